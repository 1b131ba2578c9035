package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

class EchoTrainTest {

    /**
     * Phases lie in (-180, 180]: a negative real echo with a signed-zero imaginary part is 180, not
     * -180 (Math.atan2 returns -pi for (-0.0, x &lt; 0), Java SE API documentation; IEEE 754 signed zeros).
     */
    @Test
    void phaseOfANegativeRealEchoIsPlus180() {
        EchoTrain t = new EchoTrain(List.of("a", "b", "c"), new double[] {1, 2, 3}, new double[] {-0.5, -0.5, 0.5},
                new double[] {-0.0, 0.0, -0.0});
        assertEquals(180.0, t.phaseDeg(0), 0);
        assertEquals(180.0, t.phaseDeg(1), 0);
        assertEquals(0.0, t.phaseDeg(2), 0);
    }

    /** A 270 degree excitation gives a negative CPMG train: phase 180 at every echo. */
    @Test
    void negativeCpmgTrainHasPhase180() {
        Protocol fast = ProtocolReader.parse("train: {echoes: 4, echo_spacing_ms: 8, excitation: {flip_deg: 270},"
                + " refocusing: {flip_deg: 180}}", "fast.yaml", true);
        EchoTrain f = Simulator.simulate(fast);
        for (int i = 0; i < f.size(); i++) {
            assertEquals(180.0, f.phaseDeg(i), 1e-9, "echo " + (i + 1));
        }
    }
}
