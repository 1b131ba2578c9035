package org.echotrellis.pathway;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.echotrellis.Checks;

/**
 * Finds the largest individual coherence pathways of one echo by a pruned best-first search.
 *
 * <p>A pathway is a sequence of states F<sub>k</sub> / Z<sub>k</sub> (see {@link PeriodModel}), one per
 * period, from a source (the equilibrium magnetization or T1 regrowth in a period) to F<sub>0</sub> at
 * the echo. Its amplitude is the source value carried through the transitions of each pulse and the
 * relaxation of each period. The transitions are the entries of the RF operator of Weigel (J Magn
 * Reson Imaging 41:266, 2015), written for (M+, Mz) with M&minus; = conj M+:
 * <pre>
 *   F_k -> F_k    c2 x                 F_k -> F_-k   e^{2i phi} s2 conj(x)
 *   F_k -> Z_k    -(i/2) e^{-i phi} sa x   F_k -> Z_-k   (i/2) e^{i phi} sa conj(x)
 *   Z_k -> F_k    -i e^{i phi} sa x        Z_k -> Z_k    ca x
 * </pre>
 * (at k = 0 the two transitions into the same state merge). The map is real-linear, so the
 * pathway amplitudes add up exactly to the echo.
 *
 * <p>Search: every partial pathway is ranked by |amplitude so far| times an upper bound on the gain
 * still possible to the echo ({@link PeriodModel#gainBounds()}); the one with the highest bound is
 * extended first. A complete pathway taken from the queue is therefore at least as large as every
 * pathway not yet found, so pathways come out in decreasing magnitude. Partial pathways whose bound
 * falls below the amplitude threshold are dropped; a cap on stored partial pathways bounds memory.
 */
public final class PathwaySearch {
    /**
     * Search limits.
     *
     * @param top number of pathways wanted (1..10000)
     * @param minAmplitude pathways smaller than this (units of M0) are not followed (&ge; 0)
     * @param maxEntries cap on stored partial pathways (memory bound)
     */
    public record Limits(int top, double minAmplitude, int maxEntries) {
        /**
         * Validates the limits.
         *
         * @param top number of pathways wanted (1..10000)
         * @param minAmplitude pathways smaller than this (units of M0) are not followed (&ge; 0)
         * @param maxEntries cap on stored partial pathways (memory bound)
         * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
         */
        public Limits {
            Checks.inRange("top", top, 1, 10_000, null);
            Checks.inRange("min_amplitude", minAmplitude, 0, 1, null);
            Checks.inRange("max_entries", maxEntries, 16, 50_000_000, null);
        }

        /**
         * @param top number of pathways wanted
         * @return limits without an amplitude threshold (the search still only extends partial
         *     pathways that can beat the K-th largest) and a cap of 2 million partial pathways (about 90 MB)
         */
        public static Limits of(int top) {
            return new Limits(top, 0.0, 2_000_000);
        }
    }

    private PeriodModel pm;
    private double[][] bound;
    private int[] parent = new int[1024];
    private int[] node = new int[1024];
    private int[] pulse = new int[1024];
    private int[] cls = new int[1024];
    private double[] vre = new double[1024];
    private double[] vim = new double[1024];
    private int used;
    private final BoundHeap heap = new BoundHeap();
    private double threshold;

    /** Creates a search with empty workspaces (reusable, not thread-safe). */
    PathwaySearch() { }

    /**
     * @param s the event list
     * @param echo echo index, 0-based
     * @param t1Ms T1 in ms (+Infinity allowed)
     * @param t2Ms T2 in ms (+Infinity allowed)
     * @param b1 flip-angle scale
     * @param limits search limits
     * @return the largest pathways of that echo and the unexplained rest
     */
    TopPathways find(Schedule s, int echo, double t1Ms, double t2Ms, double b1, Limits limits) {
        Checks.inRange("echo", echo + 1, 1, s.echoCount(), null);
        ClassDecomposition d = new ClassTracker().decompose(s, t1Ms, t2Ms, b1);
        return find(s, echo, t1Ms, t2Ms, b1, limits, d.echoRe(echo), d.echoIm(echo));
    }

    /**
     * As {@link #find(Schedule, int, double, double, double, Limits)}, with the echo already known
     * (from a class decomposition of the same schedule and tissue).
     *
     * @param ar real part of the echo
     * @param ai imaginary part of the echo
     */
    TopPathways find(Schedule s, int echo, double t1Ms, double t2Ms, double b1, Limits limits, double ar, double ai) {
        Checks.inRange("echo", echo + 1, 1, s.echoCount(), null);
        pm = new PeriodModel(s, echo, t1Ms, t2Ms, b1);
        bound = pm.gainBounds();
        threshold = limits.minAmplitude();
        used = 0;
        heap.clear();
        for (int q = 1; q <= pm.last; q++) {
            double v = pm.regrowth[q - 1];
            if (v != 0) {
                expand(-q, q, pm.zNode(0), v, 0.0, 0);
            }
        }
        List<Pathway> found = new ArrayList<>();
        double a2 = ar * ar + ai * ai;
        double restRe = ar;
        double restIm = ai;
        boolean complete = true;
        while (heap.size() > 0 && found.size() < limits.top()) {
            if (used >= limits.maxEntries()) {
                complete = false;
                break;
            }
            int e = heap.pop();
            if (pulse[e] == pm.last) {
                double pr = vre[e] * pm.echoE2;
                double pi = vim[e] * pm.echoE2;
                double share = a2 > 0 ? (pr * ar + pi * ai) / a2 : Double.NaN;
                found.add(new Pathway(notation(e), pr, pi, share, cls[e]));
                restRe -= pr;
                restIm -= pi;
            } else {
                propagate(e);
            }
        }
        double restShare = a2 > 0 ? (restRe * ar + restIm * ai) / a2 : Double.NaN;
        return new TopPathways(echo, ar, ai, found, restRe, restIm, restShare, complete);
    }

    /** Carries entry e through its period and applies the next pulse. */
    private void propagate(int e) {
        int q = pulse[e];
        int n = node[e];
        int k = pm.orderOf(n);
        double xr = vre[e];
        double xi = vim[e];
        int c = cls[e];
        if (pm.isZ(n)) {
            xr *= pm.e1[q];
            xi *= pm.e1[q];
            if (k != 0 && pm.timed[q]) {
                c++;
            }
            expand(e, q + 1, pm.zNode(k), xr, xi, c);
        } else {
            int m = k + pm.dephasing[q];
            if (Math.abs(m) <= pm.order) {
                expand(e, q + 1, pm.fNode(m), xr * pm.e2[q], xi * pm.e2[q], c);
            }
        }
    }

    /**
     * Applies pulse q to a pathway at {@code from} (the state at the end of period q&minus;1) with
     * value x and stores the children worth following.
     *
     * @param par parent entry, or &minus;(source period + 1) for a source
     */
    private void expand(int par, int q, int from, double xr, double xi, int c) {
        int k = pm.orderOf(from);
        double c2 = pm.c2[q];
        double s2 = pm.s2[q];
        double sa = pm.sa[q];
        double ur = pm.ur[q];
        double ui = pm.ui[q];
        if (pm.isZ(from)) {
            // -i u sa x and ca x
            add(par, q, pm.fNode(k), sa * (ur * xi + ui * xr), sa * (ui * xi - ur * xr), c);
            add(par, q, from, pm.ca[q] * xr, pm.ca[q] * xi, c);
            return;
        }
        double vr = ur * ur - ui * ui;
        double vi = 2 * ur * ui;
        // v s2 conj(x)
        double yr = s2 * (vr * xr + vi * xi);
        double yi = s2 * (vi * xr - vr * xi);
        // -(i/2) conj(u) sa x  and  (i/2) u sa conj(x)
        double h = 0.5 * sa;
        double ar = h * (ur * xi - ui * xr);
        double ai = -h * (ur * xr + ui * xi);
        double br = h * (ur * xi - ui * xr);
        double bi = h * (ur * xr + ui * xi);
        if (k == 0) {
            add(par, q, from, c2 * xr + yr, c2 * xi + yi, c);
            add(par, q, pm.zNode(0), ar + br, ai + bi, c);
        } else {
            add(par, q, from, c2 * xr, c2 * xi, c);
            add(par, q, pm.fNode(-k), yr, yi, c);
            add(par, q, pm.zNode(k), ar, ai, c);
            add(par, q, pm.zNode(-k), br, bi, c);
        }
    }

    private void add(int par, int q, int n, double re, double im, int c) {
        double b = Math.hypot(re, im) * bound[q][n];
        if (!(b > 0) || b < threshold) {
            return;
        }
        if (used == parent.length) {
            grow();
        }
        parent[used] = par;
        node[used] = n;
        pulse[used] = q;
        cls[used] = c;
        vre[used] = re;
        vim[used] = im;
        heap.push(b, used);
        used++;
    }

    private void grow() {
        int n = parent.length * 2;
        parent = Arrays.copyOf(parent, n);
        node = Arrays.copyOf(node, n);
        pulse = Arrays.copyOf(pulse, n);
        cls = Arrays.copyOf(cls, n);
        vre = Arrays.copyOf(vre, n);
        vim = Arrays.copyOf(vim, n);
    }

    private String notation(int e) {
        List<String> tokens = new ArrayList<>();
        int i = e;
        int origin;
        while (true) {
            tokens.add(StateNotation.token(pm.isZ(node[i]), pm.orderOf(node[i])));
            if (parent[i] < 0) {
                origin = -parent[i] - 1;
                break;
            }
            i = parent[i];
        }
        tokens.add(StateNotation.origin(origin));
        java.util.Collections.reverse(tokens);
        return StateNotation.join(tokens);
    }
}
