package org.echotrellis.fit.spectrum;

/**
 * Dense kernels on column-major basis matrices (a[j·m + i] = A_ij, one contiguous column per T2
 * bin). Package-private helpers of the spectrum fit; no allocation.
 */
final class Gram {
    private Gram() { }

    /**
     * G = AᵀA (row-major n×n, symmetric, both halves written). Cost m·n(n+1)/2 multiply–adds.
     *
     * @param a   m×n column-major; not modified
     * @param out n×n; overwritten
     */
    static void fill(double[] a, int m, int n, double[] out) {
        for (int j = 0; j < n; j++) {
            int cj = j * m;
            for (int k = 0; k <= j; k++) {
                int ck = k * m;
                double s = 0;
                for (int i = 0; i < m; i++) {
                    s += a[cj + i] * a[ck + i];
                }
                out[j * n + k] = s;
                out[k * n + j] = s;
            }
        }
    }

    /**
     * b = Aᵀy. Cost m·n.
     *
     * @param a      m×n column-major; not modified
     * @param y      data; y[offset … offset+m−1] read, not modified
     * @param offset first element of the decay in {@code y}
     * @param out    length ≥ n; overwritten
     */
    static void project(double[] a, int m, int n, double[] y, int offset, double[] out) {
        for (int j = 0; j < n; j++) {
            int cj = j * m;
            double s = 0;
            for (int i = 0; i < m; i++) {
                s += a[cj + i] * y[offset + i];
            }
            out[j] = s;
        }
    }

    /**
     * Residual sum of squares ‖y − A·x‖², skipping zero coefficients (NNLS solutions are sparse).
     *
     * @param a      m×n column-major; not modified
     * @param x      coefficients, length ≥ n; not modified
     * @param y      data, read at offset; not modified
     * @param offset first element of the decay in {@code y}
     * @param work   length ≥ m; overwritten with the fitted curve A·x
     * @return Σ (y_i − (A·x)_i)²
     */
    static double residual(double[] a, int m, int n, double[] x, double[] y, int offset, double[] work) {
        java.util.Arrays.fill(work, 0, m, 0.0);
        for (int j = 0; j < n; j++) {
            double c = x[j];
            if (c != 0) {
                int cj = j * m;
                for (int i = 0; i < m; i++) {
                    work[i] += c * a[cj + i];
                }
            }
        }
        double s = 0;
        for (int i = 0; i < m; i++) {
            double r = y[offset + i] - work[i];
            s += r * r;
        }
        return s;
    }
}
