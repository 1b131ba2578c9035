package org.echotrellis.fit;

/**
 * The mean of a Rician-distributed magnitude and its derivative, for fitting magnitude decays
 * whose late echoes sit on the noise floor.
 *
 * <p>For true amplitude &nu; and channel noise &sigma;, with u = &nu;&sup2;/(4&sigma;&sup2;),
 * E[M] = &sigma;&radic;(&pi;/2)&middot;e<sup>&minus;u</sup>[(1 + 2u)I<sub>0</sub>(u) + 2u
 * I<sub>1</sub>(u)] (Gudbjartsson &amp; Patz, "The Rician distribution of noisy MRI data", Magn
 * Reson Med 34:910, 1995; the Laguerre form L<sub>1/2</sub>(&minus;&nu;&sup2;/2&sigma;&sup2;)
 * written out). Differentiating, the I terms collapse (I<sub>0</sub>' = I<sub>1</sub>,
 * I<sub>1</sub>' = I<sub>0</sub> &minus; I<sub>1</sub>/u):
 * dE[M]/d&nu; = &radic;(&pi;/2)&middot;(&nu;/2&sigma;)&middot;e<sup>&minus;u</sup>[I<sub>0</sub>(u) +
 * I<sub>1</sub>(u)]. The exponentially scaled Bessel functions use the polynomial approximations
 * of Abramowitz &amp; Stegun, Handbook of Mathematical Functions (1964), 9.8.1–9.8.4 (relative
 * error below about 2e-7).
 */
final class Rician {
    private static final double SQRT_HALF_PI = Math.sqrt(Math.PI / 2);

    private Rician() { }

    /**
     * @param nu true amplitude (≥ 0)
     * @param sigma channel noise σ (&gt; 0)
     * @return E[M]
     */
    public static double mean(double nu, double sigma) {
        double u = nu * nu / (4 * sigma * sigma);
        if (u > 1e4) {
            // asymptotic: E[M] = nu + sigma^2/(2 nu) + O(sigma^4/nu^3)
            return nu + sigma * sigma / (2 * nu);
        }
        return sigma * SQRT_HALF_PI * ((1 + 2 * u) * i0e(u) + 2 * u * i1e(u));
    }

    /**
     * @param nu true amplitude (≥ 0)
     * @param sigma channel noise σ (&gt; 0)
     * @return dE[M]/dν
     */
    public static double slope(double nu, double sigma) {
        double u = nu * nu / (4 * sigma * sigma);
        if (u > 1e4) {
            return 1 - sigma * sigma / (2 * nu * nu);
        }
        return SQRT_HALF_PI * nu / (2 * sigma) * (i0e(u) + i1e(u));
    }

    /** e^{-x} I0(x), x ≥ 0 (A&amp;S 9.8.1, 9.8.2). */
    static double i0e(double x) {
        if (x < 3.75) {
            double t = x / 3.75;
            t *= t;
            double i0 = 1 + t * (3.5156229 + t * (3.0899424 + t * (1.2067492 + t * (0.2659732 + t * (0.0360768
                    + t * 0.0045813)))));
            return i0 * Math.exp(-x);
        }
        double t = 3.75 / x;
        return (0.39894228 + t * (0.01328592 + t * (0.00225319 + t * (-0.00157565 + t * (0.00916281
                + t * (-0.02057706 + t * (0.02635537 + t * (-0.01647633 + t * 0.00392377)))))))) / Math.sqrt(x);
    }

    /** e^{-x} I1(x), x ≥ 0 (A&amp;S 9.8.3, 9.8.4). */
    static double i1e(double x) {
        if (x < 3.75) {
            double t = x / 3.75;
            t *= t;
            double i1 = x * (0.5 + t * (0.87890594 + t * (0.51498869 + t * (0.15084934 + t * (0.02658733
                    + t * (0.00301532 + t * 0.00032411))))));
            return i1 * Math.exp(-x);
        }
        double t = 3.75 / x;
        return (0.39894228 + t * (-0.03988024 + t * (-0.00362018 + t * (0.00163801 + t * (-0.01031555
                + t * (0.02282967 + t * (-0.02895312 + t * (0.01787654 - t * 0.00420059)))))))) / Math.sqrt(x);
    }
}
