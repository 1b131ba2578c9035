package org.echotrellis.io;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.channels.OverlappingFileLockException;
import java.nio.charset.StandardCharsets;
import java.nio.file.DirectoryStream;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ThreadLocalRandom;
import org.echotrellis.InputException;

/**
 * A set of output files written as one unit into a directory, so the directory never mixes the
 * outputs of two runs and an interrupted run never looks complete.
 *
 * <p>While the set is open, every {@link AtomicFiles} write into its directory goes to a hidden
 * staging directory inside it ({@value #STAGING_PREFIX}…). {@link #commit()} then moves the staged
 * files into place with renames, removes files that the previous run listed in its manifest
 * ({@value #MANIFEST}) but this run did not write, and records the new manifest. A lock file
 * ({@value #LOCK}, an operating-system lock that dies with its process) refuses a concurrent run
 * into the same directory. A shutdown hook (SIGINT, SIGTERM) removes an uncommitted staging
 * directory and finishes a commit in progress; a later run removes stale staging directories or
 * finishes their commit if they were complete.
 *
 * <p>Existing files are replaced only when {@code force} is given (or, for an {@link #openOwn own}
 * set, when the manifest shows the previous run wrote them), never when they are not regular files
 * (directories, links, devices, pipes) and never when they are inputs of the same run (compared by
 * real path). A replaced file keeps its permissions; new files get the process umask.
 *
 * <p>Several sets may share one directory when each has a name ({@link #openNamed}): a BIDS
 * {@code anat/} folder holds the fit and the spectrum outputs of several collections, each a set of
 * its own with its own manifest ({@value #MANIFEST}{@code -<name>}); committing one set never removes
 * another's files. Runs into the same directory still take turns on the one lock.
 */
public final class OutputSet implements AutoCloseable {
    /** Manifest of the last committed set: one file name per line. */
    public static final String MANIFEST = ".echotrellis-outputs";
    /** Lock file guarding the directory against concurrent runs. */
    public static final String LOCK = ".echotrellis-lock";
    /** Name prefix of staging directories. */
    public static final String STAGING_PREFIX = ".echotrellis-staging-";
    private static final String COMPLETE = ".complete";
    /** File in a staging directory naming its set (absent for the unnamed set). */
    private static final String SET_NAME = ".set";
    private static final Set<OutputSet> OPEN = ConcurrentHashMap.newKeySet();

    static {
        Runtime.getRuntime().addShutdownHook(new Thread(OutputSet::onShutdown, "echotrellis-output-cleanup"));
    }

    private final Path dir;
    private final String name;
    private final boolean force;
    private final boolean replaceOwn;
    private final List<Path> inputs;
    private final Path staging;
    private final FileChannel lockChannel;
    private final FileLock lock;
    private final Set<String> previous;
    private final Set<String> written = ConcurrentHashMap.newKeySet();
    private boolean committing;
    private boolean closed;

    private OutputSet(Path dir, String name, boolean force, boolean replaceOwn, Collection<Path> inputs) {
        if (!name.isEmpty() && !name.matches("[A-Za-z0-9][A-Za-z0-9_.-]*")) {
            throw new IllegalArgumentException("output set name " + name + ": letters, digits, _ . - only");
        }
        this.dir = dir.toAbsolutePath().normalize();
        this.name = name;
        this.force = force;
        this.replaceOwn = replaceOwn;
        this.inputs = realPaths(inputs);
        if (Files.exists(this.dir) && !Files.isDirectory(this.dir)) {
            throw new InputException("out " + dir + " exists and is not a directory");
        }
        try {
            Files.createDirectories(this.dir);
        } catch (IOException e) {
            throw WriteFailure.of("cannot create the output directory " + dir, e);
        }
        FileChannel ch = null;
        FileLock l = null;
        try {
            ch = FileChannel.open(this.dir.resolve(LOCK), StandardOpenOption.CREATE, StandardOpenOption.WRITE);
            try {
                l = ch.tryLock();
            } catch (OverlappingFileLockException e) {
                l = null;
            }
            if (l == null) {
                ch.close();
                throw new WriteFailure("another run is writing to " + dir + " (lock " + LOCK
                        + "); wait for it to finish or choose another output directory");
            }
            cleanStale(this.dir);
            this.previous = readManifest(this.dir, name);
            this.staging = Files.createDirectory(this.dir.resolve(STAGING_PREFIX + ProcessHandle.current().pid() + "-"
                    + Long.toHexString(ThreadLocalRandom.current().nextLong() & 0xffffffffL)));
            if (!name.isEmpty()) {
                Files.writeString(staging.resolve(SET_NAME), name, StandardCharsets.UTF_8);
            }
        } catch (IOException e) {
            closeQuietly(ch);
            throw WriteFailure.of("cannot write to the output directory " + dir, e);
        }
        this.lockChannel = ch;
        this.lock = l;
        OPEN.add(this);
    }

    /**
     * Opens a set: creates the directory, takes its lock, cleans stale staging directories.
     *
     * @param dir the output directory
     * @param force whether existing files may be replaced
     * @param inputs the run's input files (never written over; may contain nulls)
     * @return the open set (commit, then close)
     */
    public static OutputSet open(Path dir, boolean force, Collection<Path> inputs) {
        return new OutputSet(dir, "", force, false, inputs);
    }

    /**
     * Like {@link #open}, for one of several sets sharing a directory: the set's manifest carries its
     * name, so its commit replaces and removes only files of the same set.
     *
     * @param dir the output directory
     * @param name the set's name (letters, digits, {@code _ . -}), e.g. a file-name prefix and analysis
     * @param force whether existing files may be replaced
     * @param inputs the run's input files (never written over; may contain nulls)
     * @return the open set (commit, then close)
     */
    public static OutputSet openNamed(Path dir, String name, boolean force, Collection<Path> inputs) {
        if (name.isEmpty()) {
            throw new IllegalArgumentException("a named output set needs a name");
        }
        return new OutputSet(dir, name, force, false, inputs);
    }

    /**
     * Like {@link #open}, but files listed in the directory's manifest (written by an earlier run
     * of the same kind) may be replaced without {@code force}.
     *
     * @param dir the output directory
     * @param force whether any existing file may be replaced
     * @param inputs the run's input files
     * @return the open set
     */
    public static OutputSet openOwn(Path dir, boolean force, Collection<Path> inputs) {
        return new OutputSet(dir, "", force, true, inputs);
    }

    /** @return the output directory (absolute) */
    public Path dir() {
        return dir;
    }

    /**
     * Checks up front, before any long work, that every named file may be written.
     *
     * @param names file names inside the directory
     */
    public void plan(Collection<String> names) {
        for (String n : names) {
            check(dir.resolve(n));
        }
    }

    /**
     * Where a file written earlier in this run can be read back: its staged copy while the set
     * holding it is open, otherwise the path itself.
     *
     * @param target the output path
     * @return the path to read
     */
    public static Path readable(Path target) {
        Optional<OutputSet> s = enclosing(target);
        String name = target.getFileName().toString();
        if (s.isPresent() && s.get().written.contains(name)) {
            return s.get().staging.resolve(name);
        }
        return target;
    }

    /** The open set whose directory holds {@code target}, if any. */
    static Optional<OutputSet> enclosing(Path target) {
        Path parent = target.toAbsolutePath().normalize().getParent();
        for (OutputSet s : OPEN) {
            if (s.dir.equals(parent)) {
                return Optional.of(s);
            }
        }
        return Optional.empty();
    }

    /** Refuses a target that may not be written (exists without permission, not regular, an input). */
    void check(Path target) {
        Path t = target.toAbsolutePath().normalize();
        if (Files.exists(t, LinkOption.NOFOLLOW_LINKS)) {
            AtomicFiles.refuseSpecial(t, inputs);
            boolean own = replaceOwn && previous.contains(t.getFileName().toString());
            if (!force && !own) {
                throw new InputException(target + AtomicFiles.EXISTS);
            }
        }
    }

    /** @return where the content of {@code target} is staged (target checked and recorded) */
    synchronized Path stage(Path target) {
        if (committing || closed) {
            throw new IllegalStateException("output set " + dir + " is already committed");
        }
        check(target);
        String name = target.getFileName().toString();
        written.add(name);
        return staging.resolve(name);
    }

    /** Moves the staged files into place, removes the previous run's leftovers, records the manifest. */
    public synchronized void commit() {
        if (closed || committing) {
            throw new IllegalStateException("output set " + dir + " is already committed");
        }
        try {
            for (String n : written) {
                check(dir.resolve(n));  // files may have appeared while the job ran
            }
            Files.write(staging.resolve(COMPLETE), new ArrayList<>(written), StandardCharsets.UTF_8);
            committing = true;
            rollForward(dir, staging, inputs);
        } catch (IOException e) {
            throw WriteFailure.of("cannot write to the output directory " + dir, e);
        }
    }

    /** Removes an uncommitted staging directory and releases the lock. */
    @Override
    public synchronized void close() {
        if (closed) {
            return;
        }
        closed = true;
        OPEN.remove(this);
        deleteTree(staging);
        try {
            lock.release();
        } catch (IOException ignored) {
            // the lock dies with the channel anyway
        }
        closeQuietly(lockChannel);
    }

    private static void onShutdown() {
        for (OutputSet s : OPEN) {
            synchronized (s) {
                if (s.committing && !s.closed) {
                    try {
                        rollForward(s.dir, s.staging, s.inputs);
                    } catch (IOException | RuntimeException ignored) {
                        // a later run finishes it: the staging directory is marked complete
                    }
                }
                s.close();
            }
        }
    }

    /** Moves a complete staging directory's files into place and records the manifest. */
    private static void rollForward(Path dir, Path staging, List<Path> inputs) throws IOException {
        List<String> names = Files.readAllLines(staging.resolve(COMPLETE), StandardCharsets.UTF_8);
        Path setFile = staging.resolve(SET_NAME);
        String set = Files.isRegularFile(setFile) ? Files.readString(setFile, StandardCharsets.UTF_8).strip() : "";
        Set<String> previous = readManifest(dir, set);
        for (String n : names) {
            Path from = staging.resolve(n);
            if (Files.exists(from, LinkOption.NOFOLLOW_LINKS)) {
                AtomicFiles.moveInto(from, dir.resolve(n));
            }
        }
        Set<String> now = new HashSet<>(names);
        for (String old : previous) {
            Path p = dir.resolve(old).normalize();
            if (!now.contains(old) && p.getParent().equals(dir) && Files.isRegularFile(p, LinkOption.NOFOLLOW_LINKS)
                    && !isInput(p, inputs)) {
                Files.deleteIfExists(p);
            }
        }
        Path tmp = staging.resolve(manifestName(set));
        // sorted, so that regenerating the same outputs (the committed demo figures) gives the same manifest
        Files.write(tmp, new java.util.TreeSet<>(names), StandardCharsets.UTF_8);
        AtomicFiles.moveInto(tmp, dir.resolve(manifestName(set)));
        deleteTree(staging);
    }

    /** Finishes complete staging directories left by a killed run and removes incomplete ones. */
    private static void cleanStale(Path dir) throws IOException {
        List<Path> stale = new ArrayList<>();
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(dir, STAGING_PREFIX + "*")) {
            ds.forEach(stale::add);
        }
        for (Path s : stale) {
            if (Files.isRegularFile(s.resolve(COMPLETE))) {
                rollForward(dir, s, List.of());
            } else {
                deleteTree(s);
            }
        }
    }

    /** @return the manifest file name of a set ({@value #MANIFEST} for the unnamed set) */
    static String manifestName(String set) {
        return set.isEmpty() ? MANIFEST : MANIFEST + "-" + set;
    }

    private static Set<String> readManifest(Path dir, String set) throws IOException {
        Path m = dir.resolve(manifestName(set));
        Set<String> names = new LinkedHashSet<>();
        if (Files.isRegularFile(m, LinkOption.NOFOLLOW_LINKS)) {
            for (String line : Files.readAllLines(m, StandardCharsets.UTF_8)) {
                if (!line.isBlank() && !line.contains("/") && !line.contains("\\") && !line.startsWith(".")) {
                    names.add(line.strip());
                }
            }
        }
        return names;
    }

    static List<Path> realPaths(Collection<Path> paths) {
        List<Path> real = new ArrayList<>();
        for (Path p : paths) {
            if (p == null) {
                continue;
            }
            try {
                real.add(p.toRealPath());
            } catch (IOException e) {
                real.add(p.toAbsolutePath().normalize());
            }
        }
        return real;
    }

    static boolean isInput(Path target, List<Path> inputs) {
        for (Path in : inputs) {
            try {
                if (Files.exists(target) && Files.exists(in) && Files.isSameFile(target, in)) {
                    return true;
                }
            } catch (IOException ignored) {
                // unreadable: cannot be the same file we read
            }
            if (target.toAbsolutePath().normalize().equals(in)) {
                return true;
            }
        }
        return false;
    }

    private static void deleteTree(Path root) {
        if (!Files.exists(root, LinkOption.NOFOLLOW_LINKS)) {
            return;
        }
        try (DirectoryStream<Path> ds = Files.newDirectoryStream(root)) {
            for (Path p : ds) {
                if (Files.isDirectory(p, LinkOption.NOFOLLOW_LINKS)) {
                    deleteTree(p);
                } else {
                    Files.deleteIfExists(p);
                }
            }
        } catch (IOException | RuntimeException ignored) {
            // best effort; a later run removes what is left
        }
        try {
            Files.deleteIfExists(root);
        } catch (IOException ignored) {
            // best effort
        }
    }

    private static void closeQuietly(FileChannel ch) {
        if (ch != null) {
            try {
                ch.close();
            } catch (IOException ignored) {
                // nothing to do
            }
        }
    }
}
