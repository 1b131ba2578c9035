package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.GeneralEngine;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The acquisition keys of protocol files: parsing, refusals with positions, and no change without them. */
class AcquisitionKeysTest {

    private static final String HEAD = """
            tissue: {t1_ms: 1000, t2_ms: 80}
            train:
              echoes: 8
              echo_spacing_ms: 10
            """;

    private static Protocol yaml(String text) {
        return ProtocolReader.parse(text, "t.yaml", true);
    }

    @Test
    void shippedProtocolsWithoutTheKeysRunTheEnginesAsBefore() throws IOException {
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(Path.of("sequences"))) {
            for (Path f : ds) {
                if (f.toString().endsWith(".csv")) {
                    continue;  // example decay tables for fit and spectrum
                }
                Protocol p = ProtocolReader.read(f);
                if (p.train().isPresent() && p.acquisition() != Acquisition.none()) {
                    continue;
                }
                assertSame(Acquisition.none(), p.acquisition(), f.toString());
                EchoTrain e = Simulator.simulate(p);
                int n = p.echoCount();
                double[] re = new double[n];
                double[] im = new double[n];
                if (p.cpmg().isPresent()) {
                    double[] v = new CpmgEngine(1).echoes(p.cpmg().get(), p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale());
                    double psi = Math.toRadians(p.cpmg().get().excitationPhaseDeg() - 90);
                    for (int i = 0; i < n; i++) {
                        re[i] = v[i] * Math.cos(psi);
                        im[i] = v[i] * Math.sin(psi);
                    }
                } else {
                    new GeneralEngine(1).run(p.program(), new double[] {p.tissue().t1Ms()}, new double[] {p.tissue().t2Ms()},
                            new double[] {p.b1Scale()}, 1, re, im);
                }
                assertArrayEquals(re, e.re(), 0.0, f.toString());
                assertArrayEquals(im, e.im(), 0.0, f.toString());
            }
        }
    }

    @Test
    void pulsesAloneAndDiffusivityWithoutCrushersChangeNothing() {
        Protocol plain = yaml(HEAD + "  refocusing: {flip_deg: 150}\n");
        Protocol keyed = yaml("""
                tissue: {t1_ms: 1000, t2_ms: 80, diffusivity_mm2_per_s: 0.003}
                train:
                  echoes: 8
                  echo_spacing_ms: 10
                  excitation: {flip_deg: 90, pulse: {shape: gauss, time_bandwidth: 3, duration_ms: 2}}
                  refocusing: {flip_deg: 150, pulse: {shape: rect, duration_ms: 1}}
                  slice: {selective: false}
                """);
        assertTrue(keyed.isIdealAcquisition());
        assertArrayEquals(Simulator.simulate(plain).re(), Simulator.simulate(keyed).re(), 0.0);
        assertEquals("gauss:3", keyed.acquisition().excitationPulse().get().label());
    }

    @Test
    void pulseFileIsReadRelativeToTheProtocol(@TempDir Path dir) throws IOException {
        Files.writeString(dir.resolve("env.txt"), "0.2\n0.7\n1\n0.7\n0.2\n");
        Path p = dir.resolve("p.yaml");
        Files.writeString(p, HEAD + "  refocusing: {flip_deg: 180, pulse: {shape: file, file: env.txt, duration_ms: 2}}\n"
                + "  excitation: {flip_deg: 90, pulse: {shape: file, file: env.txt, duration_ms: 2}}\n"
                + "  slice: {selective: true}\n");
        Protocol pr = ProtocolReader.read(p);
        assertEquals("file", pr.acquisition().refocusingPulse().get().shape());
        assertTrue(Simulator.simulate(pr).magnitude(0) > 0.3);
    }

    @Test
    void badValuesAreRefusedWithTheirPosition() {
        // {train lines (";" separates lines), expected position prefix, expected text}
        String[][] cases = {
            {"refocusing: {flip_deg: 180, pulse: {shape: square, duration_ms: 2}}", "t.yaml:5:", "shape must be one of rect, sinc, gauss, file"},
            {"refocusing: {flip_deg: 180, pulse: {shape: sinc, duration_ms: 2}}", "t.yaml:5:", "needs 'time_bandwidth'"},
            {"refocusing: {flip_deg: 180, pulse: {shape: rect, time_bandwidth: 4, duration_ms: 2}}", "t.yaml:5:",
                "time_bandwidth applies to shapes sinc and gauss"},
            {"refocusing: {flip_deg: 180, pulse: {shape: sinc, time_bandwidth: 4, duration_ms: -1}}", "t.yaml:5:", "duration_ms must be > 0"},
            {"refocusing: {flip_deg: 180, pulse: {shape: sinc, time_bandwidth: 0.5, duration_ms: 2}}", "t.yaml:5:",
                "time_bandwidth must be within [1, 32], got 0.5"},
            {"refocusing: {flip_deg: 180, pulse: {shape: file, file: none.txt, duration_ms: 2}}", "t.yaml:5:", "file not found"},
            {"refocusing: {flip_deg: 180};repetition_ms: 80", "t.yaml:6:", "repetition_ms must be > echoes x echo_spacing_ms = 80.0 ms, got 80.0"},
            {"refocusing: {flip_deg: 180};slice: {selective: true}", "t.yaml:6:", "slice.selective true needs excitation.pulse and refocusing.pulse"},
            {"refocusing: {flip_deg: 180};slice: {selective: 1}", "t.yaml:6:", "slice.selective must be true or false"},
            {"refocusing: {flip_deg: 180};slice: {refocusing_width_ratio: 0}", "t.yaml:6:",
                "refocusing_width_ratio must be within [0.25, 10.0], got 0.0"},
            {"refocusing: {flip_deg: 180};crusher: {cycles_per_mm: .nan, duration_ms: 1}", "t.yaml:6:", "must be a number, got NaN"},
            {"refocusing: {flip_deg: 180};crusher: {cycles_per_mm: 2}", "t.yaml:6:", "train.crusher needs 'duration_ms'"},
            {"refocusing: {flip_deg: 180};crusher: {cycles_per_mm: 2, duration_ms: 1, lobes: 2}", "t.yaml:6:", "unknown key 'lobes'"},
            {"refocusing: {flip_deg: 180, pulse: {shape: sinc, time_bandwidth: 4, duration_ms: 2}};crusher: {cycles_per_mm: 2, duration_ms: 4.5}",
                "t.yaml:6:", "must be at most echo_spacing_ms / 2 = 5.0 ms"}};
        for (String[] c : cases) {
            String tail = "  " + c[0].replace(";", "\n  ") + "\n";
            String msg = assertThrows(InputException.class, () -> yaml(HEAD + tail), c[0]).getMessage();
            assertTrue(msg.startsWith(c[1]), msg);
            assertTrue(msg.contains(c[2]), msg);
        }
    }

    @Test
    void negativeDiffusivityIsRefused() {
        String msg = assertThrows(InputException.class, () -> yaml("""
                tissue: {t1_ms: 1000, t2_ms: 80, diffusivity_mm2_per_s: -0.001}
                train: {echoes: 4, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}
                """)).getMessage();
        assertTrue(msg.startsWith("t.yaml:1:") && msg.contains("diffusivity_mm2_per_s must be within [0, 0.1]"), msg);
    }

    @Test
    void acquisitionKeysOnAnEventListAreRefusedOrKeptAsPulses() {
        Protocol p = yaml("""
                events:
                  - rf: {flip_deg: 90, phase_deg: 90, pulse: {shape: sinc, time_bandwidth: 4, duration_ms: 2}}
                  - interval: {duration_ms: 5, dephasing: 1}
                  - rf: {flip_deg: 180, pulse: {shape: gauss, time_bandwidth: 2, duration_ms: 3}}
                  - interval: {duration_ms: 5, dephasing: 1}
                  - echo
                """);
        assertEquals("gauss:2", ((Event.Rf) p.events().get(2)).pulse().get().label());
        assertTrue(p.isIdealAcquisition());
    }
}
