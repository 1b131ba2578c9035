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
 */
public record DemoContext(Path outDir, boolean force, StringBuilder summary, PrintWriter err, boolean quiet) {

    /** @return the path of a file in the demo directory */
    public Path file(String name) {
        return outDir.resolve(name);
    }

    /** @return where a file this demo run wrote can be read back (outputs are staged until the end) */
    public Path written(String name) {
        return org.echotrellis.io.OutputSet.readable(file(name));
    }
}
