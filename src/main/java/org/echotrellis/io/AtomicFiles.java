package org.echotrellis.io;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import org.echotrellis.InputException;

/**
 * Writes output files atomically: the content goes to a temporary file in the target's directory
 * and is then moved into place, so a reader never sees a half-written file and a failed run leaves
 * no partial output. An existing target is refused unless {@code force} is set.
 */
public final class AtomicFiles {
    private AtomicFiles() { }

    /** Produces the content of a file. */
    @FunctionalInterface
    public interface Body {
        /**
         * @param out stream to write to (closed by the caller)
         * @throws IOException on failure
         */
        void write(OutputStream out) throws IOException;
    }

    /**
     * Refuses an existing file unless forced.
     *
     * @param target the output path
     * @param force whether overwriting is allowed
     */
    public static void checkWritable(Path target, boolean force) {
        if (!force && Files.exists(target)) {
            throw new InputException(target + " exists; use --force to overwrite");
        }
        if (Files.isDirectory(target)) {
            throw new InputException(target + " is a directory, expected a file path");
        }
    }

    /**
     * Writes a file atomically, creating parent directories.
     *
     * @param target the output path
     * @param force whether an existing file may be replaced
     * @param body writes the content
     */
    public static void write(Path target, boolean force, Body body) {
        checkWritable(target, force);
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        Path tmp = null;
        try {
            Files.createDirectories(dir);
            tmp = Files.createTempFile(dir, "." + abs.getFileName() + ".", ".tmp");
            readableByAll(tmp);
            try (OutputStream out = new java.io.BufferedOutputStream(Files.newOutputStream(tmp), 1 << 16)) {
                body.write(out);
            }
            try {
                Files.move(tmp, abs, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING);
            }
            tmp = null;
        } catch (IOException e) {
            throw new InputException("cannot write " + target + ": " + e.getMessage(), e);
        } finally {
            if (tmp != null) {
                try {
                    Files.deleteIfExists(tmp);
                } catch (IOException ignored) {
                    // best effort clean-up of the temporary file
                }
            }
        }
    }

    /** Temporary files are created owner-only; outputs get the usual rw-r--r-- where POSIX applies. */
    private static void readableByAll(Path tmp) throws IOException {
        if (tmp.getFileSystem().supportedFileAttributeViews().contains("posix")) {
            Files.setPosixFilePermissions(tmp, java.nio.file.attribute.PosixFilePermissions.fromString("rw-r--r--"));
        }
    }

    /** Writes UTF-8 text atomically. */
    public static void writeString(Path target, String text, boolean force) {
        write(target, force, out -> out.write(text.getBytes(StandardCharsets.UTF_8)));
    }
}
