package org.echotrellis.cohort;

import java.io.Serializable;

import org.apache.hadoop.fs.Path;

/**
 * One task of the cohort: a subject, or one session of a subject. Its outputs are the derivatives
 * directory {@code sub-<L>/} (or {@code sub-<L>/ses-<S>/}) below the output directory, published
 * as a whole; the per-unit statistics file in it marks the unit complete.
 *
 * @param subject participant label (without {@code sub-})
 * @param session session label, empty if the subject has no session directories
 */
record SubjectUnit(String subject, String session) implements Serializable {
    private static final long serialVersionUID = 1L;

    /** @return {@code sub-L} or {@code sub-L/ses-S} */
    String relativeDir() {
        return "sub-" + subject + (session.isEmpty() ? "" : "/ses-" + session);
    }

    /** @return {@code sub-L} or {@code sub-L_ses-S} */
    String prefix() {
        return "sub-" + subject + (session.isEmpty() ? "" : "_ses-" + session);
    }

    /**
     * @param outputDir the derivatives dataset
     * @return the unit's directory in it
     */
    Path outputDir(Path outputDir) {
        return new Path(outputDir, relativeDir());
    }

    /**
     * @param outputDir the derivatives dataset
     * @return the statistics file written last into the unit's directory
     */
    Path statsFile(Path outputDir) {
        return new Path(outputDir(outputDir), statsName());
    }

    /** @return {@code sub-L[_ses-S]_desc-regions_mapstats.csv} */
    String statsName() {
        return prefix() + "_desc-regions_mapstats.csv";
    }

    /** @return e.g. {@code sub-01 ses-2} for messages */
    String label() {
        return "sub-" + subject + (session.isEmpty() ? "" : " ses-" + session);
    }
}
