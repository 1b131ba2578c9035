package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;

/**
 * What a {@link DemoSection} gets: the output directory, whether files may be replaced (always true
 * inside the demo directory once the user has chosen it), the markdown summary being written, and
 * the console for progress.
 *
 * @param outDir directory for all demo outputs
 * @param force whether existing files may be replaced
 * @param summary markdown summary; sections append a heading and their findings
 * @param err console for progress messages
 * @param quiet whether to suppress progress output
 * @param runLog lines for the console only (run times and other figures that change from run to
 *     run, which must stay out of the committed summary)
 */
record DemoContext(Path outDir, boolean force, StringBuilder summary, PrintWriter err, boolean quiet,
        java.util.List<String> runLog) {

    /** Adds a line to the console report (never to summary.md). */
    public void log(String line) {
        runLog.add(line);
    }

    /** @return the path of a file in the demo directory */
    public Path file(String name) {
        return outDir.resolve(name);
    }

    /** @return where a file this demo run wrote can be read back (outputs are staged until the end) */
    public Path written(String name) {
        return org.echotrellis.io.OutputSet.readable(file(name));
    }
}
