package org.echotrellis;

/**
 * Eager validation helpers. Every message names the parameter, the rule and the value, plus an
 * optional location (file and line, or option name), for example
 * {@code "t2_ms must be > 0, got -5 (sequences/knee.yaml line 4)"}.
 */
public final class Checks {
    private Checks() { }

    private static String at(String where) {
        return where == null || where.isEmpty() ? "" : " (" + where + ")";
    }

    /**
     * Requires a finite value strictly greater than zero.
     *
     * @param name  the parameter's name as the user wrote it (option or file key)
     * @param value the value to check
     * @param where the location for the message (file and line, or option), or null/empty for none
     * @return {@code value}, unchanged
     * @throws InputException if the value is zero, negative, NaN or infinite
     */
    public static double positive(String name, double value, String where) {
        if (!(value > 0) || Double.isNaN(value) || Double.isInfinite(value)) {
            throw new InputException(name + " must be a finite number > 0, got " + value + at(where));
        }
        return value;
    }

    /**
     * Requires a value strictly greater than zero; positive infinity is allowed (no relaxation).
     *
     * @param name  the parameter's name as the user wrote it (option or file key)
     * @param value the value to check
     * @param where the location for the message (file and line, or option), or null/empty for none
     * @return {@code value}, unchanged
     * @throws InputException if the value is zero, negative or NaN
     */
    public static double positiveOrInfinite(String name, double value, String where) {
        if (!(value > 0) || Double.isNaN(value)) {
            throw new InputException(name + " must be > 0 (or .inf for none), got " + value + at(where));
        }
        return value;
    }

    /**
     * Requires a finite value within [lo, hi].
     *
     * @param name  the parameter's name as the user wrote it (option or file key)
     * @param value the value to check
     * @param lo    the smallest allowed value
     * @param hi    the largest allowed value
     * @param where the location for the message (file and line, or option), or null/empty for none
     * @return {@code value}, unchanged
     * @throws InputException if the value is NaN or outside [lo, hi]
     */
    public static double inRange(String name, double value, double lo, double hi, String where) {
        if (Double.isNaN(value) || value < lo || value > hi) {
            throw new InputException(name + " must be within [" + fmt(lo) + ", " + fmt(hi) + "], got " + value + at(where));
        }
        return value;
    }

    /**
     * Requires a finite value.
     *
     * @param name  the parameter's name as the user wrote it (option or file key)
     * @param value the value to check
     * @param where the location for the message (file and line, or option), or null/empty for none
     * @return {@code value}, unchanged
     * @throws InputException if the value is NaN or infinite
     */
    public static double finite(String name, double value, String where) {
        if (Double.isNaN(value) || Double.isInfinite(value)) {
            throw new InputException(name + " must be a finite number, got " + value + at(where));
        }
        return value;
    }

    /**
     * Requires an integer within [lo, hi].
     *
     * @param name  the parameter's name as the user wrote it (option or file key)
     * @param value the value to check
     * @param lo    the smallest allowed value
     * @param hi    the largest allowed value
     * @param where the location for the message (file and line, or option), or null/empty for none
     * @return {@code value}, unchanged
     * @throws InputException if the value is outside [lo, hi]
     */
    public static int inRange(String name, int value, int lo, int hi, String where) {
        if (value < lo || value > hi) {
            throw new InputException(name + " must be within [" + lo + ", " + hi + "], got " + value + at(where));
        }
        return value;
    }

    /**
     * Requires a condition; the message is given whole.
     *
     * @param condition the rule that must hold
     * @param message   the complete one-line message (option or file, value and what is allowed)
     * @throws InputException if {@code condition} is false
     */
    public static void require(boolean condition, String message) {
        if (!condition) {
            throw new InputException(message);
        }
    }

    private static String fmt(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }
}
