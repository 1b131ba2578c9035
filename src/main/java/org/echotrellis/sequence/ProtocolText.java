package org.echotrellis.sequence;

import java.io.IOException;
import java.io.Serializable;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

import org.echotrellis.InputException;
import org.echotrellis.InputFiles;

/**
 * A protocol document as text: what a distributed job ships to its workers instead of the parsed
 * {@link Protocol} (which holds compiled engine objects). {@link #parse()} gives the same protocol
 * on every machine.
 *
 * @param text the YAML or JSON document
 * @param source the name used in messages (usually the file path)
 * @param yaml true for YAML, false for JSON
 * @serial exclude
 */
public record ProtocolText(String text, String source, boolean yaml) implements Serializable {
    private static final long serialVersionUID = 1L;

    /**
     * Validates.
     *
     * @param text the YAML or JSON document
     * @param source the name used in messages (usually the file path)
     * @param yaml true for YAML, false for JSON
     * @throws IllegalArgumentException if {@code text} is null
     */
    public ProtocolText {
        if (text == null) {
            throw new IllegalArgumentException("protocol text must not be null");
        }
        source = source == null ? "" : source;
    }

    /**
     * Reads a protocol file as text (bounded by {@link ProtocolReader#MAX_FILE_BYTES}); the format
     * follows the extension as in {@link ProtocolReader#read(Path)}.
     *
     * @param file a {@code .yaml}, {@code .yml} or {@code .json} file
     * @return the text
     * @throws InputException if the file is missing, too large or has another extension
     */
    public static ProtocolText read(Path file) {
        String name = file.toString();
        String lower = name.toLowerCase(Locale.ROOT);
        boolean yaml = lower.endsWith(".yaml") || lower.endsWith(".yml");
        if (!yaml && !lower.endsWith(".json")) {
            throw new InputException(name + ": protocol files must end in .yaml, .yml or .json");
        }
        try {
            if (Files.isDirectory(file)) {
                throw new InputException(name + ": is a directory, expected a protocol file");
            }
            if (!Files.exists(file)) {
                throw new InputException(name + ": no such file");
            }
            InputFiles.requireRegular(file, name);
            if (Files.size(file) > ProtocolReader.MAX_FILE_BYTES) {
                throw new InputException(name + ": file larger than " + ProtocolReader.MAX_FILE_BYTES + " bytes");
            }
            return new ProtocolText(Files.readString(file, StandardCharsets.UTF_8), name, yaml);
        } catch (IOException e) {
            throw InputFiles.readFailure(name, e);
        }
    }

    /**
     * @return the parsed protocol
     * @throws InputException for an invalid document, naming {@link #source()} with line:column
     */
    public Protocol parse() {
        return ProtocolReader.parse(text, source, yaml);
    }
}
