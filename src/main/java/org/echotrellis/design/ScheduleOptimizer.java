package org.echotrellis.design;

import org.apache.commons.math3.optim.InitialGuess;
import org.apache.commons.math3.optim.MaxEval;
import org.apache.commons.math3.optim.PointValuePair;
import org.apache.commons.math3.optim.SimpleBounds;
import org.apache.commons.math3.optim.nonlinear.scalar.GoalType;
import org.apache.commons.math3.optim.nonlinear.scalar.ObjectiveFunction;
import org.apache.commons.math3.optim.nonlinear.scalar.noderiv.BOBYQAOptimizer;
import org.apache.commons.math3.optim.univariate.BrentOptimizer;
import org.apache.commons.math3.optim.univariate.SearchInterval;
import org.apache.commons.math3.optim.univariate.UnivariateObjectiveFunction;
import org.apache.commons.math3.optim.univariate.UnivariatePointValuePair;
import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * Budgeted refocusing design: maximises an {@link Objective} over a smooth schedule of a few
 * spline knots ({@link FlipSpline}, spread over the echoes up to the last one the objective reads;
 * later flips taper linearly to the lowest flip, which leaves the objective unchanged) subject to relative SAR ≤ budget and B1+rms ≤ limit, with
 * Powell's BOBYQA (Powell, "The BOBYQA algorithm for bound constrained optimization without
 * derivatives", Cambridge NA Report 2009/06) from Commons Math.
 *
 * <p>Constraints are met by construction: each candidate schedule r is mapped to
 * clamp(s·r, α_min, α_max) with the largest s ∈ [0, 1] that satisfies both limits (both grow
 * with s, so bisection finds it). BOBYQA is started from the best constant schedule and from a
 * descending and an ascending ramp; the best result is kept. The best constant flip in the same
 * limits is found on a 0.25° grid refined with Brent's method.
 *
 * <p>Not thread-safe; one instance per thread.
 */
final class ScheduleOptimizer {
    private final ObjectiveEvaluator evaluator = new ObjectiveEvaluator();
    private int evaluations;

    /** Creates an optimiser with its own workspace. */
    public ScheduleOptimizer() { }

    /**
     * @param problem train, design tissue and flip bounds
     * @param objective what to maximise
     * @param limits SAR budget and B1+rms limit
     * @param rf pulse model (needs a TR when a B1+rms limit is set)
     * @param knots number of spline knots
     * @param maxEvaluations objective evaluations per BOBYQA start (≥ 50)
     * @return the optimised schedule and the constant reference
     */
    public OptimizedSchedule optimize(DesignProblem problem, Objective objective, ExposureLimits limits,
                                      RfExposure rf, int knots, int maxEvaluations) {
        Checks.inRange("max_evaluations", maxEvaluations, 50, 1_000_000, null);
        Checks.require(objective.lastEcho() <= problem.echoes(), "the objective refers to echo "
                + objective.lastEcho() + " but the train has " + problem.echoes() + " echoes");
        Checks.require(!limits.hasB1rmsLimit() || rf.hasTr(), "b1rms_limit_ut needs tr_ms");
        int n = problem.echoes();
        double lo = problem.minFlipDeg();
        double hi = problem.maxFlipDeg();
        double[] work = new double[n];
        java.util.Arrays.fill(work, lo);
        if (!limits.allows(rf, problem.excitationFlipDeg(), work)) {
            throw new InputException("the limits cannot be met even with every flip at min_flip_deg " + lo
                    + ": relative SAR " + fmt(RfExposure.relativeSar(work)) + " vs sar_budget " + limits.sarBudget()
                    + (limits.hasB1rmsLimit() ? ", B1+rms " + fmt(rf.b1rmsUt(problem.excitationFlipDeg(), work))
                    + " µT vs b1rms_limit_ut " + limits.b1rmsLimitUt() : ""));
        }
        evaluations = 0;
        double constFlip = bestConstant(problem, objective, limits, rf, work);
        java.util.Arrays.fill(work, constFlip);
        double constValue = evaluator.value(objective, problem, work);

        if (n < 2) {                     // one flip: the best constant flip is the optimum
            return new OptimizedSchedule(work.clone(), new double[] {constFlip}, constValue, constFlip, constValue,
                    evaluations);
        }
        int span = Math.min(n, Math.max(2, objective.lastEcho()));
        FlipSpline spline = new FlipSpline(Math.min(knots, span), span);
        int k = spline.knots();
        double[] bestKnots = filled(k, constFlip);
        double bestValue = constValue;
        if (hi - lo > 1e-6 && n >= 2) {
            double[][] starts = {filled(k, constFlip), ramp(k, hi, Math.max(lo, 0.5 * constFlip)),
                ramp(k, Math.max(lo, 0.5 * constFlip), hi)};
            for (double[] start : starts) {
                PointValuePair r = runBobyqa(problem, objective, limits, rf, spline, start, maxEvaluations, work);
                if (r.getValue() > bestValue) {
                    bestValue = r.getValue();
                    bestKnots = r.getPoint();
                }
            }
        }
        double[] flips = new double[n];
        scheduleFor(problem, limits, rf, spline, bestKnots, flips);
        double value = evaluator.value(objective, problem, flips);
        return new OptimizedSchedule(flips, bestKnots, value, constFlip, constValue, evaluations);
    }

    private PointValuePair runBobyqa(DesignProblem p, Objective o, ExposureLimits limits, RfExposure rf,
                                     FlipSpline spline, double[] start, int maxEval, double[] work) {
        int k = spline.knots();
        double[] lower = filled(k, p.minFlipDeg());
        double[] upper = filled(k, p.maxFlipDeg());
        double radius = Math.min(20, (p.maxFlipDeg() - p.minFlipDeg()) / 4);
        BOBYQAOptimizer bobyqa = new BOBYQAOptimizer(2 * k + 1, radius, 1e-3);
        try {
            return bobyqa.optimize(new MaxEval(maxEval), GoalType.MAXIMIZE, new InitialGuess(start),
                    new SimpleBounds(lower, upper), new ObjectiveFunction(x -> {
                        scheduleFor(p, limits, rf, spline, x, work);
                        evaluations++;
                        return evaluator.value(o, p, work);
                    }));
        } catch (org.apache.commons.math3.exception.TooManyEvaluationsException e) {
            // budget of evaluations spent: fall back to the start (the caller keeps the best)
            scheduleFor(p, limits, rf, spline, start, work);
            return new PointValuePair(start, evaluator.value(o, p, work));
        }
    }

    /** Spline → clamp → largest feasible scaling; writes the schedule into out. */
    void scheduleFor(DesignProblem p, ExposureLimits limits, RfExposure rf, FlipSpline spline,
                     double[] knotsDeg, double[] out) {
        double lo = p.minFlipDeg();
        double hi = p.maxFlipDeg();
        spline.evaluate(knotsDeg, lo, hi, out);
        taper(out, spline.echoes(), lo);
        if (limits.allows(rf, p.excitationFlipDeg(), out)) {
            return;
        }
        double[] raw = out.clone();
        double sLo = 0;
        double sHi = 1;
        for (int it = 0; it < 50; it++) {
            double s = 0.5 * (sLo + sHi);
            scaleInto(raw, s, lo, hi, out);
            if (limits.allows(rf, p.excitationFlipDeg(), out)) {
                sLo = s;
            } else {
                sHi = s;
            }
        }
        scaleInto(raw, sLo, lo, hi, out);
    }

    /**
     * Echoes after the last one the objective reads do not change it (echo n depends only on
     * pulses 1..n), so their flips fall linearly from the spline's last value to the lowest flip:
     * the objective is unchanged and the RF goes to the echoes that count.
     */
    private static void taper(double[] flips, int span, double lo) {
        int n = flips.length;
        if (span >= n) {
            return;
        }
        double last = flips[span - 1];
        for (int i = span; i < n; i++) {
            flips[i] = last + (lo - last) * (i - span + 1.0) / (n - span);
        }
    }

    private double bestConstant(DesignProblem p, Objective o, ExposureLimits limits, RfExposure rf, double[] work) {
        double lo = p.minFlipDeg();
        double top = p.maxFlipDeg();
        java.util.Arrays.fill(work, top);
        if (!limits.allows(rf, p.excitationFlipDeg(), work)) {
            double a = lo;
            double b = top;
            for (int it = 0; it < 60; it++) {
                double m = 0.5 * (a + b);
                java.util.Arrays.fill(work, m);
                if (limits.allows(rf, p.excitationFlipDeg(), work)) {
                    a = m;
                } else {
                    b = m;
                }
            }
            top = a;
        }
        double bestFlip = top;
        double best = constValue(p, o, top, work);
        for (double a = lo; a < top; a += 0.25) {
            double v = constValue(p, o, a, work);
            if (v > best) {
                best = v;
                bestFlip = a;
            }
        }
        double a = Math.max(lo, bestFlip - 0.25);
        double b = Math.min(top, bestFlip + 0.25);
        if (b - a > 1e-9) {
            UnivariatePointValuePair r = new BrentOptimizer(1e-10, 1e-8).optimize(new MaxEval(200), GoalType.MAXIMIZE,
                    new SearchInterval(a, b, bestFlip), new UnivariateObjectiveFunction(x -> constValue(p, o, x, work)));
            if (r.getValue() > best) {
                bestFlip = r.getPoint();
            }
        }
        return bestFlip;
    }

    private double constValue(DesignProblem p, Objective o, double flip, double[] work) {
        java.util.Arrays.fill(work, flip);
        evaluations++;
        return evaluator.value(o, p, work);
    }

    private static void scaleInto(double[] raw, double s, double lo, double hi, double[] out) {
        for (int i = 0; i < raw.length; i++) {
            out[i] = Math.max(lo, Math.min(hi, s * raw[i]));
        }
    }

    private static double[] filled(int k, double v) {
        double[] x = new double[k];
        java.util.Arrays.fill(x, v);
        return x;
    }

    private static double[] ramp(int k, double from, double to) {
        double[] x = new double[k];
        for (int j = 0; j < k; j++) {
            x[j] = from + (to - from) * j / (k - 1.0);
        }
        return x;
    }

    private static String fmt(double v) {
        return String.format(java.util.Locale.ROOT, "%.4g", v);
    }
}
