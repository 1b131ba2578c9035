package org.echotrellis.epg;

import java.util.Arrays;
import org.echotrellis.Checks;

/**
 * Real CPMG fast path with diffusion and the repetition-time steady state, several trains in lock-step
 * lanes (lanes innermost). Ideal (non-selective) pulses, CPMG phases.
 *
 * <p>In the frame of the excitation (Meiboom &amp; Gill 1958; Hennig 1988) the coherences excited at
 * t = 0 (the "odd" family: odd orders at every refocusing pulse, the only ones reaching k = 0 at the
 * echoes) keep every F<sub>k</sub> real and Z<sub>k</sub> = i&middot;q<sub>k</sub> imaginary; the longitudinal
 * magnetization left by the excitation and its T1 recovery (the "even" family, which alone sets
 * Z<sub>0</sub> at the end of the train) keep F<sub>k</sub> = i&middot;u<sub>k</sub> imaginary and Z<sub>k</sub> real. So
 * both run in real arithmetic. F is stored for signed orders (F&minus;<sub>k</sub> = conj F<sub>&minus;k</sub>), the
 * dephasing shift moves an offset.
 *
 * <p>Diffusion (Weigel, Schwenk, Kiselev, Scheffler &amp; Hennig, J Magn Reson 205:276, 2010) enters
 * through per-order factors over the half echo spacing before and after a pulse, given by the caller.
 * Steady state with ideal spoiling: Z<sub>0</sub> at the last echo is a&middot;M + b for the longitudinal
 * magnetization M before the excitation; the fixed point after recovery over TR &minus; N&middot;ESP is
 * M = (bE + 1 &minus; E)/(1 &minus; aE), E = exp(&minus;(TR &minus; N&middot;ESP)/T1), and the echoes scale with M.
 *
 * <p>Not thread-safe: one engine per thread; allocation-free after the first run of a given length.
 */
public final class SteadyCpmgEngine {
    private final int lanes;
    private double[] f = new double[0];
    private double[] z = new double[0];
    private final double[] e2h;
    private final double[] e1h;
    private final double[] rec;
    private final double[] c2;
    private final double[] s2;
    private final double[] sn;
    private final double[] cs;
    private final double[] ma;
    private final double[] mb;
    private final double[] work;
    private final double[] rot = new double[4];

    /** @param lanes trains in lock-step (1 to 64) */
    public SteadyCpmgEngine(int lanes) {
        this.lanes = Checks.inRange("lanes", lanes, 1, 64, null);
        e2h = new double[lanes];
        e1h = new double[lanes];
        rec = new double[lanes];
        c2 = new double[lanes];
        s2 = new double[lanes];
        sn = new double[lanes];
        cs = new double[lanes];
        ma = new double[lanes];
        mb = new double[lanes];
        work = new double[lanes];
    }

    /** @return the number of lanes */
    public int lanes() {
        return lanes;
    }

    /**
     * Length of the diffusion factor arrays for N echoes: signed orders &minus;(2N+2)..(2N+2).
     *
     * @param echoes N
     * @return the length
     */
    public static int factorLength(int echoes) {
        return 2 * (2 * echoes + 2) + 1;
    }

    /**
     * @param train the schedule (CPMG-phased)
     * @param dPre factor of an F state over the half before a pulse, index = signed starting order + 2N + 2
     * @param dPost the same over the half after a pulse
     * @param dZ factor of Z<sub>k</sub> over a half echo spacing, index k
     * @param repetitionMs TR in ms (+Infinity: one train from equilibrium)
     * @param t1Ms T1 per lane; not modified
     * @param t2Ms T2 per lane; not modified
     * @param b1 B1 per lane; not modified
     * @param count lanes used
     * @param out out[l*N + n] = signed echo n+1 of lane l in the CPMG frame; modified
     */
    public void run(CpmgTrain train, double[] dPre, double[] dPost, double[] dZ, double repetitionMs,
                    double[] t1Ms, double[] t2Ms, double[] b1, int count, double[] out) {
        if (count < 1 || count > lanes || !train.isCpmgPhased()) {
            throw new IllegalArgumentException("count within [1, lanes] and a CPMG-phased train needed");
        }
        int n = train.echoes();
        int nl = lanes;
        double esp = train.echoSpacingMs();
        double exc = Math.toRadians(train.excitationFlipDeg());
        boolean tr = Double.isFinite(repetitionMs);
        if (nl == 1) {
            runSingle(train, dPre, dPost, dZ, repetitionMs, t1Ms[0], t2Ms[0], b1[0], out);
            return;
        }
        for (int l = 0; l < nl; l++) {
            int s = l < count ? l : 0;
            e2h[l] = Math.exp(-0.5 * esp / t2Ms[s]);
            e1h[l] = Math.exp(-0.5 * esp / t1Ms[s]);
            ma[l] = 1;
        }
        if (tr) {
            // a: Z0 at the end from cos(excitation) without recovery; b: from 0 with recovery
            Arrays.fill(rec, 0);
            for (int l = 0; l < nl; l++) {
                int s = l < count ? l : 0;
                work[l] = Math.cos(b1[s] * exc);
            }
            family(train, false, dPre, dPost, dZ, b1, count, work, ma, null);
            for (int l = 0; l < nl; l++) {
                rec[l] = 1 - e1h[l];
                work[l] = 0;
            }
            family(train, false, dPre, dPost, dZ, b1, count, work, mb, null);
            for (int l = 0; l < nl; l++) {
                int s = l < count ? l : 0;
                double e = Math.exp(-(repetitionMs - n * esp) / t1Ms[s]);
                double a = ma[l];
                ma[l] = (mb[l] * e + 1 - e) / (1 - a * e);
            }
        }
        Arrays.fill(rec, 0);
        for (int l = 0; l < nl; l++) {
            int s = l < count ? l : 0;
            work[l] = ma[l] * Math.sin(b1[s] * exc);
        }
        family(train, true, dPre, dPost, dZ, b1, count, work, null, out);
    }

    /*
     * One train (a one-lane engine): the same arithmetic in the same order as the lanes, so the results
     * are bit-identical, in scalars; the two even-family runs of the steady state go in one pass over
     * two interleaved state vectors (a: from cos(excitation) without recovery; b: from 0 with it), so
     * the per-pulse rotation and relaxation factors are shared.
     */
    private void runSingle(CpmgTrain train, double[] dPre, double[] dPost, double[] dZ, double repetitionMs,
                           double t1Ms, double t2Ms, double b1, double[] out) {
        final int n = train.echoes();
        final double esp = train.echoSpacingMs();
        final double exc = Math.toRadians(train.excitationFlipDeg());
        final double e2 = Math.exp(-0.5 * esp / t2Ms);
        final double e1 = Math.exp(-0.5 * esp / t1Ms);
        final int kmax = 2 * n + 2;
        final int base0 = kmax + 2 * n + 1;
        final int len = base0 + kmax + 2;
        if (f.length < 2 * len) {
            f = new double[2 * len];
            z = new double[2 * (kmax + 2)];
        }
        final double[] fs = f;
        final double[] zs = z;
        final int off = kmax;
        double m = 1;
        if (Double.isFinite(repetitionMs)) {
            Arrays.fill(fs, 0, 2 * len, 0.0);
            Arrays.fill(zs, 0, 2 * (kmax + 2), 0.0);
            zs[0] = Math.cos(b1 * exc);
            final double recB = 1 - e1;
            int base = base0;
            double lastFlip = Double.NaN;
            double c2 = 0;
            double s2 = 0;
            double sn = 0;
            double cs = 0;
            for (int p = 1; p <= n; p++) {
                int bound = Math.min(2 * p - 2, 2 * (n - p));
                base--;
                double flip = Math.toRadians(train.refocusFlipDeg(p - 1)) * train.refocusSign(p - 1);
                if (flip != lastFlip) {
                    rotation(b1 * flip);
                    c2 = rot[0];
                    s2 = rot[1];
                    sn = rot[2];
                    cs = rot[3];
                    lastFlip = flip;
                }
                int i0 = 2 * base;
                double g0In = e2 * dPre[-1 + off];
                double g0Out = e2 * dPost[off];
                for (int j = 0; j < 2; j++) {
                    double rec = j == 0 ? 0 : recB;
                    double u = fs[i0 + j] * g0In;
                    double r = e1 * zs[j] + rec;
                    fs[i0 + j] = (cs * u - sn * r) * g0Out;
                    zs[j] = e1 * (sn * u + cs * r) + rec;
                }
                for (int k = 2; k <= bound; k += 2) {
                    int ip = 2 * (base + k);
                    int im = 2 * (base - k);
                    int iz = 2 * k;
                    double gpIn = e2 * dPre[k - 1 + off];
                    double gmIn = e2 * dPre[-k - 1 + off];
                    double gpOut = e2 * dPost[k + off];
                    double gmOut = e2 * dPost[-k + off];
                    double ez = e1 * dZ[k];
                    for (int j = 0; j < 2; j++) {
                        double u = fs[ip + j] * gpIn;
                        double v = fs[im + j] * gmIn;
                        double r = zs[iz + j] * ez;
                        fs[ip + j] = (c2 * u - s2 * v - sn * r) * gpOut;
                        fs[im + j] = (-s2 * u + c2 * v - sn * r) * gmOut;
                        zs[iz + j] = (0.5 * sn * (u + v) + cs * r) * ez;
                    }
                }
                base--;
            }
            double e = Math.exp(-(repetitionMs - n * esp) / t1Ms);
            m = (zs[1] * e + 1 - e) / (1 - zs[0] * e);
        }
        Arrays.fill(fs, 0, len, 0.0);
        Arrays.fill(zs, 0, kmax + 2, 0.0);
        int base = base0;
        fs[base] = m * Math.sin(b1 * exc);
        double lastFlip = Double.NaN;
        double c2 = 0;
        double s2 = 0;
        double sn = 0;
        double cs = 0;
        for (int p = 1; p <= n; p++) {
            int bound = Math.min(2 * p - 1, 2 * (n - p) + 1);
            base--;
            double flip = Math.toRadians(train.refocusFlipDeg(p - 1)) * train.refocusSign(p - 1);
            if (flip != lastFlip) {
                rotation(b1 * flip);
                c2 = rot[0];
                s2 = rot[1];
                sn = rot[2];
                cs = rot[3];
                lastFlip = flip;
            }
            for (int k = 1; k <= bound; k += 2) {
                int ip = base + k;
                int im = base - k;
                double ez = e1 * dZ[k];
                double x = fs[ip] * (e2 * dPre[k - 1 + off]);
                double y = fs[im] * (e2 * dPre[-k - 1 + off]);
                double q = zs[k] * ez;
                fs[ip] = (c2 * x + s2 * y + sn * q) * (e2 * dPost[k + off]);
                fs[im] = (s2 * x + c2 * y - sn * q) * (e2 * dPost[-k + off]);
                zs[k] = (cs * q - 0.5 * sn * (x - y)) * ez;
            }
            base--;
            out[p - 1] = fs[base];
        }
    }

    /** cos²(a/2), sin²(a/2), sin a, cos a of a refocusing rotation by a into {@link #rot}, as the lanes compute them. */
    private void rotation(double a) {
        double h = Math.cos(0.5 * a);
        rot[0] = h * h;
        rot[1] = 1 - h * h;
        rot[2] = Math.sin(a);
        rot[3] = Math.cos(a);
    }

    private void family(CpmgTrain train, boolean odd, double[] dPre, double[] dPost, double[] dZ, double[] b1,
                        int count, double[] init, double[] z0End, double[] out) {
        final int n = train.echoes();
        final int nl = lanes;
        final int kmax = 2 * n + 2;
        final int base0 = kmax + 2 * n + 1;
        final int len = (base0 + kmax + 2) * nl;
        if (f.length < len) {
            f = new double[len];
            z = new double[(kmax + 2) * nl];
        }
        Arrays.fill(f, 0, len, 0.0);
        Arrays.fill(z, 0, (kmax + 2) * nl, 0.0);
        int base = base0;
        for (int l = 0; l < nl; l++) {
            if (odd) {
                f[base * nl + l] = init[l];
            } else {
                z[l] = init[l];
            }
        }
        final int off = kmax;
        double lastFlip = Double.NaN;
        for (int p = 1; p <= n; p++) {
            int bound = odd ? Math.min(2 * p - 1, 2 * (n - p) + 1) : Math.min(2 * p - 2, 2 * (n - p));
            base--; // the half before the pulse moves every F up one order; its relaxation is folded below
            double flip = Math.toRadians(train.refocusFlipDeg(p - 1)) * train.refocusSign(p - 1);
            if (flip != lastFlip) {
                for (int l = 0; l < nl; l++) {
                    double a = (l < count ? b1[l] : 1.0) * flip;
                    double h = Math.cos(0.5 * a);
                    c2[l] = h * h;
                    s2[l] = 1 - h * h;
                    sn[l] = Math.sin(a);
                    cs[l] = Math.cos(a);
                }
                lastFlip = flip;
            }
            if (odd) {
                mixOdd(base, bound, dPre, dPost, dZ, off);
            } else {
                mixEven(base, bound, dPre, dPost, dZ, off);
            }
            base--;
            if (odd) {
                int ib = base * nl;
                for (int l = 0; l < count; l++) {
                    out[l * n + p - 1] = f[ib + l];
                }
            }
        }
        if (!odd) {
            System.arraycopy(z, 0, z0End, 0, nl);
        }
    }

    /*
     * Relaxation folded into the mixing: a state at signed order j at the pulse came from j - 1 at the
     * start of the half before it (factor e2h * dPre[j - 1]); after the pulse it relaxes over the half
     * after it starting at j (e2h * dPost[j]); Z_k relaxes by e1h * dZ[k] on both sides. Every state that
     * can still reach an echo (or Z0 at the end) is inside the window, so nothing else needs updating.
     */
    private void mixOdd(int base, int bound, double[] dPre, double[] dPost, double[] dZ, int off) {
        final int nl = lanes;
        for (int k = 1; k <= bound; k += 2) {
            int ip = (base + k) * nl;
            int im = (base - k) * nl;
            int iz = k * nl;
            double gpIn = dPre[k - 1 + off];
            double gmIn = dPre[-k - 1 + off];
            double gpOut = dPost[k + off];
            double gmOut = dPost[-k + off];
            double gz = dZ[k];
            for (int l = 0; l < nl; l++) {
                double e2 = e2h[l];
                double e1 = e1h[l] * gz;
                double x = f[ip + l] * (e2 * gpIn);
                double y = f[im + l] * (e2 * gmIn);
                double q = z[iz + l] * e1;
                f[ip + l] = (c2[l] * x + s2[l] * y + sn[l] * q) * (e2 * gpOut);
                f[im + l] = (s2[l] * x + c2[l] * y - sn[l] * q) * (e2 * gmOut);
                z[iz + l] = (cs[l] * q - 0.5 * sn[l] * (x - y)) * e1;
            }
        }
    }

    private void mixEven(int base, int bound, double[] dPre, double[] dPost, double[] dZ, int off) {
        final int nl = lanes;
        int i0 = base * nl;
        double g0In = dPre[-1 + off];
        double g0Out = dPost[off];
        for (int l = 0; l < nl; l++) {
            double u = f[i0 + l] * (e2h[l] * g0In);
            double r = e1h[l] * z[l] + rec[l];
            f[i0 + l] = (cs[l] * u - sn[l] * r) * (e2h[l] * g0Out);
            z[l] = e1h[l] * (sn[l] * u + cs[l] * r) + rec[l];
        }
        for (int k = 2; k <= bound; k += 2) {
            int ip = (base + k) * nl;
            int im = (base - k) * nl;
            int iz = k * nl;
            double gpIn = dPre[k - 1 + off];
            double gmIn = dPre[-k - 1 + off];
            double gpOut = dPost[k + off];
            double gmOut = dPost[-k + off];
            double gz = dZ[k];
            for (int l = 0; l < nl; l++) {
                double e2 = e2h[l];
                double e1 = e1h[l] * gz;
                double u = f[ip + l] * (e2 * gpIn);
                double v = f[im + l] * (e2 * gmIn);
                double r = z[iz + l] * e1;
                f[ip + l] = (c2[l] * u - s2[l] * v - sn[l] * r) * (e2 * gpOut);
                f[im + l] = (-s2[l] * u + c2[l] * v - sn[l] * r) * (e2 * gmOut);
                z[iz + l] = (0.5 * sn[l] * (u + v) + cs[l] * r) * e1;
            }
        }
    }
}
