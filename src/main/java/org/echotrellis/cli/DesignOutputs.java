package org.echotrellis.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Locale;
import org.echotrellis.InputException;
import org.echotrellis.design.Comparison;
import org.echotrellis.design.DesignProblem;
import org.echotrellis.design.DesignReport;
import org.echotrellis.design.ExposureSummary;
import org.echotrellis.design.IecLimits;
import org.echotrellis.design.RfExposure;
import org.echotrellis.design.ScheduleFile;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.OutputSet;
import org.echotrellis.io.Json;
import org.echotrellis.plot.BarChart;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.LineChart;
import org.jfree.chart.JFreeChart;

/** Table, files and plots of a {@code design} result. */
final class DesignOutputs {
    /** Name of the written protocol file. */
    static final String SCHEDULE_FILE = "schedule.yaml";
    private static final List<String> FILES = List.of(SCHEDULE_FILE, "design.json", "schedule.png", "schedule.svg",
            "echoes.png", "echoes.svg", "relative-sar.png", "relative-sar.svg");

    private DesignOutputs() { }

    /**
     * Opens the output set and refuses it when any output exists (without force), an output is an
     * input, or the directory is not writable, before any work is done.
     */
    static OutputSet open(Path dir, boolean force, List<Path> inputs) {
        OutputSet set = CliChecks.outputSet(dir, force, inputs);
        try {
            set.plan(FILES);
        } catch (RuntimeException e) {
            set.close();
            throw e;
        }
        return set;
    }

    /**
     * Writes schedule.yaml, design.json (the report's JSON with {@code provenance}) and the three
     * plots (PNG and SVG).
     */
    static void write(DesignReport r, Map<String, Object> json, Path dir, String name, boolean force) {
        DesignProblem p = r.problem();
        String description = String.format(Locale.ROOT, "%d echoes, ESP %s ms, refocusing schedule for %s (%s %s)",
                p.echoes(), Tables.num(p.echoSpacingMs()), p.tissueName(), r.mode(), r.spec());
        AtomicFiles.writeString(dir.resolve(SCHEDULE_FILE), ScheduleFile.yaml(name, description, r), force);
        AtomicFiles.writeString(dir.resolve("design.json"), Json.write(json), force);
        both(scheduleChart(r), dir, "schedule", force);
        both(echoChart(r), dir, "echoes", force);
        both(sarChart(r), dir, "relative-sar", force);
    }

    private static void both(JFreeChart chart, Path dir, String stem, boolean force) {
        ChartFiles.write(chart, dir.resolve(stem + ".png"), 900, 540, force);
        ChartFiles.write(chart, dir.resolve(stem + ".svg"), 900, 540, force);
    }

    /** Flips against echo number (and the best constant flip for --objective). */
    static JFreeChart scheduleChart(DesignReport r) {
        double[] n = echoIndex(r.problem().echoes());
        LineChart c = LineChart.create("Refocusing schedule: " + r.mode() + " " + r.spec(), "echo number",
                "refocusing flip (deg)")
                .subtitle(subtitle(r))
                .add("designed schedule", n, r.flipsDeg(), LineChart.Look.LINE_MARKERS, 0);
        if (!Double.isNaN(r.constantFlipDeg())) {
            c.add(String.format(Locale.ROOT, "best constant flip in the same limits (%.1f°)", r.constantFlipDeg()), n,
                    filled(n.length, r.constantFlipDeg()), LineChart.Look.DASHED, 1);
        }
        return c.yRange(0, 185).build();
    }

    /** Predicted echoes for the design tissue and the comparison tissues, with the all-180° trains dashed. */
    static JFreeChart echoChart(DesignReport r) {
        DesignProblem p = r.problem();
        double[] te = new double[p.echoes()];
        for (int i = 0; i < te.length; i++) {
            te[i] = p.echoTimeMs(i + 1);
        }
        LineChart c = LineChart.create("Predicted echoes under the designed schedule", "echo time (ms)",
                "echo amplitude (fraction of M0)").subtitle("solid: designed schedule; dashed: the same train with all-180° refocusing");
        int color = 0;
        for (Comparison t : r.comparisons()) {
            String label = String.format(Locale.ROOT, "%s (T1 %s, T2 %s ms)", t.name(), Tables.num(t.t1Ms()),
                    Tables.num(t.t2Ms()));
            c.add(label, te, t.echoes(), LineChart.Look.LINE_MARKERS, color);
            c.add(t.name() + ", all 180°", te, t.echoes180(), LineChart.Look.DASHED, color);
            color++;
        }
        if (r.target().length > 0) {
            c.add("target (" + p.tissueName() + ")", te, r.target(), LineChart.Look.MARKERS, color);
        }
        return c.yRange(0, 1.02).build();
    }

    /** Relative SAR of the schedule against the all-180° train and the budget. */
    static JFreeChart sarChart(DesignReport r) {
        ExposureSummary x = r.exposure();
        BarChart c = BarChart.create("RF energy relative to the all-180° train", "relative SAR (refocusing pulses)")
                .subtitle("Estimates only: the scanner's SAR monitor, local rules and the MR physicist decide")
                .bar("all-180° train", 1.0, 2)
                .bar("designed schedule", x.relativeSar(), 0);
        if (!Double.isNaN(r.constantFlipDeg())) {
            double rel = r.constantFlipDeg() * r.constantFlipDeg() / (180.0 * 180.0);
            c.bar(String.format(Locale.ROOT, "best constant %.1f°", r.constantFlipDeg()), rel, 1);
        }
        if (x.limits().sarBudget() < 1) {
            c.referenceLine(String.format(Locale.ROOT, "budget %.2f", x.limits().sarBudget()), x.limits().sarBudget());
        }
        return c.build();
    }

    /** Human-readable table with the schedule, the predictions and the RF figures. */
    static String table(DesignReport r) {
        DesignProblem p = r.problem();
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "# design %s %s for %s (T1 %s ms, T2 %s ms), %d echoes, ESP %s ms, B1 %.3f%n",
                r.mode(), r.spec(), p.tissueName(), Tables.num(p.t1Ms()), Tables.num(p.t2Ms()), p.echoes(),
                Tables.num(p.echoSpacingMs()), p.b1Scale()));
        List<Comparison> tissues = r.comparisons();
        StringBuilder head = new StringBuilder(String.format(Locale.ROOT, "%5s  %9s  %9s  %9s  %10s", "echo", "time_ms",
                "flip_deg", "target", "predicted"));
        for (int i = 1; i < tissues.size(); i++) {
            head.append(String.format(Locale.ROOT, "  %18s", clip(tissues.get(i).name())));
        }
        sb.append(head).append('\n');
        double[] f = r.flipsDeg();
        double[] pred = r.predicted();
        double[] target = r.target();
        for (int e = 0; e < p.echoes(); e++) {
            String t = target.length > 0 ? String.format(Locale.ROOT, "%9.5f", target[e]) : String.format("%9s", "-");
            String miss = target.length > 0 && Math.abs(pred[e] - target[e]) > 1e-6 ? " *" : "";
            sb.append(String.format(Locale.ROOT, "%5d  %9.3f  %9.3f  %s  %10.6f", e + 1, p.echoTimeMs(e + 1), f[e], t,
                    Math.abs(pred[e])));
            for (int i = 1; i < tissues.size(); i++) {
                sb.append(String.format(Locale.ROOT, "  %18.6f", tissues.get(i).echoes()[e]));
            }
            sb.append(miss).append('\n');
        }
        sb.append('\n').append(summary(r));
        sb.append('\n').append(IecLimits.table());
        return sb.toString();
    }

    /** The summary lines under the table (also used by the demo). */
    static String summary(DesignReport r) {
        ExposureSummary x = r.exposure();
        StringBuilder sb = new StringBuilder();
        if (r.mode().equals("target")) {
            if (r.firstUnreachableEcho() == 0) {
                sb.append(String.format(Locale.ROOT, "Target reached at every echo (start-up echoes: %d).%n", r.startupEchoes()));
            } else {
                sb.append(String.format(Locale.ROOT, "First unreachable echo: %d (%d echoes miss, marked *); from there the "
                        + "schedule follows the nearest reachable echo.%n", r.firstUnreachableEcho(), r.unreachableEchoes()));
                sb.append(Double.isNaN(r.reachableScale()) ? "No scaled copy of the target down to 0.02 is reachable.\n"
                        : String.format(Locale.ROOT, "Best achievable alternative: the target scaled by %.4f is reachable "
                        + "at every echo.%n", r.reachableScale()));
            }
            if (!r.exposure().withinLimits()) {
                sb.append(Double.isNaN(r.budgetScale()) ? "No scaled copy of the target down to 0.02 is reachable within the limits.\n"
                        : String.format(Locale.ROOT, "The schedule exceeds the limits; the target scaled by %.4f is "
                        + "reachable at every echo within them.%n", r.budgetScale()));
            }
        } else {
            sb.append(String.format(Locale.ROOT, "Objective %s: %.6f; best constant flip in the same limits %.2f° gives %.6f "
                    + "(ratio %.3f).%n", r.spec(), r.objectiveValue(), r.constantFlipDeg(), r.constantObjective(),
                    r.objectiveValue() / r.constantObjective()));
            if (!r.budgetBinding()) {
                sb.append(String.format(Locale.ROOT, "The SAR budget is not binding: the best schedule uses %.4f of the "
                        + "%s allowed, so the objective alone set the flips (a larger budget gives the same schedule).%n",
                        x.relativeSar(), g(x.limits().sarBudget())));
            }
        }
        sb.append(String.format(Locale.ROOT, "Relative SAR (refocusing pulses vs all 180°): %.4f; with the excitation: %.4f; "
                + "budget %s: %s.%n", x.relativeSar(), x.relativeSarWithExcitation(), g(x.limits().sarBudget()),
                x.withinLimits() ? "limits met" : "LIMITS EXCEEDED"));
        if (!Double.isNaN(x.b1rmsUt())) {
            sb.append(String.format(Locale.ROOT, "B1+rms: %.3f µT over TR %s ms%s with %d train(s) per TR (all-180° train: %.3f µT)%s.%n",
                    x.b1rmsUt(), Tables.num(x.trMs()), x.trMs() > RfExposure.B1RMS_WINDOW_MS
                            ? " (averaged over the 10 s window)" : "", x.slices(), x.b1rms180Ut(), x.limits().hasB1rmsLimit()
                            ? String.format(Locale.ROOT, "; limit %s µT", g(x.limits().b1rmsLimitUt())) : ""));
        } else {
            sb.append("B1+rms: give --tr-ms (and --slices) to compute it.\n");
        }
        sb.append(String.format(Locale.ROOT, "B1 peak: refocusing up to %.3f µT, excitation %.3f µT (%s).%n",
                x.maxRefocusB1PeakUt(), x.excitationB1PeakUt(), x.pulse()));
        if (!Double.isNaN(x.sarEstimateWPerKg())) {
            sb.append(String.format(Locale.ROOT, "SAR estimate scaled from the reference protocol: %.3f W/kg.%n",
                    x.sarEstimateWPerKg()));
        }
        return sb.toString();
    }

    private static String subtitle(DesignReport r) {
        ExposureSummary x = r.exposure();
        DesignProblem p = r.problem();
        return String.format(Locale.ROOT, "%s, %d echoes, ESP %s ms; relative SAR %.3f (budget %s)%s", p.tissueName(),
                p.echoes(), Tables.num(p.echoSpacingMs()), x.relativeSar(), g(x.limits().sarBudget()),
                Double.isNaN(x.b1rmsUt()) ? "" : String.format(Locale.ROOT, ", B1+rms %.2f µT", x.b1rmsUt()));
    }

    static String g(double v) {
        String s = String.format(Locale.ROOT, "%.4g", v);
        return s.contains(".") && !s.contains("e") ? s.replaceAll("0+$", "").replaceAll("\\.$", "") : s;
    }

    private static String clip(String s) {
        return s.length() <= 18 ? s : s.substring(0, 18);
    }

    private static double[] echoIndex(int n) {
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = i + 1;
        }
        return x;
    }

    private static double[] filled(int n, double v) {
        double[] x = new double[n];
        java.util.Arrays.fill(x, v);
        return x;
    }
}
