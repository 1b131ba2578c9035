package org.echotrellis.pathway;

import java.util.Arrays;
import org.echotrellis.Checks;

/**
 * Exact decomposition of every echo into classes m = number of periods a pathway spent as
 * dephased longitudinal magnetization (Z<sub>k</sub>, k &ne; 0). m = 0 collects the pure spin-echo
 * pathways, m &ge; 1 the stimulated-echo pathways (Hennig, J Magn Reson 78:397, 1988, classifies echo
 * pathways this way; the EPG operators follow Weigel, J Magn Reson Imaging 41:266, 2015).
 *
 * <p>Method: the EPG state is carried once per class. Every operator is linear and acts on each class
 * copy alone (RF rotation, T2 decay of F, T1 decay of Z, dephasing shift), except two: the T1
 * regrowth (1 &minus; E1) of Z<sub>0</sub> enters class 0 (regrown magnetization has not been
 * dephased), and at the first interval of each period the dephased longitudinal states Z<sub>k</sub>,
 * k &ge; 1, of class m move to class m + 1. Summing the class copies gives the ordinary EPG state at
 * every instant, so the classes of each echo add up to the echo.
 *
 * <p>Storage per class: signed transverse orders F<sub>k</sub>, k = &minus;K..K (F+<sub>k</sub> =
 * F<sub>k</sub>, F&minus;<sub>k</sub> = conj F<sub>&minus;k</sub>) and Z<sub>k</sub>, k = 0..K, as flat
 * re/im arrays. Only orders that can still reach k = 0 before the last echo are updated.
 * Cost: O(classes &middot; K) per operation, O(N<sup>3</sup>) for an N-echo train.
 *
 * <p>Not thread-safe: one tracker per thread. Workspaces grow on demand and are reused.
 */
final class ClassTracker {
    private double[] fRe = new double[0];
    private double[] fIm = new double[0];
    private double[] zRe = new double[0];
    private double[] zIm = new double[0];
    private int fw;
    private int zw;
    private int top;
    private IntervalListener listener;

    /** Called at every interval, before its relaxation and shift (used to draw phase graphs). */
    interface IntervalListener {
        /**
         * @param t the tracker, whose summed states can be read
         * @param window largest order currently held
         */
        void interval(ClassTracker t, int window);
    }

    /** Creates a tracker with empty workspaces. */
    public ClassTracker() { }

    /**
     * Decomposes every echo of a schedule.
     *
     * @param s the event list
     * @param t1Ms T1 in ms (+Infinity: no T1 relaxation)
     * @param t2Ms T2 in ms (+Infinity: no T2 relaxation)
     * @param b1 flip-angle scale applied to every pulse (&ge; 0)
     * @return the classes of every echo
     */
    public ClassDecomposition decompose(Schedule s, double t1Ms, double t2Ms, double b1) {
        int size = s.classOffset[s.echoCount];
        double[] re = new double[size];
        double[] im = new double[size];
        run(s, t1Ms, t2Ms, b1, re, im);
        return new ClassDecomposition(s.echoLabels(), s.echoTimesMs(), s.classOffset.clone(), re, im);
    }

    /**
     * Hot entry point: writes class m of echo e to index {@code s.classOffset[e] + m}.
     *
     * @param s the event list
     * @param t1Ms T1 in ms (+Infinity allowed)
     * @param t2Ms T2 in ms (+Infinity allowed)
     * @param b1 flip-angle scale (&ge; 0)
     * @param outRe receives the real parts; modified (length &ge; total class count)
     * @param outIm receives the imaginary parts; modified
     */
    public void run(Schedule s, double t1Ms, double t2Ms, double b1, double[] outRe, double[] outIm) {
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.positiveOrInfinite("t2_ms", t2Ms, null);
        Checks.inRange("b1", b1, 0, 10, null);
        prepare(s);
        int echo = 0;
        int window = 0;
        boolean promoted = false;
        for (int i = 0; i < s.op.length; i++) {
            switch (s.op[i]) {
                case Schedule.RF -> {
                    rf(s.value[i] * b1, s.second[i], window);
                    promoted = false;
                }
                case Schedule.INTERVAL -> {
                    if (!promoted) {
                        promote(window);
                        promoted = true;
                    }
                    if (listener != null) {
                        listener.interval(this, window);
                    }
                    double tau = s.value[i];
                    relax(Math.exp(-tau / t1Ms), Math.exp(-tau / t2Ms), window);
                    int next = s.window[i];
                    shift((int) s.second[i], window, next);
                    window = next;
                }
                default -> {
                    int from = s.classOffset[echo];
                    int count = s.classOffset[echo + 1] - from;
                    for (int m = 0; m < count; m++) {
                        boolean held = m <= top;
                        outRe[from + m] = held ? fRe[m * fw + zw - 1] : 0.0;
                        outIm[from + m] = held ? fIm[m * fw + zw - 1] : 0.0;
                    }
                    echo++;
                }
            }
        }
    }

    /** @param l listener for the next runs, or null */
    void listen(IntervalListener l) {
        listener = l;
    }

    /**
     * @param k signed order
     * @return |F<sub>k</sub>| summed over all classes (F+<sub>k</sub> for k &ge; 0, F&minus;<sub>|k|</sub> for k &lt; 0)
     */
    double transverseMagnitude(int k) {
        double r = 0;
        double i = 0;
        for (int m = 0; m <= top; m++) {
            r += fRe[m * fw + zw - 1 + k];
            i += fIm[m * fw + zw - 1 + k];
        }
        return Math.hypot(r, i);
    }

    /**
     * @param k order, &ge; 0
     * @return |Z<sub>k</sub>| summed over all classes
     */
    double longitudinalMagnitude(int k) {
        double r = 0;
        double i = 0;
        for (int m = 0; m <= top; m++) {
            r += zRe[m * zw + k];
            i += zIm[m * zw + k];
        }
        return Math.hypot(r, i);
    }

    private void prepare(Schedule s) {
        s.checkWorkspace();
        int k = s.maxOrder;
        fw = 2 * k + 1;
        zw = k + 1;
        int classes = s.timedPeriods + 1;
        if (fRe.length < classes * fw) {
            fRe = new double[classes * fw];
            fIm = new double[classes * fw];
        }
        if (zRe.length < classes * zw) {
            zRe = new double[classes * zw];
            zIm = new double[classes * zw];
        }
        Arrays.fill(fRe, 0, classes * fw, 0.0);
        Arrays.fill(fIm, 0, classes * fw, 0.0);
        Arrays.fill(zRe, 0, classes * zw, 0.0);
        Arrays.fill(zIm, 0, classes * zw, 0.0);
        zRe[0] = 1.0;
        top = 0;
    }

    /** Moves Z_k (1 &le; k &le; window) of every class m to class m + 1. */
    private void promote(int window) {
        for (int m = top; m >= 0; m--) {
            int src = m * zw + 1;
            System.arraycopy(zRe, src, zRe, src + zw, window);
            System.arraycopy(zIm, src, zIm, src + zw, window);
        }
        Arrays.fill(zRe, 1, 1 + window, 0.0);
        Arrays.fill(zIm, 1, 1 + window, 0.0);
        top++;
    }

    private void relax(double e1, double e2, int window) {
        for (int m = 0; m <= top; m++) {
            int c = m * fw + zw - 1;
            for (int i = c - window; i <= c + window; i++) {
                fRe[i] *= e2;
                fIm[i] *= e2;
            }
            int z = m * zw;
            for (int i = z; i <= z + window; i++) {
                zRe[i] *= e1;
                zIm[i] *= e1;
            }
        }
        zRe[0] += 1.0 - e1;
    }

    /** F_k &larr; F_{k&minus;d} for |k| &le; next, reading only |k &minus; d| &le; window. */
    private void shift(int d, int window, int next) {
        int lo = Math.max(-next, d - window);
        int hi = Math.min(next, d + window);
        for (int m = 0; m <= top; m++) {
            int c = m * fw + zw - 1;
            if (lo <= hi) {
                System.arraycopy(fRe, c + lo - d, fRe, c + lo, hi - lo + 1);
                System.arraycopy(fIm, c + lo - d, fIm, c + lo, hi - lo + 1);
                zero(c - next, c + lo);
                zero(c + hi + 1, c + next + 1);
            } else {
                zero(c - next, c + next + 1);
            }
        }
    }

    private void zero(int from, int to) {
        if (from < to) {
            Arrays.fill(fRe, from, to, 0.0);
            Arrays.fill(fIm, from, to, 0.0);
        }
    }

    /*
     * T(a, phi) of Weigel 2015 on (x = F+_k, y = F-_k, z = Z_k), c2 = cos^2(a/2), s2 = sin^2(a/2):
     *   x' = c2 x + e^{2i phi} s2 y - i e^{i phi} sin(a) z
     *   y' = e^{-2i phi} s2 x + c2 y + i e^{-i phi} sin(a) z
     *   z' = -(i/2) e^{-i phi} sin(a) x + (i/2) e^{i phi} sin(a) y + cos(a) z
     * With u = e^{i phi}: -i u z and i conj(u) z are conjugate-symmetric, so one pair of products
     * serves both rows; the same holds for the two halves of z'.
     */
    private void rf(double flipRad, double phaseRad, int window) {
        final double c2 = Math.cos(0.5 * flipRad) * Math.cos(0.5 * flipRad);
        final double s2 = Math.sin(0.5 * flipRad) * Math.sin(0.5 * flipRad);
        final double sa = Math.sin(flipRad);
        final double ca = Math.cos(flipRad);
        final double ur = Math.cos(phaseRad);
        final double ui = Math.sin(phaseRad);
        final double vr = ur * ur - ui * ui;
        final double vi = 2 * ur * ui;
        for (int m = 0; m <= top; m++) {
            final int c = m * fw + zw - 1;
            final int z = m * zw;
            rfZero(c, z, c2, s2, sa, ca, ur, ui, vr, vi);
            for (int k = 1; k <= window; k++) {
                final int ip = c + k;
                final int in = c - k;
                final double xr = fRe[ip];
                final double xi = fIm[ip];
                final double yr = fRe[in];
                final double yi = -fIm[in];
                final double qr = zRe[z + k];
                final double qi = zIm[z + k];
                // w = -i u z  (the second row uses conj-type i conj(u) z = (ui - i... ) below)
                final double wr = ui * qr + ur * qi;
                final double wi = ui * qi - ur * qr;
                final double gr = ui * qr - ur * qi;
                final double gi = ui * qi + ur * qr;
                // e^{2i phi} y and e^{-2i phi} x
                final double pr = vr * yr - vi * yi;
                final double pi = vr * yi + vi * yr;
                final double nr = vr * xr + vi * xi;
                final double ni = vr * xi - vi * xr;
                fRe[ip] = c2 * xr + s2 * pr + sa * wr;
                fIm[ip] = c2 * xi + s2 * pi + sa * wi;
                final double y2r = s2 * nr + c2 * yr + sa * gr;
                final double y2i = s2 * ni + c2 * yi + sa * gi;
                fRe[in] = y2r;
                fIm[in] = -y2i;
                // -(i/2) u* x + (i/2) u y
                final double h = 0.5 * sa;
                zRe[z + k] = h * ((ui * -xr + ur * xi) + (-ui * yr - ur * yi)) + ca * qr;
                zIm[z + k] = h * ((-ui * xi - ur * xr) + (ur * yr - ui * yi)) + ca * qi;
            }
        }
    }

    /** k = 0, where F&minus;<sub>0</sub> = conj F+<sub>0</sub> and Z<sub>0</sub> is real. */
    private void rfZero(int c, int z, double c2, double s2, double sa, double ca,
                        double ur, double ui, double vr, double vi) {
        final double xr = fRe[c];
        final double xi = fIm[c];
        final double qr = zRe[z];
        final double pr = vr * xr + vi * xi;
        final double pi = vi * xr - vr * xi;
        fRe[c] = c2 * xr + s2 * pr + sa * ui * qr;
        fIm[c] = c2 * xi + s2 * pi - sa * ur * qr;
        zRe[z] = sa * (ur * xi - ui * xr) + ca * qr;
        zIm[z] = 0.0;
    }
}
