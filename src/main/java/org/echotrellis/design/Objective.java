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
 *     (TISSUE_B defaults to the design tissue);</li>
 * <li>{@code psf:ECHO:LINES[:TISSUE[:MIN_SIGNAL[:MAX_SIDELOBE]]]} — the narrowest point-spread
 *     function of TISSUE (default: the design tissue) for LINES phase-encoding lines in linear
 *     ordering with echo ECHO at k = 0 (effective TE = ECHO × echo spacing), among schedules whose
 *     centre weight is at least MIN_SIGNAL (default 0) and whose largest side lobe is at most
 *     MAX_SIDELOBE of the peak (default 0.05: a spike of weight at k = 0 narrows the main lobe but
 *     spreads the rest into a pedestal); the value maximised is 1 / FWHM in 1/px (a schedule below
 *     the signal floor scores centre / MIN_SIGNAL − 1, one over the side-lobe limit minus its excess,
 *     both below 0);</li>
 * <li>{@code cnr:ECHO:LINES:MAX_FWHM_PX:TISSUE_A[:TISSUE_B]} — the largest contrast of the centre
 *     weights (the CNR for unit noise per pixel) in the same ordering, among schedules whose PSF
 *     FWHM is at most MAX_FWHM_PX for both tissues (a schedule over the width scores minus its
 *     excess width in px).</li>
 * </ul>
 * The image figures are those of {@link org.echotrellis.image.PointSpread}.
 */
public sealed interface Objective {
    /** @return option syntax */
    String spec();

    /** @return highest echo index the objective reads */
    int lastEcho();

    /**
     * Magnitude of the design tissue's echo at one echo.
     *
     * @param echo 1-based echo index
     */
    record SignalAt(int echo) implements Objective {
        /**
         * Checks the echo index.
         *
         * @param echo 1-based echo index
         * @throws org.echotrellis.InputException if the index is outside 1 to {@link DesignProblem#MAX_ECHOES}
         */
        public SignalAt {
            Checks.inRange("objective signal echo", echo, 1, DesignProblem.MAX_ECHOES, null);
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

    /**
     * Smallest echo magnitude of the design tissue over a window of echoes.
     *
     * @param from first echo of the window, 1-based
     * @param to   last echo of the window, 1-based and inclusive
     */
    record MinOver(int from, int to) implements Objective {
        /**
         * Checks the window.
         *
         * @param from first echo of the window, 1-based
         * @param to last echo of the window, 1-based and inclusive
         * @throws org.echotrellis.InputException if the window is empty or reaches beyond {@link DesignProblem#MAX_ECHOES}
         */
        public MinOver {
            Checks.inRange("objective min FROM", from, 1, DesignProblem.MAX_ECHOES, null);
            Checks.inRange("objective min TO", to, from, DesignProblem.MAX_ECHOES, null);
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
     * @param echo  1-based echo index
     * @param nameA first tissue's name
     * @param t1A   first tissue's T1 in ms (+Infinity for none)
     * @param t2A   first tissue's T2 in ms (+Infinity for none)
     * @param nameB second tissue's name
     * @param t1B   second tissue's T1 in ms (+Infinity for none)
     * @param t2B   second tissue's T2 in ms (+Infinity for none)
     */
    record Contrast(int echo, String nameA, double t1A, double t2A, String nameB, double t1B, double t2B)
            implements Objective {
        /**
         * Checks the echo index and the relaxation times.
         *
         * @param echo 1-based echo index
         * @param nameA first tissue's name
         * @param t1A first tissue's T1 in ms (+Infinity for none)
         * @param t2A first tissue's T2 in ms (+Infinity for none)
         * @param nameB second tissue's name
         * @param t1B second tissue's T1 in ms (+Infinity for none)
         * @param t2B second tissue's T2 in ms (+Infinity for none)
         * @throws org.echotrellis.InputException if the index is outside 1 to {@link DesignProblem#MAX_ECHOES} or a relaxation time is not &gt; 0
         */
        public Contrast {
            Checks.inRange("objective contrast echo", echo, 1, DesignProblem.MAX_ECHOES, null);
            Checks.positiveOrInfinite("t1_ms of " + nameA, t1A, "objective");
            Checks.positiveOrInfinite("t2_ms of " + nameA, t2A, "objective");
            Checks.positiveOrInfinite("t1_ms of " + nameB, t1B, "objective");
            Checks.positiveOrInfinite("t2_ms of " + nameB, t2B, "objective");
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
     * Narrowest PSF (largest 1 / FWHM) of one tissue, linear ordering with echo {@code echo} at k = 0.
     *
     * @param echo 1-based echo at k = 0
     * @param lines phase-encoding lines (a multiple of {@code echoes})
     * @param echoes echoes of the train
     * @param name tissue name
     * @param t1 the tissue's T1 in ms (+Infinity for none)
     * @param t2 the tissue's T2 in ms (+Infinity for none)
     * @param minSignal smallest acceptable centre weight (0 for none)
     * @param maxSidelobe largest acceptable side lobe relative to the PSF peak
     */
    record PsfWidth(int echo, int lines, int echoes, String name, double t1, double t2, double minSignal,
                    double maxSidelobe) implements Objective {
        /** Side-lobe limit when none is given. */
        public static final double DEFAULT_MAX_SIDELOBE = 0.05;

        /**
         * Checks the echo, the line count, the relaxation times and the limits.
         *
         * @param echo 1-based echo at k = 0
         * @param lines phase-encoding lines, a multiple of {@code echoes}
         * @param echoes echoes of the train
         * @param name tissue name
         * @param t1 the tissue's T1 in ms (+Infinity for none)
         * @param t2 the tissue's T2 in ms (+Infinity for none)
         * @param minSignal smallest acceptable centre weight, 0 to 1
         * @param maxSidelobe largest acceptable side lobe relative to the PSF peak, 0 to 1
         * @throws org.echotrellis.InputException if a value is outside its range or {@code lines} is not a multiple of {@code echoes}
         */
        public PsfWidth {
            Checks.inRange("objective psf ECHO", echo, 1, echoes, null);
            Checks.inRange("objective psf LINES", lines, 1, org.echotrellis.image.KSpaceOrdering.MAX_LINES, null);
            Checks.require(lines % echoes == 0, "objective psf LINES " + lines + " must be a multiple of the "
                    + echoes + " echoes of the train");
            Checks.positiveOrInfinite("t1_ms of " + name, t1, "objective");
            Checks.positiveOrInfinite("t2_ms of " + name, t2, "objective");
            Checks.inRange("objective psf MIN_SIGNAL", minSignal, 0, 1, null);
            Checks.inRange("objective psf MAX_SIDELOBE", maxSidelobe, 0, 1, null);
        }

        @Override
        public String spec() {
            return "psf:" + echo + ":" + lines + ":" + name + ":" + minSignal + ":" + maxSidelobe;
        }

        @Override
        public int lastEcho() {
            return echoes;
        }
    }

    /**
     * Largest contrast of the centre weights of two tissues whose PSFs are at most {@code maxFwhmPx}
     * wide, linear ordering with echo {@code echo} at k = 0.
     *
     * @param echo 1-based echo at k = 0
     * @param lines phase-encoding lines (a multiple of {@code echoes})
     * @param echoes echoes of the train
     * @param maxFwhmPx largest allowed FWHM in px (≥ 1, the delta)
     * @param nameA first tissue's name
     * @param t1A first tissue's T1 in ms (+Infinity for none)
     * @param t2A first tissue's T2 in ms (+Infinity for none)
     * @param nameB second tissue's name
     * @param t1B second tissue's T1 in ms (+Infinity for none)
     * @param t2B second tissue's T2 in ms (+Infinity for none)
     */
    record ContrastAtWidth(int echo, int lines, int echoes, double maxFwhmPx, String nameA, double t1A, double t2A,
                           String nameB, double t1B, double t2B) implements Objective {
        /**
         * Checks the echo, the line count, the width limit and the relaxation times.
         *
         * @param echo 1-based echo at k = 0
         * @param lines phase-encoding lines, a multiple of {@code echoes}
         * @param echoes echoes of the train
         * @param maxFwhmPx largest allowed FWHM in px, 1 to {@code lines}
         * @param nameA first tissue's name
         * @param t1A first tissue's T1 in ms (+Infinity for none)
         * @param t2A first tissue's T2 in ms (+Infinity for none)
         * @param nameB second tissue's name
         * @param t1B second tissue's T1 in ms (+Infinity for none)
         * @param t2B second tissue's T2 in ms (+Infinity for none)
         * @throws org.echotrellis.InputException if a value is outside its range or {@code lines} is not a multiple of {@code echoes}
         */
        public ContrastAtWidth {
            Checks.inRange("objective cnr ECHO", echo, 1, echoes, null);
            Checks.inRange("objective cnr LINES", lines, 1, org.echotrellis.image.KSpaceOrdering.MAX_LINES, null);
            Checks.require(lines % echoes == 0, "objective cnr LINES " + lines + " must be a multiple of the "
                    + echoes + " echoes of the train");
            Checks.inRange("objective cnr MAX_FWHM_PX", maxFwhmPx, 1, lines, null);
            Checks.positiveOrInfinite("t1_ms of " + nameA, t1A, "objective");
            Checks.positiveOrInfinite("t2_ms of " + nameA, t2A, "objective");
            Checks.positiveOrInfinite("t1_ms of " + nameB, t1B, "objective");
            Checks.positiveOrInfinite("t2_ms of " + nameB, t2B, "objective");
        }

        @Override
        public String spec() {
            return "cnr:" + echo + ":" + lines + ":" + maxFwhmPx + ":" + nameA + ":" + nameB;
        }

        @Override
        public int lastEcho() {
            return echoes;
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
        String allowed = "allowed: signal:ECHO, min:FROM:TO, contrast:ECHO:TISSUE_A[:TISSUE_B], "
                + "psf:ECHO:LINES[:TISSUE[:MIN_SIGNAL[:MAX_SIDELOBE]]], cnr:ECHO:LINES:MAX_FWHM_PX:TISSUE_A[:TISSUE_B]";
        Objective o;
        try {
            switch (p[0]) {
                case "signal":
                    Checks.require(p.length == 2, "objective " + spec + ": " + allowed);
                    o = new SignalAt(Integer.parseInt(p[1]));
                    break;
                case "min":
                    Checks.require(p.length == 3, "objective " + spec + ": " + allowed);
                    o = new MinOver(Integer.parseInt(p[1]), Integer.parseInt(p[2]));
                    break;
                case "contrast":
                    Checks.require(p.length == 3 || p.length == 4, "objective " + spec + ": " + allowed);
                    double[] a = tissues.apply(p[2]);
                    String nameB = p.length == 4 ? p[3] : design.tissueName();
                    double[] b = p.length == 4 ? tissues.apply(p[3]) : new double[] {design.t1Ms(), design.t2Ms()};
                    o = new Contrast(Integer.parseInt(p[1]), p[2], a[0], a[1], nameB, b[0], b[1]);
                    break;
                case "psf": {
                    Checks.require(p.length >= 3 && p.length <= 6, "objective " + spec + ": " + allowed);
                    String name = p.length >= 4 ? p[3] : design.tissueName();
                    double[] t = p.length >= 4 ? tissues.apply(p[3]) : new double[] {design.t1Ms(), design.t2Ms()};
                    o = new PsfWidth(Integer.parseInt(p[1]), Integer.parseInt(p[2]), design.echoes(), name, t[0], t[1],
                            p.length >= 5 ? Double.parseDouble(p[4]) : 0,
                            p.length == 6 ? Double.parseDouble(p[5]) : PsfWidth.DEFAULT_MAX_SIDELOBE);
                    break;
                }
                case "cnr": {
                    Checks.require(p.length == 5 || p.length == 6, "objective " + spec + ": " + allowed);
                    double[] ta = tissues.apply(p[4]);
                    String second = p.length == 6 ? p[5] : design.tissueName();
                    double[] tb = p.length == 6 ? tissues.apply(p[5]) : new double[] {design.t1Ms(), design.t2Ms()};
                    o = new ContrastAtWidth(Integer.parseInt(p[1]), Integer.parseInt(p[2]), design.echoes(),
                            Double.parseDouble(p[3]), p[4], ta[0], ta[1], second, tb[0], tb[1]);
                    break;
                }
                default:
                    throw new InputException("objective " + spec + " is not understood; " + allowed);
            }
        } catch (NumberFormatException e) {
            throw new InputException("objective " + spec + ": echo indices and line counts must be integers "
                    + "(MAX_FWHM_PX a number); " + allowed);
        }
        Checks.require(o.lastEcho() <= design.echoes(), "objective " + spec + " refers to echo "
                + o.lastEcho() + " but the train has " + design.echoes() + " echoes");
        return o;
    }
}
