package org.echotrellis.image;

/**
 * The point-spread function of a k-space weighting along the phase-encoding direction and its
 * figures.
 *
 * <p>Definition. Line j sits at k-index u = j − c (c = ⌊L/2⌋). An object point at pixel 0 has the
 * k-space data 1 on every line; weighted by w, its image along the phase-encoding direction is the
 * inverse DFT h(x) = (1/L)·Σⱼ wⱼ·exp(+i2π·(j − c)·x/L), x = −c … L−1−c. We report
 * PSF(x) = |h(x)| / w_c: weights all equal to the centre weight w_c give the discrete delta
 * (PSF(0) = 1, zero elsewhere). The sum Σₓ h(x) = w_c, so a region much larger than the PSF
 * takes the value w_c: the centre weight sets the contrast.
 *
 * <p>Figures ({@link #figures(double[])}): the peak is the largest sample (ties: the one nearest
 * the centre); the main lobe runs from the peak down both flanks as long as the samples do not
 * rise; the FWHM adds, on each flank, the distance at which the PSF first falls below half the
 * peak, interpolated linearly between the last sample at or above and the first sample below half
 * (a single sample of height 1 with zero neighbours gives 0.5 + 0.5 = 1 pixel); the side lobe is
 * the largest sample outside the main lobe, relative to the peak. The PSF is periodic in L (a DFT),
 * so the walks wrap around. *
 * <p>Closed form used as a check (common practice; METHODS §13). Single-shot linear ordering (S = 1)
 * with ideal 180° refocusing and echo spacing ESP: line j is echo j + 1, so wⱼ = r^(j+1) with
 * r = exp(−ESP/T2), and w_c = r^(c+1). With θ = 2πx/L the sum is geometric:
 * Σⱼ r^(j+1)·e^{iθ(j−c)} = r·e^{−iθc}·(1 − r^L·e^{iθL}) / (1 − r·e^{iθ}), and e^{iθL} = e^{i2πx} = 1
 * for integer x, so PSF(x) = (1 − r^L) / (L·r^c·√(1 − 2r·cos θ + r²)): a peak of
 * (1 − r^L)/(L·r^c·(1 − r)) at x = 0 and monotone flanks (no side lobes), wider for shorter T2.
 */
final class PointSpread {
    private PointSpread() { }

    /**
     * @param weights the k-space weight of every line j = 0 … L−1 (not modified)
     * @return the centred PSF magnitude: element i is pixel x = i − ⌊L/2⌋ (a new array; NaN
     *         everywhere when the centre weight is 0)
     */
    public static double[] psf(double[] weights) {
        int n = weights.length;
        int c = n / 2;
        double wc = weights[c];
        double[] re = new double[n];
        double[] im = new double[n];
        for (int m = 0; m < n; m++) {                  // a[m] = w at k-index u ≡ m (mod L)
            re[m] = weights[(m + c) % n];
        }
        Dft.transform(re, im, true);
        double[] out = new double[n];
        double norm = 1.0 / (n * wc);
        for (int i = 0; i < n; i++) {
            int x = Math.floorMod(i - c, n);
            out[i] = wc == 0 ? Double.NaN : Math.hypot(re[x], im[x]) * Math.abs(norm);
        }
        return out;
    }

    /**
     * @param psf a centred PSF magnitude (not modified)
     * @return FWHM, peak and largest side lobe; {@link PsfFigures#UNDEFINED} when the PSF is zero or
     *         not finite
     */
    public static PsfFigures figures(double[] psf) {
        int n = psf.length;
        int c = n / 2;
        int pk = -1;
        double peak = 0;
        for (int i = 0; i < n; i++) {
            double v = psf[i];
            if (!(v >= 0) || Double.isInfinite(v)) {
                return PsfFigures.UNDEFINED;
            }
            if (v > peak || (v == peak && pk >= 0 && Math.abs(i - c) < Math.abs(pk - c))) {
                peak = v;
                pk = i;
            }
        }
        if (!(peak > 0)) {
            return PsfFigures.UNDEFINED;
        }
        double half = 0.5 * peak;
        double fwhm = Math.min(n, crossing(psf, pk, 1, half) + crossing(psf, pk, -1, half));
        int right = lobeEnd(psf, pk, 1);
        int left = lobeEnd(psf, pk, -1);
        double side = 0;
        for (int k = right + 1; k < n - left; k++) {
            side = Math.max(side, psf[(pk + k) % n]);
        }
        return new PsfFigures(fwhm, peak, side / peak);
    }

    /** Distance from the peak at which the flank in direction dir first falls below half (n if never). */
    private static double crossing(double[] p, int pk, int dir, double half) {
        int n = p.length;
        for (int k = 1; k < n; k++) {
            double v = p[Math.floorMod(pk + dir * k, n)];
            if (v < half) {
                double u = p[Math.floorMod(pk + dir * (k - 1), n)];
                return (k - 1) + (u - half) / (u - v);
            }
        }
        return n;
    }

    /** Steps from the peak to the first local minimum in direction dir (at most n − 1). */
    private static int lobeEnd(double[] p, int pk, int dir) {
        int n = p.length;
        int k = 0;
        while (k < n - 1 && p[Math.floorMod(pk + dir * (k + 1), n)] <= p[Math.floorMod(pk + dir * k, n)]) {
            k++;
        }
        return k;
    }
}
