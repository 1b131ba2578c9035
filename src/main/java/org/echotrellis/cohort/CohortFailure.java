package org.echotrellis.cohort;

import java.io.Serializable;
import java.util.List;

/**
 * A subject/session that produced no outputs, with the stage that failed and a one-line message.
 *
 * @param subject participant label (without {@code sub-})
 * @param session session label, empty if none
 * @param stage {@code read} (collections, sidecars, protocol), {@code analysis} (reading the series,
 *        fit/spectrum, writing the maps), {@code labels} or {@code write} (statistics, publishing)
 * @param message one line naming the file and the problem
 * @serial exclude
 */
public record CohortFailure(String subject, String session, String stage, String message) implements Serializable {
    private static final long serialVersionUID = 1L;

    /** Column names of {@code cohort-failures.csv}. */
    public static final List<String> COLUMNS = List.of("subject", "session", "stage", "message");

    /**
     * Keeps only the first line of the message.
     *
     * @param subject participant label (without {@code sub-})
     * @param session session label, empty if none
     * @param stage {@code read} (collections, sidecars, protocol), {@code analysis} (reading the series,
     *        fit/spectrum, writing the maps), {@code labels} or {@code write} (statistics, publishing)

     * @param message one line naming the file and the problem
     */
    public CohortFailure {
        message = message == null ? "" : message.split("\\R", 2)[0];
    }

    /** @return the values in {@link #COLUMNS} order */
    public List<Object> values() {
        return List.of(subject, session, stage, message);
    }
}
