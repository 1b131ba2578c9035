package org.echotrellis.fit.spectrum;

import java.io.Serializable;
import java.util.List;

import org.echotrellis.Checks;
import org.echotrellis.sequence.Protocol;

/**
 * What a caller chose for spectrum fits whose protocols are known only later (one per BIDS collection
 * or cohort subject, or the one protocol of a {@code spectrum} run): each choice left open takes the
 * protocol's own default of {@link SpectrumOptions#defaults(Protocol)} (grid from its echo times, T1
 * of its tissue, misfit regularisation, refocusing search from its flip angles, window from the grid).
 * Serialisable, so a distributed job can ship it to workers.
 *
 * @param t1Ms fixed T1 of the basis in ms, or NaN for the protocol tissue's T1
 * @param windows T2 windows whose fractions are reported, or empty for the short-T2 window of the grid
 * @param t2MinMs shortest T2 of the grid in ms, or NaN for the protocol's default
 * @param t2MaxMs longest T2 of the grid in ms, or NaN for the protocol's default
 * @param t2Bins grid points, or 0 for {@link T2Grid#BINS_PER_DECADE} per decade of the range
 * @param regularisation the regularisation, or null for the default (misfit)
 * @param misfitIncrease the misfit target factor, or NaN for {@link SpectrumOptions#misfitIncreaseFor}
 * @param search the refocusing-angle search (or fixed angle), or null for the protocol's default
 * @serial exclude
 */
public record SpectrumChoices(double t1Ms, List<FractionWindow> windows, double t2MinMs, double t2MaxMs, int t2Bins,
                              Regularisation regularisation, double misfitIncrease, RefocusSearch search)
        implements Serializable {
    private static final long serialVersionUID = 2L;

    /** Every choice left to the protocol. */
    public static final SpectrumChoices PROTOCOL_DEFAULTS = new SpectrumChoices(Double.NaN, List.of());

    /**
     * Copies; checks what can be checked before a protocol is known.
     *
     * @param t1Ms fixed T1 of the basis in ms, or NaN for the protocol tissue's T1
     * @param windows T2 windows whose fractions are reported, or empty for the short-T2 window of the grid
     * @param t2MinMs shortest T2 of the grid in ms, or NaN for the protocol's default
     * @param t2MaxMs longest T2 of the grid in ms, or NaN for the protocol's default
     * @param t2Bins grid points, or 0 for {@link T2Grid#BINS_PER_DECADE} per decade of the range
     * @param regularisation the regularisation, or null for the default (misfit)
     * @param misfitIncrease the misfit target factor, or NaN for {@link SpectrumOptions#misfitIncreaseFor}
     * @param search the refocusing-angle search (or fixed angle), or null for the protocol's default
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public SpectrumChoices {
        windows = windows == null ? List.of() : List.copyOf(windows);
        Checks.require(t2Bins == 0 || t2Bins >= 2 && t2Bins <= T2Grid.MAX_BINS,
                "t2_bins must be 2.." + T2Grid.MAX_BINS + " (or 0 for the default), got " + t2Bins);
    }

    /**
     * Only T1 and windows chosen.
     *
     * @param t1Ms fixed T1 of the basis in ms, or NaN for the protocol tissue's T1
     * @param windows T2 windows whose fractions are reported, or empty for the default window
     */
    public SpectrumChoices(double t1Ms, List<FractionWindow> windows) {
        this(t1Ms, windows, Double.NaN, Double.NaN, 0, null, Double.NaN, null);
    }

    /**
     * The options for one protocol: the choices made, the protocol's defaults for the rest. A grid
     * with a chosen range but no chosen size gets {@link T2Grid#BINS_PER_DECADE} points per decade
     * (at most {@link T2Grid#MAX_BINS}).
     *
     * @param p the protocol of one collection (a CPMG train)
     * @return the validated options
     */
    public SpectrumOptions resolve(Protocol p) {
        SpectrumOptions d = SpectrumOptions.defaults(p);
        double lo = Double.isNaN(t2MinMs) ? d.grid().minMs() : t2MinMs;
        double hi = Double.isNaN(t2MaxMs) ? d.grid().maxMs() : t2MaxMs;
        Checks.positive("t2_min_ms", lo, null);
        Checks.require(hi > lo, "t2_max_ms must be > t2_min_ms (" + lo + " ms), got " + hi);
        int bins = t2Bins > 0 ? t2Bins
                : Math.min(T2Grid.MAX_BINS, (int) Math.ceil(T2Grid.BINS_PER_DECADE * Math.log10(hi / lo) - 1e-9) + 1);
        T2Grid grid = Double.isNaN(t2MinMs) && Double.isNaN(t2MaxMs) && t2Bins == 0 ? d.grid() : new T2Grid(lo, hi, bins);
        List<FractionWindow> ws = windows.isEmpty() ? List.of(FractionWindow.shortT2(grid)) : windows;
        return new SpectrumOptions(grid, Double.isNaN(t1Ms) ? d.t1Ms() : t1Ms,
                regularisation == null ? d.regularisation() : regularisation,
                Double.isNaN(misfitIncrease) ? d.misfitIncrease() : misfitIncrease,
                search == null ? d.search() : search, ws);
    }
}
