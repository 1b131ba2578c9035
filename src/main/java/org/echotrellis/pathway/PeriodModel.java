package org.echotrellis.pathway;

/**
 * A schedule cut at one target echo and condensed to periods, for following individual pathways.
 * Pulse q (1-based) opens period q; period 0 lies before the first pulse. For each period the total
 * dephasing, E1, E2 and the T1 regrowth of Z<sub>0</sub> over it are tabulated; the target echo sits in
 * period {@code last} after {@code echoDephasing} orders and a T2 factor {@code echoE2}.
 *
 * <p>Pathway states: F<sub>k</sub> (the coefficient of e<sup>ik&theta;</sup> in M+ = Mx + iMy, any
 * signed k) and Z<sub>k</sub> (the coefficient of e<sup>ik&theta;</sup> in Mz). Node index: F<sub>k</sub> at
 * k + K, Z<sub>k</sub> at (2K + 1) + k + K.
 */
final class PeriodModel {
    final int last;
    final int order;
    final double[] c2;
    final double[] s2;
    final double[] sa;
    final double[] ca;
    final double[] ur;
    final double[] ui;
    final int[] dephasing;
    final double[] e1;
    final double[] e2;
    final double[] regrowth;
    final boolean[] timed;
    final int echoDephasing;
    final double echoE2;

    PeriodModel(Schedule s, int echo, double t1Ms, double t2Ms, double b1) {
        int target = -1;
        int seen = 0;
        int pulses = 0;
        int sumAbs = 0;
        for (int i = 0; i < s.op.length && target < 0; i++) {
            if (s.op[i] == Schedule.RF) {
                pulses++;
            } else if (s.op[i] == Schedule.INTERVAL) {
                sumAbs += Math.abs((int) s.second[i]);
            } else if (seen++ == echo) {
                target = i;
            }
        }
        last = pulses;
        // states beyond the schedule's largest useful order can never reach an echo
        order = Math.min(sumAbs, s.maxOrder);
        long bytes = 8L * (pulses + 1) * 2 * (2L * order + 1);
        if (bytes > Schedule.MAX_WORKSPACE_BYTES) {
            throw new org.echotrellis.InputException(String.format(java.util.Locale.ROOT,
                    "pathway search up to echo %d needs %d MB (%d pulses x dephasing orders up to %d); the limit is %d MB",
                    echo + 1, bytes >> 20, pulses, order, Schedule.MAX_WORKSPACE_BYTES >> 20));
        }
        int n = pulses + 1;
        c2 = new double[n];
        s2 = new double[n];
        sa = new double[n];
        ca = new double[n];
        ur = new double[n];
        ui = new double[n];
        dephasing = new int[n];
        e1 = new double[n];
        e2 = new double[n];
        regrowth = new double[n];
        timed = new boolean[n];
        double[] durations = new double[n];
        java.util.Arrays.fill(e1, 1.0);
        java.util.Arrays.fill(e2, 1.0);
        int p = 0;
        for (int i = 0; i < target; i++) {
            if (s.op[i] == Schedule.RF) {
                p++;
                double a = s.value[i] * b1;
                c2[p] = Math.cos(0.5 * a) * Math.cos(0.5 * a);
                s2[p] = Math.sin(0.5 * a) * Math.sin(0.5 * a);
                sa[p] = Math.sin(a);
                ca[p] = Math.cos(a);
                ur[p] = Math.cos(s.second[i]);
                ui[p] = Math.sin(s.second[i]);
            } else if (s.op[i] == Schedule.INTERVAL) {
                dephasing[p] += (int) s.second[i];
                durations[p] += s.value[i];
                timed[p] = true;
            }
        }
        for (int q = 0; q < n; q++) {
            e1[q] = Math.exp(-durations[q] / t1Ms);
            e2[q] = Math.exp(-durations[q] / t2Ms);
            regrowth[q] = q == 0 ? 1.0 : 1.0 - e1[q];
        }
        echoDephasing = dephasing[last];
        echoE2 = e2[last];
    }

    int nodes() {
        return 2 * (2 * order + 1);
    }

    int fNode(int k) {
        return k + order;
    }

    int zNode(int k) {
        return 2 * order + 1 + k + order;
    }

    boolean isZ(int node) {
        return node > 2 * order;
    }

    /** @return the signed order k of a node */
    int orderOf(int node) {
        return isZ(node) ? node - (2 * order + 1) - order : node - order;
    }

    /**
     * Upper bounds on |amplitude gain| from a node right after pulse q to the target echo, for
     * q = 1..last: [q][node]. Every pulse coefficient and relaxation factor is at most 1 in
     * magnitude; the two merged k = 0 transitions are bounded by the triangle inequality.
     */
    double[][] gainBounds() {
        int nn = nodes();
        double[][] u = new double[last + 1][nn];
        for (int k = -order; k <= order; k++) {
            if (k + echoDephasing == 0) {
                u[last][fNode(k)] = echoE2;
            }
        }
        for (int q = last - 1; q >= 1; q--) {
            double[] next = u[q + 1];
            int r = q + 1;
            for (int node = 0; node < nn; node++) {
                int k = orderOf(node);
                double best;
                double factor;
                if (isZ(node)) {
                    factor = e1[q];
                    best = Math.max(Math.abs(sa[r]) * next[fNode(k)], Math.abs(ca[r]) * next[zNode(k)]);
                } else {
                    int m = k + dephasing[q];
                    if (Math.abs(m) > order) {
                        continue;
                    }
                    factor = e2[q];
                    if (m == 0) {
                        best = Math.max(next[fNode(0)], Math.abs(sa[r]) * next[zNode(0)]);
                    } else {
                        best = Math.max(Math.max(c2[r] * next[fNode(m)], s2[r] * next[fNode(-m)]),
                                0.5 * Math.abs(sa[r]) * Math.max(next[zNode(m)], next[zNode(-m)]));
                    }
                }
                u[q][node] = factor * best;
            }
        }
        return u;
    }
}
