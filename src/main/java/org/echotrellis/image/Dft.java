package org.echotrellis.image;

/**
 * Complex discrete Fourier transform of any length: a recursive mixed-radix Cooley–Tukey FFT
 * (Cooley &amp; Tukey, Math. Comp. 19:297, 1965) that splits by the smallest prime factor and does
 * a plain DFT for a prime length. Cost O(L·Σ pᵢ) for L = ∏ pᵢ: O(L log L) for lengths with small
 * factors (the usual 2ᵃ·3ᵇ·5ᶜ line counts), O(L²) for a prime L. Not a hot path (the phantom image
 * and the per-tissue PSF); it allocates work arrays per call.
 */
final class Dft {
    private Dft() { }

    /**
     * In-place transform X[k] = Σⱼ x[j]·exp(∓i·2π·j·k/L), without scaling.
     *
     * @param re real parts, length L (overwritten with the result)
     * @param im imaginary parts, length L (overwritten)
     * @param inverse true for the + sign (inverse direction, still unscaled)
     */
    public static void transform(double[] re, double[] im, boolean inverse) {
        int n = re.length;
        if (im.length != n) {
            throw new IllegalArgumentException("real and imaginary lengths differ: " + n + " vs " + im.length);
        }
        if (n <= 1) {
            return;
        }
        double[] c = new double[n];
        double[] s = new double[n];
        double sign = inverse ? 1 : -1;
        for (int i = 0; i < n; i++) {
            double a = 2 * Math.PI * i / n;
            c[i] = Math.cos(a);
            s[i] = sign * Math.sin(a);
        }
        double[] outRe = new double[n];
        double[] outIm = new double[n];
        fft(re, im, 0, 1, n, outRe, outIm, 0, c, s);
        System.arraycopy(outRe, 0, re, 0, n);
        System.arraycopy(outIm, 0, im, 0, n);
    }

    /**
     * Transforms the m inputs in[off + stride·q] into out[o … o+m−1]; c and s tabulate the twiddles
     * of the full length n = c.length (a length-m root of unity is every (n/m)-th entry).
     */
    private static void fft(double[] inRe, double[] inIm, int off, int stride, int m, double[] outRe, double[] outIm,
                            int o, double[] c, double[] s) {
        if (m == 1) {
            outRe[o] = inRe[off];
            outIm[o] = inIm[off];
            return;
        }
        int n = c.length;
        int step = n / m;
        int p = smallestFactor(m);
        if (p == m) {                                   // prime length: plain DFT
            for (int k = 0; k < m; k++) {
                double sr = 0;
                double si = 0;
                for (int j = 0; j < m; j++) {
                    int t = (int) ((long) j * k % m) * step;
                    double xr = inRe[off + stride * j];
                    double xi = inIm[off + stride * j];
                    sr += xr * c[t] - xi * s[t];
                    si += xr * s[t] + xi * c[t];
                }
                outRe[o + k] = sr;
                outIm[o + k] = si;
            }
            return;
        }
        int q = m / p;
        for (int r = 0; r < p; r++) {                   // Y_r = DFT of the r-th decimated subsequence
            fft(inRe, inIm, off + stride * r, stride * p, q, outRe, outIm, o + r * q, c, s);
        }
        double[] yr = new double[p];
        double[] yi = new double[p];
        for (int k = 0; k < q; k++) {                   // X[k + q·t] = Σ_r W_m^{r(k+qt)} · Y_r[k]
            for (int r = 0; r < p; r++) {
                yr[r] = outRe[o + r * q + k];
                yi[r] = outIm[o + r * q + k];
            }
            for (int t = 0; t < p; t++) {
                int kk = k + q * t;
                double sr = 0;
                double si = 0;
                for (int r = 0; r < p; r++) {
                    int w = (int) ((long) r * kk % m) * step;
                    sr += yr[r] * c[w] - yi[r] * s[w];
                    si += yr[r] * s[w] + yi[r] * c[w];
                }
                outRe[o + kk] = sr;
                outIm[o + kk] = si;
            }
        }
    }

    private static int smallestFactor(int m) {
        if (m % 2 == 0) {
            return 2;
        }
        for (int f = 3; (long) f * f <= m; f += 2) {
            if (m % f == 0) {
                return f;
            }
        }
        return m;
    }
}
