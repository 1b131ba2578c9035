package org.echotrellis.image;

/**
 * Fast PSF figures for many echo trains on one {@link KSpaceOrdering}: the weights are constant over
 * the lines of one echo, so h(x) = (1/L)·Σₑ aₑ·Gₑ(x) with Gₑ(x) = Σ_{j acquired by e}
 * exp(+i2π·(j − c)·x/L) tabulated once (E·L complex values, O(L²) to build). Each train then costs
 * O(E·L) multiply-adds and no allocation. Used by the design objectives that read PSF figures.
 * Not thread-safe (one workspace); one instance per thread.
 */
public final class PsfKernel {
    private final int lines;
    private final int echoes;
    private final int centreEcho;
    private final double[] gRe;
    private final double[] gIm;
    private final double[] work;

    /** @param ordering the ordering (its tables are built here) */
    public PsfKernel(KSpaceOrdering ordering) {
        lines = ordering.lines();
        echoes = ordering.echoes();
        int[] echoOf = ordering.echoOfLine();
        centreEcho = echoOf[ordering.centreLine()];
        int c = ordering.centreLine();
        double[] cos = new double[lines];
        double[] sin = new double[lines];
        for (int i = 0; i < lines; i++) {
            cos[i] = Math.cos(2 * Math.PI * i / lines);
            sin[i] = Math.sin(2 * Math.PI * i / lines);
        }
        gRe = new double[echoes * lines];
        gIm = new double[echoes * lines];
        for (int j = 0; j < lines; j++) {
            int row = echoOf[j] * lines;
            long u = j - c;
            for (int i = 0; i < lines; i++) {
                int t = (int) Math.floorMod(u * (i - c), (long) lines);
                gRe[row + i] += cos[t];
                gIm[row + i] += sin[t];
            }
        }
        work = new double[lines];
    }

    /** @return the number of lines L */
    public int lines() {
        return lines;
    }

    /** @return the 0-based echo at k = 0 */
    public int centreEcho() {
        return centreEcho;
    }

    /**
     * @param echoes echo amplitudes, at least E values; their magnitudes are the weights (not modified)
     * @param out receives the centred PSF magnitude, length L (NaN when the centre echo is 0)
     * @return {@code out}
     */
    double[] psf(double[] echoes, double[] out) {
        if (echoes.length < this.echoes || out.length != lines) {
            throw new IllegalArgumentException("need " + this.echoes + " echoes and an output of " + lines
                    + " values, got " + echoes.length + " and " + out.length);
        }
        double wc = Math.abs(echoes[centreEcho]);
        double norm = 1.0 / (lines * wc);
        for (int i = 0; i < lines; i++) {
            double sr = 0;
            double si = 0;
            for (int e = 0, row = i; e < this.echoes; e++, row += lines) {
                double a = Math.abs(echoes[e]);
                sr += a * gRe[row];
                si += a * gIm[row];
            }
            out[i] = wc == 0 ? Double.NaN : Math.sqrt(sr * sr + si * si) * norm;
        }
        return out;
    }

    /**
     * @param echoes echo amplitudes (magnitudes are used; not modified)
     * @return the PSF figures (uses this kernel's workspace)
     */
    public PsfFigures figures(double[] echoes) {
        return PointSpread.figures(psf(echoes, work));
    }
}
