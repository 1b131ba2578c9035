package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.fit.volume.FitOptions;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.fit.volume.VolumeMaps;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.OutputSet;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.io.VoxelStatus;
import org.echotrellis.plot.MapPreview;
import org.echotrellis.plot.PlotSettings;
import org.echotrellis.report.FitReport;

/** The volume branch of {@code fit}: maps, previews and summary.json. */
final class FitVolumeRun {
    private final VolumeAnalysis analysis;
    private final Path outDir;
    private final boolean force;
    private final boolean quiet;
    private final float outsideMask;
    private final Path protocolFile;

    FitVolumeRun(VolumeAnalysis analysis, Path outDir, boolean force, boolean quiet, float outsideMask,
            Path protocolFile) {
        this.protocolFile = protocolFile;
        this.analysis = analysis;
        this.outDir = outDir;
        this.force = force;
        this.quiet = quiet;
        this.outsideMask = outsideMask;
    }

    /** Map names that get a PNG and SVG preview, with their titles and colour-bar labels. */
    private static final String[][] PREVIEWS = {
        {"t2_ms", "T2, EPG fit", "T2 (ms)"}, {"mono_t2_ms", "T2, mono-exponential fit", "T2 (ms)"},
        {"b1_scale", "B1 scale", "B1 scale"}, {"amplitude", "Amplitude", "amplitude"}, {"status", "Voxel status", ""}};
    /** Figure formats of every preview. */
    private static final String[] FORMATS = {".png", ".svg"};

    VolumeMaps run(Path data, Path maskFile, Path b1File, FitCommand.B1Units b1Units, int threads,
            Map<String, Object> info, boolean json, PrintWriter o, PrintWriter err, ReportOption report) {
        // every header is checked (series against protocol, mask and B1 map against the series)
        // before any file is inflated or any voxel array allocated
        NiftiHeader grid = Nifti.readHeader(data);
        VolumeJob.checkSeries(grid, data.toString(), analysis.train().echoes());
        Nifti.checkOnGrid(maskFile, grid, "--mask");
        Nifti.checkOnGrid(b1File, grid, "--b1-map");
        try (OutputSet set = CliChecks.outputSet(outDir, force, java.util.Arrays.asList(data, maskFile, b1File, protocolFile));
                NiftiInput in = Nifti.open(data)) {
            NiftiHeader h = in.header();
            org.echotrellis.io.bids.BidsProtocol.checkSeriesSidecar(data, analysis.protocol().echoTimesMs());
            Optional<NiftiImage> mask = Optional.ofNullable(maskFile).map(Nifti::read);
            Optional<NiftiImage> b1 = Optional.ofNullable(b1File).map(Nifti::read)
                    .map(m -> b1Units == FitCommand.B1Units.percent ? m.times(0.01) : m);
            VolumeJob job = CliChecks.volumeJob(in, mask, b1, threads);
            set.plan(plannedFiles(analysis.mapNames()));
            VolumeMaps maps = CliChecks.asOptions(() -> analysis.run(job, StderrProgressBar.onTerminal(err, quiet)), "noise_sigma");
            info.put("noise_sigma", Double.isNaN(maps.noiseSigma()) ? null : maps.noiseSigma());
            VolumeResult res = maps.result();
            refuseNothingFitted(res, job, b1File);
            maps.write(outDir, outsideMask, force);
            previews(res, h);
            RunSummary.write(outDir.resolve("summary.json"), res, info, force);
            set.commit();
            report.settings(info);
            report.write("fit: " + data.getFileName(), force, r -> FitReport.volume(r, res, in, b1, sampleFit(maps)));
            double[] t2 = res.fittedValues("t2_ms");
            if (json) {
                o.println(org.echotrellis.io.Json.write(RunSummary.build(res, info)).strip());
            } else {
                o.printf(Locale.ROOT, "fitted %d voxels in %.2f s (%.0f voxels/s); median T2 %.1f ms; maps in %s%n",
                        res.processed(), res.seconds(), res.voxelsPerSecond(), RunSummary.percentile(t2, 50), outDir);
            }
            o.flush();
            return maps;
        }
    }

    /** A run in which no voxel inside the mask could be fitted is an input error, with a hint where one is clear. */
    private static void refuseNothingFitted(VolumeResult res, VolumeJob job, Path b1File) {
        long fitted = res.statusCounts().entrySet().stream().filter(e -> e.getKey().fitted())
                .mapToLong(Map.Entry::getValue).sum();
        if (res.processed() == 0 || fitted > 0) {
            return;
        }
        String hint = "";
        if (job.b1Map().isPresent()) {
            double[] inside = new double[job.voxels()];
            int n = 0;
            for (int v = 0; v < job.voxels(); v++) {
                double b = job.b1Map().get().get(v);
                if (job.inside(v) && Double.isFinite(b)) {
                    inside[n++] = b;
                }
            }
            double[] sorted = java.util.Arrays.copyOf(inside, n);
            java.util.Arrays.sort(sorted);
            double median = RunSummary.percentile(sorted, 50);
            if (median > 10) {
                hint = String.format(Locale.ROOT, "; --b1-map %s: median %.4g, values look like percent; this option "
                        + "takes scale factors (1 = nominal flip) unless --b1-map-units percent is given", b1File, median);
            }
        }
        throw new InputException("no voxel could be fitted (" + res.processed() + " inside the mask: "
                + res.statusCounts().entrySet().stream()
                        .filter(e -> e.getValue() > 0 && e.getKey() != VoxelStatus.OUTSIDE_MASK)
                        .map(e -> e.getValue() + " " + e.getKey().label()).collect(java.util.stream.Collectors.joining(", "))
                + ")" + hint);
    }

    /** The run's fit factory with the noise σ actually used, to draw the sample voxels' curves. */
    private T2Fit.Factory sampleFit(VolumeMaps maps) {
        FitOptions opts = analysis.fitOptions().orElseThrow();
        return new T2Fit.Factory(analysis.fitSettings().orElseThrow().withNoiseSigma(maps.noiseSigma()), opts.model(),
                opts.compareMono());
    }

    private static List<String> plannedFiles(List<String> outputs) {
        List<String> f = new ArrayList<>();
        for (String n : outputs) {
            f.add(n + ".nii.gz");
        }
        f.add("status.nii.gz");
        f.add("summary.json");
        for (String[] p : PREVIEWS) {
            if (outputs.contains(p[0]) || p[0].equals("status")) {
                for (String ext : FORMATS) {
                    f.add(p[0] + ext);
                }
            }
        }
        return f;
    }

    private void previews(VolumeResult res, NiftiHeader h) {
        int nx = h.size(1);
        int ny = h.size(2);
        int nz = h.size(3);
        double[] t2Range = sharedT2Range(res);
        for (String[] p : PREVIEWS) {
            for (String ext : FORMATS) {
                Path file = outDir.resolve(p[0] + ext);
                if (p[0].equals("status")) {
                    MapPreview.writeCentralCategories(file, res.status(), nx, ny, nz, p[1], StatusColours.CATEGORIES, force);
                } else if (res.names().contains(p[0])) {
                    double[] r = p[0].endsWith("t2_ms") ? t2Range : new double[] {Double.NaN, Double.NaN};
                    MapPreview.writeCentralSlice(file, res.map(p[0]), nx, ny, nz, p[1], p[2], r[0], r[1], force);
                }
            }
        }
    }

    /**
     * One colour range for the T2 maps (EPG and mono-exponential), so that the bias the comparison
     * exists to show is not clipped: {@code --display-range}, or from the lowest 2nd to the highest
     * 98th percentile of the fitted voxels of both maps.
     */
    private static double[] sharedT2Range(VolumeResult res) {
        PlotSettings ps = PlotSettings.current();
        if (ps.hasDisplayRange()) {
            return new double[] {ps.displayLo(), ps.displayHi()};
        }
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (String name : new String[] {"t2_ms", "mono_t2_ms"}) {
            if (res.names().contains(name)) {
                double[] v = res.fittedValues(name);
                if (v.length > 0) {
                    lo = Math.min(lo, RunSummary.percentile(v, 2));
                    hi = Math.max(hi, RunSummary.percentile(v, 98));
                }
            }
        }
        return lo <= hi ? new double[] {lo, hi} : new double[] {Double.NaN, Double.NaN};
    }
}
