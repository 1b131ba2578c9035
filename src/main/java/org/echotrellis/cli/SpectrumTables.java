package org.echotrellis.cli;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.echotrellis.InputException;
import org.echotrellis.fit.spectrum.BasisCache;
import org.echotrellis.fit.spectrum.FractionWindow;
import org.echotrellis.fit.spectrum.SpectrumFit;
import org.echotrellis.fit.spectrum.SpectrumFitter;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.fit.volume.SpectrumNames;
import org.echotrellis.fit.spectrum.SpectrumStatus;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.OutputSet;
import org.echotrellis.io.DecayTable;
import org.echotrellis.io.DecayTableReader;
import org.echotrellis.io.Json;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.SpectrumPlot;
import org.echotrellis.sequence.Protocol;

/** Table input of {@code spectrum}: one spectrum per decay column, printed and optionally written. */
final class SpectrumTables {
    private SpectrumTables() { }

    static List<SpectrumFit> run(Path data, Protocol p, BasisCache cache, SpectrumOptions o, String format, Path out,
                    boolean force, Map<String, Object> settings, PrintWriter stdout, List<Path> inputs) throws Exception {
        DecayTable t = DecayTableReader.read(data);
        checkEchoes(t, p);
        try (OutputSet set = out == null ? null : CliChecks.outputSet(out, force, inputs)) {
            if (set != null) {
                set.plan(List.of("spectra.csv", "spectra.json", "spectrum.png", "spectrum.svg"));
            }
            List<SpectrumFit> fits = fit(t, cache, o);
            if (set != null) {
                AtomicFiles.writeString(out.resolve("spectra.csv"), csv(fits, o), force);
                AtomicFiles.writeString(out.resolve("spectra.json"), json(fits, settings, null), force);
                for (String ext : new String[] {"png", "svg"}) {
                    ChartFiles.write(plot(fits, o, data.getFileName().toString()), out.resolve("spectrum." + ext),
                            900, 560, force);
                }
                set.commit();
            }
            print(fits, o, format, stdout, settings.get("provenance"));
            return fits;
        }
    }

    private static void print(List<SpectrumFit> fits, SpectrumOptions o, String format, PrintWriter stdout,
            Object provenance) throws Exception {
        switch (format) {
            case "json": stdout.print(json(fits, null, provenance)); break;
            case "csv": stdout.print(csv(fits, o)); break;
            default: stdout.print(text(fits, o));
        }
        stdout.flush();
    }

    /** Refuses a table whose echo count or echo times differ from the protocol. */
    static void checkEchoes(DecayTable t, Protocol p) {
        Tables.requireHeaderRow(t);
        double[] want = p.echoTimesMs();
        double[] got = t.echoTimesMs();
        if (got.length != want.length) {
            throw new InputException(t.source() + ": " + got.length + " echoes, but the protocol has " + want.length);
        }
        for (int i = 0; i < want.length; i++) {
            if (Math.abs(got[i] - want[i]) > 1e-6 * Math.max(1, want[i]) + 1e-3) {
                throw new InputException(t.source() + ": echo " + (i + 1) + " at " + got[i]
                        + " ms, but the protocol has it at " + want[i] + " ms");
            }
        }
    }

    static List<SpectrumFit> fit(DecayTable t, BasisCache cache, SpectrumOptions o) {
        SpectrumFitter fitter = new SpectrumFitter(cache, o);
        List<SpectrumFit> fits = new ArrayList<>();
        for (int c = 0; c < t.count(); c++) {
            fits.add(fitter.fit(t.names().get(c), t.decay(c)));
        }
        return fits;
    }

    static org.jfree.chart.JFreeChart plot(List<SpectrumFit> fits, SpectrumOptions o, String source) {
        List<String> names = new ArrayList<>();
        List<double[]> amps = new ArrayList<>();
        for (SpectrumFit f : fits) {
            if (SpectrumStatus.fitted(f.status())) {
                names.add(f.name());
                amps.add(f.amplitude());
            }
        }
        List<double[]> ws = new ArrayList<>();
        for (FractionWindow w : o.windows()) {
            ws.add(new double[] {w.loMs(), w.hiMs()});
        }
        String sub = source + " · " + o.grid().bins() + " bins, regularisation " + o.regularisation().label();
        return SpectrumPlot.chart("T2 spectrum", sub, o.grid().t2Ms(), names, amps, ws);
    }

    /**
     * @param fits the fitted decays
     * @param settings the run's settings (with its provenance) for the file, or null
     * @param provenance a provenance block on its own for stdout, or null
     */
    static String json(List<SpectrumFit> fits, Map<String, Object> settings, Object provenance) throws Exception {
        ObjectNode root = Json.MAPPER.createObjectNode();
        ArrayNode arr = root.putArray("spectra");
        for (SpectrumFit f : fits) {
            ObjectNode s = arr.addObject();
            s.put("name", f.name());
            ArrayNode t2 = s.putArray("t2_ms");
            for (double v : f.t2Ms()) {
                t2.add(v);
            }
            ArrayNode amp = s.putArray("amplitude");
            for (double v : f.amplitude()) {
                amp.add(v);
            }
            num(s, "refocus_deg", f.refocusDeg());
            num(s, "chi2", f.chi2());
            ArrayNode fr = s.putArray("fractions");
            for (SpectrumFit.Window w : f.windows()) {
                ObjectNode wn = fr.addObject();
                wn.put("lo_ms", w.window().loMs());
                wn.put("hi_ms", w.window().hiMs());
                num(wn, "fraction", w.fraction());
                num(wn, "gm_t2_ms", w.gmT2Ms());
            }
            num(s, "gm_t2_ms", f.gmT2Ms());
            num(s, "chi2_unregularised", f.chi2Unregularised());
            num(s, "regularisation_weight", f.mu());
            num(s, "snr", f.snr());
            s.put("status", SpectrumStatus.describe(f.status()));
        }
        if (settings != null) {
            root.set("settings", Json.MAPPER.valueToTree(settings));
        }
        if (provenance != null) {
            root.set("provenance", Json.MAPPER.valueToTree(provenance));
        }
        return Json.MAPPER.writeValueAsString(root) + "\n";
    }

    private static void num(ObjectNode n, String key, double v) {
        if (Double.isFinite(v)) {
            n.put(key, v);
        } else {
            n.putNull(key);
        }
    }

    static String csv(List<SpectrumFit> fits, SpectrumOptions o) {
        List<String> names = SpectrumNames.scalars(o);
        StringBuilder sb = new StringBuilder("name,status");
        for (String n : names) {
            sb.append(',').append(n);
        }
        for (double t2 : o.grid().t2Ms()) {
            sb.append(',').append(SpectrumNames.bin(t2));
        }
        sb.append('\n');
        for (SpectrumFit f : fits) {
            sb.append(quote(f.name())).append(',').append(SpectrumStatus.describe(f.status()).replace(' ', '_'));
            for (double v : scalars(f)) {
                sb.append(',').append(g(v));
            }
            for (double v : f.amplitude()) {
                sb.append(',').append(g(v));
            }
            sb.append('\n');
        }
        return sb.toString();
    }

    /** Scalars of a fit in the slot order of {@link SpectrumNames#scalars}. */
    static double[] scalars(SpectrumFit f) {
        double[] v = new double[6 + 2 * f.windows().size()];
        v[SpectrumFitter.REFOCUS_DEG] = f.refocusDeg();
        v[SpectrumFitter.CHI2] = f.chi2();
        v[SpectrumFitter.CHI2_UNREGULARISED] = f.chi2Unregularised();
        v[SpectrumFitter.MU] = f.mu();
        v[SpectrumFitter.SNR] = f.snr();
        v[SpectrumFitter.GM_T2_MS] = f.gmT2Ms();
        for (int w = 0; w < f.windows().size(); w++) {
            v[SpectrumFitter.fractionSlot(w)] = f.windows().get(w).fraction();
            v[SpectrumFitter.windowGmT2Slot(w)] = f.windows().get(w).gmT2Ms();
        }
        return v;
    }

    static String text(List<SpectrumFit> fits, SpectrumOptions o) {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(Locale.ROOT, "# T2 spectra: %d bins %s-%s ms, regularisation %s%n", o.grid().bins(),
                Tables.num(o.grid().minMs()), Tables.num(o.grid().maxMs()), o.regularisation().label()));
        sb.append(String.format(Locale.ROOT, "%-16s %9s %9s %10s %8s %11s", "name", "refoc_deg", "gm_t2_ms", "chi2",
                "snr", "weight"));
        for (FractionWindow w : o.windows()) {
            sb.append(String.format(Locale.ROOT, " %14s", "frac_" + w.label()));
        }
        sb.append("  status\n");
        for (SpectrumFit f : fits) {
            sb.append(String.format(Locale.ROOT, "%-16s %9.2f %9.2f %10.4g %8.1f %11.4g", f.name(), f.refocusDeg(),
                    f.gmT2Ms(), f.chi2(), f.snr(), f.mu()));
            for (SpectrumFit.Window w : f.windows()) {
                sb.append(String.format(Locale.ROOT, " %14.4f", w.fraction()));
            }
            sb.append("  ").append(SpectrumStatus.describe(f.status())).append('\n');
        }
        return sb.toString();
    }

    private static String quote(String s) {
        return org.echotrellis.io.Csv.field(s);
    }

    private static String g(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.9g", v) : "NaN";
    }
}
