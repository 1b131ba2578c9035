package org.echotrellis.fit.spectrum;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.echotrellis.Checks;

/**
 * Fits the multi-component T2 spectrum of one decay at a time: refocusing-angle refinement,
 * unregularised NNLS, then the Tikhonov weight, then the derived numbers.
 *
 * <p>Per decay (Prasloski et al., MRM 67:1803, 2012; Whittall &amp; MacKay, J Magn Reson 84:134, 1989):
 * <ol>
 *   <li>for each coarse angle α_k, unregularised NNLS with the cached basis → χ²(α_k);</li>
 *   <li>around the lowest coarse point (and around a second local minimum whose χ² is within
 *   {@value #CLOSE} relative of it, so the global minimum is kept when χ²(α) has two basins), a bounded
 *   1-D minimiser (Brent 1973) on the continuous χ²(α) with the basis interpolated from the cache
 *   gives the refocusing angle α̂ (to {@value #ANGLE_TOL_DEG}°); with a B1 map, α̂ = B1·α_ref and no
 *   search;</li>
 *   <li>basis at α̂, unregularised NNLS → s₀, χ²₀;</li>
 *   <li>weight μ by the χ² factor or GCV, final spectrum s_μ (augmented NNLS);</li>
 *   <li>fractions Σ_window s / Σ s, geometric-mean T2 exp(Σ s·ln T2 / Σ s) over the whole spectrum and
 *   each window, SNR = max fitted echo / σ̂ with σ̂ = √(χ²₀ / (echoes − non-zero bins)).</li>
 * </ol>
 * χ² is the residual sum of squares Σ (y − A·s)² in squared signal units (noise variance not divided
 * out; the χ² criterion needs only ratios).
 *
 * <p>One fitter per thread (not thread-safe); the {@link BasisCache} is shared. The hot method
 * {@link #fit(double[], int, double[], double[])} allocates nothing. Cost per decay with the default
 * settings (32 echoes, 35 bins, 14 coarse angles): 14 coarse NNLS solves, ≈ 8–12 interpolated bases
 * with their Gram products and NNLS in the continuous search, then ≈ 6–10 augmented NNLS for μ.
 */
public final class SpectrumFitter {

    /** Scalar slot: fitted refocusing angle in degrees. */
    public static final int REFOCUS_DEG = 0;
    /** Scalar slot: χ² of the final (regularised) spectrum. */
    public static final int CHI2 = 1;
    /** Scalar slot: χ² of the unregularised spectrum at the fitted angle. */
    public static final int CHI2_UNREGULARISED = 2;
    /** Scalar slot: Tikhonov weight μ. */
    public static final int MU = 3;
    /** Scalar slot: SNR estimate. */
    public static final int SNR = 4;
    /** Scalar slot: geometric-mean T2 of the whole spectrum in ms. */
    public static final int GM_T2_MS = 5;
    private static final int WINDOW_BASE = 6;

    private final BasisCache cache;
    private final SpectrumOptions options;
    private final int m;
    private final int n;
    private final Nnls nnls = new Nnls();
    private final WeightSearch weights;
    /** Second coarse minima with χ² up to this fraction above the lowest are refined too. */
    static final double CLOSE = 0.1;
    /** Tolerance of the continuous angle search in degrees. */
    static final double ANGLE_TOL_DEG = 0.1;
    private static final int MAX_EVALUATIONS = 40;

    private final BoundedMinimum minimiser = new BoundedMinimum();
    private final java.util.function.DoubleUnaryOperator chi2Function = this::chi2At;
    private double[] data;
    private int dataOffset;
    private double lastAngle = Double.NaN;
    private final double[] b;
    private final double[] x0;
    private final double[] x;
    private final double[] fitted;
    private final double[] chi2k;
    private final double[] a;
    private final double[] g;
    private final double[] logT2;
    private final boolean[][] inWindow;

    /**
     * @param cache   bases for the protocol, grid and search (shared, read-only)
     * @param options fit settings; grid and search must be those of the cache
     */
    public SpectrumFitter(BasisCache cache, SpectrumOptions options) {
        Checks.require(cache.grid().equals(options.grid()) && cache.search().equals(options.search()),
                "basis cache and spectrum options disagree on grid or refocusing search");
        this.cache = cache;
        this.options = options;
        this.m = cache.echoes();
        this.n = options.grid().bins();
        this.weights = new WeightSearch(nnls, m, n);
        this.b = new double[n];
        this.x0 = new double[n];
        this.x = new double[n];
        this.fitted = new double[m];
        this.chi2k = new double[options.search().count()];
        this.a = new double[m * n];
        this.g = new double[n * n];
        this.logT2 = new double[n];
        List<FractionWindow> ws = options.windows();
        this.inWindow = new boolean[ws.size()][n];
        for (int j = 0; j < n; j++) {
            double t2 = options.grid().t2Ms(j);
            logT2[j] = Math.log(t2);
            for (int w = 0; w < ws.size(); w++) {
                inWindow[w][j] = ws.get(w).contains(t2);
            }
        }
    }

    /** @return number of scalar outputs: 6 + 2 per window */
    public int scalarCount() {
        return WINDOW_BASE + 2 * inWindow.length;
    }

    /**
     * @param w window index
     * @return scalar slot of the fraction in window w
     */
    public static int fractionSlot(int w) {
        return WINDOW_BASE + 2 * w;
    }

    /**
     * @param w window index
     * @return scalar slot of the geometric-mean T2 (ms) within window w
     */
    public static int windowGmT2Slot(int w) {
        return WINDOW_BASE + 2 * w + 1;
    }

    /** @return echoes per decay */
    public int echoes() {
        return m;
    }

    /**
     * Fits one decay (hot path, no allocation).
     *
     * @param decay      echo magnitudes; decay[offset … offset+echoes−1] read, not modified
     * @param offset     index of echo 1 in {@code decay}
     * @param amplitudes out: spectrum, one value per bin (length ≥ bins); overwritten (zeros if not fitted)
     * @param scalars    out: length ≥ {@link #scalarCount()}, slots as the constants; overwritten (NaN if not fitted)
     * @return a {@link SpectrumStatus} code
     */
    public int fit(double[] decay, int offset, double[] amplitudes, double[] scalars) {
        return fit(decay, offset, Double.NaN, amplitudes, scalars);
    }

    /**
     * Fits one decay with the refocusing scale given by a B1 map (no search), or searched when NaN.
     *
     * @param decay      echo magnitudes; not modified
     * @param offset     index of echo 1 in {@code decay}
     * @param b1Scale    B1 from a map (refocusing angle B1·α_ref), or NaN to search
     * @param amplitudes out: spectrum; overwritten
     * @param scalars    out: scalars; overwritten
     * @return a {@link SpectrumStatus} code
     */
    public int fit(double[] decay, int offset, double b1Scale, double[] amplitudes, double[] scalars) {
        double yy = 0;
        double ymax = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < m; i++) {
            double v = decay[offset + i];
            if (!Double.isFinite(v)) {
                return blank(amplitudes, scalars, SpectrumStatus.INVALID);
            }
            yy += v * v;
            ymax = Math.max(ymax, v);
        }
        if (!(ymax > 0)) {
            return blank(amplitudes, scalars, SpectrumStatus.NO_SIGNAL);
        }
        boolean converged = true;
        double[] basis;
        double[] gram;
        double angle;
        RefocusSearch search = options.search();
        data = decay;
        dataOffset = offset;
        if (search.isFixed() && Double.isNaN(b1Scale)) {
            basis = cache.searchBasis(0);
            gram = cache.searchGram(0);
            angle = search.loDeg();
        } else if (!Double.isNaN(b1Scale)) {
            angle = b1Scale * cache.referenceDeg();
            if (cache.symmetric() && angle > 180) {
                angle = 360 - angle;
            }
            if (!(b1Scale > 0) || !(angle >= search.loDeg() - 1e-9 && angle <= search.hiDeg() + 1e-9)) {
                return blank(amplitudes, scalars, SpectrumStatus.B1_OUT_OF_RANGE);
            }
            if (search.isFixed()) {
                basis = cache.searchBasis(0);
                gram = cache.searchGram(0);
            } else {
                cache.basisAt(angle, a);
                cache.gramAt(angle, a, g);
                lastAngle = angle;
                basis = a;
                gram = g;
            }
        } else {
            int count = search.count();
            int k1 = 0;
            for (int k = 0; k < count; k++) {
                double[] ak = cache.searchBasis(k);
                Gram.project(ak, m, n, decay, offset, b);
                converged &= nnls.solve(cache.searchGram(k), b, n, 0, k > 0, x0) == Nnls.CONVERGED;
                chi2k[k] = Gram.residual(ak, m, n, x0, decay, offset, fitted);
                if (chi2k[k] < chi2k[k1]) {
                    k1 = k;
                }
            }
            // a second basin: the lowest other local minimum of the coarse χ², if close
            int k2 = -1;
            for (int k = 0; k < count; k++) {
                boolean local = (k == 0 || chi2k[k] <= chi2k[k - 1]) && (k == count - 1 || chi2k[k] <= chi2k[k + 1]);
                if (local && Math.abs(k - k1) > 1 && chi2k[k] <= (1 + CLOSE) * chi2k[k1]
                        && (k2 < 0 || chi2k[k] < chi2k[k2])) {
                    k2 = k;
                }
            }
            angle = refine(search, k1);
            double best = minimiser.value();
            if (k2 >= 0) {
                double other = refine(search, k2);
                if (minimiser.value() < best) {
                    angle = other;
                }
            }
            if (lastAngle != angle) {
                chi2At(angle);
            }
            basis = a;
            gram = g;
        }
        Gram.project(basis, m, n, decay, offset, b);
        converged &= nnls.solve(gram, b, n, 0, false, x0) == Nnls.CONVERGED;
        int p0 = nnls.passiveCount();
        double chi20 = Gram.residual(basis, m, n, x0, decay, offset, fitted);
        double fitMax = 0;
        for (int i = 0; i < m; i++) {
            fitMax = Math.max(fitMax, fitted[i]);
        }
        weights.problem(basis, gram, b, decay, offset);
        double mu;
        double chi2;
        boolean reached = true;
        switch (options.regularisation()) {
            case MISFIT:
                mu = weights.chi2Factor(options.misfitIncrease(), x0, chi20, yy, x);
                chi2 = weights.chi2();
                reached = weights.reached();
                converged &= weights.converged();
                break;
            case CROSS_VALIDATION:
                mu = weights.gcv(x0, chi20, p0, x);
                chi2 = weights.chi2();
                converged &= weights.converged();
                break;
            default:
                System.arraycopy(x0, 0, x, 0, n);
                mu = 0;
                chi2 = chi20;
        }
        System.arraycopy(x, 0, amplitudes, 0, n);
        scalars[REFOCUS_DEG] = angle;
        scalars[CHI2] = chi2;
        scalars[CHI2_UNREGULARISED] = chi20;
        scalars[MU] = mu;
        double sigma = Math.sqrt(chi20 / Math.max(1, m - p0));
        scalars[SNR] = fitMax / Math.max(sigma, 1e-12 * fitMax);
        metrics(scalars);
        if (!converged) {
            return SpectrumStatus.NOT_CONVERGED;
        }
        if (!reached) {
            return SpectrumStatus.TARGET_NOT_REACHED;
        }
        return scalars[SNR] < SpectrumStatus.LOW_SIGNAL_SNR ? SpectrumStatus.LOW_SIGNAL : SpectrumStatus.OK;
    }

    /** Continuous search between the coarse neighbours of point k; returns the angle. */
    private double refine(RefocusSearch search, int k) {
        double lo = search.angleDeg(Math.max(0, k - 1));
        double hi = search.angleDeg(Math.min(search.count() - 1, k + 1));
        return minimiser.argmin(chi2Function, lo, hi, ANGLE_TOL_DEG, MAX_EVALUATIONS);
    }

    /** Unregularised misfit at an angle; leaves the interpolated basis and its Gram matrix in a and g. */
    private double chi2At(double angleDeg) {
        cache.basisAt(angleDeg, a);
        cache.gramAt(angleDeg, a, g);
        Gram.project(a, m, n, data, dataOffset, b);
        nnls.solve(g, b, n, 0, true, x0);  // warm start: the previous angle's solution is close
        lastAngle = angleDeg;
        return Gram.residual(a, m, n, x0, data, dataOffset, fitted);
    }

    private void metrics(double[] scalars) {
        double total = 0;
        double logSum = 0;
        for (int j = 0; j < n; j++) {
            total += x[j];
            logSum += x[j] * logT2[j];
        }
        scalars[GM_T2_MS] = total > 0 ? Math.exp(logSum / total) : Double.NaN;
        for (int w = 0; w < inWindow.length; w++) {
            double part = 0;
            double partLog = 0;
            boolean[] in = inWindow[w];
            for (int j = 0; j < n; j++) {
                if (in[j]) {
                    part += x[j];
                    partLog += x[j] * logT2[j];
                }
            }
            scalars[fractionSlot(w)] = total > 0 ? part / total : Double.NaN;
            scalars[windowGmT2Slot(w)] = part > 0 ? Math.exp(partLog / part) : Double.NaN;
        }
    }

    private int blank(double[] amplitudes, double[] scalars, int status) {
        Arrays.fill(amplitudes, 0, n, 0.0);
        Arrays.fill(scalars, 0, scalarCount(), Double.NaN);
        return status;
    }

    /**
     * Fits one decay and returns an immutable result (allocates; for tables and tests).
     *
     * @param name  label of the decay
     * @param decay echo magnitudes (length = echoes); copied
     * @return the fit
     */
    public SpectrumFit fit(String name, double[] decay) {
        Checks.require(decay.length == m, "decay '" + name + "' has " + decay.length + " echoes, the protocol has " + m);
        double[] amp = new double[n];
        double[] sc = new double[scalarCount()];
        int status = fit(decay.clone(), 0, amp, sc);
        List<SpectrumFit.Window> ws = new ArrayList<>();
        for (int w = 0; w < inWindow.length; w++) {
            ws.add(new SpectrumFit.Window(options.windows().get(w), sc[fractionSlot(w)], sc[windowGmT2Slot(w)]));
        }
        return new SpectrumFit(name, options.grid().t2Ms(), amp, sc[REFOCUS_DEG], sc[CHI2], sc[CHI2_UNREGULARISED],
                sc[MU], sc[SNR], sc[GM_T2_MS], ws, status);
    }
}
