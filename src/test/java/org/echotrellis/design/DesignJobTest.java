package org.echotrellis.design;

import org.echotrellis.sequence.PulseShape;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class DesignJobTest {
    private static final RfExposure RF = new RfExposure(PulseShape.sinc(4), 2.0, PulseShape.rect(), 1.0, 3000, 8);

    @ParameterizedTest
    @CsvSource({"decay:150:0.7, 0.5, 80, 69", "constant:0.6, 0.4, 40, 100", "ramp:0.8:0.3, 0.3, 60, 80"})
    void overBudgetPrescriptionGetsAScaledAlternative(String spec, double budget, int echoes, double t2) {
        DesignProblem p = new DesignProblem("t", echoes, 4, 90, 1100, t2, 1, 10, 180);
        ExposureLimits limits = new ExposureLimits(budget, Double.POSITIVE_INFINITY);
        DesignReport r = DesignJob.prescribed(p, EchoTarget.parse(spec), new Startup.Ramp(3), RF, limits, null,
                List.of(new Tissue("other", 1800, 99)));
        assertFalse(r.exposure().withinLimits(), spec + " must exceed the budget for this check");
        double s = r.budgetScale();
        assertTrue(s > 0 && s < 1, "scale " + s);
        double[] scaled = EchoTarget.parse(spec).amplitudes(p);
        for (int i = 0; i < scaled.length; i++) {
            scaled[i] *= s;
        }
        Inversion inv = new FlipInverter().invert(p, scaled, new Startup.Ramp(3));
        assertTrue(inv.reachable());
        assertTrue(limits.allows(RF, 90, inv.flipsDeg()));
        // comparison tissues: design tissue first, then the others, all-180° trains alongside
        assertEquals(2, r.comparisons().size());
        assertEquals(Math.exp(-4 / 99.0), r.comparisons().get(1).echoes180()[0], 1e-12); // ideal CPMG echo 1
    }
}
