package org.echotrellis.fit.volume;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;

import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.FitSettings;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.fit.spectrum.BasisCache;
import org.echotrellis.fit.spectrum.FractionWindow;
import org.echotrellis.fit.spectrum.RefocusSearch;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.io.BackgroundNoise;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.ProgressReporter;
import org.echotrellis.io.VolumeJob;
import org.echotrellis.io.VolumePipeline;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.sequence.Protocol;

/**
 * A volume analysis ready to run: the single-component T2 fit ({@link #fit}) or the multi-component
 * T2 spectrum ({@link #spectrum}) of a protocol, with everything that depends only on the protocol
 * and the settings built once (the fit's start dictionary, the spectrum's basis cache). Thread-safe
 * and reusable: {@link #run} may be called for many series, one after another or at once, each run
 * using its own per-thread kernels. A distributed job builds one instance per worker from a
 * {@link VolumeRequest}.
 *
 * <pre>{@code
 * VolumeAnalysis a = VolumeAnalysis.fit(ProtocolReader.read(protocolFile), FitOptions.DEFAULT);
 * VolumeMaps maps = a.run(series, Optional.of(mask), Optional.empty(), 4, ProgressReporter.NONE);
 * maps.write(outDir, Float.NaN, false);
 * }</pre>
 */
public final class VolumeAnalysis {
    /** What a volume analysis computes. */
    public enum Kind {
        /** Single-component T2 (and B1) fit per voxel: {@link org.echotrellis.fit.T2Fit}. */
        FIT,
        /** Multi-component T2 spectrum per voxel: {@link org.echotrellis.fit.spectrum.SpectrumFitter}. */
        SPECTRUM
    }

    private final Kind kind;
    private final Protocol protocol;
    private final CpmgTrain train;
    private final FitOptions fitOptions;
    private final FitSettings fitSettings;
    private final T2Fit.Factory fitFactory;
    private final SpectrumOptions spectrumOptions;
    private final BasisCache cache;

    private VolumeAnalysis(Kind kind, Protocol protocol, FitOptions fitOptions, SpectrumOptions spectrumOptions) {
        this.kind = kind;
        this.protocol = protocol;
        this.train = protocol.cpmg().orElseThrow(() -> new InputException(protocol.source()
                + ": not a CPMG echo train (constant echo spacing, refocusing phase = excitation phase ± 90°); "
                + (kind == Kind.FIT ? "T2 fitting" : "spectrum fitting") + " needs one"));
        this.fitOptions = fitOptions;
        this.spectrumOptions = spectrumOptions;
        if (kind == Kind.FIT) {
            fitSettings = fitOptions.settings(train);
            fitFactory = new T2Fit.Factory(fitSettings, fitOptions.model(), fitOptions.compareMono());
            cache = null;
        } else {
            fitSettings = null;
            fitFactory = null;
            cache = BasisCache.build(train, spectrumOptions.t1Ms(), spectrumOptions.grid(), spectrumOptions.search());
        }
    }

    /**
     * A single-component T2 fit of volumes acquired with a protocol.
     *
     * @param protocol the acquisition (must be a CPMG train)
     * @param options the fit settings
     * @return the analysis
     * @throws InputException if the protocol is not a CPMG train or the options do not suit it
     */
    public static VolumeAnalysis fit(Protocol protocol, FitOptions options) {
        return new VolumeAnalysis(Kind.FIT, protocol, options, null);
    }

    /**
     * A multi-component T2 spectrum of volumes acquired with a protocol.
     *
     * @param protocol the acquisition (must be a CPMG train)
     * @param options the spectrum settings
     * @return the analysis
     * @throws InputException if the protocol is not a CPMG train
     */
    public static VolumeAnalysis spectrum(Protocol protocol, SpectrumOptions options) {
        return new VolumeAnalysis(Kind.SPECTRUM, protocol, null, options);
    }

    /** @return what this analysis computes */
    public Kind kind() {
        return kind;
    }

    /** @return the protocol */
    public Protocol protocol() {
        return protocol;
    }

    /** @return the protocol's echo train */
    public CpmgTrain train() {
        return train;
    }

    /** @return the fit options ({@link Kind#FIT} only) */
    public Optional<FitOptions> fitOptions() {
        return Optional.ofNullable(fitOptions);
    }

    /** @return the fit settings built from the options and the protocol ({@link Kind#FIT} only) */
    public Optional<FitSettings> fitSettings() {
        return Optional.ofNullable(fitSettings);
    }

    /** @return the spectrum options ({@link Kind#SPECTRUM} only) */
    public Optional<SpectrumOptions> spectrumOptions() {
        return Optional.ofNullable(spectrumOptions);
    }

    /** @return the basis cache ({@link Kind#SPECTRUM} only; shared read-only by all runs) */
    public Optional<BasisCache> basisCache() {
        return Optional.ofNullable(cache);
    }

    /**
     * The names of the scalar maps a run writes as {@code NAME.nii.gz}, in order (the status map and
     * a spectrum's 4-D {@code spectrum.nii.gz} come besides).
     *
     * @return the names, e.g. {@code t2_ms}, {@code b1_scale} or {@code fraction_10_40ms}
     */
    public List<String> mapNames() {
        if (kind == Kind.SPECTRUM) {
            return SpectrumNames.scalars(spectrumOptions);
        }
        return fitFactory.outputs();
    }

    /**
     * The settings of this analysis as written to {@code summary.json} and to map sidecars
     * (snake_case keys; the caller adds its own, such as the input files).
     *
     * @return an ordered map of JSON-friendly values
     */
    public Map<String, Object> describe() {
        Map<String, Object> s = new LinkedHashMap<>();
        s.put("analysis", kind.name().toLowerCase(Locale.ROOT));
        s.put("protocol_name", protocol.name());
        s.put("echoes", train.echoes());
        s.put("echo_spacing_ms", train.echoSpacingMs());
        if (kind == Kind.FIT) {
            s.put("model", fitOptions.model().name().toLowerCase(Locale.ROOT));
            s.put("t1_ms", fitOptions.t1Ms());
            s.put("t2_bounds_ms", List.of(fitOptions.t2MinMs(), fitOptions.t2MaxMs()));
            s.put("b1_bounds", List.of(fitOptions.b1Min(), fitSettings.effectiveB1Max()));
            s.put("b1_folded", fitSettings.foldActive());
            s.put("slice_profile", fitSettings.profile().label());
            s.put("slice_positions", fitSettings.profile().positions());
            return s;
        }
        SpectrumOptions o = spectrumOptions;
        s.put("t2_min_ms", o.grid().minMs());
        s.put("t2_max_ms", o.grid().maxMs());
        s.put("t2_bins", o.grid().bins());
        s.put("t2_ms", o.grid().t2Ms());
        s.put("t1_ms", o.t1Ms());
        s.put("regularisation", o.regularisation().label());
        s.put("misfit_increase", o.misfitIncrease());
        RefocusSearch r = o.search();
        s.put("refocus", r.isFixed() ? Map.of("fixed_deg", r.loDeg())
                : Map.of("lo_deg", r.loDeg(), "hi_deg", r.hiDeg(), "count", r.count()));
        List<Map<String, Double>> ws = new ArrayList<>();
        for (FractionWindow w : o.windows()) {
            ws.add(Map.of("lo_ms", w.loMs(), "hi_ms", w.hiMs()));
        }
        s.put("fraction_windows", ws);
        return s;
    }

    /**
     * Runs the analysis over an opened series.
     *
     * @param job the series, optional mask and B1 map (B1 maps apply to {@link Kind#FIT} only), threads
     * @param progress receives voxels done
     * @return the maps
     * @throws InputException if the series' echo count differs from the protocol's, or the noise
     *         cannot be estimated from the background
     */
    public VolumeMaps run(VolumeJob job, ProgressReporter progress) {
        if (job.echoes() != train.echoes()) {
            throw new InputException(job.data().source() + ": " + job.echoes() + " echoes (volumes), but the protocol "
                    + protocol.source() + " has " + train.echoes());
        }
        if (kind == Kind.SPECTRUM) {
            VolumeResult r = VolumePipeline.run(job, new SpectrumKernel.Factory(cache, spectrumOptions), progress);
            return new VolumeMaps(this, r, Double.NaN);
        }
        T2Fit.Factory f = fitFactory;
        double sigma = fitSettings.noiseSigma();
        if (fitOptions.noiseFromBackground()) {
            sigma = BackgroundNoise.sigma(job);
            f = new T2Fit.Factory(fitSettings.withNoiseSigma(sigma), fitOptions.model(), fitOptions.compareMono());
        }
        return new VolumeMaps(this, VolumePipeline.run(job, f, progress), sigma);
    }

    /**
     * Opens the files, runs the analysis and closes them.
     *
     * @param series the 4-D echo series (x, y, z, echo)
     * @param mask optional 3-D mask on the same grid
     * @param b1Map optional 3-D B1 map (flip-angle scale) on the same grid
     * @param threads worker threads (1–1024)
     * @param progress receives voxels done
     * @return the maps
     */
    public VolumeMaps run(Path series, Optional<Path> mask, Optional<Path> b1Map, int threads, ProgressReporter progress) {
        Optional<NiftiImage> m = mask.map(Nifti::read);
        Optional<NiftiImage> b = b1Map.map(Nifti::read);
        try (NiftiInput in = Nifti.open(series)) {
            return run(in, m, b, threads, progress);
        }
    }

    /**
     * Runs the analysis over an opened series ({@link Nifti#open(Path)},
     * {@link Nifti#open(java.io.InputStream, String)} or
     * {@link Nifti#open(java.nio.channels.SeekableByteChannel, String)}); the caller closes it.
     *
     * @param series the open 4-D echo series
     * @param mask optional 3-D mask on the same grid
     * @param b1Map optional 3-D B1 map (flip-angle scale) on the same grid
     * @param threads worker threads (1–1024)
     * @param progress receives voxels done
     * @return the maps
     */
    public VolumeMaps run(NiftiInput series, Optional<NiftiImage> mask, Optional<NiftiImage> b1Map, int threads,
            ProgressReporter progress) {
        return run(new VolumeJob(series, mask, b1Map, threads, VolumeJob.DEFAULT_SLAB_VALUES), progress);
    }
}
