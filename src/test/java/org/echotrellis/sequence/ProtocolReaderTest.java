package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.Path;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

class ProtocolReaderTest {

    private static Protocol yaml(String text) {
        return ProtocolReader.parse(text, "t.yaml", true);
    }

    private static String refused(String text) {
        return assertThrows(InputException.class, () -> yaml(text)).getMessage();
    }

    @Test
    void everyShippedProtocolReads() throws IOException {
        int n = 0;
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(Path.of("sequences"))) {
            for (Path f : ds) {
                if (f.toString().endsWith(".csv")) {
                    continue;  // example decay tables for fit and spectrum
                }
                Protocol p = ProtocolReader.read(f);
                assertTrue(p.echoCount() > 0, f.toString());
                assertTrue(Simulator.simulate(p).size() == p.echoCount());
                n++;
            }
        }
        assertTrue(n >= 5, "at least five example protocols");
    }

    @Test
    void shorthandCompilesToEventsAndKeepsFastPath() {
        Protocol p = yaml("""
                tissue: {t1_ms: 1000, t2_ms: 50}
                train:
                  echoes: 3
                  echo_spacing_ms: 8
                  refocusing: {flips_deg: [160, 140, 120], phase_deg: 0}
                """);
        assertEquals(3, p.echoCount());
        assertEquals(1 + 4 * 3, p.events().size());
        assertEquals(new Event.Interval(4, 1), p.events().get(1));
        assertEquals(new Event.Rf(140, 0), p.events().get(6));
        assertEquals(24.0, p.echoTimesMs()[2], 0);
        assertTrue(p.cpmg().isPresent());
    }

    @Test
    void eventListOfCpmgPatternIsDetected() {
        Protocol p = yaml("""
                tissue: {t1_ms: 1000, t2_ms: 100}
                events:
                  - rf: {flip_deg: 90, phase_deg: 0}
                  - interval: {duration_ms: 5, dephasing: 1}
                  - rf: {flip_deg: 120, phase_deg: 90}
                  - interval: {duration_ms: 5, dephasing: 1}
                  - echo: {label: first}
                """);
        CpmgTrain t = p.cpmg().orElseThrow();
        assertEquals(10.0, t.echoSpacingMs(), 0);
        assertEquals("first", p.echoLabels().get(0));
        // the fast path and the general engine give the same complex echo
        EchoTrain fast = Simulator.simulate(p);
        double[] re = new double[1];
        double[] im = new double[1];
        new org.echotrellis.epg.GeneralEngine(1).run(p.program(), new double[] {1000}, new double[] {100},
                new double[] {1}, 1, re, im);
        assertEquals(re[0], fast.re()[0], 1e-12);
        assertEquals(im[0], fast.im()[0], 1e-12);
        assertEquals(0.75 * Math.exp(-10 / 100.0), fast.magnitude(0), 1e-12); // sin^2(60) e^{-ESP/T2} (Hennig 1988)
    }

    @Test
    void nonCpmgPhasesUseGeneralEngine() {
        Protocol p = yaml("""
                train: {echoes: 4, echo_spacing_ms: 10, refocusing: {flip_deg: 160, phase_deg: 90}}
                """);
        assertTrue(p.cpmg().isEmpty());
        assertTrue(p.train().isPresent());
    }

    @Test
    void presetsAndInfinityAndJson() {
        Protocol p = yaml("""
                tissue: {preset: white_matter_3t, t2_ms: .inf}
                train: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}
                """);
        assertEquals(1084, p.tissue().t1Ms(), 0);
        assertEquals(Double.POSITIVE_INFINITY, p.tissue().t2Ms(), 0);
        Protocol j = ProtocolReader.parse("{\"tissue\":{\"t1_ms\":\"inf\",\"t2_ms\":40},\"train\":{\"echoes\":2,"
                + "\"echo_spacing_ms\":10,\"refocusing\":{\"flip_deg\":150}}}", "t.json", false);
        assertEquals(Double.POSITIVE_INFINITY, j.tissue().t1Ms(), 0);
    }

    @Test
    void syntaxErrorNamesLineAndColumn() {
        String m = refused("train:\n  echoes: [1, 2\n  echo_spacing_ms: 3\n");
        assertTrue(m.matches("t\\.yaml:\\d+:\\d+: YAML syntax error: .*"), m);
        String j = assertThrows(InputException.class,
                () -> ProtocolReader.parse("{\"train\": {\"echoes\": 3,,}}", "x.json", false)).getMessage();
        assertTrue(j.startsWith("x.json:1:"), j);
    }

    @Test
    void unknownKeyIsNamedWithAllowedKeys() {
        String m = refused("train: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: 180}, spacing: 3}\n");
        assertTrue(m.contains("unknown key 'spacing' in train; allowed: echoes, echo_spacing_ms"), m);
        assertTrue(m.startsWith("t.yaml:1:"), m);
    }

    @ParameterizedTest
    @CsvSource(delimiter = '|', value = {
        "train: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: 400}}|flip_deg must be within [0, 360] degrees, got 400",
        "train: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: .nan}}|flip_deg must be a number, got NaN",
        "train: {echoes: 2, echo_spacing_ms: -1, refocusing: {flip_deg: 180}}|echo_spacing_ms must be > 0",
        "train: {echoes: 0, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}|echoes must be within [1, 1024], got 0",
        "train: {echoes: 5000, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}|echoes must be within [1, 1024], got 5000",
        "train: {echoes: 3, echo_spacing_ms: 10, refocusing: {flips_deg: [180, 170]}}|has 2 values but echoes is 3",
        "tissue: {t1_ms: 0, t2_ms: 40}\\ntrain: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}|t1_ms must be > 0",
        "tissue: {t1_ms: 1000, t2_ms: -4}\\ntrain: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}|t2_ms must be > 0",
        "tissue: {preset: nothing}\\ntrain: {echoes: 2, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}|unknown tissue preset 'nothing'; allowed: white_matter_1p5t",
        "events: [{rf: {flip_deg: 90}}, {interval: {duration_ms: 0, dephasing: 1}}, {echo: {}}]|duration_ms must be > 0",
        "events: [{rf: {flip_deg: 90}}, {interval: {duration_ms: 2, dephasing: 1.5}}, {echo: {}}]|dephasing must be a whole number",
        "events: [{rf: {flip_deg: 90}}, {pause: {duration_ms: 2}}]|unknown key 'pause' in an event; allowed: rf, interval, echo",
        "events: [{rf: {flip_deg: 90}}]|events contain no echo",
        "name: x|needs exactly one of 'train'",
        "train: {echoes: two, echo_spacing_ms: 10, refocusing: {flip_deg: 180}}|echoes must be a number, got 'two'",
    })
    void badValuesAreRefusedNamingKeyAndValue(String text, String expected) {
        String m = refused(text.replace("\\n", "\n"));
        assertTrue(m.contains(expected), m);
        assertTrue(m.startsWith("t.yaml"), m);
    }

    @Test
    void aliasBombIsRefused() {
        StringBuilder sb = new StringBuilder("a: &a [x, x, x, x, x, x, x, x, x]\n");
        char prev = 'a';
        for (char c = 'b'; c <= 'p'; c++) {
            sb.append(c).append(": &").append(c).append(" [");
            for (int i = 0; i < 9; i++) {
                sb.append(i == 0 ? "" : ", ").append('*').append(prev);
            }
            sb.append("]\n");
            prev = c;
        }
        String m = refused(sb.toString());
        assertTrue(m.startsWith("t.yaml"), m);
    }

    @Test
    void missingFileAndWrongExtension() {
        assertTrue(assertThrows(InputException.class, () -> ProtocolReader.read(Path.of("nope.yaml"))).getMessage()
                .contains("no such file"));
        assertTrue(assertThrows(InputException.class, () -> ProtocolReader.read(Path.of("pom.xml"))).getMessage()
                .contains("must end in .yaml, .yml or .json"));
    }
}
