package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import java.awt.Color;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.file.Path;

import javax.imageio.ImageIO;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class MapPreviewTest {
    @TempDir
    Path dir;

    @Test
    void writesAReadablePngOfTheCentralSlice() throws IOException {
        int nx = 20;
        int ny = 10;
        int nz = 3;
        float[] map = new float[nx * ny * nz];
        for (int i = 0; i < map.length; i++) {
            map[i] = i % nx;
        }
        map[nx * ny + 5] = Float.NaN;
        Path out = dir.resolve("m.png");
        MapPreview.writeCentralSlice(out, map, nx, ny, nz, "T2", "T2 (ms)", Double.NaN, Double.NaN, false);
        BufferedImage img = ImageIO.read(out.toFile());
        assertEquals(640, img.getWidth());
        assertEquals(380, img.getHeight());  // 520*ny/nx + 120
    }

    @Test
    void paletteIsMonotoneInLightnessAndClamps() {
        MapPalette p = new MapPalette(0, 1);
        double prev = -1;
        for (int i = 0; i <= 20; i++) {
            Color c = (Color) p.getPaint(i / 20.0);
            double lum = 0.2126 * c.getRed() + 0.7152 * c.getGreen() + 0.0722 * c.getBlue();
            assertEquals(true, lum > prev, "luminance rises at " + i);
            prev = lum;
        }
        assertEquals(p.getPaint(0), p.getPaint(-5));
        assertEquals(p.getPaint(1), p.getPaint(7));
        assertNotEquals(255, ((Color) p.getPaint(Double.NaN)).getAlpha());
    }
}
