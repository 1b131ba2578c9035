package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.echotrellis.io.Json;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Simulator;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import picocli.CommandLine;

class DesignCommandTest {
    @TempDir
    Path dir;

    private record Run(int code, String out, String err) { }

    private Run run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = Main.newCommandLine();
        cl.setOut(new PrintWriter(out));
        cl.setErr(new PrintWriter(err));
        String[] full = new String[args.length + 1];
        full[0] = "design";
        System.arraycopy(args, 0, full, 1, args.length);
        int code = cl.execute(full);
        return new Run(code, out.toString(), err.toString());
    }

    private Path protocol() throws Exception {
        Path p = dir.resolve("train.yaml");
        Files.writeString(p, "name: test-train\ntissue: {t1_ms: 1000, t2_ms: 120}\n"
                + "train:\n  echoes: 20\n  echo_spacing_ms: 5\n  excitation: {flip_deg: 90, phase_deg: 90}\n"
                + "  refocusing: {flip_deg: 180, phase_deg: 0}\n");
        return p;
    }

    @Test
    void jsonContractForReachableTarget() throws Exception {
        Run r = run("--protocol", protocol().toString(), "--target", "constant:0.45", "--tr-ms", "2000",
                "--format", "json", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode j = Json.MAPPER.readTree(r.out());
        assertEquals(20, j.get("flips_deg").size());
        assertEquals(20, j.get("predicted").size());
        assertTrue(j.get("first_unreachable_echo").isNull());
        assertTrue(j.get("relative_sar").asDouble() > 0 && j.get("relative_sar").asDouble() < 1);
        assertTrue(j.get("b1rms_ut").asDouble() > 0);
        for (int i = 3; i < 20; i++) { // after the default ramp:3 start-up
            assertEquals(0.45, j.get("predicted").get(i).asDouble(), 1e-6);
        }
        assertTrue(j.get("caution").asText().contains("MR physicist"));
    }

    @Test
    void unreachableTargetIsReported() throws Exception {
        Run r = run("--protocol", protocol().toString(), "--target", "constant:0.85", "--max-flip-deg", "150",
                "--format", "json", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode j = Json.MAPPER.readTree(r.out());
        assertFalse(j.get("first_unreachable_echo").isNull());
        assertTrue(j.get("reachable_scale").asDouble() < 1);
    }

    @Test
    void writtenScheduleIsReadBySimulate() throws Exception {
        Path out = dir.resolve("result");
        Run r = run("--protocol", protocol().toString(), "--objective", "signal:8", "--sar-budget", "0.5",
                "--tr-ms", "2000", "--slices", "5", "--b1rms-limit-ut", "2.0", "--out", out.toString(), "--quiet");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("limits met"), r.out());
        for (String f : new String[] {"schedule.yaml", "design.json", "schedule.png", "schedule.svg", "echoes.png",
            "echoes.svg", "relative-sar.png", "relative-sar.svg"}) {
            assertTrue(Files.size(out.resolve(f)) > 200, f);
        }
        JsonNode j = Json.MAPPER.readTree(out.resolve("design.json").toFile());
        assertTrue(j.get("relative_sar").asDouble() <= 0.5 * (1 + 1e-12));
        assertTrue(j.get("b1rms_ut").asDouble() <= 2.0 * (1 + 1e-12));
        assertTrue(j.get("objective_value").asDouble() >= j.get("best_constant_objective").asDouble());
        JsonNode prov = j.get("provenance");  // every JSON output carries it, the file as well as stdout
        assertTrue(prov.get("command_line").asText().startsWith("echotrellis design "), prov.toString());
        assertEquals(Files.readString(protocol()), prov.get("protocol").asText());
        EchoTrain t = Simulator.simulate(ProtocolReader.read(out.resolve("schedule.yaml")));
        for (int i = 0; i < 20; i++) { // flips written to 1e-4 degrees
            assertEquals(j.get("predicted").get(i).asDouble(), t.magnitude(i), 1e-5);
        }
        Run again = run("--protocol", protocol().toString(), "--objective", "signal:8", "--out", out.toString(), "--quiet");
        assertEquals(2, again.code());
        assertTrue(again.err().contains("--force"), again.err());
    }

    @ParameterizedTest
    @ValueSource(strings = {"--sar-budget=0", "--sar-budget=1.5", "--target=constant:1.2", "--min-flip-deg=-5",
        "--max-flip-deg=200", "--pulse=triangle", "--b1rms-limit-ut=2", "--target=wiggle:3", "--startup=slow"})
    void badInputGivesOneLineAndExitTwo(String bad) throws Exception {
        String goal = bad.startsWith("--target") ? bad : "--target=constant:0.4";
        String[] args = bad.startsWith("--target")
                ? new String[] {"--protocol", protocol().toString(), goal}
                : new String[] {"--protocol", protocol().toString(), goal, bad};
        Run r = run(args);
        assertEquals(2, r.code(), bad + ": " + r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
    }

    @Test
    void absoluteSarScalesWithRfPower() throws Exception {
        // SAR ∝ Σ∫B1²dt / TR for the same coil and patient (common practice): with the all-180° protocol
        // itself as the reference at the same TR and slices, the estimate is the reference SAR times the
        // RF energy ratio with the excitation counted
        Run r = run("--protocol", protocol().toString(), "--target", "constant:0.45", "--tr-ms", "2000",
                "--slices", "4", "--reference-sar-w-per-kg", "2.0", "--format", "json", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode x = Json.MAPPER.readTree(r.out()).get("exposure");
        assertEquals(2.0 * x.get("relative_sar_with_excitation").asDouble(), x.get("sar_estimate_w_per_kg").asDouble(), 1e-12);
        // a reference played at twice the TR deposits half the power: the estimate doubles
        Run slow = run("--protocol", protocol().toString(), "--target", "constant:0.45", "--tr-ms", "2000",
                "--slices", "4", "--reference-sar-w-per-kg", "2.0", "--reference-tr-ms", "4000", "--format", "json", "--quiet");
        JsonNode y = Json.MAPPER.readTree(slow.out()).get("exposure");
        assertEquals(2 * x.get("sar_estimate_w_per_kg").asDouble(), y.get("sar_estimate_w_per_kg").asDouble(), 1e-12);
        Run noTr = run("--protocol", protocol().toString(), "--target", "constant:0.45", "--reference-sar-w-per-kg", "2");
        assertEquals(2, noTr.code());
    }

    @Test
    void helpShowsExample() {
        Run r = run("--help");
        assertEquals(0, r.code());
        assertTrue(r.out().contains("Example"));
        assertTrue(r.out().contains("--sar-budget"));
    }
}
