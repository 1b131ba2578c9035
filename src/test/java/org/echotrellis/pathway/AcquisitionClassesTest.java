package org.echotrellis.pathway;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import org.echotrellis.InputException;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Simulator;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Classes summed over slice positions add up to the echoes of the whole-acquisition model. */
class AcquisitionClassesTest {

    static Protocol protocol(String extra, double b1) {
        return ProtocolReader.parse("""
                tissue: {t1_ms: 1400, t2_ms: 70}
                b1_scale: %s
                train:
                  echoes: 12
                  echo_spacing_ms: 9
                  excitation: {flip_deg: 90, phase_deg: 90, pulse: {shape: sinc, time_bandwidth: 4, duration_ms: 2}}
                  refocusing: {flip_deg: 160, pulse: {shape: gauss, time_bandwidth: 3, duration_ms: 2}}
                %s
                """.formatted(b1, extra), "t.yaml", true);
    }

    @ParameterizedTest
    @ValueSource(strings = {
        "  slice: {selective: true, refocusing_width_ratio: 1.5}",
        "  slice: {selective: true}\n  repetition_ms: 1500",
        "  repetition_ms: 600"})
    void classesAddUpToTheEcho(String extra) {
        for (double b1 : new double[] {0.8, 1.15}) {
            Protocol p = protocol(extra, b1);
            ClassDecomposition d = PathwayAnalysis.classes(p);
            EchoTrain e = Simulator.simulate(p);
            double scale = e.magnitude(0);
            for (int n = 0; n < 12; n++) {
                double sr = 0;
                double si = 0;
                for (int m = 0; m < d.classCount(n); m++) {
                    sr += d.classRe(n, m);
                    si += d.classIm(n, m);
                }
                assertEquals(e.re()[n], sr, 2e-6 * scale, "echo " + (n + 1));
                assertEquals(e.im()[n], si, 2e-6 * scale, "echo " + (n + 1));
            }
        }
    }

    @org.junit.jupiter.api.Test
    void diffusionIsRefused() {
        Protocol p = ProtocolReader.parse("""
                tissue: {t1_ms: 4000, t2_ms: 1000, diffusivity_mm2_per_s: 0.003}
                train:
                  echoes: 4
                  echo_spacing_ms: 10
                  refocusing: {flip_deg: 180}
                  crusher: {cycles_per_mm: 2, duration_ms: 1}
                """, "t.yaml", true);
        assertThrows(InputException.class, () -> PathwayAnalysis.classes(p));
    }
}
