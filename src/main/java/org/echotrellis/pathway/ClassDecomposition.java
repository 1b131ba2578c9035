package org.echotrellis.pathway;

import java.util.List;

/**
 * The class decomposition of an echo train: for every echo the complex contribution of each class
 * m = 0, 1, ... (number of periods spent as dephased longitudinal magnetization), see
 * {@link ClassTracker}. The classes of an echo add up to the echo.
 *
 * <p>Immutable; arrays are copied on the way in.
 */
public final class ClassDecomposition {
    /** Echoes smaller than this (in units of M0) have no defined stimulated share. */
    public static final double MIN_DEFINED_MAGNITUDE = 1e-12;

    private final List<String> labels;
    private final double[] timesMs;
    private final int[] offset;
    private final double[] re;
    private final double[] im;

    /**
     * @param labels echo labels
     * @param timesMs echo times in ms
     * @param offset classes of echo e at [offset[e], offset[e+1]); copied
     * @param re real parts of the classes; copied
     * @param im imaginary parts of the classes; copied
     */
    public ClassDecomposition(List<String> labels, double[] timesMs, int[] offset, double[] re, double[] im) {
        if (offset.length != labels.size() + 1 || timesMs.length != labels.size()
                || re.length != offset[offset.length - 1] || im.length != re.length) {
            throw new IllegalArgumentException("inconsistent class decomposition layout");
        }
        this.labels = List.copyOf(labels);
        this.timesMs = timesMs.clone();
        this.offset = offset.clone();
        this.re = re.clone();
        this.im = im.clone();
    }

    /** @return number of echoes */
    public int echoCount() {
        return labels.size();
    }

    /**
     * @param e echo index (0-based)
     * @return its label
     */
    public String label(int e) {
        return labels.get(e);
    }

    /**
     * @param e echo index (0-based)
     * @return echo time in ms
     */
    public double timeMs(int e) {
        return timesMs[e];
    }

    /**
     * @param e echo index (0-based)
     * @return number of classes reported (m = 0 .. count&minus;1)
     */
    public int classCount(int e) {
        return offset[e + 1] - offset[e];
    }

    /**
     * @param e echo index
     * @param m class index, m ≥ 0 (periods spent as dephased longitudinal magnetization)
     * @return real part of class m of echo e (0 beyond the last class)
     */
    public double classRe(int e, int m) {
        return m < classCount(e) ? re[offset[e] + m] : 0.0;
    }

    /**
     * @param e echo index
     * @param m class index, m ≥ 0 (periods spent as dephased longitudinal magnetization)
     * @return imaginary part of class m of echo e (0 beyond the last class)
     */
    public double classIm(int e, int m) {
        return m < classCount(e) ? im[offset[e] + m] : 0.0;
    }

    /**
     * @param e echo index
     * @return real part of the echo (sum of its classes)
     */
    public double echoRe(int e) {
        double s = 0;
        for (int i = offset[e]; i < offset[e + 1]; i++) {
            s += re[i];
        }
        return s;
    }

    /**
     * @param e echo index
     * @return imaginary part of the echo (sum of its classes)
     */
    public double echoIm(int e) {
        double s = 0;
        for (int i = offset[e]; i < offset[e + 1]; i++) {
            s += im[i];
        }
        return s;
    }

    /**
     * @param e echo index
     * @return echo magnitude |A|
     */
    public double magnitude(int e) {
        return Math.hypot(echoRe(e), echoIm(e));
    }

    /**
     * Share of the echo carried by classes m &ge; 1, projected on the echo:
     * 1 &minus; Re(A<sub>0</sub>&middot;conj A)/|A|<sup>2</sup>, computed as Re((A &minus; A<sub>0</sub>)&middot;conj A)/|A|<sup>2</sup>
     * (the same number, without cancellation). It may fall outside [0, 1] when classes interfere.
     *
     * @param e echo index
     * @return the stimulated share, NaN when |A| &lt; {@link #MIN_DEFINED_MAGNITUDE}
     */
    public double stimulatedShare(int e) {
        double ar = echoRe(e);
        double ai = echoIm(e);
        double a2 = ar * ar + ai * ai;
        if (Math.sqrt(a2) < MIN_DEFINED_MAGNITUDE) {
            return Double.NaN;
        }
        double sr = ar - re[offset[e]];
        double si = ai - im[offset[e]];
        return (sr * ar + si * ai) / a2;
    }

    /**
     * Signed contribution of classes {@code from} .. {@code to} (inclusive) along the echo's own
     * phase, Re(&Sigma;A<sub>m</sub>&middot;conj A)/|A|, in units of M0. Over all classes these add up to |A|.
     *
     * @param e echo index
     * @param from first class
     * @param to last class (use {@code Integer.MAX_VALUE} for "and above")
     * @return the projected contribution (0 when the echo vanishes)
     */
    public double projected(int e, int from, int to) {
        double ar = echoRe(e);
        double ai = echoIm(e);
        double a = Math.hypot(ar, ai);
        if (a < MIN_DEFINED_MAGNITUDE) {
            return 0.0;
        }
        double s = 0;
        int last = Math.min(to, classCount(e) - 1);
        for (int m = Math.max(0, from); m <= last; m++) {
            s += re[offset[e] + m] * ar + im[offset[e] + m] * ai;
        }
        return s / a;
    }
}
