package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DecayTableReaderTest {
    @TempDir
    Path dir;

    private Path csv(String text) throws IOException {
        Path f = dir.resolve("t" + text.hashCode() + ".csv");
        Files.writeString(f, text);
        return f;
    }

    @Test
    void readsNamesTimesAndColumns() throws IOException {
        DecayTable t = DecayTableReader.read(csv("# comment\necho_time_ms, left , right\n10,1,2\n\n20,0.5,NaN\n"));
        assertEquals(List.of("left", "right"), t.names());
        assertArrayEquals(new double[] {10, 20}, t.echoTimesMs(), 0.0);
        assertArrayEquals(new double[] {1, 0.5}, t.decay(0), 0.0);
        assertTrue(Double.isNaN(t.decay(1)[1]));
        assertEquals(2, t.echoes());
    }

    @Test
    void numpyMissingAndInfiniteSpellingsMarkOneDecayInsteadOfTheTable() throws IOException {
        // numpy.savetxt writes nan, inf and -inf (from memory); an empty cell is a missing value (common practice)
        DecayTable t = DecayTableReader.read(csv("te,a,b,c,d\n10,1,nan,inf,2\n20,0.5,,-inf,1\n"));
        assertArrayEquals(new double[] {1, 0.5}, t.decay(0), 0.0);
        assertTrue(Double.isNaN(t.decay(1)[0]) && Double.isNaN(t.decay(1)[1]));
        assertEquals(Double.POSITIVE_INFINITY, t.decay(2)[0]);
        assertEquals(Double.NEGATIVE_INFINITY, t.decay(2)[1]);
        assertArrayEquals(new double[] {2, 1}, t.decay(3), 0.0);
        InputException e = assertThrows(InputException.class, () -> DecayTableReader.read(csv("te,a\nnan,1\n")));
        assertTrue(e.getMessage().contains("line 2 column 1"), e.getMessage());
    }

    @Test
    void quotedNamesWithCommasAndQuotesRoundTrip() throws IOException {
        // RFC 4180 section 2: fields with commas or quotes are enclosed in quotes, inner quotes doubled
        String tricky = "left, \"deep\" white matter";
        String line = Csv.line(List.of("echo_time_ms", tricky, "plain"));
        assertEquals("echo_time_ms,\"left, \"\"deep\"\" white matter\",plain\n", line);
        DecayTable t = DecayTableReader.read(csv("# quoted header\n" + line + "10,1,2\n20,0.5,1\n"));
        assertEquals(List.of(tricky, "plain"), t.names());
        List<Csv.Row> rows = Csv.read(new java.io.StringReader(line));
        assertEquals(List.of("echo_time_ms", tricky, "plain"), rows.get(0).cells());
    }

    @Test
    void errorsNameLineAndColumn() throws IOException {
        InputException e = assertThrows(InputException.class,
                () -> DecayTableReader.read(csv("te,a\n10,1\n20,x\n")));
        assertTrue(e.getMessage().endsWith("line 3 column 2: not a number: \"x\""), e.getMessage());
        e = assertThrows(InputException.class, () -> DecayTableReader.read(csv("te,a\n10,1\n10,2\n")));
        assertTrue(e.getMessage().contains("line 3 column 1: echo times must increase"), e.getMessage());
        e = assertThrows(InputException.class, () -> DecayTableReader.read(csv("te,a\n10,1,3\n")));
        assertTrue(e.getMessage().contains("line 2: expected 2 columns, got 3"), e.getMessage());
        assertThrows(InputException.class, () -> DecayTableReader.read(csv("te\n10\n")));
        assertThrows(InputException.class, () -> DecayTableReader.read(csv("te,a\n")));
        assertThrows(InputException.class, () -> DecayTableReader.read(csv("te,a\n-1,2\n")));
        assertThrows(InputException.class, () -> DecayTableReader.read(dir.resolve("none.csv")));
    }
}
