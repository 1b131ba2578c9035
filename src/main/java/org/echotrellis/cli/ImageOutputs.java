package org.echotrellis.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.echotrellis.image.ContrastPair;
import org.echotrellis.image.ImageReport;
import org.echotrellis.image.PhantomImages;
import org.echotrellis.image.TissueImage;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.ImagePanels;
import org.echotrellis.plot.LineChart;
import org.jfree.chart.JFreeChart;

/** Table, JSON and charts of the {@code image} command (also used by the demo). */
final class ImageOutputs {
    /** Chart stems written by --plot and --out. */
    static final List<String> CHARTS = List.of("weights", "psf", "phantom");

    private ImageOutputs() { }

    /** JSON with exactly the contract keys: tissues and pairs. Undefined numbers are null. */
    static Map<String, Object> json(ImageReport r) {
        List<Map<String, Object>> tissues = new ArrayList<>();
        for (TissueImage t : r.tissues()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("name", t.name());
            m.put("effective_te_ms", t.effectiveTeMs());
            m.put("center_signal", t.centerSignal());
            m.put("psf_fwhm_px", orNull(t.figures().fwhmPx()));
            m.put("psf_peak", orNull(t.figures().peak()));
            m.put("psf_sidelobe", orNull(t.figures().sidelobe()));
            m.put("weights", t.weights());
            tissues.add(m);
        }
        List<Map<String, Object>> pairs = new ArrayList<>();
        for (ContrastPair p : r.pairs()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("a", p.a());
            m.put("b", p.b());
            m.put("contrast", p.contrast());
            m.put("cnr", orNull(p.cnr()));
            pairs.add(m);
        }
        Map<String, Object> root = new LinkedHashMap<>();
        root.put("tissues", tissues);
        root.put("pairs", pairs);
        return root;
    }

    private static Double orNull(double v) {
        return Double.isFinite(v) ? v : null;
    }

    /** A plain-text table of the tissues and the pairs. */
    static String table(ImageReport r, String protocolName) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "%s: %d lines, %d echoes per train, %d shots, ordering %s%n", protocolName,
                r.ordering().lines(), r.ordering().echoes(), r.ordering().shots(), r.ordering().describe()));
        sb.append(String.format(Locale.ROOT, "%-22s %9s %9s %10s %12s %10s %9s %10s%n", "tissue", "T1_ms", "T2_ms",
                "eff_TE_ms", "center_sig", "fwhm_px", "psf_peak", "sidelobe"));
        for (TissueImage t : r.tissues()) {
            sb.append(String.format(Locale.ROOT, "%-22s %9s %9s %10.2f %12.5f %10.3f %9.4f %10.4f%n", t.name(),
                    Tables.num(t.tissue().t1Ms()), Tables.num(t.tissue().t2Ms()), t.effectiveTeMs(), t.centerSignal(),
                    t.figures().fwhmPx(), t.figures().peak(), t.figures().sidelobe()));
        }
        if (!r.pairs().isEmpty()) {
            sb.append(String.format(Locale.ROOT, "%n%-22s %-22s %12s %10s%n", "tissue_a", "tissue_b", "contrast", "cnr"));
            for (ContrastPair p : r.pairs()) {
                sb.append(String.format(Locale.ROOT, "%-22s %-22s %12.5f %10s%n", p.a(), p.b(), p.contrast(),
                        Double.isNaN(p.cnr()) ? "-" : String.format(Locale.ROOT, "%.3f", p.cnr())));
            }
        }
        return sb.toString();
    }

    /** Weight of every line against its k-index (j − L/2), one series per tissue. */
    static JFreeChart weightsChart(ImageReport r, String title) {
        int n = r.ordering().lines();
        double[] k = new double[n];
        for (int j = 0; j < n; j++) {
            k[j] = j - n / 2;
        }
        LineChart c = LineChart.create(title, "phase-encoding k-index (line − L/2)", "k-space weight (echo magnitude, M0 = 1)")
                .subtitle(r.ordering().describe() + " ordering, " + n + " lines, " + r.ordering().shots() + " shots");
        for (TissueImage t : r.tissues()) {
            c.add(label(t), k, t.weights(), LineChart.Look.LINE);
        }
        return c.build();
    }

    /** PSF against pixel offset, one series per tissue, around the main lobe. */
    static JFreeChart psfChart(ImageReport r, String title) {
        int n = r.ordering().lines();
        double[] x = new double[n];
        double widest = 1;
        for (int i = 0; i < n; i++) {
            x[i] = i - n / 2;
        }
        LineChart c = LineChart.create(title, "pixel offset along phase encoding (px)", "PSF magnitude (flat weights: 1)")
                .subtitle(r.ordering().describe() + " ordering; FWHM by linear interpolation on the main lobe");
        for (TissueImage t : r.tissues()) {
            c.add(String.format(Locale.ROOT, "%s, FWHM %.2f px", label(t), t.figures().fwhmPx()), x, t.psf(),
                    LineChart.Look.LINE_MARKERS);
            if (Double.isFinite(t.figures().fwhmPx())) {
                widest = Math.max(widest, t.figures().fwhmPx());
            }
        }
        double half = Math.min(n / 2.0, Math.max(8, Math.ceil(4 * widest)));
        return c.xRange(-half - 0.5, half + 0.5).build();
    }

    /** The ideal image next to one or more simulated images, one grey scale. */
    static JFreeChart phantomChart(String title, String subtitle, PhantomImages ideal, List<String> captions,
                                   List<PhantomImages> simulated) {
        ImagePanels p = ImagePanels.create(title, ideal.rows(), ideal.cols()).subtitle(subtitle);
        p.add("ideal (centre weights)", ideal.ideal());
        for (int i = 0; i < simulated.size(); i++) {
            p.add(captions.get(i), simulated.get(i).simulated());
        }
        return p.build(upper(ideal));
    }

    /** @return {width, height} for a phantom chart with this many panels */
    static int[] phantomSize(PhantomImages ideal, int panels) {
        ImagePanels p = ImagePanels.create("", ideal.rows(), ideal.cols());
        for (int i = 0; i < panels; i++) {
            p.add("", ideal.ideal());
        }
        return p.size();
    }

    private static double upper(PhantomImages img) {
        double max = 0;
        for (double v : img.ideal()) {
            max = Math.max(max, v);
        }
        return max > 0 ? 1.15 * max : 1;
    }

    /** Writes one chart. */
    static void write(JFreeChart chart, Path file, int[] size, boolean force) {
        ChartFiles.write(chart, file, size[0], size[1], force);
    }

    private static String label(TissueImage t) {
        return String.format(Locale.ROOT, "%s (T2 %s ms)", t.name(), Tables.num(t.tissue().t2Ms()));
    }
}
