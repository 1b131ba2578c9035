package org.echotrellis.fit;

/**
 * Cramér–Rao standard errors from a least-squares Jacobian: cov = s²·(JᵀJ)⁻¹ with s² the residual
 * variance Σr²/(N − P) (the linearised covariance of nonlinear least squares; e.g. Seber &amp;
 * Wild, Nonlinear Regression, 1989, ch. 2). A parameter whose Jacobian column is negligible
 * (relative norm below 1e-9) is not determined by the data: its standard error is +Infinity and
 * it is left out of the inverse, so the others get their conditional errors.
 */
final class Covariance {
    private final int p;
    private final double[] a;
    private final double[] inv;
    private final boolean[] dropped;

    Covariance(int parameters) {
        this.p = parameters;
        a = new double[p * p];
        inv = new double[p * p];
        dropped = new boolean[p];
    }

    /**
     * @param jac Jacobian, jac[i·p + k] for m residuals; not modified
     * @param m residuals
     * @param s2 residual variance
     * @param fNorm norm of the fitted model, the reference for the negligible-column test
     * @param se receives the standard error per parameter; modified
     */
    void standardErrors(double[] jac, int m, double s2, double fNorm, double[] se) {
        java.util.Arrays.fill(a, 0.0);
        for (int i = 0; i < m; i++) {
            int o = i * p;
            for (int k = 0; k < p; k++) {
                for (int l = 0; l < p; l++) {
                    a[k * p + l] += jac[o + k] * jac[o + l];
                }
            }
        }
        for (int k = 0; k < p; k++) {
            dropped[k] = !(Math.sqrt(a[k * p + k]) > 1e-9 * fNorm);
            if (dropped[k]) {
                for (int l = 0; l < p; l++) {
                    a[k * p + l] = k == l ? 1 : 0;
                    a[l * p + k] = k == l ? 1 : 0;
                }
            }
        }
        if (!invert()) {
            java.util.Arrays.fill(se, Double.POSITIVE_INFINITY);
            return;
        }
        for (int k = 0; k < p; k++) {
            double v = inv[k * p + k];
            se[k] = dropped[k] || !(v >= 0) ? Double.POSITIVE_INFINITY : Math.sqrt(s2 * v);
        }
    }

    /** Gauss–Jordan with partial pivoting; false if singular. */
    private boolean invert() {
        java.util.Arrays.fill(inv, 0.0);
        for (int k = 0; k < p; k++) {
            inv[k * p + k] = 1;
        }
        for (int c = 0; c < p; c++) {
            int piv = c;
            for (int i = c + 1; i < p; i++) {
                if (Math.abs(a[i * p + c]) > Math.abs(a[piv * p + c])) {
                    piv = i;
                }
            }
            double d = a[piv * p + c];
            if (!(Math.abs(d) > 1e-300)) {
                return false;
            }
            if (piv != c) {
                for (int l = 0; l < p; l++) {
                    swap(a, c * p + l, piv * p + l);
                    swap(inv, c * p + l, piv * p + l);
                }
            }
            for (int l = 0; l < p; l++) {
                a[c * p + l] /= d;
                inv[c * p + l] /= d;
            }
            for (int i = 0; i < p; i++) {
                if (i != c) {
                    double f = a[i * p + c];
                    for (int l = 0; l < p; l++) {
                        a[i * p + l] -= f * a[c * p + l];
                        inv[i * p + l] -= f * inv[c * p + l];
                    }
                }
            }
        }
        return true;
    }

    private static void swap(double[] x, int i, int j) {
        double t = x[i];
        x[i] = x[j];
        x[j] = t;
    }
}
