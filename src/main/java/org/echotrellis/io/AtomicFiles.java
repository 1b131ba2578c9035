package org.echotrellis.io;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.PosixFilePermission;
import java.util.Collection;
import java.util.List;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ThreadLocalRandom;
import org.echotrellis.InputException;

/**
 * Writes output files atomically: the content goes to a temporary file in the target's directory
 * and is then moved into place, so a reader never sees a half-written file and a failed run leaves
 * no partial output. Inside an open {@link OutputSet} the content is staged with the rest of the
 * set instead. An existing target is refused unless {@code force} is set, and never replaced when
 * it is not a regular file. A replaced file keeps its permissions; new files get the umask.
 * Temporary files are removed on exit (SIGINT, SIGTERM) and stale ones of dead processes by the
 * next write of the same file.
 */
public final class AtomicFiles {
    /** Ends the message refusing an existing file when overwriting was not asked for (after the path). */
    public static final String EXISTS = " exists; overwriting needs force";

    private static final String TMP_MARK = ".echotrellis-";
    private static final Set<Path> TEMPORARIES = ConcurrentHashMap.newKeySet();

    static {
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            for (Path p : TEMPORARIES) {
                try {
                    Files.deleteIfExists(p);
                } catch (IOException ignored) {
                    // best effort; the next write of the same file removes it
                }
            }
        }, "echotrellis-temp-cleanup"));
    }

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
     * Refuses an existing file unless forced, and anything that is not a regular file.
     *
     * @param target the output path
     * @param force whether overwriting is allowed
     */
    public static void checkWritable(Path target, boolean force) {
        checkWritable(target, force, List.of());
    }

    /**
     * Refuses an existing file unless forced, anything that is not a regular file, and any input
     * of the same run (compared by real path).
     *
     * @param target the output path
     * @param force whether overwriting is allowed
     * @param inputs the run's input files (may contain nulls)
     */
    public static void checkWritable(Path target, boolean force, Collection<Path> inputs) {
        var set = OutputSet.enclosing(target);
        if (set.isPresent()) {
            set.get().check(target);
            return;
        }
        if (Files.exists(target, LinkOption.NOFOLLOW_LINKS)) {
            refuseSpecial(target, OutputSet.realPaths(inputs));
            if (!force) {
                throw new InputException(target + EXISTS);
            }
        }
    }

    /** Refuses an existing path that is not a regular file or that is an input. */
    static void refuseSpecial(Path target, List<Path> inputs) {
        if (Files.isDirectory(target, LinkOption.NOFOLLOW_LINKS)) {
            throw new InputException(target + " is a directory, expected a file path");
        }
        if (Files.isSymbolicLink(target)) {
            throw new InputException(target + " is a symbolic link; refused to replace it (remove it or choose another path)");
        }
        if (!Files.isRegularFile(target, LinkOption.NOFOLLOW_LINKS)) {
            throw new InputException(target + " is not a regular file (a device, pipe or socket); refused to replace it");
        }
        if (OutputSet.isInput(target, inputs)) {
            throw new InputException(target + " is an input of this run; refused to write over it");
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
        var set = OutputSet.enclosing(target);
        if (set.isPresent()) {
            Path staged = set.get().stage(target);
            try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(staged), 1 << 16)) {
                body.write(out);
            } catch (IOException e) {
                throw WriteFailure.of("cannot write " + target, e);
            }
            return;
        }
        checkWritable(target, force);
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        Path tmp = null;
        try {
            Files.createDirectories(dir);
            cleanStale(dir, abs.getFileName().toString());
            tmp = dir.resolve("." + abs.getFileName() + TMP_MARK + ProcessHandle.current().pid() + "-"
                    + Long.toHexString(ThreadLocalRandom.current().nextLong() & 0xffffffffL) + ".tmp");
            TEMPORARIES.add(tmp);
            try (OutputStream out = new BufferedOutputStream(
                    Files.newOutputStream(tmp, StandardOpenOption.CREATE_NEW, StandardOpenOption.WRITE), 1 << 16)) {
                body.write(out);
            }
            checkWritable(target, force);  // the target may have changed while writing
            moveInto(tmp, abs);
        } catch (IOException e) {
            throw WriteFailure.of("cannot write " + target, e);
        } finally {
            if (tmp != null) {
                try {
                    Files.deleteIfExists(tmp);
                } catch (IOException ignored) {
                    // best effort clean-up of the temporary file
                }
                TEMPORARIES.remove(tmp);
            }
        }
    }

    /**
     * Moves a finished file onto its target with a rename, keeping the permissions of a replaced
     * regular file.
     */
    static void moveInto(Path from, Path to) throws IOException {
        if (Files.isRegularFile(to, LinkOption.NOFOLLOW_LINKS)
                && to.getFileSystem().supportedFileAttributeViews().contains("posix")) {
            Set<PosixFilePermission> perms = Files.getPosixFilePermissions(to, LinkOption.NOFOLLOW_LINKS);
            Files.setPosixFilePermissions(from, perms);
        }
        try {
            Files.move(from, to, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
        } catch (AtomicMoveNotSupportedException e) {
            Files.move(from, to, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    /** Removes temporaries of {@code name} left by processes that no longer run. */
    private static void cleanStale(Path dir, String name) {
        String prefix = "." + name + TMP_MARK;
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(dir, p -> {
            String n = p.getFileName().toString();
            return n.startsWith(prefix) && n.endsWith(".tmp");
        })) {
            for (Path p : ds) {
                String rest = p.getFileName().toString().substring(prefix.length());
                int dash = rest.indexOf('-');
                try {
                    long pid = Long.parseLong(rest.substring(0, dash));
                    if (ProcessHandle.of(pid).isEmpty()) {
                        Files.deleteIfExists(p);
                    }
                } catch (RuntimeException ignored) {
                    // not one of ours
                }
            }
        } catch (IOException ignored) {
            // best effort
        }
    }

    /**
     * Writes UTF-8 text atomically.
     *
     * @param target the file to write
     * @param text the whole content
     * @param force replace an existing file; without it an existing file is an input error
     */
    public static void writeString(Path target, String text, boolean force) {
        write(target, force, out -> out.write(text.getBytes(StandardCharsets.UTF_8)));
    }
}
