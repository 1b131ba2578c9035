package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Path;

import javax.imageio.ImageIO;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class MapPreviewEdgeTest {
    @TempDir
    Path dir;

    @Test
    void aConstantMapOfLargeValuesStillGetsAColourBar() throws IOException {
        // A uniform slice gives lower = upper; the palette widens the range. At 1e20 adding 1 does
        // not change a double, so the widening must be relative (common practice), or the colour-bar
        // axis refuses an empty range.
        for (float value : new float[] {0f, 3f, 1e20f, -1e20f}) {
            float[] map = new float[8 * 8];
            java.util.Arrays.fill(map, value);
            Path out = dir.resolve("c" + Math.abs(value) + (value < 0 ? "n" : "") + ".png");
            MapPreview.writeCentralSlice(out, map, 8, 8, 1, "A", "amplitude", Double.NaN, Double.NaN, false);
            assertEquals(640, ImageIO.read(out.toFile()).getWidth());
            MapPalette p = new MapPalette(value, value);
            assertTrue(p.getUpperBound() > p.getLowerBound(), "range at " + value);
        }
    }
}
