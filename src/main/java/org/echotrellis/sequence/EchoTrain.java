package org.echotrellis.sequence;

import java.util.List;

/**
 * Simulated echoes of one train: complex F+<sub>0</sub> at every echo read-out (M0 = 1).
 *
 * @param labels echo labels
 * @param timesMs echo times in ms from the first RF pulse
 * @param re real parts
 * @param im imaginary parts
 */
public record EchoTrain(List<String> labels, double[] timesMs, double[] re, double[] im) {

    /**
     * Copies.
     *
     * @param labels echo labels
     * @param timesMs echo times in ms from the first RF pulse
     * @param re real parts
     * @param im imaginary parts
     */
    public EchoTrain {
        labels = List.copyOf(labels);
        timesMs = timesMs.clone();
        re = re.clone();
        im = im.clone();
    }

    /** @return number of echoes */
    public int size() {
        return re.length;
    }

    /**
     * @param i echo index, 0-based
     * @return magnitude of echo i (0-based)
     */
    public double magnitude(int i) {
        return Math.hypot(re[i], im[i]);
    }

    /**
     * @param i echo index, 0-based
     * @return phase of echo i in degrees, (-180, 180]
     */
    public double phaseDeg(int i) {
        return Math.toDegrees(Math.atan2(im[i] + 0.0, re[i])); // + 0.0 turns -0.0 into 0.0: 180, not -180
    }

    /** @return magnitudes of all echoes */
    public double[] magnitudes() {
        double[] m = new double[re.length];
        for (int i = 0; i < m.length; i++) {
            m[i] = magnitude(i);
        }
        return m;
    }

    /** @return echo times in ms from the first RF pulse (a copy) */
    @Override
    public double[] timesMs() {
        return timesMs.clone();
    }

    /** @return real parts (a copy) */
    @Override
    public double[] re() {
        return re.clone();
    }

    /** @return imaginary parts (a copy) */
    @Override
    public double[] im() {
        return im.clone();
    }
}
