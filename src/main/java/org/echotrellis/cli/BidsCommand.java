package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.Callable;

import org.echotrellis.InputException;
import org.echotrellis.fit.spectrum.SpectrumChoices;
import org.echotrellis.fit.volume.BidsDerivatives;
import org.echotrellis.fit.volume.FitOptions;
import org.echotrellis.io.bids.BidsLayout;
import org.echotrellis.io.bids.BidsProtocol;
import org.echotrellis.io.bids.MeseCollection;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolText;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code bids}: T2 maps of every multi-echo spin-echo collection of a BIDS dataset, as a BIDS derivatives dataset. */
@Command(name = "bids", mixinStandardHelpOptions = true,
        description = {"Fit every multi-echo spin-echo collection (sub-<L>/[ses-<S>/]anat/*_echo-<n>_MESE.nii[.gz] "
                + "with JSON sidecars) of a BIDS dataset and write a BIDS derivatives dataset: _T2map (seconds), "
                + "_M0map, _desc-epgfit_TB1map (percent), _MWFmap (percent, spectrum), status maps, a JSON sidecar "
                + "per map and a summary per collection.",
            "Echo times, repetition time and flip angles come from the sidecars (EchoTime, RepetitionTime, FlipAngle, "
                + "RefocusingFlipAngle); --protocol supplies the rest. A B1 map is taken from fmap/ (_TB1map, percent).",
            "Each collection's fit and spectrum outputs are written as one set each: they appear together when the "
                + "analysis has finished and replace the previous run's set together (--force)."},
        footer = {"", "Examples:",
            "  java -jar target/echotrellis.jar bids /data/study \\",
            "      /data/study/derivatives/echotrellis participant \\",
            "      --participant-label 01 02 --analysis both \\",
            "      --protocol sequences/brain-mwi-32.yaml --mask mask",
            "  java -jar target/echotrellis.jar bids study out participant \\",
            "      --refocusing-flip-deg 160",
            "",
            "A collection that fails is reported on stderr and the others go on; the exit code is 2",
            "when any collection failed.", "", "Research tool, not a medical device."})
final class BidsCommand implements Callable<Integer> {
    @Mixin
    CommonOptions common;

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "BIDS_DIR", description = "Root of the BIDS dataset.")
    Path bidsDir;

    @Parameters(index = "1", paramLabel = "OUTPUT_DIR", description = "Root of the derivatives dataset written.")
    Path outDir;

    @Parameters(index = "2", paramLabel = "participant", description = "Analysis level: participant.")
    String level;

    @Option(names = "--participant-label", arity = "1..*", paramLabel = "L", description = "Participants to process (default: all).")
    List<String> participants = new ArrayList<>();

    @Option(names = "--session-label", arity = "1..*", paramLabel = "S", description = "Sessions to process (default: all).")
    List<String> sessions = new ArrayList<>();

    @Mixin
    DatasetOptions analysis;

    @Option(names = "--refocusing-flip-deg", paramLabel = "DEG", description = "Refocusing flip when no sidecar has RefocusingFlipAngle.")
    Double refocusDeg;

    @Option(names = "--b1-map", paramLabel = "FILE", description = "B1 map for every collection instead of fmap/ (same grid).")
    Path b1Map;

    @Option(names = "--b1-map-units", paramLabel = "U", defaultValue = "percent",
            description = "Values of --b1-map: percent (100 = nominal) or scale (default: ${DEFAULT-VALUE}).")
    FitCommand.B1Units b1Units;

    @Mixin
    ReportOption report;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all cores).")
    Integer threads;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    @Option(names = "--quiet", description = "No progress bar.")
    boolean quiet;

    @Override
    public Integer call() {
        if (!level.equals("participant")) {
            throw new InputException("analysis level must be participant, got " + level);
        }
        if (Files.exists(outDir) && !Files.isDirectory(outDir)) {
            throw new InputException("OUTPUT_DIR " + outDir + " exists and is not a directory");
        }
        if (bidsDir.toAbsolutePath().normalize().equals(outDir.toAbsolutePath().normalize())) {
            throw new InputException("OUTPUT_DIR must differ from BIDS_DIR " + bidsDir + " (inputs are never modified)");
        }
        Optional<ProtocolText> text = analysis.protocolText();
        Optional<FitOptions> fit = analysis.fit();
        Optional<SpectrumChoices> spectrum = analysis.spectrum();
        int n = threads == null ? Runtime.getRuntime().availableProcessors() : CliChecks.threads(threads);
        List<MeseCollection> found = BidsLayout.find(bidsDir, participants, sessions);
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (found.isEmpty()) {
            throw new InputException(bidsDir + ": no *_echo-<n>_MESE.nii[.gz] files under sub-*/[ses-*/]anat/"
                    + (participants.isEmpty() ? "" : " for participants " + participants));
        }
        String command = CliChecks.commandLine(spec);
        BidsDerivatives.Settings settings = new BidsDerivatives.Settings(fit, spectrum, Optional.ofNullable(b1Map),
                b1Units == FitCommand.B1Units.percent ? 0.01 : 1, Optional.ofNullable(analysis.maskChoice()),
                analysis.outsideMaskValue(), n, force, command);
        report.begin(spec, force);
        BidsDerivatives.writeDescription(outDir, command, true);
        int failed = 0;
        List<List<Object>> rows = new java.util.ArrayList<>();
        for (MeseCollection c : found) {
            try {
                BidsProtocol.Resolved r = BidsProtocol.resolve(c, text,
                        refocusDeg == null ? OptionalDouble.empty() : OptionalDouble.of(refocusDeg), "--refocusing-flip-deg");
                Protocol p = r.protocol().parse();
                checkEventList(c, p, r);
                List<Path> files = BidsDerivatives.run(bidsDir, c, r.protocol(), r.acquisition(), settings, outDir,
                        new StderrProgressBar(err, quiet));
                out.printf(Locale.ROOT, "%s: %d files in %s%n", c.label(), files.size(), outDir.resolve(c.relativeDir()));
                rows.add(reportRow(c, p, files, "done"));
            } catch (InputException e) {
                failed++;
                String line = CliChecks.optionNames(CliChecks.forCommandLine(e.getMessage()), CliChecks.DATASET_KEYS)
                        .split("\\R")[0];
                err.println("echotrellis: " + c.label() + ": " + line);
                rows.add(java.util.Arrays.asList(c.label(), "-", "-", "-", "-", "-", "failed: " + line));
            }
            out.flush();
        }
        out.printf(Locale.ROOT, "bids: %d of %d collections done%s%n", found.size() - failed, found.size(),
                failed > 0 ? ", " + failed + " failed" : "");
        out.flush();
        err.flush();
        int done = found.size() - failed;
        report.settings(new java.util.LinkedHashMap<>(java.util.Map.of("analysis", analysis.analysis.name(),
                "collections", found.size())));
        String headline = done + " of " + found.size() + " collections done" + (failed > 0 ? ", " + failed + " failed" : "");
        report.write("bids: " + bidsDir.getFileName(), force, r -> r.section("Collections")
                .paragraph(headline + ". T2 statistics over the fitted voxels with a finite T2 in each collection's T2map "
                        + "(inside the mask when one is given; seconds in the file, shown here in ms).")
                .table("Collections and their T2 maps", List.of("collection", "echoes", "echo spacing (ms)",
                        "files", "voxels with T2", "median T2 (ms) [IQR]", "status"), rows));
        return failed > 0 ? 2 : 0;
    }

    /** One row of the report: the collection, its train, and the median T2 of the map it wrote. */
    private static List<Object> reportRow(MeseCollection c, Protocol p, List<Path> files, String outcome) {
        Object echoes = p.echoCount();
        Object esp = p.cpmg().map(t -> (Object) Tables.num(t.echoSpacingMs())).orElse("-");
        Object voxels = "-";
        Object median = "-";
        Path t2 = null;
        Path status = null;
        for (Path f : files) {
            String n = f.getFileName().toString();
            t2 = n.endsWith("_T2map.nii.gz") ? f : t2;
            status = n.endsWith("_desc-fitstatus_dseg.nii.gz") ? f : status;
        }
        if (t2 != null && status != null) {
            // fitted voxels only (inside the mask, whatever fill value lies outside), in ms
            org.echotrellis.io.RegionStatistics st = org.echotrellis.io.RegionStatistics.perRegion(
                    org.echotrellis.io.Nifti.read(t2).times(1000).floats(), org.echotrellis.io.Nifti.read(status).bytes(),
                    null, "").get(0);
            voxels = st.voxels();
            median = st.voxels() == 0 ? "-" : String.format(Locale.ROOT, "%.1f [%.1f–%.1f]", st.p50(), st.p25(), st.p75());
        }
        return java.util.Arrays.asList(c.label(), echoes, esp, files.size(), voxels, median, outcome);
    }

    /** An event-list protocol keeps its own timing: its echo times must be the sidecars'. */
    private static void checkEventList(MeseCollection c, Protocol p, BidsProtocol.Resolved r) {
        if (p.train().isPresent()) {
            return;
        }
        double[] te = p.echoTimesMs();
        @SuppressWarnings("unchecked")
        List<Double> side = (List<Double>) r.acquisition().get("EchoTime");
        boolean same = te.length == side.size();
        for (int i = 0; same && i < te.length; i++) {
            same = Math.abs(te[i] - side.get(i) * 1000) <= 1e-3 * te[i];
        }
        if (!same) {
            throw new InputException(c.label() + ": sidecar EchoTime " + side + " s differs from the echo times of "
                    + p.source() + " " + java.util.Arrays.toString(te) + " ms");
        }
    }
}
