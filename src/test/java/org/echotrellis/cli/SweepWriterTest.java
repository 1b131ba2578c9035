package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Sweep;
import org.junit.jupiter.api.Test;

/** The sweep CSV written chunk by chunk: bounded memory, same rows whatever the chunk size. */
class SweepWriterTest {

    @Test
    void chunksHoldABoundedNumberOfValues() {
        for (int echoes : new int[] {1, 3, 16, 80, 1024}) {
            int c = SweepWriter.chunkPoints(echoes);
            assertTrue(c >= Sweep.LANES && c % Sweep.LANES == 0, "echoes " + echoes + ": " + c);
            assertTrue((long) c * (8L * echoes + 40) <= SweepWriter.CHUNK_BYTES, "echoes " + echoes + ": " + c);
        }
    }

    @Test
    void rowsDoNotDependOnTheChunkSizeAndMatchSingleTrains() throws Exception {
        for (String file : new String[] {"sequences/knee-t2-16.yaml", "sequences/cp-phase-error-16.yaml"}) {
            Protocol p = ProtocolReader.read(Path.of(file));
            SweepGrid grid = SweepGrid.parse(List.of("t2_ms=15:90:7", "b1=0.6:1.1:3"), p.tissue().t1Ms(),
                    p.tissue().t2Ms(), p.b1Scale());
            long[] last = {0};
            StringWriter small = new StringWriter();
            SweepWriter.write(p, grid, 2, 5, small, d -> last[0] = Math.max(last[0], d));
            assertEquals(grid.size(), last[0], "progress reaches the grid size");
            StringWriter whole = new StringWriter();
            SweepWriter.write(p, grid, 1, SweepWriter.chunkPoints(p.echoCount()), whole, d -> { });
            assertEquals(whole.toString(), small.toString(), file);
            String[] lines = small.toString().split("\n");
            assertEquals(1 + grid.size(), lines.length);
            assertTrue(lines[0].startsWith("t1_ms,t2_ms,b1,echo_1,"), lines[0]);
            double[] t1 = new double[grid.size()];
            double[] t2 = new double[grid.size()];
            double[] b1 = new double[grid.size()];
            grid.fill(0, grid.size(), t1, t2, b1);
            for (int i = 0; i < grid.size(); i++) {
                String[] row = lines[1 + i].split(",");
                EchoTrain single = Simulator.simulate(p, t1[i], t2[i], b1[i]);
                assertEquals(3 + single.size(), row.length);
                for (int e = 0; e < single.size(); e++) {
                    // printed with 9 significant digits
                    assertEquals(single.magnitude(e), Double.parseDouble(row[3 + e]), 1e-8 * single.magnitude(e) + 1e-15,
                            file + " point " + i + " echo " + (e + 1));
                }
            }
        }
    }
}
