package org.echotrellis.cli;

import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Whether the process's stderr is an interactive terminal, so that progress bars (which redraw a
 * line with carriage returns several times a second) are drawn there and never into log files or
 * pipes. On Linux the answer comes from where file descriptor 2 points ({@code /dev/pts/N} or
 * {@code /dev/ttyN}); elsewhere from {@link System#console()} (stdin and stdout on a terminal),
 * the closest signal the JDK offers.
 */
final class Terminal {
    private static final boolean STDERR_IS_TERMINAL = detect();

    private Terminal() { }

    /** @return true if stderr is a terminal */
    static boolean stderrIsTerminal() {
        return STDERR_IS_TERMINAL;
    }

    private static boolean detect() {
        Path fd2 = Path.of("/proc/self/fd/2");
        try {
            if (Files.isSymbolicLink(fd2)) {
                String target = Files.readSymbolicLink(fd2).toString();
                return target.startsWith("/dev/pts/") || target.startsWith("/dev/tty");
            }
        } catch (java.io.IOException | SecurityException | UnsupportedOperationException e) {
            // fall through to the JDK's view
        }
        return System.console() != null;
    }
}
