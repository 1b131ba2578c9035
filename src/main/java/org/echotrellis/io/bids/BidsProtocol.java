package org.echotrellis.io.bids;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLMapper;
import org.echotrellis.InputException;
import org.echotrellis.io.Json;
import org.echotrellis.sequence.ProtocolText;

/**
 * The protocol of a BIDS collection, from its sidecars and an optional protocol file: the sidecars'
 * {@code EchoTime} (seconds, one per echo file) give the echo count and spacing (a CPMG train has
 * TE_k = k·ESP; uneven times are refused with their list unless the protocol file is an event
 * list), {@code RepetitionTime} (s) gives {@code train.repetition_ms}, {@code FlipAngle} the
 * excitation flip and {@code RefocusingFlipAngle} (not a core BIDS key, written by converters) the
 * refocusing flip; the refocusing flip may instead come from the protocol file or the command
 * line. The protocol file supplies what sidecars cannot (pulse shapes, slice, crushers, tissue).
 * A value given by two sources that disagree (relative difference above 1e-3) is refused naming
 * both.
 */
public final class BidsProtocol {
    /** Relative tolerance of two values of one quantity (common practice: sidecars round to µs). */
    static final double TOLERANCE = 1e-3;

    private BidsProtocol() { }

    /**
     * The protocol and the acquisition values taken from the sidecars.
     *
     * @param protocol the resolved protocol text (JSON)
     * @param acquisition the sidecar values used, BIDS keys and units (for output sidecars)
     */
    public record Resolved(ProtocolText protocol, Map<String, Object> acquisition) { }

    /**
     * @param c the collection
     * @param protocolFile the text of {@code --protocol}, if given
     * @param refocusFlipDeg a refocusing flip from the command line, if given
     * @param refocusOption the option's name for messages
     * @return the resolved protocol
     * @throws InputException for missing, uneven or contradicting values
     */
    public static Resolved resolve(MeseCollection c, Optional<ProtocolText> protocolFile, OptionalDouble refocusFlipDeg,
            String refocusOption) {
        int n = c.echoFiles().size();
        double[] teMs = new double[n];
        for (int i = 0; i < n; i++) {
            JsonNode te = c.sidecars().get(i).get("EchoTime");
            if (te == null || !te.isNumber() || !(te.asDouble() > 0)) {
                throw new InputException(c.echoFiles().get(i) + ": its sidecars give no EchoTime (seconds > 0)"
                        + (te == null ? "" : ", got " + te));
            }
            teMs[i] = te.asDouble() * 1000;
        }
        Map<String, Object> acq = new LinkedHashMap<>();
        List<Double> teS = new ArrayList<>();
        for (double t : teMs) {
            teS.add(t / 1000);
        }
        acq.put("EchoTime", teS);
        Optional<JsonNode> tr = common(c, "RepetitionTime");
        Optional<JsonNode> flip = common(c, "FlipAngle");
        Optional<JsonNode> refocus = common(c, "RefocusingFlipAngle");
        tr.ifPresent(v -> acq.put("RepetitionTime", v.asDouble()));
        flip.ifPresent(v -> acq.put("FlipAngle", v.asDouble()));
        refocus.ifPresent(v -> acq.put("RefocusingFlipAngle", v));

        String sidecarName = c.echoFiles().get(0).getFileName() + " (sidecar)";
        ObjectNode root;
        String source;
        if (protocolFile.isPresent()) {
            root = tree(protocolFile.get());
            source = protocolFile.get().source();
            if (root.has("events")) {
                return new Resolved(protocolFile.get(), acq);  // event lists keep their own timing; checked against TE by the caller
            }
        } else {
            root = Json.MAPPER.createObjectNode();
            root.put("name", c.prefix());
            root.put("description", "from the BIDS sidecars of " + c.label());
            source = null;
        }
        double esp = teMs[0];
        for (int k = 1; k < n; k++) {
            if (Math.abs(teMs[k] - (k + 1) * esp) > TOLERANCE * esp) {
                throw new InputException(c.label() + ": echo times " + list(teMs) + " ms are not evenly spaced from the "
                        + "first (TE_k = k x " + fmt(esp) + " ms); uneven trains need an event-list protocol file");
            }
        }
        ObjectNode train = root.has("train") && root.get("train").isObject() ? (ObjectNode) root.get("train") : root.putObject("train");
        put(train, "echoes", n, sidecarName + " EchoTime count", source);
        put(train, "echo_spacing_ms", esp, sidecarName + " EchoTime", source);
        if (tr.isPresent()) {
            put(train, "repetition_ms", tr.get().asDouble() * 1000, sidecarName + " RepetitionTime", source);
        }
        if (flip.isPresent()) {
            ObjectNode ex = train.has("excitation") ? (ObjectNode) train.get("excitation") : train.putObject("excitation");
            put(ex, "flip_deg", flip.get().asDouble(), sidecarName + " FlipAngle", source);
        }
        ObjectNode ref = train.has("refocusing") ? (ObjectNode) train.get("refocusing") : null;
        boolean fromFile = ref != null && (ref.has("flip_deg") || ref.has("flips_deg"));
        if (refocus.isPresent()) {
            ref = ref == null ? train.putObject("refocusing") : ref;
            if (refocus.get().isArray()) {
                putList(ref, refocus.get(), sidecarName + " RefocusingFlipAngle", source);
            } else {
                put(ref, "flip_deg", refocus.get().asDouble(), sidecarName + " RefocusingFlipAngle", source);
            }
        }
        if (refocusFlipDeg.isPresent()) {
            ref = ref == null ? train.putObject("refocusing") : ref;
            String by = refocus.isPresent() ? sidecarName + " RefocusingFlipAngle" : source;
            put(ref, "flip_deg", refocusFlipDeg.getAsDouble(), refocusOption, by);
        }
        if (ref == null || !fromFile && refocus.isEmpty() && refocusFlipDeg.isEmpty()) {
            throw new InputException(c.label() + ": the refocusing flip angle is missing: no RefocusingFlipAngle in the "
                    + "sidecars of " + c.echoFiles().get(0).getFileName() + ", no protocol file with train.refocusing and no "
                    + refocusOption);
        }
        try {
            String text = Json.MAPPER.writeValueAsString(root);
            String src = (source == null ? "" : source + " + ") + "sidecars of " + c.label();
            return new Resolved(new ProtocolText(text, src, false), acq);
        } catch (IOException e) {
            throw new IllegalStateException(e);
        }
    }

    /** A sidecar key that must agree across the echo files. */
    private static Optional<JsonNode> common(MeseCollection c, String key) {
        JsonNode first = null;
        Path firstFile = null;
        for (int i = 0; i < c.sidecars().size(); i++) {
            JsonNode v = c.sidecars().get(i).get(key);
            if (v == null) {
                continue;
            }
            if (!v.isNumber() && !(v.isArray() && v.size() > 0 && v.get(0).isNumber())) {
                throw new InputException(c.echoFiles().get(i) + ": sidecar " + key + " must be a number, got " + v);
            }
            if (first == null) {
                first = v;
                firstFile = c.echoFiles().get(i);
            } else if (!first.equals(v) && !(v.isNumber() && close(v.asDouble(), first.asDouble()))) {
                throw new InputException(c.label() + ": sidecar " + key + " differs between echoes: " + first + " ("
                        + firstFile.getFileName() + ") vs " + v + " (" + c.echoFiles().get(i).getFileName() + ")");
            }
        }
        return Optional.ofNullable(first);
    }

    private static ObjectNode tree(ProtocolText p) {
        ObjectMapper m = p.yaml() ? new YAMLMapper() : Json.MAPPER;
        try {
            JsonNode n = m.readTree(p.text());
            if (!(n instanceof ObjectNode o)) {
                throw new InputException(p.source() + ": a protocol must be a mapping of keys");
            }
            return o.deepCopy();
        } catch (IOException e) {
            p.parse();  // reports the syntax error with line and column
            throw new InputException(p.source() + ": cannot read (" + e.getMessage() + ")", e);
        }
    }

    /** Sets a number, refusing a different value already there (from {@code by}). */
    private static void put(ObjectNode node, String key, double value, String from, String by) {
        JsonNode had = node.get(key);
        if (had != null && had.isNumber() && !close(had.asDouble(), value)) {
            throw new InputException(from + " gives " + key + " = " + fmt(value) + ", but " + (by == null ? "another source" : by)
                    + " gives " + fmt(had.asDouble()) + "; make them agree or leave one out");
        }
        if (key.equals("echoes")) {
            node.put(key, (int) value);
        } else {
            node.put(key, value);
        }
    }

    private static void putList(ObjectNode ref, JsonNode flips, String from, String by) {
        JsonNode had = ref.get("flips_deg");
        if (had != null && !had.equals(flips)) {
            throw new InputException(from + " gives flips_deg = " + flips + ", but " + by + " gives " + had);
        }
        ref.remove("flip_deg");
        ref.set("flips_deg", (ArrayNode) flips.deepCopy());
    }

    static boolean close(double a, double b) {
        return Math.abs(a - b) <= TOLERANCE * Math.max(Math.abs(a), Math.abs(b)) + 1e-12;
    }

    private static String fmt(double v) {
        return String.format(Locale.ROOT, "%.6g", v);
    }

    private static String list(double[] v) {
        StringBuilder sb = new StringBuilder("[");
        for (int i = 0; i < v.length; i++) {
            sb.append(i > 0 ? ", " : "").append(fmt(v[i]));
        }
        return sb.append(']').toString();
    }

    /**
     * Checks a 4-D series against the {@code EchoTime} list of a JSON sidecar next to it
     * ({@code X.nii[.gz]} → {@code X.json}), when there is one.
     *
     * @param series the series file
     * @param echoTimesMs the protocol's echo times in ms
     * @throws InputException if the sidecar's echo times differ in count or value (relative 1e-3)
     */
    public static void checkSeriesSidecar(Path series, double[] echoTimesMs) {
        String name = series.getFileName().toString();
        String stem = name.endsWith(".nii.gz") ? name.substring(0, name.length() - 7)
                : name.endsWith(".nii") ? name.substring(0, name.length() - 4) : null;
        if (stem == null) {
            return;
        }
        Path json = series.resolveSibling(stem + ".json");
        if (!java.nio.file.Files.isRegularFile(json)) {
            return;
        }
        JsonNode te;
        try {
            te = Json.MAPPER.readTree(json.toFile()).get("EchoTime");
        } catch (IOException e) {
            throw new InputException(json + ": sidecar is not valid JSON (" + e.getMessage().split("\\R")[0] + ")", e);
        }
        if (te == null) {
            return;
        }
        List<Double> side = new ArrayList<>();
        if (te.isArray()) {
            te.forEach(t -> side.add(t.asDouble() * 1000));
        } else {
            side.add(te.asDouble() * 1000);
        }
        boolean same = side.size() == echoTimesMs.length;
        for (int i = 0; same && i < side.size(); i++) {
            same = close(side.get(i), echoTimesMs[i]);
        }
        if (!same) {
            throw new InputException(json + ": EchoTime " + te + " s does not match the protocol's " + echoTimesMs.length
                    + " echo times " + list(echoTimesMs) + " ms of " + series.getFileName());
        }
    }
}
