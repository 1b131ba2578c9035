package org.echotrellis.cli;

import java.io.FileDescriptor;
import java.io.FileOutputStream;
import java.io.OutputStream;
import java.io.PrintWriter;
import java.util.Arrays;
import org.echotrellis.InputException;
import org.echotrellis.io.CheckedWriter;
import org.echotrellis.io.WriteFailure;
import org.echotrellis.plot.PlotSettings;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** Entry point of the {@code echotrellis} command-line tool. */
@Command(name = "echotrellis", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Extended-phase-graph tools for multi-echo spin-echo MR: simulate echo trains, "
                + "trace coherence pathways, fit T2 and B1, compute T2 spectra, design refocusing schedules "
                + "and follow fast-spin-echo trains into the image.",
        subcommands = {SimulateCommand.class, PathwaysCommand.class, FitCommand.class, SpectrumCommand.class, BidsCommand.class,
            DesignCommand.class, ImageCommand.class, CohortCommand.class, DemoCommand.class, CommandLine.HelpCommand.class},
        footer = {"", "Example:", "  java -jar target/echotrellis.jar simulate sequences/knee-t2-16.yaml \\",
            "      --b1 0.8 --plot knee.png",
            "", "Research and protocol-planning tool, not a medical device."})
public final class Main implements java.util.concurrent.Callable<Integer> {
    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    /** Without a command: prints the usage on stderr and fails (exit 2), as for any other usage error. */
    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        err.println("echotrellis: no command given");
        spec.commandLine().usage(err);
        err.flush();
        return 2;
    }

    /** @return a configured command line (error handling, case rules) */
    public static CommandLine newCommandLine() {
        CommandLine cl = new CommandLine(new Main());
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        cl.setParameterExceptionHandler(Main::onParameterError);
        cl.setExecutionExceptionHandler(Main::onExecutionError);
        cl.registerConverter(Double.class, Main::number);
        cl.registerConverter(Double.TYPE, Main::number);
        cl.setExecutionStrategy(Main::executeWithPlotSettings);
        return cl;
    }

    /**
     * Exit codes: 0 success, 1 internal error, 2 bad input or usage, 3 an output could not be
     * written (standard output or error, a full disk, permission denied, a directory locked by
     * another run).
     */
    static final int EXIT_WRITE_FAILURE = 3;

    /**
     * Runs the command line on standard output and error wrapped so that any failed write ends the
     * run with exit code {@value #EXIT_WRITE_FAILURE} (see {@link CheckedWriter}).
     *
     * @param cl the command line
     * @param out standard output
     * @param err standard error
     * @param args arguments
     * @return the exit code
     */
    static int run(CommandLine cl, OutputStream out, OutputStream err, String[] args) {
        PrintWriter o = CheckedWriter.printWriter(out, "standard output", false);
        PrintWriter e = CheckedWriter.printWriter(err, "standard error", true);
        cl.setOut(o);
        cl.setErr(e);
        // a failed write while printing help or version reaches the execution-error handler too
        CommandLine.IExecutionStrategy strategy = cl.getExecutionStrategy();
        cl.setExecutionStrategy(parsed -> {
            try {
                return strategy.execute(parsed);
            } catch (WriteFailure f) {
                throw new CommandLine.ExecutionException(cl, f.getMessage(), f);
            }
        });
        try {
            int code = cl.execute(args);
            o.flush();
            return code;
        } catch (WriteFailure f) {
            try {
                e.println("echotrellis: " + oneLine(f.getMessage()));
                e.flush();
            } catch (WriteFailure ignored) {
                // standard error is gone too: the exit code is all that is left
            }
            return EXIT_WRITE_FAILURE;
        }
    }

    /** @param args command-line arguments */
    public static void main(String[] args) {
        System.setProperty("java.awt.headless", "true");
        int code;
        try {
            code = run(newCommandLine(), new FileOutputStream(FileDescriptor.out), new FileOutputStream(FileDescriptor.err),
                    args);
        } catch (OutOfMemoryError e) {
            System.err.println("echotrellis: out of memory (" + Runtime.getRuntime().maxMemory() / (1 << 20)
                    + " MB heap); run java with a larger -Xmx, or process less at once");
            if (debug(args)) {
                e.printStackTrace();
            }
            code = 1;
        }
        System.exit(code);
    }

    /** Numbers as Java reads them, plus "inf" / "-inf" (any case) as the protocol files accept. */
    private static Double number(String text) {
        String t = text.trim().toLowerCase(java.util.Locale.ROOT);
        switch (t) {
            case "inf", "+inf", "infinity", "+infinity": return Double.POSITIVE_INFINITY;
            case "-inf", "-infinity": return Double.NEGATIVE_INFINITY;
            default:
                try {
                    return Double.valueOf(t);
                } catch (NumberFormatException e) {
                    throw new CommandLine.TypeConversionException("'" + text + "' is not a number (use digits, or inf)");
                }
        }
    }

    /**
     * Runs the chosen command with its figure settings ({@code --plot-scale}, {@code --display-range})
     * in scope, so every chart it writes follows them.
     */
    private static int executeWithPlotSettings(CommandLine.ParseResult parsed) {
        CommandLine.ParseResult leaf = parsed;
        while (leaf.hasSubcommand()) {
            leaf = leaf.subcommand();
        }
        PlotSettings settings;
        try {
            settings = PlotOptions.settings(leaf);
        } catch (InputException e) {
            return onExecutionError(e, leaf.commandSpec().commandLine(), parsed);
        }
        try (PlotSettings.Scope scope = PlotSettings.open(settings)) {
            return new CommandLine.RunLast().execute(parsed);
        }
    }

    private static boolean debug(String[] args) {
        return Arrays.asList(args).contains("--debug");
    }

    private static int onParameterError(CommandLine.ParameterException e, String[] args) {
        PrintWriter err = e.getCommandLine().getErr();
        err.println("echotrellis: " + e.getMessage());
        err.println("Try '" + e.getCommandLine().getCommandSpec().qualifiedName() + " --help' for usage.");
        if (debug(args)) {
            e.printStackTrace(err);
        }
        err.flush();
        return 2;
    }

    private static int onExecutionError(Exception e, CommandLine cl, CommandLine.ParseResult parsed) {
        PrintWriter err = cl.getErr();
        boolean dbg = debug(parsed.originalArgs().toArray(new String[0]));
        Throwable input = e;
        while (input != null && !(input instanceof InputException)) {
            input = input.getCause();
        }
        Throwable write = e;
        while (write != null && !(write instanceof WriteFailure)) {
            write = write.getCause();
        }
        int code;
        if (write != null) {
            err.println("echotrellis: " + oneLine(write.getMessage()));
            code = EXIT_WRITE_FAILURE;
        } else if (input != null) {
            err.println("echotrellis: " + oneLine(CliChecks.forCommandLine(input.getMessage())));
            code = 2;
        } else {
            err.println("echotrellis: internal error: " + e.getClass().getSimpleName()
                    + (e.getMessage() == null ? "" : ": " + oneLine(e.getMessage()))
                    + (dbg ? "" : " (run with --debug for details)"));
            code = 1;
        }
        if (dbg) {
            e.printStackTrace(err);
        }
        err.flush();
        return code;
    }

    /** First line of a message, with control characters (an ESC from a file name or protocol) as '?'. */
    private static String oneLine(String s) {
        return s == null ? "" : s.split("\\R")[0].replaceAll("[\\p{Cc}\\p{Cf}]", "?");
    }

    /** Version from the jar manifest ({@code Implementation-Version}), or "development" outside a jar. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            return new String[] {"echotrellis " + org.echotrellis.io.Provenance.version()};
        }
    }
}
