package org.echotrellis.cli;

import java.util.SplittableRandom;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;

/**
 * An invented brain-like slice for the spectrum demo: an elliptical "brain" with a cortical rim of
 * "grey matter", "white matter" carrying a short-T2 pool (18 ms), a denser tract with more of it,
 * two "ventricles" of long-T2 fluid and two deep "grey-matter" nuclei; a smooth B1 fall-off towards
 * the edge (flip scale 0.98 at the centre to about 0.76 at the rim, all flips scaled); magnitude data
 * with Gaussian noise in both channels (Rician magnitude). The pools' trains are the protocol's whole
 * acquisition (so a slice-selective protocol gives 2-D data). All values are our own scenario.
 */
final class SpectrumPhantom {
    /** T1 of the white-matter pools in ms (the basis T1 of the demo's fit). */
    static final double T1_MS = 1000;

    /** Region codes. */
    static final int BACKGROUND = 0;
    static final int GREY = 1;
    static final int WHITE = 2;
    static final int TRACT = 3;
    static final int FLUID = 4;

    final int nx;
    final int ny;
    final int echoes;
    final int[] region;
    final double[] b1;
    final double[] shortFraction;
    final double[] data;       // data[v·echoes + e]
    final double sigma;

    SpectrumPhantom(int nx, int ny, Protocol protocol, double snr, long seed) {
        this.nx = nx;
        this.ny = ny;
        this.echoes = protocol.echoCount();
        int n = nx * ny;
        region = new int[n];
        b1 = new double[n];
        shortFraction = new double[n];
        data = new double[n * echoes];
        sigma = 0.7 / snr;                          // SNR quoted for white-matter proton density 0.7
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] sig = new double[echoes];
        for (int j = 0; j < ny; j++) {
            for (int i = 0; i < nx; i++) {
                int v = i + nx * j;
                double u = (i - (nx - 1) / 2.0) / (0.45 * nx);
                double w = (j - (ny - 1) / 2.0) / (0.40 * ny);
                double r = Math.hypot(u, w);
                region[v] = classify(u, w, r);
                b1[v] = 0.98 - 0.2 * r * r + 0.02 * u;
                java.util.Arrays.fill(sig, 0);
                if (region[v] != BACKGROUND) {
                    mix(protocol, v, u, sig);
                }
                for (int e = 0; e < echoes; e++) {
                    double re = sig[e] + sigma * gauss(rnd);
                    double im = sigma * gauss(rnd);
                    data[v * echoes + e] = Math.hypot(re, im);
                }
            }
        }
    }

    private static int classify(double u, double w, double r) {
        if (r > 1) {
            return BACKGROUND;
        }
        if (r > 0.86) {
            return GREY;
        }
        if (sq((Math.abs(u) - 0.17) / 0.08) + sq((w - 0.05) / 0.24) <= 1) {
            return FLUID;
        }
        if (sq((Math.abs(u) - 0.30) / 0.11) + sq((w + 0.32) / 0.11) <= 1) {
            return GREY;
        }
        if (Math.abs(w - 0.42) < 0.07 && Math.abs(u) < 0.42) {
            return TRACT;
        }
        return WHITE;
    }

    /** Pools per region: (proton density, short fraction, T2 short, T2 main, T1). */
    private void mix(Protocol protocol, int v, double u, double[] sig) {
        double pd;
        double fShort;
        double t2Main;
        double t1;
        switch (region[v]) {
            case GREY: pd = 0.82; fShort = 0.03; t2Main = 90; t1 = 1500; break;
            case TRACT: pd = 0.68; fShort = 0.22; t2Main = 72; t1 = 1000; break;
            case FLUID: pd = 1.0; fShort = 0; t2Main = 1500; t1 = 4000; break;
            default: pd = 0.70; fShort = 0.11 + 0.03 * u; t2Main = 75; t1 = 1000;
        }
        shortFraction[v] = fShort;
        double[] main = Simulator.simulate(protocol, t1, t2Main, b1[v]).magnitudes();
        double[] shortPool = fShort > 0 ? Simulator.simulate(protocol, 500, 18, b1[v]).magnitudes() : new double[echoes];
        for (int e = 0; e < echoes; e++) {
            sig[e] = pd * ((1 - fShort) * Math.abs(main[e]) + fShort * Math.abs(shortPool[e]));
        }
    }

    private static double sq(double x) {
        return x * x;
    }

    private static double gauss(SplittableRandom r) {
        return Math.sqrt(-2 * Math.log(1 - r.nextDouble())) * Math.cos(2 * Math.PI * r.nextDouble());
    }
}
