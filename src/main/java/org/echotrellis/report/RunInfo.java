package org.echotrellis.report;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import com.fasterxml.jackson.core.JsonProcessingException;
import org.echotrellis.io.Json;

/**
 * What was run: the command line, the program version, the settings (acquisition and fit options)
 * and the input files with size and SHA-256 checksum. Checksums start when an input is added and
 * are awaited when the page is rendered. Small text inputs (protocol files) can be shown in full.
 */
public final class RunInfo {
    /** Text inputs up to this size are embedded when asked for. */
    public static final long EMBED_LIMIT_BYTES = 64 * 1024;

    private record Input(String role, Path path, long bytes, CompletableFuture<String> sha256, String text) { }

    private final String commandLine;
    private final String version;
    private final Map<String, Object> settings = new LinkedHashMap<>();
    private final List<Input> inputs = new ArrayList<>();

    private RunInfo(String commandLine, String version) {
        this.commandLine = commandLine;
        this.version = version;
    }

    /**
     * @param commandLine the command line as typed (arguments quoted where needed)
     * @param version the program version
     * @return run information without settings or inputs
     */
    public static RunInfo of(String commandLine, String version) {
        return new RunInfo(commandLine, version);
    }

    /**
     * Adds settings shown as a table (values that are lists or maps are shown as JSON).
     *
     * @param values settings in order
     * @return this
     */
    public RunInfo settings(Map<String, ?> values) {
        settings.putAll(values);
        return this;
    }

    /**
     * Adds an input file and starts its checksum. Directories and missing paths are listed without one.
     *
     * @param role e.g. "--protocol" or "DATA"
     * @param path the file
     * @param showText embed the file's text (UTF-8) if it is at most {@link #EMBED_LIMIT_BYTES}
     * @return this
     */
    public RunInfo input(String role, Path path, boolean showText) {
        if (!Files.isRegularFile(path)) {
            String what = Files.isDirectory(path) ? "directory" : "not a regular file";
            inputs.add(new Input(role, path, -1, CompletableFuture.completedFuture(what), null));
            return this;
        }
        long size;
        try {
            size = Files.size(path);
        } catch (IOException e) {
            size = -1;
        }
        String text = null;
        if (showText && size >= 0 && size <= EMBED_LIMIT_BYTES) {
            try {
                text = Files.readString(path, StandardCharsets.UTF_8);
            } catch (IOException e) {
                text = null;
            }
        }
        inputs.add(new Input(role, path, size, Checksums.start(path), text));
        return this;
    }

    void render(Section s) {
        Map<String, Object> head = new LinkedHashMap<>();
        head.put("version", version);
        head.put("Java", System.getProperty("java.version"));
        head.put("threads available", Runtime.getRuntime().availableProcessors());
        s.facts(head);
        s.paragraph("Command line:");
        s.preformatted(null, commandLine);
        if (!settings.isEmpty()) {
            Map<String, Object> shown = new LinkedHashMap<>();
            settings.forEach((k, v) -> shown.put(k, v instanceof Number || v instanceof String || v == null ? v : json(v)));
            s.subsection("Settings").facts(shown);
        }
        if (!inputs.isEmpty()) {
            List<List<?>> rows = new ArrayList<>();
            for (Input in : inputs) {
                rows.add(List.of(in.role(), in.path().toString(), in.bytes() < 0 ? "–" : (Object) in.bytes(),
                        in.sha256().join()));
            }
            Section t = s.subsection("Inputs");
            t.raw(hashTable(rows));
            for (Input in : inputs) {
                if (in.text() != null) {
                    t.preformatted(in.role() + " " + in.path() + " (file content)", in.text());
                }
            }
        }
    }

    private static String hashTable(List<List<?>> rows) {
        StringBuilder sb = new StringBuilder("<div class=\"scroll\"><table class=\"data\"><caption>Input files "
                + "(SHA-256 of the bytes as read)</caption>\n<thead><tr><th scope=\"col\">role</th><th scope=\"col\">path"
                + "</th><th scope=\"col\">bytes</th><th scope=\"col\">SHA-256</th></tr></thead>\n<tbody>\n");
        for (List<?> r : rows) {
            sb.append("<tr><td>").append(Html.text(r.get(0).toString())).append("</td><td>")
              .append(Html.text(r.get(1).toString())).append("</td><td class=\"n\">").append(Html.text(r.get(2).toString()))
              .append("</td><td class=\"hash\">").append(Html.text(r.get(3).toString())).append("</td></tr>\n");
        }
        return sb.append("</tbody></table></div>\n").toString();
    }

    private static String json(Object v) {
        try {
            return Json.MAPPER.writeValueAsString(v);
        } catch (JsonProcessingException e) {
            return String.valueOf(v);
        }
    }
}
