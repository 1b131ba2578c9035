package org.echotrellis.pathway;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.math3.complex.Complex;

/**
 * Slow reference: enumerates every pathway of one echo without any bound, straight from the event
 * list. Each step applies the full operator (written here with Commons Math complex numbers from the
 * pointwise rotation of (M+, Mz), M&minus; = conj M+; Weigel 2015) to a state with a single non-zero
 * configuration and follows every configuration that comes out non-zero. T1 regrowth enters as a new
 * pathway at every interval. Shares no code with the search or the class tracker.
 */
final class BruteForcePathways {
    /** Sum of amplitudes per pathway notation, and per class. */
    final Map<String, Complex> byNotation = new LinkedHashMap<>();
    final Map<Integer, Complex> byClass = new LinkedHashMap<>();
    private final List<double[]> ev;
    private final int target;
    private final double t1;
    private final double t2;
    private final double b1;

    BruteForcePathways(TestTrains train, int echo, double t1Ms, double t2Ms, double b1) {
        this.ev = train.events;
        this.t1 = t1Ms;
        this.t2 = t2Ms;
        this.b1 = b1;
        int seen = 0;
        int idx = -1;
        for (int i = 0; i < ev.size() && idx < 0; i++) {
            if (ev.get(i)[0] == 2 && seen++ == echo) {
                idx = i;
            }
        }
        target = idx;
        // equilibrium, then T1 regrowth of every interval
        walk(0, true, 0, Complex.ONE, List.of("Z0"), 0, false, 0);
        int period = 0;
        for (int i = 0; i < target; i++) {
            double[] e = ev.get(i);
            if (e[0] == 0) {
                period++;
            } else if (e[0] == 1) {
                double g = 1 - Math.exp(-e[1] / t1);
                if (g > 0) {
                    String origin = period == 0 ? "Z0" : "R" + period;
                    walk(i + 1, true, 0, new Complex(g), List.of(origin), 0, true, period);
                }
            }
        }
    }

    /** Follows a single configuration (z?, k) with amplitude x from event i on. */
    private void walk(int i, boolean z, int k, Complex x, List<String> tokens, int cls, boolean timed, int period) {
        if (x.abs() == 0) {
            return;
        }
        if (i == target) {
            if (!z && k == 0) {
                String key = StateNotation.join(tokens);
                byNotation.merge(key, x, Complex::add);
                byClass.merge(cls, x, Complex::add);
            }
            return;
        }
        double[] e = ev.get(i);
        if (e[0] == 2) {
            walk(i + 1, z, k, x, tokens, cls, timed, period);
        } else if (e[0] == 1) {
            int c = cls + (z && k != 0 && !timed && period >= 1 ? 1 : 0);
            Complex y = x.multiply(Math.exp(-e[1] / (z ? t1 : t2)));
            walk(i + 1, z, z ? k : k + (int) e[2], y, tokens, c, true, period);
        } else {
            pulse(i, z, k, x, tokens, cls, period);
        }
    }

    private void pulse(int i, boolean z, int k, Complex x, List<String> tokens, int cls, int period) {
        double[] e = ev.get(i);
        double a = Math.toRadians(e[1]) * b1;
        Complex u = new Complex(Math.cos(Math.toRadians(e[2])), Math.sin(Math.toRadians(e[2])));
        Complex iu = Complex.I.multiply(u);
        Complex iuc = Complex.I.multiply(u.conjugate());
        double c2 = Math.pow(Math.cos(a / 2), 2);
        double s2 = Math.pow(Math.sin(a / 2), 2);
        double sa = Math.sin(a);
        // full operator on the single configuration: out[F_j], out[Z_j]
        Map<String, Complex> out = new LinkedHashMap<>();
        if (z) {
            // M+' gets -i u sa Mz, Mz' gets cos(a) Mz
            out.merge("F" + k, iu.multiply(-sa).multiply(x), Complex::add);
            out.merge("Z" + k, x.multiply(Math.cos(a)), Complex::add);
        } else {
            // M+' = c2 M+ + u^2 s2 conj(M+) ; Mz' = -(i/2) conj(u) sa M+ + (i/2) u sa conj(M+)
            out.merge("F" + k, x.multiply(c2), Complex::add);
            out.merge("F" + (-k), u.multiply(u).multiply(s2).multiply(x.conjugate()), Complex::add);
            out.merge("Z" + k, iuc.multiply(-0.5 * sa).multiply(x), Complex::add);
            out.merge("Z" + (-k), iu.multiply(0.5 * sa).multiply(x.conjugate()), Complex::add);
        }
        for (Map.Entry<String, Complex> o : out.entrySet()) {
            boolean nz = o.getKey().charAt(0) == 'Z';
            int nk = Integer.parseInt(o.getKey().substring(1));
            List<String> t = new ArrayList<>(tokens);
            t.add(StateNotation.token(nz, nk));
            walk(i + 1, nz, nk, o.getValue(), t, cls, false, period + 1);
        }
    }

    Complex total() {
        Complex s = Complex.ZERO;
        for (Complex c : byNotation.values()) {
            s = s.add(c);
        }
        return s;
    }
}
