package org.echotrellis.cli;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.echotrellis.pathway.ClassDecomposition;
import org.echotrellis.pathway.Pathway;
import org.echotrellis.pathway.TopPathways;
import org.echotrellis.sequence.Protocol;

/** Renders a pathway analysis as an aligned table, CSV or the JSON contract of {@code pathways}. */
final class PathwayReport {
    private PathwayReport() { }

    /** NaN (undefined share) becomes JSON null. */
    private static Double orNull(double v) {
        return Double.isNaN(v) ? null : v;
    }

    /** Phase in degrees, (-180, 180], with rounding noise around 0 shown as 0. */
    private static double phaseDeg(double re, double im) {
        double deg = Math.toDegrees(Math.atan2(im + 0.0, re)); // + 0.0 turns -0.0 into 0.0: 180, not -180
        return Math.abs(deg) < 5e-4 ? 0.0 : deg;
    }

    static Map<String, Object> json(Protocol p, ClassDecomposition d, TopPathways tp) {
        Map<String, Object> root = Tables.protocolJson(p);
        List<Map<String, Object>> echoes = new ArrayList<>();
        for (int e = 0; e < d.echoCount(); e++) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("index", e + 1);
            m.put("label", d.label(e));
            m.put("time_ms", d.timeMs(e));
            m.put("real", d.echoRe(e));
            m.put("imag", d.echoIm(e));
            m.put("magnitude", d.magnitude(e));
            List<Map<String, Object>> classes = new ArrayList<>();
            for (int c = 0; c < d.classCount(e); c++) {
                Map<String, Object> cm = new LinkedHashMap<>();
                cm.put("longitudinal_intervals", c);
                cm.put("real", d.classRe(e, c));
                cm.put("imag", d.classIm(e, c));
                cm.put("magnitude", Math.hypot(d.classRe(e, c), d.classIm(e, c)));
                classes.add(cm);
            }
            m.put("classes", classes);
            m.put("stimulated_share", orNull(d.stimulatedShare(e)));
            if (tp != null && tp.echo() == e) {
                putPathways(m, tp);
            }
            echoes.add(m);
        }
        root.put("echoes", echoes);
        if (tp != null) {
            root.put("pathway_echo", tp.echo() + 1);
            putPathways(root, tp);
        }
        return root;
    }

    private static void putPathways(Map<String, Object> m, TopPathways tp) {
        List<Map<String, Object>> list = new ArrayList<>();
        for (Pathway pw : tp.pathways()) {
            Map<String, Object> pm = new LinkedHashMap<>();
            pm.put("states", pw.states());
            pm.put("real", pw.re());
            pm.put("imag", pw.im());
            pm.put("magnitude", pw.magnitude());
            pm.put("share", orNull(pw.share()));
            pm.put("longitudinal_intervals", pw.longitudinalIntervals());
            list.add(pm);
        }
        m.put("top_pathways", list);
        m.put("unexplained", orNull(tp.unexplainedShare()));
        m.put("unexplained_real", tp.unexplainedRe());
        m.put("unexplained_imag", tp.unexplainedIm());
        m.put("search_complete", tp.complete());
    }

    static String table(Protocol p, ClassDecomposition d, TopPathways tp) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "# %s  (T1 %s ms, T2 %s ms, B1 %.3f)%n", p.name(),
                Tables.num(p.tissue().t1Ms()), Tables.num(p.tissue().t2Ms()), p.b1Scale()));
        sb.append("# class contributions projected on the echo phase (they add up to the magnitude);"
                + " m = periods spent as dephased longitudinal magnetization\n");
        String head = "%5s  %10s  %10s  %10s  %10s  %10s  %10s  %10s  %11s%n";
        sb.append(String.format(Locale.ROOT, head, "echo", "time_ms", "magnitude", "phase_deg", "m=0", "m=1", "m=2",
                "m>=3", "stim_share"));
        for (int e = 0; e < d.echoCount(); e++) {
            double share = d.stimulatedShare(e);
            sb.append(String.format(Locale.ROOT, "%5d  %10.3f  %10.6f  %10.3f  %10.6f  %10.6f  %10.6f  %10.6f  %11s%n",
                    e + 1, d.timeMs(e), d.magnitude(e), phaseDeg(d.echoRe(e), d.echoIm(e)),
                    d.projected(e, 0, 0), d.projected(e, 1, 1), d.projected(e, 2, 2),
                    d.projected(e, 3, Integer.MAX_VALUE),
                    Double.isNaN(share) ? "-" : String.format(Locale.ROOT, "%.6f", share)));
        }
        if (tp != null) {
            sb.append(String.format(Locale.ROOT, "%n# largest pathways of echo %d (|A| = %.6f)%n", tp.echo() + 1,
                    Math.hypot(tp.echoRe(), tp.echoIm())));
            int w = 6;
            for (Pathway pw : tp.pathways()) {
                w = Math.max(w, pw.states().length());
            }
            String ph = "%4s  %-" + w + "s  %10s  %10s  %9s  %3s%n";
            sb.append(String.format(Locale.ROOT, ph, "rank", "states", "magnitude", "phase_deg", "share", "m"));
            String pr = "%4d  %-" + w + "s  %10.3e  %10.3f  %9.5f  %3d%n";
            int rank = 1;
            for (Pathway pw : tp.pathways()) {
                sb.append(String.format(Locale.ROOT, pr, rank++, pw.states(), pw.magnitude(),
                        phaseDeg(pw.re(), pw.im()), pw.share(), pw.longitudinalIntervals()));
            }
            if (tp.pathways().isEmpty()) {
                sb.append("(no pathway above --min-amplitude)\n");
            }
            sb.append(String.format(Locale.ROOT, "unexplained by the listed pathways: share %.5f, |rest| = %.3e%s%n",
                    tp.unexplainedShare(), tp.unexplainedMagnitude(),
                    tp.complete() ? "" : " (search stopped at its memory cap)"));
        }
        return Tables.noNegativeZero(sb.toString());
    }

    static String csv(ClassDecomposition d, TopPathways tp) {
        int classes = 0;
        for (int e = 0; e < d.echoCount(); e++) {
            classes = Math.max(classes, d.classCount(e));
        }
        StringBuilder sb = new StringBuilder("index,time_ms,real,imag,magnitude,stimulated_share");
        for (int c = 0; c < classes; c++) {
            sb.append(",class_").append(c).append("_real,class_").append(c).append("_imag");
        }
        sb.append('\n');
        for (int e = 0; e < d.echoCount(); e++) {
            double share = d.stimulatedShare(e);
            sb.append(e + 1).append(',').append(d.timeMs(e)).append(',').append(d.echoRe(e)).append(',')
                    .append(d.echoIm(e)).append(',').append(d.magnitude(e)).append(',')
                    .append(Double.isNaN(share) ? "" : Double.toString(share));
            for (int c = 0; c < classes; c++) {
                sb.append(',').append(d.classRe(e, c)).append(',').append(d.classIm(e, c));
            }
            sb.append('\n');
        }
        if (tp != null) {
            sb.append("\nrank,states,real,imag,magnitude,share,longitudinal_intervals\n");
            int rank = 1;
            for (Pathway pw : tp.pathways()) {
                sb.append(rank++).append(',').append(pw.states()).append(',').append(pw.re()).append(',')
                        .append(pw.im()).append(',').append(pw.magnitude()).append(',').append(pw.share()).append(',')
                        .append(pw.longitudinalIntervals()).append('\n');
            }
            sb.append("unexplained,,").append(tp.unexplainedRe()).append(',').append(tp.unexplainedIm()).append(',')
                    .append(tp.unexplainedMagnitude()).append(',').append(tp.unexplainedShare()).append(",\n");
        }
        return sb.toString();
    }
}
