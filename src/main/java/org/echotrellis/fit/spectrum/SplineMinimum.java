package org.echotrellis.fit.spectrum;

/**
 * Minimum of the natural cubic spline through (x_k, y_k), k = 0 … K−1, with equally spaced x: the
 * interpolation step of the refocusing-angle refinement (Prasloski et al., MRM 67:1803, 2012, fit
 * a spline to χ²(α) and take its minimum).
 *
 * <p>The second derivatives M_k solve the tridiagonal system of the natural spline (M_0 = M_{K−1}
 * = 0; Thomas algorithm). On each segment [x_k, x_k + h], with u = x − x_k,
 * S'(u) = (M_{k+1} − M_k)/(2h)·u² + M_k·u + (y_{k+1} − y_k)/h − h(2M_k + M_{k+1})/6,
 * whose roots in [0, h] and the segment ends are the candidates; the smallest S wins.
 * Not thread-safe; workspace reused, no allocation after the first call with a given K.
 */
final class SplineMinimum {
    private double[] m = new double[0];
    private double[] c = new double[0];
    private double[] d = new double[0];
    private double bestValue;

    /**
     * @param x0 first abscissa
     * @param h  spacing (> 0)
     * @param y  ordinates, length ≥ count; not modified
     * @param count number of points K ≥ 3
     * @return the abscissa of the spline minimum within [x0, x0 + (K−1)h]
     */
    double argmin(double x0, double h, double[] y, int count) {
        if (m.length < count) {
            m = new double[count];
            c = new double[count];
            d = new double[count];
        }
        // Natural spline with equal spacing: M_{k−1} + 4 M_k + M_{k+1} = 6 (y_{k−1} − 2y_k + y_{k+1}) / h².
        int inner = count - 2;
        for (int i = 0; i < inner; i++) {
            d[i] = 6 * (y[i] - 2 * y[i + 1] + y[i + 2]) / (h * h);
        }
        c[0] = 1.0 / 4;
        d[0] = d[0] / 4;
        for (int i = 1; i < inner; i++) {
            double den = 4 - c[i - 1];
            c[i] = 1 / den;
            d[i] = (d[i] - d[i - 1]) / den;
        }
        m[0] = 0;
        m[count - 1] = 0;
        for (int i = inner - 1; i >= 0; i--) {
            m[i + 1] = d[i] - (i + 1 < inner ? c[i] * m[i + 2] : 0);
        }
        double bestX = x0;
        bestValue = y[0];
        for (int k = 0; k < count - 1; k++) {
            double xk = x0 + k * h;
            if (y[k + 1] < bestValue) {
                bestValue = y[k + 1];
                bestX = xk + h;
            }
            double qa = (m[k + 1] - m[k]) / (2 * h);
            double qb = m[k];
            double qc = (y[k + 1] - y[k]) / h - h * (2 * m[k] + m[k + 1]) / 6;
            if (Math.abs(qa) < 1e-300) {
                if (qb != 0) {
                    bestX = candidate(k, xk, h, y, -qc / qb, bestX);
                }
                continue;
            }
            double disc = qb * qb - 4 * qa * qc;
            if (disc < 0) {
                continue;
            }
            double sq = Math.sqrt(disc);
            double q = -0.5 * (qb + Math.copySign(sq, qb));
            bestX = candidate(k, xk, h, y, q / qa, bestX);
            if (q != 0) {
                bestX = candidate(k, xk, h, y, qc / q, bestX);
            }
        }
        return bestX;
    }

    /** @return spline value at the last minimum found */
    double minimumValue() {
        return bestValue;
    }

    private double candidate(int k, double xk, double h, double[] y, double u, double bestX) {
        if (!(u > 0 && u < h)) {
            return bestX;
        }
        double v = value(k, h, y, u);
        if (v < bestValue) {
            bestValue = v;
            return xk + u;
        }
        return bestX;
    }

    private double value(int k, double h, double[] y, double u) {
        double w = h - u;
        return m[k] * w * w * w / (6 * h) + m[k + 1] * u * u * u / (6 * h)
                + (y[k] / h - m[k] * h / 6) * w + (y[k + 1] / h - m[k + 1] * h / 6) * u;
    }
}
