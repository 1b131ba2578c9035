package org.echotrellis.io.bids;

import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;

import com.fasterxml.jackson.databind.node.ObjectNode;

/**
 * One multi-echo spin-echo collection of a BIDS dataset: the per-echo files
 * {@code sub-<L>[_ses-<S>][_acq-<A>][_run-<R>]_echo-<n>_MESE.nii[.gz]} in echo order, each with
 * its sidecar merged by the inheritance principle, and the B1 map found for it.
 *
 * @param subject participant label (without {@code sub-})
 * @param session session label, or empty
 * @param entities the entities that name the collection (sub, ses, acq, run … without echo), in order
 * @param echoFiles the per-echo images, echo 1 first
 * @param sidecars the merged sidecar of each echo file, same order
 * @param b1Map the {@code _TB1map} of the subject/session's {@code fmap/}, if one was found
 * @param b1Sidecar the merged sidecar of that B1 map (empty object if none)
 */
public record MeseCollection(String subject, Optional<String> session, Map<String, String> entities,
                             List<Path> echoFiles, List<ObjectNode> sidecars, Optional<Path> b1Map,
                             ObjectNode b1Sidecar) {

    /**
     * Copies.
     *
     * @param subject participant label (without {@code sub-})
     * @param session session label, or empty
     * @param entities the entities that name the collection (sub, ses, acq, run … without echo), in order
     * @param echoFiles the per-echo images, echo 1 first
     * @param sidecars the merged sidecar of each echo file, same order
     * @param b1Map the {@code _TB1map} of the subject/session's {@code fmap/}, if one was found

     * @param b1Sidecar the merged sidecar of that B1 map (empty object if none)
     */
    public MeseCollection {
        entities = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(entities));
        echoFiles = List.copyOf(echoFiles);
        sidecars = List.copyOf(sidecars);
    }

    /**
     * @return the file-name prefix of the collection's outputs, e.g. {@code sub-01_ses-2_run-1}
     */
    public String prefix() {
        StringBuilder sb = new StringBuilder();
        for (Map.Entry<String, String> e : entities.entrySet()) {
            sb.append(sb.length() == 0 ? "" : "_").append(e.getKey()).append('-').append(e.getValue());
        }
        return sb.toString();
    }

    /** @return the directory of the outputs relative to a dataset root: {@code sub-L[/ses-S]/anat} */
    public Path relativeDir() {
        Path p = Path.of("sub-" + subject);
        if (session.isPresent()) {
            p = p.resolve("ses-" + session.get());
        }
        return p.resolve("anat");
    }

    /** @return a short label for messages, e.g. {@code sub-01 ses-2 run-1} */
    public String label() {
        return prefix().replace('_', ' ');
    }
}
