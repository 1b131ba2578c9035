package org.echotrellis.io;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import org.echotrellis.InputException;

/**
 * Where an output came from, written into every {@code summary.json} and JSON output: the tool
 * version (the jar manifest's {@code Implementation-Version}), the command line, the SHA-256
 * (FIPS 180-4) of every input file, and the resolved protocol text.
 */
public final class Provenance {
    private Provenance() { }

    /** @return the version from the jar manifest, or {@code development} when not run from a jar */
    public static String version() {
        String v = Provenance.class.getPackage().getImplementationVersion();
        return v == null ? "development" : v;
    }

    /**
     * @param file a file
     * @return its SHA-256 as lower-case hex
     * @throws InputException if it cannot be read
     */
    public static String sha256(Path file) {
        try (InputStream in = Files.newInputStream(file)) {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            byte[] buf = new byte[1 << 16];
            int n;
            while ((n = in.read(buf)) > 0) {
                md.update(buf, 0, n);
            }
            return HexFormat.of().formatHex(md.digest());
        } catch (IOException e) {
            throw new InputException(file + ": cannot read (" + e.getMessage() + ")", e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is missing from this Java runtime", e);
        }
    }

    /**
     * The provenance block.
     *
     * @param commandLine the command line as typed (or a description of the library call)
     * @param inputs every input file (each hashed; missing entries skipped)
     * @param protocolText the resolved protocol document, or null
     * @return an ordered map: tool, version, command_line, inputs (path → sha256), protocol
     */
    public static Map<String, Object> of(String commandLine, List<Path> inputs, String protocolText) {
        Map<String, Object> p = new LinkedHashMap<>();
        p.put("tool", "echotrellis");
        p.put("version", version());
        p.put("command_line", commandLine);
        Map<String, String> files = new LinkedHashMap<>();
        for (Path f : inputs) {
            if (f != null && Files.isRegularFile(f)) {
                files.put(f.toString(), sha256(f));
            }
        }
        p.put("inputs_sha256", files);
        p.put("protocol", protocolText);
        return p;
    }
}
