package org.echotrellis.design;

import org.apache.commons.math3.analysis.interpolation.LinearInterpolator;
import org.apache.commons.math3.analysis.interpolation.SplineInterpolator;
import org.apache.commons.math3.analysis.polynomials.PolynomialSplineFunction;
import org.echotrellis.Checks;

/**
 * A smooth refocusing schedule from a few knots: K knot flips at echo positions spread evenly
 * from echo 1 to the last echo it spans, joined by a natural cubic spline (linear for K = 2) and
 * clamped to the flip bounds.
 */
final class FlipSpline {
    private final double[] positions;
    private final int echoes;

    /**
     * @param knots number of knots, 2 to 32 and at most the echo count
     * @param echoes number of echoes the spline spans, from echo 1
     */
    public FlipSpline(int knots, int echoes) {
        Checks.inRange("knots", knots, 2, Math.max(2, Math.min(32, echoes)), null);
        this.echoes = echoes;
        positions = new double[knots];
        for (int j = 0; j < knots; j++) {
            positions[j] = 1 + j * (echoes - 1.0) / (knots - 1);
        }
    }

    /** @return number of echoes the spline spans (from echo 1) */
    public int echoes() {
        return echoes;
    }

    /** @return number of knots */
    public int knots() {
        return positions.length;
    }

    /** @return echo position (1-based, fractional) of each knot */
    public double[] positions() {
        return positions.clone();
    }

    /**
     * @param knotFlipsDeg flip at each knot (not modified)
     * @param minDeg lower clamp
     * @param maxDeg upper clamp
     * @param out receives one flip for each of the first {@link #echoes()} echoes (modified)
     */
    public void evaluate(double[] knotFlipsDeg, double minDeg, double maxDeg, double[] out) {
        if (echoes == 1) {
            out[0] = clamp(knotFlipsDeg[0], minDeg, maxDeg);
            return;
        }
        PolynomialSplineFunction f = positions.length == 2
                ? new LinearInterpolator().interpolate(positions, knotFlipsDeg)
                : new SplineInterpolator().interpolate(positions, knotFlipsDeg);
        for (int n = 1; n <= echoes; n++) {
            out[n - 1] = clamp(f.value(Math.min(n, positions[positions.length - 1])), minDeg, maxDeg);
        }
    }

    private static double clamp(double v, double lo, double hi) {
        return Math.max(lo, Math.min(hi, v));
    }
}
