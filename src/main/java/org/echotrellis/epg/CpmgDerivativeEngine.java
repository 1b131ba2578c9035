package org.echotrellis.epg;

import java.util.Arrays;

import org.echotrellis.Checks;

/**
 * Real-valued CPMG echo trains together with their exact derivatives with respect to T2 and the B1
 * scale, for fitting. Lanes share T1, T2 and B1 but carry their own flip factors (for example the
 * positions of a slice profile), and the result is the weighted sum of the lanes' trains.
 *
 * <p>Method: the extended phase graph in the real CPMG frame (Hennig, J Magn Reson 78:397, 1988;
 * Weigel, J Magn Reson Imaging 41:266, 2015), as in {@link CpmgEngine} (same parity reduction,
 * pruning and folding of the echo-spacing relaxation into the pulse). Forward-mode derivatives are
 * propagated as extra states through the same operators (the derivative states of the
 * stimulated-echo fitting model of Lebel &amp; Wilman, Magn Reson Med 64:1005, 2010). With
 * h = e2/2, g = h cos a, u = e1 sin a, v = h sin a, w = e1 cos a, s = F+ + F&minus;, d = F+ &minus;
 * F&minus;, t = h s, r = g d + u z, one pulse with the preceding relaxation is
 * <pre>
 *   F+' = t + r,   F&minus;' = t &minus; r,   z' = w z &minus; v d.
 * </pre>
 * Since &part;e2/&part;T2 = e2&middot;&kappa; with &kappa; = ESP/T2&sup2;, and &part;a/&part;B1 = A
 * (the nominal angle times the lane factor), the derivative states obey
 * <pre>
 *   T2:  t_T = h s_T + &kappa; t,  r_T = g d_T + u z_T + &kappa; g d,
 *        F+'_T = t_T + r_T,  F&minus;'_T = t_T &minus; r_T,  z'_T = w z_T &minus; v d_T &minus; &kappa; v d
 *   B1:  t_B = h s_B,  r_B = g d_B + u z_B + A z',
 *        F+'_B = t_B + r_B,  F&minus;'_B = t_B &minus; r_B,  z'_B = w z_B &minus; v d_B &minus; A r
 * </pre>
 * (about 40 flops per state and lane, N&sup2;/4 state updates for N echoes). The excitation enters
 * as the factor sin(B1&middot;f&middot;&alpha;<sub>exc</sub>) of each lane's initial state. Lanes are
 * stored one after another and each is mixed with its coefficients in registers (with nine state
 * arrays the lane-innermost layout did not vectorise and was slower).
 *
 * <p>Not thread-safe: one engine per thread. Buffers grow on demand; after warm-up {@link #run}
 * allocates nothing.
 */
public final class CpmgDerivativeEngine {
    private final int lanes;
    private double[] fp = new double[0];
    private double[] fm = new double[0];
    private double[] zz = new double[0];
    private double[] fpT = new double[0];
    private double[] fmT = new double[0];
    private double[] zzT = new double[0];
    private double[] fpB = new double[0];
    private double[] fmB = new double[0];
    private double[] zzB = new double[0];
    private final double[] gCoef;
    private final double[] uCoef;
    private final double[] vCoef;
    private final double[] wCoef;
    private final double[] aCoef;
    private final double[] cosA;
    private final double[] sinA;

    /** @param lanes lanes summed per call (1 to 256) */
    public CpmgDerivativeEngine(int lanes) {
        this.lanes = Checks.inRange("lanes", lanes, 1, 256, null);
        gCoef = new double[lanes];
        uCoef = new double[lanes];
        vCoef = new double[lanes];
        wCoef = new double[lanes];
        aCoef = new double[lanes];
        cosA = new double[lanes];
        sinA = new double[lanes];
    }

    /** @return the number of lanes */
    public int lanes() {
        return lanes;
    }

    private void ensure(int echoes) {
        int need = (2 * echoes + 2) * lanes;
        if (fp.length < need) {
            int nz = (echoes / 2 + 2) * lanes;
            fp = new double[need];
            fm = new double[need];
            fpT = new double[need];
            fmT = new double[need];
            fpB = new double[need];
            fmB = new double[need];
            zz = new double[nz];
            zzT = new double[nz];
            zzB = new double[nz];
        }
    }

    /**
     * Computes S_n = &Sigma;_l weight[l]&middot;EPG_n(lane l) and its derivatives. Lane l uses the
     * excitation flip B1&middot;excFactor[l]&middot;&alpha;<sub>exc</sub> and refocusing flips
     * B1&middot;refFactor[l]&middot;&alpha;<sub>p</sub>.
     *
     * @param train the schedule; must be CPMG-phased
     * @param t1Ms T1 in ms (may be +Infinity)
     * @param t2Ms T2 in ms (may be +Infinity)
     * @param b1 flip-angle scale
     * @param excFactor excitation flip factor per lane; not modified
     * @param refFactor refocusing flip factor per lane; not modified
     * @param weight weight per lane; not modified
     * @param count lanes used (1..lanes)
     * @param echo receives S_n at [0, echoes); modified
     * @param dT2 receives &part;S_n/&part;T2 (per ms); modified
     * @param dB1 receives &part;S_n/&part;B1; modified
     */
    public void run(CpmgTrain train, double t1Ms, double t2Ms, double b1, double[] excFactor, double[] refFactor,
            double[] weight, int count, double[] echo, double[] dT2, double[] dB1) {
        if (count < 1 || count > lanes) {
            throw new IllegalArgumentException("count must be within [1, " + lanes + "], got " + count);
        }
        if (!train.isCpmgPhased()) {
            throw new IllegalArgumentException("train is not CPMG-phased");
        }
        final int n = train.echoes();
        final int nl = count;
        ensure(n);
        // Lane-major layout: lane l owns [l*fs, (l+1)*fs) of the F arrays and [l*zs, (l+1)*zs) of z.
        final int fs = 2 * n + 2;
        final int zs = n / 2 + 2;
        Arrays.fill(fp, 0, fs * nl, 0.0);
        Arrays.fill(fm, 0, fs * nl, 0.0);
        Arrays.fill(fpT, 0, fs * nl, 0.0);
        Arrays.fill(fmT, 0, fs * nl, 0.0);
        Arrays.fill(fpB, 0, fs * nl, 0.0);
        Arrays.fill(fmB, 0, fs * nl, 0.0);
        Arrays.fill(zz, 0, zs * nl, 0.0);
        Arrays.fill(zzT, 0, zs * nl, 0.0);
        Arrays.fill(zzB, 0, zs * nl, 0.0);
        final double esp = train.echoSpacingMs();
        final double e2 = Math.exp(-esp / t2Ms);
        final double e2Half = Math.exp(-0.5 * esp / t2Ms);
        final double e1 = Math.exp(-esp / t1Ms);
        final double kappa = Double.isInfinite(t2Ms) ? 0.0 : esp / (t2Ms * t2Ms);
        final double excRad = Math.toRadians(train.excitationFlipDeg());
        int pa = n;
        int pb = 0;
        for (int l = 0; l < nl; l++) {
            double ae = excFactor[l] * excRad;
            double x = Math.sin(b1 * ae) * e2Half;
            fp[l * fs + pa] = x;
            fpT[l * fs + pa] = 0.5 * kappa * x;
            fpB[l * fs + pa] = ae * Math.cos(b1 * ae) * e2Half;
        }
        double lastFlip = Double.NaN;
        for (int p = 1; p <= n; p++) {
            final double flipRad = Math.toRadians(train.refocusFlipDeg(p - 1)) * train.refocusSign(p - 1);
            if (flipRad != lastFlip) {
                for (int l = 0; l < nl; l++) {
                    aCoef[l] = refFactor[l] * flipRad;
                    double a = b1 * aCoef[l];
                    cosA[l] = Math.cos(a);
                    sinA[l] = Math.sin(a);
                }
            }
            final boolean first = p == 1;
            if (first || flipRad != lastFlip || p == 2) {
                double h = first ? 0.5 : 0.5 * e2;
                double r1 = first ? 1.0 : e1;
                for (int l = 0; l < nl; l++) {
                    gCoef[l] = h * cosA[l];
                    uCoef[l] = r1 * sinA[l];
                    vCoef[l] = h * sinA[l];
                    wCoef[l] = r1 * cosA[l];
                }
            }
            lastFlip = flipRad;
            final int top = Math.min(p - 1, n - p);
            final double h = first ? 0.5 : 0.5 * e2;
            final double k = first ? 0.0 : kappa;
            double s = 0;
            double sT = 0;
            double sB = 0;
            for (int l = 0; l < nl; l++) {
                final int fo = l * fs;
                mix(top, fo + pa, fo + pb, l * zs, l, h, k);
                double y = fm[fo + pb];
                s += weight[l] * y;
                sT += weight[l] * (fmT[fo + pb] + 0.5 * kappa * y);
                sB += weight[l] * fmB[fo + pb];
                // two half-interval shifts: F+ moves up one odd order, F- down one; F-(k=1) becomes F+(k=1)
                fp[fo + pa - 1] = y;
                fpT[fo + pa - 1] = fmT[fo + pb];
                fpB[fo + pa - 1] = fmB[fo + pb];
            }
            echo[p - 1] = e2Half * s;
            dT2[p - 1] = e2Half * sT;
            dB1[p - 1] = e2Half * sB;
            pa--;
            pb++;
        }
    }

    /**
     * One refocusing pulse (with the preceding relaxation folded in) on the values and derivatives of
     * lane l, whose F+ states start at offset ia0, F- at ib0 and z at iz0; coefficients in registers.
     */
    private void mix(int top, int ia0, int ib0, int iz0, int l, double h, double kappa) {
        final double[] a = fp;
        final double[] b = fm;
        final double[] z = zz;
        final double[] aT = fpT;
        final double[] bT = fmT;
        final double[] zT = zzT;
        final double[] aB = fpB;
        final double[] bB = fmB;
        final double[] zB = zzB;
        final double g = gCoef[l];
        final double u = uCoef[l];
        final double v = vCoef[l];
        final double w = wCoef[l];
        final double ang = aCoef[l];
        final double kv = kappa * v;
        for (int j = 0; j <= top; j++) {
            final int ia = ia0 + j;
            final int ib = ib0 + j;
            final int iz = iz0 + j;
            double x = a[ia];
            double y = b[ib];
            double q = z[iz];
            double d = x - y;
            double t = h * (x + y);
            double gd = g * d;
            double r = gd + u * q;
            double qn = w * q - v * d;
            double dT = aT[ia] - bT[ib];
            double qT = zT[iz];
            double tT = h * (aT[ia] + bT[ib]) + kappa * t;
            double rT = g * dT + u * qT + kappa * gd;
            double dB = aB[ia] - bB[ib];
            double qB = zB[iz];
            double tB = h * (aB[ia] + bB[ib]);
            double rB = g * dB + u * qB + ang * qn;
            a[ia] = t + r;
            b[ib] = t - r;
            z[iz] = qn;
            aT[ia] = tT + rT;
            bT[ib] = tT - rT;
            zT[iz] = w * qT - v * dT - kv * d;
            aB[ia] = tB + rB;
            bB[ib] = tB - rB;
            zB[iz] = w * qB - v * dB - ang * r;
        }
    }
}
