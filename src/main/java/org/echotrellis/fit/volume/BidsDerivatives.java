package org.echotrellis.fit.volume;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.EchoStack;
import org.echotrellis.io.Json;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.OutputSet;
import org.echotrellis.io.ProgressReporter;
import org.echotrellis.io.Provenance;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.bids.BidsImages;
import org.echotrellis.io.bids.MeseCollection;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolText;

/**
 * Runs the volume analyses of one BIDS collection and writes them as a BIDS derivatives dataset
 * (BIDS specification, "Derivatives"; METHODS §12): under {@code sub-L[/ses-S]/anat/}, with the
 * input's entities kept, {@code _T2map} in seconds, {@code _M0map}, the fitted flip-angle scale as
 * {@code _desc-epgfit_TB1map} in percent, {@code _MWFmap} in percent (spectrum), a status map
 * {@code _desc-<analysis>status_dseg}, a JSON sidecar per map (Units, Sources, method and
 * reference, acquisition settings) and the run's summary {@code _desc-<analysis>_summary.json}.
 */
public final class BidsDerivatives {
    /** The BIDS version the derivatives follow. */
    public static final String BIDS_VERSION = "1.9.0";

    private BidsDerivatives() { }

    /**
     * Everything one collection's run needs besides the collection.
     *
     * @param fit the fit settings, or empty for no fit
     * @param spectrum the spectrum choices (resolved per collection protocol), or empty for no spectrum
     * @param b1Override a B1 map for every collection instead of the ones found in {@code fmap/}
     * @param b1OverrideFactor factor from the override's values to a flip-angle scale (0.01 for percent)
     * @param mask the mask choice of {@link BidsImages#find} ({@value BidsImages#MASK} or a path pattern),
     *        or empty to fit every voxel
     * @param outsideMask value of the maps outside the mask (NaN, or 0 for tools that dislike NaN)
     * @param threads worker threads
     * @param force replace existing outputs
     * @param commandLine the command line, for provenance
     */
    public record Settings(Optional<FitOptions> fit, Optional<org.echotrellis.fit.spectrum.SpectrumChoices> spectrum,
                           Optional<Path> b1Override, double b1OverrideFactor, Optional<String> mask, float outsideMask,
                           int threads, boolean force, String commandLine) {
        /**
         * Checks that at least one analysis is requested.
         *
         * @param fit the fit settings, or empty for no fit
         * @param spectrum the spectrum choices (resolved per collection protocol), or empty for no spectrum
         * @param b1Override a B1 map for every collection instead of the ones found in {@code fmap/}
         * @param b1OverrideFactor factor from the override's values to a flip-angle scale (0.01 for percent)
         * @param mask the mask choice of {@link BidsImages#find} ({@value BidsImages#MASK} or a path pattern),
         *        or empty to fit every voxel
         * @param outsideMask value of the maps outside the mask (NaN, or 0 for tools that dislike NaN)
         * @param threads worker threads
         * @param force replace existing outputs
         * @param commandLine the command line, for provenance
         * @throws IllegalArgumentException if neither fit nor spectrum settings are given
         */
        public Settings {
            if (fit.isEmpty() && spectrum.isEmpty()) {
                throw new IllegalArgumentException("BIDS derivatives need fit or spectrum settings");
            }
        }
    }

    /**
     * Writes {@code dataset_description.json} of the derivatives dataset.
     *
     * @param outDir the derivatives root
     * @param commandLine the command line, recorded under GeneratedBy
     * @param force overwrite an existing file
     * @return the file
     */
    public static Path writeDescription(Path outDir, String commandLine, boolean force) {
        Map<String, Object> d = new LinkedHashMap<>();
        d.put("Name", "echotrellis T2 maps");
        d.put("BIDSVersion", BIDS_VERSION);
        d.put("DatasetType", "derivative");
        Map<String, Object> by = new LinkedHashMap<>();
        by.put("Name", "echotrellis");
        by.put("Version", Provenance.version());
        by.put("CommandLine", commandLine);
        by.put("Description", "EPG T2/B1 fits and T2 spectra of multi-echo spin-echo series");
        d.put("GeneratedBy", List.of(by));
        Path f = outDir.resolve("dataset_description.json");
        AtomicFiles.writeString(f, Json.write(d), force);
        return f;
    }

    /**
     * The files a run of a collection writes, relative to the derivatives root.
     *
     * @param c the collection
     * @param s the settings
     * @return relative paths
     */
    public static List<Path> plannedFiles(MeseCollection c, Settings s) {
        List<Path> f = new ArrayList<>();
        String p = c.prefix();
        Path dir = c.relativeDir();
        List<String> stems = new ArrayList<>();
        if (s.fit().isPresent()) {
            stems.add(p + "_T2map");
            stems.add(p + "_M0map");
            if (s.fit().get().model() == org.echotrellis.fit.FitModel.EPG) {
                stems.add(p + "_desc-epgfit_TB1map");
            }
            stems.add(p + "_desc-fitstatus_dseg");
        }
        if (s.spectrum().isPresent()) {
            stems.add(p + "_MWFmap");
            stems.add(p + "_desc-spectrumstatus_dseg");
        }
        for (String st : stems) {
            f.add(dir.resolve(st + ".nii.gz"));
            f.add(dir.resolve(st + ".json"));
        }
        if (s.fit().isPresent()) {
            f.add(dir.resolve(p + "_desc-fit_summary.json"));
        }
        if (s.spectrum().isPresent()) {
            f.add(dir.resolve(p + "_desc-spectrum_summary.json"));
        }
        return f;
    }

    /**
     * Runs and writes one collection. Each analysis's files are one output set of the collection's
     * folder ({@link OutputSet#openNamed}, named by the collection prefix and the analysis): they
     * appear together once the analysis has finished, replace the previous run's files of the same set
     * together, and never touch the files of other collections or of the other analysis.
     *
     * @param root the BIDS dataset root (for the Sources URIs and the mask pattern)
     * @param c the collection
     * @param protocol the resolved protocol
     * @param acquisition the sidecar values used (BIDS keys)
     * @param s the settings
     * @param outDir the derivatives root
     * @param progress receives voxels done
     * @return the files written
     */
    public static List<Path> run(Path root, MeseCollection c, ProtocolText protocol, Map<String, Object> acquisition,
            Settings s, Path outDir, ProgressReporter progress) {
        for (Path f : plannedFiles(c, s)) {
            AtomicFiles.checkWritable(outDir.resolve(f), s.force());
        }
        Optional<Path> maskFile = s.mask().map(m -> BidsImages.require(m, BidsImages.MASK, root, c));
        Optional<NiftiImage> mask = maskFile.map(Nifti::read);
        Optional<NiftiImage> b1 = b1Map(c, s);
        List<String> sources = new ArrayList<>();
        List<Path> inputs = new ArrayList<>(c.echoFiles());
        for (Path e : c.echoFiles()) {
            sources.add(bidsUri(root, e));
        }
        if (s.b1Override().isPresent()) {
            sources.add(s.b1Override().get().toAbsolutePath().toUri().toString());
            inputs.add(s.b1Override().get());
        } else if (c.b1Map().isPresent()) {
            sources.add(bidsUri(root, c.b1Map().get()));
            inputs.add(c.b1Map().get());
        }
        if (maskFile.isPresent()) {
            sources.add(bidsUri(root, maskFile.get()));
            inputs.add(maskFile.get());
        }
        Path dir = outDir.resolve(c.relativeDir());
        String p = c.prefix();
        List<Path> written = new ArrayList<>();
        Map<String, Object> provenance = Provenance.of(s.commandLine(), inputs, protocol.text());
        float fill = s.outsideMask();
        try (NiftiInput series = EchoStack.open(c.echoFiles(), c.label())) {
            Protocol parsed = protocol.parse();
            if (s.fit().isPresent()) {
                VolumeAnalysis a = VolumeAnalysis.fit(parsed, s.fit().get());
                VolumeMaps m = a.run(series, mask, b1, s.threads(), progress);
                Map<String, Object> side = sidecarBase(sources, acquisition, a,
                        "EPG fit of amplitude, T2 and B1 per voxel with stimulated echoes included",
                        "Lebel RM, Wilman AH. Transverse relaxometry with stimulated echo compensation. Magn Reson Med 2010;64:1005-1014");
                try (OutputSet set = OutputSet.openNamed(dir, p + "_fit", s.force(), inputs)) {
                    List<Path> files = new ArrayList<>();
                    files.addAll(map(dir, p + "_T2map", m, m.filled("t2_ms", fill), 0.001, "s", "T2 (s)", side, s.force()));
                    files.addAll(map(dir, p + "_M0map", m, m.filled("amplitude", fill), 1, "arbitrary", "M0 (signal units)",
                            side, s.force()));
                    if (m.mapNames().contains("b1_scale")) {
                        files.addAll(map(dir, p + "_desc-epgfit_TB1map", m, m.filled("b1_scale", fill), 100, "percent",
                                "flip-angle scale (percent)", side, s.force()));
                    }
                    files.addAll(status(dir, p + "_desc-fitstatus_dseg", m, side, s.force()));
                    files.add(summary(dir.resolve(p + "_desc-fit_summary.json"), m, c, provenance, s.force()));
                    set.commit();
                    written.addAll(files);
                }
            }
            if (s.spectrum().isPresent()) {
                VolumeAnalysis a = VolumeAnalysis.spectrum(parsed, s.spectrum().get().resolve(parsed));
                VolumeMaps m = a.run(series, mask, Optional.empty(), s.threads(), progress);
                Map<String, Object> side = sidecarBase(sources, acquisition, a,
                        "non-negative least-squares T2 spectrum on an EPG basis with refocusing-angle refinement; "
                                + "MWF = fraction of the first T2 window",
                        "Prasloski T, Maedler B, Xiang QS, MacKay A, Laule C. Applications of stimulated echo correction "
                                + "to multicomponent T2 analysis. Magn Reson Med 2012;67:1803-1814");
                String fraction = m.mapNames().stream().filter(n -> n.startsWith("fraction_")).findFirst().orElseThrow();
                try (OutputSet set = OutputSet.openNamed(dir, p + "_spectrum", s.force(), inputs)) {
                    List<Path> files = new ArrayList<>();
                    files.addAll(map(dir, p + "_MWFmap", m, m.filled(fraction, fill), 100, "percent",
                            "myelin water fraction (percent)", side, s.force()));
                    files.addAll(status(dir, p + "_desc-spectrumstatus_dseg", m, side, s.force()));
                    files.add(summary(dir.resolve(p + "_desc-spectrum_summary.json"), m, c, provenance, s.force()));
                    set.commit();
                    written.addAll(files);
                }
            }
        }
        return written;
    }

    private static String bidsUri(Path root, Path file) {
        Path abs = file.toAbsolutePath().normalize();
        Path r = root.toAbsolutePath().normalize();
        return abs.startsWith(r) ? "bids:raw:" + r.relativize(abs).toString().replace('\\', '/') : abs.toUri().toString();
    }

    private static Optional<NiftiImage> b1Map(MeseCollection c, Settings s) {
        if (s.b1Override().isPresent()) {
            return Optional.of(Nifti.read(s.b1Override().get()).times(s.b1OverrideFactor()));
        }
        if (c.b1Map().isEmpty()) {
            return Optional.empty();
        }
        Path f = c.b1Map().get();
        String units = c.b1Sidecar().path("Units").asText("percent").trim().toLowerCase(Locale.ROOT);
        double factor;
        switch (units) {
            case "percent":
            case "%":
                factor = 0.01;
                break;
            case "1":
            case "ratio":
            case "scale":
            case "fraction":
                factor = 1;
                break;
            default:
                throw new InputException(f + ": sidecar Units \"" + units + "\" of a TB1map must be percent (100 = nominal) "
                        + "or 1 (a flip-angle scale)");
        }
        NiftiImage img = Nifti.read(f);
        return Optional.of(NiftiImage.of(img.header(), img.values(), f.getFileName().toString()).times(factor));
    }

    private static Map<String, Object> sidecarBase(List<String> sources, Map<String, Object> acquisition,
            VolumeAnalysis a, String method, String reference) {
        Map<String, Object> side = new LinkedHashMap<>();
        side.put("Sources", sources);
        side.put("Method", method);
        side.put("MethodReference", reference);
        side.put("AcquisitionSettings", acquisition);
        side.put("AnalysisSettings", a.describe());
        return side;
    }

    private static List<Path> map(Path dir, String stem, VolumeMaps m, float[] values, double factor, String units,
            String description, Map<String, Object> base, boolean force) {
        float[] v = values.clone();
        for (int i = 0; i < v.length; i++) {
            v[i] = (float) (v[i] * factor);
        }
        NiftiHeader h = VolumeMaps.estimateHeader(m.mapHeader(), description.replaceAll(" \\(.*\\)", ""), units);
        Path img = dir.resolve(stem + ".nii.gz");
        Nifti.write(img, h, v, force);
        Map<String, Object> side = new LinkedHashMap<>();
        side.put("Units", units);
        side.put("Description", description);
        side.putAll(base);
        Path json = dir.resolve(stem + ".json");
        AtomicFiles.writeString(json, Json.write(side), force);
        return List.of(img, json);
    }

    private static List<Path> status(Path dir, String stem, VolumeMaps m, Map<String, Object> base, boolean force) {
        byte[] st = m.status();
        float[] v = new float[st.length];
        for (int i = 0; i < v.length; i++) {
            v[i] = st[i];
        }
        Path img = dir.resolve(stem + ".nii.gz");
        Nifti.write(img, VolumeMaps.statusHeader(m.mapHeader()), v, force);
        Map<String, Object> side = new LinkedHashMap<>();
        side.put("Description", "voxel status of the fit");
        Map<String, String> levels = new LinkedHashMap<>();
        for (org.echotrellis.io.VoxelStatus s : org.echotrellis.io.VoxelStatus.values()) {
            levels.put(Integer.toString(s.code()), s.label());
        }
        side.put("Levels", levels);
        side.putAll(base);
        Path json = dir.resolve(stem + ".json");
        AtomicFiles.writeString(json, Json.write(side), force);
        return List.of(img, json);
    }

    private static Path summary(Path file, VolumeMaps m, MeseCollection c, Map<String, Object> provenance, boolean force) {
        Map<String, Object> settings = new LinkedHashMap<>();
        settings.put("collection", c.prefix());
        settings.putAll(m.analysis().describe());
        settings.put("noise_sigma", Double.isNaN(m.noiseSigma()) ? null : m.noiseSigma());
        settings.put("provenance", provenance);
        RunSummary.write(file, m.result(), settings, force);
        return file;
    }
}
