package org.echotrellis.cli;

import static org.echotrellis.cli.Adversarial.KNEE;
import static org.echotrellis.cli.Adversarial.fifo;
import static org.echotrellis.cli.Adversarial.image;
import static org.echotrellis.cli.Adversarial.refused;
import static org.echotrellis.cli.Adversarial.series;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.AccessDeniedException;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.echotrellis.InputFiles;
import org.echotrellis.io.WriteFailure;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Issue 10 §2 and §3, hostile or mistaken inputs: each is refused with exit 2 and one line naming
 * the file, option or value, or (where the issue asks for it) accepted with a note.
 */
class AdversarialInputsTest {
    @TempDir
    Path dir;

    private Path protocol(String name, String text) throws IOException {
        return Files.writeString(dir.resolve(name), text);
    }

    private static final String TRAIN = "train:\n  echoes: 4\n  echo_spacing_ms: 10\n"
            + "  refocusing: {flip_deg: 180}\n";

    @Test
    void fifosAndDevicesAreRefusedBeforeOpening() throws Exception {
        Path pipe = fifo(dir.resolve("p.yaml"));
        assumeTrue(pipe != null, "mkfifo not available");
        refused(CliRun.of("simulate", pipe.toString()), 2, pipe.toString(), "not a regular file");
        Path list = fifo(dir.resolve("target.txt"));
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "list:" + list), 2, list.toString(), "not a regular file");
        Path zero = Files.createSymbolicLink(dir.resolve("zero.yaml"), Path.of("/dev/zero"));
        refused(CliRun.of("simulate", zero.toString()), 2, zero.toString(), "not a regular file");
        Path table = fifo(dir.resolve("t.csv"));
        refused(CliRun.of("fit", table.toString(), "--protocol", KNEE), 2, table.toString(), "not a regular file");
    }

    @Test
    void permissionAndDiskErrorsSayTheSystemsReason() {
        assertEquals("x.yaml: permission denied",
                InputFiles.readFailure("x.yaml", new AccessDeniedException("x.yaml")).getMessage());
        assertEquals("cannot write o/t2.nii: No space left on device",
                WriteFailure.of("cannot write o/t2.nii", new FileSystemException("o/t2.nii", null, "No space left on device"))
                        .getMessage());
        assertEquals("permission denied", WriteFailure.reason(new java.io.FileNotFoundException("o/x (Permission denied)")));
    }

    @Test
    void anUnreadableProtocolSaysPermissionDenied() throws Exception {
        assumeTrue(!"root".equals(System.getProperty("user.name")), "root reads everything");
        Path p = protocol("secret.yaml", TRAIN);
        Files.setPosixFilePermissions(p, java.nio.file.attribute.PosixFilePermissions.fromString("-w-------"));
        refused(CliRun.of("simulate", p.toString()), 2, p.toString(), "permission denied");
    }

    @Test
    void optionsThatWouldBeIgnoredAreRefused() throws Exception {
        refused(CliRun.of("simulate", KNEE, "--threads", "4"), 2, "--threads", "--sweep");
        Path s = series(dir.resolve("s.nii"), 2, 2);
        refused(CliRun.of("fit", s.toString(), "--protocol", KNEE, "--mono-offset", "--out", dir.resolve("o").toString()),
                2, "--mono-offset", "--compare-mono");
        Path table = Files.writeString(dir.resolve("t.csv"), table());
        refused(CliRun.of("fit", table.toString(), "--protocol", KNEE, "--threads", "0"), 2, "--threads", table.toString());
        refused(CliRun.of("spectrum", table.toString(), "--protocol", KNEE, "--threads", "0"), 2, "--threads");
        refused(CliRun.of("spectrum", table.toString(), "--protocol", KNEE, "--regularisation", "none",
                "--misfit-increase", "1.05"), 2, "--misfit-increase", "--regularisation none");
        refused(CliRun.of("pathways", KNEE, "--diagram-threshold", "0.1"), 2, "--diagram-threshold", "--diagram");
        refused(CliRun.of("fit", s.toString(), "--protocol", KNEE, "--plot", "x.png"), 2, "--plot");
    }

    private static String table() {
        StringBuilder sb = new StringBuilder("te_ms,a\n");
        for (int k = 1; k <= 16; k++) {
            sb.append(9.0 * k).append(',').append(1000 * Math.exp(-9.0 * k / 40)).append('\n');
        }
        return sb.toString();
    }

    @Test
    void yamlAliasesOfMappingsResolveAndOthersAreRefusedClearly() throws Exception {
        Path ok = protocol("alias.yaml", "tissue: {t1_ms: 1000, t2_ms: 80}\nrefocus: &ex {flip_deg: 160}\n".replace(
                "refocus: &ex {flip_deg: 160}\n", "") + "train:\n  echoes: 4\n  echo_spacing_ms: 10\n"
                + "  excitation: &ex {flip_deg: 90, phase_deg: 90}\n  refocusing: {flip_deg: 180, phase_deg: 0}\n");
        assertEquals(0, CliRun.of("simulate", ok.toString()).code());
        Path events = protocol("events.yaml", "tissue: {t1_ms: 1000, t2_ms: 80}\nevents:\n"
                + "  - rf: &ninety {flip_deg: 90, phase_deg: 90}\n  - interval: {duration_ms: 5, dephasing: 1}\n"
                + "  - rf: {flip_deg: 180}\n  - interval: {duration_ms: 5, dephasing: 1}\n  - echo: {}\n"
                + "  - rf: *ninety\n  - interval: {duration_ms: 5, dephasing: 1}\n  - echo: {}\n");
        CliRun r = CliRun.of("simulate", events.toString(), "--format", "csv");
        assertEquals(0, r.code(), r.err());
        Path scalar = protocol("label.yaml", "tissue: {t1_ms: 1000, t2_ms: 80}\nname: &L knee\nevents:\n"
                + "  - rf: {flip_deg: 90}\n  - interval: {duration_ms: 5}\n  - echo: {label: *L}\n");
        refused(CliRun.of("simulate", scalar.toString()), 2, "label.yaml:", "alias *L", "write the value out");
    }

    @Test
    void ambiguousNumbersAndDoubledKeysAreRefused() throws Exception {
        for (String n : new String[] {"010", "0x10", "0o10", "1_6"}) {
            Path p = protocol("n.yaml", "tissue: {t1_ms: 1000, t2_ms: 80}\ntrain:\n  echoes: " + n
                    + "\n  echo_spacing_ms: 10\n  refocusing: {flip_deg: 180}\n");
            // YAML 1.1 reads 0o10 as text: refused as not a number; the others as octal, hex or grouped
            refused(CliRun.of("simulate", p.toString()), 2, "n.yaml:3:", "'" + n + "'",
                    n.startsWith("0o") ? "must be a number" : "plain decimal");
        }
        Path b1 = protocol("b1.yaml", "b1_scale: 0.8\ntissue: {t1_ms: 1000, t2_ms: 80}\n" + TRAIN + "  b1_scale: 0.9\n");
        refused(CliRun.of("simulate", b1.toString()), 2, "b1.yaml:", "b1_scale is given twice");
    }

    @Test
    void aMissingTissueIsNotedAndControlCharactersNeverReachTheTerminal() throws Exception {
        Path p = protocol("plain.yaml", "name: \"bad\\e[31mname\\u202e\"\n" + TRAIN);
        CliRun r = CliRun.of("simulate", p.toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.err().startsWith("note: " + p + " has no tissue section; assuming T1 1000 ms, T2 100 ms"), r.err());
        assertFalse(r.out().contains("\u001b") || r.out().contains("\u202e"), r.out());
        assertTrue(r.out().contains("bad?[31mname?"), r.out());
        CliRun quiet = CliRun.of("simulate", p.toString(), "--t1-ms", "900", "--t2-ms", "60");
        assertEquals("", quiet.err(), "both given: nothing assumed");
        refused(CliRun.of("simulate", dir.resolve("x\u001b[2J.yaml").toString()), 2, "x?[2J.yaml");
    }

    @Test
    void designTimingAndKnotRulesAgreeWithTheirMessages() {
        refused(CliRun.of("design", "--protocol", KNEE, "--target", "constant:0.4", "--tr-ms", "1", "--pulse", "sinc:4",
                "--pulse-ms", "2"), 2, "--tr-ms 1", "144 ms");
        for (String k : new String[] {"1", "33", "1000"}) {
            refused(CliRun.of("design", "--protocol", KNEE, "--objective", "signal:8", "--knots", k), 2, "--knots must be within [2, 32]");
        }
    }

    @Test
    void unclearMessagesNowSayWhatIsWrong() throws Exception {
        Path table = Files.writeString(dir.resolve("t.csv"), table());
        refused(CliRun.of("fit", table.toString(), "--protocol", KNEE, "--slice-profile", "sinc"), 2,
                "--slice-profile sinc", "time-bandwidth product", "sinc:4");
        Path threeD = image(dir.resolve("one.nii"), 5, 2, 2, 2);
        refused(CliRun.of("fit", threeD.toString(), "--protocol", KNEE, "--out", dir.resolve("o").toString()), 2,
                threeD.toString(), "3-D image", "4-D series");
        Path noHeader = Files.writeString(dir.resolve("nohead.csv"), table().substring(table().indexOf('\n') + 1));
        refused(CliRun.of("fit", noHeader.toString(), "--protocol", KNEE), 2, noHeader.toString(), "header row");
        for (float off : new float[] {100, -100, 0}) {
            Path s = series(dir.resolve("off.nii"), 2, 2);
            byte[] b = Files.readAllBytes(s);
            ByteBuffer.wrap(b).order(ByteOrder.LITTLE_ENDIAN).putFloat(108, off);
            Files.write(s, b);
            refused(CliRun.of("fit", s.toString(), "--protocol", KNEE, "--out", dir.resolve("o").toString()), 2,
                    s.toString(), "vox_offset must be a whole number >= 352");
            Files.delete(s);
        }
    }
}
