package org.echotrellis.image;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * Which echo of a segmented fast-spin-echo train acquires which phase-encoding line.
 *
 * <p>Lines are numbered j = 0 … L−1 from the most negative to the most positive phase-encoding
 * position; k = 0 is line c = ⌊L/2⌋. With E echoes per train there are S = L/E shots (L must be a
 * multiple of E). Rules (common practice, METHODS §13):
 * <ul>
 * <li>{@link Kind#LINEAR} without a centre echo: echo e (1-based) of every shot acquires the
 *     contiguous segment of lines (e−1)·S … e·S−1;</li>
 * <li>{@link Kind#LINEAR} with centre echo C: the segment order is rotated so that echo C acquires
 *     the segment m = ⌊c/S⌋ that holds line c: echo e acquires segment (e − C + m) mod E;</li>
 * <li>{@link Kind#CENTRIC}: lines sorted by |j − c| (ties: the negative side first) are split into
 *     E consecutive groups of S; echo e acquires group e.</li>
 * </ul>
 *
 * @param lines number of phase-encoding lines L
 * @param echoes echoes per train E
 * @param kind ordering rule
 * @param centerEcho 1-based echo placed at k = 0 for rotated linear ordering, or 0 for none
 */
public record KSpaceOrdering(int lines, int echoes, Kind kind, int centerEcho) {
    /** Largest number of phase-encoding lines accepted. */
    public static final int MAX_LINES = 4096;

    /** Ordering rules. */
    public enum Kind {
        /** Contiguous segments, optionally rotated. */
        LINEAR,
        /** Centre out, alternating sides. */
        CENTRIC
    }

    /**
     * Validates.
     *
     * @param lines number of phase-encoding lines L
     * @param echoes echoes per train E
     * @param kind ordering rule
     * @param centerEcho 1-based echo placed at k = 0 for rotated linear ordering, or 0 for none
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public KSpaceOrdering {
        Checks.inRange("phase_lines", lines, 1, MAX_LINES, null);
        Checks.inRange("echoes per train", echoes, 1, MAX_LINES, null);
        if (lines % echoes != 0) {
            throw new InputException("phase_lines " + lines + " must be a multiple of the " + echoes
                    + " echoes per train (shots = lines / echoes)");
        }
        if (kind == null) {
            throw new InputException("ordering must be linear or centric");
        }
        if (kind == Kind.CENTRIC && centerEcho != 0) {
            throw new InputException("center_echo " + centerEcho + " applies to ordering linear only "
                    + "(centric ordering places echo 1 at the centre)");
        }
        if (centerEcho != 0) {
            Checks.inRange("center_echo", centerEcho, 1, echoes, null);
        }
    }

    /**
     * @param lines number of phase-encoding lines L, 1 to {@link #MAX_LINES}
     * @param echoes echoes per train E; L must be a multiple of E
     * @return linear ordering without rotation
     * @throws org.echotrellis.InputException if L is out of range or not a multiple of E
     */
    public static KSpaceOrdering linear(int lines, int echoes) {
        return new KSpaceOrdering(lines, echoes, Kind.LINEAR, 0);
    }

    /**
     * @param lines number of phase-encoding lines L, 1 to {@link #MAX_LINES}
     * @param echoes echoes per train E; L must be a multiple of E
     * @param centerEcho 1-based echo that acquires k = 0, 1 to E
     * @return linear ordering rotated so that echo {@code centerEcho} (1-based) acquires k = 0
     * @throws org.echotrellis.InputException if L is out of range or not a multiple of E, or the centre echo is outside 1 to E
     */
    public static KSpaceOrdering linear(int lines, int echoes, int centerEcho) {
        Checks.inRange("center_echo", centerEcho, 1, Math.max(1, echoes), null);
        return new KSpaceOrdering(lines, echoes, Kind.LINEAR, centerEcho);
    }

    /**
     * @param lines number of phase-encoding lines L, 1 to {@link #MAX_LINES}
     * @param echoes echoes per train E; L must be a multiple of E
     * @return centric ordering
     * @throws org.echotrellis.InputException if L is out of range or not a multiple of E
     */
    public static KSpaceOrdering centric(int lines, int echoes) {
        return new KSpaceOrdering(lines, echoes, Kind.CENTRIC, 0);
    }

    /** @return shots S = L / E */
    public int shots() {
        return lines / echoes;
    }

    /** @return the line at k = 0, ⌊L/2⌋ */
    public int centreLine() {
        return lines / 2;
    }

    /**
     * @return for every line j, the 0-based index of the echo that acquires it (a new array)
     */
    public int[] echoOfLine() {
        int s = shots();
        int c = centreLine();
        int[] echo = new int[lines];
        if (kind == Kind.CENTRIC) {
            // rank r = 0, 1, 2, ...: c, c−1, c+1, c−2, c+2, ... (negative side first), skipping lines off the grid
            int r = 0;
            for (int d = 0; r < lines; d++) {
                if (d == 0) {
                    echo[c] = r++ / s;
                    continue;
                }
                if (c - d >= 0) {
                    echo[c - d] = r++ / s;
                }
                if (c + d < lines) {
                    echo[c + d] = r++ / s;
                }
            }
            return echo;
        }
        int shift = centerEcho == 0 ? 0 : Math.floorMod(c / s - (centerEcho - 1), echoes);
        for (int j = 0; j < lines; j++) {
            int segment = j / s;
            echo[j] = Math.floorMod(segment - shift, echoes);
        }
        return echo;
    }

    /** @return the 0-based index of the echo that acquires line L/2 (sets the effective TE) */
    public int centreEchoIndex() {
        return echoOfLine()[centreLine()];
    }

    /** @return a short description, e.g. "linear, centre echo 8" */
    public String describe() {
        if (kind == Kind.CENTRIC) {
            return "centric";
        }
        return centerEcho == 0 ? "linear" : "linear, centre echo " + centerEcho;
    }
}
