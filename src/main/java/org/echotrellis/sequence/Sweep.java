package org.echotrellis.sequence;

import java.util.Optional;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.function.IntConsumer;
import java.util.stream.IntStream;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.epg.EpgProgram;
import org.echotrellis.epg.GeneralEngine;

/**
 * Echo magnitudes of one protocol over many (T1, T2, B1) points — a dictionary — using all cores and
 * lock-step lanes: each worker thread owns one engine and fills blocks of {@value #LANES} points.
 */
public final class Sweep {
    /** Points simulated together in one engine call. */
    public static final int LANES = 8;

    private Sweep() { }

    /**
     * @param p the protocol
     * @param t1Ms T1 per point (ms); not modified
     * @param t2Ms T2 per point (ms); not modified
     * @param b1 B1 scale per point; not modified
     * @param threads worker threads (&ge; 1)
     * @param progress called with the number of points finished so far (may be null); called from workers
     * @return magnitudes[point][echo]
     */
    public static double[][] magnitudes(Protocol p, double[] t1Ms, double[] t2Ms, double[] b1, int threads,
                                        IntConsumer progress) {
        int points = t2Ms.length;
        if (t1Ms.length != points || b1.length != points) {
            throw new IllegalArgumentException("t1, t2 and b1 must have the same length");
        }
        int n = p.echoCount();
        double[][] out = new double[points][n];
        int blocks = (points + LANES - 1) / LANES;
        if (!p.isIdealAcquisition()) {
            return acquisition(p, t1Ms, t2Ms, b1, threads, progress, out);
        }
        Optional<CpmgTrain> cpmg = p.cpmg();
        EpgProgram prog = cpmg.isPresent() ? null : p.program();
        ThreadLocal<Block> work = ThreadLocal.withInitial(() -> new Block(n));
        AtomicInteger done = new AtomicInteger();
        Runnable body = () -> IntStream.range(0, blocks).parallel().forEach(bi -> {
            Block w = work.get();
            int from = bi * LANES;
            int cnt = Math.min(LANES, points - from);
            for (int l = 0; l < cnt; l++) {
                w.t1[l] = t1Ms[from + l];
                w.t2[l] = t2Ms[from + l];
                w.b1[l] = b1[from + l];
            }
            if (cpmg.isPresent()) {
                w.cpmg.run(cpmg.get(), w.t1, w.t2, w.b1, cnt, w.re);
                for (int l = 0; l < cnt; l++) {
                    for (int e = 0; e < n; e++) {
                        out[from + l][e] = Math.abs(w.re[l * n + e]);
                    }
                }
            } else {
                w.general.run(prog, w.t1, w.t2, w.b1, cnt, w.re, w.im);
                for (int l = 0; l < cnt; l++) {
                    for (int e = 0; e < n; e++) {
                        out[from + l][e] = Math.hypot(w.re[l * n + e], w.im[l * n + e]);
                    }
                }
            }
            int d = done.addAndGet(cnt);
            if (progress != null) {
                progress.accept(d);
            }
        });
        java.util.concurrent.ForkJoinPool pool = new java.util.concurrent.ForkJoinPool(Math.max(1, threads));
        try {
            pool.submit(body).join();
        } finally {
            pool.shutdown();
        }
        return out;
    }

    /** The whole acquisition ({@link AcquisitionModel}, built once, one workspace per thread). */
    private static double[][] acquisition(Protocol p, double[] t1Ms, double[] t2Ms, double[] b1, int threads,
                                          IntConsumer progress, double[][] out) {
        double b1Max = 0;
        for (double v : b1) {
            b1Max = Math.max(b1Max, v);
        }
        AcquisitionModel model = Simulator.model(p, b1Max);
        AtomicInteger done = new AtomicInteger();
        Runnable body = () -> IntStream.range(0, t2Ms.length).parallel().forEach(i -> {
            model.magnitudes(t1Ms[i], t2Ms[i], b1[i], out[i]);
            int d = done.incrementAndGet();
            if (progress != null && (d % LANES == 0 || d == t2Ms.length)) {
                progress.accept(d);
            }
        });
        java.util.concurrent.ForkJoinPool pool = new java.util.concurrent.ForkJoinPool(Math.max(1, threads));
        try {
            pool.submit(body).join();
        } finally {
            pool.shutdown();
        }
        return out;
    }

    private static final class Block {
        final double[] t1 = new double[LANES];
        final double[] t2 = new double[LANES];
        final double[] b1 = new double[LANES];
        final double[] re;
        final double[] im;
        final CpmgEngine cpmg = new CpmgEngine(LANES);
        final GeneralEngine general = new GeneralEngine(LANES);

        Block(int echoes) {
            re = new double[LANES * echoes];
            im = new double[LANES * echoes];
        }
    }
}
