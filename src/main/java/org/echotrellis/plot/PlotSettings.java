package org.echotrellis.plot;

import java.util.Locale;
import org.echotrellis.InputException;

/**
 * How the current command wants its figures: a size factor for print ({@code --plot-scale}) and an
 * optional colour range for its maps ({@code --display-range LO:HI}). The command line opens a
 * scope for the duration of one command ({@link #open}); charts read {@link #current()}. Outside a
 * scope the defaults apply (scale 1, ranges chosen from the data).
 *
 * @param scale size factor: PNG files get {@code scale} times the pixels, SVG files the same factor
 *     in their declared width and height; text, lines and markers grow with it
 * @param displayLo lower end of the map colour range, or NaN for the data's own range
 * @param displayHi upper end of the map colour range, or NaN
 */
public record PlotSettings(double scale, double displayLo, double displayHi) {
    /** Scale 1, ranges from the data. */
    public static final PlotSettings DEFAULT = new PlotSettings(1, Double.NaN, Double.NaN);
    private static final ThreadLocal<PlotSettings> CURRENT = ThreadLocal.withInitial(() -> DEFAULT);

    /**
     * Checks the values.
     *
     * @param scale size factor: PNG files get {@code scale} times the pixels, SVG files the same factor
     *     in their declared width and height; text, lines and markers grow with it
     * @param displayLo lower end of the map colour range, or NaN for the data's own range
     * @param displayHi upper end of the map colour range, or NaN
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public PlotSettings {
        if (!(scale >= 0.25 && scale <= 8)) {
            throw new InputException("plot_scale must be within [0.25, 8], got " + scale);
        }
    }

    /** @return the settings of the running command (or {@link #DEFAULT}) */
    public static PlotSettings current() {
        return CURRENT.get();
    }

    /** @return whether {@code --display-range} fixed the map colour range */
    public boolean hasDisplayRange() {
        return !Double.isNaN(displayLo);
    }

    /**
     * Makes {@code s} current on this thread until the returned scope is closed.
     *
     * @param s settings
     * @return a scope that restores the defaults when closed
     */
    public static Scope open(PlotSettings s) {
        CURRENT.set(s);
        return CURRENT::remove;
    }

    /**
     * Parses {@code LO:HI} (finite numbers, LO &lt; HI).
     *
     * @param option option name for messages
     * @param text the value
     * @return {lo, hi}
     */
    public static double[] parseRange(String option, String text) {
        String[] parts = text.split(":", -1);
        try {
            if (parts.length == 2) {
                double lo = Double.parseDouble(parts[0].trim());
                double hi = Double.parseDouble(parts[1].trim());
                if (Double.isFinite(lo) && Double.isFinite(hi) && lo < hi) {
                    return new double[] {lo, hi};
                }
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        throw new InputException(String.format(Locale.ROOT,
                "%s must be LO:HI with finite numbers and LO < HI, e.g. 20:160, got '%s'", option, text));
    }

    /** A settings scope; closing it restores the defaults. */
    @FunctionalInterface
    public interface Scope extends AutoCloseable {
        @Override
        void close();
    }
}
