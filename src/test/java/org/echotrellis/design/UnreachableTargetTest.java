package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * The reported first unreachable echo is checked by brute force: with the designed flips for the
 * echoes before it, every flip on a 0.01° grid over the bounds is simulated with the foundation
 * {@link CpmgEngine} (an independent kernel), and the first echo whose target no grid flip
 * reaches (no sign change of echo − target and no grid point within 1e-6) must be the reported one.
 */
class UnreachableTargetTest {

    @ParameterizedTest
    @CsvSource({
        // echoes, ESP, T1, T2, B1, max flip, step echo, level before, level after
        "30, 5, 1000, 100, 1.0, 140, 13, 0.45, 0.75",
        "24, 7, 800, 80, 0.9, 160, 8, 0.40, 0.80",
        "12, 5, 1200, 90, 1.0, 150, 1, 0.95, 0.95",
        "20, 4, 1500, 60, 1.1, 120, 5, 0.55, 0.70",
    })
    void firstFailingEchoMatchesBruteForce(int echoes, double esp, double t1, double t2, double b1, double maxFlip,
                                           int stepEcho, double before, double after) {
        DesignProblem p = new DesignProblem("t", echoes, esp, 90, t1, t2, b1, 0, maxFlip);
        double[] target = new double[echoes];
        for (int i = 0; i < echoes; i++) {
            target[i] = i + 1 < stepEcho ? before : after;
        }
        Inversion inv = new FlipInverter().invert(p, target, new Startup.None());
        int reported = inv.firstUnreachableEcho();
        assertTrue(reported > 0, "this target must fail somewhere");
        double[] flips = inv.flipsDeg();
        int brute = 0;
        for (int m = 1; m <= reported && brute == 0; m++) {
            if (!reachableByGrid(p, flips, m, target[m - 1])) {
                brute = m;
            }
        }
        assertEquals(brute, reported);
        // the best achievable continuation: a too-high target is followed with the largest useful echo
        double[] predicted = inv.predicted();
        assertTrue(predicted[reported - 1] < target[reported - 1]);
    }

    @ParameterizedTest
    @CsvSource({"30, 5, 1000, 100, 1.0, 140", "24, 7, 800, 80, 0.9, 160"})
    void largestReachableScaleIsTight(int echoes, double esp, double t1, double t2, double b1, double maxFlip) {
        DesignProblem p = new DesignProblem("t", echoes, esp, 90, t1, t2, b1, 0, maxFlip);
        double[] target = new EchoTarget.Decay(400, 0.9).amplitudes(p);
        FlipInverter inv = new FlipInverter();
        double s = inv.largestReachableScale(p, target, new Startup.None());
        assertTrue(s > 0 && s < 1, "scale " + s);
        double[] scaled = target.clone();
        double[] above = target.clone();
        for (int i = 0; i < echoes; i++) {
            scaled[i] *= s;
            above[i] *= s * 1.001;
        }
        assertTrue(inv.invert(p, scaled, new Startup.None()).reachable());
        assertTrue(!inv.invert(p, above, new Startup.None()).reachable());
    }

    /** Brute force over a 0.01° grid of the flip for echo m, earlier flips fixed. */
    private static boolean reachableByGrid(DesignProblem p, double[] flips, int m, double goal) {
        CpmgEngine engine = new CpmgEngine(1);
        double[] trial = java.util.Arrays.copyOf(flips, m);
        double[] out = new double[m];
        double[] t1 = {p.t1Ms()};
        double[] t2 = {p.t2Ms()};
        double[] b1 = {p.b1Scale()};
        int steps = (int) Math.round((p.maxFlipDeg() - p.minFlipDeg()) / 0.01);
        double prev = Double.NaN;
        for (int i = 0; i <= steps; i++) {
            trial[m - 1] = p.minFlipDeg() + i * (p.maxFlipDeg() - p.minFlipDeg()) / steps;
            engine.run(CpmgTrain.of(m, p.echoSpacingMs(), p.excitationFlipDeg(), trial), t1, t2, b1, 1, out);
            double d = out[m - 1] - goal;
            if (Math.abs(d) < 1e-6 || (i > 0 && (d < 0) != (prev < 0))) {
                return true;
            }
            prev = d;
        }
        return false;
    }
}
