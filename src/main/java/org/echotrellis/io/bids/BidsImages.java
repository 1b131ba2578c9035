package org.echotrellis.io.bids;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.stream.Stream;

import org.echotrellis.InputException;

/**
 * Finds a 3-D image that belongs to a collection — a brain mask ({@code _mask}) or a segmentation
 * ({@code _dseg}) — from a user's choice: the keyword naming the BIDS suffix, which looks in the
 * collection's own {@code anat/} folder (BIDS specification, "Derivatives: masks and segmentations";
 * METHODS §12), or a path pattern below the dataset root with {@code {sub}} and {@code {ses}}
 * placeholders, e.g. {@code derivatives/masks/sub-{sub}/anat/sub-{sub}_desc-brain_mask.nii.gz}.
 */
public final class BidsImages {
    /** The choice that selects a collection's {@code _mask} image in its {@code anat/} folder. */
    public static final String MASK = "mask";
    /** The choice that selects a collection's {@code _dseg} image in its {@code anat/} folder. */
    public static final String DSEG = "dseg";

    private BidsImages() { }

    /**
     * Resolves a choice for one collection.
     *
     * @param choice the suffix keyword ({@code suffix}), a path pattern, or null for none
     * @param suffix the BIDS suffix the keyword stands for ({@value #MASK} or {@value #DSEG})
     * @param root the dataset root (local)
     * @param c the collection
     * @return the image, or empty when the choice is null or names no existing file
     */
    public static Optional<Path> find(String choice, String suffix, Path root, MeseCollection c) {
        if (choice == null) {
            return Optional.empty();
        }
        if (choice.equals(suffix)) {
            return beside(root, c, suffix);
        }
        Path p = root.resolve(expand(choice, c.subject(), c.session().orElse("")));
        return Files.isRegularFile(p) ? Optional.of(p) : Optional.empty();
    }

    /**
     * Like {@link #find}, but a missing image is an error naming what was looked for.
     *
     * @param choice the suffix keyword or a path pattern (not null)
     * @param suffix the BIDS suffix the keyword stands for
     * @param root the dataset root (local)
     * @param c the collection
     * @return the image
     * @throws InputException when no image is found
     */
    public static Path require(String choice, String suffix, Path root, MeseCollection c) {
        return find(choice, suffix, root, c).orElseThrow(() -> new InputException(choice.equals(suffix)
                ? root.resolve(c.relativeDir()) + ": no " + c.prefix() + "*_" + suffix + ".nii[.gz] for " + c.label()
                : root.resolve(expand(choice, c.subject(), c.session().orElse(""))) + ": no such file (the " + suffix
                        + " of " + c.label() + ")"));
    }

    /**
     * @param pattern a path with {@code {sub}} and {@code {ses}} placeholders
     * @param subject the participant label
     * @param session the session label, or empty
     * @return the path for one subject/session
     */
    public static String expand(String pattern, String subject, String session) {
        return pattern.replace("{sub}", subject).replace("{ses}", session);
    }

    /**
     * The image with a suffix in the collection's {@code anat/} folder: one carrying all the
     * collection's entities first, else one of the subject/session without {@code acq}/{@code run}
     * entities (a {@code desc} entity is allowed, as in {@code sub-01_desc-brain_mask}).
     */
    private static Optional<Path> beside(Path root, MeseCollection c, String suffix) {
        Path anat = root.resolve(c.relativeDir());
        if (!Files.isDirectory(anat)) {
            return Optional.empty();
        }
        String unit = "sub-" + c.subject() + c.session().map(s -> "_ses-" + s).orElse("");
        List<Path> found;
        try (Stream<Path> s = Files.list(anat)) {
            found = s.filter(p -> {
                String n = p.getFileName().toString();
                return n.startsWith(unit + "_") && (n.endsWith("_" + suffix + ".nii.gz") || n.endsWith("_" + suffix + ".nii"));
            }).sorted().toList();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + anat + ": " + e.getMessage(), e);
        }
        for (Path p : found) {
            if (p.getFileName().toString().startsWith(c.prefix() + "_")) {
                return Optional.of(p);
            }
        }
        return found.stream().filter(p -> {
            String n = p.getFileName().toString();
            return !n.contains("_acq-") && !n.contains("_run-") && !n.contains("status_" + suffix);
        }).findFirst();
    }
}
