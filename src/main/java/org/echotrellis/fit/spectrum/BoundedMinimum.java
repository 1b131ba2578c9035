package org.echotrellis.fit.spectrum;

import java.util.function.DoubleUnaryOperator;

/**
 * Minimum of a function of one variable on a closed interval without derivatives: golden-section
 * steps combined with successive parabolic interpolation (Brent, Algorithms for Minimization
 * without Derivatives, 1973, ch. 5, procedure "localmin"). Converges to a local minimum within the
 * interval to the absolute tolerance given; the function is evaluated at most {@code maxEvaluations}
 * times. Stateless apart from the result of the last call; not thread-safe.
 */
final class BoundedMinimum {
    private static final double GOLD = 0.5 * (3 - Math.sqrt(5));
    private double value;
    private int evaluations;

    /**
     * @param f the function
     * @param lo left end
     * @param hi right end (&gt; lo)
     * @param tol absolute tolerance in x
     * @param maxEvaluations evaluation limit
     * @return the abscissa of the minimum found
     */
    double argmin(DoubleUnaryOperator f, double lo, double hi, double tol, int maxEvaluations) {
        double a = lo;
        double b = hi;
        double x = a + GOLD * (b - a);
        double w = x;
        double v = x;
        double fx = f.applyAsDouble(x);
        evaluations = 1;
        double fw = fx;
        double fv = fx;
        double d = 0;
        double e = 0;
        while (evaluations < maxEvaluations) {
            double m = 0.5 * (a + b);
            double t = 1e-10 * Math.abs(x) + tol / 3;
            if (Math.abs(x - m) <= 2 * t - 0.5 * (b - a)) {
                break;
            }
            boolean golden = true;
            if (Math.abs(e) > t) {
                double r = (x - w) * (fx - fv);
                double q = (x - v) * (fx - fw);
                double p = (x - v) * q - (x - w) * r;
                q = 2 * (q - r);
                if (q > 0) {
                    p = -p;
                } else {
                    q = -q;
                }
                if (Math.abs(p) < Math.abs(0.5 * q * e) && p > q * (a - x) && p < q * (b - x)) {
                    e = d;
                    d = p / q;
                    double u = x + d;
                    if (u - a < 2 * t || b - u < 2 * t) {
                        d = x < m ? t : -t;
                    }
                    golden = false;
                }
            }
            if (golden) {
                e = (x < m ? b : a) - x;
                d = GOLD * e;
            }
            double u = x + (Math.abs(d) >= t ? d : (d > 0 ? t : -t));
            double fu = f.applyAsDouble(u);
            evaluations++;
            if (fu <= fx) {
                if (u < x) {
                    b = x;
                } else {
                    a = x;
                }
                v = w;
                fv = fw;
                w = x;
                fw = fx;
                x = u;
                fx = fu;
            } else {
                if (u < x) {
                    a = u;
                } else {
                    b = u;
                }
                if (fu <= fw || w == x) {
                    v = w;
                    fv = fw;
                    w = u;
                    fw = fu;
                } else if (fu <= fv || v == x || v == w) {
                    v = u;
                    fv = fu;
                }
            }
        }
        value = fx;
        return x;
    }

    /** @return the function value at the last minimum found */
    double value() {
        return value;
    }

    /** @return evaluations of the last call */
    int evaluations() {
        return evaluations;
    }
}
