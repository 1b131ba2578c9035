package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The GCV weight search finds the minimum of V(μ) = m·‖y − A·s_μ‖² / (m − df(μ))² (Golub, Heath &amp;
 * Wahba 1979) as well as a dense scan of 241 weights over the same range, to 0.5 % of V
 * (V is rough in μ because the NNLS active set changes, so a local search can stop a little short).
 */
class GcvSearchTest {

    @ParameterizedTest
    @ValueSource(longs = {8, 1234, 50_505})
    void searchMatchesDenseScan(long seed) {
        SpectrumOptions o = SpectrumOptions.defaults(org.echotrellis.epg.CpmgTrain.constant(32, 10, 180), 1000, true).withSearch(RefocusSearch.fixed(150))
                .withRegularisation(Regularisation.CROSS_VALIDATION)
                .withWindows(java.util.List.of(new FractionWindow(10, 40))).withGrid(new T2Grid(10, 2000, 40));
        BasisCache cache = BasisCache.build(CpmgTrain.constant(32, 10, 180), 1000, o.grid(), o.search());
        SpectrumFitter fitter = new SpectrumFitter(cache, o);
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] a = cache.searchBasis(0);
        double[] g = cache.searchGram(0);
        int m = 32;
        int n = o.grid().bins();
        double scale = 0;
        for (int j = 0; j < n; j++) {
            scale += g[j * n + j] / n;
        }
        Nnls nnls = new Nnls();
        double[] b = new double[n];
        double[] x = new double[n];
        double[] fit = new double[m];
        for (int r = 0; r < 5; r++) {
            double[] y = SpectrumAccuracyTest.decay(new double[] {0.12, 0.88}, new double[] {20, 80}, 150,
                    100 + 300 * rnd.nextDouble(), rnd);
            SpectrumFit f = fitter.fit("d", y);
            Gram.project(a, m, n, y, 0, b);
            double chosen = v(nnls, g, b, a, y, f.mu(), x, fit);
            double best = Double.POSITIVE_INFINITY;
            for (int k = 0; k <= 240; k++) {
                double mu = 1e-8 * scale * Math.pow(10, k / 24.0);
                best = Math.min(best, v(nnls, g, b, a, y, mu, x, fit));
            }
            assertTrue(chosen <= best * 1.005, "V(chosen) " + chosen + " vs dense minimum " + best);
        }
    }

    private static double v(Nnls nnls, double[] g, double[] b, double[] a, double[] y, double mu, double[] x,
                            double[] fit) {
        nnls.solve(g, b, x.length, mu, false, x);
        double rss = Gram.residual(a, 32, x.length, x, y, 0, fit);
        double df = nnls.passiveCount() - mu * nnls.inverseTrace();
        return 32 * rss / ((32 - df) * (32 - df));
    }
}
