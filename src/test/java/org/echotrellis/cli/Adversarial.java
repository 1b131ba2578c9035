package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.OutputSet;

/** Shared helpers of the adversarial suite: crafted inputs and the checks every case makes. */
final class Adversarial {
    static final String KNEE = "sequences/knee-t2-16.yaml";

    private Adversarial() { }

    /** Exit code, exactly one line on stderr, no stack trace, and every culprit named. */
    static void refused(CliRun r, int code, String... named) {
        assertEquals(code, r.code(), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertTrue(r.err().startsWith("echotrellis: "), r.err());
        assertFalse(r.err().contains("\tat ") || r.err().contains("Exception"), r.err());
        for (String n : named) {
            assertTrue(r.err().contains(n), "'" + n + "' not in: " + r.err());
        }
    }

    /** A small 4-D series of 16 mono-exponential echoes (ESP 9 ms) on an nx × ny × 1 grid. */
    static Path series(Path file, int nx, int ny) {
        int nv = nx * ny;
        double[] data = new double[nv * 16];
        for (int v = 0; v < nv; v++) {
            for (int k = 0; k < 16; k++) {
                data[k * nv + v] = 1000 * Math.exp(-9.0 * (k + 1) / (30 + 5 * v));
            }
        }
        Nifti.write(file, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, 1, 16), data, false);
        return file;
    }

    /** A 3-D image with every voxel set to {@code value}. */
    static Path image(Path file, double value, int... sizes) {
        int n = 1;
        for (int s : sizes) {
            n *= s;
        }
        double[] v = new double[n];
        java.util.Arrays.fill(v, value);
        Nifti.write(file, NiftiHeader.create(NiftiDatatype.FLOAT32, sizes), v, false);
        return file;
    }

    /**
     * Every file below {@code dir} with its content, to prove nothing changed (the empty lock file
     * an output directory keeps is not an output).
     */
    static List<String> snapshot(Path dir) throws IOException {
        List<String> out = new ArrayList<>();
        try (Stream<Path> s = Files.walk(dir)) {
            for (Path p : s.sorted().filter(p -> !p.getFileName().toString().equals(OutputSet.LOCK)).toList()) {
                String kind = Files.isSymbolicLink(p) ? "link->" + Files.readSymbolicLink(p)
                        : Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS) ? java.util.Arrays.hashCode(Files.readAllBytes(p)) + ""
                        : "dir";
                out.add(dir.relativize(p) + " " + kind);
            }
        }
        return out;
    }

    /** No staging directory or temporary file is left anywhere below {@code dir}. */
    static void noLeftovers(Path dir) throws IOException {
        try (Stream<Path> s = Files.walk(dir)) {
            List<Path> left = s.filter(p -> {
                String n = p.getFileName().toString();
                return n.startsWith(".echotrellis-staging") || n.endsWith(".tmp");
            }).toList();
            assertEquals(List.of(), left);
        }
    }

    /** A FIFO made with mkfifo, or null where that is not available. */
    static Path fifo(Path file) {
        try {
            Process p = new ProcessBuilder("mkfifo", file.toString()).start();
            return p.waitFor() == 0 ? file : null;
        } catch (IOException e) {
            return null;
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            return null;
        }
    }
}
