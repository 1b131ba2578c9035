package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;

import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.api.Test;

class TrainSurfaceTest {

    static Protocol plain(int echoes, double esp, double refocusDeg) {
        return Protocol.ofTrain("plain", "", new Tissue("", 1000, 100), 1, CpmgTrain.constant(echoes, esp, refocusDeg), "test");
    }

    /** Largest |interpolated − simulated| over random points, relative to echo 1 of the simulated train. */
    static double worstError(Protocol p, double t1, double t2Lo, double t2Hi, double b1Lo, double b1Hi, long seed, int points) {
        TrainSurface s = TrainSurface.build(new TrainSource(p, t1), t2Lo, t2Hi, b1Lo, b1Hi);
        TrainSurface.Workspace w = s.workspace();
        int n = s.echoes();
        double[] g = new double[n];
        double[] d1 = new double[n];
        double[] d2 = new double[n];
        Random r = new Random(seed);
        double worst = 0;
        for (int i = 0; i < points; i++) {
            double t2 = t2Lo * Math.pow(t2Hi / t2Lo, r.nextDouble());
            double b1 = b1Lo + (b1Hi - b1Lo) * r.nextDouble();
            s.evaluate(w, t2, b1, g, d1, d2);
            EchoTrain direct = Simulator.simulate(p, t1, t2, b1);
            double ref = direct.magnitude(0);
            for (int k = 0; k < n; k++) {
                worst = Math.max(worst, Math.abs(Math.abs(g[k]) - direct.magnitude(k)) / ref);
            }
        }
        return worst;
    }

    /** 2-D acquisition of the accuracy floors: sinc TBW 4 (2 ms) on both pulses, equal widths, 32 echoes, ESP 10 ms. */
    static Protocol slice(double widthRatio, double trMs) {
        org.echotrellis.sequence.RfPulse e = org.echotrellis.sequence.RfPulse.of("sinc", 4, 2);
        org.echotrellis.sequence.Acquisition a = new org.echotrellis.sequence.Acquisition(java.util.Optional.of(e),
                java.util.Optional.of(e), true, widthRatio, trMs, java.util.Optional.empty());
        return Protocol.ofTrain("slice", "", new Tissue("x", 1000, 80), 1.0, CpmgTrain.constant(32, 10, 180), "test", a);
    }

    @Test
    void sliceSelectiveTrainsInterpolateWithin1e4OfEchoOne() {
        // Reference: the acquisition model evaluated directly at each point (the quantity tabulated).
        double e = worstError(slice(1, Double.POSITIVE_INFINITY), 1000, 10, 1000, 0.5, 1.5, 6, 60);
        assertTrue(e < 1e-4, "worst interpolation error " + e);
    }

    @Test
    void idealPulseTrainsInterpolateWithin1e4OfEchoOne() {
        // Reference: direct EPG simulation of the same protocol at each point (the quantity tabulated).
        double e = worstError(plain(32, 10, 180), 1000, 5, 3000, 0.3, 1.7, 5, 400);
        assertTrue(e < 1e-4, "worst interpolation error " + e);
    }
}
