package org.echotrellis.design;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Everything a design produced: the schedule, its predicted echoes, reachability (prescribed
 * mode) or objective values (budgeted mode), RF exposure figures and comparison tissues. Built
 * by {@link DesignJob}. Arrays are copied on the way in and out. Exposure figures are
 * estimates only: the scanner's own SAR monitor, local regulations and the responsible MR
 * physicist decide.
 *
 * @param mode "target" or "objective"
 * @param spec the --target or --objective value
 * @param problem the design problem
 * @param flipsDeg nominal refocusing flips
 * @param predicted signed echoes of the design tissue
 * @param target effective target per echo (prescribed mode), else empty
 * @param startupEchoes start-up echoes (prescribed mode)
 * @param firstUnreachableEcho first echo that misses its target, 0 when none (prescribed mode)
 * @param unreachableEchoes number of echoes that miss (prescribed mode)
 * @param reachableScale largest factor of the target that is reachable everywhere, NaN if none
 * @param budgetScale largest factor of the target reachable everywhere by a schedule that meets the
 *                    limits, when the schedule itself does not meet them (prescribed mode); NaN
 *                    otherwise or when none does
 * @param objectiveValue objective of the schedule (budgeted mode), else NaN
 * @param constantFlipDeg best constant flip in the same limits (budgeted mode), else NaN
 * @param constantObjective objective of that constant schedule, else NaN
 * @param exposure RF figures of the schedule
 * @param comparisons design tissue first, then the comparison tissues
 */
public record DesignReport(String mode, String spec, DesignProblem problem, double[] flipsDeg, double[] predicted,
                           double[] target, int startupEchoes, int firstUnreachableEcho, int unreachableEchoes,
                           double reachableScale, double budgetScale, double objectiveValue, double constantFlipDeg,
                           double constantObjective, ExposureSummary exposure, List<Comparison> comparisons) {
    /**
     * Copies arrays and the list.
     *
     * @param mode "target" or "objective"
     * @param spec the --target or --objective value
     * @param problem the design problem
     * @param flipsDeg nominal refocusing flips
     * @param predicted signed echoes of the design tissue
     * @param target effective target per echo (prescribed mode), else empty
     * @param startupEchoes start-up echoes (prescribed mode)
     * @param firstUnreachableEcho first echo that misses its target, 0 when none (prescribed mode)
     * @param unreachableEchoes number of echoes that miss (prescribed mode)
     * @param reachableScale largest factor of the target that is reachable everywhere, NaN if none
     * @param budgetScale largest factor of the target reachable everywhere by a schedule that meets the
     *                    limits, when the schedule itself does not meet them (prescribed mode); NaN
     *                    otherwise or when none does
     * @param objectiveValue objective of the schedule (budgeted mode), else NaN
     * @param constantFlipDeg best constant flip in the same limits (budgeted mode), else NaN
     * @param constantObjective objective of that constant schedule, else NaN
     * @param exposure RF figures of the schedule
     * @param comparisons design tissue first, then the comparison tissues
     */
    public DesignReport {
        flipsDeg = flipsDeg.clone();
        predicted = predicted.clone();
        target = target.clone();
        comparisons = List.copyOf(comparisons);
    }

    /** @return nominal refocusing flips (a copy) */
    @Override
    public double[] flipsDeg() {
        return flipsDeg.clone();
    }

    /** @return signed echoes of the design tissue (a copy) */
    @Override
    public double[] predicted() {
        return predicted.clone();
    }

    /** @return effective target per echo (prescribed mode), else empty (a copy) */
    @Override
    public double[] target() {
        return target.clone();
    }

    /**
     * Whether the relative-SAR budget shaped the result: false when the best schedule uses less
     * than 99 % of it, so that the objective itself, not the budget, set the flips (a looser
     * budget would give the same schedule).
     *
     * @return true if the schedule sits at the budget
     */
    public boolean budgetBinding() {
        return exposure.relativeSar() >= 0.99 * exposure.limits().sarBudget();
    }

    /** @return the JSON form (contract keys first; NaN and 0 sentinels become null) */
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("flips_deg", flipsDeg);
        m.put("predicted", predicted);
        m.put("relative_sar", exposure.relativeSar());
        m.put("b1rms_ut", nullIfNaN(exposure.b1rmsUt()));
        m.put("first_unreachable_echo", firstUnreachableEcho == 0 ? null : firstUnreachableEcho);
        m.put("mode", mode);
        m.put(mode, spec);
        m.put("design_tissue", Map.of("name", problem.tissueName(), "t1_ms", problem.t1Ms(), "t2_ms", problem.t2Ms()));
        m.put("echoes", problem.echoes());
        m.put("echo_spacing_ms", problem.echoSpacingMs());
        m.put("b1_scale", problem.b1Scale());
        m.put("flip_bounds_deg", new double[] {problem.minFlipDeg(), problem.maxFlipDeg()});
        if (mode.equals("target")) {
            m.put("target", target);
            m.put("startup_echoes", startupEchoes);
            m.put("unreachable_echoes", unreachableEchoes);
            m.put("reachable_scale", nullIfNaN(reachableScale));
            m.put("budget_scale", nullIfNaN(budgetScale));
        } else {
            m.put("objective_value", objectiveValue);
            m.put("best_constant_flip_deg", constantFlipDeg);
            m.put("best_constant_objective", constantObjective);
            m.put("sar_budget_binding", budgetBinding());
        }
        m.put("exposure", exposure.toJson());
        List<Map<String, Object>> tissues = new ArrayList<>();
        for (Comparison c : comparisons) {
            Map<String, Object> t = new LinkedHashMap<>();
            t.put("name", c.name());
            t.put("t1_ms", c.t1Ms());
            t.put("t2_ms", c.t2Ms());
            t.put("echoes", c.echoes());
            t.put("echoes_180", c.echoes180());
            t.put("echo_model", c.echoModel());
            tissues.add(t);
        }
        m.put("tissues", tissues);
        m.put("caution", IecLimits.CAUTION);
        return m;
    }

    static Double nullIfNaN(double v) {
        return Double.isNaN(v) ? null : v;
    }
}
