package org.echotrellis.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.Color;
import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import javax.imageio.ImageIO;
import org.echotrellis.plot.SliceImages;
import org.junit.jupiter.api.Test;

/** Tile sizes within the pixel budget, and the hand-written PNG read back by the JDK's decoder. */
class MontageTest {
    @Test
    void twoMillionVoxelsStayWithinThePixelBudget() {
        Montage m = Montage.forGrid(128, 128, 122, 7);
        double px = Math.ceil(128 / m.step()) * Math.ceil(128 / m.step()) * 122 * 7;
        assertTrue(px <= Montage.PIXEL_BUDGET * 1.05, "pixels " + px);
        assertEquals(1.0, Montage.forGrid(24, 20, 5, 7).step(), 0.0);
        assertTrue(Montage.forGrid(1024, 16, 1, 1).step() >= 1024.0 / Montage.MAX_TILE_PX);
    }

    @Test
    void indexedPngDecodesToThePaletteColours() throws Exception {
        int nx = 5;
        int ny = 3;
        float[] map = new float[nx * ny * 2];
        for (int i = 0; i < map.length; i++) {
            map[i] = i;
        }
        map[nx * ny + 2] = Float.NaN;                       // slice 1, x = 2, y = 0
        SliceImages images = new SliceImages(0, map.length - 1, new Color(0x333333));
        // decoded by javax.imageio (an independent PNG reader)
        BufferedImage img = ImageIO.read(new ByteArrayInputStream(images.slicePng(map, nx, ny, 1, 1)));
        assertEquals(nx, img.getWidth());
        assertEquals(ny, img.getHeight());
        assertEquals(0x333333, img.getRGB(2, ny - 1) & 0xffffff, "NaN drawn in the background colour, y upwards");
        // the last voxel of slice 1 holds the range maximum: the palette's last colour, top right
        assertEquals(images.colourAt(1).getRGB() & 0xffffff, img.getRGB(nx - 1, 0) & 0xffffff);
        BufferedImage full = ImageIO.read(new ByteArrayInputStream(images.slicePng(map, nx, ny, 0, 2.5)));
        assertEquals(2, full.getWidth());
        assertEquals(2, full.getHeight());
        // bottom-left pixel at step 2.5 takes voxel (1, 1), value 6: the palette colour at 6/29 of the range
        Color expect = images.colourAt(6 / 29.0);
        Color got = new Color(full.getRGB(0, 1));
        assertTrue(Math.abs(expect.getRed() - got.getRed()) <= 3 && Math.abs(expect.getGreen() - got.getGreen()) <= 3
                && Math.abs(expect.getBlue() - got.getBlue()) <= 3, expect + " vs " + got);
    }
}
