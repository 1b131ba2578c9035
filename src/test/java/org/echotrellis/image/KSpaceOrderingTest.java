package org.echotrellis.image;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.util.List;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.api.Test;

/** Orderings and effective TE on hand-worked cases with L = 8 lines and E = 4 echoes (S = 2 shots). */
class KSpaceOrderingTest {

    @Test
    void linearFillsContiguousSegments() {
        // hand-worked: echo 1 → lines 0,1; echo 2 → 2,3; echo 3 → 4,5; echo 4 → 6,7; line L/2 = 4 is echo 3
        KSpaceOrdering o = KSpaceOrdering.linear(8, 4);
        assertArrayEquals(new int[] {0, 0, 1, 1, 2, 2, 3, 3}, o.echoOfLine());
        assertEquals(2, o.centreEchoIndex());
        assertEquals(2, o.shots());
    }

    @Test
    void centerEchoRotatesTheSegments() {
        // hand-worked, centre echo 2: segment 2 (lines 4,5) holds line 4, so echo 2 takes it; then
        // echo 3 → 6,7; echo 4 wraps to 0,1; echo 1 → 2,3
        assertArrayEquals(new int[] {3, 3, 0, 0, 1, 1, 2, 2}, KSpaceOrdering.linear(8, 4, 2).echoOfLine());
        // centre echo 1: echo 1 → 4,5; echo 2 → 6,7; echo 3 → 0,1; echo 4 → 2,3
        assertArrayEquals(new int[] {2, 2, 3, 3, 0, 0, 1, 1}, KSpaceOrdering.linear(8, 4, 1).echoOfLine());
        // centre echo 3 is the unrotated layout
        assertArrayEquals(KSpaceOrdering.linear(8, 4).echoOfLine(), KSpaceOrdering.linear(8, 4, 3).echoOfLine());
        assertEquals(3, KSpaceOrdering.linear(8, 4, 4).centreEchoIndex());
    }

    @Test
    void centricSplitsCentreOutNegativeSideFirst() {
        // hand-worked: sorted by |j − 4|, ties negative first: 4, 3, 5, 2, 6, 1, 7, 0
        // groups of 2: echo 1 {4,3}, echo 2 {5,2}, echo 3 {6,1}, echo 4 {7,0}
        assertArrayEquals(new int[] {3, 2, 1, 0, 0, 1, 2, 3}, KSpaceOrdering.centric(8, 4).echoOfLine());
        // single shot, L = E = 8: each rank its own echo
        assertArrayEquals(new int[] {7, 5, 3, 1, 0, 2, 4, 6}, KSpaceOrdering.centric(8, 8).echoOfLine());
    }

    @Test
    void effectiveTeOfHandWorkedCases() {
        // ideal 180° CPMG, ESP 10 ms: echo e at 10·e ms (common practice)
        Protocol p = Protocol.ofTrain("t", "", new Tissue("x", 1000, 100), 1.0, CpmgTrain.constant(4, 10, 180), "test");
        List<Tissue> t = List.of(new Tissue("x", 1000, 100));
        assertEquals(30, FseImaging.analyse(p, KSpaceOrdering.linear(8, 4), t, Double.NaN).tissues().get(0).effectiveTeMs(), 1e-12);
        assertEquals(20, FseImaging.analyse(p, KSpaceOrdering.linear(8, 4, 2), t, Double.NaN).tissues().get(0).effectiveTeMs(), 1e-12);
        assertEquals(10, FseImaging.analyse(p, KSpaceOrdering.centric(8, 4), t, Double.NaN).tissues().get(0).effectiveTeMs(), 1e-12);
        // weights: line j carries exp(−TE/T2) of its echo; centre signal exp(−30/100) for linear
        TissueImage ti = FseImaging.analyse(p, KSpaceOrdering.linear(8, 4), t, Double.NaN).tissues().get(0);
        assertEquals(Math.exp(-0.3), ti.centerSignal(), 1e-12);
        assertEquals(Math.exp(-0.1), ti.weights()[1], 1e-12);
        assertEquals(Math.exp(-0.4), ti.weights()[7], 1e-12);
    }

    @Test
    void refusesBadCombinations() {
        assertThrows(InputException.class, () -> KSpaceOrdering.linear(10, 4));
        assertThrows(InputException.class, () -> new KSpaceOrdering(8, 4, KSpaceOrdering.Kind.CENTRIC, 2));
        assertThrows(InputException.class, () -> KSpaceOrdering.linear(8, 4, 5));
        assertThrows(InputException.class, () -> KSpaceOrdering.linear(0, 4));
    }

    @Test
    void everyEchoAcquiresShotsLines() {
        for (KSpaceOrdering o : List.of(KSpaceOrdering.linear(96, 12, 5), KSpaceOrdering.centric(96, 12),
                KSpaceOrdering.linear(7, 7), KSpaceOrdering.centric(9, 3))) {
            int[] count = new int[o.echoes()];
            for (int e : o.echoOfLine()) {
                count[e]++;
            }
            for (int c : count) {
                assertEquals(o.shots(), c, o.describe());
            }
        }
    }
}
