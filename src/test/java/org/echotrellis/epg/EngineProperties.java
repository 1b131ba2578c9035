package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;
import net.jqwik.api.constraints.LongRange;

/** Property tests of the engines (jqwik; seeds fixed by jqwik's database-free default generation). */
class EngineProperties {

    /** RF pulses and dephasing alone preserve the voxel-mean |M|^2 (rotations are norm-preserving; Parseval). */
    @Property(tries = 60, seed = "424242")
    void rfAndShiftsPreserveNorm(@ForAll @LongRange(min = 1, max = 1_000_000) long seed,
                                 @ForAll @IntRange(min = 1, max = 25) int pulses) {
        SplittableRandom r = new SplittableRandom(seed);
        EpgProgram.Builder b = EpgProgram.builder().keepAllStates();
        for (int i = 0; i < pulses; i++) {
            b.rf(r.nextDouble(0, 360), r.nextDouble(-180, 180));
            b.interval(r.nextDouble(0.1, 5), r.nextInt(-2, 3));
        }
        EpgProgram p = b.echo().build();
        GeneralEngine g = new GeneralEngine(2);
        double[] re = new double[2];
        double[] im = new double[2];
        double inf = Double.POSITIVE_INFINITY;
        g.run(p, new double[] {inf, inf}, new double[] {inf, inf}, new double[] {1, r.nextDouble(0.3, 1.7)}, 2, re, im);
        assertEquals(1.0, g.stateNormSquared(p, 0), 1e-12);
        assertEquals(1.0, g.stateNormSquared(p, 1), 1e-12);
    }

    /** The real CPMG fast path equals the general complex engine to 1e-12 (same physics, two codes). */
    @Property(tries = 80, seed = "1234")
    void fastPathEqualsGeneralEngine(@ForAll @LongRange(min = 1, max = 1_000_000) long seed,
                                     @ForAll @IntRange(min = 1, max = 48) int echoes) {
        SplittableRandom r = new SplittableRandom(seed);
        double[] flips = new double[echoes];
        double[] phases = new double[echoes];
        double exc = r.nextDouble(10, 170);
        double excPhase = r.nextDouble(-180, 180);
        for (int i = 0; i < echoes; i++) {
            flips[i] = r.nextDouble(0, 360);
            phases[i] = excPhase + (r.nextBoolean() ? 90 : -90) + 360 * r.nextInt(-1, 2);
        }
        CpmgTrain t = new CpmgTrain(echoes, r.nextDouble(2, 20), exc, excPhase, flips, phases);
        EpgProgram.Builder b = EpgProgram.builder().rf(exc, excPhase);
        for (int i = 0; i < echoes; i++) {
            b.interval(t.echoSpacingMs() / 2, 1).rf(flips[i], phases[i]).interval(t.echoSpacingMs() / 2, 1).echo();
        }
        EpgProgram p = b.build();
        int lanes = 5;
        double[] t1 = new double[lanes];
        double[] t2 = new double[lanes];
        double[] b1 = new double[lanes];
        for (int l = 0; l < lanes; l++) {
            t1[l] = l == 0 ? Double.POSITIVE_INFINITY : r.nextDouble(200, 3000);
            t2[l] = l == 1 ? Double.POSITIVE_INFINITY : r.nextDouble(5, 500);
            b1[l] = r.nextDouble(0.3, 1.7);
        }
        int count = 1 + r.nextInt(lanes);
        double[] fast = new double[lanes * echoes];
        new CpmgEngine(lanes).run(t, t1, t2, b1, count, fast);
        double[] re = new double[lanes * echoes];
        double[] im = new double[lanes * echoes];
        new GeneralEngine(lanes).run(p, t1, t2, b1, count, re, im);
        double psi = Math.toRadians(excPhase - 90);
        for (int l = 0; l < count; l++) {
            for (int n = 0; n < echoes; n++) {
                int i = l * echoes + n;
                assertEquals(re[i], fast[i] * Math.cos(psi), 1e-12, "lane " + l + " echo " + n);
                assertEquals(im[i], fast[i] * Math.sin(psi), 1e-12, "lane " + l + " echo " + n);
            }
        }
    }

    /** B1 = 1 with 180 degree refocusing gives exp(-n ESP/T2) for any T2 (Carr &amp; Purcell 1954; Meiboom &amp; Gill 1958). */
    @Property(tries = 100, seed = "99")
    void perfectRefocusingIsExponential(@ForAll @DoubleRange(min = 1, max = 5000) double t2,
                                        @ForAll @DoubleRange(min = 1, max = 30) double esp,
                                        @ForAll @IntRange(min = 1, max = 64) int echoes) {
        double[] e = new CpmgEngine(1).echoes(CpmgTrain.constant(echoes, esp, 180), 1000, t2, 1.0);
        for (int n = 1; n <= echoes; n++) {
            assertEquals(Math.exp(-n * esp / t2), e[n - 1], 1e-12 + 1e-12 * Math.exp(-n * esp / t2));
        }
    }
}
