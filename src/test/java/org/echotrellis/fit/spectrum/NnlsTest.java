package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.LUDecomposition;
import org.apache.commons.math3.linear.MatrixUtils;
import org.apache.commons.math3.linear.RealMatrix;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Properties of the Lawson–Hanson solver on random problems (several fixed seeds). */
class NnlsTest {

    record Problem(double[] a, int m, int n, double[] y) { }

    static Problem random(SplittableRandom r) {
        int m = 8 + r.nextInt(30);
        int n = 3 + r.nextInt(25);
        double[] a = new double[m * n];
        for (int i = 0; i < a.length; i++) {
            a[i] = r.nextDouble() * 2 - 1;
        }
        double[] y = new double[m];
        for (int i = 0; i < m; i++) {
            y[i] = r.nextDouble() * 2 - 1;
        }
        return new Problem(a, m, n, y);
    }

    static double[] gradient(Problem p, double[] x, double ridge) {
        double[] fit = new double[p.m()];
        Gram.residual(p.a(), p.m(), p.n(), x, p.y(), 0, fit);
        double[] w = new double[p.n()];
        for (int j = 0; j < p.n(); j++) {
            double s = -ridge * x[j];
            for (int i = 0; i < p.m(); i++) {
                s += p.a()[j * p.m() + i] * (p.y()[i] - fit[i]);
            }
            w[j] = s;
        }
        return w;
    }

    @ParameterizedTest
    @ValueSource(longs = {1, 17, 4096, 65_537})
    void kuhnTuckerConditionsHold(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        Nnls solver = new Nnls();
        for (int k = 0; k < 25; k++) {
            Problem p = random(r);
            double[] x = new double[p.n()];
            assertEquals(Nnls.CONVERGED, solver.solve(p.a(), p.m(), p.n(), p.y(), x));
            double[] w = gradient(p, x, 0);
            for (int j = 0; j < p.n(); j++) {
                // Kuhn–Tucker conditions of NNLS (Lawson & Hanson 1974, ch. 23, theorem 23.4):
                // x ≥ 0; w = Aᵀ(y − Ax) ≤ 0; w_j = 0 where x_j > 0. Tolerance 1e-9 (problems are O(1)).
                assertTrue(x[j] >= 0);
                assertTrue(w[j] <= 1e-9, "w" + j + " = " + w[j]);
                if (x[j] > 0) {
                    assertEquals(0, w[j], 1e-9);
                }
            }
        }
    }

    @ParameterizedTest
    @ValueSource(longs = {2, 23, 777})
    void ridgeEqualsExplicitAugmentedSystemAndWarmStartsAgree(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        Nnls solver = new Nnls();
        for (int k = 0; k < 20; k++) {
            Problem p = random(r);
            double mu = Math.pow(10, -4 + 4 * r.nextDouble());
            int m2 = p.m() + p.n();
            double[] aug = new double[m2 * p.n()];
            double[] y2 = new double[m2];
            System.arraycopy(p.y(), 0, y2, 0, p.m());
            for (int j = 0; j < p.n(); j++) {
                System.arraycopy(p.a(), j * p.m(), aug, j * m2, p.m());
                aug[j * m2 + p.m() + j] = Math.sqrt(mu);
            }
            double[] xAug = new double[p.n()];
            solver.solve(aug, m2, p.n(), y2, xAug);
            double[] g = new double[p.n() * p.n()];
            double[] b = new double[p.n()];
            Gram.fill(p.a(), p.m(), p.n(), g);
            Gram.project(p.a(), p.m(), p.n(), p.y(), 0, b);
            double[] xRidge = new double[p.n()];
            solver.solve(g, b, p.n(), mu, false, xRidge);
            double[] xWarm = new double[p.n()];
            for (int j = 0; j < p.n(); j++) {
                xWarm[j] = r.nextDouble() < 0.5 ? r.nextDouble() : 0;   // arbitrary feasible start
            }
            solver.solve(g, b, p.n(), mu, true, xWarm);
            for (int j = 0; j < p.n(); j++) {
                // Tikhonov as augmented least squares [A; √μ I] (Whittall & MacKay 1989): same minimiser,
                // unique for μ > 0 (strictly convex); 1e-9 absolute
                assertEquals(xAug[j], xRidge[j], 1e-9);
                assertEquals(xRidge[j], xWarm[j], 1e-9);
            }
        }
    }

    @ParameterizedTest
    @ValueSource(longs = {6, 60, 600})
    void warmStartOnDependentColumnsRecovers(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        Nnls solver = new Nnls();
        for (int k = 0; k < 20; k++) {
            Problem p = random(r);
            if (p.n() < 3) {
                continue;
            }
            System.arraycopy(p.a(), 0, p.a(), 2 * p.m(), p.m());    // column 2 duplicates column 0
            double[] g = new double[p.n() * p.n()];
            double[] b = new double[p.n()];
            Gram.fill(p.a(), p.m(), p.n(), g);
            Gram.project(p.a(), p.m(), p.n(), p.y(), 0, b);
            double[] cold = new double[p.n()];
            solver.solve(g, b, p.n(), 0, false, cold);
            double[] warm = new double[p.n()];
            java.util.Arrays.fill(warm, 0.5);                        // a support with dependent columns
            assertEquals(Nnls.CONVERGED, solver.solve(g, b, p.n(), 0, true, warm));
            double[] fit = new double[p.m()];
            // the fitted vector of NNLS is unique (projection onto a convex cone), whatever the start
            assertEquals(Gram.residual(p.a(), p.m(), p.n(), cold, p.y(), 0, fit),
                    Gram.residual(p.a(), p.m(), p.n(), warm, p.y(), 0, fit), 1e-9);
        }
    }

    @ParameterizedTest
    @ValueSource(longs = {5, 99, 2024})
    void effectiveDegreesOfFreedomMatchInfluenceMatrixTrace(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        Nnls solver = new Nnls();
        for (int k = 0; k < 10; k++) {
            Problem p = random(r);
            double mu = Math.pow(10, -3 + 3 * r.nextDouble());
            double[] g = new double[p.n() * p.n()];
            double[] b = new double[p.n()];
            Gram.fill(p.a(), p.m(), p.n(), g);
            Gram.project(p.a(), p.m(), p.n(), p.y(), 0, b);
            double[] x = new double[p.n()];
            solver.solve(g, b, p.n(), mu, false, x);
            int[] support = java.util.stream.IntStream.range(0, p.n()).filter(j -> x[j] > 0).toArray();
            if (support.length == 0) {
                continue;
            }
            RealMatrix ap = new Array2DRowRealMatrix(p.m(), support.length);
            for (int c = 0; c < support.length; c++) {
                for (int i = 0; i < p.m(); i++) {
                    ap.setEntry(i, c, p.a()[support[c] * p.m() + i]);
                }
            }
            RealMatrix inner = ap.transpose().multiply(ap)
                    .add(MatrixUtils.createRealIdentityMatrix(support.length).scalarMultiply(mu));
            RealMatrix h = ap.multiply(new LUDecomposition(inner).getSolver().getInverse()).multiply(ap.transpose());
            // influence matrix H = A_P (A_PᵀA_P + μI)⁻¹ A_Pᵀ (Golub, Heath & Wahba 1979), trace by Commons Math
            assertEquals(support.length, solver.passiveCount());
            assertEquals(h.getTrace(), solver.passiveCount() - mu * solver.inverseTrace(), 1e-9);
        }
    }

    @ParameterizedTest
    @ValueSource(doubles = {0.3, 1.7, 2.9})
    void boundedMinimumFindsTheMinimumOfAQuarticAndStopsAtABound(double centre) {
        // (x - c)^2 + (x - c)^4 has its only minimum at c (calculus; common practice); Brent's
        // method (Brent 1973, ch. 5) must find it to the tolerance, and a monotone function's
        // minimum on [0, 3] lies at the bound.
        BoundedMinimum s = new BoundedMinimum();
        double x = s.argmin(v -> (v - centre) * (v - centre) + Math.pow(v - centre, 4), 0, 3, 1e-6, 100);
        assertEquals(centre, x, 1e-5);
        assertEquals(0, s.value(), 1e-9);
        assertEquals(3, s.argmin(v -> -v, 0, 3, 1e-6, 100), 1e-5);
        assertTrue(s.evaluations() <= 100);
    }
}
