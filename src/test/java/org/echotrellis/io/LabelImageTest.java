package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Label images from PNG and NIfTI slices. */
class LabelImageTest {
    @TempDir
    Path tmp;

    @Test
    void niftiSliceWithWholeNumberLabels() {
        // 3 x 2 x 3 volume, value = 10·z + x + 3·y; slice z = 1 holds 10..15 in x-fastest order
        double[] v = new double[18];
        for (int i = 0; i < 18; i++) {
            v[i] = 10 * (i / 6) + i % 6;
        }
        Path f = tmp.resolve("labels.nii.gz");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.INT16, 3, 2, 3), v, false);
        LabelImage li = LabelImage.read(f, null);
        assertEquals(2, li.rows());
        assertEquals(3, li.cols());
        assertArrayEquals(new int[] {10, 11, 12, 13, 14, 15}, li.labels());
        assertArrayEquals(new int[] {20, 21, 22, 23, 24, 25}, LabelImage.read(f, 2).labels());
        assertThrows(InputException.class, () -> LabelImage.read(f, 3));
        v[7] = 1.5;
        Path g = tmp.resolve("fraction.nii");
        Nifti.write(g, NiftiHeader.create(NiftiDatatype.FLOAT32, 3, 2, 3), v, false);
        InputException e = assertThrows(InputException.class, () -> LabelImage.read(g, 1));
        assertTrue(e.getMessage().contains("whole numbers"), e.getMessage());
    }

    @Test
    void greyPngKeepsStoredValuesAndPutsTheTopRowLast() throws Exception {
        BufferedImage img = new BufferedImage(2, 2, BufferedImage.TYPE_BYTE_GRAY);
        img.getRaster().setSample(0, 0, 0, 3);     // top-left
        img.getRaster().setSample(1, 1, 0, 200);   // bottom-right
        Path f = tmp.resolve("g.png");
        ImageIO.write(img, "png", f.toFile());
        // row 0 is the bottom row: (bottom-left 0, bottom-right 200), then the top row (3, 0)
        assertArrayEquals(new int[] {0, 200, 3, 0}, LabelImage.read(f, null).labels());
        assertThrows(InputException.class, () -> LabelImage.read(f, 0));
        assertThrows(InputException.class, () -> LabelImage.read(tmp.resolve("missing.png"), null));
    }
}
