package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;

import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.FitModel;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.fit.volume.FitOptions;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code fit}: stimulated-echo-corrected T2 (and B1) from decay tables or NIfTI volumes. */
@Command(name = "fit", mixinStandardHelpOptions = true,
        description = {"Fit T2 and B1 to multi-echo spin-echo decays with the protocol's EPG echo model "
                + "(stimulated echoes included), or with a mono-exponential for comparison.",
            "DATA is a CSV decay table (first column echo time in ms, one decay per further column) "
                + "or a 4-D NIfTI-1 series (.nii/.nii.gz, x, y, z, echo)."},
        footer = {"", "Examples:",
            "  java -jar target/echotrellis.jar fit sequences/brain-mwi-32-decays.csv \\",
            "      --protocol sequences/brain-mwi-32.yaml --format json",
            "  java -jar target/echotrellis.jar demo   # writes plots/phantom-*.nii.gz",
            "  java -jar target/echotrellis.jar fit plots/phantom-series.nii.gz \\",
            "      --protocol sequences/brain-mwi-32.yaml \\",
            "      --mask plots/phantom-mask.nii.gz --out t2maps --compare-mono",
            "  java -jar target/echotrellis.jar fit plots/phantom-series.nii.gz \\",
            "      --protocol sequences/brain-mwi-32.yaml \\",
            "      --mask plots/phantom-mask.nii.gz --out t2maps-noise --noise-sigma auto",
            "",
            "The acquisition (pulse shapes, slice selection, repetition time, crushers,",
            "diffusion) is read from the protocol; T1 is the protocol tissue's unless",
            "--t1-ms is given.",
            "",
            "Volumes: t2_ms, t2_se_ms, b1_scale, b1_se, amplitude, residual_rms, status",
            "(and mono_t2_ms) as .nii.gz maps, PNG and SVG previews and summary.json",
            "in --out.",
            "Status: 0 outside mask, 1 ok, 2 hit bound, 3 low signal, 4 invalid input,",
            "5 not converged.",
            "B1 is reported folded (refocusing angle <= 180 deg) for constant trains",
            "without slice selection: B1 = 1 + x and 1 - x give the same magnitude",
            "train. b1_se is '-' (null) where the data do not determine B1."})
final class FitCommand implements Callable<Integer> {
    @Mixin
    CommonOptions common;

    @Mixin
    PlotOptions plotOptions;

    @Mixin
    MapOptions mapOptions;

    @Spec
    CommandSpec spec;

    @Mixin
    ReportOption report;

    @Parameters(index = "0", paramLabel = "DATA", description = "CSV decay table or NIfTI-1 series (.nii, .nii.gz).")
    Path data;

    @Option(names = "--protocol", required = true, paramLabel = "FILE", description = "Protocol file of the acquisition (.yaml/.json).")
    Path protocol;

    @Option(names = "--model", paramLabel = "MODEL", defaultValue = "epg", description = "epg or mono (default: ${DEFAULT-VALUE}).")
    FitModel model;

    @Option(names = "--mask", paramLabel = "FILE", description = "3-D NIfTI mask: voxels with value 0 are skipped.")
    Path mask;

    @Option(names = "--b1-map", paramLabel = "FILE", description = "3-D NIfTI B1 map (flip-angle scale): B1 is fixed per voxel.")
    Path b1Map;

    @Option(names = "--b1-map-units", paramLabel = "U", defaultValue = "scale",
            description = "Values of --b1-map: scale (1 = nominal) or percent (100 = nominal) (default: ${DEFAULT-VALUE}).")
    B1Units b1MapUnits;

    @Option(names = "--outside-mask-value", paramLabel = "V", defaultValue = "nan",
            description = "Value of the maps outside the mask: nan or a number such as 0 (default: ${DEFAULT-VALUE}).")
    String outsideMask;

    @Option(names = "--noise-sigma", paramLabel = "S",
            description = "Channel noise sigma (signal units) for the Rician mean model, or 'auto' (volumes: from outside the mask).")
    String noiseSigma;

    @Option(names = "--t1-ms", paramLabel = "MS", description = "Fixed T1 in ms (default: the protocol tissue's T1).")
    Double t1Ms;

    @Option(names = "--t2-min-ms", paramLabel = "MS", defaultValue = "1", description = "Lower T2 bound (default: ${DEFAULT-VALUE}).")
    double t2MinMs;

    @Option(names = "--t2-max-ms", paramLabel = "MS", defaultValue = "5000", description = "Upper T2 bound (default: ${DEFAULT-VALUE}).")
    double t2MaxMs;

    @Option(names = "--b1-min", paramLabel = "SCALE", defaultValue = "0.3", description = "Lower B1 bound (default: ${DEFAULT-VALUE}).")
    double b1Min;

    @Option(names = "--b1-max", paramLabel = "SCALE", defaultValue = "1.7", description = "Upper B1 bound before folding (default: ${DEFAULT-VALUE}).")
    double b1Max;

    @Option(names = "--mono-offset", description = "Fit a constant offset in the mono-exponential model.")
    boolean monoOffset;

    @Option(names = "--mono-skip-first", description = "Drop the first echo in the mono-exponential model.")
    boolean monoSkipFirst;

    @Option(names = "--compare-mono", description = "Also fit the mono-exponential model (map mono_t2_ms).")
    boolean compareMono;

    @Option(names = "--format", paramLabel = "FMT", defaultValue = "table", description = "Stdout: table or json; for NIfTI input json prints the run summary (default: ${DEFAULT-VALUE}).")
    Format format;

    @Option(names = "--out", paramLabel = "DIR", defaultValue = "t2-fit", description = "Output directory (default: ${DEFAULT-VALUE}).")
    Path out;

    @Option(names = "--plot", paramLabel = "PATH",
            description = "Decay tables: plot a sample of the decays with their fits and a summary (.png or .svg).")
    Path plot;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads for volumes (default: all cores).")
    Integer threads;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    @Option(names = "--quiet", description = "No progress bar.")
    boolean quiet;

    /** Units of a B1 map file. */
    enum B1Units { scale, percent }

    /** Stdout formats for decay tables. */
    enum Format { table, json }

    @Override
    public Integer call() {
        report.begin(spec, force);
        Protocol p = ProtocolReader.read(protocol);
        CpmgTrain train = p.cpmg().orElseThrow(() -> new InputException("--protocol " + protocol
                + ": fit needs a CPMG train (constant echo spacing, refocusing phase = excitation phase ± 90°)"));
        double t1 = t1Ms != null ? CliChecks.positiveOrInf("--t1-ms", t1Ms) : Double.NaN;
        FitOptions options = CliChecks.asOptions(() -> new FitOptions(model, t1, t2MinMs, t2MaxMs, b1Min, b1Max, true,
                Double.NaN, false, monoOffset, monoSkipFirst, compareMono));
        String name = data.getFileName().toString().toLowerCase(Locale.ROOT);
        boolean volume = name.endsWith(".nii") || name.endsWith(".nii.gz");
        PrintWriter o = spec.commandLine().getOut();
        refuseIgnored(volume);
        if (!volume) {
            if (mask != null || b1Map != null) {
                throw new InputException("--mask and --b1-map apply to NIfTI volumes, not to the decay table " + data);
            }
            double sigma = tableSigma();
            FitOptions tableOptions = options;
            T2Fit.Factory f = new T2Fit.Factory(CliChecks.asOptions(() -> tableOptions.settings(p)).withNoiseSigma(sigma),
                    model, true);
            new FitTableRun(f, p, tablePlots(), force, List.of(data, protocol)).run(data, format == Format.json, o,
                    CliChecks.optionNames(options.t1Source(), "t1_ms"), CliChecks.provenance(spec, protocol, data), report);
            return 0;
        }
        int n = threads == null ? Runtime.getRuntime().availableProcessors() : CliChecks.threads(threads);
        if (noiseSigma != null) {
            options = noiseSigma.equals("auto") ? options.withNoise(Double.NaN, true)
                    : options.withNoise(parseSigma(noiseSigma), false);
        }
        FitOptions fitOptions = options;
        VolumeAnalysis analysis = CliChecks.asOptions(() -> VolumeAnalysis.fit(p, fitOptions));
        Map<String, Object> info = new LinkedHashMap<>();
        info.put("data", data.toString());
        info.put("protocol", p.name());
        info.putAll(analysis.describe());
        info.computeIfPresent("t1_source", (k, v) -> CliChecks.optionNames(v.toString(), "t1_ms"));
        info.put("b1_map", b1Map == null ? null : b1Map.toString());
        info.put("b1_map_units", b1MapUnits.name());
        info.put("mask", mask == null ? null : mask.toString());
        info.put("threads", n);
        info.put("provenance", CliChecks.provenance(spec, protocol, data, mask, b1Map));
        new FitVolumeRun(analysis, out, force, quiet, CliChecks.outsideMaskValue(outsideMask), protocol)
                .run(data, mask, b1Map, b1MapUnits, n, info, format == Format.json, o, spec.commandLine().getErr(), report);
        return 0;
    }

    /** Options the chosen input or model would ignore are refused rather than silently dropped. */
    private void refuseIgnored(boolean volume) {
        if (!volume && threads != null) {
            throw new InputException("--threads " + threads + " applies to NIfTI volumes; the decay table " + data
                    + " is fitted on one thread");
        }
        if (volume && plot != null) {
            throw new InputException("--plot " + plot + " applies to decay tables; volumes write PNG previews into --out");
        }
        boolean monoFitted = model == FitModel.MONO || compareMono || !volume;
        for (String option : new String[] {"--mono-offset", "--mono-skip-first"}) {
            if (!monoFitted && spec.commandLine().getParseResult().hasMatchedOption(option)) {
                throw new InputException(option + " changes the mono-exponential fit, which --model epg does not run "
                        + "on volumes; add --compare-mono or use --model mono");
            }
        }
    }

    /** Plots of a decay table: --plot FILE, or NAME-fit.png/.svg in an --out given explicitly; else none. */
    private List<Path> tablePlots() {
        List<Path> files = new ArrayList<>();
        if (plot != null) {
            files.add(plot);
        }
        if (spec.commandLine().getParseResult().hasMatchedOption("--out")) {
            String stem = data.getFileName().toString().replaceAll("\\.[^.]*$", "");
            files.add(out.resolve(stem + "-fit.png"));
            files.add(out.resolve(stem + "-fit.svg"));
        }
        return files;
    }

    /** Parses --noise-sigma for tables (no 'auto'). */
    private double tableSigma() {
        if (noiseSigma == null) {
            return Double.NaN;
        }
        if (noiseSigma.equals("auto")) {
            throw new InputException("--noise-sigma auto needs a NIfTI volume with --mask; give a number for decay tables");
        }
        return parseSigma(noiseSigma);
    }

    /**
     * @param text option value
     * @return σ &gt; 0
     */
    static double parseSigma(String text) {
        try {
            double v = Double.parseDouble(text);
            if (!(v > 0) || !Double.isFinite(v)) {
                throw new NumberFormatException();
            }
            return v;
        } catch (NumberFormatException e) {
            throw new InputException("--noise-sigma must be a number > 0 or 'auto', got " + text);
        }
    }
}
