package org.echotrellis.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import picocli.CommandLine;

/** Runs the command line in-process with captured output. */
record CliRun(int code, String out, String err) {
    static CliRun of(String... args) {
        CommandLine cl = Main.newCommandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(args);
        return new CliRun(code, out.toString(), err.toString());
    }
}
