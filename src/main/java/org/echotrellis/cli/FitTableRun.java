package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.FitModel;
import org.echotrellis.fit.T2Estimate;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.io.DecayTable;
import org.echotrellis.io.DecayTableReader;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Json;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VoxelStatus;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.LineChart;
import org.echotrellis.sequence.Protocol;

/**
 * The decay-table branch of {@code fit}: one fit per column, a table or JSON, and a plot only when
 * asked for, bounded in size: at most {@link #PLOT_DECAYS} decays drawn plus a summary line over all.
 */
final class FitTableRun {
    /** Most decays drawn on a table's plot; a wider table shows an evenly spaced sample. */
    static final int PLOT_DECAYS = 12;

    private final T2Fit.Factory factory;
    private final Protocol protocol;
    private final List<Path> plotFiles;
    private final boolean force;
    private final List<Path> inputs;

    /**
     * @param plotFiles plots to write (none: no plot)
     * @param inputs the run's inputs, never written over
     */
    FitTableRun(T2Fit.Factory factory, Protocol protocol, List<Path> plotFiles, boolean force, List<Path> inputs) {
        this.factory = factory;
        this.protocol = protocol;
        this.plotFiles = List.copyOf(plotFiles);
        this.force = force;
        this.inputs = inputs;
    }

    void run(Path csv, boolean json, PrintWriter o, Map<String, Object> provenance, ReportOption report) {
        DecayTable table = DecayTableReader.read(csv);
        CpmgTrain train = factory.settings().train();
        checkTimes(table, train);
        for (Path f : plotFiles) {
            ChartFiles.isSvg(f);
            AtomicFiles.checkWritable(f, force, inputs);
        }
        T2Fit fit = factory.newKernel();
        double[] times = table.echoTimesMs();
        LineChart chart = LineChart.create(protocol.name() + ": decays and fits", "echo time (ms)", "signal");
        int step = Math.max(1, (table.count() + PLOT_DECAYS - 1) / PLOT_DECAYS);
        List<Map<String, Object>> rows = new ArrayList<>();
        double[] t2 = new double[table.count()];
        int fitted = 0;
        for (int c = 0; c < table.count(); c++) {
            T2Estimate e = fit.estimate(table.decay(c), Double.NaN);
            String name = table.names().get(c);
            rows.add(row(name, e));
            if (e.status().fitted() && Double.isFinite(e.t2Ms())) {
                t2[fitted++] = e.t2Ms();
            }
            if (!plotFiles.isEmpty() && c % step == 0 && e.status() != VoxelStatus.INVALID_INPUT) {
                double[][] curves = fit.curves(e);
                int colour = c / step;
                chart.add(name + " data", times, table.decay(c), LineChart.Look.MARKERS, colour);
                if (factory.model() == FitModel.EPG && e.status().fitted()) {
                    chart.add(name + String.format(Locale.ROOT, " EPG T2 %.1f ms", e.t2Ms()), times, curves[0],
                            LineChart.Look.LINE, colour);
                }
                if (Double.isFinite(curves[1][0])) {
                    chart.add(name + String.format(Locale.ROOT, " mono T2 %.1f ms", e.monoT2Ms()), times, curves[1],
                            LineChart.Look.DASHED, colour);
                }
            }
        }
        if (json) {
            Map<String, Object> root = new LinkedHashMap<>();
            root.put("fits", rows);
            root.put("provenance", provenance);
            o.print(Json.write(root));
        } else {
            o.print(table(rows));
        }
        o.flush();
        if (!plotFiles.isEmpty()) {
            double[] sorted = Arrays.copyOf(t2, fitted);
            Arrays.sort(sorted);
            chart.subtitle(String.format(Locale.ROOT, "%d of %d decays shown%s; %d fitted, median T2 %s ms "
                    + "(quartiles %s to %s); markers: data, solid: EPG fit, dashed: mono-exponential",
                    (table.count() + step - 1) / step, table.count(), step > 1 ? " (every " + step + "th)" : "", fitted,
                    Tables.num(RunSummary.percentile(sorted, 50)), Tables.num(RunSummary.percentile(sorted, 25)),
                    Tables.num(RunSummary.percentile(sorted, 75))));
            for (Path f : plotFiles) {
                ChartFiles.write(chart.build(), f, 900, 560, force);
            }
        }
        report.settings(Tables.protocolJson(protocol));
        report.write("fit: " + csv.getFileName(), force, r -> {
            var s = r.section("Fits").records("One row per decay", rows);
            if (!plotFiles.isEmpty()) {
                s.chart(chart.build(), 900, 560, "Decays of " + csv.getFileName() + " with the fitted curves");
            }
        });
    }

    private static void checkTimes(DecayTable t, CpmgTrain train) {
        Tables.requireHeaderRow(t);
        if (t.echoes() != train.echoes()) {
            throw new InputException(t.source() + ": " + t.echoes() + " echoes, but the protocol has " + train.echoes());
        }
        double[] te = t.echoTimesMs();
        for (int i = 0; i < te.length; i++) {
            double want = train.echoTimeMs(i + 1);
            if (Math.abs(te[i] - want) > 0.01 * train.echoSpacingMs()) {
                throw new InputException(t.source() + " row " + (i + 1) + ": echo time " + te[i] + " ms, the protocol has "
                        + want + " ms (echo spacing " + train.echoSpacingMs() + " ms)");
            }
        }
    }

    private static Map<String, Object> row(String name, T2Estimate e) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("name", name);
        m.put("t2_ms", finite(e.t2Ms()));
        m.put("t2_se_ms", finite(e.t2SeMs()));
        m.put("b1_scale", finite(e.b1Scale()));
        m.put("b1_se", finite(e.b1Se()));
        m.put("amplitude", finite(e.amplitude()));
        m.put("residual_rms", finite(e.residualRms()));
        m.put("status", e.status().label());
        m.put("mono_t2_ms", finite(e.monoT2Ms()));
        return m;
    }

    private static Double finite(double v) {
        return Double.isFinite(v) ? v : null;
    }

    private static String table(List<Map<String, Object>> rows) {
        StringBuilder sb = new StringBuilder(String.format(Locale.ROOT, "%-16s %10s %10s %9s %9s %11s %11s %-14s %11s%n",
                "name", "t2_ms", "t2_se_ms", "b1_scale", "b1_se", "amplitude", "resid_rms", "status", "mono_t2_ms"));
        for (Map<String, Object> r : rows) {
            sb.append(String.format(Locale.ROOT, "%-16s %10s %10s %9s %9s %11s %11s %-14s %11s%n", r.get("name"),
                    fmt(r.get("t2_ms"), 2), fmt(r.get("t2_se_ms"), 2), fmt(r.get("b1_scale"), 4), fmt(r.get("b1_se"), 4),
                    fmt(r.get("amplitude"), 4), fmt(r.get("residual_rms"), 5), r.get("status"), fmt(r.get("mono_t2_ms"), 2)));
        }
        return sb.toString();
    }

    private static String fmt(Object v, int digits) {
        return v == null ? "-" : String.format(Locale.ROOT, "%." + digits + "f", (Double) v);
    }
}
