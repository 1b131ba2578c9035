package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Optional;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

/**
 * Closed-form checks of the acquisition model: diffusion (Stejskal &amp; Tanner 1965; Weigel et al. 2010),
 * the spin-echo steady state (Bernstein, King &amp; Zhou 2004), and the ideal limit against the engine.
 */
class AcquisitionPhysicsTest {

    static Protocol train(CpmgTrain t, Tissue tissue, Acquisition a) {
        return Protocol.ofTrain("t", "", tissue, 1.0, t, "test", a);
    }

    static Acquisition acq(Optional<RfPulse> ref, double trMs, Optional<Crusher> crusher) {
        return new Acquisition(Optional.empty(), ref, false, 1.0, trMs, crusher);
    }

    @Test
    void stejskalTannerPerCrusherPairWithIdealRefocusing() {
        // Stejskal & Tanner, J Chem Phys 42:288 (1965): b = K^2 (Delta - delta/3), K = 2 pi q,
        // Delta = delta + tau; one pair per echo, so echo n carries exp(-n D b).
        for (double[] c : new double[][] {{2, 1.0, 2.0, 0.003}, {5, 2.0, 0.0, 0.002}, {1.5, 0.5, 3.0, 0.0008}}) {
            double q = c[0];
            double delta = c[1];
            double tau = c[2];
            double d = c[3];
            CpmgTrain t = CpmgTrain.constant(12, 12.0, 180);
            Optional<RfPulse> ref = tau > 0 ? Optional.of(RfPulse.of("sinc", 4, tau)) : Optional.empty();
            Protocol p = train(t, new Tissue("fluid", 4000, 500, d), acq(ref, Double.POSITIVE_INFINITY,
                    Optional.of(new Crusher(q, delta))));
            EchoTrain e = Simulator.simulate(p);
            double k = 2 * Math.PI * q;
            double b = k * k * (delta + tau - delta / 3) * 1e-3; // s/mm^2 with times in ms
            for (int n = 1; n <= 12; n++) {
                double expect = Math.exp(-n * 12.0 / 500) * Math.exp(-n * d * b);
                assertEquals(expect, e.magnitude(n - 1), 1e-9 * expect, "echo " + n + " q " + q);
            }
        }
    }

    @Test
    void carrPurcellConstantGradientCheckValues() {
        // METHODS §1 check, Carr & Purcell (1954) constant gradient: D tau dk^2 = 0.25 per half spacing
        // gives echo n = exp(-n/6). Crusher filling the whole half spacing (delta = ESP/2, tau = 0).
        double esp = 10;
        double q = 5.0;
        double k = 2 * Math.PI * q;
        double d = 0.25 / (0.5 * esp * 1e-3 * k * k);
        Protocol p = train(CpmgTrain.constant(6, esp, 180), new Tissue("x", Double.POSITIVE_INFINITY,
                Double.POSITIVE_INFINITY, d), acq(Optional.empty(), Double.POSITIVE_INFINITY, Optional.of(new Crusher(q, 0.5 * esp))));
        double[] expect = {0.846482, 0.716531, 0.606531, 0.513417, 0.434598, 0.367879};
        EchoTrain e = Simulator.simulate(p);
        for (int n = 0; n < 6; n++) {
            assertEquals(expect[n], e.magnitude(n), 1e-6);
        }
    }

    @Test
    void spinEchoSteadyStateBernsteinKingZhou() {
        // S = M0 (1 - 2 exp(-(TR - TE/2)/T1) + exp(-TR/T1)) exp(-TE/T2) (Bernstein, King & Zhou,
        // Handbook of MRI Pulse Sequences, 2004), ideal 90/180, one echo.
        for (double[] c : new double[][] {{500, 20, 800, 60}, {3000, 100, 4000, 2000}, {200, 30, 300, 50}}) {
            double tr = c[0];
            double te = c[1];
            double t1 = c[2];
            double t2 = c[3];
            Protocol p = train(CpmgTrain.constant(1, te, 180), new Tissue("x", t1, t2),
                    acq(Optional.empty(), tr, Optional.empty()));
            double expect = (1 - 2 * Math.exp(-(tr - te / 2) / t1) + Math.exp(-tr / t1)) * Math.exp(-te / t2);
            assertEquals(expect, Simulator.simulate(p).magnitude(0), 1e-12);
        }
    }

    @Test
    void longRepetitionAndNoDiffusionReproduceTheEngine() {
        double[] flips = new double[20];
        double[] phases = new double[20];
        for (int i = 0; i < flips.length; i++) {
            flips[i] = 100 + 3 * i;
            phases[i] = i % 3 == 0 ? 0 : 30 * i;
        }
        CpmgTrain cpmg = CpmgTrain.of(20, 8, 80, flips);
        CpmgTrain general = new CpmgTrain(20, 8, 80, 90, flips, phases);
        for (CpmgTrain t : new CpmgTrain[] {cpmg, general}) {
            Tissue tissue = new Tissue("x", 900, 70, 0.002);
            Protocol ideal = train(t, tissue, Acquisition.none());
            Protocol model = train(t, tissue, acq(Optional.empty(), 1e12, Optional.empty()));
            for (double b1 : new double[] {0.7, 1.0, 1.3}) {
                EchoTrain a = Simulator.simulate(ideal, 900, 70, b1);
                EchoTrain b = Simulator.simulate(model, 900, 70, b1);
                for (int n = 0; n < 20; n++) {
                    assertEquals(a.re()[n], b.re()[n], 1e-12);
                    assertEquals(a.im()[n], b.im()[n], 1e-12);
                }
            }
        }
    }

    @Test
    void steadyStateWithAnyFlipsMatchesBruteForceIsochromats() {
        // Brute-force isochromat reference (test sources), repeated until converged, spoiled before
        // each excitation.
        double[] flips = new double[16];
        for (int i = 0; i < flips.length; i++) {
            flips[i] = 180 - 60 * Math.sin(Math.PI * i / 15);
        }
        for (double[] c : new double[][] {{700, 4000, 1500, 0.8}, {1200, 900, 60, 1.1}, {400, 1500, 200, 1.0}}) {
            double tr = c[0];
            CpmgTrain t = CpmgTrain.of(16, 12, 75, flips);
            Protocol p = train(t, new Tissue("x", c[1], c[2]), acq(Optional.empty(), tr, Optional.empty()));
            EchoTrain e = Simulator.simulate(p, c[1], c[2], c[3]);
            var s = new SliceBlochReference.Settings("sinc", 4, 2, 2, 1, 75, flips, 12, c[1], c[2], c[3], tr);
            double[][] ref = SliceBlochReference.nonSelectiveEchoes(s);
            for (int n = 0; n < 16; n++) {
                assertEquals(ref[0][n], e.re()[n], 1e-10, "echo " + n + " TR " + tr);
                assertEquals(ref[1][n], e.im()[n], 1e-10, "echo " + n + " TR " + tr);
            }
        }
    }

    @Test
    void realFastPathEqualsComplexKernelWithDiffusionAndRepetition() {
        double[] flips = new double[24];
        for (int i = 0; i < flips.length; i++) {
            flips[i] = 120 + 2.5 * i;
        }
        Tissue fluid = new Tissue("fluid", 3500, 900, 0.003);
        Acquisition a = acq(Optional.of(RfPulse.of("sinc", 4, 2.5)), 2500, Optional.of(new Crusher(3, 1.5)));
        CpmgTrain real = new CpmgTrain(24, 9, 85, 90, flips, new double[24]);
        double[] nearly = new double[24];
        java.util.Arrays.fill(nearly, 1e-6); // not CPMG-phased by the test's tolerance: complex kernel
        CpmgTrain complex = new CpmgTrain(24, 9, 85, 90, flips, nearly);
        for (double b1 : new double[] {0.65, 1.0, 1.25}) {
            EchoTrain x = Simulator.simulate(train(real, fluid, a), 3500, 900, b1);
            EchoTrain y = Simulator.simulate(train(complex, fluid, a), 3500, 900, b1);
            for (int n = 0; n < 24; n++) {
                assertEquals(y.re()[n], x.re()[n], 1e-7);
                assertEquals(0, x.im()[n], 1e-15);
            }
        }
    }

    @Test
    void diffusionNeedsCrushers() {
        Tissue tissue = new Tissue("x", 900, 70, 0.003);
        Protocol p = train(CpmgTrain.constant(8, 10, 150), tissue, Acquisition.none());
        assertTrue(p.isIdealAcquisition());
    }
}
