package org.echotrellis.fit.spectrum;

import java.util.Arrays;

/**
 * Non-negative least squares, min ‖A·x − y‖² + μ‖x‖² subject to x ≥ 0, by the active-set
 * algorithm of Lawson &amp; Hanson ("Solving Least Squares Problems", Prentice-Hall 1974, ch. 23,
 * algorithm NNLS).
 *
 * <p>The solver works on the normal-equation form of the problem — the Gram matrix G = AᵀA and
 * b = Aᵀy — as in the covariance variant of Bro &amp; De Jong ("A fast non-negativity-constrained
 * least squares algorithm", J Chemometrics 11:393, 1997). The main loop, the selection of the
 * largest positive gradient component, and the inner loop with the interpolation step back to
 * the feasible region are Lawson &amp; Hanson's; only the least-squares subproblem on the passive set
 * is solved by Cholesky factorisation of G_PP instead of Householder QR of A_P. A ridge μ ≥ 0
 * added to the diagonal makes this exactly the augmented NNLS of Tikhonov regularisation,
 * [A; √μ·I]·x ≈ [y; 0], whose Gram matrix is AᵀA + μI and whose right-hand side is Aᵀy.
 *
 * <p>Why the normal form: a spectrum fit solves many problems with the same A (eight refocusing
 * angles, then a dozen regularisation weights), so G is computed once per basis and each solve
 * costs O(n·p) per iteration for the gradient and O(p³/6) for the factorisation (p = passive-set
 * size), independent of the number of echoes.
 *
 * <p>Not thread-safe: one instance per thread. Workspaces grow to the largest n seen and are
 * reused; no allocation per solve after the first.
 */
final class Nnls {

    /** Solve finished with the Kuhn–Tucker conditions met. */
    public static final int CONVERGED = 0;
    /** The iteration limit (3n main-loop steps, as suggested by Lawson &amp; Hanson) was reached. */
    public static final int ITERATION_LIMIT = 1;

    /** Relative pivot below which a column is taken as linearly dependent on the passive set. */
    private static final double DEPENDENT = 1e-13;
    /** Gradient tolerance relative to max|b|. */
    private static final double GRADIENT_TOL = 1e-12;

    private int cap;
    private double[] chol = new double[0];   // p×p lower-triangular factor, row-major with stride cap
    private double[] z = new double[0];      // subproblem solution, indexed by passive position
    private double[] w = new double[0];      // gradient b − (G + μI)x
    private int[] passive = new int[0];      // passive-set indices in factor order
    private boolean[] inP = new boolean[0];
    private boolean[] rejected = new boolean[0];
    private double[] gram = new double[0];   // direct-form workspace
    private double[] rhs = new double[0];
    private int p;
    private int iterations;
    private double[] gramRef;   // problem of the current solve
    private double ridgeRef;
    private int gramStride;

    /** Creates a solver; workspaces are sized on first use. */
    public Nnls() { }

    private void ensure(int n) {
        if (n <= cap) {
            return;
        }
        cap = n;
        chol = new double[n * n];
        z = new double[n];
        w = new double[n];
        passive = new int[n];
        inP = new boolean[n];
        rejected = new boolean[n];
    }

    /** @return size of the passive set (non-zero coefficients) of the last solve */
    public int passiveCount() {
        return p;
    }

    /**
     * trace((G_PP + μI)⁻¹) on the passive set of the last solve, from its Cholesky factor:
     * trace(L⁻ᵀL⁻¹) = ‖L⁻¹‖²_F, by forward substitution column by column (p³/6 multiply–adds). Used for
     * the effective degrees of freedom of generalised cross-validation.
     *
     * @return the trace, 0 for an empty passive set
     */
    public double inverseTrace() {
        int n = cap;
        double sum = 0;
        for (int c = 0; c < p; c++) {
            for (int r = c; r < p; r++) {
                double s = r == c ? 1 : 0;
                int rowL = r * n;
                for (int k = c; k < r; k++) {
                    s -= chol[rowL + k] * w[k];
                }
                w[r] = s / chol[rowL + r];
                sum += w[r] * w[r];
            }
        }
        return sum;
    }

    /** @return main-loop iterations of the last solve */
    public int iterations() {
        return iterations;
    }

    /**
     * Direct form: min ‖A·x − y‖², x ≥ 0. Forms AᵀA and Aᵀy in a reused workspace.
     *
     * @param a  m×n matrix, column-major (a[j·m + i] = A_ij); not modified
     * @param m  rows
     * @param n  columns
     * @param y  right-hand side, length ≥ m; not modified
     * @param x  output, length ≥ n; overwritten with the solution
     * @return {@link #CONVERGED} or {@link #ITERATION_LIMIT}
     */
    public int solve(double[] a, int m, int n, double[] y, double[] x) {
        if (gram.length < n * n) {
            gram = new double[n * n];
            rhs = new double[n];
        }
        Gram.fill(a, m, n, gram);
        Gram.project(a, m, n, y, 0, rhs);
        return solve(gram, rhs, n, 0.0, false, x);
    }

    /**
     * Normal form: min ½xᵀ(G + μI)x − bᵀx, x ≥ 0, i.e. min ‖A·x − y‖² + μ‖x‖² with G = AᵀA, b = Aᵀy.
     *
     * @param g     n×n Gram matrix AᵀA, row-major; not modified
     * @param b     Aᵀy, length ≥ n; not modified
     * @param n     number of unknowns
     * @param ridge μ ≥ 0 added to the diagonal (Tikhonov weight)
     * @param warm  if true, {@code x} holds a feasible start (x ≥ 0) whose support seeds the passive
     *              set (used when μ changes a little between solves); if false, x starts at 0
     * @param x     in: start when {@code warm}; out: the solution (length ≥ n)
     * @return {@link #CONVERGED} or {@link #ITERATION_LIMIT}
     */
    public int solve(double[] g, double[] b, int n, double ridge, boolean warm, double[] x) {
        ensure(n);
        gramStride = n;
        p = 0;
        Arrays.fill(inP, 0, n, false);
        Arrays.fill(rejected, 0, n, false);
        double bmax = 0;
        for (int j = 0; j < n; j++) {
            bmax = Math.max(bmax, Math.abs(b[j]));
            if (warm && x[j] > 0) {
                passive[p++] = j;
                inP[j] = true;
            } else {
                x[j] = 0;
            }
        }
        iterations = 0;
        if (bmax == 0) {
            Arrays.fill(x, 0, n, 0.0);
            return CONVERGED;
        }
        double tol = GRADIENT_TOL * bmax;
        if (p > 0) {
            int dep = factor(g, ridge, 0);
            if (dep >= 0) {
                dropFrom(dep, x);      // a warm support need not be independent for this matrix
            }
            if (p > 0) {
                innerLoop(g, b, ridge, x, -1);
            }
        }
        int limit = 3 * n;
        while (true) {
            gradient(g, b, n, ridge, x);
            int t = -1;
            double best = tol;
            for (int j = 0; j < n; j++) {
                if (!inP[j] && !rejected[j] && w[j] > best) {
                    best = w[j];
                    t = j;
                }
            }
            if (t < 0) {
                return CONVERGED;
            }
            if (++iterations > limit) {
                return ITERATION_LIMIT;
            }
            passive[p++] = t;
            inP[t] = true;
            if (factor(g, ridge, p - 1) >= 0 || !innerLoop(g, b, ridge, x, t)) {
                // t is (numerically) dependent on the passive set or its coefficient would not be
                // positive: Lawson & Hanson step 6 — reject it for this main-loop step.
                p--;                 // t was last: factor rows 0 … p−1 stay valid
                inP[t] = false;
                rejected[t] = true;
                continue;
            }
            Arrays.fill(rejected, 0, n, false);
        }
    }

    /**
     * Inner loop of Lawson &amp; Hanson: solve on P; while some z_j ≤ 0, step from x towards z until
     * the first coefficient hits zero, move the zeros out of P and solve again.
     *
     * @param added the index just added to P (its z must be positive at the first solve), or −1
     * @return false if {@code added} ≥ 0 and its first coefficient is not positive (x unchanged)
     */
    private boolean innerLoop(double[] g, double[] b, double ridge, double[] x, int added) {
        substitute(b);
        if (added >= 0 && z[p - 1] <= 0) {
            return false;
        }
        for (int guard = 0; guard < 3 * cap + 3; guard++) {
            double alpha = 2;
            int hit = -1;
            for (int q = 0; q < p; q++) {
                if (z[q] <= 0) {
                    double xj = x[passive[q]];
                    double a = xj / (xj - z[q]);
                    if (a < alpha) {
                        alpha = a;
                        hit = q;
                    }
                }
            }
            if (hit < 0) {
                for (int q = 0; q < p; q++) {
                    x[passive[q]] = z[q];
                }
                return true;
            }
            int keep = 0;
            for (int q = 0; q < p; q++) {
                int j = passive[q];
                double v = x[j] + alpha * (z[q] - x[j]);
                if (q == hit || v <= 0) {
                    x[j] = 0;
                    inP[j] = false;
                } else {
                    x[j] = v;
                    passive[keep++] = j;
                }
            }
            p = keep;
            int dep = factor(g, ridge, 0);
            if (dep >= 0) {
                dropFrom(dep, x);
            }
            substitute(b);
        }
        for (int q = 0; q < p; q++) {
            x[passive[q]] = Math.max(z[q], 0);
        }
        return true;
    }

    /** Drops passive positions from {@code dep} on that the factorisation found dependent. */
    private void dropFrom(int dep, double[] x) {
        while (dep >= 0) {
            int j = passive[dep];
            x[j] = 0;
            inP[j] = false;
            System.arraycopy(passive, dep + 1, passive, dep, p - dep - 1);
            p--;
            dep = factorRows(dep);
        }
    }

    private int factor(double[] g, double ridge, int fromRow) {
        gramRef = g;
        ridgeRef = ridge;
        return factorRows(fromRow);
    }

    /**
     * Cholesky rows fromRow … p−1 of (G + μI)_PP = L·Lᵀ, rows before {@code fromRow} being valid.
     *
     * @return the first row found dependent (pivot ≤ {@link #DEPENDENT}·diagonal), or −1
     */
    private int factorRows(int fromRow) {
        double[] g = gramRef;
        int n = cap;
        for (int r = fromRow; r < p; r++) {
            int jr = passive[r];
            int rowG = jr * gramStride;
            int rowL = r * n;
            for (int c = 0; c < r; c++) {
                double s = g[rowG + passive[c]];
                int rowC = c * n;
                for (int k = 0; k < c; k++) {
                    s -= chol[rowL + k] * chol[rowC + k];
                }
                chol[rowL + c] = s / chol[rowC + c];
            }
            double diag = g[rowG + jr] + ridgeRef;
            double d = diag;
            for (int k = 0; k < r; k++) {
                d -= chol[rowL + k] * chol[rowL + k];
            }
            if (!(d > DEPENDENT * diag)) {
                return r;
            }
            chol[rowL + r] = Math.sqrt(d);
        }
        return -1;
    }

    /** Solves L·Lᵀ·z = b_P into {@code z}. */
    private void substitute(double[] b) {
        int n = cap;
        for (int r = 0; r < p; r++) {
            double s = b[passive[r]];
            int rowL = r * n;
            for (int k = 0; k < r; k++) {
                s -= chol[rowL + k] * z[k];
            }
            z[r] = s / chol[rowL + r];
        }
        for (int r = p - 1; r >= 0; r--) {
            double s = z[r];
            for (int k = r + 1; k < p; k++) {
                s -= chol[k * n + r] * z[k];
            }
            z[r] = s / chol[r * n + r];
        }
    }

    /** w = b − (G + μI)·x, using only the non-zero (passive) entries of x. */
    private void gradient(double[] g, double[] b, int n, double ridge, double[] x) {
        for (int j = 0; j < n; j++) {
            double s = b[j] - ridge * x[j];
            int row = j * n;
            for (int q = 0; q < p; q++) {
                int k = passive[q];
                s -= g[row + k] * x[k];
            }
            w[j] = s;
        }
    }
}
