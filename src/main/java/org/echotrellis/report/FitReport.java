package org.echotrellis.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.VolumeResult;

/**
 * The content of a T2-fit volume report: headline numbers, montages and histograms of every map
 * (EPG and mono-exponential T2 share one display range), and sample decays with fitted curves.
 */
public final class FitReport {
    /** The fit maps a report shows, in order, with titles, units and range groups. */
    static final List<MapSpec> MAPS = List.of(
            MapSpec.of("t2_ms", "T2", "T2 (ms)", "t2"),
            MapSpec.of("mono_t2_ms", "mono-exponential T2", "T2 (ms)", "t2"),
            MapSpec.of("t2_se_ms", "standard error of T2", "T2 SE (ms)", null),
            MapSpec.of("b1_scale", "B1 scale", "B1 scale", null),
            MapSpec.of("b1_se", "standard error of B1", "B1 SE", null),
            MapSpec.of("amplitude", "amplitude", "amplitude (data units)", null),
            MapSpec.of("residual_rms", "residual rms", "residual rms (data units)", null),
            MapSpec.of("offset", "mono-exponential offset", "offset (data units)", null));

    private FitReport() { }

    /**
     * Adds the sections of a fit volume report.
     *
     * @param r the report
     * @param res the fit result
     * @param in the open echo series the result came from (for the sample decays)
     * @param b1Map the B1 map used, if any
     * @param factory the run's fit factory
     */
    public static void volume(Report r, VolumeResult res, NiftiInput in, Optional<NiftiImage> b1Map, T2Fit.Factory factory) {
        List<MapSpec> maps = new ArrayList<>();
        for (MapSpec m : MAPS) {
            if (res.names().contains(m.name())) {
                maps.add(m);
            }
        }
        List<MapSpec> head = new ArrayList<>(maps.subList(0, 1));
        if (res.names().contains("b1_scale")) {
            head.add(MAPS.get(3));
        }
        VolumeSections.headline(r, res, head);
        var ranges = VolumeSections.ranges(res, maps);
        VolumeSections.montages(r, res, maps, ranges);
        VolumeSections.histograms(r, res, maps, ranges);
        FitSamples.add(r, res, in, b1Map, factory);
    }
}
