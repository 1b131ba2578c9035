package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.Test;

/** {@code design} with the objectives on image figures, through the command line. */
class DesignImageObjectiveTest {

    @Test
    void psfObjectiveReportsTheBestConstantToo() throws Exception {
        CliRun r = CliRun.of("design", "--protocol", "sequences/brain-fse-t2-3t.yaml", "--design-tissue",
                "white_matter_3t", "--objective", "psf:16:64:white_matter_3t:0.15", "--sar-budget", "0.5",
                "--knots", "3", "--max-evaluations", "60", "--quiet", "--format", "json");
        assertEquals(0, r.code(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertEquals("psf:16:64:white_matter_3t:0.15:0.05", j.get("objective").asText());
        double v = j.get("objective_value").asDouble();
        double c = j.get("best_constant_objective").asDouble();
        assertTrue(v >= c && v > 0 && v <= 1 + 1e-9, v + " vs constant " + c);   // 1/FWHM ≤ 1 (the delta)
    }

    @Test
    void badImageObjectiveIsOneLine() {
        CliRun r = CliRun.of("design", "--protocol", "sequences/brain-fse-t2-3t.yaml", "--objective", "psf:16:60",
                "--quiet");
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("--objective psf LINES 60 must be a multiple of the 32 echoes"), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
    }
}
