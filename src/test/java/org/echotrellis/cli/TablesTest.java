package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.echotrellis.sequence.EchoTrain;
import org.junit.jupiter.api.Test;

class TablesTest {

    /**
     * Labels holding a comma, a quote or a line break are quoted, quotes doubled, so every echo
     * stays one record (RFC 4180, "Common Format and MIME Type for CSV Files", 2005, §2 rules 6-7).
     */
    @Test
    void echoCsvQuotesLabelsWithSeparatorsQuotesAndLineBreaks() {
        EchoTrain t = new EchoTrain(List.of("a,b", "say \"hi\"", "two\nlines", "cr\rhere", "plain"),
                new double[] {1, 2, 3, 4, 5}, new double[] {1, 1, 1, 1, 1}, new double[5]);
        String[] lines = Tables.echoCsv(t).split("\n", -1);
        assertEquals("1,\"a,b\",1.0,1.0,0.0,1.0,0.0", lines[1]);
        assertEquals("2,\"say \"\"hi\"\"\",2.0,1.0,0.0,1.0,0.0", lines[2]);
        assertEquals("3,\"two", lines[3]);
        assertEquals("lines\",3.0,1.0,0.0,1.0,0.0", lines[4]);
        assertEquals("4,\"cr\rhere\",4.0,1.0,0.0,1.0,0.0", lines[5]);
        assertEquals("5,plain,5.0,1.0,0.0,1.0,0.0", lines[6]);
    }
}
