package org.echotrellis.sequence;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.yaml.snakeyaml.LoaderOptions;

/**
 * Reads protocol files: YAML ({@code .yaml}, {@code .yml}) or JSON ({@code .json}), in the shorthand
 * echo-train form ({@code train:}) or the general event-list form ({@code events:}). Every refusal
 * names file:line:column, the key, the bad value and what is allowed. Hostile files are bounded: at
 * most {@link #MAX_FILE_BYTES} bytes, 10 YAML aliases, nesting depth 32.
 */
public final class ProtocolReader {
    /** Largest accepted protocol file. */
    public static final int MAX_FILE_BYTES = 2_000_000;
    /** Largest accepted echo count. */
    public static final int MAX_ECHOES = 1024;
    /** Largest accepted sum of |dephasing| over all intervals (bounds the number of states). */
    public static final int MAX_TOTAL_DEPHASING = 20_000;

    private static final Set<String> TOP = keys("name", "description", "tissue", "train", "events", "b1_scale");
    private static final Set<String> TISSUE = keys("preset", "name", "t1_ms", "t2_ms", "diffusivity_mm2_per_s");
    private static final Set<String> TRAIN = keys("echoes", "echo_spacing_ms", "excitation", "refocusing", "b1_scale",
            "repetition_ms", "slice", "crusher");
    private static final Set<String> EXCITATION = keys("flip_deg", "phase_deg", "pulse");
    private static final Set<String> REFOCUSING = keys("flip_deg", "flips_deg", "phase_deg", "phases_deg", "pulse");
    private static final Set<String> EVENT = keys("rf", "interval", "echo");
    private static final Set<String> RF = keys("flip_deg", "phase_deg", "pulse");
    private static final Set<String> INTERVAL = keys("duration_ms", "dephasing");
    private static final Set<String> ECHO = keys("label");

    private ProtocolReader() { }

    private static Set<String> keys(String... k) {
        return new LinkedHashSet<>(List.of(k));
    }

    /**
     * Reads a protocol file.
     *
     * @param file path ending in .yaml, .yml or .json
     * @return the protocol
     * @throws InputException for any problem, with file:line:column where known
     */
    public static Protocol read(Path file) {
        return ProtocolText.read(file).parse();
    }

    /**
     * Reads one of the example protocols shipped inside the jar (the files of {@code sequences/}).
     *
     * @param fileName e.g. {@code knee-t2-16.yaml}
     * @return the protocol
     */
    public static Protocol readBuiltIn(String fileName) {
        try (var in = ProtocolReader.class.getResourceAsStream("/sequences/" + fileName)) {
            if (in == null) {
                throw new InputException("no built-in protocol " + fileName);
            }
            String lower = fileName.toLowerCase(Locale.ROOT);
            return parse(new String(in.readAllBytes(), StandardCharsets.UTF_8), "built-in:" + fileName,
                    !lower.endsWith(".json"));
        } catch (IOException e) {
            throw new InputException("cannot read built-in protocol " + fileName + ": " + e.getMessage(), e);
        }
    }

    /**
     * Parses protocol text.
     *
     * @param text the document
     * @param source name used in messages
     * @param yaml true for YAML, false for JSON
     * @return the protocol
     */
    public static Protocol parse(String text, String source, boolean yaml) {
        Node root;
        try (JsonParser p = factory(yaml).createParser(text)) {
            root = Node.read(p, source);
            if (p.nextToken() != null) {
                var at = p.currentTokenLocation();
                throw new InputException(source + ":" + at.getLineNr() + ":" + at.getColumnNr()
                        + ": more content after the protocol; give one protocol per file");
            }
        } catch (JsonProcessingException e) {
            var loc = e.getLocation();
            String where = loc == null ? source : source + ":" + loc.getLineNr() + ":" + loc.getColumnNr();
            String msg = e.getOriginalMessage() == null ? "syntax error" : e.getOriginalMessage().split("\\R")[0];
            throw new InputException(where + ": " + (yaml ? "YAML" : "JSON") + " syntax error: " + msg, e);
        } catch (IOException e) {
            throw new InputException(source + ": cannot parse (" + e.getMessage() + ")", e);
        } catch (RuntimeException e) {
            if (e instanceof InputException ie) {
                throw ie;
            }
            String m = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage().split("\\R")[0];
            throw new InputException(source + ": cannot parse: " + m, e);
        }
        return build(root, source);
    }

    private static JsonFactory factory(boolean yaml) {
        StreamReadConstraints limits = StreamReadConstraints.builder().maxNestingDepth(64)
                .maxStringLength(1_000_000).maxNumberLength(100).build();
        if (yaml) {
            LoaderOptions opts = new LoaderOptions();
            opts.setMaxAliasesForCollections(10);
            opts.setAllowDuplicateKeys(true); // reported with position by Node
            opts.setNestingDepthLimit(64);
            opts.setCodePointLimit(MAX_FILE_BYTES);
            return YAMLFactory.builder().loaderOptions(opts).streamReadConstraints(limits).build();
        }
        return JsonFactory.builder().streamReadConstraints(limits).build();
    }

    private static Protocol build(Node root, String src) {
        Node.allowOnly(root, "the protocol", TOP);
        Map<String, Node> top = root.map("the protocol");
        String name = top.containsKey("name") ? top.get("name").text("name") : fileStem(src);
        String description = top.containsKey("description") ? top.get("description").text("description") : "";
        Tissue tissue = top.containsKey("tissue") ? tissue(top.get("tissue")) : DEFAULT_TISSUE;
        boolean hasTrain = top.containsKey("train");
        boolean hasEvents = top.containsKey("events");
        if (hasTrain == hasEvents) {
            throw new InputException(root.where + ": a protocol needs exactly one of 'train' (shorthand echo train) or 'events' (event list)");
        }
        double b1 = top.containsKey("b1_scale") ? b1(top.get("b1_scale")) : 1.0;
        if (hasTrain) {
            Node tn = top.get("train");
            Node.allowOnly(tn, "train", TRAIN);
            Map<String, Node> t = tn.map("train");
            if (t.containsKey("b1_scale")) {
                if (top.containsKey("b1_scale")) {
                    throw new InputException(t.get("b1_scale").where + ": b1_scale is given twice, at the top level ("
                            + top.get("b1_scale").where + ") and in train; give it once");
                }
                b1 = b1(t.get("b1_scale"));
            }
            CpmgTrain train = train(tn);
            return Protocol.ofTrain(name, description, tissue, b1, train, src, AcquisitionReader.read(tn, train, src));
        }
        return new Protocol(name, description, tissue, b1, events(top.get("events"), src), Optional.empty(), src);
    }

    /** Tissue of a protocol without a {@code tissue} section (T1 1000 ms, T2 100 ms). */
    private static final Tissue DEFAULT_TISSUE = new Tissue("default", 1000, 100);

    /**
     * @param p a protocol read by this class
     * @return true if its file had no {@code tissue} section, so T1 1000 ms and T2 100 ms were assumed
     */
    public static boolean tissueAssumed(Protocol p) {
        return p.tissue() == DEFAULT_TISSUE;
    }

    private static String fileStem(String src) {
        String s = Path.of(src).getFileName().toString();
        int dot = s.lastIndexOf('.');
        return dot > 0 ? s.substring(0, dot) : s;
    }

    private static double b1(Node n) {
        double v = n.number("b1_scale");
        if (!(v > 0) || v > 5 || Double.isInfinite(v)) {
            throw new InputException(n.where + ": b1_scale must be within (0, 5], got " + v);
        }
        return v;
    }

    private static Tissue tissue(Node n) {
        Node.allowOnly(n, "tissue", TISSUE);
        Map<String, Node> m = n.map("tissue");
        Tissue base = null;
        if (m.containsKey("preset")) {
            Node p = m.get("preset");
            String preset = p.text("preset");
            try {
                base = TissuePresets.get(preset);
            } catch (InputException e) {
                throw new InputException(p.where + ": " + e.getMessage(), e);
            }
        } else if (!m.containsKey("t1_ms") || !m.containsKey("t2_ms")) {
            throw new InputException(n.where + ": tissue needs either 'preset' or both 't1_ms' and 't2_ms'");
        }
        String name = m.containsKey("name") ? m.get("name").text("name") : base != null ? base.name() : "";
        double t1 = m.containsKey("t1_ms") ? relaxation(m.get("t1_ms"), "t1_ms") : base.t1Ms();
        double t2 = m.containsKey("t2_ms") ? relaxation(m.get("t2_ms"), "t2_ms") : base.t2Ms();
        double d = m.containsKey("diffusivity_mm2_per_s") ? AcquisitionReader.diffusivity(m.get("diffusivity_mm2_per_s")) : 0;
        return new Tissue(name, t1, t2, d);
    }

    private static double relaxation(Node n, String key) {
        double v = n.number(key);
        if (!(v > 0)) {
            throw new InputException(n.where + ": " + key + " must be > 0 ms (or .inf for no relaxation), got " + v);
        }
        return v;
    }

    private static double flip(Node n, String key) {
        double v = n.number(key);
        if (!(v >= 0 && v <= 360)) {
            throw new InputException(n.where + ": " + key + " must be within [0, 360] degrees, got " + v);
        }
        return v;
    }

    private static double phase(Node n, String key) {
        double v = n.number(key);
        if (Double.isInfinite(v)) {
            throw new InputException(n.where + ": " + key + " must be a finite number of degrees, got " + v);
        }
        return v;
    }

    static double duration(Node n, String key) {
        double v = n.number(key);
        if (!(v > 0) || Double.isInfinite(v) || v > 1e7) {
            throw new InputException(n.where + ": " + key + " must be > 0 and at most 1e7 ms, got " + v);
        }
        return v;
    }

    private static CpmgTrain train(Node tn) {
        Map<String, Node> t = tn.map("train");
        Node en = require(tn, t, "echoes", "train");
        int echoes = en.integer("echoes");
        if (echoes < 1 || echoes > MAX_ECHOES) {
            throw new InputException(en.where + ": echoes must be within [1, " + MAX_ECHOES + "], got " + echoes);
        }
        double esp = duration(require(tn, t, "echo_spacing_ms", "train"), "echo_spacing_ms");
        double excFlip = 90;
        double excPhase = 90;
        if (t.containsKey("excitation")) {
            Node xn = t.get("excitation");
            Node.allowOnly(xn, "train.excitation", EXCITATION);
            Map<String, Node> x = xn.map("train.excitation");
            if (x.containsKey("flip_deg")) {
                excFlip = flip(x.get("flip_deg"), "excitation.flip_deg");
            }
            if (x.containsKey("phase_deg")) {
                excPhase = phase(x.get("phase_deg"), "excitation.phase_deg");
            }
        }
        Node rn = require(tn, t, "refocusing", "train");
        Node.allowOnly(rn, "train.refocusing", REFOCUSING);
        Map<String, Node> r = rn.map("train.refocusing");
        double[] flips = perEcho(rn, r, "flip_deg", "flips_deg", echoes, 180, true);
        double[] phases = perEcho(rn, r, "phase_deg", "phases_deg", echoes, 0, false);
        return new CpmgTrain(echoes, esp, excFlip, excPhase, flips, phases);
    }

    private static double[] perEcho(Node owner, Map<String, Node> r, String one, String many, int echoes,
                                    double dflt, boolean isFlip) {
        if (r.containsKey(one) && r.containsKey(many)) {
            throw new InputException(r.get(many).where + ": give either '" + one + "' or '" + many + "' in train.refocusing, not both");
        }
        double[] out = new double[echoes];
        if (r.containsKey(many)) {
            Node ln = r.get(many);
            List<Node> list = ln.list("refocusing." + many);
            if (list.size() != echoes) {
                throw new InputException(ln.where + ": refocusing." + many + " has " + list.size()
                        + " values but echoes is " + echoes + "; give one value per echo");
            }
            for (int i = 0; i < echoes; i++) {
                String key = "refocusing." + many + "[" + i + "]";
                out[i] = isFlip ? flip(list.get(i), key) : phase(list.get(i), key);
            }
            return out;
        }
        double v = dflt;
        if (r.containsKey(one)) {
            v = isFlip ? flip(r.get(one), "refocusing." + one) : phase(r.get(one), "refocusing." + one);
        } else if (isFlip) {
            throw new InputException(owner.where + ": train.refocusing needs 'flip_deg' (one flip) or 'flips_deg' (one per echo)");
        }
        java.util.Arrays.fill(out, v);
        return out;
    }

    static Node require(Node owner, Map<String, Node> m, String key, String what) {
        Node n = m.get(key);
        if (n == null) {
            throw new InputException(owner.where + ": " + what + " needs '" + key + "'");
        }
        return n;
    }

    private static List<Event> events(Node ln, String src) {
        List<Node> list = ln.list("events");
        Checks.require(!list.isEmpty(), ln.where + ": events must not be empty");
        if (list.size() > Protocol.MAX_EVENTS) {
            throw new InputException(ln.where + ": at most " + Protocol.MAX_EVENTS + " events, got " + list.size());
        }
        List<Event> out = new ArrayList<>(list.size());
        int echoes = 0;
        long totalDephasing = 0;
        for (Node en : list) {
            if (en.value instanceof String s && s.trim().equals("echo")) {
                out.add(new Event.Echo(""));
                echoes++;
                continue;
            }
            Node.allowOnly(en, "an event", EVENT);
            Map<String, Node> m = en.map("an event");
            if (m.size() != 1) {
                throw new InputException(en.where + ": each event must have exactly one of rf, interval, echo; got " + m.keySet());
            }
            Map.Entry<String, Node> e = m.entrySet().iterator().next();
            Node body = e.getValue();
            switch (e.getKey()) {
                case "rf" -> {
                    Node.allowOnly(body, "rf", RF);
                    Map<String, Node> b = body.map("rf");
                    double f = flip(require(body, b, "flip_deg", "rf"), "rf.flip_deg");
                    double ph = b.containsKey("phase_deg") ? phase(b.get("phase_deg"), "rf.phase_deg") : 0;
                    Optional<RfPulse> pulse = b.containsKey("pulse")
                            ? Optional.of(AcquisitionReader.pulse(b.get("pulse"), "rf.pulse", src)) : Optional.empty();
                    out.add(new Event.Rf(f, ph, pulse));
                }
                case "interval" -> {
                    Node.allowOnly(body, "interval", INTERVAL);
                    Map<String, Node> b = body.map("interval");
                    double d = duration(require(body, b, "duration_ms", "interval"), "interval.duration_ms");
                    int k = 0;
                    if (b.containsKey("dephasing")) {
                        Node dn = b.get("dephasing");
                        k = dn.integer("interval.dephasing");
                        if (Math.abs(k) > 1000) {
                            throw new InputException(dn.where + ": interval.dephasing must be within [-1000, 1000], got " + k);
                        }
                    }
                    totalDephasing += Math.abs(k);
                    if (totalDephasing > MAX_TOTAL_DEPHASING) {
                        throw new InputException(body.where + ": total |dephasing| over all intervals exceeds " + MAX_TOTAL_DEPHASING);
                    }
                    out.add(new Event.Interval(d, k));
                }
                default -> {
                    String label = "";
                    if (body.value != null) {
                        Node.allowOnly(body, "echo", ECHO);
                        Map<String, Node> b = body.map("echo");
                        label = b.containsKey("label") ? b.get("label").text("echo.label") : "";
                    }
                    out.add(new Event.Echo(label));
                    echoes++;
                }
            }
        }
        if (echoes == 0) {
            throw new InputException(ln.where + ": events contain no echo; add at least one '- echo: {}'");
        }
        if (echoes > MAX_ECHOES) {
            throw new InputException(ln.where + ": at most " + MAX_ECHOES + " echoes, got " + echoes);
        }
        return out;
    }
}
