package org.echotrellis.cli;

import java.awt.Color;
import java.util.ArrayList;
import java.util.List;
import org.echotrellis.io.VoxelStatus;
import org.echotrellis.plot.ChartStyle;
import org.echotrellis.plot.MapPreview;

/**
 * Colours of the voxel status codes in status-map previews: outside the mask black like the
 * background, fitted voxels light blue, each problem a colour that differs from its neighbours in
 * lightness as well as hue (so it reads under colour-vision deficiency too); the legend names them.
 */
final class StatusColours {
    /** The categories in code order. */
    static final List<MapPreview.Category> CATEGORIES = categories();

    private StatusColours() { }

    private static List<MapPreview.Category> categories() {
        Color[] c = {Color.BLACK, ChartStyle.color(5), ChartStyle.color(1), ChartStyle.color(4), ChartStyle.color(3),
            new Color(0xF4F1EA)};
        List<MapPreview.Category> list = new ArrayList<>();
        for (VoxelStatus s : VoxelStatus.values()) {
            list.add(new MapPreview.Category(s.code(), s.label().replace('_', ' '), c[s.code()]));
        }
        return List.copyOf(list);
    }
}
