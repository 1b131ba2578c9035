package org.echotrellis.cli;

import picocli.CommandLine.Option;

/**
 * {@code --display-range LO:HI}: one colour range for the comparable maps of a volume command
 * (T2 maps of {@code fit}; window-fraction maps of {@code spectrum}). Without it, comparable maps
 * share the range that covers the 2nd to 98th percentile of all of them together.
 */
final class MapOptions {
    @Option(names = "--display-range", paramLabel = "LO:HI",
            description = "Colour range of the T2 or fraction map previews, e.g. 20:160 (default: shared "
                    + "2nd-98th percentile range of the comparable maps).")
    String displayRange;
}
