package org.echotrellis.fit;

import java.util.Random;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;

/** Synthetic decays for the fit tests, made with the engine's CPMG fast path ({@link CpmgEngine}). */
final class FitData {
    private FitData() { }

    /** Magnitude EPG train, amplitude 1. */
    static double[] decay(CpmgTrain train, double t1, double t2, double b1) {
        double[] e = new CpmgEngine(1).echoes(train, t1, t2, b1);
        for (int i = 0; i < e.length; i++) {
            e[i] = Math.abs(e[i]);
        }
        return e;
    }

    /** Adds Gaussian noise of standard deviation sigma (copy). */
    static double[] gaussian(double[] clean, double sigma, Random r) {
        double[] y = clean.clone();
        for (int i = 0; i < y.length; i++) {
            y[i] += sigma * r.nextGaussian();
        }
        return y;
    }

    /** Rician magnitudes: |clean + complex Gaussian noise| (copy). */
    static double[] rician(double[] clean, double sigma, Random r) {
        double[] y = clean.clone();
        for (int i = 0; i < y.length; i++) {
            y[i] = Math.hypot(clean[i] + sigma * r.nextGaussian(), sigma * r.nextGaussian());
        }
        return y;
    }

    /** Folded B1: the magnitude train of B1 = 1 + x equals that of 1 − x for nominal 90°/180°. */
    static double fold(double b1) {
        return b1 > 1 ? 2 - b1 : b1;
    }
}
