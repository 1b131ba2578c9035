package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.fit.FitModel;
import org.echotrellis.fit.FitSettings;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.io.BackgroundNoise;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.OutputSet;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.io.VolumePipeline;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.plot.MapPreview;

/** The volume branch of {@code fit}: maps, previews and summary.json. */
final class FitVolumeRun {
    private final FitSettings settings;
    private final FitModel model;
    private final boolean compareMono;
    private final String noiseSigma;
    private final Path outDir;
    private final boolean force;
    private final boolean quiet;
    private final Path protocolFile;

    FitVolumeRun(FitSettings settings, FitModel model, boolean compareMono, String noiseSigma, Path outDir,
            boolean force, boolean quiet, Path protocolFile) {
        this.protocolFile = protocolFile;
        this.settings = settings;
        this.model = model;
        this.compareMono = compareMono;
        this.noiseSigma = noiseSigma;
        this.outDir = outDir;
        this.force = force;
        this.quiet = quiet;
    }

    /** Map names that get a PNG preview, with their colour-bar labels. */
    private static final String[][] PREVIEWS = {
        {"t2_ms", "T2 (ms)"}, {"mono_t2_ms", "mono-exponential T2 (ms)"}, {"b1_scale", "B1 scale"},
        {"amplitude", "amplitude"}, {"status", "status code"}};

    VolumeResult run(Path data, Path maskFile, Path b1File, int threads, Map<String, Object> info, PrintWriter o,
            PrintWriter err) {
        // every header is checked (series against protocol, mask and B1 map against the series)
        // before any file is inflated or any voxel array allocated
        NiftiHeader grid = Nifti.readHeader(data);
        VolumeJob.checkSeries(grid, data.toString(), settings.train().echoes());
        Nifti.checkOnGrid(maskFile, grid, "--mask");
        Nifti.checkOnGrid(b1File, grid, "--b1-map");
        try (OutputSet set = OutputSet.open(outDir, force, java.util.Arrays.asList(data, maskFile, b1File, protocolFile));
                NiftiInput in = Nifti.open(data)) {
            NiftiHeader h = in.header();
            VolumeJob.checkSeries(h, data.toString(), settings.train().echoes());
            // headers are checked against the series before any voxel data are inflated or read
            Optional<NiftiImage> mask = Optional.ofNullable(maskFile).map(f -> Nifti.readOnGrid(f, h, "--mask"));
            Optional<NiftiImage> b1 = Optional.ofNullable(b1File).map(f -> Nifti.readOnGrid(f, h, "--b1-map"));
            VolumeJob job = new VolumeJob(in, mask, b1, threads, VolumeJob.DEFAULT_SLAB_VALUES);
            double sigma = Double.NaN;
            if (noiseSigma != null) {
                sigma = noiseSigma.equals("auto") ? BackgroundNoise.sigma(job) : FitCommand.parseSigma(noiseSigma);
            }
            info.put("noise_sigma", Double.isNaN(sigma) ? null : sigma);
            T2Fit.Factory factory = new T2Fit.Factory(settings.withNoiseSigma(sigma), model, compareMono);
            set.plan(plannedFiles(factory.outputs()));
            VolumeResult res = VolumePipeline.run(job, factory, new StderrProgressBar(err, quiet));
            refuseNothingFitted(res, job, b1File);
            res.writeMaps(outDir, force);
            previews(res, h);
            RunSummary.write(outDir.resolve("summary.json"), res, info, force);
            set.commit();
            double[] t2 = res.fittedValues("t2_ms");
            o.printf(Locale.ROOT, "fitted %d voxels in %.2f s (%.0f voxels/s); median T2 %.1f ms; maps in %s%n",
                    res.processed(), res.seconds(), res.voxelsPerSecond(), RunSummary.percentile(t2, 50), outDir);
            o.flush();
            return res;
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
                        + "takes scale factors (1 = nominal flip)", b1File, median);
            }
        }
        throw new InputException("no voxel could be fitted (" + res.processed() + " inside the mask: "
                + res.statusCounts().entrySet().stream()
                        .filter(e -> e.getValue() > 0 && e.getKey() != org.echotrellis.io.VoxelStatus.OUTSIDE_MASK)
                        .map(e -> e.getValue() + " " + e.getKey().label()).collect(java.util.stream.Collectors.joining(", "))
                + ")" + hint);
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
                f.add(p[0] + ".png");
            }
        }
        return f;
    }

    private void previews(VolumeResult res, NiftiHeader h) {
        int nx = h.size(1);
        int ny = h.size(2);
        int nz = h.size(3);
        double[] t2 = res.fittedValues("t2_ms");
        double lo = RunSummary.percentile(t2, 2);
        double hi = RunSummary.percentile(t2, 98);
        for (String[] p : PREVIEWS) {
            float[] map;
            double a = Double.NaN;
            double b = Double.NaN;
            if (p[0].equals("status")) {
                byte[] s = res.status();
                map = new float[s.length];
                for (int i = 0; i < s.length; i++) {
                    map[i] = s[i];
                }
                a = 0;
                b = 5;
            } else if (res.names().contains(p[0])) {
                map = res.map(p[0]);
                if (p[0].endsWith("t2_ms")) {
                    a = lo;
                    b = hi;
                }
            } else {
                continue;
            }
            MapPreview.writeCentralSlice(outDir.resolve(p[0] + ".png"), map, nx, ny, nz, p[1], p[1], a, b, force);
        }
    }
}
