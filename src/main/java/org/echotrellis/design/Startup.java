package org.echotrellis.design;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * How the first echoes of a prescribed-signal design are stabilised (option {@code --startup}).
 * <ul>
 * <li>{@code none}: every echo is inverted to the target from echo 1.</li>
 * <li>{@code alsop}: the first refocusing pulse is 90° + α/2, where α is the constant flip whose
 *     static pseudo-steady state matches the target at echo 2 (Alsop, MRM 37:176, 1997); the
 *     inversion starts at echo 2.</li>
 * <li>{@code ramp:N}: over the first N echoes the target is blended from the largest echo reachable
 *     at that echo down to the prescription, weight (N+1−n)/(N+1) on the former, for a smooth
 *     transition between pseudo-steady states (Hennig, Weigel &amp; Scheffler, MRM 49:527, 2003); in a
 *     train no longer than the ramp it covers every echo but the last, which keeps the prescription.</li>
 * </ul>
 */
public sealed interface Startup {
    /**
     * @param trainEchoes echoes of the whole train
     * @return number of start-up echoes for a train of the given length
     */
    int echoes(int trainEchoes);

    /** @return option syntax */
    String spec();

    /** No start-up. */
    record None() implements Startup {
        @Override
        public int echoes(int trainEchoes) {
            return 0;
        }

        @Override
        public String spec() {
            return "none";
        }
    }

    /** First pulse 90° + α/2. */
    record Alsop() implements Startup {
        @Override
        public int echoes(int trainEchoes) {
            return Math.min(1, trainEchoes - 1);
        }

        @Override
        public String spec() {
            return "alsop";
        }
    }

    /**
     * Blended ramp over the first echoes.
     *
     * @param length number of echoes (1 to 64)
     */
    record Ramp(int length) implements Startup {
        /**
         * Validates the length.
         *
         * @param length number of echoes (1 to 64)
         * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
         */
        public Ramp {
            Checks.inRange("startup ramp length", length, 1, 64, null);
        }

        @Override
        public int echoes(int trainEchoes) {
            return Math.max(0, Math.min(length, trainEchoes - 1));   // the last echo keeps the prescription
        }

        @Override
        public String spec() {
            return "ramp:" + length;
        }
    }

    /**
     * Parses {@code none}, {@code alsop} or {@code ramp:N}.
     *
     * @param spec option value
     * @return the start-up
     */
    static Startup parse(String spec) {
        String s = spec == null ? "" : spec.trim();
        if (s.equals("none")) {
            return new None();
        }
        if (s.equals("alsop")) {
            return new Alsop();
        }
        if (s.startsWith("ramp:")) {
            try {
                return new Ramp(Integer.parseInt(s.substring(5)));
            } catch (NumberFormatException e) {
                throw new InputException("startup " + spec + ": N must be an integer; allowed: none, alsop, ramp:N");
            }
        }
        throw new InputException("startup " + spec + " is not understood; allowed: none, alsop, ramp:N");
    }
}
