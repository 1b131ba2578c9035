package org.echotrellis.io.bids;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Optional;

/**
 * A BIDS file name split into its entities ({@code key-value} pairs joined by {@code _}), suffix
 * and extension, e.g. {@code sub-01_ses-2_echo-3_MESE.nii.gz} → {sub: 01, ses: 2, echo: 3},
 * {@code MESE}, {@code .nii.gz} (BIDS specification, "File name structure").
 *
 * @param entities the entities in file order
 * @param suffix the suffix
 * @param extension the extension with its leading dot
 */
record BidsName(Map<String, String> entities, String suffix, String extension) {

    /**
     * Copies.
     *
     * @param entities the entities in file order
     * @param suffix the suffix
     * @param extension the extension with its leading dot
     */
    public BidsName {
        entities = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(entities));
    }

    /**
     * @param fileName a file name
     * @return the parts, or empty if it is not of the form {@code key-value_..._suffix.ext}
     */
    public static Optional<BidsName> parse(String fileName) {
        int dot = fileName.indexOf('.');
        if (dot <= 0) {
            return Optional.empty();
        }
        String stem = fileName.substring(0, dot);
        String ext = fileName.substring(dot);
        String[] parts = stem.split("_", -1);
        Map<String, String> e = new LinkedHashMap<>();
        for (int i = 0; i < parts.length - 1; i++) {
            int dash = parts[i].indexOf('-');
            if (dash <= 0 || dash == parts[i].length() - 1) {
                return Optional.empty();
            }
            e.put(parts[i].substring(0, dash), parts[i].substring(dash + 1));
        }
        String suffix = parts[parts.length - 1];
        if (suffix.isEmpty() || suffix.contains("-")) {
            return Optional.empty();
        }
        return Optional.of(new BidsName(e, suffix, ext));
    }

    /**
     * @param key an entity key
     * @return its value, if present
     */
    public Optional<String> get(String key) {
        return Optional.ofNullable(entities.get(key));
    }

    /**
     * Whether this name's entities are all present with the same values in another's (the rule by
     * which a sidecar applies to a data file under the inheritance principle).
     *
     * @param other a data file's name
     * @return true if every entity of this name appears in {@code other}
     */
    public boolean appliesTo(BidsName other) {
        for (Map.Entry<String, String> en : entities.entrySet()) {
            if (!en.getValue().equals(other.entities.get(en.getKey()))) {
                return false;
            }
        }
        return suffix.equals(other.suffix);
    }
}
