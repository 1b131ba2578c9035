package org.echotrellis.sequence;

import org.echotrellis.Checks;

/**
 * A shaped RF pulse of the acquisition: its envelope and its duration. The envelope sets the slice
 * profile (Bloch simulation, {@link PulseRotation}) and, with the duration, the RF exposure; the
 * duration also enters the diffusion timing of a crushed refocusing pulse.
 *
 * @param shape {@code rect}, {@code sinc}, {@code gauss} or {@code file}
 * @param timeBandwidth time-bandwidth product for sinc and gauss (NaN otherwise)
 * @param durationMs duration in ms (&gt; 0)
 * @param file the envelope file as written in the protocol for {@code file} (empty otherwise)
 * @param envelope the envelope samples
 */
public record RfPulse(String shape, double timeBandwidth, double durationMs, String file, PulseShape envelope) {

    /**
     * Validates.
     *
     * @param shape {@code rect}, {@code sinc}, {@code gauss} or {@code file}
     * @param timeBandwidth time-bandwidth product for sinc and gauss (NaN otherwise)
     * @param durationMs duration in ms (&gt; 0)
     * @param file the envelope file as written in the protocol for {@code file} (empty otherwise)
     * @param envelope the envelope samples
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public RfPulse {
        Checks.require(shape != null && (shape.equals("rect") || shape.equals("sinc") || shape.equals("gauss")
                || shape.equals("file")), "pulse shape must be rect, sinc, gauss or file, got " + shape);
        Checks.positive("pulse duration_ms", durationMs, null);
        Checks.require(envelope != null, "pulse envelope missing");
        file = file == null ? "" : file;
    }

    /**
     * @param shape rect, sinc or gauss
     * @param timeBandwidth TBW for sinc and gauss (ignored for rect)
     * @param durationMs duration in ms
     * @return the pulse
     */
    public static RfPulse of(String shape, double timeBandwidth, double durationMs) {
        return switch (shape) {
            case "rect" -> new RfPulse("rect", Double.NaN, durationMs, "", PulseShape.rect());
            case "sinc" -> new RfPulse("sinc", timeBandwidth, durationMs, "", PulseShape.sinc(timeBandwidth));
            case "gauss" -> new RfPulse("gauss", timeBandwidth, durationMs, "", PulseShape.gauss(timeBandwidth));
            default -> throw new IllegalArgumentException("shape must be rect, sinc or gauss, got " + shape);
        };
    }

    /** @return the shape as one word, e.g. {@code sinc:4} or {@code file:envelope.txt} */
    public String label() {
        return switch (shape) {
            case "sinc", "gauss" -> shape + ":" + trim(timeBandwidth);
            case "file" -> "file:" + file;
            default -> shape;
        };
    }

    private static String trim(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}
