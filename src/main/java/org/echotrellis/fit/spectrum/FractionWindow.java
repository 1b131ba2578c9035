package org.echotrellis.fit.spectrum;

import org.echotrellis.Checks;

/**
 * A T2 window [lo, hi] in ms over which the spectrum is summed, e.g. 10–40 ms, whose fraction of the
 * whole spectrum is the usual myelin water fraction estimate (MacKay et al., MRM 31:673, 1994).
 * A bin belongs to the window when lo ≤ T2_j ≤ hi (edges widened by 1e-9 relative so that a window
 * edge placed exactly on a grid point includes it).
 *
 * @param loMs lower edge in ms
 * @param hiMs upper edge in ms
 * @serial exclude
 */
public record FractionWindow(double loMs, double hiMs) implements java.io.Serializable {

    /** Upper edge of the default short-T2 window in ms. */
    public static final double SHORT_T2_EDGE_MS = 40;

    /**
     * The default window: every T2 the grid holds up to {@value #SHORT_T2_EDGE_MS} ms (the upper edge
     * of the myelin water window used at 3 T, MacKay et al. 1994 and followers; the lower edge is the
     * grid's own shortest T2, so nothing short is left out). Grids starting above 20 ms get
     * [shortest, 2 × shortest].
     *
     * @param grid the T2 grid
     * @return the window
     */
    public static FractionWindow shortT2(T2Grid grid) {
        return new FractionWindow(grid.minMs(), Math.min(grid.maxMs(), Math.max(SHORT_T2_EDGE_MS, 2 * grid.minMs())));
    }

    private static final double EDGE = 1e-9;

    /**
     * Validates LO &lt; HI, both finite and positive.
     *
     * @param loMs lower edge in ms
     * @param hiMs upper edge in ms
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public FractionWindow {
        Checks.positive("fraction_window_ms LO", loMs, null);
        Checks.positive("fraction_window_ms HI", hiMs, null);
        Checks.require(hiMs > loMs, "fraction_window_ms needs LO < HI, got " + loMs + ":" + hiMs);
    }

    /**
     * Parses {@code LO:HI}.
     *
     * @param text the option value
     * @return the window
     * @throws org.echotrellis.InputException naming the option if malformed
     */
    public static FractionWindow parse(String text) {
        String[] parts = text.split(":", -1);
        Checks.require(parts.length == 2, "fraction_window_ms must be LO:HI in ms, got '" + text + "'");
        try {
            return new FractionWindow(Double.parseDouble(parts[0].trim()), Double.parseDouble(parts[1].trim()));
        } catch (NumberFormatException e) {
            throw new org.echotrellis.InputException(
                    "fraction_window_ms must be LO:HI in ms (numbers), got '" + text + "'", e);
        }
    }

    /**
     * @param t2Ms a T2 in ms
     * @return true when {@code t2Ms} lies in the window (edges inclusive)
     */
    public boolean contains(double t2Ms) {
        return t2Ms >= loMs * (1 - EDGE) && t2Ms <= hiMs * (1 + EDGE);
    }

    /**
     * Refuses a window that reaches outside the grid or holds no grid point.
     *
     * @param grid the T2 grid
     * @throws org.echotrellis.InputException naming {@code --fraction-window-ms}
     */
    void checkWithin(T2Grid grid) {
        String w = label();
        Checks.require(loMs >= grid.minMs() * (1 - EDGE),
                "fraction_window_ms " + w + " starts below the T2 grid (" + grid.minMs() + " ms); allowed "
                        + grid.minMs() + " to " + grid.maxMs() + " ms");
        Checks.require(hiMs <= grid.maxMs() * (1 + EDGE),
                "fraction_window_ms " + w + " ends above the T2 grid (" + grid.maxMs() + " ms); allowed "
                        + grid.minMs() + " to " + grid.maxMs() + " ms");
        boolean any = false;
        for (int j = 0; j < grid.bins() && !any; j++) {
            any = contains(grid.t2Ms(j));
        }
        Checks.require(any, "fraction_window_ms " + w + " contains no T2 grid point (grid "
                + grid.minMs() + " to " + grid.maxMs() + " ms, " + grid.bins() + " bins)");
    }

    /** @return {@code LO:HI} as given */
    public String label() {
        return fmt(loMs) + ":" + fmt(hiMs);
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
