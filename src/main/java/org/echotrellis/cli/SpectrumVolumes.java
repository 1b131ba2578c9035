package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import org.echotrellis.InputException;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.fit.volume.SpectrumNames;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.fit.volume.VolumeMaps;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.OutputSet;
import org.echotrellis.io.ProgressReporter;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.plot.MapPreview;
import org.echotrellis.plot.PlotSettings;

/**
 * Image input of {@code spectrum}: runs the fit over the volume (slab streaming, mask, threads and
 * status from the shared volume pipeline) and writes spectrum.nii.gz (4-D, one volume per T2 bin),
 * one NIfTI map per scalar, status.nii.gz, PNG previews of the central slice and summary.json.
 * Memory: the input is streamed; outputs are held as float32, (bins + maps) · 4 bytes per voxel.
 */
final class SpectrumVolumes {
    /** Figure formats of every map preview. */
    private static final String[] PREVIEW_FORMATS = {".png", ".svg"};

    private SpectrumVolumes() { }

    static VolumeMaps run(Path data, Path mask, Path b1Map, double b1Factor, VolumeAnalysis analysis, int threads,
                          Path out, boolean force,
                          float outsideMask, Map<String, Object> settings, ProgressReporter progress,
                          boolean json, PrintWriter stdout, List<Path> inputs) throws Exception {
        if (Files.exists(out) && !Files.isDirectory(out)) {
            throw new InputException("--out " + out + " exists and is not a directory");
        }
        SpectrumOptions o = analysis.spectrumOptions().orElseThrow();
        NiftiHeader grid = Nifti.readHeader(data);  // headers first: nothing inflated before they agree
        VolumeJob.checkSeries(grid, data.toString(), analysis.train().echoes());
        Nifti.checkOnGrid(mask, grid, "--mask");
        Nifti.checkOnGrid(b1Map, grid, "--b1-map");
        try (OutputSet set = CliChecks.outputSet(out, force, inputs); NiftiInput in = Nifti.open(data)) {
            Optional<NiftiImage> m = mask == null ? Optional.empty() : Optional.of(Nifti.read(mask));
            Optional<NiftiImage> b1 = b1Map == null ? Optional.empty() : Optional.of(Nifti.read(b1Map).times(b1Factor));
            VolumeJob job = CliChecks.volumeJob(in, m, b1, threads);
            org.echotrellis.io.bids.BidsProtocol.checkSeriesSidecar(data, analysis.protocol().echoTimesMs());
            set.plan(plannedFiles(analysis, o));
            VolumeMaps r = analysis.run(job, progress);
            Map<String, Object> s = write(r, o, out, force, outsideMask, settings);
            set.commit();
            VolumeResult res = r.result();
            if (json) {
                stdout.println(summary(res, s).strip());
            } else {
                stdout.printf(Locale.ROOT, "spectrum: %d voxels fitted in %.1f s (%.0f voxels/s); outputs in %s%n",
                        res.processed(), res.seconds(), res.voxelsPerSecond(), out);
            }
            stdout.flush();
            return r;
        }
    }

    private static Map<String, Object> write(VolumeMaps r, SpectrumOptions o, Path out, boolean force,
                                             float outsideMask, Map<String, Object> settings) {
        NiftiHeader h = r.mapHeader();
        int nx = h.size(1);
        int ny = h.size(2);
        int nz = h.size(3);
        r.write(out, outsideMask, force);
        List<String> scalars = r.mapNames();
        double fractionHi = sharedEnd(r.result(), scalars, "fraction_", 98);
        double gmLo = sharedEnd(r.result(), scalars, "gm_t2_", 2);
        double gmHi = sharedEnd(r.result(), scalars, "gm_t2_", 98);
        PlotSettings ps = PlotSettings.current();
        for (String name : scalars) {
            if (name.equals("chi2_unregularised")) {
                continue;
            }
            double lo = Double.NaN;
            double hi = Double.NaN;
            if (name.startsWith("fraction_")) {
                // the window fractions share one range (from 0), or --display-range
                lo = ps.hasDisplayRange() ? ps.displayLo() : 0;
                hi = ps.hasDisplayRange() ? ps.displayHi() : fractionHi;
            } else if (name.startsWith("gm_t2_")) {
                lo = gmLo;
                hi = gmHi;
            }
            for (String ext : PREVIEW_FORMATS) {
                MapPreview.writeCentralSlice(out.resolve(name + ext), r.map(name), nx, ny, nz, title(name), unit(name),
                        lo, hi, force);
            }
        }
        Map<String, Object> s = new LinkedHashMap<>(settings);
        s.put("outputs", outputs(scalars));
        org.echotrellis.io.AtomicFiles.writeString(out.resolve("summary.json"), summary(r.result(), s), force);
        return s;
    }

    /**
     * summary.json with the status counts under the spectrum's own names: the shared status map's
     * codes 2 and 5 mean "regularisation target not reached" and "NNLS iteration limit" here.
     */
    static String summary(VolumeResult r, Map<String, Object> settings) {
        com.fasterxml.jackson.databind.node.ObjectNode root = RunSummary.build(r, settings);
        com.fasterxml.jackson.databind.node.ObjectNode counts =
                (com.fasterxml.jackson.databind.node.ObjectNode) root.get("status_counts");
        com.fasterxml.jackson.databind.node.ObjectNode renamed = root.objectNode();
        counts.fields().forEachRemaining(e -> renamed.set(STATUS_NAMES.getOrDefault(e.getKey(), e.getKey()), e.getValue()));
        root.set("status_counts", renamed);
        try {
            return org.echotrellis.io.Json.MAPPER.writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Shared status labels → spectrum meanings. */
    static final Map<String, String> STATUS_NAMES = Map.of(
            "hit_bound", "regularisation_target_not_reached",
            "not_converged", "nnls_iteration_limit");


    /**
     * The lowest 2nd ({@code q} = 2) or highest 98th ({@code q} = 98) percentile over the maps whose
     * name starts with {@code prefix}, so that comparable maps share one colour range (NaN if none).
     */
    private static double sharedEnd(VolumeResult r, List<String> scalars, String prefix, int q) {
        double end = Double.NaN;
        for (String n : scalars) {
            if (n.startsWith(prefix) && r.fittedValues(n).length > 0) {
                double v = RunSummary.percentile(r.fittedValues(n), q);
                end = Double.isNaN(end) ? v : q < 50 ? Math.min(end, v) : Math.max(end, v);
            }
        }
        return end;
    }

    /** The files a run writes, checked before any work. */
    static List<String> plannedFiles(VolumeAnalysis analysis, SpectrumOptions o) {
        List<String> names = new ArrayList<>(VolumeMaps.fileNames(analysis));
        names.add("summary.json");
        for (String n : SpectrumNames.scalars(o)) {
            if (!n.equals("chi2_unregularised")) {
                names.add(n + ".png");
                names.add(n + ".svg");
            }
        }
        return names;
    }

    private static List<String> outputs(List<String> scalars) {
        List<String> files = new ArrayList<>();
        files.add("spectrum.nii.gz (4-D: one volume per T2 bin, t2_ms in settings)");
        for (String n : scalars) {
            files.add(n + ".nii.gz");
        }
        files.add("status.nii.gz (0 outside mask, 1 ok, 2 regularisation target not reached, "
                + "3 low signal (largest fitted echo < 10 noise SD), 4 invalid input or B1 map value outside the "
                + "refocusing range, 5 NNLS iteration limit)");
        return files;
    }

    static String title(String name) {
        if (name.startsWith("fraction_")) {
            return "T2 window fraction " + name.substring(9).replace('_', '-');
        }
        if (name.startsWith("gm_t2_") && !name.equals("gm_t2_ms")) {
            return "geometric-mean T2, window " + name.substring(6).replace('_', '-');
        }
        switch (name) {
            case "refocus_deg": return "fitted refocusing angle";
            case "gm_t2_ms": return "geometric-mean T2";
            case "snr": return "SNR estimate";
            case "chi2": return "misfit χ²";
            case "regularisation_weight": return "regularisation weight μ";
            default: return name;
        }
    }

    static String unit(String name) {
        if (name.startsWith("fraction_")) {
            return "fraction";
        }
        if (name.startsWith("gm_t2_")) {
            return "T2 (ms)";
        }
        switch (name) {
            case "refocus_deg": return "angle (deg)";
            case "chi2": return "χ² (signal²)";
            case "regularisation_weight": return "μ";
            case "snr": return "SNR (largest echo / σ)";
            default: return name;
        }
    }
}
