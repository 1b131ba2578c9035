package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;

/** A protocol file holds one document; anything after it is refused rather than silently dropped. */
class ProtocolDocumentTest {
    private static final String TRAIN = "train: {echoes: 3, echo_spacing_ms: 5, refocusing: {flip_deg: 180}}\n";

    @Test
    void secondYamlDocumentIsRefusedWithItsPosition() {
        String m = assertThrows(InputException.class,
                () -> ProtocolReader.parse(TRAIN + "---\ntrain: {echoes: 9}\n", "two.yaml", true)).getMessage();
        assertTrue(m.startsWith("two.yaml:3:1: "), m);
        assertTrue(m.endsWith("give one protocol per file"), m);
    }

    @Test
    void trailingJsonContentIsRefusedWithItsPosition() {
        String json = "{\"train\": {\"echoes\": 3, \"echo_spacing_ms\": 5, \"refocusing\": {\"flip_deg\": 180}}}";
        for (String tail : new String[] {" {\"b1_scale\": 0.5}", "\n[1]", " trailing"}) {
            String m = assertThrows(InputException.class, () -> ProtocolReader.parse(json + tail, "t.json", false),
                    tail).getMessage();
            assertTrue(m.startsWith("t.json:"), m);
        }
        assertEquals(3, ProtocolReader.parse(json + "\n  \n", "t.json", false).echoCount());
        assertEquals(3, ProtocolReader.parse(TRAIN + "# a closing comment\n", "t.yaml", true).echoCount());
        assertEquals(3, ProtocolReader.parse(TRAIN + "...\n", "t.yaml", true).echoCount());
    }

    @Test
    void badPresetValueNamesItsPositionOnce() {
        String m = assertThrows(InputException.class,
                () -> ProtocolReader.parse("tissue: {preset: [1]}\n" + TRAIN, "p.yaml", true)).getMessage();
        assertEquals("p.yaml:1:18: preset must be text, got a list", m);
    }

    @Test
    void aDirectoryIsNamedAsSuch(@org.junit.jupiter.api.io.TempDir java.nio.file.Path tmp) throws Exception {
        java.nio.file.Path dir = java.nio.file.Files.createDirectory(tmp.resolve("protocols.yaml"));
        String m = assertThrows(InputException.class, () -> ProtocolReader.read(dir)).getMessage();
        assertEquals(dir + ": is a directory, expected a protocol file", m);
        String missing = assertThrows(InputException.class, () -> ProtocolReader.read(tmp.resolve("none.yaml"))).getMessage();
        assertEquals(tmp.resolve("none.yaml") + ": no such file", missing);
    }
}
