package org.echotrellis.report;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;

/**
 * SHA-256 checksums of input files (FIPS 180-4), read in 1 MiB blocks. {@link #start} hashes on a
 * background daemon thread, so a command can register its inputs before its main work and the
 * report only waits for what is left.
 */
final class Checksums {
    private static final ExecutorService HASHER = Executors.newSingleThreadExecutor(r -> {
        Thread t = new Thread(r, "report-checksums");
        t.setDaemon(true);
        return t;
    });

    private Checksums() { }

    /**
     * @param file a regular file
     * @return the lower-case hex SHA-256 of its bytes
     * @throws IOException if it cannot be read
     */
    public static String sha256(Path file) throws IOException {
        MessageDigest md;
        try {
            md = MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("the JDK has no SHA-256", e);
        }
        byte[] buf = new byte[1 << 20];
        try (InputStream in = Files.newInputStream(file)) {
            int n;
            while ((n = in.read(buf)) > 0) {
                md.update(buf, 0, n);
            }
        }
        return HexFormat.of().formatHex(md.digest());
    }

    /**
     * Starts hashing in the background.
     *
     * @param file the file
     * @return the hex checksum, or a text starting with "unreadable:" if reading fails
     */
    public static CompletableFuture<String> start(Path file) {
        return CompletableFuture.supplyAsync(() -> {
            try {
                return sha256(file);
            } catch (IOException | RuntimeException e) {
                return "unreadable: " + e.getMessage();
            }
        }, HASHER);
    }
}
