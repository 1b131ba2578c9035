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
    /** Deferred relaxation: true F = scaleF * stored F, true Z_k = scaleZ * stored Z_k (k >= 1); Z0 is stored true. */
    private final double[] scaleF = new double[64];
    private final double[] scaleZ = new double[64];
    private final double[] halfCos = new double[64];
    private final double[] sinA = new double[64];
    private final double[] cosA = new double[64];
    private final double[] sinZ = new double[64];
    private final double[] sinF = new double[64];
    private final double[] sin0 = new double[64];

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
            scaleF[l] = 1.0;
            scaleZ[l] = 1.0;
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
        double frame = 0;
        double frameCos = 1;
        double frameSin = 0;
        int echo = 0;
        final int ne = p.echoCount;
        for (int i = 0; i < p.op.length; i++) {
            switch (p.op[i]) {
                case EpgProgram.RF -> {
                    double phi = p.phaseRad[i];
                    rf(p.table[i], phi - frame, base, p.window[i]);
                    if (phi != frame) {
                        frame = phi;
                        frameCos = Math.cos(phi);
                        frameSin = Math.sin(phi);
                    }
                }
                case EpgProgram.INTERVAL -> {
                    base -= p.dephasing[i];
                    relax(p.table[i], p.window[i], base);
                }
                default -> {
                    int pos = base * nl;
                    for (int l = 0; l < count; l++) {
                        double xr = scaleF[l] * fRe[pos + l];
                        double xi = scaleF[l] * fIm[pos + l];
                        outRe[l * ne + echo] = xr * frameCos - xi * frameSin;
                        outIm[l * ne + echo] = xr * frameSin + xi * frameCos;
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
            sum += (fRe[i] * fRe[i] + fIm[i] * fIm[i]) * scaleF[lane] * scaleF[lane];
        }
        for (int k = 0; k <= win; k++) {
            double m = zRe[k * nl + lane] * zRe[k * nl + lane] + zIm[k * nl + lane] * zIm[k * nl + lane];
            sum += k == 0 ? m : 2 * m * scaleZ[lane] * scaleZ[lane];
        }
        return sum;
    }

    /*
     * Relaxation is deferred: F and Z_k (k >= 1) relax uniformly, so only the per-lane scales change
     * (O(lanes) instead of O(states x lanes)); the RF pulse folds the scale ratio into its mixing
     * coefficients. Z0 recovers toward M0 and is kept true. Scales are folded back into the states
     * before they could underflow.
     */
    private void relax(int u, int win, int base) {
        final int nl = lanes;
        final int eo = u * nl;
        boolean renormalise = false;
        for (int l = 0; l < nl; l++) {
            double f1 = e1[eo + l];
            zRe[l] = f1 * zRe[l] + (1.0 - f1);
            zIm[l] *= f1;
            scaleF[l] *= e2[eo + l];
            scaleZ[l] *= f1;
            renormalise |= scaleF[l] < 1e-120 || scaleZ[l] < 1e-120;
        }
        if (renormalise) {
            foldScales(win, base);
        }
    }

    private void foldScales(int win, int base) {
        final int nl = lanes;
        for (int k = base - win; k <= base + win; k++) {
            for (int l = 0; l < nl; l++) {
                fRe[k * nl + l] *= scaleF[l];
                fIm[k * nl + l] *= scaleF[l];
            }
        }
        for (int k = 1; k <= win; k++) {
            for (int l = 0; l < nl; l++) {
                zRe[k * nl + l] *= scaleZ[l];
                zIm[k * nl + l] *= scaleZ[l];
            }
        }
        java.util.Arrays.fill(scaleF, 0, nl, 1.0);
        java.util.Arrays.fill(scaleZ, 0, nl, 1.0);
    }

    /*
     * RF pulse of flip a about phase phi. The states are stored in a frame rotated by the phase of
     * the last pulse ("frame"): T(a, phi) = R(phi) T(a, 0) R(-phi), where R(psi) multiplies every
     * F_k (all k, both signs, by the conjugate symmetry) by e^{i psi} and leaves Z alone. So a pulse
     * first rotates the stored F by e^{-i (phi - frame)} (skipped when the phase repeats, as in CPMG
     * or CP trains), then applies the real-coefficient T(a, 0) to (x = F+_k, y = F-_k, z = Z_k):
     *   x' = (x + y)/2 + cos(a) (x - y)/2 - i sin(a) z
     *   y' = (x + y)/2 - cos(a) (x - y)/2 + i sin(a) z
     *   z' = -(i/2) sin(a) (x - y) + cos(a) z
     * (10 multiplications and 14 additions per state and lane; Weigel 2015 for T).
     */
    private void rf(int u, double dPhase, int base, int win) {
        final int nl = lanes;
        final double[] fr = fRe;
        final double[] fi = fIm;
        final double[] zr = zRe;
        final double[] zi = zIm;
        if (dPhase != 0) {
            final double c = Math.cos(dPhase);
            final double s = -Math.sin(dPhase);
            for (int i = (base - win) * nl, end = (base + win + 1) * nl; i < end; i++) {
                double xr = fr[i];
                double xi = fi[i];
                fr[i] = xr * c - xi * s;
                fi[i] = xr * s + xi * c;
            }
        }
        final int to = u * nl;
        final double[] hc = halfCos;
        final double[] sa = sinA;
        final double[] ca = cosA;
        final double[] sz = sinZ;
        final double[] sf = sinF;
        final double[] s0 = sin0;
        for (int l = 0; l < nl; l++) {
            double c = cosHalf[to + l];
            double s = sinHalf[to + l];
            ca[l] = c * c - s * s;
            hc[l] = 0.5 * ca[l];
            sa[l] = 2 * s * c;
            sz[l] = sa[l] * scaleZ[l] / scaleF[l];       // Z -> F coupling in stored units
            sf[l] = 0.5 * sa[l] * scaleF[l] / scaleZ[l]; // F -> Z coupling in stored units
            s0[l] = sa[l] / scaleF[l];                   // true Z0 -> stored F0
        }
        // k = 0: y = conj(x); z' = sin(a) Im(x) + cos(a) z stays real
        {
            final int ip = base * nl;
            for (int l = 0; l < nl; l++) {
                double xr = fr[ip + l];
                double xi = fi[ip + l];
                double qr = zr[l];
                double qi = zi[l];
                fr[ip + l] = xr + s0[l] * qi;
                fi[ip + l] = ca[l] * xi - s0[l] * qr;
                zr[l] = sa[l] * scaleF[l] * xi + ca[l] * qr;
                zi[l] = ca[l] * qi;
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
                double hr = 0.5 * (xr + yr);
                double hi = 0.5 * (xi + yi);
                double dr = xr - yr;
                double di = xi - yi;
                double gr = hc[l] * dr;
                double gi = hc[l] * di;
                double szr = sz[l] * qr;   // i sin(a) z = (-sa qi, sa qr), in stored units
                double szi = sz[l] * qi;
                fr[ip + l] = hr + gr + szi;
                fi[ip + l] = hi + gi - szr;
                // F_{-k} = conj(y') with y' = h - g + i sin(a) z
                fr[im + l] = hr - gr - szi;
                fi[im + l] = -(hi - gi + szr);
                zr[iz + l] = sf[l] * di + ca[l] * qr;
                zi[iz + l] = -sf[l] * dr + ca[l] * qi;
            }
        }
    }
}
