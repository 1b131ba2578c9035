package org.echotrellis.cli;

import org.echotrellis.plot.PlotSettings;
import picocli.CommandLine;
import picocli.CommandLine.Option;

/**
 * {@code --plot-scale}: the size factor of every figure a command writes. {@link Main} reads it
 * (and {@link MapOptions}'s {@code --display-range}) from the parse result and runs the command
 * with those {@link PlotSettings} in scope.
 */
final class PlotOptions {
    @Option(names = "--plot-scale", paramLabel = "F", defaultValue = "1",
            description = "Size factor of the figures for print, within [0.25, 8]: PNG gets F times the pixels, "
                    + "SVG F times the size; text and lines grow along (default: ${DEFAULT-VALUE}).")
    double plotScale;

    /**
     * @param leaf the parse result of the command that runs
     * @return the figure settings it asked for
     */
    static PlotSettings settings(CommandLine.ParseResult leaf) {
        double scale = leaf.hasMatchedOption("--plot-scale") ? leaf.matchedOptionValue("--plot-scale", 1.0) : 1;
        double lo = Double.NaN;
        double hi = Double.NaN;
        if (leaf.hasMatchedOption("--display-range")) {
            double[] r = PlotSettings.parseRange("--display-range", leaf.matchedOptionValue("--display-range", ""));
            lo = r[0];
            hi = r[1];
        }
        double s = scale;
        double l = lo;
        double h = hi;
        return CliChecks.asOptions(() -> new PlotSettings(s, l, h), "plot_scale");
    }
}
