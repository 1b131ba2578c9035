package org.echotrellis.fit.spectrum;

import java.util.List;
import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.Acquisitions;
import org.echotrellis.sequence.Protocol;

/**
 * Settings of a spectrum fit.
 *
 * @param grid           T2 grid
 * @param t1Ms           fixed T1 of the basis in ms (default: the protocol tissue's T1)
 * @param regularisation how μ is chosen
 * @param misfitIncrease χ²(μ)/χ²(0) target of {@link Regularisation#MISFIT} (default 1 + 1/(4·echoes))
 * @param search         refocusing angles searched (or one fixed angle)
 * @param windows        T2 windows whose fractions are reported (at least one)
 * @serial exclude
 */
public record SpectrumOptions(T2Grid grid, double t1Ms, Regularisation regularisation, double misfitIncrease,
                              RefocusSearch search, List<FractionWindow> windows)
        implements java.io.Serializable {

    /**
     * Our defaults for a protocol: grid from the echo times ({@link T2Grid#forEchoTimes}), T1 of the
     * protocol's tissue, misfit regularisation with the increase of {@link #misfitIncreaseFor}, the
     * search of {@link RefocusSearch#forTrain}, the window of {@link FractionWindow#shortT2}.
     *
     * @param p the protocol (a CPMG train)
     * @return the options
     */
    public static SpectrumOptions defaults(Protocol p) {
        CpmgTrain t = p.cpmg().orElseThrow(() -> new org.echotrellis.InputException(
                "the protocol is not a CPMG echo train; spectrum fitting needs one"));
        return defaults(t, p.tissue().t1Ms(), !Acquisitions.sliceSelective(p));
    }

    /**
     * Our defaults for a train.
     *
     * @param t the train
     * @param t1Ms fixed T1 in ms
     * @param symmetric true for ideal pulses (search up to 180°)
     * @return the options
     */
    public static SpectrumOptions defaults(CpmgTrain t, double t1Ms, boolean symmetric) {
        T2Grid grid = T2Grid.forEchoTimes(t.echoTimeMs(1), t.echoTimeMs(t.echoes()));
        double ref = 0;
        for (int i = 0; i < t.echoes(); i++) {
            ref = Math.max(ref, t.refocusFlipDeg(i));
        }
        return new SpectrumOptions(grid, t1Ms, Regularisation.MISFIT, misfitIncreaseFor(t.echoes()),
                RefocusSearch.forTrain(ref, symmetric), List.of(FractionWindow.shortT2(grid)));
    }

    /**
     * Our default misfit increase: 1 + 1/(4·echoes) — the unregularised misfit is about
     * (echoes − fitted components)·σ², so the smoothing may cost about a quarter of one echo's noise
     * variance (stronger smoothing, half or a whole echo's, merged a 20 ms pool into an 80 ms one too
     * often in our two-pool check, {@code SpectrumAccuracyTest}: 238 and 216 of 300 decays within
     * ±0.03 instead of ≥ 240).
     *
     * @param echoes echoes per decay
     * @return the factor
     */
    public static double misfitIncreaseFor(int echoes) {
        return 1 + 0.25 / echoes;
    }

    /**
     * Validates; every window must lie within the grid, and no window may be given twice.
     *
     * @param grid           T2 grid
     * @param t1Ms           fixed T1 of the basis in ms (default: the protocol tissue's T1)
     * @param regularisation how μ is chosen
     * @param misfitIncrease χ²(μ)/χ²(0) target of {@link Regularisation#MISFIT} (default 1 + 1/(4·echoes))

     * @param search         refocusing angles searched (or one fixed angle)
     * @param windows        T2 windows whose fractions are reported (at least one)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public SpectrumOptions {
        Checks.require(grid != null && regularisation != null && search != null && windows != null,
                "spectrum options must not be null");
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.inRange("misfit_increase", misfitIncrease, 1.0, 10.0, null);
        Checks.require(!windows.isEmpty(), "at least one fraction_window_ms is needed");
        windows = List.copyOf(windows);
        for (int i = 0; i < windows.size(); i++) {
            FractionWindow w = windows.get(i);
            w.checkWithin(grid);
            Checks.require(windows.indexOf(w) == i, "fraction_window_ms " + w.label()
                    + " is given twice; each window names its own output maps");
        }
    }

    /**
     * @param g the T2 grid
     * @return a copy with another grid
     */
    public SpectrumOptions withGrid(T2Grid g) {
        return new SpectrumOptions(g, t1Ms, regularisation, misfitIncrease, search, windows);
    }

    /**
     * @param r the regularisation
     * @return a copy with another regularisation
     */
    public SpectrumOptions withRegularisation(Regularisation r) {
        return new SpectrumOptions(grid, t1Ms, r, misfitIncrease, search, windows);
    }

    /**
     * @param f the χ² factor
     * @return a copy with another χ² factor
     */
    public SpectrumOptions withMisfitIncrease(double f) {
        return new SpectrumOptions(grid, t1Ms, regularisation, f, search, windows);
    }

    /**
     * @param s the refocusing search
     * @return a copy with another refocusing search
     */
    public SpectrumOptions withSearch(RefocusSearch s) {
        return new SpectrumOptions(grid, t1Ms, regularisation, misfitIncrease, s, windows);
    }

    /**
     * @param w the windows
     * @return a copy with other windows
     */
    public SpectrumOptions withWindows(List<FractionWindow> w) {
        return new SpectrumOptions(grid, t1Ms, regularisation, misfitIncrease, search, w);
    }

    /**
     * @param t1 T1 of the basis in ms
     * @return a copy with another T1
     */
    public SpectrumOptions withT1Ms(double t1) {
        return new SpectrumOptions(grid, t1, regularisation, misfitIncrease, search, windows);
    }
}
