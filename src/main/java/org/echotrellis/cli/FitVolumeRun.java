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
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.BackgroundNoise;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.io.VolumePipeline;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.plot.MapPreview;
import org.echotrellis.plot.PlotSettings;

/** The volume branch of {@code fit}: maps, previews and summary.json. */
final class FitVolumeRun {
    private final FitSettings settings;
    private final FitModel model;
    private final boolean compareMono;
    private final String noiseSigma;
    private final Path outDir;
    private final boolean force;
    private final boolean quiet;

    FitVolumeRun(FitSettings settings, FitModel model, boolean compareMono, String noiseSigma, Path outDir,
            boolean force, boolean quiet) {
        this.settings = settings;
        this.model = model;
        this.compareMono = compareMono;
        this.noiseSigma = noiseSigma;
        this.outDir = outDir;
        this.force = force;
        this.quiet = quiet;
    }

    /** Map names that get a PNG and SVG preview, with their titles and colour-bar labels. */
    private static final String[][] PREVIEWS = {
        {"t2_ms", "T2, EPG fit", "T2 (ms)"}, {"mono_t2_ms", "T2, mono-exponential fit", "T2 (ms)"},
        {"b1_scale", "B1 scale", "B1 scale"}, {"amplitude", "Amplitude", "amplitude"}, {"status", "Voxel status", ""}};
    /** Figure formats of every preview. */
    private static final String[] FORMATS = {".png", ".svg"};

    VolumeResult run(Path data, Path maskFile, Path b1File, int threads, Map<String, Object> info, boolean json,
            PrintWriter o, PrintWriter err) {
        Optional<NiftiImage> mask = Optional.ofNullable(maskFile).map(Nifti::read);
        Optional<NiftiImage> b1 = Optional.ofNullable(b1File).map(Nifti::read);
        try (NiftiInput in = Nifti.open(data)) {
            NiftiHeader h = in.header();
            int echoes = h.volumes();
            if (echoes != settings.train().echoes()) {
                throw new InputException(data + ": " + echoes + " echoes (dim 4), but the protocol has " + settings.train().echoes());
            }
            VolumeJob job = new VolumeJob(in, mask, b1, threads, VolumeJob.DEFAULT_SLAB_VALUES);
            double sigma = Double.NaN;
            if (noiseSigma != null) {
                sigma = noiseSigma.equals("auto") ? BackgroundNoise.sigma(job) : FitCommand.parseSigma(noiseSigma);
            }
            info.put("noise_sigma", Double.isNaN(sigma) ? null : sigma);
            T2Fit.Factory factory = new T2Fit.Factory(settings.withNoiseSigma(sigma), model, compareMono);
            List<Path> files = plannedFiles(factory.outputs());
            for (Path f : files) {
                AtomicFiles.checkWritable(f, force);
            }
            VolumeResult res = VolumePipeline.run(job, factory, StderrProgressBar.onTerminal(err, quiet));
            res.writeMaps(outDir, force);
            previews(res, h);
            RunSummary.write(outDir.resolve("summary.json"), res, info, force);
            double[] t2 = res.fittedValues("t2_ms");
            if (json) {
                o.println(org.echotrellis.io.Json.write(RunSummary.build(res, info)).strip());
            } else {
                o.printf(Locale.ROOT, "fitted %d voxels in %.2f s (%.0f voxels/s); median T2 %.1f ms; maps in %s%n",
                        res.processed(), res.seconds(), res.voxelsPerSecond(), RunSummary.percentile(t2, 50), outDir);
            }
            o.flush();
            return res;
        }
    }

    private List<Path> plannedFiles(List<String> outputs) {
        List<Path> f = new ArrayList<>();
        for (String n : outputs) {
            f.add(outDir.resolve(n + ".nii.gz"));
        }
        f.add(outDir.resolve("status.nii.gz"));
        f.add(outDir.resolve("summary.json"));
        for (String[] p : PREVIEWS) {
            if (outputs.contains(p[0]) || p[0].equals("status")) {
                for (String ext : FORMATS) {
                    f.add(outDir.resolve(p[0] + ext));
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
