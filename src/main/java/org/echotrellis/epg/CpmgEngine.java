package org.echotrellis.epg;

import java.util.Arrays;
import org.echotrellis.Checks;

/**
 * Real-valued CPMG fast path of the EPG engine, several trains in lock-step lanes.
 *
 * <p>With excitation about y and refocusing about x (the CPMG phase condition, Meiboom &amp; Gill 1958),
 * all F states stay real and all Z states purely imaginary; writing Z = i&middot;z the refocusing
 * operator becomes the real matrix (Hennig 1988; Weigel 2015)
 * <pre>
 *   R(a) = [ cos^2(a/2)   sin^2(a/2)   sin a ]
 *          [ sin^2(a/2)   cos^2(a/2)  -sin a ]
 *          [ -sin(a)/2    sin(a)/2     cos a ]
 * </pre>
 * Two further reductions make the kernel cheap:
 * <ul>
 *   <li><b>Parity.</b> With one dephasing order per half echo spacing, the coherences excited at t = 0
 *   sit at odd orders k just before every refocusing pulse; longitudinal states created from Z0
 *   (the residual cos&alpha;<sub>exc</sub> and T1 recovery) are offset by an odd order and never reach
 *   k = 0 at an echo time. So only odd k are stored (index j = (k &minus; 1)/2), Z0 and its recovery are
 *   not needed, and a non-90&deg; excitation only scales the train by sin&alpha;<sub>exc</sub>.</li>
 *   <li><b>Pruning.</b> Before pulse n of N, a state at order k &gt; 2(N &minus; n) + 1 cannot reach k = 0
 *   by the last echo, and no state exceeds k = 2n &minus; 1, so j runs over [0, min(n&minus;1, N&minus;n)]:
 *   about N<sup>2</sup>/4 state updates per train.</li>
 * </ul>
 * Relaxation over the echo spacing is folded into the pulse matrix, and the two dephasing shifts per
 * echo spacing are realised by moving array offsets, so the only per-state work is the mixing:
 * with s = F+ + F&minus;, d = F+ &minus; F&minus;, r = e2/2 &middot; cos&alpha; &middot; d + e1 sin&alpha; z:
 * F+' = e2/2&middot;s + r, F&minus;' = e2/2&middot;s &minus; r, z' = e1 cos&alpha; z &minus; e2/2 sin&alpha; d
 * (5 multiplications, 6 additions per state and lane). Lanes are innermost so the JIT can vectorise.
 *
 * <p>Not thread-safe: use one engine per thread. Buffers grow on demand and are reused; after warm-up
 * {@link #run} allocates nothing.
 */
public final class CpmgEngine {
    private final int lanes;
    private double[] fp = new double[0];
    private double[] fm = new double[0];
    private double[] zz = new double[0];
    private final double[] e2;
    private final double[] e2Half;
    private final double[] e1;
    private final double[] cosA;
    private final double[] sinA;
    private final double[] half;
    private final double[] gCoef;
    private final double[] uCoef;
    private final double[] vCoef;
    private final double[] wCoef;

    /**
     * @param lanes number of trains simulated in lock-step (1 to 64; 4 to 8 is a good choice)
     */
    public CpmgEngine(int lanes) {
        this.lanes = Checks.inRange("lanes", lanes, 1, 64, null);
        e2 = new double[lanes];
        e2Half = new double[lanes];
        e1 = new double[lanes];
        cosA = new double[lanes];
        sinA = new double[lanes];
        half = new double[lanes];
        gCoef = new double[lanes];
        uCoef = new double[lanes];
        vCoef = new double[lanes];
        wCoef = new double[lanes];
    }

    /** @return the number of lanes */
    public int lanes() {
        return lanes;
    }

    private void ensure(int echoes) {
        int need = (2 * echoes + 2) * lanes;
        if (fp.length < need) {
            fp = new double[need];
            fm = new double[need];
            zz = new double[(echoes / 2 + 2) * lanes];
        }
    }

    /**
     * Simulates up to {@code lanes} trains of the same schedule with per-lane tissue and B1.
     *
     * @param train the schedule; must be {@link CpmgTrain#isCpmgPhased() CPMG-phased}
     * @param t1Ms T1 per lane in ms (may be +Infinity); not modified
     * @param t2Ms T2 per lane in ms (may be +Infinity); not modified
     * @param b1 flip-angle scale per lane; not modified
     * @param count number of lanes used (1..lanes)
     * @param out receives out[l*echoes + n] = signed amplitude of echo n+1 of lane l (M0 = 1) in the
     *     CPMG frame; its complex phase is (excitation phase &minus; 90&deg;). Modified.
     */
    public void run(CpmgTrain train, double[] t1Ms, double[] t2Ms, double[] b1, int count, double[] out) {
        if (count < 1 || count > lanes) {
            throw new IllegalArgumentException("count must be within [1, " + lanes + "], got " + count);
        }
        if (!train.isCpmgPhased()) {
            throw new IllegalArgumentException("train is not CPMG-phased; use GeneralEngine");
        }
        final int n = train.echoes();
        final int nl = lanes;
        ensure(n);
        Arrays.fill(fp, 0, (2 * n + 2) * nl, 0.0);
        Arrays.fill(fm, 0, (2 * n + 2) * nl, 0.0);
        Arrays.fill(zz, 0, (n / 2 + 2) * nl, 0.0);
        final double esp = train.echoSpacingMs();
        final double excRad = Math.toRadians(train.excitationFlipDeg());
        int pa = n;
        int pb = 0;
        for (int l = 0; l < nl; l++) {
            if (l < count) {
                e2[l] = Math.exp(-esp / t2Ms[l]);
                e2Half[l] = Math.exp(-0.5 * esp / t2Ms[l]);
                e1[l] = Math.exp(-esp / t1Ms[l]);
                fp[pa * nl + l] = Math.sin(b1[l] * excRad) * e2Half[l];
            } else {
                e2[l] = 0;
                e2Half[l] = 0;
                e1[l] = 0;
            }
        }
        boolean sameB1 = true;
        for (int l = 1; l < count; l++) {
            sameB1 &= b1[l] == b1[0];
        }
        double lastFlip = Double.NaN;
        for (int p = 1; p <= n; p++) {
            final double flipRad = Math.toRadians(train.refocusFlipDeg(p - 1)) * train.refocusSign(p - 1);
            if (flipRad != lastFlip) {
                if (sameB1) {
                    double c = Math.cos(b1[0] * flipRad);
                    double s = Math.sin(b1[0] * flipRad);
                    Arrays.fill(cosA, c);
                    Arrays.fill(sinA, s);
                } else {
                    for (int l = 0; l < nl; l++) {
                        double a = (l < count ? b1[l] : 1.0) * flipRad;
                        cosA[l] = Math.cos(a);
                        sinA[l] = Math.sin(a);
                    }
                }
                lastFlip = flipRad;
            }
            // Relaxation of the preceding echo spacing folded into the pulse; the first pulse's half
            // interval was applied when the state was initialised.
            final boolean first = p == 1;
            for (int l = 0; l < nl; l++) {
                double r2 = first ? 1.0 : e2[l];
                double r1 = first ? 1.0 : e1[l];
                half[l] = 0.5 * r2;
                gCoef[l] = 0.5 * r2 * cosA[l];
                uCoef[l] = r1 * sinA[l];
                vCoef[l] = 0.5 * r2 * sinA[l];
                wCoef[l] = r1 * cosA[l];
            }
            final int top = Math.min(p - 1, n - p);
            mix(top, pa, pb);
            final int ib = pb * nl;
            for (int l = 0; l < count; l++) {
                out[l * n + p - 1] = e2Half[l] * fm[ib + l];
            }
            // Two half-interval shifts: F+ moves up one odd order, F- down one; F-(k=1) becomes F+(k=1).
            pa--;
            System.arraycopy(fm, ib, fp, pa * nl, nl);
            pb++;
        }
    }

    private void mix(int top, int pa, int pb) {
        final int nl = lanes;
        final double[] a = fp;
        final double[] b = fm;
        final double[] z = zz;
        final double[] h = half;
        final double[] g = gCoef;
        final double[] u = uCoef;
        final double[] v = vCoef;
        final double[] w = wCoef;
        for (int j = 0; j <= top; j++) {
            final int ia = (pa + j) * nl;
            final int ib = (pb + j) * nl;
            final int iz = j * nl;
            for (int l = 0; l < nl; l++) {
                double x = a[ia + l];
                double y = b[ib + l];
                double q = z[iz + l];
                double s = x + y;
                double d = x - y;
                double t = h[l] * s;
                double r = g[l] * d + u[l] * q;
                a[ia + l] = t + r;
                b[ib + l] = t - r;
                z[iz + l] = w[l] * q - v[l] * d;
            }
        }
    }

    /**
     * Convenience: one train (allocates its result).
     *
     * @param train the schedule (CPMG-phased)
     * @param t1Ms T1 in ms
     * @param t2Ms T2 in ms
     * @param b1 flip-angle scale
     * @return signed echo amplitudes in the CPMG frame, echo 1 first
     */
    public double[] echoes(CpmgTrain train, double t1Ms, double t2Ms, double b1) {
        double[] out = new double[train.echoes() * lanes];
        double[] t1 = new double[lanes];
        double[] t2 = new double[lanes];
        double[] s = new double[lanes];
        t1[0] = t1Ms;
        t2[0] = t2Ms;
        s[0] = b1;
        run(train, t1, t2, s, 1, out);
        return Arrays.copyOf(out, train.echoes());
    }
}
