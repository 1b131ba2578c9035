package org.echotrellis.plot;

import java.awt.Color;
import java.awt.image.BufferedImage;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import javax.imageio.ImageIO;

/**
 * Renders slices of a 3-D map as small RGB images in the colours of {@link MapPalette}: one colour
 * table of {@value #LEVELS} entries is taken from the palette per display range, then each output
 * pixel takes the voxel at its centre (nearest-neighbour downsampling by an integer step). Rows are
 * drawn with y upwards (voxel j = 0 at the bottom), as in the NIfTI voxel grid; NaN is drawn in the
 * background colour given.
 */
public final class SliceImages {
    /** Entries of the colour table. */
    public static final int LEVELS = 256;

    static {
        System.setProperty("java.awt.headless", "true");
    }

    private final int[] table = new int[LEVELS];
    private final double lower;
    private final double upper;
    private final int background;

    /**
     * @param lower value of the first colour
     * @param upper value of the last colour
     * @param background colour of NaN voxels
     */
    public SliceImages(double lower, double upper, Color background) {
        MapPalette palette = new MapPalette(lower, upper);
        this.lower = palette.getLowerBound();
        this.upper = palette.getUpperBound();
        for (int i = 0; i < LEVELS; i++) {
            double v = this.lower + (this.upper - this.lower) * i / (LEVELS - 1);
            table[i] = ((Color) palette.getPaint(v)).getRGB();
        }
        this.background = background.getRGB();
    }

    /** @return the value of the first colour (after widening an empty range) */
    public double lower() {
        return lower;
    }

    /** @return the value of the last colour */
    public double upper() {
        return upper;
    }

    /**
     * @param fraction position in the range, 0 (first colour) to 1 (last)
     * @return the palette colour there
     */
    public Color colourAt(double fraction) {
        int i = (int) Math.round(Math.max(0, Math.min(1, fraction)) * (LEVELS - 1));
        return new Color(table[i]);
    }

    /**
     * Renders slice z, one pixel per {@code step} voxels in x and y (nearest neighbour: the voxel
     * under the pixel centre).
     *
     * @param map the 3-D map, x fastest (not modified)
     * @param nx x size
     * @param ny y size
     * @param z slice index
     * @param step downsampling step (≥ 1, may be fractional)
     * @return an image of ceil(nx/step) × ceil(ny/step) pixels
     */
    public BufferedImage slice(float[] map, int nx, int ny, int z, double step) {
        int w = (int) Math.ceil(nx / step);
        int h = (int) Math.ceil(ny / step);
        int[] rgb = new int[w * h];
        double scale = (LEVELS - 1) / (upper - lower);
        int base = z * nx * ny;
        for (int row = 0; row < h; row++) {
            int j = Math.min(ny - 1, (int) ((row + 0.5) * step));
            int line = (h - 1 - row) * w;
            for (int col = 0; col < w; col++) {
                int i = Math.min(nx - 1, (int) ((col + 0.5) * step));
                float v = map[base + i + nx * j];
                if (Float.isNaN(v)) {
                    rgb[line + col] = background;
                } else {
                    int k = (int) Math.round((v - lower) * scale);
                    rgb[line + col] = table[Math.max(0, Math.min(LEVELS - 1, k))];
                }
            }
        }
        BufferedImage img = new BufferedImage(w, h, BufferedImage.TYPE_INT_RGB);
        img.setRGB(0, 0, w, h, rgb, 0, w);
        return img;
    }

    /**
     * @param img an image
     * @return its PNG bytes
     */
    public static byte[] png(BufferedImage img) {
        ByteArrayOutputStream out = new ByteArrayOutputStream(img.getWidth() * img.getHeight() + 256);
        try {
            if (!ImageIO.write(img, "png", out)) {
                throw new IllegalStateException("no PNG writer available");
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return out.toByteArray();
    }
}
