package org.echotrellis.epg;

import java.util.Arrays;
import org.echotrellis.Checks;

/**
 * General complex EPG engine: any flips and RF phases, any durations and integer dephasing steps,
 * T1 and T2 relaxation including recovery of Z0 toward M0 = 1 (Hennig 1988; Weigel 2015). Several
 * trains of the same {@link EpgProgram} run in lock-step lanes with their own T1, T2 and B1.
 *
 * <p>Storage: the transverse states are kept as one complex sequence F<sub>k</sub>, k = &minus;K..K, with
 * F+<sub>k</sub> = F<sub>k</sub> and F&minus;<sub>k</sub> = conj(F<sub>&minus;k</sub>); a dephasing step
 * F<sub>k</sub> &larr; F<sub>k&minus;d</sub> then only moves the array offset. Longitudinal states Z<sub>k</sub>
 * are stored for k &ge; 0. The RF operator is the 3&times;3 matrix T(&alpha;, &phi;) of Weigel 2015 applied to
 * (F+<sub>k</sub>, F&minus;<sub>k</sub>, Z<sub>k</sub>) for every k. Only orders that can still reach k = 0
 * before the last echo are updated ({@link EpgProgram}), about half of the states in a spin-echo train.
 *
 * <p>Not thread-safe: use one engine per thread. Workspaces grow on demand and are reused.
 */
public final class GeneralEngine {
    private final int lanes;
    private double[] fRe = new double[0];
    private double[] fIm = new double[0];
    private double[] zRe = new double[0];
    private double[] zIm = new double[0];
    private double[] cosHalf = new double[0];
    private double[] sinHalf = new double[0];
    private double[] e1 = new double[0];
    private double[] e2 = new double[0];
    private final double[] t11 = new double[64];
    private final double[] sn = new double[64];
    private final double[] cs = new double[64];
    private final double[] s2 = new double[64];

    /** @param lanes number of trains simulated in lock-step (1 to 64) */
    public GeneralEngine(int lanes) {
        this.lanes = Checks.inRange("lanes", lanes, 1, 64, null);
    }

    /** @return the number of lanes */
    public int lanes() {
        return lanes;
    }

    private void ensure(EpgProgram p) {
        int nl = lanes;
        if (fRe.length < p.bufferLength * nl) {
            fRe = new double[p.bufferLength * nl];
            fIm = new double[p.bufferLength * nl];
        }
        if (zRe.length < (p.maxOrder + 1) * nl) {
            zRe = new double[(p.maxOrder + 1) * nl];
            zIm = new double[(p.maxOrder + 1) * nl];
        }
        if (cosHalf.length < p.flipsRad.length * nl) {
            cosHalf = new double[p.flipsRad.length * nl];
            sinHalf = new double[p.flipsRad.length * nl];
        }
        if (e1.length < p.durationsMs.length * nl) {
            e1 = new double[p.durationsMs.length * nl];
            e2 = new double[p.durationsMs.length * nl];
        }
    }

    /**
     * Runs the program for up to {@code lanes} tissues at once, starting from equilibrium (Z0 = 1).
     *
     * @param p the compiled event list
     * @param t1Ms T1 per lane in ms (+Infinity allowed); not modified
     * @param t2Ms T2 per lane in ms (+Infinity allowed); not modified
     * @param b1 flip-angle scale per lane; not modified
     * @param count lanes used (1..lanes)
     * @param outRe receives Re F+<sub>0</sub> of echo e of lane l at [l*echoCount + e]; modified
     * @param outIm receives Im F+<sub>0</sub> likewise; modified
     */
    public void run(EpgProgram p, double[] t1Ms, double[] t2Ms, double[] b1, int count, double[] outRe, double[] outIm) {
        if (count < 1 || count > lanes) {
            throw new IllegalArgumentException("count must be within [1, " + lanes + "], got " + count);
        }
        final int nl = lanes;
        ensure(p);
        Arrays.fill(fRe, 0, p.bufferLength * nl, 0.0);
        Arrays.fill(fIm, 0, p.bufferLength * nl, 0.0);
        Arrays.fill(zRe, 0, (p.maxOrder + 1) * nl, 0.0);
        Arrays.fill(zIm, 0, (p.maxOrder + 1) * nl, 0.0);
        for (int l = 0; l < nl; l++) {
            zRe[l] = 1.0;
        }
        for (int u = 0; u < p.flipsRad.length; u++) {
            for (int l = 0; l < nl; l++) {
                double a = 0.5 * p.flipsRad[u] * (l < count ? b1[l] : 1.0);
                cosHalf[u * nl + l] = Math.cos(a);
                sinHalf[u * nl + l] = Math.sin(a);
            }
        }
        for (int u = 0; u < p.durationsMs.length; u++) {
            double t = p.durationsMs[u];
            for (int l = 0; l < nl; l++) {
                boolean used = l < count;
                e1[u * nl + l] = used ? Math.exp(-t / t1Ms[l]) : 1.0;
                e2[u * nl + l] = used ? Math.exp(-t / t2Ms[l]) : 1.0;
            }
        }
        int base = p.startBase;
        int echo = 0;
        final int ne = p.echoCount;
        for (int i = 0; i < p.op.length; i++) {
            switch (p.op[i]) {
                case EpgProgram.RF -> rf(p.table[i], p.phaseTrig, 4 * i, base, p.window[i]);
                case EpgProgram.INTERVAL -> {
                    base -= p.dephasing[i];
                    relax(p.table[i], base, p.window[i]);
                }
                default -> {
                    int pos = base * nl;
                    for (int l = 0; l < count; l++) {
                        outRe[l * ne + echo] = fRe[pos + l];
                        outIm[l * ne + echo] = fIm[pos + l];
                    }
                    echo++;
                }
            }
        }
    }

    /**
     * Diagnostic: the squared norm of the final state of lane l after the last {@link #run}, the
     * Fourier-domain mean of |M(&theta;)|<sup>2</sup> over the voxel:
     * &Sigma;<sub>k</sub> |F<sub>k</sub>|<sup>2</sup> + |Z<sub>0</sub>|<sup>2</sup> + 2&Sigma;<sub>k&ge;1</sub> |Z<sub>k</sub>|<sup>2</sup>
     * (Parseval). RF pulses and dephasing preserve it; it is meaningful only for programs built with
     * {@link EpgProgram.Builder#keepAllStates()}.
     *
     * @param p the program last run
     * @param lane the lane
     * @return the squared norm
     */
    public double stateNormSquared(EpgProgram p, int lane) {
        int nl = lanes;
        int base = p.startBase;
        for (int i = 0; i < p.op.length; i++) {
            if (p.op[i] == EpgProgram.INTERVAL) {
                base -= p.dephasing[i];
            }
        }
        int win = p.maxOrder;
        double sum = 0;
        for (int k = -win; k <= win; k++) {
            int i = (base + k) * nl + lane;
            sum += fRe[i] * fRe[i] + fIm[i] * fIm[i];
        }
        for (int k = 0; k <= win; k++) {
            double m = zRe[k * nl + lane] * zRe[k * nl + lane] + zIm[k * nl + lane] * zIm[k * nl + lane];
            sum += k == 0 ? m : 2 * m;
        }
        return sum;
    }

    private void relax(int u, int base, int win) {
        final int nl = lanes;
        final double[] r1 = e1;
        final double[] r2 = e2;
        final int eo = u * nl;
        final double[] fr = fRe;
        final double[] fi = fIm;
        for (int k = base - win; k <= base + win; k++) {
            final int ip = k * nl;
            for (int l = 0; l < nl; l++) {
                double f = r2[eo + l];
                fr[ip + l] *= f;
                fi[ip + l] *= f;
            }
        }
        for (int l = 0; l < nl; l++) {
            double f = r1[eo + l];
            zRe[l] = f * zRe[l] + (1.0 - f);
            zIm[l] *= f;
        }
        for (int k = 1; k <= win; k++) {
            final int iz = k * nl;
            for (int l = 0; l < nl; l++) {
                double f = r1[eo + l];
                zRe[iz + l] *= f;
                zIm[iz + l] *= f;
            }
        }
    }

    /*
     * T(a, phi) on (x = F+_k, y = F-_k, z = Z_k), with c2 = cos^2(a/2), s2 = sin^2(a/2):
     *   x' = c2 x + e^{2i phi} s2 y - i e^{i phi} sin(a) z
     *   y' = e^{-2i phi} s2 x + c2 y + i e^{-i phi} sin(a) z
     *   z' = -(i/2) e^{-i phi} sin(a) x + (i/2) e^{i phi} sin(a) y + cos(a) z
     * expanded into real arithmetic (about 60 flops per state and lane).
     */
    private void rf(int u, double[] trig, int at, int base, int win) {
        final int nl = lanes;
        final double cp = trig[at];
        final double sp = trig[at + 1];
        final double c2p = trig[at + 2];
        final double s2p = trig[at + 3];
        final int to = u * nl;
        for (int l = 0; l < nl; l++) {
            double c = cosHalf[to + l];
            double s = sinHalf[to + l];
            t11[l] = c * c;
            s2[l] = s * s;
            sn[l] = 2 * s * c;
            cs[l] = c * c - s * s;
        }
        final double[] fr = fRe;
        final double[] fi = fIm;
        final double[] zr = zRe;
        final double[] zi = zIm;
        // k = 0: F-_0 = conj(F+_0), so only x' and Z0' are needed; Z0 stays real.
        {
            final int ip = base * nl;
            for (int l = 0; l < nl; l++) {
                double xr = fr[ip + l];
                double xi = fi[ip + l];
                double qr = zr[l];
                double qi = zi[l];
                double sa = sn[l];
                // e^{2i phi} conj(x)
                double pyr = c2p * xr + s2p * xi;
                double pyi = s2p * xr - c2p * xi;
                double azr = sp * qr + cp * qi;
                double azi = sp * qi - cp * qr;
                fr[ip + l] = t11[l] * xr + s2[l] * pyr + sa * azr;
                fi[ip + l] = t11[l] * xi + s2[l] * pyi + sa * azi;
                zr[l] = sa * (cp * xi - sp * xr) + cs[l] * qr;
                zi[l] = cs[l] * qi;
            }
        }
        for (int k = 1; k <= win; k++) {
            final int ip = (base + k) * nl;
            final int im = (base - k) * nl;
            final int iz = k * nl;
            for (int l = 0; l < nl; l++) {
                double xr = fr[ip + l];
                double xi = fi[ip + l];
                double yr = fr[im + l];      // y = conj(F_{-k})
                double yi = -fi[im + l];
                double qr = zr[iz + l];
                double qi = zi[iz + l];
                double c2 = t11[l];
                double a2 = s2[l];
                double sa = sn[l];
                double ca = cs[l];
                // e^{2i phi} y and e^{-2i phi} x
                double pyr = c2p * yr - s2p * yi;
                double pyi = s2p * yr + c2p * yi;
                double mxr = c2p * xr + s2p * xi;
                double mxi = c2p * xi - s2p * xr;
                // -i e^{i phi} z = (sp - i cp) z ;  i e^{-i phi} z = (sp + i cp) z
                double azr = sp * qr + cp * qi;
                double azi = sp * qi - cp * qr;
                double bzr = sp * qr - cp * qi;
                double bzi = sp * qi + cp * qr;
                double nxr = c2 * xr + a2 * pyr + sa * azr;
                double nxi = c2 * xi + a2 * pyi + sa * azi;
                double nyr = a2 * mxr + c2 * yr + sa * bzr;
                double nyi = a2 * mxi + c2 * yi + sa * bzi;
                // -(i/2) e^{-i phi} x = -(i/2)(cp - i sp) x = (-(sp) - i cp)/2 x
                // (i/2) e^{i phi} y = (i/2)(cp + i sp) y = (-(sp) + i cp)/2 y
                double hx = 0.5 * sa;
                double nzr = hx * ((-sp * xr + cp * xi) + (-sp * yr - cp * yi)) + ca * qr;
                double nzi = hx * ((-sp * xi - cp * xr) + (-sp * yi + cp * yr)) + ca * qi;
                fr[ip + l] = nxr;
                fi[ip + l] = nxi;
                fr[im + l] = nyr;
                fi[im + l] = -nyi;
                zr[iz + l] = nzr;
                zi[iz + l] = nzi;
            }
        }
    }
}
