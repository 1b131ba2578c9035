package org.echotrellis.pathway;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import org.apache.commons.math3.complex.Complex;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Best-first pathway search against brute-force enumeration and closed forms. */
class PathwaySearchTest {
    private static final double INF = Double.POSITIVE_INFINITY;
    private static final PathwaySearch.Limits ALL = new PathwaySearch.Limits(10_000, 0.0, 4_000_000);

    @Test
    void sixEchoTrainListedPathwaysPlusUnexplainedReproduceTheEcho() {
        TestTrains t = TestTrains.cpmg(6, 10, 125);
        Schedule s = t.schedule();
        for (int top : new int[] {1, 5, 20}) {
            TopPathways r = new PathwaySearch().find(s, 5, 1000, 80, 0.9, PathwaySearch.Limits.of(top));
            double sr = r.unexplainedRe();
            double si = r.unexplainedIm();
            double share = r.unexplainedShare();
            for (Pathway p : r.pathways()) {
                sr += p.re();
                si += p.im();
                share += p.share();
            }
            assertEquals(r.echoRe(), sr, 1e-15);
            assertEquals(r.echoIm(), si, 1e-15);
            assertEquals(1.0, share, 1e-12);
            assertEquals(top, r.pathways().size());
            for (int i = 1; i < r.pathways().size(); i++) {
                assertTrue(r.pathways().get(i).magnitude() <= r.pathways().get(i - 1).magnitude() * (1 + 1e-12));
            }
        }
        // all pathways together leave nothing unexplained: the expansion is exact
        TopPathways all = new PathwaySearch().find(s, 5, 1000, 80, 0.9, ALL);
        assertTrue(all.complete());
        assertTrue(all.pathways().size() < 10_000);
        assertEquals(0.0, all.unexplainedMagnitude(), 1e-12);
        ClassDecomposition d = new ClassTracker().decompose(s, 1000, 80, 0.9);
        assertEquals(d.magnitude(5), Math.hypot(all.echoRe(), all.echoIm()), 0);
    }

    @ParameterizedTest
    @ValueSource(longs = {11, 23, 37, 41, 59})
    void searchEqualsBruteForceEnumeration(long seed) {
        Random rnd = new Random(seed);
        TestTrains t = TestTrains.random(rnd, 3 + rnd.nextInt(2));
        double t1 = rnd.nextBoolean() ? INF : 50 + 500 * rnd.nextDouble();
        double t2 = 20 + 200 * rnd.nextDouble();
        double b1 = 0.7 + 0.5 * rnd.nextDouble();
        Schedule s = t.schedule();
        ClassDecomposition d = new ClassTracker().decompose(s, t1, t2, b1);
        for (int echo = 0; echo < s.echoCount(); echo++) {
            BruteForcePathways brute = new BruteForcePathways(t, echo, t1, t2, b1);
            TopPathways found = new PathwaySearch().find(s, echo, t1, t2, b1, ALL);
            // brute-force sum = the echo (exactness of the pathway expansion)
            assertEquals(d.echoRe(echo), brute.total().getReal(), 1e-12);
            assertEquals(d.echoIm(echo), brute.total().getImaginary(), 1e-12);
            // brute-force sums per class = the class decomposition
            for (Map.Entry<Integer, Complex> c : brute.byClass.entrySet()) {
                assertEquals(d.classRe(echo, c.getKey()), c.getValue().getReal(), 1e-12, "class " + c.getKey());
                assertEquals(d.classIm(echo, c.getKey()), c.getValue().getImaginary(), 1e-12, "class " + c.getKey());
            }
            // every pathway found is a brute-force pathway with the same amplitude ...
            for (Pathway p : found.pathways()) {
                Complex b = brute.byNotation.get(p.states());
                assertNotNull(b, "unknown pathway " + p.states() + " seed " + seed);
                assertEquals(b.getReal(), p.re(), 1e-12, p.states());
                assertEquals(b.getImaginary(), p.im(), 1e-12, p.states());
            }
            // ... and the k largest brute-force magnitudes are the ones the search lists first
            List<Double> mags = new ArrayList<>();
            for (Complex c : brute.byNotation.values()) {
                mags.add(c.abs());
            }
            mags.sort((a, b) -> Double.compare(b, a));
            int n = Math.min(8, found.pathways().size());
            for (int i = 0; i < n; i++) {
                assertEquals(mags.get(i), found.pathways().get(i).magnitude(), 1e-12, "rank " + i + " seed " + seed);
            }
            long nonZero = mags.stream().filter(m -> m > 1e-300).count();
            assertEquals(nonZero, found.pathways().size(), "pathway count seed " + seed);
        }
    }

    @Test
    void cpmgSecondEchoPathwaysInTheNotation() {
        double alpha = 120;
        Schedule s = TestTrains.cpmg(2, 10, alpha).schedule();
        TopPathways r = new PathwaySearch().find(s, 1, INF, INF, 1.0, PathwaySearch.Limits.of(10));
        double a = Math.toRadians(alpha);
        Pathway se = null;
        Pathway ste = null;
        for (Pathway p : r.pathways()) {
            if (p.states().equals("Z0 F0 F-1*2")) {
                se = p;
            } else if (p.states().equals("Z0 F0 Z-1 F-1")) {
                ste = p;
            }
        }
        assertNotNull(se);
        assertNotNull(ste);
        // Hennig 1988: double spin echo sin^4(a/2), class 0; stimulated echo 1/2 sin^2 a, class 1
        assertEquals(Math.pow(Math.sin(a / 2), 4), se.re(), 1e-12);
        assertEquals(0, se.longitudinalIntervals());
        assertEquals(0.5 * Math.pow(Math.sin(a), 2), ste.re(), 1e-12);
        assertEquals(1, ste.longitudinalIntervals());
        assertEquals(2, r.pathways().size());
        assertEquals(0.0, r.unexplainedMagnitude(), 1e-15);
    }

    @Test
    void thresholdDropsSmallPathwaysIntoTheRest() {
        Schedule s = TestTrains.cpmg(8, 10, 100).schedule();
        TopPathways loose = new PathwaySearch().find(s, 7, INF, INF, 1.0, new PathwaySearch.Limits(10_000, 1e-3, 4_000_000));
        for (Pathway p : loose.pathways()) {
            assertTrue(p.magnitude() >= 1e-3);
        }
        TopPathways all = new PathwaySearch().find(s, 7, INF, INF, 1.0, ALL);
        long big = all.pathways().stream().filter(p -> p.magnitude() >= 1e-3).count();
        assertEquals(big, loose.pathways().size());
        assertEquals(0.0, all.unexplainedMagnitude(), 1e-12);
    }
}
