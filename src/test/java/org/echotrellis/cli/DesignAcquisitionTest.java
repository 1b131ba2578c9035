package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Json;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Simulator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** design reports the echoes of the protocol's acquisition (slice profile, TR, diffusion), not a private model. */
class DesignAcquisitionTest {
    @TempDir
    Path dir;

    private static final String TRAIN = "train:\n  echoes: 12\n  echo_spacing_ms: 10\n"
            + "  excitation: {flip_deg: 90, phase_deg: 90, pulse: {shape: sinc, time_bandwidth: 4, duration_ms: 2.0}}\n"
            + "  refocusing: {flip_deg: 180, phase_deg: 0, pulse: {shape: sinc, time_bandwidth: 4, duration_ms: 2.0}}\n";

    @Test
    void sliceSelectiveTrainsAreReportedThroughTheAcquisitionModel() throws Exception {
        Path p = dir.resolve("slice.yaml");
        Files.writeString(p, "name: slice-design\ntissue: {t1_ms: 1000, t2_ms: 60}\n" + TRAIN
                + "  repetition_ms: 2000\n  slice: {selective: true, refocusing_width_ratio: 1.0}\n");
        CliRun r = CliRun.of("design", "--protocol", p.toString(), "--objective", "signal:8", "--knots", "3",
                "--format", "json", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode j = Json.MAPPER.readTree(r.out());
        JsonNode design = j.get("tissues").get(0);
        assertEquals("acquisition", design.get("echo_model").asText());
        double[] flips = new double[12];
        for (int i = 0; i < 12; i++) {
            flips[i] = j.get("flips_deg").get(i).asDouble();
        }
        // the same schedule played through the protocol's own acquisition
        Protocol base = ProtocolReader.read(p);
        CpmgTrain t = base.cpmg().orElseThrow();
        Protocol q = Protocol.ofTrain(base.name(), "", base.tissue(), base.b1Scale(),
                new CpmgTrain(12, 10, t.excitationFlipDeg(), t.excitationPhaseDeg(), flips, t.refocusPhasesDeg()),
                base.source(), base.acquisition());
        EchoTrain e = Simulator.simulate(q);
        double maxIdealGap = 0;
        for (int i = 0; i < 12; i++) {
            double acquired = Math.hypot(e.re()[i], e.im()[i]);
            assertEquals(acquired, design.get("echoes").get(i).asDouble(), 1e-9, "echo " + (i + 1));
            maxIdealGap = Math.max(maxIdealGap, Math.abs(acquired - Math.abs(j.get("predicted").get(i).asDouble())));
        }
        // slice profiles and incomplete T1 recovery change the train visibly (common practice: 2-D trains
        // carry less signal than the ideal-pulse model predicts)
        assertTrue(maxIdealGap > 0.01, "acquisition and ideal-pulse echoes differ, gap " + maxIdealGap);
    }

    @Test
    void idealProtocolsKeepTheIdealPulseEchoes() throws Exception {
        Path p = dir.resolve("ideal.yaml");
        Files.writeString(p, "name: ideal-design\ntissue: {t1_ms: 1000, t2_ms: 60}\ntrain:\n  echoes: 12\n"
                + "  echo_spacing_ms: 10\n  excitation: {flip_deg: 90, phase_deg: 90}\n"
                + "  refocusing: {flip_deg: 180, phase_deg: 0}\n");
        CliRun r = CliRun.of("design", "--protocol", p.toString(), "--objective", "signal:8", "--knots", "3",
                "--format", "json", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode j = Json.MAPPER.readTree(r.out());
        JsonNode design = j.get("tissues").get(0);
        assertEquals("ideal_pulses", design.get("echo_model").asText());
        for (int i = 0; i < 12; i++) {
            assertEquals(Math.abs(j.get("predicted").get(i).asDouble()), design.get("echoes").get(i).asDouble(), 1e-12);
        }
    }
}
