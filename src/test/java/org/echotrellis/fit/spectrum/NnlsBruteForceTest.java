package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.QRDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * NNLS against obviously correct slow code: every support S ⊆ {1..n} (n ≤ 7), unconstrained least
 * squares on the columns in S by Commons Math QR, kept when all coefficients are positive; the
 * smallest residual wins. An optimum with linearly independent columns always exists
 * (Lawson &amp; Hanson 1974, ch. 23), so the enumeration finds the minimum; rank-deficient subsets are
 * skipped. Includes under-determined (m &lt; n) and duplicated-column problems. Residual norms agree
 * to 1e-9.
 */
class NnlsBruteForceTest {

    @ParameterizedTest
    @ValueSource(longs = {3, 31, 314, 3141, 31_415})
    void matchesEnumerationOfSupports(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        Nnls solver = new Nnls();
        for (int k = 0; k < 30; k++) {
            int n = 2 + r.nextInt(6);
            int m = 2 + r.nextInt(10);
            double[] a = new double[m * n];
            for (int i = 0; i < a.length; i++) {
                a[i] = r.nextDouble() * 2 - 1;
            }
            if (n >= 3 && r.nextInt(3) == 0) {
                System.arraycopy(a, 0, a, 2 * m, m);          // column 3 repeats column 1
            }
            double[] y = new double[m];
            for (int i = 0; i < m; i++) {
                y[i] = r.nextDouble() * 2 - 1;
            }
            double[] x = new double[n];
            solver.solve(a, m, n, y, x);
            double[] fit = new double[m];
            double rss = Gram.residual(a, m, n, x, y, 0, fit);
            assertEquals(bruteForce(a, m, n, y), Math.sqrt(rss), 1e-9, "m " + m + " n " + n);
        }
    }

    static double bruteForce(double[] a, int m, int n, double[] y) {
        RealVector yv = new ArrayRealVector(y);
        double best = yv.getNorm();                      // empty support: x = 0
        for (int mask = 1; mask < (1 << n); mask++) {
            int p = Integer.bitCount(mask);
            if (p > m) {
                continue;
            }
            RealMatrix as = new Array2DRowRealMatrix(m, p);
            int c = 0;
            for (int j = 0; j < n; j++) {
                if ((mask & (1 << j)) != 0) {
                    for (int i = 0; i < m; i++) {
                        as.setEntry(i, c, a[j * m + i]);
                    }
                    c++;
                }
            }
            QRDecomposition qr = new QRDecomposition(as, 1e-10);
            if (!qr.getSolver().isNonSingular()) {
                continue;
            }
            RealVector z = qr.getSolver().solve(yv);
            if (z.getMinValue() <= 0) {
                continue;
            }
            best = Math.min(best, as.operate(z).subtract(yv).getNorm());
        }
        return best;
    }
}
