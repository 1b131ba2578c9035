package org.echotrellis.cli;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.fit.spectrum.BasisCache;
import org.echotrellis.fit.spectrum.SpectrumChoices;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code spectrum}: multi-component T2 spectra of decay tables or multi-echo images. */
@Command(name = "spectrum", mixinStandardHelpOptions = true,
        description = {"Fit the distribution of T2 in each decay (NNLS on an EPG basis, Tikhonov regularisation, "
                + "refocusing-angle refinement) and report window fractions, e.g. the short-T2 (myelin) water fraction.",
            "Table input (.csv: echo time in ms, then one column per decay) prints spectra; with --out also writes "
                + "spectra.csv, spectra.json and spectrum.png/.svg.",
            "Image input (.nii/.nii.gz, 4-D x,y,z,echo) writes spectrum.nii.gz (one volume per T2 bin), maps, "
                + "status, PNG previews and summary.json into --out."},
        footer = {"", "Examples:",
            "  java -jar target/echotrellis.jar spectrum \\",
            "      sequences/brain-mwi-32-decays.csv \\",
            "      --protocol sequences/brain-mwi-32.yaml --format json",
            "  java -jar target/echotrellis.jar demo   # writes plots/phantom-*.nii.gz",
            "  java -jar target/echotrellis.jar spectrum plots/phantom-series.nii.gz \\",
            "      --protocol sequences/brain-mwi-32.yaml \\",
            "      --mask plots/phantom-mask.nii.gz --fraction-window-ms 10:40 --out mwf",
            "",
            "Defaults follow the protocol: T2 grid from the first echo time to",
            "4 x the last, 15 bins per decade; T1 of the protocol tissue; misfit",
            "regularisation letting the misfit grow by 1 + 1/(4 echoes); refocusing",
            "angle bracketed every 15 deg at most from 0.3 x nominal to 180 deg (1.4 x",
            "nominal with slice selection), then refined continuously; fraction window",
            "from the shortest grid T2 to 40 ms.",
            "", "Research tool, not a medical device."})
final class SpectrumCommand implements Callable<Integer> {
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

    @Parameters(index = "0", paramLabel = "DATA", description = "Decay table (.csv) or 4-D image (.nii, .nii.gz).")
    Path data;

    @Option(names = "--protocol", required = true, paramLabel = "FILE",
            description = "Protocol file of the acquisition (.yaml/.json); must be a CPMG train.")
    Path protocol;

    @Option(names = "--mask", paramLabel = "FILE", description = "3-D mask for image input (0 = skip).")
    Path mask;

    @Option(names = "--t2-min-ms", paramLabel = "MS", description = "Shortest T2 of the grid (default: the first echo time).")
    Double t2MinMs;

    @Option(names = "--t2-max-ms", paramLabel = "MS", description = "Longest T2 of the grid (default: 4 x last echo time).")
    Double t2MaxMs;

    @Option(names = "--t2-bins", paramLabel = "N", description = "Log-spaced grid points (default: 15 per decade).")
    Integer t2Bins;

    @Option(names = "--t1-ms", paramLabel = "MS", description = "Fixed T1 of the basis (default: the protocol tissue's T1).")
    Double t1Ms;

    @Option(names = "--regularisation", paramLabel = "METHOD", defaultValue = "misfit",
            description = "misfit (the misfit grows by --misfit-increase), cross-validation or none (default: ${DEFAULT-VALUE}).")
    String regularisation;

    @Option(names = "--misfit-increase", paramLabel = "FACTOR",
            description = "misfit target: regularised / unregularised misfit (default: 1 + 1/(4 echoes)).")
    Double misfitIncrease;

    @Option(names = "--refocus-search-deg", paramLabel = "LO:HI:COUNT",
            description = "Coarse refocusing angles bracketing the continuous search (default: from the protocol, see below).")
    String refocusSearch;

    @Option(names = "--refocus-deg", paramLabel = "DEG", description = "Use this refocusing angle instead of searching.")
    Double refocusDeg;

    @Option(names = "--b1-map", paramLabel = "FILE",
            description = "3-D B1 map (same grid, flip-angle scale) for image input: fixes each voxel's refocusing angle, no search.")
    Path b1Map;

    @Option(names = "--b1-map-units", paramLabel = "U", defaultValue = "scale",
            description = "Values of --b1-map: scale (1 = nominal) or percent (100 = nominal) (default: ${DEFAULT-VALUE}).")
    FitCommand.B1Units b1MapUnits;

    @Option(names = "--fraction-window-ms", paramLabel = "LO:HI",
            description = "T2 window whose fraction is reported (repeatable; default: shortest grid T2 to 40 ms).")
    List<String> windows = new ArrayList<>();

    @Option(names = "--out", paramLabel = "DIR", description = "Output directory (required for image input).")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads for images (default: all cores).")
    Integer threads;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    @Option(names = "--quiet", description = "No progress bar.")
    boolean quiet;

    @Option(names = "--outside-mask-value", paramLabel = "V", defaultValue = "nan",
            description = "Value of image maps outside the mask: nan or a number such as 0 (default: ${DEFAULT-VALUE}).")
    String outsideMask;

    @Option(names = "--format", paramLabel = "FMT", defaultValue = "table",
            description = "Table-input output on stdout: table, csv or json (default: ${DEFAULT-VALUE}).")
    Format format;

    /** Output formats for table input. */
    enum Format { table, csv, json }

    @Override
    public Integer call() throws Exception {
        Protocol p = ProtocolReader.read(protocol);
        CpmgTrain train = p.cpmg().orElseThrow(() -> new InputException("--protocol " + protocol
                + ": not a CPMG echo train (constant echo spacing, refocusing phase = excitation phase ± 90°); "
                + "spectrum fitting needs one"));
        SpectrumOptions options = options(p);
        report.begin(spec, force);
        String name = data.getFileName() == null ? "" : data.getFileName().toString().toLowerCase(Locale.ROOT);
        boolean image = name.endsWith(".nii") || name.endsWith(".nii.gz");
        Checks.require(image || name.endsWith(".csv"),
                "DATA " + data + ": expected a decay table (.csv) or an image (.nii, .nii.gz)");
        Checks.require(image || b1Map == null, "--b1-map applies to image input only; DATA " + data + " is a table");
        Checks.require(b1Map == null || refocusDeg == null, "--b1-map and --refocus-deg exclude each other; give one");
        refuseIgnored(image);
        VolumeAnalysis analysis = CliChecks.asOptions(() -> VolumeAnalysis.spectrum(p, options));
        BasisCache cache = analysis.basisCache().orElseThrow();
        Map<String, Object> settings = settings(p, analysis);
        if (image) {
            Checks.require(out != null, "--out DIR is required for image input");
            int n = threads == null ? Runtime.getRuntime().availableProcessors() : threads;
            Checks.inRange("--threads", n, 1, 1024, null);
            var res = SpectrumVolumes.run(data, mask, b1Map, b1MapUnits == FitCommand.B1Units.percent ? 0.01 : 1,
                    analysis, n, out, force,
                    CliChecks.outsideMaskValue(outsideMask), settings,
                    StderrProgressBar.onTerminal(spec.commandLine().getErr(), quiet), format == Format.json,
                    spec.commandLine().getOut(), java.util.Arrays.asList(data, mask, protocol, b1Map)).result();
            report.settings(settings);
            report.write("spectrum: " + data.getFileName(), force, r -> CommandReports.spectrumVolume(r, res, options));
        } else {
            Checks.require(mask == null, "--mask applies to image input only; DATA " + data + " is a table");
            var fits = SpectrumTables.run(data, p, cache, options, format.name(), out, force, settings,
                    spec.commandLine().getOut(), List.of(data, protocol));
            report.settings(settings);
            report.write("spectrum: " + data.getFileName(), force, r -> r.section("Spectra")
                    .chart(SpectrumTables.plot(fits, options, data.getFileName().toString()), 900, 560, "T2 spectra of the decays")
                    .preformatted("Table (as printed)", SpectrumTables.text(fits, options)));
        }
        return 0;
    }

    /** Options the chosen input or method would ignore are refused rather than silently dropped. */
    private void refuseIgnored(boolean image) {
        if (!image && threads != null) {
            throw new InputException("--threads " + threads + " applies to image input; the decay table " + data
                    + " is fitted on one thread");
        }
    }

    /**
     * @param p the protocol, source of the defaults
     * @return the fit options from the command line over the protocol's defaults (validated; errors name the option)
     */
    SpectrumOptions options(Protocol p) {
        SpectrumChoices c = CliChecks.spectrumChoices(t1Ms, windows, t2MinMs, t2MaxMs, t2Bins, regularisation,
                misfitIncrease, refocusSearch, refocusDeg);
        return CliChecks.asOptions(() -> c.resolve(p));
    }

    private Map<String, Object> settings(Protocol p, VolumeAnalysis analysis) {
        Map<String, Object> s = new LinkedHashMap<>();
        s.put("command", "spectrum");
        s.put("data", data.toString());
        s.put("protocol", protocol.toString());
        s.put("mask", mask == null ? null : mask.toString());
        s.putAll(analysis.describe());
        s.put("provenance", CliChecks.provenance(spec, protocol, data, mask, b1Map));
        s.put("t1_source", t1Ms != null ? "--t1-ms" : "protocol tissue");
        if (b1Map != null) {
            s.put("refocus", Map.of("from_b1_map", b1Map.toString(), "b1_map_units", b1MapUnits.name()));
        }
        return s;
    }
}
