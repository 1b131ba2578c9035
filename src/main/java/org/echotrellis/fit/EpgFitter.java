package org.echotrellis.fit;

import org.echotrellis.io.VoxelStatus;

/**
 * Stimulated-echo-corrected T2 fit of one decay, for one thread (Lebel &amp; Wilman,
 * "Transverse relaxometry with stimulated echo compensation", Magn Reson Med 64:1005, 2010):
 * the protocol's EPG train with free amplitude, T2 and B1 (or B1 fixed from a map), T1 fixed.
 *
 * <p>Steps: (1) start from the best local maxima of a coarse {@link StartDictionary} — every
 * candidate whose grid misfit is within a factor {@value #CLOSE} of the best is refined, the lowest
 * final misfit wins (with slice profiles the misfit has a basin on each side of B1 = 1); (2) Levenberg–
 * Marquardt over (ln T2, B1) with the amplitude projected out (variable projection, Golub &amp;
 * Pereyra, SIAM J Numer Anal 10:413, 1973; for one linear parameter A = g·y/g·g and the exact
 * Jacobian of A·g is A ∂g + g (∂g·y − 2A g·∂g)/g·g), with analytic EPG derivatives. With an
 * active fold limit L (constant refocusing, B1·α ≤ 180°) the train is an even function of
 * B1 − L, so it is flat to second order at the fold; the solver works on q = (L − B1)², in which
 * the train is smooth and not flat, and converges quadratically right up to the fold; (3) with a
 * noise σ, refine (A, ln T2, B1) on the Rician mean E[M](A·g, σ) ({@link Rician}), so late echoes
 * on the noise floor do not lengthen T2; (4) Cramér–Rao standard errors ({@link Covariance}) from
 * the amplitude-projected Jacobian and the residual variance (with a noise σ: the larger of σ² and
 * the residual variance). Where B1 is not identifiable (its standard error is infinite or exceeds
 * half the width of the B1 bounds) the B1 standard error is NaN, reported as "not determined".
 *
 * <p>Allocation-free per decay after construction.
 */
final class EpgFitter {
    /** Output slots. */
    static final int T2 = 0;
    static final int T2_SE = 1;
    static final int B1 = 2;
    static final int B1_SE = 3;
    static final int AMPLITUDE = 4;
    static final int RESIDUAL_RMS = 5;
    static final int OUTPUTS = 6;

    private static final int MAX_ITERATIONS = 60;
    private static final double STEP_TOL = 1e-6;
    /** Smallest fold parameter q = (L − B1)²: B1 stays 1e-8 below the fold limit L. */
    private static final double Q_MIN = 1e-16;

    private final FitSettings settings;
    private final EpgSignal signal;
    private final StartDictionary dictionary;
    private final int n;
    private final double[] g;
    private final double[] gT;
    private final double[] gB;
    /** Candidates with a grid misfit up to this factor times the best one are refined too. */
    static final double CLOSE = 2.0;

    private final double[] starts = new double[2 * StartDictionary.MAX_CANDIDATES];
    private final double[] misfits = new double[StartDictionary.MAX_CANDIDATES];
    private final int[] bestIdx = new int[StartDictionary.MAX_CANDIDATES];
    private final double[] scan;
    private final SmallLeastSquares lmFree;
    private final SmallLeastSquares lmFixed;
    private final SmallLeastSquares lmRiceFree;
    private final SmallLeastSquares lmRiceFixed;
    private final Covariance cov2 = new Covariance(2);
    private final Covariance cov1 = new Covariance(1);
    private final Covariance cov3 = new Covariance(3);
    private final double[] jp;
    private final double[] se = new double[3];
    private final double[] x2 = new double[2];
    private final double[] x1 = new double[1];
    private final double[] x3 = new double[3];
    private final double[] lo2;
    private final double[] hi2;
    private final double[] lo1;
    private final double[] hi1;
    private final double[] lo3;
    private final double[] hi3;
    private final VarPro varPro = new VarPro();
    private final RiceMean riceMean = new RiceMean();
    private double[] y;
    private int off;
    private double fixedB1;
    private final boolean foldActive;
    private final double b1HiFit;
    private int lastIterations;

    /** True when the train is not folded: a start on each side of the split B1 is always refined. */
    private final boolean alwaysBoth;

    EpgFitter(FitSettings settings, StartDictionary dictionary, TrainSurface surface) {
        this.alwaysBoth = !settings.foldActive();
        this.settings = settings;
        this.signal = new EpgSignal(settings, surface);
        this.dictionary = dictionary;
        this.n = settings.train().echoes();
        scan = new double[dictionary.size()];
        g = new double[n];
        gT = new double[n];
        gB = new double[n];
        jp = new double[n * 3];
        lmFree = new SmallLeastSquares(2, n);
        lmFixed = new SmallLeastSquares(1, n);
        lmRiceFree = new SmallLeastSquares(3, n);
        lmRiceFixed = new SmallLeastSquares(2, n);
        double lnLo = Math.log(settings.t2MinMs());
        double lnHi = Math.log(settings.t2MaxMs());
        double bHi = settings.effectiveB1Max();
        b1HiFit = bHi;
        foldActive = settings.foldActive();
        double qLo = foldActive ? Q_MIN : settings.b1Min();
        double qHi = foldActive ? (bHi - settings.b1Min()) * (bHi - settings.b1Min()) : bHi;
        lo2 = new double[] {lnLo, qLo};
        hi2 = new double[] {lnHi, qHi};
        lo1 = new double[] {lnLo};
        hi1 = new double[] {lnHi};
        lo3 = new double[] {0, lnLo, qLo};
        hi3 = new double[] {Double.MAX_VALUE, lnHi, qHi};
    }

    /**
     * Fits one decay.
     *
     * @param data decay at data[offset .. offset + echoes); not modified
     * @param offset start
     * @param b1Fixed B1 from a map, or NaN to fit B1; a value outside [b1Min, b1Max] gives
     *        {@link VoxelStatus#INVALID_INPUT}
     * @param out receives the {@link #OUTPUTS} values; modified
     * @return the status
     */
    VoxelStatus fit(double[] data, int offset, double b1Fixed, double[] out) {
        java.util.Arrays.fill(out, 0, OUTPUTS, Double.NaN);
        double peak = 0;
        for (int i = 0; i < n; i++) {
            peak = Math.max(peak, data[offset + i]);
        }
        if (!(peak > 0)) {
            return VoxelStatus.INVALID_INPUT;
        }
        if (b1Fixed < settings.b1Min() || b1Fixed > settings.b1Max()) {
            return VoxelStatus.INVALID_INPUT;  // a map value outside the bounds (e.g. in percent) is not clamped
        }
        y = data;
        off = offset;
        fixedB1 = Double.isNaN(b1Fixed) ? Double.NaN : foldFixed(b1Fixed);
        int nc = dictionary.candidates(data, offset, fixedB1, scan, starts, misfits, bestIdx);
        boolean free = Double.isNaN(fixedB1);
        double cost;
        SmallLeastSquares lm;
        double lnT2;
        double b1;
        if (free) {
            lm = lmFree;
            double bestCost = Double.POSITIVE_INFINITY;
            double bestLn = Math.log(starts[0]);
            double bestQ = toParam(starts[1]);
            boolean lastIsBest = false;
            for (int c = 0; c < nc; c++) {
                if (c > 0 && !alwaysBoth && !(misfits[c] <= CLOSE * misfits[0])) {
                    continue;
                }
                x2[0] = Math.log(starts[2 * c]);
                x2[1] = toParam(starts[2 * c + 1]);
                double cc = lm.solve(varPro, x2, lo2, hi2, MAX_ITERATIONS, STEP_TOL);
                lastIsBest = cc < bestCost;
                if (lastIsBest) {
                    bestCost = cc;
                    bestLn = x2[0];
                    bestQ = x2[1];
                }
            }
            if (!lastIsBest) {
                // restore the solver's state (residuals, Jacobian) at the winning candidate
                x2[0] = bestLn;
                x2[1] = bestQ;
                bestCost = lm.solve(varPro, x2, lo2, hi2, MAX_ITERATIONS, STEP_TOL);
            }
            cost = bestCost;
            lnT2 = x2[0];
            b1 = toB1(x2[1]);
        } else {
            x1[0] = Math.log(starts[0]);
            lm = lmFixed;
            cost = lm.solve(varPro, x1, lo1, hi1, MAX_ITERATIONS, STEP_TOL);
            lnT2 = x1[0];
            b1 = fixedB1;
        }
        if (!(cost < Double.POSITIVE_INFINITY)) {
            return VoxelStatus.INVALID_INPUT;
        }
        double amp = varPro.amplitudeFor(lm.residuals());
        lastIterations = lm.iterations();
        int p = free ? 2 : 1;
        boolean converged = lm.converged();
        double[] jac = lm.jacobian();
        double[] r = lm.residuals();
        double fNorm = projectAmplitude(jac, r, p);
        double s2 = cost / Math.max(1, n - p - 1);
        (free ? cov2 : cov1).standardErrors(jp, n, s2, fNorm, se);
        double seLnT2 = se[0];
        double seB1 = free ? se[1] * Math.abs(dB1(x2[1])) : Double.NaN;
        if (!Double.isNaN(settings.noiseSigma())) {
            SmallLeastSquares lr = free ? lmRiceFree : lmRiceFixed;
            double[] x = free ? x3 : x2;
            x[0] = amp;
            x[1] = lnT2;
            if (free) {
                x[2] = toParam(b1);
            }
            cost = lr.solve(riceMean, x, lo3, hi3, MAX_ITERATIONS, STEP_TOL);
            converged = lr.converged();
            amp = x[0];
            lnT2 = x[1];
            b1 = free ? toB1(x[2]) : fixedB1;
            // Echoes on the noise floor have a magnitude variance below sigma^2 (Rayleigh: 0.43
            // sigma^2) but carry little information (dE[M]/dnu -> 0 as nu -> 0), so the residual variance
            // underestimates the variance of the informative echoes: use the known sigma^2 unless
            // the misfit is larger.
            double sigma = settings.noiseSigma();
            s2 = Math.max(sigma * sigma, cost / Math.max(1, n - p - 1));
            (free ? cov3 : cov2).standardErrors(lr.jacobian(), n, s2, modelNorm(lr.residuals()), se);
            seLnT2 = se[1];
            seB1 = free ? se[2] * Math.abs(dB1(x[2])) : Double.NaN;
        }
        if (!(seB1 < 0.5 * (b1HiFit - settings.b1Min()))) {
            seB1 = Double.NaN;  // the data do not determine B1 within its bounds: no standard error
        }
        double t2 = Math.exp(lnT2);
        out[T2] = t2;
        out[T2_SE] = t2 * seLnT2;
        out[B1] = b1;
        out[B1_SE] = seB1;
        out[AMPLITUDE] = amp;
        out[RESIDUAL_RMS] = Math.sqrt(cost / n);
        double[] rFinal = Double.isNaN(settings.noiseSigma()) ? r : (free ? lmRiceFree : lmRiceFixed).residuals();
        double peakModel = 0;
        for (int i = 0; i < n; i++) {
            peakModel = Math.max(peakModel, y[off + i] - rFinal[i]);
        }
        return status(converged, lnT2, b1, free, peakModel, Math.sqrt(s2));
    }

    /** B1 from the solver's parameter: B1 = L − √q at an active fold limit L, else q itself. */
    private double toB1(double q) {
        return foldActive ? b1HiFit - Math.sqrt(Math.max(q, 0)) : q;
    }

    /** The solver's parameter for a B1 value (inverse of {@link #toB1}). */
    private double toParam(double b1) {
        return foldActive ? Math.max(Q_MIN, (b1HiFit - b1) * (b1HiFit - b1)) : b1;
    }

    /** dB1/dq. */
    private double dB1(double q) {
        return foldActive ? -0.5 / Math.sqrt(Math.max(q, Q_MIN)) : 1;
    }

    /**
     * A B1 value from a map, folded like the fitted values (a refocusing angle above 180° is
     * equivalent to 360° minus it) and kept within the bounds.
     */
    private double foldFixed(double b1) {
        double v = foldActive && b1 > b1HiFit ? 2 * b1HiFit - b1 : b1;
        return Math.max(settings.b1Min(), Math.min(b1HiFit, v));
    }

    /** @return LM iterations of the last fit (the least-squares stage) */
    int lastIterations() {
        return lastIterations;
    }

    private VoxelStatus status(boolean converged, double lnT2, double b1, boolean free, double peakModel,
            double noiseRms) {
        double noise = Double.isNaN(settings.noiseSigma()) ? noiseRms : settings.noiseSigma();
        if (!converged) {
            return VoxelStatus.NOT_CONVERGED;
        }
        boolean onBound = lnT2 <= lo1[0] + 1e-9 || lnT2 >= hi1[0] - 1e-9
                || free && (b1 <= settings.b1Min() + 1e-9 || (!foldActive && b1 >= b1HiFit - 1e-9));
        if (onBound) {
            return VoxelStatus.HIT_BOUND;
        }
        if (peakModel < 3 * noise) {
            return VoxelStatus.LOW_SIGNAL;
        }
        return VoxelStatus.OK;
    }

    /** Fills jp with the amplitude-projected Jacobian (I − P_f)J; returns |f|. */
    private double projectAmplitude(double[] jac, double[] r, int p) {
        double ff = 0;
        for (int i = 0; i < n; i++) {
            double f = y[off + i] - r[i];
            ff += f * f;
        }
        for (int k = 0; k < p; k++) {
            double fj = 0;
            for (int i = 0; i < n; i++) {
                fj += (y[off + i] - r[i]) * jac[i * p + k];
            }
            double c = ff > 0 ? fj / ff : 0;
            for (int i = 0; i < n; i++) {
                jp[i * p + k] = jac[i * p + k] - c * (y[off + i] - r[i]);
            }
        }
        return Math.sqrt(ff);
    }

    private double modelNorm(double[] r) {
        double ff = 0;
        for (int i = 0; i < n; i++) {
            double f = y[off + i] - r[i];
            ff += f * f;
        }
        return Math.sqrt(ff);
    }

    /**
     * Least squares with the amplitude projected out; x = (ln T2[, B1]). The solver evaluates
     * trial points it may reject, so the amplitude of each evaluation is kept with the residual
     * buffer it was written to: the solver alternates two buffers and returns the accepted one.
     */
    private final class VarPro implements SmallLeastSquares.Problem {
        private double[] key0;
        private double[] key1;
        private double amp0 = Double.NaN;
        private double amp1 = Double.NaN;

        /** @return the amplitude of the evaluation that wrote the residuals r (NaN if none did) */
        double amplitudeFor(double[] r) {
            return r == key0 ? amp0 : r == key1 ? amp1 : Double.NaN;
        }

        private void remember(double[] r, double a) {
            if (r == key0) {
                amp0 = a;
            } else if (r == key1) {
                amp1 = a;
            } else {
                key1 = key0;
                amp1 = amp0;
                key0 = r;
                amp0 = a;
            }
        }

        @Override
        public double evaluate(double[] x, double[] r, double[] jac) {
            boolean free = x.length == 2;
            double t2 = Math.exp(x[0]);
            double b1 = free ? toB1(x[1]) : fixedB1;
            double chain = free ? dB1(x[1]) : 0;
            signal.evaluate(t2, b1, g, gT, gB);
            double gg = 0;
            double gy = 0;
            double tY = 0;
            double gTd = 0;
            double bY = 0;
            double gBd = 0;
            for (int i = 0; i < n; i++) {
                double yi = y[off + i];
                gg += g[i] * g[i];
                gy += g[i] * yi;
                tY += gT[i] * yi;
                gTd += g[i] * gT[i];
                bY += gB[i] * yi;
                gBd += g[i] * gB[i];
            }
            if (!(gg > 0)) {
                remember(r, Double.NaN);
                return Double.POSITIVE_INFINITY;
            }
            double a = gy / gg;
            remember(r, a);
            double daT = (tY - 2 * a * gTd) / gg;
            double daB = (bY - 2 * a * gBd) / gg;
            double cost = 0;
            int p = x.length;
            for (int i = 0; i < n; i++) {
                double ri = y[off + i] - a * g[i];
                r[i] = ri;
                cost += ri * ri;
                jac[i * p] = a * gT[i] + g[i] * daT;
                if (free) {
                    jac[i * p + 1] = (a * gB[i] + g[i] * daB) * chain;
                }
            }
            return cost;
        }
    }

    /** Rician mean model; x = (A, ln T2[, B1]). */
    private final class RiceMean implements SmallLeastSquares.Problem {
        @Override
        public double evaluate(double[] x, double[] r, double[] jac) {
            boolean free = x.length == 3;
            double a = x[0];
            double t2 = Math.exp(x[1]);
            double b1 = free ? toB1(x[2]) : fixedB1;
            double chain = free ? dB1(x[2]) : 0;
            signal.evaluate(t2, b1, g, gT, gB);
            double sigma = settings.noiseSigma();
            double cost = 0;
            int p = x.length;
            for (int i = 0; i < n; i++) {
                double nu = a * g[i];
                double sign = nu < 0 ? -1 : 1;
                double m = Rician.mean(Math.abs(nu), sigma);
                double d = Rician.slope(Math.abs(nu), sigma) * sign;
                double ri = y[off + i] - m;
                r[i] = ri;
                cost += ri * ri;
                jac[i * p] = d * g[i];
                jac[i * p + 1] = d * a * gT[i];
                if (free) {
                    jac[i * p + 2] = d * a * gB[i] * chain;
                }
            }
            return cost;
        }
    }
}
