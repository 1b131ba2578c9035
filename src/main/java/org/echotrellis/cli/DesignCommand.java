package org.echotrellis.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;
import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.io.OutputSet;
import org.echotrellis.design.DesignJob;
import org.echotrellis.design.DesignProblem;
import org.echotrellis.design.DesignReport;
import org.echotrellis.design.EchoTarget;
import org.echotrellis.design.ExposureLimits;
import org.echotrellis.design.Objective;
import org.echotrellis.sequence.PulseShape;
import org.echotrellis.design.RfExposure;
import org.echotrellis.design.SarReference;
import org.echotrellis.design.Startup;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Json;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Tissue;
import org.echotrellis.sequence.TissuePresets;
import picocli.CommandLine;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code design}: refocusing schedules for a prescribed echo evolution or a budgeted objective. */
@Command(name = "design", mixinStandardHelpOptions = true,
        description = {"Design a refocusing-flip schedule for a CPMG echo train: echo by echo for a prescribed "
                + "echo evolution (--target), or the best smooth schedule for an objective within a relative-SAR "
                + "budget and a B1+rms limit (--objective). Writes the schedule as a protocol file that simulate, "
                + "pathways and fit read.",
            "RF figures are estimates for planning only: the scanner's own SAR monitor, local regulations and "
                + "the responsible MR physicist decide."},
        footer = {"", "Targets: constant:LEVEL, ramp:FIRST:LAST, decay:PSEUDO_T2_MS[:START], list:FILE",
            "Objectives: signal:ECHO, min:FROM:TO, contrast:ECHO:TISSUE_A[:TISSUE_B],",
            "  psf:ECHO:LINES[:TISSUE[:MIN_SIGNAL[:MAX_SIDELOBE]]] (value 1/FWHM),",
            "  cnr:ECHO:LINES:MAX_FWHM_PX:TISSUE_A[:TISSUE_B]",
            "", "Examples:",
            "  java -jar target/echotrellis.jar design \\",
            "      --protocol sequences/fse-variable-1p5t.yaml \\",
            "      --target constant:0.4 --out fse-design",
            "  java -jar target/echotrellis.jar design \\",
            "      --protocol sequences/brain-fse-80-3t.yaml \\",
            "      --objective min:20:80 --sar-budget 0.5 --tr-ms 4000 --slices 12",
            "", "Estimates only: the scanner's SAR monitor, local rules and the MR physicist decide."})
final class DesignCommand implements Callable<Integer> {
    @Mixin
    CommonOptions common;

    @Mixin
    PlotOptions plotOptions;

    @Spec
    CommandSpec spec;

    @Mixin
    ReportOption htmlReport;

    @Option(names = "--protocol", required = true, paramLabel = "FILE",
            description = "Protocol file with the echo train and design tissue (.yaml, .yml or .json).")
    Path protocol;

    @ArgGroup(exclusive = true, multiplicity = "1")
    Goal goal;

    /** Exactly one of --target and --objective. */
    static final class Goal {
        @Option(names = "--target", paramLabel = "SPEC", description = "Prescribed echo amplitudes (M0 = 1).")
        String target;

        @Option(names = "--objective", paramLabel = "SPEC", description = "Quantity to maximise within the limits.")
        String objective;
    }

    @Option(names = "--startup", paramLabel = "SPEC", defaultValue = "ramp:3",
            description = "Start-up for --target: none, alsop or ramp:N (default: ${DEFAULT-VALUE}).")
    String startup;

    @Option(names = "--min-flip-deg", paramLabel = "DEG", defaultValue = "10",
            description = "Lowest refocusing flip (default: ${DEFAULT-VALUE}).")
    double minFlipDeg;

    @Option(names = "--max-flip-deg", paramLabel = "DEG", defaultValue = "180",
            description = "Highest refocusing flip (default: ${DEFAULT-VALUE}).")
    double maxFlipDeg;

    @Option(names = "--sar-budget", paramLabel = "FRACTION", defaultValue = "1",
            description = "Relative SAR budget, fraction of the all-180° train in (0, 1] (default: ${DEFAULT-VALUE}).")
    double sarBudget;

    @Option(names = "--b1rms-limit-ut", paramLabel = "UT", description = "B1+rms limit in µT (needs --tr-ms).")
    Double b1rmsLimitUt;

    @Option(names = "--tr-ms", paramLabel = "MS", description = "Repetition time in ms, for B1+rms; overrides the protocol's repetition_ms.")
    Double trMs;

    @Option(names = "--slices", paramLabel = "N", defaultValue = "1",
            description = "Echo trains played per TR, e.g. slices (default: ${DEFAULT-VALUE}).")
    int slices;

    @Option(names = "--pulse", paramLabel = "SHAPE", defaultValue = "sinc:4",
            description = "Refocusing pulse: rect, sinc:TBW, gauss:TBW or file:PATH; overrides the protocol's "
                    + "refocusing pulse (default: the protocol's, else ${DEFAULT-VALUE}).")
    String pulse;

    @Option(names = "--pulse-ms", paramLabel = "MS", defaultValue = "2",
            description = "Refocusing pulse duration in ms; overrides the protocol's (default: the protocol's, else ${DEFAULT-VALUE}).")
    double pulseMs;

    @Option(names = "--excitation-pulse", paramLabel = "SHAPE", description = "Excitation pulse shape; overrides the protocol's (default: the protocol's, else --pulse).")
    String excitationPulse;

    @Option(names = "--excitation-pulse-ms", paramLabel = "MS", description = "Excitation pulse duration; overrides the protocol's (default: the protocol's, else --pulse-ms).")
    Double excitationPulseMs;

    @Option(names = "--knots", paramLabel = "K", defaultValue = "6",
            description = "Spline knots of the schedule for --objective, 2 to 32; fewer when the objective "
                    + "spans fewer echoes (default: ${DEFAULT-VALUE}).")
    int knots;

    @Option(names = "--max-evaluations", paramLabel = "N", defaultValue = "3000",
            description = "Objective evaluations per optimiser start (default: ${DEFAULT-VALUE}).")
    int maxEvaluations;

    @Option(names = "--design-tissue", paramLabel = "PRESET", description = "Design for this tissue preset instead of the file's.")
    String designTissue;

    @Option(names = "--compare-tissue", paramLabel = "PRESET",
            description = "Tissue preset to predict as well (repeatable; default: two or three brain and muscle tissues).")
    List<String> compareTissues = new ArrayList<>();

    @Option(names = "--reference-sar-w-per-kg", paramLabel = "W_PER_KG",
            description = "Scanner-reported SAR of a reference protocol, to scale an absolute estimate (needs --tr-ms).")
    Double referenceSar;

    @Option(names = "--reference-protocol", paramLabel = "FILE",
            description = "Reference protocol for the SAR scaling (default: --protocol as written).")
    Path referenceProtocol;

    @Option(names = "--reference-tr-ms", paramLabel = "MS", description = "TR of the reference (default: --tr-ms).")
    Double referenceTrMs;

    @Option(names = "--reference-slices", paramLabel = "N", description = "Trains per TR of the reference (default: --slices).")
    Integer referenceSlices;

    @Option(names = "--out", paramLabel = "DIR", description = "Write schedule.yaml, design.json and plots here.")
    Path out;

    @Option(names = "--name", paramLabel = "NAME", description = "Name of the written protocol (default: PROTOCOL-designed).")
    String name;

    @Option(names = "--format", paramLabel = "FMT", defaultValue = "table",
            description = "Standard output: table or json (default: ${DEFAULT-VALUE}).")
    Format format;

    @Option(names = "--keep-over-limits",
            description = "Report and write a schedule that exceeds the SAR budget or B1+rms limit (otherwise exit 2 "
                    + "naming the largest target factor reachable within them).")
    boolean keepOverLimits;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    @Option(names = "--quiet", description = "No progress messages.")
    boolean quiet;

    /** Output formats. */
    enum Format { table, json }

    /** Library keys of the design settings, each given by the option of the same name. */
    private static final String[] KEYS = {"objective", "target", "startup", "knots", "slices", "min_flip_deg",
        "max_flip_deg", "sar_budget", "b1rms_limit_ut", "tr_ms", "pulse_ms", "excitation_pulse_ms", "max_evaluations",
        "reference_sar_w_per_kg"};

    @Override
    public Integer call() {
        Protocol p = ProtocolReader.read(protocol);
        CpmgTrain train = p.cpmg().orElseThrow(() -> new InputException(protocol
                + ": design needs a CPMG echo train (train: shorthand or CPMG-phased event list)"));
        Tissue tissue = designTissue == null ? p.tissue() : TissuePresets.get(designTissue);
        if (designTissue == null && ProtocolReader.tissueAssumed(p)) {
            spec.commandLine().getErr().println("note: " + protocol + " has no tissue section; designing for T1 "
                    + Tables.num(tissue.t1Ms()) + " ms, T2 " + Tables.num(tissue.t2Ms()) + " ms (add tissue: or give --design-tissue)");
        }
        String tissueName = tissue.name() == null || tissue.name().isEmpty() ? "design tissue" : tissue.name();
        DesignProblem problem = CliChecks.asOptions(() -> new DesignProblem(tissueName, train.echoes(),
                train.echoSpacingMs(), train.excitationFlipDeg(), tissue.t1Ms(), tissue.t2Ms(), p.b1Scale(), minFlipDeg,
                maxFlipDeg), KEYS);
        checkTiming(train);
        ExposureLimits limits = CliChecks.asOptions(() -> new ExposureLimits(sarBudget,
                b1rmsLimitUt == null ? Double.POSITIVE_INFINITY : Checks.positive("--b1rms-limit-ut", b1rmsLimitUt, null)),
                KEYS);
        RfExposure rf = rf(p);
        SarReference reference = reference(p, train, rf);
        List<Tissue> compare = compareTissues(tissueName);
        htmlReport.begin(spec, force);
        try (OutputSet set = out == null ? null : DesignOutputs.open(out, force, inputs())) {
            return run(p, problem, limits, rf, reference, compare, set);
        }
    }

    /** Input files of this run, never written over. */
    private List<Path> inputs() {
        List<Path> in = new ArrayList<>(java.util.Arrays.asList(protocol, referenceProtocol));
        if (goal.target != null && goal.target.startsWith("list:")) {
            in.add(Path.of(goal.target.substring(5)));
        }
        for (String shape : java.util.Arrays.asList(pulse, excitationPulse)) {
            if (shape != null && !shape.contains(":")) {
                in.add(Path.of(shape));
            }
        }
        return in;
    }

    private int run(Protocol p, DesignProblem problem, ExposureLimits limits, RfExposure rf, SarReference reference,
            List<Tissue> compare, OutputSet set) {
        PrintWriter err = spec.commandLine().getErr();
        DesignReport report;
        if (goal.target != null) {
            EchoTarget target = CliChecks.asOptions(() -> EchoTarget.parse(goal.target), KEYS);
            Startup start = CliChecks.asOptions(() -> Startup.parse(startup), KEYS);
            report = CliChecks.asOptions(() -> DesignJob.prescribed(problem, target, start, rf, limits,
                    reference, compare, org.echotrellis.design.AcquiredEchoes.forProtocol(p)), KEYS);
        } else {
            Objective objective = CliChecks.asOptions(() -> Objective.parse(goal.objective, problem,
                    DesignCommand::presetTimes), KEYS);
            if (!quiet) {
                err.println("design: optimising " + knots + " spline knots for " + objective.spec() + " ...");
                err.flush();
            }
            report = CliChecks.asOptions(() -> DesignJob.optimised(problem, objective, rf, limits, reference, knots,
                    maxEvaluations, compare, org.echotrellis.design.AcquiredEchoes.forProtocol(p)), KEYS);
        }
        refuseOverLimits(report);
        PrintWriter o = spec.commandLine().getOut();
        java.util.Map<String, Object> json = CliChecks.withProvenance(report.toJson(), spec, protocol);
        o.print(format == Format.json ? Json.write(json) : DesignOutputs.table(report));
        o.flush();
        if (out != null) {
            String protocolName = name != null ? name : p.name() + "-designed";
            DesignOutputs.write(report, json, out, protocolName, force);
            set.commit();
            if (!quiet) {
                err.println("design: wrote " + out.resolve(DesignOutputs.SCHEDULE_FILE) + ", design.json and plots");
                err.flush();
            }
        }
        htmlReport.settings(CommandReports.acquisition(p));
        htmlReport.write("design: " + p.name(), force, r -> CommandReports.design(r, report));
        return 0;
    }

    /** A schedule over the limits is an error unless --keep-over-limits asks for it. */
    private void refuseOverLimits(DesignReport r) {
        if (r.exposure().withinLimits() || keepOverLimits) {
            return;
        }
        ExposureLimits l = r.exposure().limits();
        String limitsText = String.format(java.util.Locale.ROOT, "relative SAR %.4f (budget %s)%s",
                r.exposure().relativeSar(), DesignOutputs.g(l.sarBudget()), Double.isNaN(r.exposure().b1rmsUt()) ? ""
                        : String.format(java.util.Locale.ROOT, ", B1+rms %.3f µT (limit %s)", r.exposure().b1rmsUt(),
                        l.hasB1rmsLimit() ? DesignOutputs.g(l.b1rmsLimitUt()) + " µT" : "none"));
        String reachable = r.mode().equals("target")
                ? Double.isNaN(r.budgetScale()) ? "no scaled copy of the target down to 0.02 is reachable within them"
                : String.format(java.util.Locale.ROOT, "the largest factor of the target reachable within them is %.4f",
                        r.budgetScale())
                : "no schedule in the flip bounds meets them";
        throw new InputException("design " + r.mode() + " " + r.spec() + ": the schedule exceeds the limits, "
                + limitsText + "; " + reachable + " (give --keep-over-limits to report and write it anyway)");
    }

    /** TR must hold the trains played in it; the knot count follows one stated rule. */
    private void checkTiming(CpmgTrain train) {
        double trainMs = train.echoes() * train.echoSpacingMs();
        if (trMs != null && Double.isFinite(trMs) && trMs < slices * trainMs) {
            throw new InputException(String.format(java.util.Locale.ROOT, "--tr-ms %s is shorter than the %s ms of echo "
                    + "trains it must hold (%d slice(s) x %d echoes x %s ms echo spacing); give a TR of at least %s ms",
                    Tables.num(trMs), Tables.num(slices * trainMs), slices, train.echoes(),
                    Tables.num(train.echoSpacingMs()), Tables.num(slices * trainMs)));
        }
        if (goal.objective != null) {
            Checks.inRange("--knots", knots, 2, 32, "fewer are used when the objective spans fewer echoes");
        } else if (spec.commandLine().getParseResult().hasMatchedOption("--knots")) {
            throw new InputException("--knots shapes the --objective schedule; --target prescribes every echo");
        }
    }

    /**
     * Pulse shapes, durations and TR for the RF exposure: an option given on the command line wins; else
     * the protocol's {@code pulse} and {@code repetition_ms}; else the option defaults.
     */
    private RfExposure rf(Protocol p) {
        CommandLine.ParseResult parsed = spec.commandLine().getParseResult();
        var acq = p.acquisition();
        PulseShape refocus = !parsed.hasMatchedOption("--pulse") && acq.refocusingPulse().isPresent()
                ? acq.refocusingPulse().get().envelope() : PulseShape.parse(pulse, "--pulse");
        double refMs = !parsed.hasMatchedOption("--pulse-ms") && acq.refocusingPulse().isPresent()
                ? acq.refocusingPulse().get().durationMs() : pulseMs;
        PulseShape exc;
        if (excitationPulse != null) {
            exc = PulseShape.parse(excitationPulse, "--excitation-pulse");
        } else if (acq.excitationPulse().isPresent()) {
            exc = acq.excitationPulse().get().envelope();
        } else {
            exc = refocus;
        }
        double excMs = excitationPulseMs != null ? excitationPulseMs
                : acq.excitationPulse().isPresent() ? acq.excitationPulse().get().durationMs() : refMs;
        double tr = trMs != null ? trMs : acq.hasRepetition() ? acq.repetitionMs() : Double.NaN;
        PulseShape e = exc;
        return CliChecks.asOptions(() -> new RfExposure(refocus, refMs, e, excMs, tr, slices), KEYS);
    }

    private SarReference reference(Protocol p, CpmgTrain train, RfExposure rf) {
        if (referenceSar == null) {
            Checks.require(referenceProtocol == null && referenceTrMs == null && referenceSlices == null,
                    "--reference-protocol, --reference-tr-ms and --reference-slices need --reference-sar-w-per-kg");
            return null;
        }
        Checks.require(rf.hasTr(), "--reference-sar-w-per-kg needs --tr-ms (or repetition_ms in the protocol)");
        CpmgTrain ref = train;
        if (referenceProtocol != null) {
            ref = ProtocolReader.read(referenceProtocol).cpmg().orElseThrow(() -> new InputException(referenceProtocol
                    + ": the reference protocol must be a CPMG echo train"));
        }
        RfExposure refRf = rf.withTiming(referenceTrMs == null ? rf.trMs() : referenceTrMs,
                referenceSlices == null ? slices : referenceSlices);
        double power = refRf.powerUt2(ref.excitationFlipDeg(), ref.refocusFlipsDeg());
        return CliChecks.asOptions(() -> new SarReference(referenceSar, power), KEYS);
    }

    private List<Tissue> compareTissues(String designName) {
        List<Tissue> list = new ArrayList<>();
        if (!compareTissues.isEmpty()) {
            for (String n : compareTissues) {
                list.add(TissuePresets.get(n));
            }
            return list;
        }
        String field = designName.endsWith("_1p5t") ? "_1p5t" : "_3t";
        for (String base : new String[] {"white_matter", "grey_matter", "skeletal_muscle", "blood"}) {
            String n = base + field;
            if (!n.equals(designName) && TissuePresets.names().contains(n) && list.size() < 3) {
                list.add(TissuePresets.get(n));
            }
        }
        return list;
    }

    private static double[] presetTimes(String name) {
        Tissue t = TissuePresets.get(name);
        return new double[] {t.t1Ms(), t.t2Ms()};
    }
}
