package org.echotrellis.design;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * RF exposure figures of a schedule. Estimates only: the scanner's own SAR monitor, local
 * regulations and the responsible MR physicist decide.
 *
 * @param relativeSar refocusing-train SAR relative to the all-180° train
 * @param relativeSarWithExcitation the same with the excitation pulse counted
 * @param b1rmsUt B1+rms over TR (over 10 s when TR is longer) in µT (NaN without TR)
 * @param b1rms180Ut B1+rms of the all-180° train (NaN without TR)
 * @param maxRefocusB1PeakUt largest refocusing B1 peak in µT
 * @param excitationB1PeakUt excitation B1 peak in µT
 * @param sarEstimateWPerKg absolute SAR scaled from the reference protocol, NaN when not asked
 * @param limits the limits of the design
 * @param withinLimits whether the schedule meets them
 * @param pulse refocusing pulse as option text, with duration
 * @param trMs TR in ms (NaN when unknown)
 * @param slices trains per TR
 */
public record ExposureSummary(double relativeSar, double relativeSarWithExcitation, double b1rmsUt, double b1rms180Ut,
                              double maxRefocusB1PeakUt, double excitationB1PeakUt, double sarEstimateWPerKg,
                              ExposureLimits limits, boolean withinLimits, String pulse, double trMs, int slices) {

    /** @return JSON map, NaN as null, with the IEC context table */
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("relative_sar", relativeSar);
        m.put("relative_sar_with_excitation", relativeSarWithExcitation);
        m.put("b1rms_ut", DesignReport.nullIfNaN(b1rmsUt));
        m.put("b1rms_180_train_ut", DesignReport.nullIfNaN(b1rms180Ut));
        m.put("max_refocusing_b1_peak_ut", maxRefocusB1PeakUt);
        m.put("excitation_b1_peak_ut", excitationB1PeakUt);
        m.put("sar_estimate_w_per_kg", DesignReport.nullIfNaN(sarEstimateWPerKg));
        m.put("sar_budget", limits.sarBudget());
        m.put("b1rms_limit_ut", limits.hasB1rmsLimit() ? limits.b1rmsLimitUt() : null);
        m.put("within_limits", withinLimits);
        m.put("refocusing_pulse", pulse);
        m.put("tr_ms", DesignReport.nullIfNaN(trMs));
        m.put("trains_per_tr", slices);
        List<Map<String, Object>> modes = new ArrayList<>();
        for (IecLimits.Mode mode : IecLimits.modes()) {
            Map<String, Object> e = new LinkedHashMap<>();
            e.put("mode", mode.mode());
            e.put("whole_body_w_per_kg", mode.wholeBodyWPerKg());
            e.put("head_w_per_kg", mode.headWPerKg());
            e.put("partial_body", mode.partialBodyRule());
            modes.add(e);
        }
        m.put("iec_60601_2_33_limits_for_context", modes);
        return m;
    }
}
