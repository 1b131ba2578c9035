package org.echotrellis.sequence;

import java.util.Arrays;

/**
 * The echo train of one isochromat family in complex EPG form (Weigel, JMRI 41:266, 2015) with a general
 * rotation per refocusing pulse, T2/T1 relaxation, T1 recovery of Z<sub>0</sub> and diffusion (Weigel,
 * Schwenk, Kiselev, Scheffler &amp; Hennig, J Magn Reson 205:276, 2010). Package-private workhorse of
 * {@link AcquisitionModel}; one instance per thread, allocation-free after construction.
 *
 * <p>Rotation operator from the Cayley–Klein parameters (a, b) of a pulse (Pauly et al. 1991), on
 * (F+<sub>k</sub>, F&minus;<sub>k</sub>, Z<sub>k</sub>):
 * <pre>
 *   [ a*²      &minus;b²       2a*b  ]
 *   [ &minus;b*²     a²        2ab*  ]
 *   [ &minus;a*b*   &minus;ab     |a|²&minus;|b|² ]
 * </pre>
 * (for a = cos(&alpha;/2), b = &minus;i e<sup>i&phi;</sup> sin(&alpha;/2) this is the T(&alpha;, &phi;) of Weigel 2015).
 *
 * <p><b>Families.</b> With CPMG timing the coherences excited at t = 0 sit at odd orders at every
 * refocusing pulse and alone reach k = 0 at the echoes (the "odd" family); Z<sub>0</sub> after the
 * excitation and its T1 recovery sit at even orders and alone set Z<sub>0</sub> at the end of the train
 * (the "even" family). Each family is run on its own with only its parity updated and only orders that
 * can still reach k = 0 by the end (about N²/4 state updates per family for N echoes).
 *
 * <p>Storage: one complex sequence F<sub>k</sub>, k = &minus;K..K (F+<sub>k</sub> = F<sub>k</sub>, F&minus;<sub>k</sub> =
 * conj F<sub>&minus;k</sub>) whose dephasing shift only moves an offset, and Z<sub>k</sub> for k &ge; 0.
 */
final class TrainKernel {
    private final int n;
    private final int kmax;
    private final int base0;
    private final double[] fr;
    private final double[] fi;
    private final double[] zr;
    private final double[] zi;
    private final double[] dPre;
    private final double[] dPost;
    private final double[] dZ;
    private final int off;

    /**
     * @param echoes echoes N
     * @param dPre diffusion factor of an F state over the half before a pulse, by signed order + K + 1
     * @param dPost the same over the half after a pulse
     * @param dZ diffusion factor of Z<sub>k</sub> over a half echo spacing, by k
     */
    TrainKernel(int echoes, double[] dPre, double[] dPost, double[] dZ) {
        n = echoes;
        kmax = 2 * echoes + 1;
        base0 = kmax + 2 * echoes + 1;
        fr = new double[base0 + kmax + 2];
        fi = new double[fr.length];
        zr = new double[kmax + 2];
        zi = new double[kmax + 2];
        this.dPre = dPre;
        this.dPost = dPost;
        this.dZ = dZ;
        off = kmax + 1;
    }

    /** Length of the diffusion factor arrays for N echoes. */
    static int factorLength(int echoes) {
        return 2 * (2 * echoes + 1) + 3;
    }

    /**
     * Runs one family from the state right after the excitation.
     *
     * @param coef rotation of every pulse kind: 18 doubles per kind (t00..t22 as re, im); not modified
     * @param kindOf pulse kind of each refocusing pulse; not modified
     * @param odd true: the odd family (echoes), false: the even family (Z<sub>0</sub> at the end)
     * @param f0r Re F<sub>0</sub> after the excitation
     * @param f0i Im F<sub>0</sub> after the excitation
     * @param z0 Z<sub>0</sub> after the excitation
     * @param recover whether Z<sub>0</sub> recovers toward 1 (T1)
     * @param e2h exp(&minus;ESP/(2 T2))
     * @param e1h exp(&minus;ESP/(2 T1))
     * @param w weight added to the echoes
     * @param outRe echo real parts, incremented by w &times; echo (odd family only); modified
     * @param outIm echo imaginary parts likewise; modified
     * @return Re Z<sub>0</sub> at the time of the last echo
     */
    double run(double[] coef, int[] kindOf, boolean odd, double f0r, double f0i, double z0, boolean recover,
               double e2h, double e1h, double w, double[] outRe, double[] outIm) {
        int len = fr.length;
        Arrays.fill(fr, 0, len, 0.0);
        Arrays.fill(fi, 0, len, 0.0);
        Arrays.fill(zr, 0.0);
        Arrays.fill(zi, 0.0);
        int base = base0;
        fr[base] = f0r;
        fi[base] = f0i;
        zr[0] = z0;
        double rec = recover ? 1 - e1h : 0;
        for (int p = 1; p <= n; p++) {
            int bound = odd ? Math.min(2 * p - 1, 2 * (n - p) + 1) : Math.min(2 * p - 2, 2 * (n - p));
            half(base, -bound - 1, bound, dPre, e2h, e1h, rec, odd);
            base--;
            mix(coef, 18 * kindOf[p - 1], base, odd ? 1 : 0, bound);
            half(base, -bound, bound, dPost, e2h, e1h, rec, odd);
            base--;
            if (odd) {
                outRe[p - 1] += w * fr[base];
                outIm[p - 1] += w * fi[base];
            }
        }
        return zr[0];
    }

    /** Relaxation and diffusion over a half echo spacing; only the family's parity is touched. */
    private void half(int base, int lo, int hi, double[] d, double e2h, double e1h, double rec, boolean odd) {
        for (int k = lo; k <= hi; k += 2) {
            double g = e2h * d[k + off];
            fr[base + k] *= g;
            fi[base + k] *= g;
        }
        int top = Math.min(hi, kmax);
        for (int k = odd ? 1 : 2; k <= top; k += 2) {
            double g = e1h * dZ[k];
            zr[k] *= g;
            zi[k] *= g;
        }
        zr[0] = e1h * zr[0] + rec;
        zi[0] = e1h * zi[0];
    }

    private void mix(double[] c, int o, int base, int start, int bound) {
        final double t00r = c[o];
        final double t00i = c[o + 1];
        final double t01r = c[o + 2];
        final double t01i = c[o + 3];
        final double t02r = c[o + 4];
        final double t02i = c[o + 5];
        final double t10r = c[o + 6];
        final double t10i = c[o + 7];
        final double t11r = c[o + 8];
        final double t11i = c[o + 9];
        final double t12r = c[o + 10];
        final double t12i = c[o + 11];
        final double t20r = c[o + 12];
        final double t20i = c[o + 13];
        final double t21r = c[o + 14];
        final double t21i = c[o + 15];
        final double t22r = c[o + 16];
        final double t22i = c[o + 17];
        for (int k = start; k <= bound; k += 2) {
            double pr = fr[base + k];
            double pi = fi[base + k];
            double mr;
            double mi;
            if (k == 0) {
                mr = pr;
                mi = -pi;
            } else {
                mr = fr[base - k];
                mi = -fi[base - k];
            }
            double qr = zr[k];
            double qi = zi[k];
            double npr = t00r * pr - t00i * pi + t01r * mr - t01i * mi + t02r * qr - t02i * qi;
            double npi = t00r * pi + t00i * pr + t01r * mi + t01i * mr + t02r * qi + t02i * qr;
            double nqr = t20r * pr - t20i * pi + t21r * mr - t21i * mi + t22r * qr - t22i * qi;
            double nqi = t20r * pi + t20i * pr + t21r * mi + t21i * mr + t22r * qi + t22i * qr;
            if (k != 0) {
                double nmr = t10r * pr - t10i * pi + t11r * mr - t11i * mi + t12r * qr - t12i * qi;
                double nmi = t10r * pi + t10i * pr + t11r * mi + t11i * mr + t12r * qi + t12i * qr;
                fr[base - k] = nmr;
                fi[base - k] = -nmi;
            }
            fr[base + k] = npr;
            fi[base + k] = npi;
            zr[k] = nqr;
            zi[k] = nqi;
        }
    }

    /**
     * Fills the 18 coefficients of the rotation with Cayley–Klein parameters (a, b).
     *
     * @param ar Re a
     * @param ai Im a
     * @param br Re b
     * @param bi Im b
     * @param c coefficient array; modified at [o, o + 18)
     * @param o offset
     */
    static void coefficients(double ar, double ai, double br, double bi, double[] c, int o) {
        // a* ^2
        c[o] = ar * ar - ai * ai;
        c[o + 1] = -2 * ar * ai;
        // -b^2
        c[o + 2] = -(br * br - bi * bi);
        c[o + 3] = -2 * br * bi;
        // 2 a* b
        c[o + 4] = 2 * (ar * br + ai * bi);
        c[o + 5] = 2 * (ar * bi - ai * br);
        // -b*^2
        c[o + 6] = -(br * br - bi * bi);
        c[o + 7] = 2 * br * bi;
        // a^2
        c[o + 8] = ar * ar - ai * ai;
        c[o + 9] = 2 * ar * ai;
        // 2 a b*
        c[o + 10] = 2 * (ar * br + ai * bi);
        c[o + 11] = 2 * (ai * br - ar * bi);
        // -a* b*
        c[o + 12] = -(ar * br - ai * bi);
        c[o + 13] = ar * bi + ai * br;
        // -a b
        c[o + 14] = -(ar * br - ai * bi);
        c[o + 15] = -(ar * bi + ai * br);
        // |a|^2 - |b|^2
        c[o + 16] = ar * ar + ai * ai - br * br - bi * bi;
        c[o + 17] = 0;
    }
}
