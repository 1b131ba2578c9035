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
import org.echotrellis.report.FitReport;

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

    /** Map names that get a PNG preview, with their colour-bar labels. */
    private static final String[][] PREVIEWS = {
        {"t2_ms", "T2 (ms)"}, {"mono_t2_ms", "mono-exponential T2 (ms)"}, {"b1_scale", "B1 scale"},
        {"amplitude", "amplitude"}, {"status", "status code"}};

    VolumeResult run(Path data, Path maskFile, Path b1File, int threads, Map<String, Object> info, PrintWriter o,
            PrintWriter err, ReportOption report) {
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
            VolumeResult res = VolumePipeline.run(job, factory, new StderrProgressBar(err, quiet));
            res.writeMaps(outDir, force);
            previews(res, h);
            RunSummary.write(outDir.resolve("summary.json"), res, info, force);
            report.settings(info);
            report.write("fit: " + data.getFileName(), force, r -> FitReport.volume(r, res, in, b1, factory));
            double[] t2 = res.fittedValues("t2_ms");
            o.printf(Locale.ROOT, "fitted %d voxels in %.2f s (%.0f voxels/s); median T2 %.1f ms; maps in %s%n",
                    res.processed(), res.seconds(), res.voxelsPerSecond(), RunSummary.percentile(t2, 50), outDir);
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
                f.add(outDir.resolve(p[0] + ".png"));
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
