package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class EpgProgramTest {

    /** Flips and durations are tabulated once per distinct value; every operation points at its own value. */
    @Test
    void repeatedFlipsAndDurationsShareOneTableEntry() {
        for (long seed : new long[] {3, 4, 5}) {
            SplittableRandom r = new SplittableRandom(seed);
            double[] flipPool = {90, 120, 150, 180, 0};
            double[] durationPool = {2.5, 5, 7.25};
            int pulses = 400;
            double[] flips = new double[pulses];
            double[] durations = new double[pulses];
            EpgProgram.Builder b = EpgProgram.builder();
            for (int i = 0; i < pulses; i++) {
                flips[i] = flipPool[r.nextInt(flipPool.length)];
                durations[i] = durationPool[r.nextInt(durationPool.length)];
                b.rf(flips[i], r.nextDouble(0, 360)).interval(durations[i], r.nextInt(-2, 3)).echo();
            }
            EpgProgram p = b.build();
            assertEquals(flipPool.length, p.flipsRad.length, "seed " + seed);
            assertEquals(durationPool.length, p.durationsMs.length, "seed " + seed);
            for (int i = 0; i < pulses; i++) {
                assertEquals(Math.toRadians(flips[i]), p.flipsRad[p.table[3 * i]], 0, "seed " + seed + " pulse " + i);
                assertEquals(durations[i], p.durationsMs[p.table[3 * i + 1]], 0, "seed " + seed + " interval " + i);
            }
        }
    }
}
