package org.echotrellis.fit.spectrum;

import java.util.List;
import org.echotrellis.Checks;

/**
 * Settings of a spectrum fit.
 *
 * @param grid           T2 grid
 * @param t1Ms           fixed T1 of the basis in ms (Prasloski et al. 2012 use 1000 ms)
 * @param regularisation how μ is chosen
 * @param misfitIncrease χ²(μ)/χ²(0) target of {@link Regularisation#CHI2} (default 1.02)
 * @param search         refocusing angles searched (or one fixed angle)
 * @param windows        T2 windows whose fractions are reported (at least one)
 */
public record SpectrumOptions(T2Grid grid, double t1Ms, Regularisation regularisation, double misfitIncrease,
                              RefocusSearch search, List<FractionWindow> windows)
        implements java.io.Serializable {

    /** Defaults: 40 bins 10–2000 ms, T1 1 s, χ² factor 1.02, 8 angles 50–180°, window 10–40 ms. */
    public static final SpectrumOptions DEFAULT = new SpectrumOptions(T2Grid.DEFAULT, 1000, Regularisation.CHI2,
            1.02, RefocusSearch.DEFAULT, List.of(FractionWindow.DEFAULT));

    /** Validates; every window must lie within the grid, and no window may be given twice. */
    public SpectrumOptions {
        Checks.require(grid != null && regularisation != null && search != null && windows != null,
                "spectrum options must not be null");
        Checks.positiveOrInfinite("--t1-ms", t1Ms, null);
        Checks.inRange("--misfit-increase", misfitIncrease, 1.0, 10.0, null);
        Checks.require(!windows.isEmpty(), "at least one --fraction-window-ms is needed");
        windows = List.copyOf(windows);
        for (int i = 0; i < windows.size(); i++) {
            FractionWindow w = windows.get(i);
            w.checkWithin(grid);
            Checks.require(windows.indexOf(w) == i, "--fraction-window-ms " + w.label()
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
