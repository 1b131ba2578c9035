package org.echotrellis.cli;

import java.util.Locale;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;

/** Text renderings of echo trains: aligned tables and CSV. */
final class Tables {
    private Tables() { }

    static String num(double v) {
        if (Double.isInfinite(v)) {
            return v > 0 ? "inf" : "-inf";
        }
        return v == Math.rint(v) && Math.abs(v) < 1e12 ? Long.toString((long) v) : String.format(Locale.ROOT, "%.6g", v);
    }

    /**
     * Removes the sign of values that print as zero ("-0.000" → " 0.000", width kept), so aligned
     * tables never show a negative zero for a phase or component that rounds to nothing.
     *
     * @param text formatted table text
     * @return the same text without negative zeros
     */
    static String noNegativeZero(String text) {
        return text.replaceAll("(?<![0-9.eE])-(0\\.0+)(?![0-9])", " $1");
    }

    /** The leading JSON fields every per-protocol report shares: protocol name, tissue and B1. */
    static java.util.Map<String, Object> protocolJson(Protocol p) {
        java.util.Map<String, Object> root = new java.util.LinkedHashMap<>();
        root.put("protocol", p.name());
        java.util.Map<String, Object> tissue = new java.util.LinkedHashMap<>();
        tissue.put("t1_ms", p.tissue().t1Ms());
        tissue.put("t2_ms", p.tissue().t2Ms());
        if (p.acquisition() != org.echotrellis.sequence.Acquisition.none() || p.tissue().diffusivityMm2PerS() > 0) {
            tissue.put("diffusivity_mm2_per_s", p.tissue().diffusivityMm2PerS());
        }
        root.put("tissue", tissue);
        root.put("b1", p.b1Scale());
        if (p.acquisition() != org.echotrellis.sequence.Acquisition.none()) {
            root.put("acquisition", p.acquisition().settings());
        }
        return root;
    }

    /** @return the engine that produced the echoes: acquisition (whole-acquisition model), cpmg or general */
    static String engine(Protocol p) {
        return !p.isIdealAcquisition() ? "acquisition" : p.cpmg().isPresent() ? "cpmg" : "general";
    }

    static String echoTable(Protocol p, EchoTrain t) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "# %s  (T1 %s ms, T2 %s ms, B1 %.3f, engine %s)%n", p.name(),
                num(p.tissue().t1Ms()), num(p.tissue().t2Ms()), p.b1Scale(), engine(p)));
        int lw = 5;
        for (String l : t.labels()) {
            lw = Math.max(lw, l.length());
        }
        String head = "%5s  %-" + lw + "s  %10s  %10s  %10s  %11s  %11s%n";
        sb.append(String.format(Locale.ROOT, head, "echo", "label", "time_ms", "magnitude", "phase_deg", "real", "imag"));
        String row = "%5d  %-" + lw + "s  %10.3f  %10.6f  %10.3f  %11.7f  %11.7f%n";
        double[] times = t.timesMs();
        double[] re = t.re();
        double[] im = t.im();
        for (int i = 0; i < t.size(); i++) {
            sb.append(String.format(Locale.ROOT, row, i + 1, t.labels().get(i), times[i], t.magnitude(i),
                    t.phaseDeg(i), re[i], im[i]));
        }
        return noNegativeZero(sb.toString());
    }

    static String echoCsv(EchoTrain t) {
        StringBuilder sb = new StringBuilder("index,label,time_ms,magnitude,phase_deg,real,imag\n");
        double[] times = t.timesMs();
        double[] re = t.re();
        double[] im = t.im();
        for (int i = 0; i < t.size(); i++) {
            sb.append(i + 1).append(',').append(csv(t.labels().get(i))).append(',').append(times[i]).append(',')
                    .append(t.magnitude(i)).append(',').append(t.phaseDeg(i)).append(',').append(re[i]).append(',')
                    .append(im[i]).append('\n');
        }
        return sb.toString();
    }

    private static String csv(String s) {
        return org.echotrellis.io.Csv.field(s);
    }

    /**
     * Refuses a decay table whose first row held numbers: it was read as the header row, so the
     * table looks one echo short (common mistake: a table saved without column names).
     *
     * @param t the table
     */
    static void requireHeaderRow(org.echotrellis.io.DecayTable t) {
        for (String name : t.names()) {
            try {
                Double.parseDouble(name.strip());
            } catch (NumberFormatException e) {
                return;
            }
        }
        throw new org.echotrellis.InputException(t.source() + ": the first row holds numbers, not column names; "
                + "add a header row (echo-time column name, then one name per decay, e.g. te_ms,voxel1,voxel2)");
    }
}
