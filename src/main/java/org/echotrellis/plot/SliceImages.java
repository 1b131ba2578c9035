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
     * Renders slice z as an indexed-colour PNG (colour type 3, 8 bits: {@value #LEVELS} − 1 palette
     * levels and the NaN colour), one pixel per {@code step} voxels in x and y (nearest neighbour:
     * the voxel under the pixel centre), compressed with zlib at its fastest level. PNG layout per
     * the W3C PNG specification (2003): signature, IHDR, PLTE, IDAT, IEND, each chunk with CRC-32.
     *
     * @param map the 3-D map, x fastest (not modified)
     * @param nx x size
     * @param ny y size
     * @param z slice index
     * @param step downsampling step (≥ 1, may be fractional)
     * @return the PNG bytes of a ceil(nx/step) × ceil(ny/step) image
     */
    public byte[] slicePng(float[] map, int nx, int ny, int z, double step) {
        int w = (int) Math.ceil(nx / step);
        int h = (int) Math.ceil(ny / step);
        int levels = LEVELS - 1;
        byte[] raw = new byte[(w + 1) * h];
        double scale = (levels - 1) / (upper - lower);
        int base = z * nx * ny;
        int[] column = new int[w];
        for (int col = 0; col < w; col++) {
            column[col] = Math.min(nx - 1, (int) ((col + 0.5) * step));
        }
        for (int row = 0; row < h; row++) {
            int j = Math.min(ny - 1, (int) ((row + 0.5) * step));
            int line = (h - 1 - row) * (w + 1);
            raw[line] = 0;                                   // filter type None
            int src = base + nx * j;
            for (int col = 0; col < w; col++) {
                float v = map[src + column[col]];
                int k = Float.isNaN(v) ? levels : (int) Math.round((v - lower) * scale);
                raw[line + 1 + col] = (byte) (k < 0 ? 0 : Math.min(k, levels));
            }
        }
        byte[] plte = new byte[3 * (levels + 1)];
        for (int i = 0; i < levels; i++) {
            int c = table[(int) Math.round(i * (LEVELS - 1.0) / (levels - 1))];
            plte[3 * i] = (byte) (c >> 16);
            plte[3 * i + 1] = (byte) (c >> 8);
            plte[3 * i + 2] = (byte) c;
        }
        plte[3 * levels] = (byte) (background >> 16);
        plte[3 * levels + 1] = (byte) (background >> 8);
        plte[3 * levels + 2] = (byte) background;
        java.util.zip.Deflater deflater = new java.util.zip.Deflater(java.util.zip.Deflater.BEST_SPEED);
        deflater.setInput(raw);
        deflater.finish();
        ByteArrayOutputStream idat = new ByteArrayOutputStream(raw.length / 2 + 64);
        byte[] buf = new byte[1 << 14];
        while (!deflater.finished()) {
            idat.write(buf, 0, deflater.deflate(buf));
        }
        deflater.end();
        ByteArrayOutputStream out = new ByteArrayOutputStream(idat.size() + plte.length + 64);
        out.writeBytes(new byte[] {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'});
        byte[] ihdr = java.nio.ByteBuffer.allocate(13).putInt(w).putInt(h).put((byte) 8).put((byte) 3)
                .put((byte) 0).put((byte) 0).put((byte) 0).array();
        chunk(out, "IHDR", ihdr);
        chunk(out, "PLTE", plte);
        chunk(out, "IDAT", idat.toByteArray());
        chunk(out, "IEND", new byte[0]);
        return out.toByteArray();
    }

    private static void chunk(ByteArrayOutputStream out, String type, byte[] data) {
        byte[] t = type.getBytes(java.nio.charset.StandardCharsets.US_ASCII);
        java.util.zip.CRC32 crc = new java.util.zip.CRC32();
        crc.update(t);
        crc.update(data);
        out.writeBytes(java.nio.ByteBuffer.allocate(4).putInt(data.length).array());
        out.writeBytes(t);
        out.writeBytes(data);
        out.writeBytes(java.nio.ByteBuffer.allocate(4).putInt((int) crc.getValue()).array());
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
    BufferedImage slice(float[] map, int nx, int ny, int z, double step) {
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
    static byte[] png(BufferedImage img) {
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
