package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Json;
import org.echotrellis.pathway.ClassDecomposition;
import org.echotrellis.pathway.PathwayAnalysis;
import org.echotrellis.pathway.PathwaySearch;
import org.echotrellis.pathway.PhaseGraph;
import org.echotrellis.pathway.TopPathways;
import org.echotrellis.plot.ChartFiles;
import org.jfree.chart.JFreeChart;
import org.echotrellis.plot.ClassContributionChart;
import org.echotrellis.plot.PhaseGraphDiagram;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Tissue;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code pathways}: which coherence pathways form each echo, the stimulated share, the phase graph. */
@Command(name = "pathways", mixinStandardHelpOptions = true,
        description = {"Split every echo of a protocol into classes by the number of periods its pathways spent "
                + "as dephased longitudinal magnetization (m = 0: spin echoes; m >= 1: stimulated echoes), "
                + "list the largest individual pathways of one echo, and draw the phase graph."},
        footer = {"", "Examples:",
            "  java -jar target/echotrellis.jar pathways sequences/knee-t2-16.yaml \\",
            "      --b1 0.8 --plot classes.png",
            "  java -jar target/echotrellis.jar pathways sequences/brain-mwi-32.yaml \\",
            "      --b1 0.8 --diagram graph.svg --diagram-threshold 0.01",
            "  java -jar target/echotrellis.jar pathways sequences/knee-t2-16.yaml \\",
            "      --b1 0.8 --echo 4 --top 8",
            "  java -jar target/echotrellis.jar pathways \\",
            "      sequences/three-pulse-stimulated.yaml --format json",
            "", "Pathway notation: origin (Z0 equilibrium, Rp regrown in period p), then the state after each "
                + "pulse: Fk transverse with signed order k, Zk longitudinal (sign = direction it re-emerges), "
                + "S*n = n repeats. Example: Z0 F0 Z-1 F-1 is the stimulated echo of CPMG echo 2."})
final class PathwaysCommand implements Callable<Integer> {
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

    @Option(names = "--echo", paramLabel = "N", description = "List the largest pathways of echo N (1-based).")
    Integer echo;

    @Option(names = "--top", paramLabel = "K", description = "How many pathways to list for --echo (default 10).")
    Integer top;

    @Option(names = "--min-amplitude", paramLabel = "A", defaultValue = "0",
            description = "Pathway search: do not follow pathways smaller than A (fraction of M0; default: "
                    + "${DEFAULT-VALUE}, i.e. list the K largest however small).")
    double minAmplitude;

    @Option(names = "--format", paramLabel = "FMT", defaultValue = "table",
            description = "Output format: table, csv or json (default: ${DEFAULT-VALUE}).")
    Format format;

    @Option(names = "--plot", paramLabel = "PATH", description = "Write the stacked class-contribution chart (.png or .svg).")
    Path plot;

    @Option(names = "--diagram", paramLabel = "PATH", description = "Write the phase-graph diagram (.png or .svg).")
    Path diagram;

    @Option(names = "--diagram-threshold", paramLabel = "A", defaultValue = "0.001",
            description = "Diagram: leave out states smaller than A (fraction of M0; default: ${DEFAULT-VALUE}).")
    double diagramThreshold;

    @Option(names = "--diagram-max-order", paramLabel = "K",
            description = "Diagram: leave out dephasing orders above K (default: all that can still refocus).")
    Integer diagramMaxOrder;

    @Option(names = "--diagram-until-ms", paramLabel = "MS",
            description = "Diagram: draw only the first MS milliseconds of the sequence.")
    Double diagramUntilMs;

    @Option(names = "--diagram-scale", paramLabel = "SCALE", defaultValue = "linear",
            description = "Diagram line strength: linear (proportional to the state's magnitude, relative to the "
                    + "largest state at that time) or log (from the threshold to M0; shows weak states; "
                    + "default: ${DEFAULT-VALUE}).")
    LineScale diagramScale;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    /** Output formats. */
    enum Format { table, csv, json }

    /** Diagram line scales. */
    enum LineScale { linear, log }

    @Override
    public Integer call() {
        Protocol p = input.load();
        Tissue t = p.tissue();
        double scale = p.b1Scale();
        checkOptions(p);
        report.begin(spec, force);
        ClassDecomposition d = PathwayAnalysis.classes(p);
        TopPathways tp = null;
        if (echo != null) {
            PathwaySearch.Limits lim = new PathwaySearch.Limits(top == null ? 10 : top, minAmplitude, 2_000_000);
            tp = CliChecks.asOptions(() -> PathwayAnalysis.topPathways(p, d, echo, lim), "echo");
        }
        PrintWriter o = spec.commandLine().getOut();
        switch (format) {
            case json -> o.print(Json.write(CliChecks.withProvenance(PathwayReport.json(p, d, tp), spec, input.file)));
            case csv -> o.print(PathwayReport.csv(d, tp));
            default -> o.print(PathwayReport.table(p, d, tp));
        }
        o.flush();
        String conditions = String.format(Locale.ROOT, "T1 = %s ms, T2 = %s ms, B1 = %.2f", Tables.num(t.t1Ms()),
                Tables.num(t.t2Ms()), scale);
        if (plot != null) {
            ChartFiles.write(classChart(p, d, conditions), plot, 900, 560, force);
        }
        if (diagram != null) {
            ChartFiles.write(diagramChart(p, conditions), diagram, 1000, 600, force);
        }
        TopPathways top = tp;
        report.settings(CommandReports.acquisition(p));
        report.write("pathways: " + p.name(), force, r -> CommandReports.pathways(r, PathwayReport.table(p, d, top),
                classChart(p, d, conditions), diagramChart(p, conditions), conditions));
        return 0;
    }

    private static JFreeChart classChart(Protocol p, ClassDecomposition d, String conditions) {
        return ClassContributionChart.create(p.name() + ": echo classes by longitudinal periods",
                conditions + "; bars projected on each echo's phase add up to |echo|", d);
    }

    private JFreeChart diagramChart(Protocol p, String conditions) {
        int maxOrder = diagramMaxOrder == null ? 100_000 : diagramMaxOrder;
        double until = diagramUntilMs == null ? Double.POSITIVE_INFINITY : diagramUntilMs;
        PhaseGraph g = PathwayAnalysis.phaseGraph(p, diagramThreshold, maxOrder, until);
        return PhaseGraphDiagram.create(p.name() + ": phase graph", conditions
                + "; states below " + diagramThreshold + " of M0 not drawn", g,
                diagramScale == LineScale.log ? PhaseGraphDiagram.Scale.LOG : PhaseGraphDiagram.Scale.LINEAR);
    }

    private void checkOptions(Protocol p) {
        int n = p.echoCount();
        if (n == 0) {
            throw new InputException(input.file + ": the protocol has no echo events; nothing to analyse");
        }
        if (top != null && echo == null) {
            throw new InputException("--top needs --echo N (an echo within [1, " + n + "])");
        }
        if (echo != null) {
            Checks.inRange("--echo", echo, 1, n, input.file + " has " + n + " echoes");
        }
        if (top != null) {
            Checks.inRange("--top", top, 1, 10_000, null);
        }
        Checks.inRange("--min-amplitude", minAmplitude, 0, 1, null);
        Checks.inRange("--diagram-threshold", diagramThreshold, 0, 1, null);
        if (diagram == null) {
            for (String option : new String[] {"--diagram-threshold", "--diagram-max-order", "--diagram-until-ms"}) {
                if (spec.commandLine().getParseResult().hasMatchedOption(option)) {
                    throw new InputException(option + " shapes the phase-graph diagram; give --diagram PATH.png or PATH.svg too");
                }
            }
        }
        if (diagramMaxOrder != null) {
            Checks.inRange("--diagram-max-order", diagramMaxOrder, 0, 100_000, null);
        }
        if (diagramUntilMs != null) {
            Checks.positive("--diagram-until-ms", diagramUntilMs, null);
        }
        if (plot != null && diagram != null) {
            Checks.require(!plot.toAbsolutePath().normalize().equals(diagram.toAbsolutePath().normalize()),
                    "--plot and --diagram name the same file " + plot + "; give two paths");
        }
        for (Path f : new Path[] {plot, diagram}) {
            if (f != null) {                      // refuse before any work or output, not after the table
                ChartFiles.isSvg(f);
                AtomicFiles.checkWritable(f, force, java.util.List.of(input.file));
            }
        }
    }
}
