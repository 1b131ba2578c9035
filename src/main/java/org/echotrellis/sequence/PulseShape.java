package org.echotrellis.sequence;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.InputFiles;

/**
 * An RF pulse envelope b(t), real (amplitude-modulated), sampled uniformly over the pulse and
 * normalised to peak |b| = 1. Used for slice profiles (Bloch simulation across the slice, {@code fit})
 * and for RF exposure ({@code design}): the area fraction A_f = mean(b) and power fraction
 * P_f = mean(b²) give the B1 amplitude and energy of a pulse of any flip and duration.
 *
 * <p>Shapes: {@code rect}; {@code sinc:TBW} — sinc with time-bandwidth product TBW (TBW/2 zero
 * crossings each side) under a Hann window spanning the pulse (common practice; Bernstein, King
 * &amp; Zhou, Handbook of MRI Pulse Sequences, 2004, §2.3, from memory); {@code gauss:TBW} — a
 * Gaussian truncated to the pulse whose untruncated spectrum has a full width at half maximum of
 * TBW/duration (Fourier pair of a Gaussian); {@code file:PATH} — samples of the envelope, one or more
 * numbers per line (white space, commas or semicolons; {@code #} starts a comment).
 *
 * @param label the shape as written, e.g. {@code sinc:4}
 * @param samples envelope samples (copied and normalised to peak magnitude 1)
 */
public record PulseShape(String label, double[] samples) {
    /** Samples of the built-in shapes (midpoint rule; A_f and P_f accurate to about 1e-7). */
    public static final int SAMPLES = 4000;
    /** Largest accepted pulse-envelope file. */
    public static final long MAX_FILE_BYTES = 20_000_000;

    /**
     * Copies, normalises to peak magnitude 1 and checks that the envelope can produce a flip.
     *
     * @param label the shape as written, e.g. {@code sinc:4}
     * @param samples envelope samples (copied and normalised to peak magnitude 1)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public PulseShape {
        Checks.require(samples != null && samples.length >= 2, "pulse shape " + label + " needs at least 2 samples");
        double peak = 0;
        for (double v : samples) {
            Checks.require(Double.isFinite(v), "pulse shape " + label + ": every sample must be a finite number");
            peak = Math.max(peak, Math.abs(v));
        }
        Checks.require(peak > 0, "pulse shape " + label + ": every sample is zero");
        double[] c = samples.clone();
        for (int i = 0; i < c.length; i++) {
            c[i] /= peak;
        }
        samples = c;
        Checks.require(Math.abs(mean(samples)) > 1e-6, "pulse shape " + label
                + ": the envelope has (almost) zero area, so it cannot produce a flip");
    }

    /** @return envelope samples (normalised to peak magnitude 1; a copy) */
    @Override
    public double[] samples() {
        return samples.clone();
    }

    /** @return A_f = mean(b), the area relative to a rectangle of the same peak and duration */
    public double areaFraction() {
        return mean(samples);
    }

    /** @return P_f = mean(b²), the energy relative to a rectangle of the same peak and duration */
    public double powerFraction() {
        double s = 0;
        for (double v : samples) {
            s += v * v;
        }
        return s / samples.length;
    }

    /** @return a rectangular pulse */
    public static PulseShape rect() {
        return new PulseShape("rect", new double[] {1, 1});
    }

    /**
     * @param tbw time-bandwidth product (&gt; 0, &le; 64)
     * @return the Hann-windowed sinc b(t) = sinc(TBW (t &minus; ½)) (½ + ½ cos 2&pi;(t &minus; ½)), t in [0, 1]
     */
    public static PulseShape sinc(double tbw) {
        Checks.inRange("sinc time-bandwidth product", tbw, 1e-3, 64, null);
        double[] b = new double[SAMPLES];
        for (int i = 0; i < SAMPLES; i++) {
            double x = (i + 0.5) / SAMPLES - 0.5;
            double arg = Math.PI * tbw * x;
            double sinc = arg == 0 ? 1 : Math.sin(arg) / arg;
            b[i] = sinc * 0.5 * (1 + Math.cos(2 * Math.PI * x));
        }
        return new PulseShape("sinc:" + trim(tbw), b);
    }

    /**
     * @param tbw time-bandwidth product (&gt; 0, &le; 64)
     * @return the truncated Gaussian b(t) = exp(&minus;(t &minus; ½)²/(2s²)), s = &radic;(2 ln 2)/(&pi; TBW)
     */
    public static PulseShape gauss(double tbw) {
        Checks.inRange("gauss time-bandwidth product", tbw, 1e-3, 64, null);
        double sigma = Math.sqrt(2 * Math.log(2)) / (Math.PI * tbw); // in units of the duration
        double[] b = new double[SAMPLES];
        for (int i = 0; i < SAMPLES; i++) {
            double x = (i + 0.5) / SAMPLES - 0.5;
            b[i] = Math.exp(-x * x / (2 * sigma * sigma));
        }
        return new PulseShape("gauss:" + trim(tbw), b);
    }

    /**
     * Parses {@code rect}, {@code sinc:TBW}, {@code gauss:TBW} or {@code file:PATH}.
     *
     * @param spec option value
     * @param option option name for messages
     * @return the shape
     */
    public static PulseShape parse(String spec, String option) {
        String s = spec == null ? "" : spec.trim();
        String allowed = "allowed: rect, sinc:TBW, gauss:TBW, file:PATH";
        try {
            if (s.equals("rect")) {
                return rect();
            } else if (s.startsWith("sinc:")) {
                return sinc(Double.parseDouble(s.substring(5)));
            } else if (s.startsWith("gauss:")) {
                return gauss(Double.parseDouble(s.substring(6)));
            } else if (s.startsWith("file:") && s.length() > 5) {
                return fromFile(Path.of(s.substring(5)), option);
            }
        } catch (NumberFormatException e) {
            throw new InputException(option + " " + spec + ": TBW must be a number; " + allowed);
        }
        throw new InputException(option + " " + spec + " is not a known pulse shape; " + allowed);
    }

    /**
     * Reads envelope samples from a text file.
     *
     * @param file path
     * @param option option name for messages
     * @return the shape, labelled with the file name
     */
    public static PulseShape fromFile(Path file, String option) {
        List<String> lines;
        try {
            InputFiles.requireRegular(file, option + " " + file);
            if (Files.size(file) > MAX_FILE_BYTES) {
                throw new InputException(option + " " + file + ": file larger than " + MAX_FILE_BYTES + " bytes");
            }
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new InputException(option + " " + file + ": file not found");
        } catch (InputException e) {
            throw e;
        } catch (IOException e) {
            throw InputFiles.readFailure(option + " " + file, e);
        } catch (RuntimeException e) {
            throw new InputException(option + " " + file + ": cannot read (" + e.getMessage() + ")", e);
        }
        List<Double> values = new ArrayList<>();
        for (int i = 0; i < lines.size(); i++) {
            String line = lines.get(i);
            int hash = line.indexOf('#');
            String body = hash >= 0 ? line.substring(0, hash) : line;
            for (String tok : body.trim().split("[\\s,;]+")) {
                if (!tok.isEmpty()) {
                    double v;
                    try {
                        v = Double.parseDouble(tok);
                    } catch (NumberFormatException e) {
                        throw new InputException(file + " line " + (i + 1) + ": pulse amplitude must be a number, got '" + tok + "'");
                    }
                    Checks.finite("pulse amplitude", v, file + " line " + (i + 1));
                    values.add(v);
                }
            }
        }
        double[] b = new double[values.size()];
        for (int i = 0; i < b.length; i++) {
            b[i] = values.get(i);
        }
        Checks.require(b.length >= 2, option + " " + file + " holds " + b.length + " samples; at least 2 are needed");
        return new PulseShape(file.getFileName().toString(), b);
    }

    private static double mean(double[] v) {
        double s = 0;
        for (double x : v) {
            s += x;
        }
        return s / v.length;
    }

    private static String trim(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
