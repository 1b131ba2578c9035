package org.echotrellis.pathway;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;
import net.jqwik.api.constraints.LongRange;
import org.junit.jupiter.api.Test;

/** Exact class decomposition: sums, closed forms and the foundation engine. */
class ClassTrackerTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    /** Tolerance of the decomposition: the classes must add up to the echo to 1e-12 M0 (issue 3). */
    private static final double TOL = 1e-12;

    private static double[] classSums(ClassDecomposition d) {
        double[] out = new double[2 * d.echoCount()];
        for (int e = 0; e < d.echoCount(); e++) {
            for (int m = 0; m < d.classCount(e); m++) {
                out[2 * e] += d.classRe(e, m);
                out[2 * e + 1] += d.classIm(e, m);
            }
        }
        return out;
    }

    @Property(tries = 60, seed = "20261201")
    void classesAddUpToTheGeneralEngineEcho(@ForAll @LongRange(min = 1, max = 1_000_000) long seed,
                                            @ForAll @IntRange(min = 1, max = 7) int pulses) {
        Random rnd = new Random(seed);
        TestTrains t = TestTrains.random(rnd, pulses);
        double t1 = rnd.nextInt(4) == 0 ? INF : 20 + 2000 * rnd.nextDouble();
        double t2 = rnd.nextInt(4) == 0 ? INF : 5 + 300 * rnd.nextDouble();
        double b1 = 0.5 + rnd.nextDouble();
        double[] expected = t.generalEngine(t1, t2, b1);
        double[] got = classSums(new ClassTracker().decompose(t.schedule(), t1, t2, b1));
        for (int i = 0; i < expected.length; i++) {
            // foundation GeneralEngine echo sum, agreement required to 1e-12 (issue 3, section 1)
            assertEquals(expected[i], got[i], TOL, "echo component " + i + " seed " + seed);
        }
    }

    @Test
    void cpmgTrainOf128EchoesMatchesTheGeneralEngine() {
        TestTrains t = TestTrains.cpmg(128, 8, 130);
        double[] expected = t.generalEngine(900, 60, 0.85);
        double[] got = classSums(new ClassTracker().decompose(t.schedule(), 900, 60, 0.85));
        for (int i = 0; i < expected.length; i++) {
            assertEquals(expected[i], got[i], TOL, "component " + i);
        }
    }

    @Test
    void threePulseStimulatedEchoIsClassOneAndSpinEchoIsClassZero() {
        double a1 = 50;
        double a2 = 70;
        double a3 = 110;
        // pulses at 0, 2, 7 (dephasing one order per unit): SE12 at 4, STE at 9 (METHODS 2a timing)
        Schedule s = new TestTrains().rf(a1, 90).interval(2, 2).rf(a2, 90).interval(2, 2).echo()
                .interval(3, 3).rf(a3, 90).interval(2, 2).echo().schedule();
        ClassDecomposition d = new ClassTracker().decompose(s, INF, INF, 1.0);
        double r1 = Math.toRadians(a1);
        double r2 = Math.toRadians(a2);
        double r3 = Math.toRadians(a3);
        // Hahn, Phys Rev 80:580 (1950); Woessner, J Chem Phys 34:2057 (1961): SE12 = sin a1 sin^2(a2/2)
        double se12 = Math.sin(r1) * Math.pow(Math.sin(r2 / 2), 2);
        assertEquals(se12, Math.hypot(d.classRe(0, 0), d.classIm(0, 0)), TOL);
        assertEquals(0.0, Math.hypot(d.classRe(0, 1), d.classIm(0, 1)), TOL);
        // same sources: STE = 1/2 sin a1 sin a2 sin a3, entirely in class 1
        double ste = 0.5 * Math.sin(r1) * Math.sin(r2) * Math.sin(r3);
        assertEquals(ste, Math.hypot(d.classRe(1, 1), d.classIm(1, 1)), TOL);
        assertEquals(ste, d.magnitude(1), TOL);
        assertEquals(0.0, Math.hypot(d.classRe(1, 0), d.classIm(1, 0)), TOL);
        assertEquals(1.0, d.stimulatedShare(1), 1e-12);
    }

    @Test
    void threePulseStimulatedEchoCarriesT1WeightingOfItsMixingTime() {
        double t1 = 400;
        double t2 = 60;
        double tau1 = 6;
        double tau2 = 27;
        double a = 80;
        Schedule s = new TestTrains().rf(a, 90).interval(tau1, 2).rf(a, 90).interval(tau2, 9).rf(a, 90)
                .interval(tau1, 2).echo().schedule();
        ClassDecomposition d = new ClassTracker().decompose(s, t1, t2, 1.0);
        double r = Math.toRadians(a);
        // Hahn 1950: STE = 1/2 sin^3 a exp(-2 tau1/T2) exp(-tau2/T1), tau2 = mixing time
        double expected = 0.5 * Math.pow(Math.sin(r), 3) * Math.exp(-2 * tau1 / t2) * Math.exp(-tau2 / t1);
        assertEquals(expected, Math.hypot(d.classRe(0, 1), d.classIm(0, 1)), TOL);
        assertEquals(expected, d.magnitude(0), TOL);
    }

    @Test
    void cpmgSecondEchoSplitsIntoDoubleSpinEchoAndStimulatedEcho() {
        for (double alpha : new double[] {60, 90, 120, 150}) {
            ClassDecomposition d = new ClassTracker().decompose(TestTrains.cpmg(4, 10, alpha).schedule(), INF, INF, 1.0);
            double r = Math.toRadians(alpha);
            // Hennig, J Magn Reson 78:397 (1988): echo 2 = sin^4(a/2) (spin echo) + 1/2 sin^2 a (stimulated)
            assertEquals(Math.pow(Math.sin(r / 2), 4), d.classRe(1, 0), TOL, "class 0 at " + alpha);
            assertEquals(0.5 * Math.pow(Math.sin(r), 2), d.classRe(1, 1), TOL, "class 1 at " + alpha);
            // echo 1 = sin^2(a/2), pure spin echo (Hennig 1988)
            assertEquals(Math.pow(Math.sin(r / 2), 2), d.classRe(0, 0), TOL);
            assertEquals(0.0, d.stimulatedShare(0), TOL);
        }
    }

    @Test
    void cpmgSecondEchoClassesCarryTheirOwnRelaxation() {
        double alpha = 120;
        double esp = 10;
        double t1 = 1000;
        double t2 = 100;
        ClassDecomposition d = new ClassTracker().decompose(TestTrains.cpmg(3, esp, alpha).schedule(), t1, t2, 1.0);
        double r = Math.toRadians(alpha);
        // Hennig 1988 pathway rules with relaxation: the double spin echo is transverse for 2 ESP,
        // the stimulated echo transverse for ESP and longitudinal for one ESP
        double se = Math.pow(Math.sin(r / 2), 4) * Math.exp(-2 * esp / t2);
        double ste = 0.5 * Math.pow(Math.sin(r), 2) * Math.exp(-esp / t2) * Math.exp(-esp / t1);
        assertEquals(se, d.classRe(1, 0), TOL);
        assertEquals(ste, d.classRe(1, 1), TOL);
        assertEquals(ste / (se + ste), d.stimulatedShare(1), 1e-12);
    }

    @Test
    void idealRefocusingHasNoStimulatedShare() {
        ClassDecomposition d = new ClassTracker().decompose(TestTrains.cpmg(32, 9, 180).schedule(), 1200, 40, 1.0);
        for (int e = 0; e < d.echoCount(); e++) {
            // ideal 180 deg CPMG: every echo is a pure spin echo (Carr & Purcell 1954; Meiboom & Gill 1958)
            assertEquals(0.0, d.stimulatedShare(e), 1e-15, "echo " + (e + 1));
            assertEquals(Math.exp(-(e + 1) * 9 / 40.0), d.magnitude(e), TOL);
        }
    }

    @Test
    void oversizedSchedulesAreRefusedAsInput() {
        Schedule.Builder b = Schedule.builder().rf(90, 90);
        for (int n = 0; n < 600; n++) {
            b.interval(1, 1000).rf(120, 0).interval(1, 1000).echo();
        }
        Schedule s = b.build();
        org.echotrellis.InputException ex = org.junit.jupiter.api.Assertions.assertThrows(
                org.echotrellis.InputException.class, () -> new ClassTracker().decompose(s, 1000, 100, 1));
        assertTrue(ex.getMessage().contains("limit"), ex.getMessage());
        org.junit.jupiter.api.Assertions.assertThrows(org.echotrellis.InputException.class,
                () -> new PathwaySearch().find(s, 599, 1000, 100, 1, PathwaySearch.Limits.of(3)));
        // the 128-echo CPMG train stays far inside both limits
        Schedule cpmg = TestTrains.cpmg(128, 8, 130).schedule();
        assertTrue(cpmg.classWorkspaceBytes() < Schedule.MAX_WORKSPACE_BYTES / 50);
        assertTrue(cpmg.stateUpdates < Schedule.MAX_STATE_UPDATES / 100);
    }

    @Test
    void classCountsStayWithinTheNumberOfPeriodsBetween() {
        Schedule s = TestTrains.cpmg(5, 10, 120).schedule();
        for (int e = 0; e < 5; e++) {
            // echo n can have been longitudinal in at most n - 1 periods (periods 1 .. n-1)
            assertEquals(e + 1, s.classCount(e));
        }
        ClassDecomposition d = new ClassTracker().decompose(s, INF, INF, 1.0);
        assertTrue(Math.abs(d.classRe(4, 4)) > 1e-6, "class 4 of echo 5 present at 120 deg");
    }
}
