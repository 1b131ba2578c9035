package org.echotrellis.design;

import org.apache.commons.math3.analysis.UnivariateFunction;
import org.apache.commons.math3.analysis.solvers.BrentSolver;

/**
 * Prescribed-signal design: computes the refocusing flips echo by echo so that the EPG echo of
 * the design tissue equals a target (Hennig, Weigel &amp; Scheffler, "Calculation of flip angles
 * for echo trains with predefined amplitudes with the extended phase graph (EPG)-algorithm",
 * MRM 51:68, 2004; Busse et al., MRM 55:1030, 2006).
 *
 * <p>Just before pulse n only the k = 1 states A = F+_1, B = F−_1, C = z_1 feed the next echo:
 * S_n(α) = E2(ESP/2)·[(A+B)/2 + cos α·(B−A)/2 − sin α·C], a sinusoid in α. Its extrema split
 * [α_min, α_max] into monotone pieces; the first piece whose ends bracket the target is solved
 * with Commons Math's {@link BrentSolver}, giving the smallest flip that meets the target. When
 * no piece brackets it the echo is unreachable: the flip that comes closest is used (the
 * largest flip when the target is too high) and the inversion goes on from there, so the
 * schedule is the best achievable continuation; the first such echo is reported.
 *
 * <p>One instance per thread; no allocation per echo apart from the result arrays.
 */
final class FlipInverter {
    private static final double TANGENT_TOLERANCE = 1e-12;

    private final CpmgStepper stepper = new CpmgStepper();
    private final BrentSolver solver = new BrentSolver(1e-15, 1e-15, 1e-17);
    private final EchoFunction function = new EchoFunction();

    /** Creates an inverter with its own workspace. */
    public FlipInverter() { }

    /**
     * Inverts the target echo by echo.
     *
     * @param problem train, tissue and flip bounds
     * @param target one amplitude per echo (not modified)
     * @param startup start-up stabilisation
     * @return schedule, predicted echoes, effective target and reachability
     */
    public Inversion invert(DesignProblem problem, double[] target, Startup startup) {
        int n = problem.echoes();
        double[] flips = new double[n];
        double[] predicted = new double[n];
        double[] effective = new double[n];
        int first = invertInto(problem, target, 1.0, startup, flips, predicted, effective);
        int count = 0;
        for (int i = 0; i < n; i++) {
            if (Math.abs(predicted[i] - effective[i]) > 1e-9) {
                count++;
            }
        }
        return new Inversion(flips, predicted, effective, startup.echoes(n), first, count);
    }

    /**
     * Largest factor s ≤ 1 such that s·target is reachable at every echo: a scan in steps of
     * 0.02 from 1 downward, refined by 30 bisection steps (the METHODS §5 rescaling of the
     * whole prescription).
     *
     * @return the factor, or NaN if no scaled target down to 0.02 is reachable
     */
    public double largestReachableScale(DesignProblem problem, double[] target, Startup startup) {
        int n = problem.echoes();
        double[] f = new double[n];
        double[] p = new double[n];
        double[] e = new double[n];
        if (invertInto(problem, target, 1.0, startup, f, p, e) == 0) {
            return 1.0;
        }
        double hi = 1.0;
        double lo = Double.NaN;
        for (int step = 49; step >= 1; step--) {
            double s = step * 0.02;
            if (invertInto(problem, target, s, startup, f, p, e) == 0) {
                lo = s;
                break;
            }
            hi = s;
        }
        if (Double.isNaN(lo)) {
            return Double.NaN;
        }
        for (int it = 0; it < 30; it++) {
            double mid = 0.5 * (lo + hi);
            if (invertInto(problem, target, mid, startup, f, p, e) == 0) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return lo;
    }

    /**
     * Core loop.
     *
     * @param target prescription (not modified), multiplied by scale
     * @param flips receives nominal flips in degrees (modified)
     * @param predicted receives the echoes of the schedule (modified)
     * @param effective receives the per-echo target after the start-up (modified)
     * @return first unreachable echo (1-based), or 0 if every echo meets its target
     */
    int invertInto(DesignProblem problem, double[] target, double scale, Startup startup,
                   double[] flips, double[] predicted, double[] effective) {
        int n = problem.echoes();
        double b1 = problem.b1Scale();
        double lo = Math.toRadians(problem.minFlipDeg() * b1);
        double hi = Math.toRadians(problem.maxFlipDeg() * b1);
        int startupEchoes = startup.echoes(n);
        stepper.start(n, problem.echoSpacingMs(), problem.t1Ms(), problem.t2Ms(), b1, problem.excitationFlipDeg());
        int first = 0;
        for (int e = 0; e < n; e++) {
            stepper.advanceToPulse();
            double goal = scale * target[e];
            double actual;
            if (startup instanceof Startup.Alsop && e < startupEchoes) {
                actual = Math.min(hi, Math.max(lo, Math.toRadians(alsopFirstFlipDeg(problem, scale * target[1]) * b1)));
                goal = stepper.echoFor(actual);
            } else {
                if (startup instanceof Startup.Ramp && e < startupEchoes) {
                    double w = (startupEchoes - e) / (startupEchoes + 1.0);
                    goal = w * maxReachable(lo, hi) + (1 - w) * goal;
                }
                actual = solve(goal, lo, hi);
                if (Double.isNaN(actual)) {
                    actual = closest(goal, lo, hi);
                    if (first == 0) {
                        first = e + 1;
                    }
                }
            }
            effective[e] = goal;
            flips[e] = Math.toDegrees(actual) / b1;
            predicted[e] = stepper.pulseAndEcho(flips[e]);
        }
        return first;
    }

    /**
     * Alsop's first refocusing flip 90° + α/2 (nominal degrees), with α the constant flip whose
     * static pseudo-steady state equals the echo-2 target once the ideal T2 decay and the
     * excitation are divided out.
     */
    static double alsopFirstFlipDeg(DesignProblem problem, double echo2Target) {
        double decay = Math.sin(Math.toRadians(problem.excitationFlipDeg() * problem.b1Scale()))
                * Math.exp(-2 * problem.echoSpacingMs() / problem.t2Ms());
        double level = decay > 0 ? echo2Target / decay : 1;
        double alphaNominalDeg = Math.toDegrees(PseudoSteadyState.flipFor(level)) / problem.b1Scale();
        return 90 + 0.5 * Math.min(180, alphaNominalDeg);
    }

    /** Smallest actual flip in [lo, hi] whose echo equals goal, or NaN when none does. */
    private double solve(double goal, double lo, double hi) {
        function.goal = goal;
        double a = lo;
        double fa = function.value(a);
        if (fa == 0) {
            return a;
        }
        double next = nextCritical(lo);
        double best = Math.abs(fa);
        while (a < hi) {
            double b = Math.min(hi, next);
            double fb = function.value(b);
            if (fb == 0) {
                return b;
            }
            if ((fa < 0) != (fb < 0)) {
                return solver.solve(200, function, a, b);
            }
            best = Math.min(best, Math.abs(fb));
            if (best <= TANGENT_TOLERANCE) {
                return Math.abs(fa) <= Math.abs(fb) ? a : b;
            }
            a = b;
            fa = fb;
            next += Math.PI;
        }
        return Double.NaN;
    }

    /** The flip in [lo, hi] whose echo is nearest to goal (ends and interior extrema). */
    private double closest(double goal, double lo, double hi) {
        function.goal = goal;
        double bestFlip = lo;
        double best = Math.abs(function.value(lo));
        for (double c = nextCritical(lo); c < hi; c += Math.PI) {
            double v = Math.abs(function.value(c));
            if (v < best) {
                best = v;
                bestFlip = c;
            }
        }
        if (Math.abs(function.value(hi)) < best) {
            bestFlip = hi;
        }
        return bestFlip;
    }

    /** The largest echo any flip in [lo, hi] can give from the current state. */
    private double maxReachable(double lo, double hi) {
        double best = Math.max(stepper.echoFor(lo), stepper.echoFor(hi));
        for (double c = nextCritical(lo); c < hi; c += Math.PI) {
            best = Math.max(best, stepper.echoFor(c));
        }
        return best;
    }

    /**
     * First extremum of P·cos α + Q·sin α strictly above lo; the extrema are δ + mπ with
     * δ = atan2(Q, P), P = (B−A)/2, Q = −C.
     */
    private double nextCritical(double lo) {
        double p = 0.5 * (stepper.stateB() - stepper.stateA());
        double q = -stepper.stateC();
        double delta = Math.atan2(q, p);
        double m = Math.floor((lo - delta) / Math.PI) + 1;
        return delta + m * Math.PI;
    }

    /** Echo minus goal as a function of the actual flip; reused to avoid allocation per echo. */
    private final class EchoFunction implements UnivariateFunction {
        private double goal;

        @Override
        public double value(double flipRad) {
            return stepper.echoFor(flipRad) - goal;
        }
    }
}
