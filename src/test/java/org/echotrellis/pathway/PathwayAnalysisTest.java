package org.echotrellis.pathway;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Stream;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Simulator;
import org.junit.jupiter.api.Test;

/** The protocol facade against the foundation simulator, on every shipped protocol file. */
class PathwayAnalysisTest {
    private static List<Path> protocols() throws IOException {
        try (Stream<Path> files = Files.list(Path.of("sequences"))) {
            return files.filter(f -> f.toString().endsWith(".yaml") || f.toString().endsWith(".json")).sorted().toList();
        }
    }

    @Test
    void classesOfEveryShippedProtocolAddUpToTheSimulatedEchoes() throws IOException {
        List<Path> files = protocols();
        assertTrue(files.size() >= 5);
        for (Path f : files) {
            for (double b1 : new double[] {0.75, 1.0}) {
                Protocol p = ProtocolReader.read(f).withB1Scale(b1);
                if (p.acquisition().diffuses(p.tissue().diffusivityMm2PerS())) {
                    Protocol diffusing = p;
                    org.junit.jupiter.api.Assertions.assertThrows(org.echotrellis.InputException.class,
                            () -> PathwayAnalysis.classes(diffusing), "diffusion is refused by pathways");
                    p = p.withTissue(p.tissue().withDiffusivityMm2PerS(0));
                }
                EchoTrain train = Simulator.simulate(p);
                ClassDecomposition d;
                try {
                    d = PathwayAnalysis.classes(p);
                } catch (org.echotrellis.InputException e) {
                    // pathways refuses protocols with diffusion across crushers by design (one line, exit 2)
                    assertTrue(e.getMessage().contains("diffusion"), e.getMessage());
                    continue;
                }
                assertEquals(train.size(), d.echoCount(), f.toString());
                // the foundation engines (CPMG fast path or general) must agree to 1e-12 (issue 3); the
                // whole-acquisition model's tables (interpolated rotations) to 2e-6 of echo 1
                double tol = p.isIdealAcquisition() ? 1e-12 : 2e-6 * train.magnitude(0);
                for (int e = 0; e < d.echoCount(); e++) {
                    assertEquals(train.re()[e], d.echoRe(e), tol, f + " echo " + (e + 1));
                    assertEquals(train.im()[e], d.echoIm(e), tol, f + " echo " + (e + 1));
                    assertEquals(train.labels().get(e), d.label(e));
                    assertEquals(train.timesMs()[e], d.timeMs(e), 1e-9);
                }
            }
        }
    }

    @Test
    void topPathwaysOfTheKneeTrainExplainTheEcho() {
        Protocol p = ProtocolReader.read(Path.of("sequences/knee-t2-16.yaml")).withB1Scale(0.8);
        TopPathways tp = PathwayAnalysis.topPathways(p, 4, PathwaySearch.Limits.of(10_000));
        assertTrue(tp.complete());
        // every pathway of echo 4 listed: nothing left unexplained (exact expansion)
        assertEquals(0.0, tp.unexplainedMagnitude(), 1e-12);
        assertEquals("Z0 F0 F-1*4", tp.pathways().get(0).states());
    }
}
