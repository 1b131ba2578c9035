package org.echotrellis.fit.spectrum;

/**
 * Choice of the Tikhonov weight μ for min ‖A·s − y‖² + μ‖s‖², s ≥ 0, each trial solved as the
 * augmented NNLS [A; √μ·I]·s ≈ [y; 0] (in normal form: ridge μ on AᵀA, see {@link Nnls}).
 *
 * <ul>
 *   <li>χ² factor (Whittall &amp; MacKay, J Magn Reson 84:134, 1989): μ with χ²(μ) = f·χ²(0). χ²(μ) is
 *   non-decreasing in μ, so the root is bracketed by stepping log μ in decades, then refined by
 *   bisection on log μ with the Illinois false-position step (Dowell &amp; Jarratt, BIT 11:168, 1971),
 *   which keeps the bracket of bisection but converges superlinearly. Stops at
 *   |χ²(μ)/χ²(0) − f| ≤ {@value #RATIO_TOL}.</li>
 *   <li>GCV (Golub, Heath &amp; Wahba, Technometrics 21:215, 1979): μ minimising
 *   V(μ) = m·‖y − A·s_μ‖² / (m − df(μ))², df = trace of the influence matrix on the passive set P,
 *   trace(A_P(A_PᵀA_P + μI)⁻¹A_Pᵀ) = p − μ·trace((G_PP + μI)⁻¹). A scan over log μ (four points per decade, 10 decades), then a
 *   golden-section search around the best grid point.</li>
 * </ul>
 * Successive trials warm-start NNLS from the previous solution. Not thread-safe.
 */
final class WeightSearch {

    /** Accepted |χ²(μ)/χ²(0) − f|. */
    static final double RATIO_TOL = 1e-5;
    /** χ²(0) below this fraction of ‖y‖² counts as an exact fit: no regularisation needed. */
    private static final double EXACT = 1e-24;
    private static final double LN10 = Math.log(10);
    private static final double START = 3e-5;        // first μ, relative to mean diag(AᵀA) (typical at SNR 100–400)
    private static final double LOWEST = 1e-14;
    private static final double HIGHEST = 1e8;
    private static final double GOLDEN = (Math.sqrt(5) - 1) / 2;
    /** GCV scan points per decade of μ (V is not smooth in μ: the NNLS active set changes). */
    private static final int GCV_PER_DECADE = 4;

    private final Nnls nnls;
    private final int m;
    private final int n;
    private final double[] fitted;
    private final double[] best;
    private double[] a;
    private double[] g;
    private double[] b;
    private double[] y;
    private int offset;
    private double chi2;
    private boolean reached;
    private boolean converged;

    WeightSearch(Nnls nnls, int m, int n) {
        this.nnls = nnls;
        this.m = m;
        this.n = n;
        this.fitted = new double[m];
        this.best = new double[n];
    }

    /** Sets the problem of the following searches; arrays are kept by reference and not modified. */
    void problem(double[] basis, double[] gram, double[] rhs, double[] data, int dataOffset) {
        a = basis;
        g = gram;
        b = rhs;
        y = data;
        offset = dataOffset;
    }

    /** @return χ² of the last accepted solution */
    double chi2() {
        return chi2;
    }

    /** @return false if the χ² target was outside the weights tried */
    boolean reached() {
        return reached;
    }

    /** @return false if an NNLS solve hit its iteration limit */
    boolean converged() {
        return converged;
    }

    private double evaluate(double mu, double[] x) {
        converged &= nnls.solve(g, b, n, mu, true, x) == Nnls.CONVERGED;
        return Gram.residual(a, m, n, x, y, offset, fitted);
    }

    private double scale() {
        double t = 0;
        for (int j = 0; j < n; j++) {
            t += g[j * n + j];
        }
        return t / n;
    }

    /**
     * χ²-factor criterion.
     *
     * @param factor f ≥ 1
     * @param x0     unregularised solution; not modified
     * @param chi20  its χ²
     * @param yy     ‖y‖²
     * @param x      out: the regularised solution (length ≥ n)
     * @return the weight μ (0 if none was needed)
     */
    double chi2Factor(double factor, double[] x0, double chi20, double yy, double[] x) {
        System.arraycopy(x0, 0, x, 0, n);
        chi2 = chi20;
        reached = true;
        converged = true;
        if (factor <= 1 || chi20 <= EXACT * yy) {
            return 0;
        }
        double target = factor * chi20;
        if (yy <= target) {
            reached = false;           // even s = 0 misfits by less than the target: pure noise
            return 0;
        }
        double s = scale();
        double lnLow = Math.log(LOWEST * s);
        double lnHigh = Math.log(HIGHEST * s);
        double uLo = Double.NaN;
        double gLo = 0;
        double uHi = Double.NaN;
        double gHi = 0;
        double u = Math.log(START * s);
        while (Double.isNaN(uLo) || Double.isNaN(uHi)) {
            if (u < lnLow || u > lnHigh) {
                reached = false;
                return Math.exp(u < lnLow ? u + LN10 : u - LN10);
            }
            chi2 = evaluate(Math.exp(u), x);
            double gu = chi2 / chi20 - factor;
            if (Math.abs(gu) <= RATIO_TOL) {
                return Math.exp(u);
            }
            if (gu < 0) {
                uLo = u;
                gLo = gu;
                u += LN10;
            } else {
                uHi = u;
                gHi = gu;
                u -= LN10;
            }
        }
        int side = 0;
        for (int it = 0; it < 60; it++) {
            u = (uLo * gHi - uHi * gLo) / (gHi - gLo);
            if (!(u > uLo && u < uHi)) {
                u = 0.5 * (uLo + uHi);
            }
            chi2 = evaluate(Math.exp(u), x);
            double gu = chi2 / chi20 - factor;
            if (Math.abs(gu) <= RATIO_TOL || uHi - uLo < 1e-12) {
                return Math.exp(u);
            }
            if (gu < 0) {
                if (side < 0) {
                    gHi *= 0.5;
                }
                uLo = u;
                gLo = gu;
                side = -1;
            } else {
                if (side > 0) {
                    gLo *= 0.5;
                }
                uHi = u;
                gHi = gu;
                side = 1;
            }
        }
        reached = Math.abs(chi2 / chi20 - factor) <= 10 * RATIO_TOL;
        return Math.exp(u);
    }

    /**
     * Generalised cross-validation.
     *
     * @param x0    unregularised solution; not modified
     * @param chi20 its χ²
     * @param p0    its number of non-zero coefficients
     * @param x     out: the selected solution
     * @return the weight μ (0 when μ = 0 scores best)
     */
    double gcv(double[] x0, double chi20, int p0, double[] x) {
        converged = true;
        reached = true;
        double s = scale();
        bestScore = score(chi20, p0);
        bestU = Double.NEGATIVE_INFINITY;
        bestChi2 = chi20;
        System.arraycopy(x0, 0, best, 0, n);
        System.arraycopy(x0, 0, x, 0, n);
        double u0 = Math.log(1e-8 * s);
        double h = LN10 / GCV_PER_DECADE;
        for (int k = 0; k <= 10 * GCV_PER_DECADE; k++) {
            gcvAt(u0 + k * h, x);
        }
        if (bestU > Double.NEGATIVE_INFINITY) {
            double lo = bestU - h;
            double hi = bestU + h;
            double c = hi - GOLDEN * (hi - lo);
            double d = lo + GOLDEN * (hi - lo);
            double fc = gcvAt(c, x);
            double fd = gcvAt(d, x);
            for (int it = 0; it < 12; it++) {
                if (fc < fd) {
                    hi = d;
                    d = c;
                    fd = fc;
                    c = hi - GOLDEN * (hi - lo);
                    fc = gcvAt(c, x);
                } else {
                    lo = c;
                    c = d;
                    fc = fd;
                    d = lo + GOLDEN * (hi - lo);
                    fd = gcvAt(d, x);
                }
            }
        }
        System.arraycopy(best, 0, x, 0, n);
        chi2 = bestChi2;
        return bestU > Double.NEGATIVE_INFINITY ? Math.exp(bestU) : 0;
    }

    private double bestScore;
    private double bestU;
    private double bestChi2;

    /** V(e^u); remembers the best solution seen. */
    private double gcvAt(double u, double[] x) {
        double mu = Math.exp(u);
        double rss = evaluate(mu, x);
        double v = score(rss, nnls.passiveCount() - mu * nnls.inverseTrace());
        if (v < bestScore) {
            bestScore = v;
            bestU = u;
            bestChi2 = rss;
            System.arraycopy(x, 0, best, 0, n);
        }
        return v;
    }

    private double score(double rss, double df) {
        double dof = m - df;
        return dof <= 0 ? Double.POSITIVE_INFINITY : m * rss / (dof * dof);
    }
}
