package org.echotrellis.fit;

/**
 * A coarse dictionary of unit-norm model trains over a (T2, B1) grid, shared read-only by all
 * threads, giving robust starting values: the atom with the largest (ĝ·y)² is the least-squares
 * best on the grid for a free amplitude. T2 is log-spaced (ratio about 1.3 per step) over the
 * bounds, B1 evenly spaced over [b1Min, effective b1Max] (about 0.1 per step where the train is
 * folded, 0.05 otherwise: with slice profiles the train is not symmetric about B1 = 1 and the
 * misfit has a basin on each side, METHODS §10). Each atom also stores its derivatives (with
 * respect to ln T2 and B1, same scaling), so a start is refined by one Gauss–Newton step of the
 * amplitude-projected problem without another model evaluation.
 *
 * <p>{@link #candidates} returns the best local maxima of (ĝ·y)² over the whole grid (both sides
 * of B1 = 1), so the fit can refine every basin whose misfit is close to the best.
 */
final class StartDictionary {
    private final int nT2;
    private final int nB1;
    private final int echoes;
    private final double[] t2;
    private final double[] b1;
    private final double[] atoms;  // [(ib*nT2 + it)*echoes + n]
    private final double[] byEcho; // the same unit atoms, [n*size() + ib*nT2 + it], for the scan
    private final double[] atomsT; // derivative with respect to ln T2, same layout and scale
    private final double[] atomsB; // derivative with respect to B1
    private final double lnT2Lo;
    private final double lnT2Hi;
    private final double b1Lo;
    private final double b1Hi;

    /** Most starting candidates returned. */
    static final int MAX_CANDIDATES = 3;

    /** B1 separating the two basins of an unfolded train (180° / nominal refocusing), NaN when folded. */
    private final double split;

    StartDictionary(FitSettings s, TrainSurface surface) {
        double lo = s.t2MinMs();
        double hi = s.t2MaxMs();
        nT2 = Math.max(4, (int) Math.ceil(Math.log(hi / lo) / Math.log(1.3)) + 1);
        b1Lo = s.b1Min();
        b1Hi = s.effectiveB1Max();
        lnT2Lo = Math.log(lo);
        lnT2Hi = Math.log(hi);
        double stepB1 = s.foldActive() ? 0.1 : 0.05;
        double maxRef = 0;
        for (int i = 0; i < s.train().echoes(); i++) {
            maxRef = Math.max(maxRef, s.train().refocusFlipDeg(i));
        }
        split = s.foldActive() || !(maxRef > 0) ? Double.NaN : 180.0 / maxRef;
        nB1 = Math.max(2, (int) Math.ceil((b1Hi - b1Lo) / stepB1) + 1);
        echoes = s.train().echoes();
        t2 = new double[nT2];
        b1 = new double[nB1];
        for (int i = 0; i < nT2; i++) {
            t2[i] = lo * Math.pow(hi / lo, i / (double) (nT2 - 1));
        }
        for (int j = 0; j < nB1; j++) {
            b1[j] = b1Lo + (b1Hi - b1Lo) * j / (nB1 - 1);
        }
        atoms = new double[nT2 * nB1 * echoes];
        atomsT = new double[atoms.length];
        byEcho = new double[atoms.length];
        atomsB = new double[atoms.length];
        EpgSignal sig = new EpgSignal(s, surface);
        double[] g = new double[echoes];
        double[] d1 = new double[echoes];
        double[] d2 = new double[echoes];
        for (int j = 0; j < nB1; j++) {
            for (int i = 0; i < nT2; i++) {
                sig.evaluate(t2[i], b1[j], g, d1, d2);
                double norm = 0;
                for (double v : g) {
                    norm += v * v;
                }
                double inv = norm > 0 ? 1 / Math.sqrt(norm) : 0;
                int o = (j * nT2 + i) * echoes;
                for (int n = 0; n < echoes; n++) {
                    atoms[o + n] = g[n] * inv;
                    byEcho[n * nT2 * nB1 + j * nT2 + i] = g[n] * inv;
                    atomsT[o + n] = d1[n] * inv;
                    atomsB[o + n] = d2[n] * inv;
                }
            }
        }
    }

    /** @return number of atoms */
    int size() {
        return nT2 * nB1;
    }

    /**
     * Starting candidates for a decay: the local maxima of (ĝ·y)² on the grid (8-neighbourhood), best
     * first, each refined by one Gauss–Newton step.
     *
     * @param y data at y[off .. off+echoes); not modified
     * @param off offset
     * @param fixedB1 B1 to use (the nearest grid row is searched), or NaN to search all rows
     * @param work scratch of length ≥ {@link #size()}; modified
     * @param starts receives {T2, B1} per candidate at [2k, 2k+1], length ≥ 2·{@link #MAX_CANDIDATES}; modified
     * @param misfits receives the grid misfit ‖y‖² − (ĝ·y)² per candidate, length ≥ {@link #MAX_CANDIDATES}; modified
     * @param best scratch of length ≥ {@link #MAX_CANDIDATES}; modified
     * @return number of candidates (≥ 1)
     */
    int candidates(double[] y, int off, double fixedB1, double[] work, double[] starts, double[] misfits, int[] best) {
        int j0 = 0;
        int j1 = nB1;
        if (!Double.isNaN(fixedB1)) {
            int j = 0;
            for (int k = 1; k < nB1; k++) {
                if (Math.abs(b1[k] - fixedB1) < Math.abs(b1[j] - fixedB1)) {
                    j = k;
                }
            }
            j0 = j;
            j1 = j + 1;
        }
        // Scan with the atoms innermost (no reduction in the inner loop, so it vectorises):
        // work[a] = ĝ_a·y, then the local maxima of (ĝ_a·y)² with ĝ_a·y > 0.
        final int size = nT2 * nB1;
        final int a0 = j0 * nT2;
        final int a1 = j1 * nT2;
        java.util.Arrays.fill(work, a0, a1, 0.0);
        double yy = 0;
        for (int n = 0; n < echoes; n++) {
            final double yn = y[off + n];
            yy += yn * yn;
            final int base = n * size;
            for (int a = a0; a < a1; a++) {
                work[a] += byEcho[base + a] * yn;
            }
        }
        int count = 0;
        double[] score = misfits;
        if (!Double.isNaN(split) && Double.isNaN(fixedB1)) {
            // both basins, always: the best atom below and the best at or above the split
            int lo = -1;
            int hi = -1;
            for (int a = a0; a < a1; a++) {
                double d = work[a];
                if (!(d > 0)) {
                    continue;
                }
                if (b1[a / nT2] < split) {
                    lo = lo < 0 || d > work[lo] ? a : lo;
                } else {
                    hi = hi < 0 || d > work[hi] ? a : hi;
                }
            }
            if (lo >= 0) {
                best[count] = lo;
                score[count++] = work[lo] * work[lo];
            }
            if (hi >= 0) {
                best[count] = hi;
                score[count++] = work[hi] * work[hi];
            }
            if (count == 2 && score[1] > score[0]) {
                int t = best[0];
                best[0] = best[1];
                best[1] = t;
                double u = score[0];
                score[0] = score[1];
                score[1] = u;
            }
        }
        for (int a = a0; a < a1 && !(!Double.isNaN(split) && Double.isNaN(fixedB1)); a++) {
            double d = work[a];
            if (!(d > 0)) {
                continue;
            }
            double sc = d * d;
            if (count == MAX_CANDIDATES && sc <= score[count - 1]) {
                continue;
            }
            if (!localMaximum(work, a, j0, j1, d)) {
                continue;
            }
            int k = Math.min(count, MAX_CANDIDATES - 1);
            while (k > 0 && score[k - 1] < sc) {
                score[k] = score[k - 1];
                best[k] = best[k - 1];
                k--;
            }
            score[k] = sc;
            best[k] = a;
            count = Math.min(MAX_CANDIDATES, count + 1);
        }
        if (count == 0) {
            starts[0] = t2[0];
            starts[1] = Double.isNaN(fixedB1) ? b1[j0] : fixedB1;
            misfits[0] = yy;
            return 1;
        }
        for (int c = 0; c < count; c++) {
            int bi = best[c] % nT2;
            int bj = best[c] / nT2;
            starts[2 * c] = t2[bi];
            starts[2 * c + 1] = Double.isNaN(fixedB1) ? b1[bj] : fixedB1;
            misfits[c] = yy - score[c];
            refine(y, off, (bj * nT2 + bi) * echoes, !Double.isNaN(fixedB1), starts, 2 * c);
        }
        return count;
    }

    /** True if (ĝ_a·y) = d is not below any of its grid neighbours within rows [j0, j1). */
    private boolean localMaximum(double[] work, int a, int j0, int j1, double d) {
        int i = a % nT2;
        int j = a / nT2;
        for (int dj = -1; dj <= 1; dj++) {
            int jj = j + dj;
            if (jj < j0 || jj >= j1) {
                continue;
            }
            for (int di = -1; di <= 1; di++) {
                int ii = i + di;
                if ((di == 0 && dj == 0) || ii < 0 || ii >= nT2) {
                    continue;
                }
                if (work[jj * nT2 + ii] > d) {
                    return false;
                }
            }
        }
        return true;
    }

    /** One Gauss–Newton step on the projected problem from atom at offset o. */
    private void refine(double[] y, int off, int o, boolean b1Fixed, double[] start, int so) {
        double a = 0;
        double gt = 0;
        double gb = 0;
        for (int n = 0; n < echoes; n++) {
            a += atoms[o + n] * y[off + n];
            gt += atoms[o + n] * atomsT[o + n];
            gb += atoms[o + n] * atomsB[o + n];
        }
        double htt = 0;
        double hbb = 0;
        double htb = 0;
        double rt = 0;
        double rb = 0;
        for (int n = 0; n < echoes; n++) {
            double gn = atoms[o + n];
            double r = y[off + n] - a * gn;
            double jt = a * (atomsT[o + n] - gn * gt);
            double jb = a * (atomsB[o + n] - gn * gb);
            htt += jt * jt;
            hbb += jb * jb;
            htb += jt * jb;
            rt += jt * r;
            rb += jb * r;
        }
        double dLn;
        double dB = 0;
        if (b1Fixed) {
            dLn = htt > 0 ? rt / htt : 0;
        } else {
            double det = htt * hbb - htb * htb;
            if (!(det > 1e-12 * htt * hbb)) {
                dLn = htt > 0 ? rt / htt : 0;
            } else {
                dLn = (hbb * rt - htb * rb) / det;
                dB = (htt * rb - htb * rt) / det;
            }
        }
        double stepLn = Math.log(1.3);
        double stepB = (b1Hi - b1Lo) / (nB1 - 1);  // within one grid step of the atom
        dLn = Math.max(-stepLn, Math.min(stepLn, dLn));
        dB = Math.max(-stepB, Math.min(stepB, dB));
        start[so] = Math.exp(Math.max(lnT2Lo, Math.min(lnT2Hi, Math.log(start[so]) + dLn)));
        if (!b1Fixed) {
            start[so + 1] = Math.max(b1Lo, Math.min(b1Hi, start[so + 1] + dB));
        }
    }
}
