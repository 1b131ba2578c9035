package org.echotrellis.io;

import java.awt.image.BufferedImage;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import javax.imageio.ImageIO;
import org.echotrellis.InputException;

/**
 * A 2-D integer label image, read from a grey-scale PNG (label = the stored grey value, 8 or 16 bit;
 * an RGB PNG must have equal channels, label = that value 0–255) or from one
 * z-slice of a NIfTI-1 volume (label = the voxel value, which must be a whole number). Rows run
 * along y with row 0 at the bottom: the PNG's top pixel row is the last row, as in the NIfTI voxel
 * grid. Pixel (row y, column x) is element y·cols + x. Arrays are copied on the way in and out.
 *
 * @param rows number of rows (y)
 * @param cols number of columns (x)
 * @param labels label of every pixel
 * @param source file name (and slice) for messages
 */
public record LabelImage(int rows, int cols, int[] labels, String source) {
    /** Largest accepted side length. */
    public static final int MAX_SIDE = 4096;

    /**
     * Copies.
     *
     * @param rows number of rows (y)
     * @param cols number of columns (x)
     * @param labels label of every pixel
     * @param source file name (and slice) for messages
     */
    public LabelImage {
        labels = labels.clone();
    }

    /** @return label of every pixel (a copy) */
    @Override
    public int[] labels() {
        return labels.clone();
    }

    /**
     * @param file a .png, .nii or .nii.gz file
     * @param slice z-slice of a NIfTI volume (null: the middle slice, nz/2); must be null for PNG
     * @return the label image
     * @throws InputException for unreadable files, colour pixels, fractional labels or a bad slice
     */
    public static LabelImage read(Path file, Integer slice) {
        String n = file.getFileName() == null ? "" : file.getFileName().toString().toLowerCase(Locale.ROOT);
        if (!Files.isRegularFile(file)) {
            throw new InputException("phantom " + file + ": no such file (give builtin, a .png or a .nii/.nii.gz label image)");
        }
        if (n.endsWith(".png")) {
            if (slice != null) {
                throw new InputException("phantom_slice applies to NIfTI label images, not to the PNG " + file);
            }
            return png(file);
        }
        if (n.endsWith(".nii") || n.endsWith(".nii.gz")) {
            return nifti(file, slice);
        }
        throw new InputException("phantom " + file + ": the label image must end in .png, .nii or .nii.gz");
    }

    private static LabelImage png(Path file) {
        BufferedImage img;
        try {
            img = ImageIO.read(file.toFile());
        } catch (IOException e) {
            throw new InputException("phantom " + file + ": cannot read the PNG: " + e.getMessage(), e);
        }
        if (img == null) {
            throw new InputException("phantom " + file + ": not a readable PNG image");
        }
        int w = img.getWidth();
        int h = img.getHeight();
        checkSize(file.toString(), w, h);
        int[] labels = new int[w * h];
        java.awt.image.Raster raster = img.getRaster();
        boolean grey = img.getColorModel().getColorSpace().getType() == java.awt.color.ColorSpace.TYPE_GRAY
                && !(img.getColorModel() instanceof java.awt.image.IndexColorModel);
        for (int py = 0; py < h; py++) {
            for (int x = 0; x < w; x++) {
                if (grey) {                   // stored grey value (8 or 16 bit), no colour conversion
                    labels[(h - 1 - py) * w + x] = raster.getSample(x, py, 0);
                    continue;
                }
                int rgb = img.getRGB(x, py);
                int r = (rgb >> 16) & 0xff;
                int g = (rgb >> 8) & 0xff;
                int b = rgb & 0xff;
                if (r != g || g != b) {
                    throw new InputException("phantom " + file + ": pixel (" + x + ", " + py + ") has colour (" + r + ", "
                            + g + ", " + b + "); a label image is grey, label = grey value 0-255");
                }
                labels[(h - 1 - py) * w + x] = r;
            }
        }
        return new LabelImage(h, w, labels, file.toString());
    }

    private static LabelImage nifti(Path file, Integer slice) {
        NiftiImage img = Nifti.read(file);
        NiftiHeader h = img.header();
        int nx = h.size(1);
        int ny = h.size(2);
        int nz = h.size(3);
        checkSize(file.toString(), nx, ny);
        int z = slice == null ? nz / 2 : slice;
        if (z < 0 || z >= nz) {
            throw new InputException("phantom_slice " + z + ": " + file + " has slices 0.." + (nz - 1));
        }
        int[] labels = new int[nx * ny];
        long base = (long) z * nx * ny;
        for (int i = 0; i < nx * ny; i++) {
            double v = img.get((int) (base + i));
            long r = Math.round(v);
            if (!(Math.abs(v - r) <= 1e-6) || Math.abs(r) > Integer.MAX_VALUE) {
                throw new InputException("phantom " + file + ": voxel (" + i % nx + ", " + i / nx + ", " + z
                        + ") has value " + v + "; labels must be whole numbers");
            }
            labels[i] = (int) r;
        }
        return new LabelImage(ny, nx, labels, file + " slice " + z);
    }

    private static void checkSize(String file, int w, int h) {
        if (w < 1 || h < 1 || w > MAX_SIDE || h > MAX_SIDE) {
            throw new InputException("phantom " + file + ": " + w + " x " + h + " pixels; allowed 1 to " + MAX_SIDE
                    + " per side");
        }
    }
}
