package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.DoubleRange;
import net.jqwik.api.constraints.IntRange;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;

/** The design stepper against the foundation CPMG engine (independent kernel, same physics). */
class CpmgStepperProperties {
    @Property(tries = 60, seed = "20261201")
    void agreesWithFoundationEngine(@ForAll @IntRange(min = 1, max = 70) int echoes,
                                    @ForAll @DoubleRange(min = 1, max = 20) double espMs,
                                    @ForAll @DoubleRange(min = 50, max = 3000) double t1Ms,
                                    @ForAll @DoubleRange(min = 5, max = 500) double t2Ms,
                                    @ForAll @DoubleRange(min = 0.5, max = 1.3) double b1,
                                    @ForAll @DoubleRange(min = 10, max = 170) double excitationDeg,
                                    @ForAll long flipSeed) {
        java.util.Random rnd = new java.util.Random(flipSeed);
        double[] flips = new double[echoes];
        for (int i = 0; i < echoes; i++) {
            flips[i] = 180 * rnd.nextDouble();
        }
        double[] mine = new double[echoes];
        new CpmgStepper().run(echoes, espMs, t1Ms, t2Ms, b1, excitationDeg, flips, mine);
        double[] ref = new CpmgEngine(1).echoes(CpmgTrain.of(echoes, espMs, excitationDeg, flips), t1Ms, t2Ms, b1);
        for (int n = 0; n < echoes; n++) {
            assertEquals(ref[n], mine[n], 1e-12, "echo " + (n + 1)); // fast paths agree to rounding
        }
    }


    @Property(tries = 40, seed = "77031")
    void agreesWithFoundationEngineSecondSeed(@ForAll @IntRange(min = 1, max = 40) int echoes,
                                              @ForAll @DoubleRange(min = 50, max = 3000) double t1Ms,
                                              @ForAll @DoubleRange(min = 5, max = 500) double t2Ms,
                                              @ForAll long flipSeed) {
        agreesWithFoundationEngine(echoes, 7.5, t1Ms, t2Ms, 1.0, 90, flipSeed);
    }
}
