package org.echotrellis.cli;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.echotrellis.InputException;

/**
 * The grid of a {@code --sweep NAME=START:STOP:COUNT} set: the Cartesian product of evenly spaced
 * values (inclusive) per named parameter; parameters not swept keep their protocol value. Only the
 * axes are held (at most 3 × 100 000 values); points are produced chunk by chunk with
 * {@link #fill}, T1 varying slowest and B1 fastest.
 */
record SweepGrid(double[] t1Axis, double[] t2Axis, double[] b1Axis) {
    static final int MAX_POINTS = 5_000_000;
    private static final List<String> NAMES = List.of("t1_ms", "t2_ms", "b1");

    int size() {
        return t1Axis.length * t2Axis.length * b1Axis.length;
    }

    /**
     * Writes the parameters of points {@code from .. to-1} into the arrays (index 0 = point from).
     */
    void fill(int from, int to, double[] t1, double[] t2, double[] b1) {
        int nb = b1Axis.length;
        int n2 = t2Axis.length;
        for (int i = from; i < to; i++) {
            t1[i - from] = t1Axis[i / (n2 * nb)];
            t2[i - from] = t2Axis[(i / nb) % n2];
            b1[i - from] = b1Axis[i % nb];
        }
    }

    static SweepGrid parse(List<String> specs, double t1, double t2, double b1) {
        Map<String, double[]> axes = new LinkedHashMap<>();
        for (String s : specs) {
            int eq = s.indexOf('=');
            String name = eq < 0 ? s : s.substring(0, eq).trim();
            if (!NAMES.contains(name)) {
                throw new InputException("--sweep " + s + ": NAME must be one of " + String.join(", ", NAMES));
            }
            if (axes.containsKey(name)) {
                throw new InputException("--sweep " + name + " given twice");
            }
            String[] parts = eq < 0 ? new String[0] : s.substring(eq + 1).split(":");
            if (parts.length != 3) {
                throw new InputException("--sweep " + s + ": expected NAME=START:STOP:COUNT, e.g. t2_ms=10:200:20");
            }
            double a;
            double b;
            int n;
            try {
                a = Double.parseDouble(parts[0]);
                b = Double.parseDouble(parts[1]);
                n = Integer.parseInt(parts[2].trim());
            } catch (NumberFormatException e) {
                throw new InputException("--sweep " + s + ": START and STOP must be numbers and COUNT a whole number");
            }
            if (n < 1 || n > 100_000) {
                throw new InputException("--sweep " + s + ": COUNT must be within [1, 100000], got " + n);
            }
            double lo = Math.min(a, b);
            if (!(lo > 0) || Double.isInfinite(a) || Double.isInfinite(b)) {
                throw new InputException("--sweep " + s + ": values must be finite and > 0");
            }
            if (name.equals("b1") && Math.max(a, b) > 5) {
                throw new InputException("--sweep " + s + ": b1 must be within (0, 5]");
            }
            double[] v = new double[n];
            for (int i = 0; i < n; i++) {
                v[i] = n == 1 ? a : a + (b - a) * i / (n - 1);
            }
            axes.put(name, v);
        }
        double[] v1 = axes.getOrDefault("t1_ms", new double[] {t1});
        double[] v2 = axes.getOrDefault("t2_ms", new double[] {t2});
        double[] vb = axes.getOrDefault("b1", new double[] {b1});
        long total = (long) v1.length * v2.length * vb.length;
        if (total > MAX_POINTS) {
            throw new InputException("--sweep grid has " + total + " points; at most " + MAX_POINTS);
        }
        return new SweepGrid(v1, v2, vb);
    }
}
