package org.echotrellis.cohort;

import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.UUID;

import org.apache.hadoop.conf.Configuration;
import org.apache.hadoop.fs.FileStatus;
import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.FileUtil;

/**
 * File access of the cohort job through Hadoop's {@link FileSystem} API, so that {@code file://},
 * {@code hdfs://} and {@code s3a://} locations work alike. A location without a scheme is a local
 * path. Outputs are staged in a local directory and published by copying to a hidden temporary
 * name next to the target and renaming it into place: on local disks and HDFS the rename is atomic,
 * so a reader sees a subject's outputs complete or not at all (on S3 a rename is a copy; a
 * job interrupted during it leaves the hidden temporary name, never a partial target).
 */
final class Storage {
    private Storage() { }

    /**
     * @param location a URI or a local path
     * @return the Hadoop path, local paths made absolute
     */
    static org.apache.hadoop.fs.Path path(String location) {
        URI uri = URI.create(location.replace(" ", "%20"));
        if (uri.getScheme() == null || uri.getScheme().length() == 1) {
            return new org.apache.hadoop.fs.Path(Path.of(location).toAbsolutePath().normalize().toUri());
        }
        return new org.apache.hadoop.fs.Path(location);
    }

    /**
     * @param p a Hadoop path
     * @return its file system (cached by Hadoop)
     */
    static FileSystem fs(org.apache.hadoop.fs.Path p) {
        try {
            Configuration conf = new Configuration();
            if (isLocal(p)) {
                // the raw local file system: no .crc checksum files beside the outputs
                return FileSystem.getLocal(conf).getRawFileSystem();
            }
            return p.getFileSystem(conf);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot reach the file system of " + p + ": " + e.getMessage(), e);
        }
    }

    /** @return true if the location is on the local file system */
    static boolean isLocal(org.apache.hadoop.fs.Path p) {
        return "file".equals(p.toUri().getScheme());
    }

    /** @return the local path of a {@code file:} location */
    static Path local(org.apache.hadoop.fs.Path p) {
        return Path.of(p.toUri());
    }

    /**
     * @param p a location
     * @return true if a file or directory exists there
     */
    static boolean exists(org.apache.hadoop.fs.Path p) {
        try {
            return fs(p).exists(p);
        } catch (IOException e) {
            throw new UncheckedIOException(p + ": " + e.getMessage(), e);
        }
    }

    /**
     * Copies a remote file or directory into a local directory.
     *
     * @param src the remote location
     * @param localDir an existing local directory
     * @return the local copy
     */
    static Path fetch(org.apache.hadoop.fs.Path src, Path localDir) {
        Path dst = localDir.resolve(src.getName());
        try {
            fs(src).copyToLocalFile(false, src, new org.apache.hadoop.fs.Path(dst.toUri()), true);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + src + ": " + e.getMessage(), e);
        }
        return dst;
    }

    /**
     * Copies the JSON files (sidecars) directly in a remote directory into a local directory.
     *
     * @param dir the remote directory
     * @param localDir an existing local directory
     */
    static void fetchSidecars(org.apache.hadoop.fs.Path dir, Path localDir) {
        try {
            for (FileStatus s : fs(dir).listStatus(dir)) {
                if (s.isFile() && s.getPath().getName().endsWith(".json")) {
                    fetch(s.getPath(), localDir);
                }
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot list " + dir + ": " + e.getMessage(), e);
        }
    }

    /**
     * Publishes a local directory as {@code target}: copied to a hidden temporary sibling, then
     * renamed. An existing target is replaced only with {@code replace}.
     *
     * @param localDir the finished outputs
     * @param target the final location (its parent is created)
     * @param replace delete an existing target first
     */
    static void publish(Path localDir, org.apache.hadoop.fs.Path target, boolean replace) {
        FileSystem fs = fs(target);
        org.apache.hadoop.fs.Path tmp = new org.apache.hadoop.fs.Path(target.getParent(),
                "." + target.getName() + ".tmp-" + UUID.randomUUID());
        try {
            fs.mkdirs(target.getParent());
            fs.copyFromLocalFile(false, true, new org.apache.hadoop.fs.Path(localDir.toUri()), tmp);
            if (fs.exists(target)) {
                if (!replace) {
                    throw new IOException(target + " appeared while this subject ran (another run writes here?)");
                }
                fs.delete(target, true);
            }
            if (!fs.rename(tmp, target)) {
                throw new IOException("cannot rename " + tmp + " to " + target);
            }
        } catch (IOException e) {
            try {
                fs.delete(tmp, true);
            } catch (IOException ignored) {
                // the first failure is the one to report
            }
            throw new UncheckedIOException("cannot write " + target + ": " + e.getMessage(), e);
        }
    }

    /**
     * Writes a small text file atomically (temporary sibling, then rename; replaces).
     *
     * @param target the file
     * @param text its content (UTF-8)
     */
    static void writeText(org.apache.hadoop.fs.Path target, String text) {
        FileSystem fs = fs(target);
        org.apache.hadoop.fs.Path tmp = new org.apache.hadoop.fs.Path(target.getParent(),
                "." + target.getName() + ".tmp-" + UUID.randomUUID());
        try {
            fs.mkdirs(target.getParent());
            try (OutputStream out = fs.create(tmp, false)) {
                out.write(text.getBytes(StandardCharsets.UTF_8));
            }
            replace(fs, tmp, target);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + target + ": " + e.getMessage(), e);
        }
    }

    /**
     * Moves a finished temporary file or directory onto {@code target}, replacing it.
     *
     * @param fs the file system of both
     * @param tmp the finished temporary
     * @param target the final name
     * @throws IOException on failure (the temporary is removed)
     */
    static void replace(FileSystem fs, org.apache.hadoop.fs.Path tmp, org.apache.hadoop.fs.Path target)
            throws IOException {
        if (fs.exists(target)) {
            FileStatus st = fs.getFileStatus(target);
            if (!st.isDirectory() && !st.isFile()) {
                fs.delete(tmp, true);
                throw new IOException(target + " is not a regular file; not replaced");
            }
            fs.delete(target, true);
        }
        if (!fs.rename(tmp, target)) {
            fs.delete(tmp, true);
            throw new IOException("cannot rename " + tmp + " to " + target);
        }
    }

    /**
     * Reads a small text file.
     *
     * @param p the file
     * @return its content (UTF-8)
     */
    static String readText(org.apache.hadoop.fs.Path p) {
        try (var in = fs(p).open(p)) {
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot read " + p + ": " + e.getMessage(), e);
        }
    }

    /**
     * Deletes a local scratch directory, ignoring failures.
     *
     * @param dir the directory
     */
    static void deleteLocal(Path dir) {
        if (dir != null && Files.exists(dir)) {
            FileUtil.fullyDelete(dir.toFile());
        }
    }
}
