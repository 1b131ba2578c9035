package org.echotrellis.cli;

import picocli.CommandLine.Option;

/** Options shared by every command. */
final class CommonOptions {
    @Option(names = "--debug", description = "Print stack traces for errors.")
    boolean debug;

    /** @return whether --debug was given */
    public boolean debug() {
        return debug;
    }
}
