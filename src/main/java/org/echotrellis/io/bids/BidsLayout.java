package org.echotrellis.io.bids;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import java.util.stream.Stream;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.echotrellis.InputException;
import org.echotrellis.io.Json;

/**
 * Finds the multi-echo spin-echo collections of a BIDS dataset (Brain Imaging Data Structure,
 * Gorgolewski et al., Sci Data 3:160044, 2016; BIDS specification: suffix
 * {@code MESE}, one file per echo with the {@code echo-<n>} entity) under
 * {@code sub-<L>/[ses-<S>/]anat/}, merges each file's JSON sidecars by the inheritance principle
 * (every {@code *_MESE.json} from the dataset root down to the file's directory whose entities are
 * a subset of the file's applies; a deeper or more specific one overrides a key), and picks the
 * B1 map ({@code _TB1map}) of the same subject and session from {@code fmap/}.
 */
public final class BidsLayout {
    private BidsLayout() { }

    /**
     * @param root the dataset root (holds {@code dataset_description.json} and {@code sub-*})
     * @param participants labels to include (with or without {@code sub-}); empty for all
     * @param sessions labels to include (with or without {@code ses-}); empty for all
     * @return the collections, sorted by name
     * @throws InputException if the root is not a directory or a named participant is missing
     */
    public static List<MeseCollection> find(Path root, List<String> participants, List<String> sessions) {
        if (!Files.isDirectory(root)) {
            throw new InputException(root + ": not a directory (expected a BIDS dataset)");
        }
        List<String> want = strip(participants, "sub-");
        List<String> wantSes = strip(sessions, "ses-");
        for (String p : want) {
            if (!Files.isDirectory(root.resolve("sub-" + p))) {
                throw new InputException(root + ": no participant sub-" + p + " (participant label " + p + ")");
            }
        }
        Map<String, Map<Integer, Path>> groups = new TreeMap<>();
        Map<String, BidsName> names = new LinkedHashMap<>();
        try (Stream<Path> files = Files.walk(root, 4)) {
            for (Path f : (Iterable<Path>) files::iterator) {
                Optional<BidsName> n = BidsName.parse(f.getFileName().toString());
                if (n.isEmpty() || !n.get().suffix().equals("MESE") || !isImage(n.get().extension())
                        || !f.getParent().getFileName().toString().equals("anat")) {
                    continue;
                }
                BidsName name = n.get();
                String sub = name.get("sub").orElse(null);
                if (sub == null || !want.isEmpty() && !want.contains(sub)) {
                    continue;
                }
                Optional<String> ses = name.get("ses");
                if (!wantSes.isEmpty() && (ses.isEmpty() || !wantSes.contains(ses.get()))) {
                    continue;
                }
                String echo = name.get("echo").orElseThrow(() -> new InputException(f
                        + ": a MESE file needs the echo-<n> entity (one file per echo)"));
                int e;
                try {
                    e = Integer.parseInt(echo);
                } catch (NumberFormatException x) {
                    throw new InputException(f + ": echo-" + echo + " is not an echo number");
                }
                Map<String, String> key = new LinkedHashMap<>(name.entities());
                key.remove("echo");
                BidsName collection = new BidsName(key, "MESE", "");
                String id = f.getParent() + "|" + key;
                names.put(id, collection);
                Path before = groups.computeIfAbsent(id, k -> new TreeMap<>()).put(e, f);
                if (before != null) {
                    throw new InputException(f + ": echo " + e + " is also given by " + before);
                }
            }
        } catch (IOException e) {
            throw new InputException(root + ": cannot list the dataset (" + e.getMessage() + ")", e);
        }
        List<MeseCollection> out = new ArrayList<>();
        for (Map.Entry<String, Map<Integer, Path>> g : groups.entrySet()) {
            BidsName key = names.get(g.getKey());
            List<Path> echoes = new ArrayList<>(g.getValue().values());
            int expect = 1;
            for (int e : g.getValue().keySet()) {
                if (e != expect++) {
                    throw new InputException(echoes.get(0).getParent() + ": echoes of " + key.entities()
                            + " are numbered " + g.getValue().keySet() + "; expected 1.." + g.getValue().size());
                }
            }
            List<ObjectNode> sidecars = new ArrayList<>();
            for (Path f : echoes) {
                sidecars.add(sidecar(root, f));
            }
            Optional<String> ses = key.get("ses");
            Optional<Path> b1 = b1Map(root, key);
            ObjectNode b1Sidecar = b1.isPresent() ? sidecar(root, b1.get()) : Json.MAPPER.createObjectNode();
            out.add(new MeseCollection(key.get("sub").orElseThrow(), ses, key.entities(), echoes, sidecars, b1, b1Sidecar));
        }
        out.sort(Comparator.comparing(MeseCollection::prefix));
        return out;
    }

    private static boolean isImage(String ext) {
        return ext.equals(".nii") || ext.equals(".nii.gz");
    }

    private static List<String> strip(List<String> labels, String prefix) {
        List<String> s = new ArrayList<>();
        for (String l : labels) {
            s.add(l.startsWith(prefix) ? l.substring(prefix.length()) : l);
        }
        return s;
    }

    /**
     * The sidecar of a data file by the inheritance principle.
     *
     * @param root dataset root
     * @param file a data file below it
     * @return the merged keys (an empty object if no sidecar applies)
     */
    public static ObjectNode sidecar(Path root, Path file) {
        BidsName target = BidsName.parse(file.getFileName().toString()).orElseThrow();
        ObjectNode merged = Json.MAPPER.createObjectNode();
        List<Path> dirs = new ArrayList<>();
        Path rootAbs = root.toAbsolutePath().normalize();
        for (Path d = file.toAbsolutePath().normalize().getParent(); d != null && d.startsWith(rootAbs); d = d.getParent()) {
            dirs.add(0, d);
        }
        for (Path d : dirs) {
            List<Path> here = new ArrayList<>();
            try (Stream<Path> s = Files.list(d)) {
                s.filter(p -> p.getFileName().toString().endsWith(".json")).forEach(here::add);
            } catch (IOException e) {
                throw new InputException(d + ": cannot list (" + e.getMessage() + ")", e);
            }
            List<Map.Entry<BidsName, Path>> apply = new ArrayList<>();
            for (Path j : here) {
                Optional<BidsName> n = BidsName.parse(j.getFileName().toString());
                if (n.isEmpty() && j.getFileName().toString().equals(target.suffix() + ".json")) {
                    n = Optional.of(new BidsName(Map.of(), target.suffix(), ".json"));
                }
                if (n.isPresent() && n.get().appliesTo(target)) {
                    apply.add(Map.entry(n.get(), j));
                }
            }
            apply.sort(Comparator.comparingInt(en -> en.getKey().entities().size()));
            for (Map.Entry<BidsName, Path> en : apply) {
                merged.setAll(read(en.getValue()));
            }
        }
        return merged;
    }

    private static ObjectNode read(Path json) {
        try {
            JsonNode n = Json.MAPPER.readTree(json.toFile());
            if (!(n instanceof ObjectNode o)) {
                throw new InputException(json + ": a sidecar must hold a JSON object");
            }
            return o;
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            var loc = e.getLocation();
            throw new InputException(json + (loc == null ? "" : ":" + loc.getLineNr() + ":" + loc.getColumnNr())
                    + ": invalid JSON (" + e.getOriginalMessage() + ")", e);
        } catch (IOException e) {
            throw new InputException(json + ": cannot read (" + e.getMessage() + ")", e);
        }
    }

    /** The TB1map of fmap/ for a collection: the only one, or the one with the collection's run. */
    private static Optional<Path> b1Map(Path root, BidsName key) {
        Path dir = root.resolve("sub-" + key.get("sub").orElseThrow());
        if (key.get("ses").isPresent()) {
            dir = dir.resolve("ses-" + key.get("ses").get());
        }
        dir = dir.resolve("fmap");
        if (!Files.isDirectory(dir)) {
            return Optional.empty();
        }
        List<Path> maps = new ArrayList<>();
        try (Stream<Path> s = Files.list(dir)) {
            s.filter(p -> BidsName.parse(p.getFileName().toString())
                    .filter(n -> n.suffix().equals("TB1map") && isImage(n.extension())).isPresent()).sorted().forEach(maps::add);
        } catch (IOException e) {
            throw new InputException(dir + ": cannot list (" + e.getMessage() + ")", e);
        }
        if (maps.size() > 1) {
            Optional<String> run = key.get("run");
            List<Path> same = maps.stream().filter(p -> BidsName.parse(p.getFileName().toString()).orElseThrow()
                    .get("run").equals(run)).toList();
            if (same.size() != 1) {
                throw new InputException(dir + ": " + maps.size() + " TB1map files " + maps.stream()
                        .map(p -> p.getFileName().toString()).toList() + " and none matches " + key.entities()
                        + " alone; give the B1 map explicitly");
            }
            return Optional.of(same.get(0));
        }
        return maps.stream().findFirst();
    }
}
