package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Consumer;
import org.echotrellis.report.Report;
import org.echotrellis.report.RunInfo;
import picocli.CommandLine.Model.ArgSpec;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Model.OptionSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParseResult;

/**
 * The {@code --report PATH.html} option as a mixin, with the few calls a command needs:
 * {@link #begin} before the work (checks the path, records the command line and starts SHA-256
 * checksums of every input file given on the command line), {@link #settings} for the run's
 * settings, and {@link #write} with the command's sections at the end. Without {@code --report}
 * every call does nothing.
 *
 * <pre>{@code
 * @Mixin ReportOption report;
 * ...
 * report.begin(spec, force);                       // before long work
 * ... run ...
 * report.write("fit: " + data, force, r -> VolumeSections.headline(r, result, maps));
 * }</pre>
 */
final class ReportOption {
    /** Option names whose values are outputs, not inputs, and get no checksum. */
    private static final List<String> OUTPUT_PREFIXES = List.of("--out", "--plot", "--diagram", "--report", "--save",
            "--write");

    @Option(names = "--report", paramLabel = "PATH.html",
            description = "Also write a self-contained HTML report of the run (figures inline; opens offline in a browser).")
    Path report;

    private RunInfo info;
    private CommandSpec spec;

    /** @return whether --report was given */
    public boolean enabled() {
        return report != null;
    }

    /**
     * Checks the report path (.html/.htm, writable) and starts the input checksums. Call before work.
     *
     * @param spec the command's spec (for the command line and the inputs)
     * @param force whether an existing report may be replaced
     */
    public void begin(CommandSpec spec, boolean force) {
        if (report == null) {
            return;
        }
        CliChecks.checkAsOptions(() -> Report.checkTarget(report, force), "report");
        this.spec = spec;
        ParseResult parsed = spec.commandLine().getParseResult();
        StringBuilder cl = new StringBuilder("echotrellis");
        for (String a : spec.root().commandLine().getParseResult().originalArgs()) {
            cl.append(' ').append(quote(a));
        }
        info = RunInfo.of(cl.toString(), new Main.Version().getVersion()[0]);
        for (ArgSpec a : inputs(parsed)) {
            String role = a instanceof OptionSpec o ? o.longestName() : a.paramLabel();
            for (Path p : paths(a.getValue())) {
                String n = p.toString().toLowerCase(Locale.ROOT);
                boolean text = n.endsWith(".yaml") || n.endsWith(".yml") || n.endsWith(".json");
                info.input(role, p, text);
            }
        }
    }

    /**
     * Adds settings shown under "What was run".
     *
     * @param values settings in order
     */
    public void settings(Map<String, ?> values) {
        if (info != null) {
            info.settings(values);
        }
    }

    /**
     * Builds and writes the report; the "What was run" section comes first.
     *
     * @param title the page title
     * @param force whether an existing report may be replaced
     * @param content adds the command's sections
     */
    public void write(String title, boolean force, Consumer<Report> content) {
        if (report == null) {
            return;
        }
        if (info == null) {
            throw new IllegalStateException("ReportOption.begin was not called");
        }
        long t0 = System.nanoTime();
        Report r = Report.create(title).run(info);
        content.accept(r);
        long bytes = r.write(report, force);
        PrintWriter err = spec.commandLine().getErr();
        err.printf(Locale.ROOT, "report: wrote %s (%.1f MB in %.2f s)%n", report, bytes / 1e6, (System.nanoTime() - t0) / 1e9);
        err.flush();
    }

    private static java.util.Collection<ArgSpec> inputs(ParseResult parsed) {
        java.util.Set<ArgSpec> list = new java.util.LinkedHashSet<>(parsed.matchedPositionals());
        for (OptionSpec o : parsed.matchedOptions()) {
            boolean output = false;
            for (String prefix : OUTPUT_PREFIXES) {
                output |= o.longestName().startsWith(prefix);
            }
            if (!output) {
                list.add(o);
            }
        }
        return list;
    }

    private static List<Path> paths(Object value) {
        List<Path> out = new ArrayList<>();
        if (value instanceof Path p) {
            out.add(p);
        } else if (value instanceof Iterable<?> it) {
            for (Object o : it) {
                if (o instanceof Path p) {
                    out.add(p);
                }
            }
        }
        return out;
    }

    private static String quote(String a) {
        if (!a.isEmpty() && a.matches("[A-Za-z0-9_@%+=:,./-]+")) {
            return a;
        }
        return "'" + a.replace("'", "'\\''") + "'";
    }
}
