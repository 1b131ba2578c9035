package org.echotrellis.design;

import java.util.ArrayList;
import java.util.List;

import org.echotrellis.Checks;
import org.echotrellis.sequence.Tissue;

/**
 * The two design jobs behind the {@code design} command: prescribed-signal inversion and
 * budgeted optimisation. Each returns a {@link DesignReport} with the RF exposure figures and
 * the predicted echoes of the design tissue and the comparison tissues.
 */
public final class DesignJob {
    private DesignJob() { }

    /**
     * Prescribed-signal design.
     *
     * @param p train, design tissue, flip bounds
     * @param target prescribed echo amplitudes
     * @param startup start-up stabilisation
     * @param rf pulse model
     * @param limits limits to report against (a prescription is not changed to meet them)
     * @param reference SAR reference, or null
     * @param compare comparison tissues
     * @return the report
     */
    public static DesignReport prescribed(DesignProblem p, EchoTarget target, Startup startup, RfExposure rf,
                                          ExposureLimits limits, SarReference reference, List<Tissue> compare) {
        return prescribed(p, target, startup, rf, limits, reference, compare, null);
    }

    /**
     * Prescribed-signal design whose tissue echoes are reported as the protocol acquires them.
     *
     * @param p train, design tissue, flip bounds
     * @param target prescribed echo amplitudes
     * @param startup start-up stabilisation
     * @param rf pulse model
     * @param limits limits to report against
     * @param reference SAR reference, or null
     * @param compare comparison tissues
     * @param acquired the protocol's acquisition model ({@link AcquiredEchoes#forProtocol}), or null for
     *        ideal pulses; the schedule is solved on the ideal-pulse model either way
     * @return the report
     */
    public static DesignReport prescribed(DesignProblem p, EchoTarget target, Startup startup, RfExposure rf,
                                          ExposureLimits limits, SarReference reference, List<Tissue> compare,
                                          AcquiredEchoes acquired) {
        checkLimits(limits, rf, reference);
        double[] amplitudes = target.amplitudes(p);
        FlipInverter inverter = new FlipInverter();
        Inversion inv = inverter.invert(p, amplitudes, startup);
        double scale = inv.reachable() ? 1.0 : inverter.largestReachableScale(p, amplitudes, startup);
        double[] flips = inv.flipsDeg();
        double budgetScale = limits.allows(rf, p.excitationFlipDeg(), flips) ? Double.NaN
                : budgetScale(inverter, p, amplitudes, startup, rf, limits);
        return new DesignReport("target", target.spec(), p, flips, inv.predicted(), inv.effectiveTarget(),
                inv.startupEchoes(), inv.firstUnreachableEcho(), inv.unreachableEchoes(), scale, budgetScale,
                Double.NaN, Double.NaN, Double.NaN, exposure(p, flips, rf, limits, reference),
                comparisons(p, flips, compare, acquired));
    }

    /**
     * Budgeted optimisation.
     *
     * @param p train, design tissue, flip bounds
     * @param objective what to maximise
     * @param rf pulse model
     * @param limits SAR budget and B1+rms limit (met by the result)
     * @param reference SAR reference, or null
     * @param knots spline knots
     * @param maxEvaluations evaluations per optimiser start
     * @param compare comparison tissues
     * @return the report
     */
    public static DesignReport optimised(DesignProblem p, Objective objective, RfExposure rf, ExposureLimits limits,
                                         SarReference reference, int knots, int maxEvaluations, List<Tissue> compare) {
        return optimised(p, objective, rf, limits, reference, knots, maxEvaluations, compare, null);
    }

    /**
     * Budgeted optimisation whose tissue echoes are reported as the protocol acquires them.
     *
     * @param p train, design tissue, flip bounds
     * @param objective what to maximise
     * @param rf pulse model
     * @param limits SAR budget and B1+rms limit (met by the result)
     * @param reference SAR reference, or null
     * @param knots spline knots
     * @param maxEvaluations evaluations per optimiser start
     * @param compare comparison tissues
     * @param acquired the protocol's acquisition model ({@link AcquiredEchoes#forProtocol}), or null for
     *        ideal pulses; the schedule is optimised on the ideal-pulse model either way
     * @return the report
     */
    public static DesignReport optimised(DesignProblem p, Objective objective, RfExposure rf, ExposureLimits limits,
                                         SarReference reference, int knots, int maxEvaluations, List<Tissue> compare,
                                         AcquiredEchoes acquired) {
        checkLimits(limits, rf, reference);
        OptimizedSchedule r = new ScheduleOptimizer().optimize(p, objective, limits, rf, knots, maxEvaluations);
        double[] flips = r.flipsDeg();
        double[] predicted = new double[p.echoes()];
        new CpmgStepper().run(p.echoes(), p.echoSpacingMs(), p.t1Ms(), p.t2Ms(), p.b1Scale(), p.excitationFlipDeg(),
                flips, predicted);
        return new DesignReport("objective", objective.spec(), p, flips, predicted, new double[0], 0, 0, 0, Double.NaN,
                Double.NaN, r.objective(), r.constantFlipDeg(), r.constantObjective(), exposure(p, flips, rf, limits, reference),
                comparisons(p, flips, compare, acquired));
    }

    /**
     * Largest factor s of the prescription that is reachable at every echo with a schedule that meets
     * the limits: a scan from 1
     * downward in steps of 0.02, refined by 30 bisection steps above the first factor that meets
     * them. (The RF is not monotone in s: a target too low to reach can call for 180° pulses.)
     *
     * @return s, or NaN when no factor down to 0.02 meets them
     */
    static double budgetScale(FlipInverter inverter, DesignProblem p, double[] target, Startup startup, RfExposure rf,
                              ExposureLimits limits) {
        double[] scaled = new double[target.length];
        double hi = 1;
        double lo = Double.NaN;
        for (int step = 49; step >= 1; step--) {
            double sc = step * 0.02;
            if (meets(inverter, p, target, sc, scaled, startup, rf, limits)) {
                lo = sc;
                break;
            }
            hi = sc;
        }
        if (Double.isNaN(lo)) {
            return Double.NaN;
        }
        for (int it = 0; it < 30; it++) {
            double mid = 0.5 * (lo + hi);
            if (meets(inverter, p, target, mid, scaled, startup, rf, limits)) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return lo;
    }

    private static boolean meets(FlipInverter inverter, DesignProblem p, double[] target, double s, double[] scaled,
                                 Startup startup, RfExposure rf, ExposureLimits limits) {
        for (int i = 0; i < target.length; i++) {
            scaled[i] = s * target[i];
        }
        Inversion inv = inverter.invert(p, scaled, startup);
        return inv.reachable() && limits.allows(rf, p.excitationFlipDeg(), inv.flipsDeg());
    }

    /** RF figures of a schedule. */
    static ExposureSummary exposure(DesignProblem p, double[] flips, RfExposure rf, ExposureLimits limits,
                                    SarReference reference) {
        double[] full = new double[flips.length];
        java.util.Arrays.fill(full, 180);
        double maxFlip = 0;
        for (double f : flips) {
            maxFlip = Math.max(maxFlip, f);
        }
        double exc = p.excitationFlipDeg();
        double sar = reference == null ? Double.NaN : reference.scale(rf.powerUt2(exc, flips));
        return new ExposureSummary(RfExposure.relativeSar(flips), rf.relativeSarWithExcitation(exc, flips),
                rf.b1rmsUt(exc, flips), rf.b1rmsUt(exc, full),
                RfExposure.b1PeakUt(maxFlip, rf.refocusShape(), rf.refocusMs()),
                RfExposure.b1PeakUt(exc, rf.excitationShape(), rf.excitationMs()), sar, limits,
                limits.allows(rf, exc, flips), rf.refocusShape().label() + ", " + rf.refocusMs() + " ms", rf.trMs(),
                rf.slices());
    }

    private static List<Comparison> comparisons(DesignProblem p, double[] flips, List<Tissue> compare,
                                                AcquiredEchoes acquired) {
        List<Comparison> out = new ArrayList<>();
        if (acquired != null) {
            Tissue design = acquired.designTissue();
            out.add(Comparison.acquired(acquired, new Tissue(p.tissueName(), p.t1Ms(), p.t2Ms(),
                    design.diffusivityMm2PerS()), flips));
            for (Tissue t : compare) {
                out.add(Comparison.acquired(acquired, t, flips));
            }
            return out;
        }
        out.add(Comparison.of(p, p.tissueName(), p.t1Ms(), p.t2Ms(), flips));
        for (Tissue t : compare) {
            out.add(Comparison.of(p, t.name(), t.t1Ms(), t.t2Ms(), flips));
        }
        return out;
    }

    private static void checkLimits(ExposureLimits limits, RfExposure rf, SarReference reference) {
        Checks.require(!limits.hasB1rmsLimit() || rf.hasTr(), "b1rms_limit_ut needs tr_ms (B1+rms is averaged over TR)");
        Checks.require(reference == null || rf.hasTr(), "reference_sar_w_per_kg needs tr_ms");
    }
}
