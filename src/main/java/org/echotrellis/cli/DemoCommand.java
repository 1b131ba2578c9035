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
        footer = {"", "Example:", "  echotrellis demo --out plots"})
public final class DemoCommand implements Callable<Integer> {
    /** The demo's parts, in order. */
    static final List<DemoSection> SECTIONS = List.of(
            new FoundationDemo(),
            new PathwayDemo(),
            new FitDemo(),
            new SpectrumDemo(),
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
        try (OutputSet set = OutputSet.openOwn(out, force, List.of())) {
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
        DemoContext ctx = new DemoContext(out, true, summary, spec.commandLine().getErr(), quiet);
        for (DemoSection s : SECTIONS) {
            if (!quiet) {
                ctx.err().println("demo: " + s.title() + " ...");
                ctx.err().flush();
            }
            s.run(ctx);
        }
        AtomicFiles.writeString(out.resolve("summary.md"), summary.toString(), force);
        set.commit();
        spec.commandLine().getOut().print(summary);
        spec.commandLine().getOut().flush();
        if (!quiet) {
            ctx.err().println("demo: wrote " + out.resolve("summary.md"));
        }
    }
}
