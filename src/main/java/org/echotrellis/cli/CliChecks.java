package org.echotrellis.cli;

import org.echotrellis.InputException;

/** Validation of command-line option values; messages name the option. */
final class CliChecks {
    private CliChecks() { }

    static double positiveOrInf(String option, double v) {
        if (!(v > 0)) {
            throw new InputException(option + " must be > 0 (or Infinity), got " + v);
        }
        return v;
    }

    static double b1(String option, double v) {
        if (!(v > 0) || v > 5 || Double.isNaN(v)) {
            throw new InputException(option + " must be within (0, 5], got " + v);
        }
        return v;
    }

    static int threads(int n) {
        if (n < 1 || n > 1024) {
            throw new InputException("--threads must be within [1, 1024], got " + n);
        }
        return n;
    }
}
