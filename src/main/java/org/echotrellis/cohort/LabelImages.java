package org.echotrellis.cohort;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.stream.Stream;

/**
 * Finds a unit's label image for the cohort table. {@code dseg}: a {@code *_dseg.nii[.gz]} of the
 * subject/session in its {@code anat/} directory (one whose name carries the collection's
 * {@code acq}/{@code run} entities if there are several); otherwise a pattern below the dataset root
 * with {@code {sub}} and {@code {ses}} placeholders. A unit without a label image is summarised over
 * its whole mask.
 */
final class LabelImages {
    /** The option value that selects BIDS segmentations. */
    static final String DSEG = "dseg";

    private LabelImages() { }

    /**
     * @param spec {@code dseg}, a pattern, or null for none
     * @param root the dataset root (local)
     * @param unit the subject/session
     * @param entities the collection's file-name prefix, e.g. {@code sub-01_ses-2_acq-fast}
     * @return the label image, if any
     */
    static Optional<Path> find(String spec, Path root, SubjectUnit unit, String entities) {
        if (spec == null) {
            return Optional.empty();
        }
        if (!spec.equals(DSEG)) {
            Path p = root.resolve(spec.replace("{sub}", unit.subject()).replace("{ses}", unit.session()));
            return Files.isRegularFile(p) ? Optional.of(p) : Optional.empty();
        }
        return beside(root, unit, entities, "dseg");
    }

    /**
     * A 3-D image with a suffix in the unit's {@code anat/} directory, e.g. its {@code _mask}.
     *
     * @param root the dataset root (local)
     * @param unit the subject/session
     * @param entities the collection's file-name prefix
     * @param suffix the BIDS suffix, e.g. {@code dseg} or {@code mask}
     * @return the image, preferring one with the collection's entities
     */
    static Optional<Path> beside(Path root, SubjectUnit unit, String entities, String suffix) {
        Path anat = root.resolve(unit.relativeDir()).resolve("anat");
        if (!Files.isDirectory(anat)) {
            return Optional.empty();
        }
        List<Path> dsegs;
        try (Stream<Path> s = Files.list(anat)) {
            dsegs = s.filter(p -> {
                String n = p.getFileName().toString();
                return n.startsWith(unit.prefix() + "_") && (n.endsWith("_" + suffix + ".nii.gz")
                        || n.endsWith("_" + suffix + ".nii"));
            }).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + anat + ": " + e.getMessage(), e);
        }
        for (Path p : dsegs) {
            if (p.getFileName().toString().startsWith(entities + "_")) {
                return Optional.of(p);
            }
        }
        return dsegs.stream().filter(p -> {
            String n = p.getFileName().toString();
            return !n.contains("_acq-") && !n.contains("_run-") && !n.contains("_desc-");
        }).findFirst();
    }
}
