package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;

/** Consistency of the inversion on random trains, checked with the foundation CPMG engine. */
class FlipInverterProperties {

    @Property(tries = 80, seed = "6011")
    void reportIsConsistent(@ForAll @IntRange(min = 2, max = 60) int echoes,
                            @ForAll @DoubleRange(min = 2, max = 12) double espMs,
                            @ForAll @DoubleRange(min = 300, max = 2500) double t1Ms,
                            @ForAll @DoubleRange(min = 20, max = 400) double t2Ms,
                            @ForAll @DoubleRange(min = 0.7, max = 1.2) double b1,
                            @ForAll @DoubleRange(min = 0, max = 60) double minFlip,
                            @ForAll @DoubleRange(min = 100, max = 180) double maxFlip,
                            @ForAll @DoubleRange(min = 0.05, max = 0.9) double level,
                            @ForAll @IntRange(min = 0, max = 3) int startupKind) {
        DesignProblem p = new DesignProblem("t", echoes, espMs, 90, t1Ms, t2Ms, b1, minFlip, maxFlip);
        Startup s = switch (startupKind) {
            case 0 -> new Startup.None();
            case 1 -> new Startup.Alsop();
            default -> new Startup.Ramp(startupKind + 1);
        };
        Inversion inv = new FlipInverter().invert(p, new EchoTarget.Constant(level).amplitudes(p), s);
        double[] flips = inv.flipsDeg();
        double[] pred = inv.predicted();
        double[] eff = inv.effectiveTarget();
        int first = 0;
        int misses = 0;
        for (int i = 0; i < echoes; i++) {
            assertTrue(flips[i] >= minFlip - 1e-9 && flips[i] <= maxFlip + 1e-9, "flip " + flips[i]);
            if (Math.abs(pred[i] - eff[i]) > 1e-9) {
                misses++;
                first = first == 0 ? i + 1 : first;
            }
            if (i >= s.echoes(echoes)) {
                assertEquals(level, eff[i], 0.0); // after the start-up the target is the prescription
            }
        }
        assertEquals(first, inv.firstUnreachableEcho());
        assertEquals(misses, inv.unreachableEchoes());
        double[] ref = new CpmgEngine(1).echoes(CpmgTrain.of(echoes, espMs, 90, flips), t1Ms, t2Ms, b1);
        for (int i = 0; i < echoes; i++) {
            assertEquals(ref[i], pred[i], 1e-12);
        }
    }

    @Property(tries = 40, seed = "90217")
    void reportIsConsistentSecondSeed(@ForAll @IntRange(min = 2, max = 40) int echoes,
                                      @ForAll @DoubleRange(min = 20, max = 400) double t2Ms,
                                      @ForAll @DoubleRange(min = 0.05, max = 0.9) double level) {
        reportIsConsistent(echoes, 5, 1000, t2Ms, 1.0, 10, 180, level, 2);
    }
}
