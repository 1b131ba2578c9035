package org.echotrellis.report;

import java.awt.Color;
import java.util.Locale;
import java.util.concurrent.ForkJoinPool;
import java.util.stream.IntStream;
import org.echotrellis.plot.SliceImages;

/**
 * Montages of every slice of a 3-D map: one small PNG per slice (data URI) in a wrapping grid,
 * and an SVG colour bar drawn from the same palette table. Slices are downsampled by a common
 * factor so that all montages of one report hold at most {@value #PIXEL_BUDGET} pixels together
 * and a tile is at most {@value #MAX_TILE_PX} pixels wide or high; tiles are encoded in parallel.
 */
final class Montage {
    /** Pixels of all montages of one report together. */
    static final long PIXEL_BUDGET = 3_000_000L;
    /** Largest tile side in pixels. */
    static final int MAX_TILE_PX = 192;
    private static final Color NAN_COLOUR = new Color(0x333333);

    private final int nx;
    private final int ny;
    private final int nz;
    private final double step;

    private Montage(int nx, int ny, int nz, double step) {
        this.nx = nx;
        this.ny = ny;
        this.nz = nz;
        this.step = step;
    }

    /**
     * @param nx x size
     * @param ny y size
     * @param nz slices
     * @param maps montages planned in the report
     * @return a montage maker with a downsampling step that keeps the pixel budget
     */
    static Montage forGrid(int nx, int ny, int nz, int maps) {
        double perMap = (double) PIXEL_BUDGET / Math.max(1, maps);
        double step = Math.max(1, Math.sqrt((double) nx * ny * nz / perMap));
        step = Math.max(step, Math.max(nx, ny) / (double) MAX_TILE_PX);
        return new Montage(nx, ny, nz, step);
    }

    /** @return the downsampling step (1 = every voxel) */
    double step() {
        return step;
    }

    /**
     * Adds the colour bar and the montage of one map to a section.
     *
     * @param s the section
     * @param map the map, x fastest (not modified)
     * @param spec title and unit
     * @param lower first-colour value
     * @param upper last-colour value
     */
    void add(Section s, float[] map, MapSpec spec, double lower, double upper) {
        SliceImages images = new SliceImages(lower, upper, NAN_COLOUR);
        String[] uris = new String[nz];
        ForkJoinPool.commonPool().submit(() -> IntStream.range(0, nz).parallel().forEach(z ->
                uris[z] = Section.dataUri(images.slicePng(map, nx, ny, z, step)))).join();
        int w = (int) Math.ceil(nx / step);
        int h = (int) Math.ceil(ny / step);
        double zoom = Math.max(1, Math.min(4, 128.0 / Math.max(w, h)));
        int dw = (int) Math.round(w * zoom);
        int dh = (int) Math.round(h * zoom);
        StringBuilder sb = new StringBuilder();
        sb.append("<div class=\"mapblock\">").append(colourBar(s.newId(), images, spec.unit()));
        if (step > 1) {
            sb.append(String.format(Locale.ROOT, "<p class=\"sub\">Shown at 1 pixel per %.2f voxels.</p>", step));
        }
        sb.append("<div class=\"montage\">\n");
        for (int z = 0; z < nz; z++) {
            String alt = spec.title() + ", slice z = " + z;
            sb.append("<figure class=\"tile\"><img src=\"").append(uris[z]).append("\" alt=\"").append(Html.text(alt))
              .append("\" width=\"").append(dw).append("\" height=\"").append(dh).append("\" style=\"width:").append(dw)
              .append("px;height:").append(dh).append("px\"><figcaption>z ").append(z).append("</figcaption></figure>\n");
        }
        sb.append("</div></div>\n");
        s.raw(sb.toString());
    }

    /** An SVG colour bar: the palette as a gradient from lower to upper with five labelled ticks. */
    static String colourBar(String id, SliceImages images, String unit) {
        StringBuilder sb = new StringBuilder();
        String alt = "Colour bar: " + unit + " from " + Html.num(images.lower()) + " to " + Html.num(images.upper());
        sb.append("<svg class=\"bar\" width=\"380\" height=\"58\" viewBox=\"0 0 380 58\" role=\"img\" aria-label=\"")
          .append(Html.text(alt)).append("\"><defs><linearGradient id=\"").append(id).append("\">");
        for (int i = 0; i <= 16; i++) {
            Color c = images.colourAt(i / 16.0);
            sb.append(String.format(Locale.ROOT, "<stop offset=\"%.4f\" stop-color=\"#%02x%02x%02x\"/>", i / 16.0,
                    c.getRed(), c.getGreen(), c.getBlue()));
        }
        sb.append("</linearGradient></defs><text x=\"40\" y=\"12\" font-size=\"12\" fill=\"#222\">").append(Html.text(unit))
          .append("</text><rect x=\"40\" y=\"18\" width=\"300\" height=\"14\" fill=\"url(#").append(id)
          .append(")\" stroke=\"#555\" stroke-width=\"0.5\"/>");
        for (int i = 0; i <= 4; i++) {
            double x = 40 + 300 * i / 4.0;
            double v = images.lower() + (images.upper() - images.lower()) * i / 4.0;
            sb.append(String.format(Locale.ROOT, "<line x1=\"%.1f\" y1=\"32\" x2=\"%.1f\" y2=\"37\" stroke=\"#222\"/>", x, x))
              .append(String.format(Locale.ROOT, "<text x=\"%.1f\" y=\"50\" font-size=\"11\" text-anchor=\"middle\" "
                      + "fill=\"#222\">", x)).append(Html.text(Html.num(v))).append("</text>");
        }
        sb.append("</svg>\n");
        return sb.toString();
    }
}
