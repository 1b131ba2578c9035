package org.echotrellis.fit;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import org.echotrellis.InputException;

/**
 * An RF pulse envelope b(t) sampled uniformly over its duration (real, amplitude-modulated, peak
 * magnitude 1), immutable.
 *
 * @param label the spec it came from, e.g. {@code sinc:4}
 * @param samples envelope samples (copied)
 */
public record PulseShape(String label, double[] samples) {
    /** Samples used for the built-in shapes. */
    static final int SAMPLES = 256;

    /** Copies and normalises to peak magnitude 1. */
    public PulseShape {
        double peak = 0;
        for (double v : samples) {
            peak = Math.max(peak, Math.abs(v));
        }
        if (samples.length < 8 || !(peak > 0) || !Double.isFinite(peak)) {
            throw new InputException("pulse shape " + label + " needs at least 8 finite samples, not all zero");
        }
        double[] c = samples.clone();
        for (int i = 0; i < c.length; i++) {
            c[i] /= peak;
        }
        samples = c;
    }

    @Override
    public double[] samples() {
        return samples.clone();
    }

    /**
     * Hann-windowed sinc with TBW/2 zero crossings on each side of the centre (time-bandwidth
     * product TBW): b(t) = sinc(TBW·(t − ½))·(½ + ½cos 2π(t − ½)), t in [0, 1] (common practice;
     * Bernstein, King &amp; Zhou, Handbook of MRI Pulse Sequences, 2004, §2.3).
     *
     * @param tbw time-bandwidth product (2 to 32)
     * @return the shape
     */
    public static PulseShape sinc(double tbw) {
        double[] s = new double[SAMPLES];
        for (int i = 0; i < SAMPLES; i++) {
            double t = (i + 0.5) / SAMPLES - 0.5;
            double x = Math.PI * tbw * t;
            double sinc = Math.abs(x) < 1e-12 ? 1 : Math.sin(x) / x;
            s[i] = sinc * (0.5 + 0.5 * Math.cos(2 * Math.PI * t));
        }
        return new PulseShape("sinc:" + fmt(tbw), s);
    }

    /**
     * Gaussian truncated to the duration, with its spectral FWHM times the duration equal to TBW:
     * b(t) = exp(−(t − ½)²/(2s²)), s = √(2 ln 2)/(π·TBW) (Fourier pair of a Gaussian; common practice).
     *
     * @param tbw time-bandwidth product (1 to 32)
     * @return the shape
     */
    public static PulseShape gauss(double tbw) {
        double sd = Math.sqrt(2 * Math.log(2)) / (Math.PI * tbw);
        double[] s = new double[SAMPLES];
        for (int i = 0; i < SAMPLES; i++) {
            double t = (i + 0.5) / SAMPLES - 0.5;
            s[i] = Math.exp(-t * t / (2 * sd * sd));
        }
        return new PulseShape("gauss:" + fmt(tbw), s);
    }

    /**
     * Reads an envelope: one amplitude per line, uniform time steps; blank lines and lines starting
     * with {@code #} are skipped.
     *
     * @param file the text file
     * @return the shape
     */
    public static PulseShape read(Path file) {
        List<String> lines;
        try {
            lines = Files.readAllLines(file);
        } catch (NoSuchFileException e) {
            throw new InputException("--slice-profile " + file + ": file not found (expected none, sinc:TBW, gauss:TBW or a pulse file)");
        } catch (IOException | RuntimeException e) {
            throw new InputException("--slice-profile " + file + ": cannot read (" + e.getMessage() + ")", e);
        }
        List<Double> v = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            String s = lines.get(i).strip();
            if (s.isEmpty() || s.startsWith("#")) {
                continue;
            }
            try {
                double x = Double.parseDouble(s);
                if (!Double.isFinite(x)) {
                    throw new NumberFormatException();
                }
                v.add(x);
            } catch (NumberFormatException e) {
                throw new InputException(file + " line " + (i + 1) + ": pulse amplitude must be a finite number, got \"" + s + "\"");
            }
        }
        double[] a = new double[v.size()];
        for (int i = 0; i < a.length; i++) {
            a[i] = v.get(i);
        }
        return new PulseShape(file.getFileName().toString(), a);
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
