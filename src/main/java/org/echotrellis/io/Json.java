package org.echotrellis.io;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.json.JsonMapper;

/** The project's shared Jackson mapper: pretty-printed output, non-finite numbers as JSON strings. */
public final class Json {
    /** Shared mapper (thread-safe once configured). */
    public static final ObjectMapper MAPPER = JsonMapper.builder()
            .enable(SerializationFeature.INDENT_OUTPUT)
            .enable(com.fasterxml.jackson.core.json.JsonWriteFeature.WRITE_NAN_AS_STRINGS)
            .build();

    private Json() { }

    /**
     * @param value a tree, map, list or record
     * @return pretty JSON text ending in a newline
     */
    public static String write(Object value) {
        try {
            return MAPPER.writeValueAsString(value) + System.lineSeparator();
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot serialise " + value.getClass().getSimpleName(), e);
        }
    }
}
