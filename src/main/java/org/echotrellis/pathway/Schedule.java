package org.echotrellis.pathway;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.echotrellis.Checks;

/**
 * The event list the pathway analysis works on: RF pulses, free intervals (duration and dephasing
 * step) and echo read-outs, in time order, compiled into flat arrays. Built from a protocol's event
 * model ({@link PathwayAnalysis}) or directly with {@link #builder()}.
 *
 * <p>A <em>period</em> is the stretch between two consecutive RF pulses (period 0 lies before the
 * first pulse, period p follows pulse p). A pathway changes state only at pulses, so its state is
 * fixed within a period; the class index m of the decomposition counts the periods (of non-zero
 * duration) that a pathway spends as dephased longitudinal magnetization.
 *
 * <p>Immutable and thread-safe.
 */
final class Schedule {
    /** Largest workspace the pathway analysis allocates for one schedule (bytes). */
    public static final long MAX_WORKSPACE_BYTES = 256L << 20;
    /** Largest class decomposition accepted, in state updates (about half a minute on one core). */
    public static final long MAX_STATE_UPDATES = 3_000_000_000L;

    static final byte RF = 0;
    static final byte INTERVAL = 1;
    static final byte ECHO = 2;

    final byte[] op;
    /** RF: flip in rad (before the B1 scale); INTERVAL: duration in ms. */
    final double[] value;
    /** RF: phase in rad; INTERVAL: dephasing step (integer). */
    final double[] second;
    final String[] labels;
    final double[] echoTimesMs;
    final int echoCount;
    final int rfCount;
    /** Largest |k| that can still reach k = 0 before the last echo, after each operation. */
    final int[] window;
    final int maxOrder;
    /** Number of periods that contain at least one interval: the class index never exceeds it. */
    final int timedPeriods;
    /** Estimated state updates of one class decomposition (classes held &times; orders, summed over operations). */
    final long stateUpdates;
    /** Classes of echo e occupy [classOffset[e], classOffset[e + 1]) in a flattened decomposition. */
    final int[] classOffset;

    private Schedule(Builder b) {
        int n = b.ops.size();
        op = new byte[n];
        value = new double[n];
        second = new double[n];
        labels = b.labels.toArray(new String[0]);
        echoTimesMs = new double[labels.length];
        int rf = 0;
        int echoes = 0;
        int lastEcho = -1;
        int timed = 0;
        boolean periodTimed = false;
        double t = 0;
        for (int i = 0; i < n; i++) {
            double[] o = b.ops.get(i);
            op[i] = (byte) o[0];
            value[i] = o[1];
            second[i] = o[2];
            switch (op[i]) {
                case RF -> {
                    rf++;
                    periodTimed = false;
                }
                case INTERVAL -> {
                    t += value[i];
                    if (!periodTimed) {
                        timed++;
                        periodTimed = true;
                    }
                }
                default -> {
                    echoTimesMs[echoes++] = t;
                    lastEcho = i;
                }
            }
        }
        // An echo pathway is transverse in the echo's own period, and only Z0 exists in periods 0
        // and 1 (before and just after the first pulse), so its class is at most the number of
        // timed periods from period 2 up to the one before the echo's.
        classOffset = new int[echoes + 1];
        int e = 0;
        int between = 0;
        int pulses = 0;
        boolean timedHere = false;
        for (int i = 0; i < n; i++) {
            if (op[i] == RF) {
                if (timedHere && pulses >= 2) {
                    between++;
                }
                pulses++;
                timedHere = false;
            } else if (op[i] == INTERVAL) {
                timedHere = true;
            } else {
                classOffset[e + 1] = classOffset[e] + between + 1;
                e++;
            }
        }
        rfCount = rf;
        echoCount = echoes;
        timedPeriods = timed;
        window = new int[n];
        int[] reachAfter = new int[n];
        int reach = 0;
        for (int i = n - 1; i >= 0; i--) {
            reachAfter[i] = i >= lastEcho ? 0 : reach;
            if (op[i] == INTERVAL && i < lastEcho) {
                reach += Math.abs((int) second[i]);
            }
        }
        int past = 0;
        int max = 0;
        long updates = 0;
        int classes = 1;
        boolean counted = false;
        for (int i = 0; i < n; i++) {
            if (op[i] == INTERVAL) {
                past += Math.abs((int) second[i]);
                if (!counted) {
                    classes++;
                    counted = true;
                }
            } else if (op[i] == RF) {
                counted = false;
            }
            window[i] = Math.min(past, reachAfter[i]);
            max = Math.max(max, window[i]);
            updates += (long) classes * (window[i] + 1);
        }
        maxOrder = max;
        stateUpdates = updates;
    }

    /** @return number of echo read-outs */
    public int echoCount() {
        return echoCount;
    }

    /** @return number of RF pulses */
    public int rfCount() {
        return rfCount;
    }

    /** @return number of operations (pulses, intervals and read-outs) */
    public int opCount() {
        return op.length;
    }

    /** @return the highest dephasing order that can still contribute to an echo */
    public int maxOrder() {
        return maxOrder;
    }

    /**
     * @param echo echo index, 0-based
     * @return number of classes (m = 0 .. count&minus;1) the decomposition reports for that echo
     */
    public int classCount(int echo) {
        return classOffset[echo + 1] - classOffset[echo];
    }

    /** @return bytes of the class tracker's workspace: (classes) &times; (3K + 2) complex numbers */
    public long classWorkspaceBytes() {
        return 16L * (timedPeriods + 1) * (3L * maxOrder + 2);
    }

    /**
     * Refuses schedules whose class decomposition would need more than {@link #MAX_WORKSPACE_BYTES}
     * or more than {@link #MAX_STATE_UPDATES} state updates.
     */
    void checkWorkspace() {
        long bytes = classWorkspaceBytes();
        if (bytes > MAX_WORKSPACE_BYTES) {
            throw new org.echotrellis.InputException(String.format(java.util.Locale.ROOT,
                    "pathway analysis of this protocol needs %d MB (%d periods x dephasing orders up to %d); "
                            + "the limit is %d MB: use fewer echoes or smaller dephasing steps",
                    bytes >> 20, timedPeriods, maxOrder, MAX_WORKSPACE_BYTES >> 20));
        }
        if (stateUpdates > MAX_STATE_UPDATES) {
            throw new org.echotrellis.InputException(String.format(java.util.Locale.ROOT,
                    "pathway analysis of this protocol needs about %.1e state updates (%d periods x dephasing orders "
                            + "up to %d); the limit is %.0e: use fewer echoes or smaller dephasing steps",
                    (double) stateUpdates, timedPeriods, maxOrder, (double) MAX_STATE_UPDATES));
        }
    }

    /** @return echo labels in read-out order (a copy) */
    public List<String> echoLabels() {
        return List.of(labels);
    }

    /** @return echo times in ms from the start of the list (a copy) */
    public double[] echoTimesMs() {
        return echoTimesMs.clone();
    }

    /** @return a new builder */
    public static Builder builder() {
        return new Builder();
    }

    @Override
    public String toString() {
        return "Schedule[ops=" + op.length + ", pulses=" + rfCount + ", echoes=" + echoCount
                + ", maxOrder=" + maxOrder + ", echoTimesMs=" + Arrays.toString(echoTimesMs) + "]";
    }

    /** Collects events in time order. Not thread-safe. */
    static final class Builder {
        private final List<double[]> ops = new ArrayList<>();
        private final List<String> labels = new ArrayList<>();

        private Builder() { }

        /**
         * An instantaneous RF rotation.
         *
         * @param flipDeg nominal flip in degrees, [0, 360] (the B1 scale is applied at analysis time)
         * @param phaseDeg RF phase in degrees (rotation axis in the transverse plane)
         * @return this builder
         */
        public Builder rf(double flipDeg, double phaseDeg) {
            Checks.inRange("flip_deg", flipDeg, 0, 360, null);
            Checks.finite("phase_deg", phaseDeg, null);
            ops.add(new double[] {RF, Math.toRadians(flipDeg), Math.toRadians(phaseDeg)});
            return this;
        }

        /**
         * A free interval: relaxation over the duration and an integer dephasing step.
         *
         * @param durationMs duration in ms, &gt; 0
         * @param dephasing dephasing orders added (negative allowed, |d| &le; 1000)
         * @return this builder
         */
        public Builder interval(double durationMs, int dephasing) {
            Checks.positive("duration_ms", durationMs, null);
            Checks.inRange("dephasing", dephasing, -1000, 1000, null);
            ops.add(new double[] {INTERVAL, durationMs, dephasing});
            return this;
        }

        /**
         * An echo read-out of F+<sub>0</sub>.
         *
         * @param label echo label (null or empty: "echo N")
         * @return this builder
         */
        public Builder echo(String label) {
            String l = label == null || label.isBlank() ? "echo " + (labels.size() + 1) : label;
            labels.add(l);
            ops.add(new double[] {ECHO, 0, 0});
            return this;
        }

        /** @return this builder, with an unlabelled echo read-out appended */
        public Builder echo() {
            return echo(null);
        }

        /** @return the compiled schedule */
        public Schedule build() {
            return new Schedule(this);
        }
    }
}
