package org.echotrellis.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.OutputSet;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code demo}: runs the built-in scenarios end to end and writes their figures and a summary. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = "Run the built-in scenarios (invented protocols and tissues) and write plots and summary.md.",
        footer = {"", "Example:", "  java -jar target/echotrellis.jar demo --out plots",
            "", "Prints a short report with run times; the findings go to DIR/summary.md."})
final class DemoCommand implements Callable<Integer> {
    /** The demo's parts, in order. */
    static final List<DemoSection> SECTIONS = List.of(
            new FoundationDemo(),
            new PathwayDemo(),
            new FitDemo(),
            new SpectrumDemo(),
            new SliceDemo(),
            new DesignDemo(),
            new ImageDemo());

    @Mixin
    CommonOptions common;

    @Spec
    CommandSpec spec;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "plots", description = "Output directory (default: ${DEFAULT-VALUE}).")
    Path out;

    @Option(names = "--quiet", description = "No progress messages.")
    boolean quiet;

    @Option(names = "--force", description = "Replace existing files the demo did not write itself "
            + "(files listed in the directory's " + OutputSet.MANIFEST + " are always replaced).")
    boolean force;

    @Override
    public Integer call() throws Exception {
        if (Files.exists(out) && !Files.isDirectory(out)) {
            throw new InputException("--out " + out + " exists and is not a directory");
        }
        Path parent = out.toAbsolutePath().getParent();
        if (parent != null && Files.exists(parent) && !Files.isDirectory(parent)) {
            throw new InputException("--out " + out + ": cannot create the directory (" + parent + " is not a directory)");
        }
        try (OutputSet set = CliChecks.asOptions(() -> OutputSet.openOwn(out, force, List.of()), "out")) {
            set.plan(OWN_FILES);
            run(set);
        }
        return 0;
    }

    /** Files every demo run writes; checked before the demo starts. */
    private static final List<String> OWN_FILES = List.of("summary.md");

    private void run(OutputSet set) throws Exception {
        StringBuilder summary = new StringBuilder("# echotrellis demo summary\n\n"
                + "All protocols, tissues and phantoms here are invented scenarios for demonstration.\n\n");
        java.util.List<String> log = new java.util.ArrayList<>();
        DemoContext ctx = new DemoContext(out, true, summary, spec.commandLine().getErr(), quiet, log);
        java.io.PrintWriter o = spec.commandLine().getOut();
        long start = System.nanoTime();
        for (DemoSection s : SECTIONS) {
            if (!quiet) {
                ctx.err().println("demo: " + s.title() + " ...");
                ctx.err().flush();
            }
            long t0 = System.nanoTime();
            int notes = log.size();
            s.run(ctx);
            log.add(notes, String.format(java.util.Locale.ROOT, "%5.1f s  %s", (System.nanoTime() - t0) * 1e-9, s.title()));
            for (int i = notes + 1; i < log.size(); i++) {
                log.set(i, "         " + log.get(i));
            }
        }
        AtomicFiles.writeString(out.resolve("summary.md"), summary.toString(), force);
        set.commit();
        long figures;
        try (java.util.stream.Stream<Path> files = Files.list(out)) {
            figures = files.filter(f -> f.getFileName().toString().endsWith(".png")).count();
        }
        o.println("echotrellis demo: invented scenarios, all figures as PNG and SVG");
        for (String line : log) {
            o.println("  " + line);
        }
        o.printf(java.util.Locale.ROOT, "wrote %d figures (.png and .svg) and %s in %.1f s; the findings are in summary.md%n",
                figures, out.resolve("summary.md"), (System.nanoTime() - start) * 1e-9);
        o.flush();
    }
}
