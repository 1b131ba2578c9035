package org.echotrellis.pathway;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import org.echotrellis.epg.EpgProgram;
import org.echotrellis.epg.GeneralEngine;

/** Event lists for the pathway tests, built once and compiled for both engines. */
final class TestTrains {
    /** One event: {0, flipDeg, phaseDeg}, {1, durationMs, dephasing} or {2, 0, 0}. */
    final List<double[]> events = new ArrayList<>();

    TestTrains rf(double flipDeg, double phaseDeg) {
        events.add(new double[] {0, flipDeg, phaseDeg});
        return this;
    }

    TestTrains interval(double durationMs, int dephasing) {
        events.add(new double[] {1, durationMs, dephasing});
        return this;
    }

    TestTrains echo() {
        events.add(new double[] {2, 0, 0});
        return this;
    }

    /** CPMG train: 90 deg about y, refocusing about x, ESP/2 per dephasing order (Meiboom &amp; Gill 1958). */
    static TestTrains cpmg(int echoes, double espMs, double refocusDeg) {
        TestTrains t = new TestTrains().rf(90, 90);
        for (int n = 0; n < echoes; n++) {
            t.interval(espMs / 2, 1).rf(refocusDeg, 0).interval(espMs / 2, 1).echo();
        }
        return t;
    }

    /** A random event list: pulses with random flips/phases, 1-3 intervals between, echoes anywhere. */
    static TestTrains random(Random rnd, int pulses) {
        TestTrains t = new TestTrains();
        for (int p = 0; p < pulses; p++) {
            t.rf(360 * rnd.nextDouble(), 360 * rnd.nextDouble() - 180);
            int intervals = 1 + rnd.nextInt(3);
            for (int i = 0; i < intervals; i++) {
                t.interval(0.5 + 10 * rnd.nextDouble(), rnd.nextInt(5) - 2);
                if (rnd.nextInt(3) > 0) {
                    t.echo();
                }
            }
        }
        return t.echo();
    }

    Schedule schedule() {
        Schedule.Builder b = Schedule.builder();
        for (double[] e : events) {
            switch ((int) e[0]) {
                case 0 -> b.rf(e[1], e[2]);
                case 1 -> b.interval(e[1], (int) e[2]);
                default -> b.echo();
            }
        }
        return b.build();
    }

    EpgProgram program() {
        EpgProgram.Builder b = EpgProgram.builder();
        for (double[] e : events) {
            switch ((int) e[0]) {
                case 0 -> b.rf(e[1], e[2]);
                case 1 -> b.interval(e[1], (int) e[2]);
                default -> b.echo();
            }
        }
        return b.build();
    }

    /** Echoes from the foundation's general engine, interleaved re/im per echo. */
    double[] generalEngine(double t1Ms, double t2Ms, double b1) {
        EpgProgram p = program();
        double[] re = new double[p.echoCount()];
        double[] im = new double[p.echoCount()];
        new GeneralEngine(1).run(p, new double[] {t1Ms}, new double[] {t2Ms}, new double[] {b1}, 1, re, im);
        double[] out = new double[2 * re.length];
        for (int i = 0; i < re.length; i++) {
            out[2 * i] = re[i];
            out[2 * i + 1] = im[i];
        }
        return out;
    }
}
