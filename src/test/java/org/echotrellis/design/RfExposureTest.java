package org.echotrellis.design;

import org.echotrellis.sequence.PulseShape;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.nio.file.Files;
import java.nio.file.Path;

import org.apache.commons.math3.special.Erf;
import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class RfExposureTest {
    private static double[] filled(int n, double v) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, v);
        return a;
    }

    @Test
    void relativeSarOfConstantTrains() {
        // issue 6 §5: all-180° = 1; all-120° = (120/180)² = 0.4444 for equal durations (SAR ∝ α², METHODS §6)
        assertEquals(1.0, RfExposure.relativeSar(filled(16, 180)), 1e-15);
        assertEquals(4.0 / 9.0, RfExposure.relativeSar(filled(16, 120)), 1e-15);
        RfExposure rf = new RfExposure(PulseShape.sinc(4), 2.0, PulseShape.rect(), 1.0, 3000, 1);
        assertEquals(1.0, rf.relativeSarWithExcitation(90, filled(16, 180)), 1e-15);
    }

    @Test
    void rectangularB1FromCodataGamma() {
        // B1 = α/(γ·τ) with γ/2π = 42.577 MHz/T (CODATA 2014: 42.577 478 92 MHz/T):
        // 180° in 1 ms → 11.74 µT, 90° in 1 ms → 5.87 µT (issue 6 §5); 180° in 3 ms → 3.9144 µT (METHODS §6)
        assertEquals(1e6 / (2 * 42.577e6 * 1e-3), RfExposure.b1PeakUt(180, PulseShape.rect(), 1.0), 1e-12);
        assertEquals(11.74, RfExposure.b1PeakUt(180, PulseShape.rect(), 1.0), 0.005);
        assertEquals(5.87, RfExposure.b1PeakUt(90, PulseShape.rect(), 1.0), 0.005);
        assertEquals(3.9144, RfExposure.b1PeakUt(180, PulseShape.rect(), 3.0), 1e-4);
    }

    @Test
    void hannSincFractions() {
        // A_f = mean(b), P_f = mean(b²) of the Hann-windowed sinc (Bernstein, King & Zhou 2004, from
        // memory), values evaluated from that definition in METHODS §6 (table)
        double[][] table = {{2, 0.4076, 0.2984}, {4, 0.2532, 0.1991}, {6, 0.1660, 0.1440}, {8, 0.1252, 0.1123}};
        for (double[] row : table) {
            PulseShape s = PulseShape.sinc(row[0]);
            assertEquals(row[1], s.areaFraction(), 1e-4, "A_f TBW " + row[0]);
            assertEquals(row[2], s.powerFraction(), 1e-4, "P_f TBW " + row[0]);
        }
        // Hann-sinc TBW 4, 2.56 ms: 90° → 9.059 µT, 180° → 18.119 µT peak (METHODS §6)
        assertEquals(9.059, RfExposure.b1PeakUt(90, PulseShape.sinc(4), 2.56), 2e-3);
        assertEquals(18.119, RfExposure.b1PeakUt(180, PulseShape.sinc(4), 2.56), 2e-3);
    }

    @Test
    void gaussianAreaMatchesErf() {
        // ∫ exp(−x²/2σ²) over [−½, ½] = σ·√(2π)·erf(1/(2√2·σ)) (Gaussian integral; common practice)
        for (double tbw : new double[] {1, 2, 4}) {
            double sigma = Math.sqrt(2 * Math.log(2)) / (Math.PI * tbw);
            double exact = sigma * Math.sqrt(2 * Math.PI) * Erf.erf(1 / (2 * Math.sqrt(2) * sigma));
            assertEquals(exact, PulseShape.gauss(tbw).areaFraction(), 1e-6); // 4000-sample midpoint rule
            double exactPower = sigma * Math.sqrt(Math.PI) * Erf.erf(1 / (2 * sigma));
            assertEquals(exactPower, PulseShape.gauss(tbw).powerFraction(), 1e-6);
        }
    }

    @Test
    void b1rmsOfRectangularTrain() {
        // N rectangular pulses of amplitude B1 and duration t_p in T: B1+rms = B1·√(N·t_p/T)
        // (McRobbie, Essentials of MRI Safety, 2020). 17 pulses of 180° (excitation set to 180° too), 1 ms, TR 1 s.
        RfExposure rf = new RfExposure(PulseShape.rect(), 1.0, PulseShape.rect(), 1.0, 1000, 1);
        double b1 = RfExposure.b1PeakUt(180, PulseShape.rect(), 1.0);
        assertEquals(b1 * Math.sqrt(17 * 1e-3 / 1.0), rf.b1rmsUt(180, filled(16, 180)), 1e-12);
    }

    @Test
    void b1rmsAveragesOverTenSecondsWhenTrIsLonger() {
        // B1+rms = √((1/T)·∫|B1+|²dt) with T = 10 s, the sliding averaging window (McRobbie, Essentials of
        // MRI Safety, 2020; IEC 60601-2-33 via METHODS §6). With TR ≥ 10 s the worst window holds the
        // whole train, so for 17 rectangular 180° pulses of 1 ms: B1·√(17·1 ms / 10 s), whatever the TR.
        double b1 = RfExposure.b1PeakUt(180, PulseShape.rect(), 1.0);
        double expected = b1 * Math.sqrt(17 * 1e-3 / 10.0);
        for (double trMs : new double[] {10_000, 20_000, 60_000}) {
            RfExposure rf = new RfExposure(PulseShape.rect(), 1.0, PulseShape.rect(), 1.0, trMs, 1);
            assertEquals(expected, rf.b1rmsUt(180, filled(16, 180)), 1e-12, "TR " + trMs + " ms");
        }
        // below 10 s the periodic train averages over one TR, as before: B1·√(17·1 ms / 5 s)
        RfExposure rf5 = new RfExposure(PulseShape.rect(), 1.0, PulseShape.rect(), 1.0, 5000, 1);
        assertEquals(b1 * Math.sqrt(17 * 1e-3 / 5.0), rf5.b1rmsUt(180, filled(16, 180)), 1e-12);
    }

    @Test
    void b1rmsMultiSliceExample() {
        // METHODS §6 example (evaluated from the B1+rms definition, McRobbie 2020): 20 slices × (90° +
        // 16 × 180°) Hann-sinc TBW 4, 2.56 ms, TR 4 s → 3.69 µT; with 120° refocusing → 2.48 µT
        RfExposure rf = new RfExposure(PulseShape.sinc(4), 2.56, PulseShape.sinc(4), 2.56, 4000, 20);
        assertEquals(3.69, rf.b1rmsUt(90, filled(16, 180)), 0.005);
        assertEquals(2.48, rf.b1rmsUt(90, filled(16, 120)), 0.005);
    }

    @Test
    void sampledPulseFile(@TempDir Path dir) throws Exception {
        Path f = dir.resolve("pulse.txt");
        Files.writeString(f, "# triangle, peak 2\n0 0.5 1, 1.5\n2 1.5 1 0.5 0\n");
        PulseShape s = PulseShape.parse("file:" + f, "--pulse");
        assertEquals(4.0 / 9.0, s.areaFraction(), 1e-12); // normalised samples 0, .25, .5, .75, 1, .75, .5, .25, 0
        assertEquals(PulseShape.sinc(4).areaFraction(), PulseShape.parse("sinc:4", "--pulse").areaFraction(), 0);
        Files.writeString(f, "0 1 -1 0\n");
        assertThrows(InputException.class, () -> PulseShape.parse("file:" + f, "--pulse")); // zero area
        Files.writeString(f, "0 1 x\n");
        assertThrows(InputException.class, () -> PulseShape.parse("file:" + f, "--pulse"));
    }

    @Test
    void badShapesAndTimingRefused() {
        assertThrows(InputException.class, () -> PulseShape.parse("triangle", "--pulse"));
        assertThrows(InputException.class, () -> PulseShape.parse("sinc:abc", "--pulse"));
        assertThrows(InputException.class, () -> PulseShape.parse("gauss:-1", "--pulse"));
        assertThrows(InputException.class, () -> new RfExposure(PulseShape.rect(), 0, PulseShape.rect(), 1, 1000, 1));
        assertThrows(InputException.class, () -> new RfExposure(PulseShape.rect(), 1, PulseShape.rect(), 1, -5, 1));
    }

    @Test
    void iecPartialBodyLimits() {
        // IEC 60601-2-33 ed. 3 partial-body SAR: normal 10 − 8r (2..10), first level 10 − 6r (4..10) (from memory)
        assertEquals(10, IecLimits.partialBodyLimitWPerKg(false, 0), 1e-15);
        assertEquals(2, IecLimits.partialBodyLimitWPerKg(false, 1), 1e-15);
        assertEquals(6, IecLimits.partialBodyLimitWPerKg(false, 0.5), 1e-15);
        assertEquals(4, IecLimits.partialBodyLimitWPerKg(true, 1), 1e-15);
        assertEquals(7, IecLimits.partialBodyLimitWPerKg(true, 0.5), 1e-15);
        // whole body 2 / 4 W/kg, head 3.2 W/kg (J Med Radiat Sci 69:250, 2022, Table 3)
        assertEquals(2.0, IecLimits.modes().get(0).wholeBodyWPerKg());
        assertEquals(4.0, IecLimits.modes().get(1).wholeBodyWPerKg());
        assertEquals(3.2, IecLimits.modes().get(1).headWPerKg());
    }
}
