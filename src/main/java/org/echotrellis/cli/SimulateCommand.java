package org.echotrellis.cli;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Json;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.EchoPlot;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Tissue;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code simulate}: echo amplitudes of a protocol, or a dictionary over a (T1, T2, B1) grid. */
@Command(name = "simulate", mixinStandardHelpOptions = true,
        description = "Predict the echo train of a protocol file with the extended phase graph.",
        footer = {"", "Examples:",
            "  java -jar target/echotrellis.jar simulate sequences/knee-t2-16.yaml \\",
            "      --b1 0.8 --plot knee.png --plot-tissue csf_3t,lesion:1400:120",
            "  java -jar target/echotrellis.jar simulate sequences/knee-t2-16.yaml \\",
            "      --refocusing-flip-deg 150 --t2-ms inf",
            "  java -jar target/echotrellis.jar simulate sequences/brain-mwi-32.yaml \\",
            "      --format json",
            "  java -jar target/echotrellis.jar simulate sequences/knee-t2-16.yaml \\",
            "      --sweep t2_ms=10:100:10 --sweep b1=0.6:1:5 --out dict.csv",
            "",
            "--b1 scales every pulse (the excitation too, as a B1 fall-off does);",
            "--refocusing-flip-deg changes only the refocusing pulses."})
final class SimulateCommand implements Callable<Integer> {
    @Mixin
    CommonOptions common;

    @Mixin
    PlotOptions plotOptions;

    @Spec
    CommandSpec spec;

    @Mixin
    ReportOption report;

    @Mixin
    ProtocolInput input;

    @Option(names = "--format", paramLabel = "FMT", defaultValue = "table",
            description = "Output format: table, csv or json (default: ${DEFAULT-VALUE}).")
    Format format;

    @Option(names = "--plot", paramLabel = "PATH", description = "Write a plot of the echo train (.png or .svg).")
    Path plot;

    @Option(names = "--plot-b1", paramLabel = "SCALES", split = ",",
            description = "Extra B1 scales drawn on the plot, e.g. 0.7,0.85.")
    List<Double> plotB1 = new ArrayList<>();

    @Option(names = "--plot-tissue", paramLabel = "TISSUE", split = ",",
            description = "Extra tissues drawn on the plot at the same B1: a preset name (e.g. csf_3t) "
                    + "or NAME:T1_MS:T2_MS (e.g. lesion:1400:120).")
    List<String> plotTissues = new ArrayList<>();

    @Option(names = "--sweep", paramLabel = "NAME=START:STOP:COUNT",
            description = "Simulate a grid (repeatable; NAME one of t2_ms, t1_ms, b1); writes CSV, one row per point.")
    List<String> sweeps = new ArrayList<>();

    @Option(names = "--out", paramLabel = "PATH", description = "Write the sweep CSV to this file instead of stdout.")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads for sweeps (default: all cores).")
    Integer threads;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    @Option(names = "--quiet", description = "No progress bar.")
    boolean quiet;

    /** Output formats. */
    enum Format { table, csv, json }

    @Override
    public Integer call() {
        refuseIgnoredOptions();
        report.begin(spec, force);
        Protocol p = input.load();
        Tissue t = p.tissue();
        double scale = p.b1Scale();
        PrintWriter o = spec.commandLine().getOut();
        if (!sweeps.isEmpty()) {
            sweep(p, o);
            report.settings(CommandReports.acquisition(p));
            report.write("simulate sweep: " + p.name(), force, r -> r.section("Sweep").facts(Map.of("grid points",
                    SweepGrid.parse(sweeps, t.t1Ms(), t.t2Ms(), scale).size(), "CSV", out == null ? "standard output" : out)));
            return 0;
        }
        EchoTrain train = Simulator.simulate(p);
        switch (format) {
            case json -> o.print(Json.write(CliChecks.withProvenance(json(p, train), spec, input.file)));
            case csv -> o.print(Tables.echoCsv(train));
            default -> o.print(Tables.echoTable(p, train));
        }
        o.flush();
        if (plot != null) {
            ChartFiles.write(echoChart(p, train), plot, 900, 560, force);
        }
        report.settings(CommandReports.acquisition(p));
        report.write("simulate: " + p.name(), force, r -> CommandReports.simulate(r, p, train, echoChart(p, train)));
        return 0;
    }

    /** The echo-train chart of --plot and of the report (extra B1 scales and tissues included). */
    private org.jfree.chart.JFreeChart echoChart(Protocol p, EchoTrain train) {
        Tissue t = p.tissue();
        double scale = p.b1Scale();
        EchoPlot ep = EchoPlot.create(p.name() + ": predicted echo train")
                .subtitle(String.format(Locale.ROOT, "T1 = %s ms, T2 = %s ms, B1 = %.2f; engine: %s",
                        Tables.num(t.t1Ms()), Tables.num(t.t2Ms()), scale, p.cpmg().isPresent() ? "CPMG fast path" : "general"));
        ep.train(tissueLabel(t) + String.format(Locale.ROOT, ", B1 %.2f", scale), train);
        for (double extra : plotB1) {
            ep.train(tissueLabel(t) + String.format(Locale.ROOT, ", B1 %.2f", extra),
                    Simulator.simulate(p, t.t1Ms(), t.t2Ms(), CliChecks.b1("--plot-b1", extra)));
        }
        for (String spec : plotTissues) {
            Tissue extra = TissueOption.parse(spec, "--plot-tissue");
            ep.train(tissueLabel(extra) + String.format(Locale.ROOT, ", B1 %.2f", scale),
                    Simulator.simulate(p, extra.t1Ms(), extra.t2Ms(), scale));
        }
        double[] times = train.timesMs();
        double exc = p.cpmg().map(c -> Math.abs(Math.sin(Math.toRadians(c.excitationFlipDeg() * scale)))).orElse(1.0);
        if (!Double.isInfinite(t.t2Ms()) && times.length > 0) {
            ep.ideal(t.t2Ms(), exc, times[times.length - 1]);
        }
        return ep.build();
    }

    /**
     * Options that the chosen mode would ignore are refused rather than silently dropped, and the plot
     * path is checked before any work or output.
     */
    private void refuseIgnoredOptions() {
        if (sweeps.isEmpty()) {
            if (threads != null) {
                throw new InputException("--threads " + threads + " applies to --sweep grids; a single train runs on one thread");
            }
            if (out != null) {
                throw new InputException("--out " + out + ": --out writes the --sweep CSV; a single train goes to "
                        + "stdout (redirect it) and its plot to --plot");
            }
            if (plot != null) {
                ChartFiles.isSvg(plot);
                AtomicFiles.checkWritable(plot, force, List.of(input.file));
            } else if (!plotB1.isEmpty() || !plotTissues.isEmpty()) {
                throw new InputException((plotB1.isEmpty() ? "--plot-tissue" : "--plot-b1")
                        + " adds curves to the --plot chart; give --plot PATH.png or PATH.svg too");
            }
            for (double extra : plotB1) {
                CliChecks.b1("--plot-b1", extra);
            }
            for (String spec : plotTissues) {
                TissueOption.parse(spec, "--plot-tissue");
            }
            return;
        }
        if (out != null) {
            AtomicFiles.checkWritable(out, force, List.of(input.file));
        }
        CommandLine.ParseResult parsed = spec.commandLine().getParseResult();
        for (String option : List.of("--format", "--plot", "--plot-b1", "--plot-tissue")) {
            if (parsed.hasMatchedOption(option)) {
                throw new InputException(option + " cannot be combined with --sweep; a sweep writes CSV, one row per grid point");
            }
        }
    }

    /** Legend text of a tissue: its name (or "tissue") with T1 and T2. */
    private static String tissueLabel(Tissue t) {
        String name = t.name() == null || t.name().isBlank() ? "tissue" : t.name();
        return String.format(Locale.ROOT, "%s (T1 %s, T2 %s ms)", name, Tables.num(t.t1Ms()), Tables.num(t.t2Ms()));
    }

    private Map<String, Object> json(Protocol p, EchoTrain train) {
        Map<String, Object> root = Tables.protocolJson(p);
        root.put("engine", Tables.engine(p));
        List<Map<String, Object>> echoes = new ArrayList<>();
        double[] times = train.timesMs();
        double[] re = train.re();
        double[] im = train.im();
        for (int i = 0; i < train.size(); i++) {
            Map<String, Object> e = new LinkedHashMap<>();
            e.put("index", i + 1);
            e.put("label", train.labels().get(i));
            e.put("time_ms", times[i]);
            e.put("magnitude", train.magnitude(i));
            e.put("phase_deg", train.phaseDeg(i));
            e.put("real", re[i]);
            e.put("imag", im[i]);
            echoes.add(e);
        }
        root.put("echoes", echoes);
        return root;
    }

    private int sweep(Protocol p, PrintWriter o) {
        SweepGrid grid = SweepGrid.parse(sweeps, p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale());
        int nThreads = threads == null ? Runtime.getRuntime().availableProcessors() : CliChecks.threads(threads);
        int chunk = SweepWriter.chunkPoints(p.echoCount());
        try (ProgressBar bar = new ProgressBar(spec.commandLine().getErr(), "points", grid.size(),
                quiet || !Terminal.stderrIsTerminal())) {
            if (out != null) {
                AtomicFiles.write(out, force, stream -> {
                    Writer w = new BufferedWriter(new OutputStreamWriter(stream, StandardCharsets.UTF_8), 1 << 16);
                    SweepWriter.write(p, grid, nThreads, chunk, w, bar::update);
                });
            } else {
                SweepWriter.write(p, grid, nThreads, chunk, o, bar::update);
            }
        } catch (IOException e) {
            throw new InputException("cannot write the sweep CSV: " + e.getMessage(), e);
        }
        return 0;
    }
}
