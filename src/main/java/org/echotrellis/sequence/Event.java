package org.echotrellis.sequence;

/** One event of a sequence: an RF pulse, a free interval, or an echo read-out. */
public sealed interface Event {

    /**
     * Instantaneous RF rotation.
     *
     * @param flipDeg nominal flip in degrees, [0, 360] (multiplied by the B1 scale when simulated)
     * @param phaseDeg RF phase in degrees (axis of rotation in the transverse plane; 0 = x, 90 = y)
     * @param pulse the pulse's envelope and duration when given (RF exposure); the rotation still acts
     *     at one instant
     */
    record Rf(double flipDeg, double phaseDeg, java.util.Optional<RfPulse> pulse) implements Event {
        /**
         * Defaults a missing pulse to empty.
         *
         * @param flipDeg nominal flip in degrees, [0, 360] (multiplied by the B1 scale when simulated)
         * @param phaseDeg RF phase in degrees (axis of rotation in the transverse plane; 0 = x, 90 = y)
         * @param pulse the pulse's envelope and duration when given (RF exposure); the rotation still acts
         *     at one instant
         */
        public Rf {
            pulse = pulse == null ? java.util.Optional.empty() : pulse;
        }

        /**
         * A hard pulse.
         *
         * @param flipDeg flip in degrees
         * @param phaseDeg phase in degrees
         */
        public Rf(double flipDeg, double phaseDeg) {
            this(flipDeg, phaseDeg, java.util.Optional.empty());
        }
    }

    /**
     * Free precession: relaxation over the duration and a gradient adding {@code dephasing} orders.
     *
     * @param durationMs duration in ms (&gt; 0)
     * @param dephasing integer number of dephasing orders added (0 none, negative allowed)
     */
    record Interval(double durationMs, int dephasing) implements Event { }

    /**
     * Records F+<sub>0</sub> at this instant.
     *
     * @param label a name for the echo (may be empty)
     */
    record Echo(String label) implements Event { }
}
