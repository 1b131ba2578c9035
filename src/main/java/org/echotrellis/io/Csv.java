package org.echotrellis.io;

import java.io.IOException;
import java.io.Reader;
import java.util.ArrayList;
import java.util.List;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.csv.CsvMapper;
import com.fasterxml.jackson.dataformat.csv.CsvParser;
import com.fasterxml.jackson.dataformat.csv.CsvSchema;

/**
 * CSV in and out as RFC 4180 describes it (Shafranovich, "Common Format and MIME Type for
 * Comma-Separated Values (CSV) Files", IETF 2005): fields with commas, double quotes or line breaks
 * are enclosed in double quotes, a quote inside is doubled. Parsing and quoting are Jackson's
 * ({@code jackson-dataformat-csv}).
 */
public final class Csv {
    private static final CsvMapper MAPPER = CsvMapper.builder()
            .enable(CsvParser.Feature.SKIP_EMPTY_LINES)
            .enable(CsvParser.Feature.ALLOW_COMMENTS)
            .build();

    private Csv() { }

    /** A parsed row and the line it starts on. */
    record Row(int line, List<String> cells) {
        /** Copies. */
        public Row {
            cells = List.copyOf(cells);
        }
    }

    /**
     * Reads every row (lines starting with {@code #} and blank lines are skipped).
     *
     * @param in the text
     * @return the rows with their line numbers (1-based)
     * @throws IOException for malformed CSV (for example an unclosed quote)
     */
    static List<Row> read(Reader in) throws IOException {
        List<Row> rows = new ArrayList<>();
        CsvSchema schema = CsvSchema.emptySchema().withComments();
        try (JsonParser p = MAPPER.readerFor(String[].class).with(schema).createParser(in)) {
            JsonToken t;
            while ((t = p.nextToken()) != null) {
                if (t != JsonToken.START_ARRAY) {
                    continue;
                }
                int line = -1;
                List<String> cells = new ArrayList<>();
                while ((t = p.nextToken()) != JsonToken.END_ARRAY && t != null) {
                    if (line < 0) {
                        line = p.currentTokenLocation().getLineNr();
                    }
                    String v = p.getText();
                    cells.add(v == null || t == JsonToken.VALUE_NULL ? "" : v);
                }
                rows.add(new Row(line, cells));
            }
        }
        return rows;
    }

    /**
     * Formats one CSV line through Jackson's generator: a field is quoted when it holds a comma,
     * a quote or a line break (quotes doubled).
     *
     * @param cells the fields
     * @return the line, ending in a line feed
     */
    public static String line(List<String> cells) {
        try {
            return MAPPER.writerFor(String[].class).with(CsvSchema.emptySchema().withLineSeparator("\n"))
                    .writeValueAsString(cells.toArray(new String[0]));
        } catch (IOException e) {
            throw new IllegalStateException("CSV formatting failed", e);
        }
    }

    /**
     * @param text a field value
     * @return the field as written in a CSV line (see {@link #line(List)})
     */
    public static String field(String text) {
        String l = line(List.of(text));
        return l.substring(0, l.length() - 1);
    }
}
