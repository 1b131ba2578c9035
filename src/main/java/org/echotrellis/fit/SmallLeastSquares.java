package org.echotrellis.fit;

/**
 * A Levenberg–Marquardt solver for small bounded problems (1 to 4 parameters, any number of
 * residuals), allocation-free after construction and meant to be reused by one thread for many
 * voxels. Marquardt's diagonal scaling, a multiplicative damping schedule, and bounds by
 * projection with an active set: a parameter on a bound whose step points outward is held for
 * that step.
 *
 * <p>Method: K. Levenberg, Q Appl Math 2:164 (1944); D. W. Marquardt, J Soc Ind Appl Math 11:431
 * (1963). Cross-checked in the tests against Commons Math's {@code LevenbergMarquardtOptimizer}.
 */
final class SmallLeastSquares {

    /** The problem: residuals r = y − f(x) and the Jacobian of f. */
    interface Problem {
        /**
         * @param x parameters (not modified)
         * @param r receives residuals y − f(x); modified
         * @param jac receives ∂f_i/∂x_k at jac[i·p + k]; modified
         * @return Σ r², or +Infinity/NaN if f cannot be evaluated at x
         */
        double evaluate(double[] x, double[] r, double[] jac);
    }

    private final int p;
    private final int m;
    private double[] r;
    private double[] jac;
    private double[] rTrial;
    private double[] jacTrial;
    private final double[] xTrial;
    private final double[] h;
    private final double[] g;
    private final double[] a;
    private final double[] step;
    private final boolean[] held;
    private int iterations;
    private boolean converged;
    private double noiseTol = 1e-2;

    /**
     * @param parameters number of parameters (1..4)
     * @param residuals number of residuals
     */
    SmallLeastSquares(int parameters, int residuals) {
        this.p = parameters;
        this.m = residuals;
        r = new double[m];
        rTrial = new double[m];
        jac = new double[m * p];
        jacTrial = new double[m * p];
        xTrial = new double[p];
        h = new double[p * p];
        g = new double[p];
        a = new double[p * p];
        step = new double[p];
        held = new boolean[p];
    }

    /**
     * @param fraction stop when the predicted cost decrease of a step is below this fraction of
     *        the residual variance Σr²/(m − p) (default 1e-2, a remaining step of about a tenth of a standard error; 0 disables the test)
     */
    void noiseTolerance(double fraction) {
        this.noiseTol = fraction;
    }

    /** @return iterations (accepted or rejected steps) of the last solve */
    int iterations() {
        return iterations;
    }

    /** @return true if the last solve met a tolerance before the iteration limit */
    boolean converged() {
        return converged;
    }

    /** @return residuals at the solution of the last solve (internal buffer; do not modify) */
    double[] residuals() {
        return r;
    }

    /** @return Jacobian at the solution of the last solve (internal buffer; do not modify) */
    double[] jacobian() {
        return jac;
    }

    /**
     * Minimises Σ r² from x within [lo, hi].
     *
     * @param problem the problem
     * @param x start on entry, solution on return; modified
     * @param lo lower bounds; not modified
     * @param hi upper bounds; not modified
     * @param maxIterations limit on evaluations after the first
     * @param stepTol relative step tolerance per parameter
     * @return Σ r² at the solution
     */
    double solve(Problem problem, double[] x, double[] lo, double[] hi, int maxIterations, double stepTol) {
        for (int k = 0; k < p; k++) {
            x[k] = Math.max(lo[k], Math.min(hi[k], x[k]));
        }
        double cost = problem.evaluate(x, r, jac);
        double lambda = 1e-3;
        iterations = 0;
        converged = false;
        if (!(cost < Double.POSITIVE_INFINITY)) {
            return cost;
        }
        normalEquations();
        while (iterations < maxIterations) {
            iterations++;
            if (!dampedStep(lambda, x, lo, hi)) {
                converged = true;  // no admissible direction: at a bounded stationary point
                break;
            }
            // Stop when the Gauss–Newton model predicts a cost decrease below a tiny fraction of
            // the residual variance: the remaining step is then far below the standard errors.
            double predicted = 0;
            for (int k = 0; k < p; k++) {
                predicted += step[k] * g[k];
            }
            if (predicted <= noiseTol * cost / Math.max(1, m - p)) {
                converged = true;
                break;
            }
            boolean small = true;
            for (int k = 0; k < p; k++) {
                xTrial[k] = Math.max(lo[k], Math.min(hi[k], x[k] + step[k]));
                if (Math.abs(xTrial[k] - x[k]) > stepTol * (Math.abs(x[k]) + stepTol)) {
                    small = false;
                }
            }
            if (small) {
                converged = true;
                break;
            }
            double trial = problem.evaluate(xTrial, rTrial, jacTrial);
            if (trial <= cost) {
                double[] t = r;
                r = rTrial;
                rTrial = t;
                t = jac;
                jac = jacTrial;
                jacTrial = t;
                System.arraycopy(xTrial, 0, x, 0, p);
                boolean flat = cost - trial <= 1e-10 * cost;
                cost = trial;
                lambda = Math.max(lambda * 0.2, 1e-12);
                normalEquations();
                if (flat) {
                    converged = true;
                    break;
                }
            } else {
                lambda *= 8;
                if (lambda > 1e14) {
                    converged = true;
                    break;
                }
            }
        }
        return cost;
    }

    private void normalEquations() {
        java.util.Arrays.fill(h, 0.0);
        java.util.Arrays.fill(g, 0.0);
        for (int i = 0; i < m; i++) {
            int o = i * p;
            double ri = r[i];
            for (int k = 0; k < p; k++) {
                double jk = jac[o + k];
                g[k] += jk * ri;
                for (int l = 0; l <= k; l++) {
                    h[k * p + l] += jk * jac[o + l];
                }
            }
        }
        for (int k = 0; k < p; k++) {
            for (int l = 0; l < k; l++) {
                h[l * p + k] = h[k * p + l];
            }
        }
    }

    /** Solves (H + λ diag H) δ = g with the active set; false if every parameter is held. */
    private boolean dampedStep(double lambda, double[] x, double[] lo, double[] hi) {
        java.util.Arrays.fill(held, false);
        for (int pass = 0; pass <= p; pass++) {
            double maxDiag = 0;
            for (int k = 0; k < p; k++) {
                maxDiag = Math.max(maxDiag, h[k * p + k]);
            }
            double floor = 1e-14 * Math.max(maxDiag, 1e-300);
            for (int k = 0; k < p; k++) {
                for (int l = 0; l < p; l++) {
                    a[k * p + l] = held[k] || held[l] ? (k == l ? 1.0 : 0.0) : h[k * p + l];
                }
                if (!held[k]) {
                    a[k * p + k] += lambda * Math.max(h[k * p + k], floor) + floor;
                }
                step[k] = held[k] ? 0.0 : g[k];
            }
            if (!gauss()) {
                return false;
            }
            boolean changed = false;
            boolean any = false;
            for (int k = 0; k < p; k++) {
                if (held[k]) {
                    continue;
                }
                boolean out = (x[k] <= lo[k] && step[k] < 0) || (x[k] >= hi[k] && step[k] > 0);
                if (out) {
                    held[k] = true;
                    changed = true;
                } else {
                    any = true;
                }
            }
            if (!changed) {
                return any;
            }
        }
        return false;
    }

    /** Gaussian elimination with partial pivoting on a (p×p), right-hand side in step. */
    private boolean gauss() {
        for (int c = 0; c < p; c++) {
            int piv = c;
            for (int i = c + 1; i < p; i++) {
                if (Math.abs(a[i * p + c]) > Math.abs(a[piv * p + c])) {
                    piv = i;
                }
            }
            if (!(Math.abs(a[piv * p + c]) > 0)) {
                return false;
            }
            if (piv != c) {
                for (int l = 0; l < p; l++) {
                    double t = a[c * p + l];
                    a[c * p + l] = a[piv * p + l];
                    a[piv * p + l] = t;
                }
                double t = step[c];
                step[c] = step[piv];
                step[piv] = t;
            }
            for (int i = c + 1; i < p; i++) {
                double f = a[i * p + c] / a[c * p + c];
                for (int l = c; l < p; l++) {
                    a[i * p + l] -= f * a[c * p + l];
                }
                step[i] -= f * step[c];
            }
        }
        for (int c = p - 1; c >= 0; c--) {
            double s = step[c];
            for (int l = c + 1; l < p; l++) {
                s -= a[c * p + l] * step[l];
            }
            step[c] = s / a[c * p + c];
        }
        return true;
    }
}
