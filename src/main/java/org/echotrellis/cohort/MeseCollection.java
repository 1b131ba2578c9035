package org.echotrellis.cohort;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.echotrellis.InputException;
import org.echotrellis.io.Json;

/**
 * One multi-echo spin-echo collection of a subject/session in a local BIDS tree: the files
 * {@code sub-<L>[_ses-<S>][_acq-<A>][_run-<R>]_echo-<n>_MESE.nii[.gz]} of one entity set, in echo
 * order, each with its sidecar keys merged by the BIDS inheritance principle (JSON files higher in
 * the tree whose entities are a subset of the file's apply unless a closer one sets the key).
 *
 * @param entities the file-name prefix before {@code _echo-}, e.g. {@code sub-01_ses-2_acq-fast}
 * @param acquisition the {@code acq} label or empty
 * @param run the {@code run} label or empty
 * @param echoFiles the echo files in echo order
 * @param sidecars the merged sidecar of each echo file
 */
record MeseCollection(String entities, String acquisition, String run, List<Path> echoFiles,
                      List<JsonNode> sidecars) {
    private static final Pattern ECHO = Pattern.compile("(sub-[^_]+(?:_[a-z]+-[^_]+)*?)_echo-(\\d+)_MESE\\.nii(\\.gz)?");

    /**
     * Finds the collections of a unit.
     *
     * @param root the dataset root
     * @param unit the subject/session
     * @return the collections sorted by entities
     * @throws InputException if the unit has no multi-echo files or an echo number repeats
     */
    static List<MeseCollection> find(Path root, SubjectUnit unit) {
        Path anat = root.resolve(unit.relativeDir()).resolve("anat");
        Map<String, TreeMap<Integer, Path>> groups = new TreeMap<>();
        if (Files.isDirectory(anat)) {
            try (Stream<Path> s = Files.list(anat)) {
                for (Path p : s.sorted().toList()) {
                    Matcher m = ECHO.matcher(p.getFileName().toString());
                    if (m.matches() && m.group(1).startsWith(unit.prefix())) {
                        Path old = groups.computeIfAbsent(m.group(1), k -> new TreeMap<>())
                                .put(Integer.parseInt(m.group(2)), p);
                        if (old != null) {
                            throw new InputException(p + ": echo " + m.group(2) + " is also given by " + old);
                        }
                    }
                }
            } catch (IOException e) {
                throw new UncheckedIOException("cannot list " + anat + ": " + e.getMessage(), e);
            }
        }
        if (groups.isEmpty()) {
            throw new InputException(anat + ": no " + unit.prefix() + "*_echo-<n>_MESE.nii[.gz] files");
        }
        List<MeseCollection> out = new ArrayList<>();
        for (Map.Entry<String, TreeMap<Integer, Path>> g : groups.entrySet()) {
            List<Path> files = new ArrayList<>(g.getValue().values());
            List<JsonNode> cars = new ArrayList<>();
            for (Path f : files) {
                cars.add(sidecar(root, f));
            }
            out.add(new MeseCollection(g.getKey(), entity(g.getKey(), "acq"), entity(g.getKey(), "run"), files, cars));
        }
        return out;
    }

    /** The echo times in seconds, one per echo file, from the sidecars' {@code EchoTime}. */
    double[] echoTimesS() {
        double[] te = new double[echoFiles.size()];
        for (int i = 0; i < te.length; i++) {
            JsonNode t = sidecars.get(i).get("EchoTime");
            if (t == null || !t.isNumber() || !(t.asDouble() > 0)) {
                throw new InputException(echoFiles.get(i) + ": sidecar EchoTime (seconds, > 0) is missing or invalid"
                        + (t == null ? "" : ", got " + t));
            }
            te[i] = t.asDouble();
        }
        return te;
    }

    /**
     * @param key a sidecar key
     * @return its number from the first echo's sidecar, or NaN if absent
     */
    double number(String key) {
        JsonNode n = sidecars.get(0).get(key);
        return n != null && n.isNumber() ? n.asDouble() : Double.NaN;
    }

    private static String entity(String entities, String key) {
        for (String part : entities.split("_")) {
            if (part.startsWith(key + "-")) {
                return part.substring(key.length() + 1);
            }
        }
        return "";
    }

    /** Merges the JSON sidecars that apply to a data file, from the root down to its own. */
    private static JsonNode sidecar(Path root, Path data) {
        String name = data.getFileName().toString().replaceFirst("\\.nii(\\.gz)?$", "");
        Map<String, String> own = entities(name);
        ObjectNode merged = Json.MAPPER.createObjectNode();
        Path rel = root.relativize(data.getParent());
        List<Path> dirs = new ArrayList<>();
        dirs.add(root);
        Path d = root;
        for (Path part : rel) {
            d = d.resolve(part);
            dirs.add(d);
        }
        for (Path dir : dirs) {
            List<Path> jsons;
            try (Stream<Path> s = Files.list(dir)) {
                jsons = s.filter(p -> p.getFileName().toString().endsWith("_MESE.json")).sorted().toList();
            } catch (IOException e) {
                throw new UncheckedIOException("cannot list " + dir + ": " + e.getMessage(), e);
            }
            // fewer entities first, so a more specific sidecar in the same directory wins
            jsons = new ArrayList<>(jsons);
            jsons.sort((a, b) -> Integer.compare(entities(stem(a)).size(), entities(stem(b)).size()));
            for (Path j : jsons) {
                Map<String, String> e = entities(stem(j));
                if (own.entrySet().containsAll(e.entrySet())) {
                    merge(merged, j);
                }
            }
        }
        return merged;
    }

    private static String stem(Path json) {
        return json.getFileName().toString().replaceFirst("\\.json$", "");
    }

    private static Map<String, String> entities(String stem) {
        Map<String, String> m = new LinkedHashMap<>();
        for (String part : stem.split("_")) {
            int dash = part.indexOf('-');
            if (dash > 0) {
                m.put(part.substring(0, dash).toLowerCase(Locale.ROOT), part.substring(dash + 1));
            }
        }
        return m;
    }

    private static void merge(ObjectNode into, Path json) {
        try {
            JsonNode n = Json.MAPPER.readTree(json.toFile());
            if (!(n instanceof ObjectNode o)) {
                throw new InputException(json + ": a sidecar must hold a JSON object");
            }
            for (Iterator<Map.Entry<String, JsonNode>> it = o.fields(); it.hasNext(); ) {
                Map.Entry<String, JsonNode> e = it.next();
                into.set(e.getKey(), e.getValue());
            }
        } catch (IOException e) {
            throw new InputException(json + ": not valid JSON (" + e.getMessage().split("\\R")[0] + ")", e);
        }
    }
}
