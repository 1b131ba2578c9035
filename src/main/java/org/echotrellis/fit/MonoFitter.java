package org.echotrellis.fit;

import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.fitting.leastsquares.MultivariateJacobianFunction;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.apache.commons.math3.util.Pair;
import org.echotrellis.io.VoxelStatus;

/**
 * The naive reference: a mono-exponential fit S(t) = A·e^(−t/T2) (+ C with the offset option) by
 * Commons Math's Levenberg–Marquardt optimiser with an analytic Jacobian, started from a
 * log-linear fit. Optionally drops the first echo, which reduces the stimulated-echo bias (Milford
 * et al., "Mono-exponential fitting in T2-relaxometry: relevance of offset and first echo", PLoS
 * ONE 10:e0145255, 2015). Its T2 is biased upwards when refocusing is imperfect; it is offered for
 * comparison. One instance per thread.
 */
final class MonoFitter {
    /** Output slots. */
    static final int T2 = 0;
    static final int T2_SE = 1;
    static final int AMPLITUDE = 2;
    static final int OFFSET = 3;
    static final int RESIDUAL_RMS = 4;
    static final int OUTPUTS = 5;

    private final double[] times;
    private final int first;
    private final boolean offset;
    private final double t2Min;
    private final double t2Max;
    private final LeastSquaresOptimizer optimizer = new LevenbergMarquardtOptimizer();

    MonoFitter(FitSettings s) {
        int n = s.train().echoes();
        times = new double[n];
        for (int i = 0; i < n; i++) {
            times[i] = s.train().echoTimeMs(i + 1);
        }
        first = s.monoSkipFirst() && n > 3 ? 1 : 0;
        offset = s.monoOffset();
        t2Min = s.t2MinMs();
        t2Max = s.t2MaxMs();
    }

    /**
     * @param data decay at data[offset .. offset + echoes); not modified
     * @param off start
     * @param out receives {@link #OUTPUTS} values; modified
     * @return the status
     */
    VoxelStatus fit(double[] data, int off, double[] out) {
        java.util.Arrays.fill(out, 0, OUTPUTS, Double.NaN);
        int m = times.length - first;
        double[] y = new double[m];
        double[] t = new double[m];
        for (int i = 0; i < m; i++) {
            y[i] = data[off + first + i];
            t[i] = times[first + i];
        }
        double[] start = logLinearStart(t, y);
        if (start == null) {
            return VoxelStatus.INVALID_INPUT;
        }
        MultivariateJacobianFunction model = point -> {
            double a = point.getEntry(0);
            double t2 = point.getEntry(1);
            double c = offset ? point.getEntry(2) : 0;
            RealVector v = new ArrayRealVector(m);
            RealMatrix j = new Array2DRowRealMatrix(m, offset ? 3 : 2);
            for (int i = 0; i < m; i++) {
                double e = Math.exp(-t[i] / t2);
                v.setEntry(i, a * e + c);
                j.setEntry(i, 0, e);
                j.setEntry(i, 1, a * e * t[i] / (t2 * t2));
                if (offset) {
                    j.setEntry(i, 2, 1);
                }
            }
            return new Pair<>(v, j);
        };
        double[] x0 = offset ? new double[] {start[0], start[1], 0} : start;
        LeastSquaresOptimizer.Optimum opt;
        try {
            opt = optimizer.optimize(new LeastSquaresBuilder()
                    .start(x0)
                    .model(model)
                    .target(y)
                    .parameterValidator(p -> {
                        p.setEntry(0, Math.max(0, p.getEntry(0)));
                        p.setEntry(1, Math.max(t2Min, Math.min(t2Max, p.getEntry(1))));
                        return p;
                    })
                    .maxEvaluations(1000)
                    .maxIterations(200)
                    .build());
        } catch (RuntimeException e) {
            return VoxelStatus.NOT_CONVERGED;
        }
        RealVector p = opt.getPoint();
        double cost = opt.getResiduals().dotProduct(opt.getResiduals());
        int dof = Math.max(1, m - p.getDimension());
        out[T2] = p.getEntry(1);
        out[AMPLITUDE] = p.getEntry(0);
        out[OFFSET] = offset ? p.getEntry(2) : 0;
        out[RESIDUAL_RMS] = Math.sqrt(cost / m);
        try {
            RealMatrix cov = opt.getCovariances(1e-14);
            out[T2_SE] = Math.sqrt(cost / dof * cov.getEntry(1, 1));
        } catch (RuntimeException e) {
            out[T2_SE] = Double.POSITIVE_INFINITY;
        }
        boolean onBound = out[T2] <= t2Min * (1 + 1e-9) || out[T2] >= t2Max * (1 - 1e-9);
        return onBound ? VoxelStatus.HIT_BOUND : VoxelStatus.OK;
    }

    /** Weighted log-linear regression (weights y², common practice) on positive echoes; null if none. */
    private double[] logLinearStart(double[] t, double[] y) {
        double sw = 0;
        double st = 0;
        double sl = 0;
        double stt = 0;
        double stl = 0;
        int used = 0;
        for (int i = 0; i < t.length; i++) {
            if (y[i] > 0) {
                double w = y[i] * y[i];
                double l = Math.log(y[i]);
                sw += w;
                st += w * t[i];
                sl += w * l;
                stt += w * t[i] * t[i];
                stl += w * t[i] * l;
                used++;
            }
        }
        if (used < 2 || !(sw > 0)) {
            return null;
        }
        double det = sw * stt - st * st;
        double slope = det > 0 ? (sw * stl - st * sl) / det : -1.0 / 100;
        double icpt = (sl - slope * st) / sw;
        double t2 = slope < 0 ? -1 / slope : t2Max;
        t2 = Math.max(t2Min, Math.min(t2Max, t2));
        return new double[] {Math.exp(icpt), t2};
    }
}
