package org.echotrellis.image;

/**
 * Reference for the tests: the centred PSF straight from its definition with a plain O(L²) DFT in
 * double precision, sharing no code with the main sources.
 */
final class PlainDft {
    private PlainDft() { }

    /** PSF(x) = |(1/L)·Σⱼ wⱼ·exp(+i2π·(j − c)·x/L)| / w_c for x = i − c, c = ⌊L/2⌋. */
    static double[] psf(double[] w) {
        int n = w.length;
        int c = n / 2;
        double[] out = new double[n];
        for (int i = 0; i < n; i++) {
            int x = i - c;
            double re = 0;
            double im = 0;
            for (int j = 0; j < n; j++) {
                double a = 2 * Math.PI * (double) (j - c) * x / n;
                re += w[j] * Math.cos(a);
                im += w[j] * Math.sin(a);
            }
            out[i] = Math.sqrt(re * re + im * im) / n / w[c];
        }
        return out;
    }

    /** X[k] = Σⱼ x[j]·exp(∓i2π·j·k/L); returns {re, im}. */
    static double[][] dft(double[] re, double[] im, boolean inverse) {
        int n = re.length;
        double sign = inverse ? 1 : -1;
        double[][] out = new double[2][n];
        for (int k = 0; k < n; k++) {
            for (int j = 0; j < n; j++) {
                double a = sign * 2 * Math.PI * (double) ((long) j * k % n) / n;
                out[0][k] += re[j] * Math.cos(a) - im[j] * Math.sin(a);
                out[1][k] += re[j] * Math.sin(a) + im[j] * Math.cos(a);
            }
        }
        return out;
    }
}
