package org.echotrellis.fit.spectrum;

import java.util.stream.IntStream;

import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.Acquisitions;
import org.echotrellis.fit.TrainSource;
import org.echotrellis.sequence.Protocol;

/**
 * EPG basis matrices of a spectrum fit, built once per refocusing angle and shared read-only by all
 * worker threads: never rebuilt per voxel.
 *
 * <p>Column j of the basis at refocusing angle α is the echo train of the protocol for T2 = T2_j
 * (grid), fixed T1, M0 = 1, as in the stimulated-echo corrected multi-component analysis of
 * Prasloski et al. (MRM 67:1803, 2012). α_ref is the protocol's largest refocusing flip (for a
 * constant train, the refocusing flip itself).
 * <ul>
 *   <li>Ideal-pulse CPMG train (no slice selection, repetition time or diffusion): the EPG CPMG
 *   engine with α/α_ref scaling every refocusing flip; the excitation is kept nominal (with CPMG
 *   timing it only scales the whole train, parity result, METHODS §1).</li>
 *   <li>Any other acquisition: the protocol's whole acquisition model (slice profile at the actual
 *   B1, steady state, diffusion) at B1 = α/α_ref, which scales every pulse of the acquisition; α is
 *   then the refocusing angle at the slice centre.</li>
 * </ul>
 *
 * <p>Two sets are cached: the exact bases (and Gram matrices AᵀA) at the search angles, and a table
 * every {@value #TABLE_STEP_DEG}° over the search range, from which the basis at the refined angle
 * is interpolated linearly (error ≈ h²/8·∂²A/∂α² ≈ 1e-5 of the signal for h = 0.5°).
 * Memory: (count + table) · echoes · bins doubles, and for ideal pulses 2 · table · bins² more for
 * the node Gram matrices that make the interpolated AᵀA cheap.
 */
public final class BasisCache {

    /** Angle step of the interpolation table in degrees (ideal-pulse bases, linear interpolation). */
    public static final double TABLE_STEP_DEG = 0.5;
    /**
     * Angle step of the table of whole-acquisition bases in degrees, interpolated by 4-point cubic
     * Lagrange (each of these bases costs a slice integral per T2 bin; the error of the cubic,
     * h⁴/24·|∂⁴A/∂α⁴| at most, stays below 1e-5 of the signal for these smooth trains).
     */
    public static final double TABLE_STEP_SLICE_DEG = 2.0;

    private static final int LANES = 8;

    private final int echoes;
    private final T2Grid grid;
    private final RefocusSearch search;
    private final double[][] searchBasis;
    private final double[][] searchGram;
    private final double tableLoDeg;
    private final double tableStepDeg;
    private final double[][] table;
    private double referenceDeg;
    private boolean symmetric;
    private boolean cubic;
    /** Linear tables only: AᵀA at every node and the symmetrised cross products A_sᵀA_{s+1}. */
    private double[][] tableGram = new double[0][];
    private double[][] tableCross = new double[0][];

    private BasisCache(int echoes, T2Grid grid, RefocusSearch search, double[][] searchBasis,
                       double[][] searchGram, double tableLoDeg, double tableStepDeg, double[][] table) {
        this.echoes = echoes;
        this.grid = grid;
        this.search = search;
        this.searchBasis = searchBasis;
        this.searchGram = searchGram;
        this.tableLoDeg = tableLoDeg;
        this.tableStepDeg = tableStepDeg;
        this.table = table;
    }

    /**
     * Builds the cache for a protocol's acquisition.
     *
     * @param protocol the acquisition (must be a CPMG train)
     * @param t1Ms   fixed T1 of the basis in ms
     * @param grid   T2 grid
     * @param search refocusing angles (a fixed angle gives one basis and no table)
     * @return the cache
     */
    public static BasisCache build(Protocol protocol, double t1Ms, T2Grid grid, RefocusSearch search) {
        CpmgTrain train = protocol.cpmg().orElseThrow(() -> new org.echotrellis.InputException(
                "the protocol's echo train is not CPMG-phased (refocusing phase = excitation phase ± 90°); "
                        + "spectrum fitting needs a CPMG train"));
        double ref = 0;
        for (int i = 0; i < train.echoes(); i++) {
            ref = Math.max(ref, train.refocusFlipDeg(i));
        }
        TrainSource source = Acquisitions.plainCpmg(protocol) || !(ref > 0) ? null
                : new TrainSource(protocol, t1Ms, search.hiDeg() / ref * 1.01);
        return build(train, source, t1Ms, grid, search);
    }

    /**
     * Builds the cache for an ideal-pulse CPMG train.
     *
     * @param train  the CPMG train (must be CPMG-phased)
     * @param t1Ms   fixed T1 of the basis in ms
     * @param grid   T2 grid
     * @param search refocusing angles
     * @return the cache
     */
    static BasisCache build(CpmgTrain train, double t1Ms, T2Grid grid, RefocusSearch search) {
        return build(train, null, t1Ms, grid, search);
    }

    private static BasisCache build(CpmgTrain train, TrainSource source, double t1Ms, T2Grid grid,
                                    RefocusSearch search) {
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.require(train.isCpmgPhased(),
                "the protocol's echo train is not CPMG-phased (refocusing phase = excitation phase ± 90°); "
                        + "spectrum fitting needs a CPMG train");
        double ref = 0;
        for (int i = 0; i < train.echoes(); i++) {
            ref = Math.max(ref, train.refocusFlipDeg(i));
        }
        Checks.require(ref > 0, "the protocol's refocusing flips are all 0°");
        Checks.require(Math.abs(Math.sin(Math.toRadians(train.excitationFlipDeg()))) > 1e-6,
                "the protocol's excitation flip " + train.excitationFlipDeg()
                        + "° tips no magnetisation into the transverse plane; spectrum fitting needs an excitation "
                        + "between 0° and 180° (exclusive), e.g. 90°");
        final double refDeg = ref;
        ThreadLocal<Builder> builders = ThreadLocal.withInitial(() -> new Builder(train, t1Ms, grid, refDeg));
        int m = train.echoes();
        int n = grid.bins();
        double[][] basis = new double[search.count()][];
        double[][] gram = new double[search.count()][];
        IntStream.range(0, search.count()).parallel().forEach(k -> {
            basis[k] = basisAt(builders.get(), source, grid, refDeg, search.angleDeg(k));
            gram[k] = new double[n * n];
            Gram.fill(basis[k], m, n, gram[k]);
        });
        double[][] table = new double[0][];
        double wanted = source == null ? TABLE_STEP_DEG : TABLE_STEP_SLICE_DEG;
        double step = wanted;
        if (!search.isFixed()) {
            int steps = Math.max(3, (int) Math.ceil((search.hiDeg() - search.loDeg()) / wanted - 1e-9));
            final double h = (search.hiDeg() - search.loDeg()) / steps;
            step = h;
            double[][] tab = new double[steps + 1][];
            IntStream.rangeClosed(0, steps).parallel().forEach(s ->
                    tab[s] = basisAt(builders.get(), source, grid, refDeg, search.loDeg() + s * h));
            table = tab;
        }
        BasisCache c = new BasisCache(m, grid, search, basis, gram, search.loDeg(), step, table);
        c.referenceDeg = ref;
        c.symmetric = source == null;
        c.cubic = source != null;
        if (!c.cubic && table.length > 1) {
            c.tableGram = new double[table.length][];
            c.tableCross = new double[table.length - 1][];
            final double[][] tb = table;
            IntStream.range(0, table.length).parallel().forEach(k -> {
                c.tableGram[k] = new double[n * n];
                Gram.fill(tb[k], m, n, c.tableGram[k]);
                if (k + 1 < tb.length) {
                    double[] x = new double[n * n];
                    for (int j = 0; j < n; j++) {
                        for (int l = 0; l < n; l++) {
                            double sum = 0;
                            for (int i = 0; i < m; i++) {
                                sum += tb[k][j * m + i] * tb[k + 1][l * m + i];
                            }
                            x[j * n + l] = sum;
                        }
                    }
                    for (int j = 0; j < n; j++) {
                        for (int l = 0; l < j; l++) {
                            double sym = 0.5 * (x[j * n + l] + x[l * n + j]);
                            x[j * n + l] = sym;
                            x[l * n + j] = sym;
                        }
                    }
                    c.tableCross[k] = x;
                }
            });
        }
        return c;
    }

    /** @return the reference refocusing flip α_ref in degrees (the protocol's largest): angle = B1·α_ref */
    public double referenceDeg() {
        return referenceDeg;
    }

    /**
     * @return true for the ideal-pulse CPMG basis, whose magnitude trains at α and 360° − α agree,
     *         so a B1 above 180°/α_ref is folded
     */
    public boolean symmetric() {
        return symmetric;
    }

    /** The basis at one angle: the exact CPMG builder, or the whole acquisition at B1 = α/α_ref. */
    private static double[] basisAt(Builder b, TrainSource source, T2Grid grid, double refDeg, double angleDeg) {
        if (source == null) {
            return b.basis(angleDeg);
        }
        double[] t2 = grid.t2Ms();
        double[] a = new double[source.echoes() * t2.length];
        double[] im = new double[a.length];
        source.row(t2, angleDeg / refDeg, a, im);
        for (int i = 0; i < a.length; i++) {
            a[i] = Math.hypot(a[i], im[i]);
        }
        return a;
    }

    /** Simulates basis columns through the EPG engine, {@value #LANES} T2 values at a time. */
    private static final class Builder {
        private final CpmgTrain train;
        private final double[] flips;
        private final double refDeg;
        private final double[] t1;
        private final double[] t2;
        private final double[] b1;
        private final double[] out;
        private final double[] gridT2;
        private final CpmgEngine engine = new CpmgEngine(LANES);

        Builder(CpmgTrain train, double t1Ms, T2Grid grid, double refDeg) {
            this.train = train;
            this.flips = train.refocusFlipsDeg();
            this.refDeg = refDeg;
            this.t1 = new double[LANES];
            java.util.Arrays.fill(t1, t1Ms);
            this.t2 = new double[LANES];
            this.b1 = new double[LANES];
            java.util.Arrays.fill(b1, 1.0);
            this.out = new double[LANES * train.echoes()];
            this.gridT2 = grid.t2Ms();
        }

        double[] basis(double angleDeg) {
            double scale = angleDeg / refDeg;
            double[] scaled = new double[flips.length];
            for (int i = 0; i < flips.length; i++) {
                scaled[i] = Math.min(360, flips[i] * scale);
            }
            CpmgTrain t = train.withRefocusFlipsDeg(scaled);
            int m = train.echoes();
            double[] a = new double[m * gridT2.length];
            for (int j0 = 0; j0 < gridT2.length; j0 += LANES) {
                int count = Math.min(LANES, gridT2.length - j0);
                System.arraycopy(gridT2, j0, t2, 0, count);
                engine.run(t, t1, t2, b1, count, out);
                for (int l = 0; l < count; l++) {
                    for (int e = 0; e < m; e++) {
                        a[(j0 + l) * m + e] = Math.abs(out[l * m + e]);
                    }
                }
            }
            return a;
        }
    }

    /** @return echoes per decay (rows of every basis) */
    public int echoes() {
        return echoes;
    }

    /** @return the T2 grid (columns of every basis) */
    public T2Grid grid() {
        return grid;
    }

    /** @return the refocusing angles of the search */
    public RefocusSearch search() {
        return search;
    }

    /** Basis k of the search, column-major; shared, callers must not modify. */
    double[] searchBasis(int k) {
        return searchBasis[k];
    }

    /** Gram matrix of search basis k, row-major; shared, callers must not modify. */
    double[] searchGram(int k) {
        return searchGram[k];
    }

    /**
     * Basis at an angle inside the search range, linearly interpolated in the table.
     *
     * @param angleDeg refocusing angle in degrees, clamped to the search range
     * @param out      echoes × bins, column-major; overwritten
     */
    void basisAt(double angleDeg, double[] out) {
        int len = echoes * grid.bins();
        if (table.length == 0) {
            System.arraycopy(searchBasis[0], 0, out, 0, len);
            return;
        }
        double u = (angleDeg - tableLoDeg) / tableStepDeg;
        u = Math.max(0, Math.min(table.length - 1, u));
        if (cubic) {
            // 4-point Lagrange on nodes s-1 .. s+2, the window shifted inwards at the ends
            int s = Math.max(1, Math.min(table.length - 3, (int) u));
            double t = u - s;
            double w0 = -t * (t - 1) * (t - 2) / 6;
            double w1 = (t + 1) * (t - 1) * (t - 2) / 2;
            double w2 = -(t + 1) * t * (t - 2) / 2;
            double w3 = (t + 1) * t * (t - 1) / 6;
            double[] a0 = table[s - 1];
            double[] a1 = table[s];
            double[] a2 = table[s + 1];
            double[] a3 = table[s + 2];
            for (int i = 0; i < len; i++) {
                out[i] = w0 * a0[i] + w1 * a1[i] + w2 * a2[i] + w3 * a3[i];
            }
            return;
        }
        int s = Math.min(table.length - 2, (int) u);
        double t = u - s;
        double[] a0 = table[s];
        double[] a1 = table[s + 1];
        for (int i = 0; i < len; i++) {
            out[i] = a0[i] + t * (a1[i] - a0[i]);
        }
    }

    /**
     * AᵀA of the basis at an angle, as {@link #basisAt} interpolates it: for the linear table exactly
     * (1−t)²G_s + 2t(1−t)·sym(A_sᵀA_{s+1}) + t²G_{s+1} from the node products (3n² operations
     * instead of m·n²/2), otherwise computed from the interpolated basis.
     *
     * @param angleDeg refocusing angle in degrees
     * @param basis the basis of {@link #basisAt} at that angle
     * @param out n×n; overwritten
     */
    void gramAt(double angleDeg, double[] basis, double[] out) {
        int n = grid.bins();
        if (tableGram.length == 0) {
            Gram.fill(basis, echoes, n, out);
            return;
        }
        double u = (angleDeg - tableLoDeg) / tableStepDeg;
        u = Math.max(0, Math.min(table.length - 1, u));
        int s = Math.min(table.length - 2, (int) u);
        double t = u - s;
        double w0 = (1 - t) * (1 - t);
        double w1 = 2 * t * (1 - t);
        double w2 = t * t;
        double[] g0 = tableGram[s];
        double[] c = tableCross[s];
        double[] g1 = tableGram[s + 1];
        for (int i = 0; i < n * n; i++) {
            out[i] = w0 * g0[i] + w1 * c[i] + w2 * g1[i];
        }
    }

    /**
     * Copy of the basis at an angle (for plots and tests).
     *
     * @param angleDeg refocusing angle in degrees (clamped to the search range)
     * @return echoes × bins, column-major (a[j·echoes + i] = echo i+1 of bin j)
     */
    double[] basis(double angleDeg) {
        double[] out = new double[echoes * grid.bins()];
        basisAt(angleDeg, out);
        return out;
    }
}
