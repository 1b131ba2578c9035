package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.fit.volume.VolumeMaps;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.plot.MapPreview;

/** The volume branch of {@code fit}: maps, previews and summary.json. */
final class FitVolumeRun {
    private final VolumeAnalysis analysis;
    private final Path outDir;
    private final boolean force;
    private final boolean quiet;
    private final float outsideMask;

    FitVolumeRun(VolumeAnalysis analysis, Path outDir, boolean force, boolean quiet, float outsideMask) {
        this.analysis = analysis;
        this.outDir = outDir;
        this.force = force;
        this.quiet = quiet;
        this.outsideMask = outsideMask;
    }

    /** Map names that get a PNG preview, with their colour-bar labels. */
    private static final String[][] PREVIEWS = {
        {"t2_ms", "T2 (ms)"}, {"mono_t2_ms", "mono-exponential T2 (ms)"}, {"b1_scale", "B1 scale"},
        {"amplitude", "amplitude"}, {"status", "status code"}};

    VolumeMaps run(Path data, Path maskFile, Path b1File, FitCommand.B1Units b1Units, int threads,
            Map<String, Object> info, PrintWriter o, PrintWriter err) {
        Optional<NiftiImage> mask = Optional.ofNullable(maskFile).map(Nifti::read);
        Optional<NiftiImage> b1 = Optional.ofNullable(b1File).map(Nifti::read)
                .map(m -> b1Units == FitCommand.B1Units.percent ? m.times(0.01) : m);
        try (NiftiInput in = Nifti.open(data)) {
            NiftiHeader h = in.header();
            int echoes = h.volumes();
            if (echoes != analysis.train().echoes()) {
                throw new InputException(data + ": " + echoes + " echoes (dim 4), but the protocol has " + analysis.train().echoes());
            }
            VolumeJob job = CliChecks.volumeJob(in, mask, b1, threads);
            for (Path f : plannedFiles(analysis.mapNames())) {
                AtomicFiles.checkWritable(f, force);
            }
            VolumeMaps maps = analysis.run(job, new StderrProgressBar(err, quiet));
            info.put("noise_sigma", Double.isNaN(maps.noiseSigma()) ? null : maps.noiseSigma());
            VolumeResult res = maps.result();
            maps.write(outDir, outsideMask, force);
            previews(res, h);
            RunSummary.write(outDir.resolve("summary.json"), res, info, force);
            double[] t2 = res.fittedValues("t2_ms");
            o.printf(Locale.ROOT, "fitted %d voxels in %.2f s (%.0f voxels/s); median T2 %.1f ms; maps in %s%n",
                    res.processed(), res.seconds(), res.voxelsPerSecond(), RunSummary.percentile(t2, 50), outDir);
            o.flush();
            return maps;
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
