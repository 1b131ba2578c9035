package org.echotrellis.design;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * An RF pulse envelope b(t), sampled uniformly over the pulse and normalised to peak |b| = 1.
 * Its area fraction A_f = mean(b) and power fraction P_f = mean(b²) give the B1 amplitude and
 * energy of a pulse of any flip and duration (see {@link RfExposure}).
 *
 * <p>Shapes (option {@code --pulse}): {@code rect}; {@code sinc:TBW} — sinc with time-bandwidth
 * product TBW (TBW/2 zero crossings each side) under a Hann window spanning the pulse
 * (Bernstein, King &amp; Zhou, Handbook of MRI Pulse Sequences, 2004, §2.3, from memory);
 * {@code gauss:TBW} — Gaussian truncated to the pulse whose untruncated small-tip profile has
 * a full width at half maximum of TBW/duration; {@code file:PATH} — samples of the envelope,
 * one number per entry (white space, commas or new lines; {@code #} starts a comment).
 *
 * @param spec option syntax, for reports
 * @param samples envelope samples, peak |b| = 1 (copied)
 */
public record PulseShape(String spec, double[] samples) {
    private static final int SAMPLES = 4000;

    /** Copies the samples and checks that the area is not zero. */
    public PulseShape {
        samples = samples.clone();
        Checks.require(samples.length >= 2, "--pulse " + spec + ": needs at least 2 samples");
        Checks.require(Math.abs(mean(samples)) > 1e-6, "--pulse " + spec
                + ": the envelope has (almost) zero area, so it cannot produce a flip");
    }

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

    /** @param tbw time-bandwidth product (> 0, ≤ 64) @return Hann-windowed sinc */
    public static PulseShape sinc(double tbw) {
        Checks.inRange("--pulse sinc time-bandwidth product", tbw, 1e-3, 64, null);
        double[] b = new double[SAMPLES];
        for (int i = 0; i < SAMPLES; i++) {
            double x = (i + 0.5) / SAMPLES - 0.5;
            double arg = Math.PI * tbw * x;
            double sinc = arg == 0 ? 1 : Math.sin(arg) / arg;
            b[i] = sinc * 0.5 * (1 + Math.cos(2 * Math.PI * x));
        }
        return normalised("sinc:" + trim(tbw), b);
    }

    /** @param tbw time-bandwidth product (> 0, ≤ 64) @return truncated Gaussian */
    public static PulseShape gauss(double tbw) {
        Checks.inRange("--pulse gauss time-bandwidth product", tbw, 1e-3, 64, null);
        double sigma = Math.sqrt(2 * Math.log(2)) / (Math.PI * tbw); // in units of the duration
        double[] b = new double[SAMPLES];
        for (int i = 0; i < SAMPLES; i++) {
            double x = (i + 0.5) / SAMPLES - 0.5;
            b[i] = Math.exp(-x * x / (2 * sigma * sigma));
        }
        return normalised("gauss:" + trim(tbw), b);
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
                return fromFile(Path.of(s.substring(5)));
            }
        } catch (NumberFormatException e) {
            throw new InputException(option + " " + spec + ": TBW must be a number; " + allowed);
        }
        throw new InputException(option + " " + spec + " is not a known pulse shape; " + allowed);
    }

    /** Reads envelope samples from a text file. @param file path @return the shape */
    public static PulseShape fromFile(Path file) {
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new InputException("--pulse file: cannot read " + file + " (" + e.getMessage() + ")", e);
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
                        throw new InputException(file + " line " + (i + 1) + ": '" + tok + "' is not a number");
                    }
                    Checks.finite("pulse sample", v, file + " line " + (i + 1));
                    values.add(v);
                }
            }
        }
        double[] b = new double[values.size()];
        for (int i = 0; i < b.length; i++) {
            b[i] = values.get(i);
        }
        Checks.require(b.length >= 2, "--pulse file:" + file + " holds " + b.length + " samples; at least 2 are needed");
        return normalised("file:" + file, b);
    }

    private static PulseShape normalised(String spec, double[] b) {
        double peak = 0;
        for (double v : b) {
            peak = Math.max(peak, Math.abs(v));
        }
        Checks.require(peak > 0, "--pulse " + spec + ": every sample is zero");
        for (int i = 0; i < b.length; i++) {
            b[i] /= peak;
        }
        return new PulseShape(spec, b);
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
