package org.echotrellis.image;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import org.echotrellis.InputException;

/**
 * A 2-D phantom: every pixel belongs to one tissue (an index into a tissue list) or to none (−1,
 * no signal). Rows run along the phase-encoding direction, columns along the read-out; pixel
 * (row y, column x) is element y·cols + x. Immutable; arrays are copied.
 *
 * @param rows number of rows (phase-encoding direction)
 * @param cols number of columns (read-out direction)
 * @param region tissue index of every pixel, or −1
 * @param description a short description for captions
 */
public record Phantom(int rows, int cols, int[] region, String description) {
    /**
     * Validates and copies.
     *
     * @param rows number of rows (phase-encoding direction)
     * @param cols number of columns (read-out direction)
     * @param region tissue index of every pixel, or −1
     * @param description a short description for captions
     * @throws IllegalArgumentException if a side is below 1 or {@code region} does not hold rows × cols
     *         pixels
     */
    public Phantom {
        if (rows < 1 || cols < 1 || region.length != rows * cols) {
            throw new IllegalArgumentException("phantom of " + rows + " x " + cols + " needs " + rows * cols
                    + " pixels, got " + region.length);
        }
        region = region.clone();
    }

    /** @return tissue index of every pixel, or −1 (a copy) */
    @Override
    public int[] region() {
        return region.clone();
    }

    /**
     * The built-in phantom, size × size: discs of five sizes (radii 9 %, 6 %, 4 %, 2.5 % and 1.5 % of
     * the size, the smallest a few pixels across) in one row per disc tissue, on a background.
     * With two or more tissues the background is tissue 0 and row r holds tissue r + 1 (at most
     * four rows; further tissues are left out of the picture). With one tissue the discs are
     * tissue 0 on an empty (no-signal) background.
     *
     * @param size rows and columns (the number of phase-encoding lines)
     * @param tissues number of tissues available (≥ 1)
     * @return the phantom
     */
    public static Phantom builtin(int size, int tissues) {
        int background = tissues >= 2 ? 0 : -1;
        int rowCount = tissues >= 2 ? Math.min(4, tissues - 1) : 1;
        double[] radii = {0.09, 0.06, 0.04, 0.025, 0.015};
        int[] region = new int[size * size];
        java.util.Arrays.fill(region, background);
        for (int r = 0; r < rowCount; r++) {
            int tissue = tissues >= 2 ? r + 1 : 0;
            double yc = size * (r + 1.0) / (rowCount + 1.0);
            for (int k = 0; k < radii.length; k++) {
                double xc = size * (k + 0.5) / radii.length;
                double rad = Math.max(0.75, radii[k] * size);
                for (int y = 0; y < size; y++) {
                    for (int x = 0; x < size; x++) {
                        double dy = y + 0.5 - yc;
                        double dx = x + 0.5 - xc;
                        if (dx * dx + dy * dy <= rad * rad) {
                            region[y * size + x] = tissue;
                        }
                    }
                }
            }
        }
        return new Phantom(size, size, region, "built-in: discs of 5 sizes on a background");
    }

    /**
     * A phantom from a label image and a mapping of label values to tissue names.
     *
     * @param rows label-image rows
     * @param cols label-image columns
     * @param labels integer label of every pixel, y·cols + x
     * @param mapping label value → tissue name; labels not in the mapping give no signal
     * @param tissueNames the tissues of the run, in order
     * @param source file name for messages and captions
     * @return the phantom
     * @throws InputException when the mapping names a tissue that is not in the run
     */
    public static Phantom fromLabels(int rows, int cols, int[] labels, Map<Integer, String> mapping,
                                     List<String> tissueNames, String source) {
        Map<Integer, Integer> index = new LinkedHashMap<>();
        for (Map.Entry<Integer, String> e : mapping.entrySet()) {
            int t = tissueNames.indexOf(e.getValue());
            if (t < 0) {
                throw new InputException("label " + e.getKey() + "=" + e.getValue() + ": no tissue of that name; "
                        + "the tissues of this run are " + String.join(", ", tissueNames));
            }
            index.put(e.getKey(), t);
        }
        int[] region = new int[labels.length];
        for (int i = 0; i < labels.length; i++) {
            region[i] = index.getOrDefault(labels[i], -1);
        }
        return new Phantom(rows, cols, region, source);
    }

    /**
     * @param labels label value of every pixel of the label image
     * @param mapping label value to tissue name
     * @return the label values of a label image that a mapping leaves without a tissue, sorted
     */
    public static List<Integer> unmapped(int[] labels, Map<Integer, String> mapping) {
        TreeSet<Integer> out = new TreeSet<>();
        for (int v : labels) {
            if (!mapping.containsKey(v)) {
                out.add(v);
            }
        }
        return new ArrayList<>(out);
    }

    /**
     * Nearest-neighbour resampling to another number of rows, columns scaled by the same factor
     * (at least 1), so that the rows match the number of phase-encoding lines.
     *
     * @param newRows rows wanted
     * @return this phantom when the rows already match, else the resampled phantom
     */
    public Phantom withRows(int newRows) {
        if (newRows == rows) {
            return this;
        }
        int newCols = Math.max(1, (int) Math.round((double) cols * newRows / rows));
        int[] out = new int[newRows * newCols];
        for (int y = 0; y < newRows; y++) {
            int sy = Math.min(rows - 1, (int) ((y + 0.5) * rows / newRows));
            for (int x = 0; x < newCols; x++) {
                int sx = Math.min(cols - 1, (int) ((x + 0.5) * cols / newCols));
                out[y * newCols + x] = region[sy * cols + sx];
            }
        }
        return new Phantom(newRows, newCols, out, description + ", resampled to " + newRows + " x " + newCols);
    }
}
