package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermission;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.List;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Issue 10 §1.2–1.4: output sets never mix two runs, never replace what they must not. */
class OutputSetTest {
    @TempDir
    Path dir;

    private void firstRun(Path out, String... names) {
        try (OutputSet set = OutputSet.open(out, false, List.of())) {
            for (String n : names) {
                AtomicFiles.writeString(out.resolve(n), "old " + n, false);
            }
            set.commit();
        }
    }

    private static List<String> hidden(Path out) throws IOException {
        try (Stream<Path> s = Files.list(out)) {
            return s.map(p -> p.getFileName().toString()).filter(n -> n.startsWith(".echotrellis-staging")
                    || n.endsWith(".tmp")).toList();
        }
    }

    @Test
    void nothingIsVisibleBeforeCommitAndAnAbandonedRunLeavesTheOldSet() throws IOException {
        Path out = dir.resolve("o");
        firstRun(out, "t2.nii", "summary.json");
        try (OutputSet set = OutputSet.open(out, true, List.of())) {
            AtomicFiles.writeString(out.resolve("t2.nii"), "new", true);
            assertEquals("old t2.nii", Files.readString(out.resolve("t2.nii")), "staged, not yet in place");
            // the run fails here (full disk, bad voxel data, ...) and never commits
        }
        assertEquals("old t2.nii", Files.readString(out.resolve("t2.nii")));
        assertEquals("old summary.json", Files.readString(out.resolve("summary.json")));
        assertEquals(List.of(), hidden(out));
    }

    private static void namedRun(Path out, String set, String... names) {
        try (OutputSet s = OutputSet.openNamed(out, set, true, List.of())) {
            for (String n : names) {
                AtomicFiles.writeString(out.resolve(n), set + " " + n, true);
            }
            s.commit();
        }
    }

    @Test
    void namedSetsShareADirectoryAndEachReplacesOnlyItsOwnFiles() throws IOException {
        Path out = dir.resolve("anat");
        namedRun(out, "sub-01_fit", "sub-01_T2map.nii.gz", "sub-01_desc-epgfit_TB1map.nii.gz");
        namedRun(out, "sub-01_spectrum", "sub-01_MWFmap.nii.gz");
        namedRun(out, "sub-02_fit", "sub-02_T2map.nii.gz");
        namedRun(out, "sub-01_fit", "sub-01_T2map.nii.gz");  // a refit without the B1 map
        assertFalse(Files.exists(out.resolve("sub-01_desc-epgfit_TB1map.nii.gz")), "left by the set's previous run");
        assertEquals("sub-01_spectrum sub-01_MWFmap.nii.gz", Files.readString(out.resolve("sub-01_MWFmap.nii.gz")));
        assertEquals("sub-02_fit sub-02_T2map.nii.gz", Files.readString(out.resolve("sub-02_T2map.nii.gz")));
        assertEquals(List.of("sub-01_T2map.nii.gz"), Files.readAllLines(out.resolve(OutputSet.MANIFEST + "-sub-01_fit")));
        assertFalse(Files.exists(out.resolve(OutputSet.MANIFEST)), "no unnamed manifest");
        assertEquals(List.of(), hidden(out));
        assertThrows(IllegalArgumentException.class, () -> OutputSet.openNamed(out, "../escape", true, List.of()));
    }

    @Test
    void aCommitReplacesTheWholeSetAndRemovesOutputsThePreviousRunWroteOnly() throws IOException {
        Path out = dir.resolve("o");
        firstRun(out, "a", "b", "summary.json");
        Files.writeString(out.resolve("notes.txt"), "user file");
        try (OutputSet set = OutputSet.open(out, true, List.of())) {
            AtomicFiles.writeString(out.resolve("a"), "new a", true);
            AtomicFiles.writeString(out.resolve("summary.json"), "new s", true);
            set.commit();
        }
        assertEquals("new a", Files.readString(out.resolve("a")));
        assertEquals("new s", Files.readString(out.resolve("summary.json")));
        assertFalse(Files.exists(out.resolve("b")), "b belonged to the previous run only");
        assertEquals("user file", Files.readString(out.resolve("notes.txt")), "files of no run stay");
        assertEquals(List.of("a", "summary.json"), Files.readAllLines(out.resolve(OutputSet.MANIFEST)));
        assertEquals(List.of(), hidden(out));
    }

    @Test
    void existingFilesNeedForce() {
        Path out = dir.resolve("o");
        firstRun(out, "a");
        try (OutputSet set = OutputSet.open(out, false, List.of())) {
            InputException e = assertThrows(InputException.class, () -> set.plan(List.of("a")));
            assertTrue(e.getMessage().contains("exists; overwriting needs force"), e.getMessage());
        }
    }

    @Test
    void aConcurrentRunIntoTheSameDirectoryIsRefused() {
        Path out = dir.resolve("o");
        try (OutputSet first = OutputSet.open(out, false, List.of())) {
            WriteFailure e = assertThrows(WriteFailure.class, () -> OutputSet.open(out, false, List.of()));
            assertTrue(e.getMessage().startsWith("another run is writing to " + out), e.getMessage());
        }
        OutputSet.open(out, false, List.of()).close();  // the lock is released
    }

    @Test
    void staleStagingIsRemovedAndACompleteOneIsFinished() throws IOException {
        Path out = dir.resolve("o");
        firstRun(out, "a");
        Path incomplete = Files.createDirectories(out.resolve(OutputSet.STAGING_PREFIX + "1-dead"));
        Files.writeString(incomplete.resolve("a"), "half-written");
        Path complete = Files.createDirectories(out.resolve(OutputSet.STAGING_PREFIX + "2-dead"));
        Files.writeString(complete.resolve("b"), "complete b");
        Files.writeString(complete.resolve(".complete"), "b\n");
        OutputSet.open(out, false, List.of()).close();
        assertEquals(List.of(), hidden(out));
        // the complete set (b only) was the newer run: its commit finishes and a, of the run before, goes
        assertFalse(Files.exists(out.resolve("a")));
        assertEquals("complete b", Files.readString(out.resolve("b")));
    }

    @Test
    void nonRegularFilesAreNeverReplacedEvenWithForce() throws Exception {
        Path out = Files.createDirectories(dir.resolve("o"));
        Files.createSymbolicLink(out.resolve("t2.nii"), Path.of("/dev/null"));
        Files.createSymbolicLink(out.resolve("link.json"), Files.writeString(dir.resolve("elsewhere"), "keep"));
        Files.createDirectory(out.resolve("sub.png"));
        try (OutputSet set = OutputSet.open(out, true, List.of())) {
            for (String n : List.of("t2.nii", "link.json", "sub.png")) {
                InputException e = assertThrows(InputException.class, () -> set.plan(List.of(n)));
                assertTrue(e.getMessage().startsWith(out.resolve(n).toString()), e.getMessage());
            }
        }
        assertTrue(Files.isSymbolicLink(out.resolve("t2.nii")));
        assertEquals("keep", Files.readString(dir.resolve("elsewhere")));
        InputException dev = assertThrows(InputException.class,
                () -> AtomicFiles.writeString(Path.of("/dev/null"), "x", true));
        assertTrue(dev.getMessage().contains("not a regular file"), dev.getMessage());
    }

    @Test
    void anInputOfTheRunIsNeverWrittenOver() throws IOException {
        Path out = Files.createDirectories(dir.resolve("o"));
        Path input = Files.writeString(out.resolve("spectrum.nii.gz"), "the series");
        Path viaLink = Files.createSymbolicLink(dir.resolve("series-link.nii.gz"), input);
        try (OutputSet set = OutputSet.open(out, true, List.of(viaLink))) {
            InputException e = assertThrows(InputException.class, () -> set.plan(List.of("spectrum.nii.gz")));
            assertTrue(e.getMessage().contains("is an input of this run"), e.getMessage());
        }
        assertEquals("the series", Files.readString(input));
    }

    @Test
    void replacedFilesKeepTheirPermissionsAndNewFilesFollowTheUmask() throws IOException {
        assumeTrue(dir.getFileSystem().supportedFileAttributeViews().contains("posix"));
        Path out = dir.resolve("o");
        firstRun(out, "a");
        Set<PosixFilePermission> mode = PosixFilePermissions.fromString("rw-r-----");
        Files.setPosixFilePermissions(out.resolve("a"), mode);
        Path probe = Files.createFile(dir.resolve("probe"));  // created with the process umask
        try (OutputSet set = OutputSet.open(out, true, List.of())) {
            AtomicFiles.writeString(out.resolve("a"), "new", true);
            AtomicFiles.writeString(out.resolve("b"), "new", true);
            set.commit();
        }
        assertEquals(mode, Files.getPosixFilePermissions(out.resolve("a")));
        assertEquals(Files.getPosixFilePermissions(probe), Files.getPosixFilePermissions(out.resolve("b")));
        AtomicFiles.writeString(dir.resolve("single"), "x", false);
        assertEquals(Files.getPosixFilePermissions(probe), Files.getPosixFilePermissions(dir.resolve("single")));
    }

    @Test
    void anOwnSetReplacesOnlyWhatItsManifestLists() throws IOException {
        Path out = dir.resolve("demo");
        try (OutputSet set = OutputSet.openOwn(out, false, List.of())) {
            AtomicFiles.writeString(out.resolve("summary.md"), "demo 1", false);
            set.commit();
        }
        try (OutputSet set = OutputSet.openOwn(out, false, List.of())) {
            AtomicFiles.writeString(out.resolve("summary.md"), "demo 2", false);
            set.commit();
        }
        assertEquals("demo 2", Files.readString(out.resolve("summary.md")));
        Path user = Files.createDirectories(dir.resolve("user"));
        Files.writeString(user.resolve("summary.md"), "my notes");
        try (OutputSet set = OutputSet.openOwn(user, false, List.of())) {
            assertThrows(InputException.class, () -> set.plan(List.of("summary.md")));
        }
        assertEquals("my notes", Files.readString(user.resolve("summary.md")));
    }

    /** SIGTERM from a scheduler in the middle of a run: staging removed, old set intact. */
    @Test
    void sigtermRemovesTheStagingDirectory() throws Exception {
        Path out = dir.resolve("o");
        firstRun(out, "a");
        Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-cp", System.getProperty("java.class.path"), SlowRun.class.getName(), out.toString())
                .redirectErrorStream(true).start();
        byte[] ready = p.getInputStream().readNBytes(6);
        assertEquals("staged", new String(ready), "child did not stage its file");
        assertEquals(1, hidden(out).size(), "staging directory exists while the run is going");
        p.destroy();  // SIGTERM
        assertTrue(p.waitFor(20, TimeUnit.SECONDS));
        assertEquals(List.of(), hidden(out));
        assertEquals("old a", Files.readString(out.resolve("a")));
    }

    /** A run that stages one file and then works for a long time (for the signal test). */
    public static final class SlowRun {
        /** @param args the output directory */
        public static void main(String[] args) throws Exception {
            Path out = Path.of(args[0]);
            OutputSet set = OutputSet.open(out, true, List.of());
            AtomicFiles.writeString(out.resolve("a"), "new", true);
            System.out.print("staged");
            System.out.flush();
            Thread.sleep(60_000);
            set.commit();
        }
    }
}
