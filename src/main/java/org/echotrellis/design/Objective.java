package org.echotrellis.design;

import java.util.function.Function;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * What a budgeted schedule maximises (option {@code --objective}); echo indices are 1-based.
 * <ul>
 * <li>{@code signal:ECHO} — |echo| of the design tissue at the effective echo;</li>
 * <li>{@code min:FROM:TO} — the smallest |echo| of the design tissue over a window;</li>
 * <li>{@code contrast:ECHO:TISSUE_A[:TISSUE_B]} — ||S_A| − |S_B|| at the effective echo
 *     (TISSUE_B defaults to the design tissue).</li>
 * </ul>
 */
public sealed interface Objective {
    /** @return option syntax */
    String spec();

    /** @return highest echo index the objective reads */
    int lastEcho();

    /** Signal at one echo. @param echo 1-based echo index */
    record SignalAt(int echo) implements Objective {
        /** Validates the index. */
        public SignalAt {
            Checks.inRange("--objective signal echo", echo, 1, DesignProblem.MAX_ECHOES, null);
        }

        @Override
        public String spec() {
            return "signal:" + echo;
        }

        @Override
        public int lastEcho() {
            return echo;
        }
    }

    /** Smallest echo over a window. @param from first echo @param to last echo (inclusive) */
    record MinOver(int from, int to) implements Objective {
        /** Validates the window. */
        public MinOver {
            Checks.inRange("--objective min FROM", from, 1, DesignProblem.MAX_ECHOES, null);
            Checks.inRange("--objective min TO", to, from, DesignProblem.MAX_ECHOES, null);
        }

        @Override
        public String spec() {
            return "min:" + from + ":" + to;
        }

        @Override
        public int lastEcho() {
            return to;
        }
    }

    /**
     * Contrast between two tissues at one echo.
     *
     * @param echo 1-based echo index
     * @param nameA first tissue @param t1A its T1 in ms @param t2A its T2 in ms
     * @param nameB second tissue @param t1B its T1 in ms @param t2B its T2 in ms
     */
    record Contrast(int echo, String nameA, double t1A, double t2A, String nameB, double t1B, double t2B)
            implements Objective {
        /** Validates the index and relaxation times. */
        public Contrast {
            Checks.inRange("--objective contrast echo", echo, 1, DesignProblem.MAX_ECHOES, null);
            Checks.positiveOrInfinite("t1_ms of " + nameA, t1A, "--objective");
            Checks.positiveOrInfinite("t2_ms of " + nameA, t2A, "--objective");
            Checks.positiveOrInfinite("t1_ms of " + nameB, t1B, "--objective");
            Checks.positiveOrInfinite("t2_ms of " + nameB, t2B, "--objective");
        }

        @Override
        public String spec() {
            return "contrast:" + echo + ":" + nameA + ":" + nameB;
        }

        @Override
        public int lastEcho() {
            return echo;
        }
    }

    /**
     * Parses the option.
     *
     * @param spec option value
     * @param design the design problem (its tissue is the default second tissue)
     * @param tissues looks up a tissue name and returns {T1 ms, T2 ms}; throws InputException
     *                for unknown names
     * @return the objective
     */
    static Objective parse(String spec, DesignProblem design, Function<String, double[]> tissues) {
        String s = spec == null ? "" : spec.trim();
        String[] p = s.split(":", -1);
        String allowed = "allowed: signal:ECHO, min:FROM:TO, contrast:ECHO:TISSUE_A[:TISSUE_B]";
        Objective o;
        try {
            switch (p[0]) {
                case "signal":
                    Checks.require(p.length == 2, "--objective " + spec + ": " + allowed);
                    o = new SignalAt(Integer.parseInt(p[1]));
                    break;
                case "min":
                    Checks.require(p.length == 3, "--objective " + spec + ": " + allowed);
                    o = new MinOver(Integer.parseInt(p[1]), Integer.parseInt(p[2]));
                    break;
                case "contrast":
                    Checks.require(p.length == 3 || p.length == 4, "--objective " + spec + ": " + allowed);
                    double[] a = tissues.apply(p[2]);
                    String nameB = p.length == 4 ? p[3] : design.tissueName();
                    double[] b = p.length == 4 ? tissues.apply(p[3]) : new double[] {design.t1Ms(), design.t2Ms()};
                    o = new Contrast(Integer.parseInt(p[1]), p[2], a[0], a[1], nameB, b[0], b[1]);
                    break;
                default:
                    throw new InputException("--objective " + spec + " is not understood; " + allowed);
            }
        } catch (NumberFormatException e) {
            throw new InputException("--objective " + spec + ": echo indices must be integers; " + allowed);
        }
        Checks.require(o.lastEcho() <= design.echoes(), "--objective " + spec + " refers to echo "
                + o.lastEcho() + " but the train has " + design.echoes() + " echoes");
        return o;
    }
}
