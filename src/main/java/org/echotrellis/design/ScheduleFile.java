package org.echotrellis.design;

import java.util.Locale;

/**
 * Text of a designed schedule as a protocol file in the shorthand form ({@code train:} with
 * {@code refocusing.flips_deg}), which {@code simulate}, {@code pathways} and {@code fit} read.
 * Flips are written with 4 decimals (1e-4°).
 */
public final class ScheduleFile {
    private ScheduleFile() { }

    /**
     * @param name protocol name
     * @param description one line of free text
     * @param report the design
     * @return YAML text
     */
    public static String yaml(String name, String description, DesignReport report) {
        DesignProblem p = report.problem();
        ExposureSummary x = report.exposure();
        StringBuilder sb = new StringBuilder();
        sb.append("# Refocusing schedule designed by echotrellis design (").append(report.mode()).append(' ')
                .append(report.spec()).append(").\n");
        sb.append(String.format(Locale.ROOT, "# Relative SAR %.4f of the all-180° train", x.relativeSar()));
        if (!Double.isNaN(x.b1rmsUt())) {
            sb.append(String.format(Locale.ROOT, ", B1+rms %.3f µT (TR %.0f ms, %d per TR)", x.b1rmsUt(), x.trMs(),
                    x.slices()));
        }
        sb.append(".\n");
        ExposureLimits lim = x.limits();
        sb.append(String.format(Locale.ROOT, "# Designed for: relative-SAR budget %s", plain(lim.sarBudget())));
        if (lim.hasB1rmsLimit()) {
            sb.append(String.format(Locale.ROOT, ", B1+rms limit %s µT", plain(lim.b1rmsLimitUt())));
        }
        sb.append(String.format(Locale.ROOT, ", refocusing pulse %s, excitation flip %s°, B1 scale %s: %s.%n",
                x.pulse(), num(p.excitationFlipDeg()), num(p.b1Scale()),
                x.withinLimits() ? "limits met" : "LIMITS EXCEEDED (written on request)"));
        sb.append("# ").append(IecLimits.CAUTION).append('\n');
        sb.append("name: ").append(quote(name)).append('\n');
        sb.append("description: ").append(quote(description)).append('\n');
        sb.append("tissue: {name: ").append(quote(p.tissueName())).append(", t1_ms: ").append(num(p.t1Ms()))
                .append(", t2_ms: ").append(num(p.t2Ms())).append("}\n");
        sb.append("train:\n");
        sb.append("  echoes: ").append(p.echoes()).append('\n');
        sb.append("  echo_spacing_ms: ").append(num(p.echoSpacingMs())).append('\n');
        sb.append("  excitation: {flip_deg: ").append(num(p.excitationFlipDeg())).append(", phase_deg: 90}\n");
        sb.append("  refocusing:\n    flips_deg: [");
        double[] f = report.flipsDeg();
        for (int i = 0; i < f.length; i++) {
            if (i > 0) {
                sb.append(i % 8 == 0 ? ",\n                " : ", ");
            }
            sb.append(String.format(Locale.ROOT, "%.4f", f[i]));
        }
        sb.append("]\n    phase_deg: 0\n");
        sb.append("  b1_scale: ").append(num(p.b1Scale())).append('\n');
        return sb.toString();
    }

    private static String num(double v) {
        if (Double.isInfinite(v)) {
            return ".inf";
        }
        return v == Math.rint(v) && Math.abs(v) < 1e12 ? Long.toString((long) v) : Double.toString(v);
    }

    private static String plain(double v) {
        return String.format(Locale.ROOT, "%.4g", v).replaceAll("\\.?0+$", "");
    }

    private static String quote(String s) {
        return "\"" + s.replace("\\", "\\\\").replace("\"", "\\\"") + "\"";
    }
}
