package org.echotrellis.sequence;

import java.nio.file.Path;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;

/**
 * Reads the acquisition keys of a protocol file — {@code pulse} on excitation, refocusing and event-list
 * {@code rf} events, {@code train.slice}, {@code train.repetition_ms}, {@code train.crusher} and
 * {@code tissue.diffusivity_mm2_per_s} — into an {@link Acquisition}, refusing bad values with
 * file:line:column. Package-private helper of {@link ProtocolReader}.
 */
final class AcquisitionReader {
    private static final Set<String> PULSE = keys("shape", "time_bandwidth", "duration_ms", "file");
    private static final Set<String> SLICE = keys("selective", "refocusing_width_ratio");
    private static final Set<String> CRUSHER = keys("cycles_per_mm", "duration_ms");

    private AcquisitionReader() { }

    private static Set<String> keys(String... k) {
        return new LinkedHashSet<>(List.of(k));
    }

    static double diffusivity(Node n) {
        double v = n.number("diffusivity_mm2_per_s");
        if (!(v >= 0) || v > Tissue.MAX_DIFFUSIVITY_MM2_PER_S) {
            throw new InputException(n.where + ": tissue.diffusivity_mm2_per_s must be within [0, "
                    + Tissue.MAX_DIFFUSIVITY_MM2_PER_S + "] mm²/s, got " + v);
        }
        return v;
    }

    /**
     * @param n the pulse mapping
     * @param what key path for messages, e.g. {@code refocusing.pulse}
     * @param src the protocol source (file names are relative to its directory)
     * @return the pulse
     */
    static RfPulse pulse(Node n, String what, String src) {
        Node.allowOnly(n, what, PULSE);
        Map<String, Node> m = n.map(what);
        Node sn = ProtocolReader.require(n, m, "shape", what);
        String shape = sn.text(what + ".shape");
        double dur = ProtocolReader.duration(ProtocolReader.require(n, m, "duration_ms", what), what + ".duration_ms");
        boolean tbwShape = shape.equals("sinc") || shape.equals("gauss");
        if (!tbwShape && !shape.equals("rect") && !shape.equals("file")) {
            throw new InputException(sn.where + ": " + what + ".shape must be one of rect, sinc, gauss, file; got '" + shape + "'");
        }
        if (m.containsKey("time_bandwidth") && !tbwShape) {
            throw new InputException(m.get("time_bandwidth").where + ": " + what
                    + ".time_bandwidth applies to shapes sinc and gauss only, not " + shape);
        }
        if (m.containsKey("file") && !shape.equals("file")) {
            throw new InputException(m.get("file").where + ": " + what + ".file applies to shape file only, not " + shape);
        }
        if (tbwShape) {
            Node tn = ProtocolReader.require(n, m, "time_bandwidth", what + " with shape " + shape);
            double tbw = tn.number(what + ".time_bandwidth");
            if (!(tbw >= 1 && tbw <= 32)) {
                throw new InputException(tn.where + ": " + what + ".time_bandwidth must be within [1, 32], got " + tbw);
            }
            return RfPulse.of(shape, tbw, dur);
        }
        if (shape.equals("rect")) {
            return RfPulse.of("rect", Double.NaN, dur);
        }
        Node fn = ProtocolReader.require(n, m, "file", what + " with shape file");
        String file = fn.text(what + ".file");
        Path parent = src.startsWith("built-in:") ? null : Path.of(src).toAbsolutePath().getParent();
        Path path = parent == null ? Path.of(file) : parent.resolve(file);
        PulseShape env;
        try {
            env = PulseShape.fromFile(path, what + ".file");
        } catch (InputException e) {
            throw new InputException(fn.where + ": " + e.getMessage(), e);
        }
        return new RfPulse("file", Double.NaN, dur, file, env);
    }

    /**
     * @param tn the train mapping
     * @param train the parsed train (for timing checks)
     * @param src protocol source
     * @return the acquisition ({@link Acquisition#none()} when no acquisition key is present)
     */
    static Acquisition read(Node tn, CpmgTrain train, String src) {
        Map<String, Node> t = tn.map("train");
        Optional<RfPulse> exc = Optional.empty();
        Optional<RfPulse> ref = Optional.empty();
        if (t.containsKey("excitation") && t.get("excitation").map("train.excitation").containsKey("pulse")) {
            exc = Optional.of(pulse(t.get("excitation").map("train.excitation").get("pulse"), "excitation.pulse", src));
        }
        Node rn = t.get("refocusing");
        if (rn != null && rn.map("train.refocusing").containsKey("pulse")) {
            ref = Optional.of(pulse(rn.map("train.refocusing").get("pulse"), "refocusing.pulse", src));
        }
        boolean selective = false;
        double ratio = 1;
        if (t.containsKey("slice")) {
            Node sn = t.get("slice");
            Node.allowOnly(sn, "train.slice", SLICE);
            Map<String, Node> sm = sn.map("train.slice");
            if (sm.containsKey("selective")) {
                Node b = sm.get("selective");
                if (!(b.value instanceof Boolean v)) {
                    throw new InputException(b.where + ": slice.selective must be true or false, got " + b.describe());
                }
                selective = v;
            }
            if (sm.containsKey("refocusing_width_ratio")) {
                Node rr = sm.get("refocusing_width_ratio");
                ratio = rr.number("slice.refocusing_width_ratio");
                if (!(ratio >= Acquisition.MIN_WIDTH_RATIO && ratio <= Acquisition.MAX_WIDTH_RATIO)) {
                    throw new InputException(rr.where + ": slice.refocusing_width_ratio must be within ["
                            + Acquisition.MIN_WIDTH_RATIO + ", " + Acquisition.MAX_WIDTH_RATIO + "], got " + ratio);
                }
            }
            if (selective && (exc.isEmpty() || ref.isEmpty())) {
                throw new InputException(sn.where + ": slice.selective true needs excitation.pulse and refocusing.pulse"
                        + " (the shapes whose profiles are simulated)");
            }
        }
        double tr = Double.POSITIVE_INFINITY;
        Node trn = t.get("repetition_ms");
        if (trn != null) {
            tr = ProtocolReader.duration(trn, "repetition_ms");
            double trainMs = train.echoes() * train.echoSpacingMs();
            if (!(tr > trainMs)) {
                throw new InputException(trn.where + ": repetition_ms must be > echoes x echo_spacing_ms = " + trainMs
                        + " ms, got " + tr);
            }
        }
        Optional<Crusher> crusher = Optional.empty();
        Node cn = t.get("crusher");
        if (cn != null) {
            Node.allowOnly(cn, "train.crusher", CRUSHER);
            Map<String, Node> cm = cn.map("train.crusher");
            Node qn = ProtocolReader.require(cn, cm, "cycles_per_mm", "train.crusher");
            double q = qn.number("crusher.cycles_per_mm");
            if (!(q > 0) || q > 1000) {
                throw new InputException(qn.where + ": crusher.cycles_per_mm must be within (0, 1000], got " + q);
            }
            double d = ProtocolReader.duration(ProtocolReader.require(cn, cm, "duration_ms", "train.crusher"),
                    "crusher.duration_ms");
            crusher = Optional.of(new Crusher(q, d));
        }
        if (exc.isEmpty() && ref.isEmpty() && !selective && trn == null && cn == null && !t.containsKey("slice")) {
            return Acquisition.none();
        }
        Acquisition a = new Acquisition(exc, ref, selective, ratio, tr, crusher);
        Optional<String> problem = a.timingProblem(train);
        if (problem.isPresent()) {
            Node at = cn != null ? cn : rn != null ? rn : tn;
            throw new InputException(at.where + ": " + problem.get());
        }
        return a;
    }
}
