package org.echotrellis.epg;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.echotrellis.Checks;

/**
 * An event list (RF pulses, free intervals with a dephasing step, echo read-outs) compiled for the
 * {@link GeneralEngine}: operation codes in flat arrays, unique flips and durations tabulated so that
 * trigonometric and exponential factors are computed once per run, and for every operation the
 * largest dephasing order that can still reach k = 0 before the last echo ("reach"), which bounds the
 * states the engine must update (states beyond it can never contribute to a recorded echo).
 *
 * <p>Immutable and thread-safe once built.
 */
public final class EpgProgram {
    static final byte RF = 0;
    static final byte INTERVAL = 1;
    static final byte ECHO = 2;

    final byte[] op;
    /** RF: index into flipsRad; INTERVAL: index into durationsMs. */
    final int[] table;
    /** RF: phase in rad, reduced to [0, 2 pi) so that repeated phases are recognised. */
    final double[] phaseRad;
    final int[] dephasing;
    /** Largest |k| whose state can still contribute to a later echo, after this operation. */
    final int[] window;
    final double[] flipsRad;
    final double[] durationsMs;
    final int echoCount;
    /** Maximum window over the program: the engine stores orders -maxOrder..maxOrder. */
    final int maxOrder;
    /** Buffer layout of the F array: position of k = 0 at the start, and buffer length. */
    final int startBase;
    final int bufferLength;

    private EpgProgram(Builder b) {
        int n = b.ops.size();
        op = new byte[n];
        table = new int[n];
        phaseRad = new double[n];
        dephasing = new int[n];
        Map<Long, Integer> flipIndex = new HashMap<>();
        Map<Long, Integer> durationIndex = new HashMap<>();
        List<Double> flips = new ArrayList<>();
        List<Double> durations = new ArrayList<>();
        int echoes = 0;
        int lastEcho = -1;
        for (int i = 0; i < n; i++) {
            double[] o = b.ops.get(i);
            op[i] = (byte) o[0];
            switch (op[i]) {
                case RF -> {
                    table[i] = indexOf(flips, flipIndex, Math.toRadians(o[1]));
                    double deg = o[2] - 360.0 * Math.floor(o[2] / 360.0);
                    phaseRad[i] = Math.toRadians(deg);
                }
                case INTERVAL -> {
                    table[i] = indexOf(durations, durationIndex, o[1]);
                    dephasing[i] = (int) o[2];
                }
                default -> {
                    echoes++;
                    lastEcho = i;
                }
            }
        }
        echoCount = echoes;
        flipsRad = flips.stream().mapToDouble(Double::doubleValue).toArray();
        durationsMs = durations.stream().mapToDouble(Double::doubleValue).toArray();
        // reach after op i = sum of |dephasing| of intervals after i up to the last echo
        window = new int[n];
        int reach = 0;
        int[] reachAfter = new int[n];
        for (int i = n - 1; i >= 0; i--) {
            reachAfter[i] = b.keepAll ? Integer.MAX_VALUE / 4 : i >= lastEcho ? 0 : reach;
            if (op[i] == INTERVAL && i < lastEcho) {
                reach += Math.abs(dephasing[i]);
            }
        }
        int top = 0;
        int cum = 0;
        int minCum = 0;
        int maxCum = 0;
        int maxWin = 0;
        for (int i = 0; i < n; i++) {
            if (op[i] == INTERVAL) {
                top += Math.abs(dephasing[i]);
                cum += dephasing[i];
                minCum = Math.min(minCum, cum);
                maxCum = Math.max(maxCum, cum);
            }
            window[i] = Math.min(top, reachAfter[i]);
            maxWin = Math.max(maxWin, window[i]);
        }
        maxOrder = maxWin;
        // base' = base - d: base ranges over startBase - maxCum .. startBase - minCum
        startBase = maxCum + maxOrder;
        bufferLength = (maxCum - minCum) + 2 * maxOrder + 1;
    }

    /** Index of v in the table of unique values (bitwise equality, as Double.compare), appending it if new. */
    private static int indexOf(List<Double> values, Map<Long, Integer> index, double v) {
        return index.computeIfAbsent(Double.doubleToLongBits(v), bits -> {
            values.add(v);
            return values.size() - 1;
        });
    }

    /** @return number of echo read-outs */
    public int echoCount() {
        return echoCount;
    }

    /** @return number of operations */
    public int opCount() {
        return op.length;
    }

    /** @return the highest dephasing order the engine needs to store */
    public int maxOrder() {
        return maxOrder;
    }

    /** @return a new builder */
    public static Builder builder() {
        return new Builder();
    }

    @Override
    public String toString() {
        return "EpgProgram[ops=" + op.length + ", echoes=" + echoCount + ", maxOrder=" + maxOrder
                + ", flips=" + Arrays.toString(flipsRad) + "]";
    }

    /** Collects operations in order. Not thread-safe. */
    public static final class Builder {
        private final List<double[]> ops = new ArrayList<>();
        private boolean keepAll;

        private Builder() { }

        /**
         * An instantaneous RF rotation.
         *
         * @param flipDeg flip in degrees, [0, 360]
         * @param phaseDeg RF phase in degrees (rotation axis in the transverse plane)
         * @return this builder
         */
        public Builder rf(double flipDeg, double phaseDeg) {
            Checks.inRange("flip_deg", flipDeg, 0, 360, null);
            Checks.finite("phase_deg", phaseDeg, null);
            ops.add(new double[] {RF, flipDeg, phaseDeg});
            return this;
        }

        /**
         * A free interval: relaxation over the duration, then a dephasing shift.
         *
         * @param durationMs duration in ms (&ge; 0)
         * @param dephasing integer number of dephasing orders added (negative allowed)
         * @return this builder
         */
        public Builder interval(double durationMs, int dephasing) {
            Checks.inRange("duration_ms", durationMs, 0, 1e9, null);
            Checks.inRange("dephasing", dephasing, -1000, 1000, null);
            ops.add(new double[] {INTERVAL, durationMs, dephasing});
            return this;
        }

        /** @return this builder, with an echo read-out (F+<sub>0</sub>) appended */
        public Builder echo() {
            ops.add(new double[] {ECHO, 0, 0});
            return this;
        }

        /**
         * Keeps every state up to date, also those that can no longer reach an echo (slower; for
         * diagnostics such as the state norm or full phase-graph pictures).
         *
         * @return this builder
         */
        public Builder keepAllStates() {
            keepAll = true;
            return this;
        }

        /** @return the compiled program */
        public EpgProgram build() {
            return new EpgProgram(this);
        }
    }
}
