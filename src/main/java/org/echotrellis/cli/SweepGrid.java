package org.echotrellis.cli;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.echotrellis.InputException;

/**
 * The grid of a {@code --sweep NAME=START:STOP:COUNT} set: the Cartesian product of evenly spaced
 * values (inclusive) per named parameter; parameters not swept keep their protocol value.
 */
record SweepGrid(double[] t1Ms, double[] t2Ms, double[] b1) {
    static final int MAX_POINTS = 5_000_000;
    private static final List<String> NAMES = List.of("t1_ms", "t2_ms", "b1");

    int size() {
        return t2Ms.length;
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
        int m = (int) total;
        double[] o1 = new double[m];
        double[] o2 = new double[m];
        double[] ob = new double[m];
        int i = 0;
        for (double x1 : v1) {
            for (double x2 : v2) {
                for (double xb : vb) {
                    o1[i] = x1;
                    o2[i] = x2;
                    ob[i] = xb;
                    i++;
                }
            }
        }
        return new SweepGrid(o1, o2, ob);
    }
}
