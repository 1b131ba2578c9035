package org.echotrellis.fit.spectrum;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Recovery of known spectra from synthetic decays (our own scenario values). The forward model is
 * the EPG CPMG echo train (Hennig 1988; Weigel 2015), magnitude data with Gaussian noise in both
 * channels (Rician magnitude, Gudbjartsson &amp; Patz 1995). The criteria are those of the spectrum
 * issue; several fixed seeds.
 */
class SpectrumAccuracyTest {

    static final CpmgTrain TRAIN = CpmgTrain.constant(32, 10, 180);
    static final SpectrumOptions OPTIONS = SpectrumOptions.defaults(org.echotrellis.epg.CpmgTrain.constant(32, 10, 180), 1000, true);
    static final BasisCache CACHE = BasisCache.build(TRAIN, 1000, OPTIONS.grid(), OPTIONS.search());

    /**
     * Noisy magnitude decay of a mixture (M0 total 1). SNR is defined as in the SNR map of the fit:
     * noise-free first-echo amplitude / σ, σ the noise SD in each channel.
     */
    static double[] decay(double[] fractions, double[] t2Ms, double refocusDeg, double snr, SplittableRandom rnd) {
        CpmgTrain train = CpmgTrain.constant(32, 10, refocusDeg);
        CpmgEngine engine = new CpmgEngine(1);
        double[] y = new double[32];
        for (int c = 0; c < fractions.length; c++) {
            double[] e = engine.echoes(train, 1000, t2Ms[c], 1.0);
            for (int i = 0; i < 32; i++) {
                y[i] += fractions[c] * Math.abs(e[i]);
            }
        }
        double sigma = y[0] / snr;
        for (int i = 0; i < 32; i++) {
            double re = y[i] + sigma * gaussian(rnd);
            double im = sigma * gaussian(rnd);
            y[i] = Math.hypot(re, im);
        }
        return y;
    }

    static double gaussian(SplittableRandom rnd) {
        double u = rnd.nextDouble();
        double v = rnd.nextDouble();
        return Math.sqrt(-2 * Math.log(1 - u)) * Math.cos(2 * Math.PI * v);
    }

    @ParameterizedTest
    @ValueSource(longs = {11, 2026, 77_003})
    void twoPoolsShortFractionAndAngle(long seed) {
        SpectrumFitter fitter = new SpectrumFitter(CACHE, OPTIONS);
        SplittableRandom rnd = new SplittableRandom(seed);
        int runs = 300;
        double[] err = new double[runs];
        int within3pct = 0;
        int angleOk = 0;
        for (int r = 0; r < runs; r++) {
            // our own two-pool scenario: 15 % at 20 ms + 85 % at 80 ms, refocusing 150°, SNR 300
            double[] y = decay(new double[] {0.15, 0.85}, new double[] {20, 80}, 150, 300, rnd);
            SpectrumFit f = fitter.fit("r" + r, y);
            assertEquals(SpectrumStatus.OK, f.status());
            err[r] = Math.abs(f.windows().get(0).fraction() - 0.15);
            within3pct += err[r] <= 0.03 ? 1 : 0;
            angleOk += Math.abs(f.refocusDeg() - 150) <= 3 ? 1 : 0;
        }
        Arrays.sort(err);
        double median = 0.5 * (err[runs / 2 - 1] + err[runs / 2]);
        // criteria of the spectrum issue: median |error| ≤ 0.02, ≥ 80 % within ±0.03, angle ±3° in ≥ 90 %
        assertTrue(median <= 0.02, "median |fraction error| " + median);
        assertTrue(within3pct >= 0.8 * runs, "within ±0.03: " + within3pct + "/" + runs);
        assertTrue(angleOk >= 0.9 * runs, "angle within 3°: " + angleOk + "/" + runs);
    }

    @ParameterizedTest
    @ValueSource(longs = {5, 909, 31_337})
    void onePoolPeakWithinOneBin(long seed) {
        SpectrumFitter fitter = new SpectrumFitter(CACHE, OPTIONS);
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] grid = OPTIONS.grid().t2Ms();
        for (double t2 : new double[] {25, 60, 110, 300}) {
            double angle = 130 + 40 * rnd.nextDouble();
            SpectrumFit f = fitter.fit("one", decay(new double[] {1}, new double[] {t2}, angle, 300, rnd));
            int peak = f.peakBin();
            int truth = nearest(grid, t2);
            // issue criterion: peak within one bin of the true T2
            assertTrue(Math.abs(peak - truth) <= 1, "T2 " + t2 + ": peak at " + grid[peak]);
            // issue criterion: fraction outside the peak's window < 0.05 (window = peak ± 2 bins, our choice)
            double[] s = f.amplitude();
            double total = Arrays.stream(s).sum();
            double inside = 0;
            for (int j = Math.max(0, peak - 2); j <= Math.min(s.length - 1, peak + 2); j++) {
                inside += s[j];
            }
            assertTrue(1 - inside / total < 0.05, "T2 " + t2 + ": outside " + (1 - inside / total));
        }
    }

    static int nearest(double[] grid, double t2) {
        int best = 0;
        for (int j = 1; j < grid.length; j++) {
            if (Math.abs(Math.log(grid[j] / t2)) < Math.abs(Math.log(grid[best] / t2))) {
                best = j;
            }
        }
        return best;
    }

    @ParameterizedTest
    @ValueSource(longs = {3, 4_242, 987_654})
    void chi2FactorIsMet(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        for (double factor : new double[] {1.01, 1.02, 1.05}) {
            SpectrumOptions o = OPTIONS.withMisfitIncrease(factor);
            SpectrumFitter fitter = new SpectrumFitter(CACHE, o);
            for (int r = 0; r < 10; r++) {
                double[] y = decay(new double[] {0.1, 0.6, 0.3}, new double[] {18, 75, 140},
                        140 + 30 * rnd.nextDouble(), 150 + 300 * rnd.nextDouble(), rnd);
                SpectrumFit f = fitter.fit("d", y);
                assertEquals(SpectrumStatus.OK, f.status());
                // issue criterion (Whittall & MacKay 1989 χ² factor): χ²(μ) = factor·χ²(0) within 1e-3 relative
                assertEquals(factor, f.chi2() / f.chi2Unregularised(), 1e-3 * factor);
                assertTrue(f.mu() > 0);
            }
        }
    }

    @ParameterizedTest
    @ValueSource(longs = {13, 1313, 131_313})
    void pureNoiseIsFlagged(long seed) {
        SpectrumFitter fitter = new SpectrumFitter(CACHE, OPTIONS);
        SplittableRandom rnd = new SplittableRandom(seed);
        int flagged = 0;
        for (int r = 0; r < 50; r++) {
            double[] y = new double[32];
            for (int i = 0; i < 32; i++) {
                y[i] = Math.hypot(0.01 * gaussian(rnd), 0.01 * gaussian(rnd));   // Rayleigh: no signal at all
            }
            int s = fitter.fit("noise", y).status();
            flagged += s == SpectrumStatus.LOW_SIGNAL || s == SpectrumStatus.TARGET_NOT_REACHED ? 1 : 0;
        }
        // our rule: largest fitted echo < 10 × noise estimate → low signal; every pure-noise decay is flagged
        assertTrue(flagged == 50, "flagged " + flagged + "/50");
    }

    static List<FractionWindow> windows() {
        return List.of(FractionWindow.shortT2(OPTIONS.grid()));
    }
}
