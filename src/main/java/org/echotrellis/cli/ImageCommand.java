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
import org.echotrellis.image.FseImaging;
import org.echotrellis.image.ImageReport;
import org.echotrellis.image.KSpaceOrdering;
import org.echotrellis.image.Phantom;
import org.echotrellis.image.PhantomImager;
import org.echotrellis.image.PhantomImages;
import org.echotrellis.io.AtomicFiles;
import org.echotrellis.io.Json;
import org.echotrellis.io.LabelImage;
import org.echotrellis.io.OutputSet;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Tissue;
import org.jfree.chart.JFreeChart;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code image}: effective TE, point-spread function, contrast and a phantom image of a fast spin echo. */
@Command(name = "image", mixinStandardHelpOptions = true,
        description = {"From echo train to image: lay the protocol's echoes across k-space (segmented fast spin echo, "
                + "L phase-encoding lines, S = L / echoes shots) and report per tissue the effective TE, the k-space "
                + "weights, the point-spread function (FWHM, peak, largest side lobe) and per tissue pair the "
                + "contrast and CNR; plot the weights, the PSFs and a simulated phantom image next to the ideal one.",
            "One phase-encoding direction; no motion, no T2* or off-resonance during the read-out."},
        footer = {"", "Tissues: a preset name, or NAME:T1_MS:T2_MS (default: the protocol's tissue).",
            "Phantom: builtin (discs of 5 sizes, one row per tissue after the first, on",
            "the first tissue), or a label image (.png grey values, or a .nii/.nii.gz",
            "slice) with --label VALUE=TISSUE for each label that has signal.",
            "", "Examples:",
            "  java -jar target/echotrellis.jar image sequences/brain-fse-t2-3t.yaml \\",
            "      --phase-lines 256 --center-echo 8 --tissue white_matter_3t \\",
            "      --tissue csf:4300:1900 --noise-sd 0.01 --plot brain.png",
            "  java -jar target/echotrellis.jar image sequences/knee-t2-16.yaml \\",
            "      --phase-lines 128 --ordering centric --format json",
            "  java -jar target/echotrellis.jar image sequences/brain-fse-t2-3t.yaml \\",
            "      --phase-lines 192 --tissue white_matter_3t --tissue grey_matter_3t \\",
            "      --phantom labels.png --label 1=white_matter_3t \\",
            "      --label 2=grey_matter_3t --out brain-image"})
final class ImageCommand implements Callable<Integer> {
    /** Files written into --out. */
    static final String JSON_FILE = "image.json";

    @Mixin
    CommonOptions common;

    @Mixin
    PlotOptions plotOptions;

    @Spec
    CommandSpec spec;

    @Mixin
    ReportOption htmlReport;

    @Mixin
    ProtocolInput input;

    @Option(names = "--phase-lines", required = true, paramLabel = "L",
            description = "Phase-encoding lines, a multiple of the echoes per train (1 to 4096).")
    int phaseLines;

    @Option(names = "--ordering", paramLabel = "ORDER", defaultValue = "linear",
            description = "k-space ordering: linear or centric (default: ${DEFAULT-VALUE}).")
    Ordering ordering;

    @Option(names = "--center-echo", paramLabel = "C",
            description = "Linear ordering rotated so that echo C (1-based) acquires k = 0 (sets the effective TE).")
    Integer centerEcho;

    @Option(names = "--tissue", paramLabel = "TISSUE",
            description = "Tissue to image (repeatable): a preset or NAME:T1_MS:T2_MS (default: the protocol's tissue).")
    List<String> tissues = new ArrayList<>();

    @Option(names = "--noise-sd", paramLabel = "X",
            description = "Noise standard deviation per pixel (M0 = 1): gives the CNR and noise in the phantom image.")
    Double noiseSd;

    @Option(names = "--phantom", paramLabel = "builtin|FILE", defaultValue = "builtin",
            description = "Phantom for the image plot: builtin, or a label image (.png, .nii, .nii.gz) (default: ${DEFAULT-VALUE}).")
    String phantom;

    @Option(names = "--label", paramLabel = "VALUE=TISSUE",
            description = "Tissue of a label value of the --phantom FILE (repeatable); other labels give no signal.")
    List<String> labels = new ArrayList<>();

    @Option(names = "--phantom-slice", paramLabel = "Z", description = "z-slice of a NIfTI label image (default: the middle).")
    Integer phantomSlice;

    @Option(names = "--seed", paramLabel = "N", defaultValue = "1",
            description = "Seed of the phantom image noise (default: ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--format", paramLabel = "FMT", defaultValue = "table",
            description = "Standard output: table or json (default: ${DEFAULT-VALUE}).")
    Format format;

    @Option(names = "--plot", paramLabel = "PATH",
            description = "Write the plots as PATH-weights, PATH-psf and PATH-phantom (.png or .svg, from PATH's extension).")
    Path plot;

    @Option(names = "--out", paramLabel = "DIR", description = "Write image.json and the plots (PNG and SVG) into DIR.")
    Path out;

    @Option(names = "--force", description = "Overwrite existing output files.")
    boolean force;

    /** Orderings. */
    enum Ordering { linear, centric }

    /** Output formats. */
    enum Format { table, json }

    @Override
    public Integer call() {
        boolean builtin = "builtin".equals(phantom);
        boolean figures = plot != null || out != null;
        if (!builtin && labels.isEmpty()) {
            throw new InputException("--phantom " + phantom + " needs --label VALUE=TISSUE for the labels that have signal");
        }
        if (builtin && (!labels.isEmpty() || phantomSlice != null)) {
            throw new InputException((labels.isEmpty() ? "--phantom-slice" : "--label")
                    + " applies to a --phantom FILE label image, not to the built-in phantom");
        }
        for (String option : List.of("--phantom", "--seed")) {
            if (!figures && spec.commandLine().getParseResult().hasMatchedOption(option)) {
                throw new InputException(option + " is for the phantom image; give --plot PATH or --out DIR too");
            }
        }
        List<Path> targets = targets();
        htmlReport.begin(spec, force);
        try (OutputSet set = out == null ? null : openSet(builtin)) {
            run(builtin, figures, targets);
            if (set != null) {
                set.commit();
            }
        }
        return 0;
    }

    /** Opens the --out set and checks every file name before any work. */
    private OutputSet openSet(boolean builtin) {
        OutputSet set = CliChecks.outputSet(out, force, java.util.Arrays.asList(input.file, builtin ? null : Path.of(phantom)));
        try {
            List<String> names = new ArrayList<>(List.of(JSON_FILE));
            for (String c : ImageOutputs.CHARTS) {
                names.add(c + ".png");
                names.add(c + ".svg");
            }
            set.plan(names);
        } catch (RuntimeException e) {
            set.close();
            throw e;
        }
        return set;
    }

    private void run(boolean builtin, boolean figures, List<Path> targets) {
        Protocol p = input.load();
        List<Tissue> ts = tissues(p);
        KSpaceOrdering o = ordering(p.echoCount());
        Map<Integer, String> mapping = mapping(ts);
        LabelImage labelImage = builtin || !figures ? null
                : CliChecks.asOptions(() -> LabelImage.read(Path.of(phantom), phantomSlice), "phantom", "phantom_slice");
        ImageReport report = CliChecks.asOptions(() -> FseImaging.analyse(p, o, ts, noiseSd == null ? Double.NaN : noiseSd),
                "noise_sd");
        PrintWriter w = spec.commandLine().getOut();
        Map<String, Object> json = new LinkedHashMap<>(ImageOutputs.json(report));
        json.put("provenance", CliChecks.provenance(spec, input.file, builtin || !figures ? null : Path.of(phantom)));
        w.print(format == Format.json ? Json.write(json) : ImageOutputs.table(report, p.name()));
        w.flush();
        if (figures) {
            Phantom ph = labelImage == null ? Phantom.builtin(o.lines(), ts.size()) : fromFile(labelImage, mapping, ts);
            PhantomImages img = CliChecks.asOptions(() -> PhantomImager.image(ph, report.tissues(), noiseSd == null ? 0 : noiseSd,
                    seed), "noise_sd");
            String title = p.name() + ": ";
            List<JFreeChart> charts = List.of(ImageOutputs.weightsChart(report, title + "k-space weights"),
                    ImageOutputs.psfChart(report, title + "point-spread function"),
                    ImageOutputs.phantomChart(title + "phantom image", phantomCaption(ph, img), img,
                            List.of(String.format(Locale.ROOT, "simulated, effective TE %.1f ms",
                                    report.tissues().get(0).effectiveTeMs())), List.of(img)));
            int[][] sizes = {{900, 540}, {900, 540}, ImageOutputs.phantomSize(img, 2)};
            int per = plot != null ? 1 : 2;
            for (int i = 0; i < targets.size(); i++) {
                ImageOutputs.write(charts.get(i / per), targets.get(i), sizes[i / per], force);
            }
        }
        if (out != null) {
            AtomicFiles.writeString(out.resolve(JSON_FILE), Json.write(json), force);
        }
        htmlReport.settings(CommandReports.acquisition(p));
        htmlReport.write("image: " + p.name(), force, r -> CommandReports.image(r, report, p.name()));
    }

    /** The chart files to write, checked before any work; --plot and --out are exclusive. */
    private List<Path> targets() {
        List<Path> files = new ArrayList<>();
        if (plot != null && out != null) {
            throw new InputException("give either --plot PATH or --out DIR, not both");
        }
        if (plot != null) {
            String ext = ChartFiles.isSvg(plot) ? ".svg" : ".png";
            String name = plot.getFileName().toString();
            String stem = name.substring(0, name.length() - 4);
            for (String c : ImageOutputs.CHARTS) {
                files.add(plot.resolveSibling(stem + "-" + c + ext));
            }
        }
        for (Path f : files) {
            AtomicFiles.checkWritable(f, force);
        }
        if (out != null) {                        // checked by the output set (openSet)
            for (String c : ImageOutputs.CHARTS) {
                files.add(out.resolve(c + ".png"));
                files.add(out.resolve(c + ".svg"));
            }
        }
        return files;
    }

    private List<Tissue> tissues(Protocol p) {
        List<Tissue> list = new ArrayList<>();
        if (tissues.isEmpty()) {
            Tissue t = p.tissue();
            list.add(t.name().isEmpty() ? new Tissue("tissue", t.t1Ms(), t.t2Ms()) : t);
            return list;
        }
        for (String s : tissues) {
            Tissue t = TissueOption.parse(s, "--tissue");
            for (Tissue other : list) {
                if (other.name().equals(t.name())) {
                    throw new InputException("--tissue " + s + ": the name " + t.name() + " is given twice");
                }
            }
            list.add(t);
        }
        return list;
    }

    private KSpaceOrdering ordering(int echoes) {
        if (echoes < 1) {
            throw new InputException("the protocol has no echoes to lay across k-space");
        }
        if (ordering == Ordering.centric) {
            if (centerEcho != null) {
                throw new InputException("--center-echo " + centerEcho + " applies to --ordering linear only "
                        + "(centric ordering places echo 1 at the centre)");
            }
            return CliChecks.asOptions(() -> KSpaceOrdering.centric(phaseLines, echoes), "phase_lines");
        }
        if (centerEcho != null && (centerEcho < 1 || centerEcho > echoes)) {
            throw new InputException("--center-echo must be within [1, " + echoes + "] (the echoes per train), got "
                    + centerEcho);
        }
        return CliChecks.asOptions(() -> centerEcho == null ? KSpaceOrdering.linear(phaseLines, echoes)
                : KSpaceOrdering.linear(phaseLines, echoes, centerEcho), "phase_lines", "center_echo");
    }

    private Map<Integer, String> mapping(List<Tissue> ts) {
        Map<Integer, String> m = new LinkedHashMap<>();
        List<String> names = ts.stream().map(Tissue::name).toList();
        for (String s : labels) {
            int eq = s.indexOf('=');
            String allowed = "--label " + s + ": expected VALUE=TISSUE with a whole-number VALUE and TISSUE one of "
                    + String.join(", ", names);
            if (eq < 1) {
                throw new InputException(allowed);
            }
            int value;
            try {
                value = Integer.parseInt(s.substring(0, eq).trim());
            } catch (NumberFormatException e) {
                throw new InputException(allowed, e);
            }
            String name = s.substring(eq + 1).trim();
            if (!names.contains(name)) {
                throw new InputException(allowed);
            }
            if (m.put(value, name) != null) {
                throw new InputException("--label " + s + ": label " + value + " is mapped twice");
            }
        }
        return m;
    }

    private Phantom fromFile(LabelImage li, Map<Integer, String> mapping, List<Tissue> ts) {
        List<Integer> unmapped = Phantom.unmapped(li.labels(), mapping);
        if (!unmapped.isEmpty()) {
            PrintWriter err = spec.commandLine().getErr();
            err.println("image: label values " + unmapped.stream().limit(12).map(String::valueOf).toList()
                    + (unmapped.size() > 12 ? " …" : "") + " of " + li.source() + " have no --label and give no signal");
            err.flush();
        }
        return CliChecks.asOptions(() -> Phantom.fromLabels(li.rows(), li.cols(), li.labels(), mapping,
                ts.stream().map(Tissue::name).toList(), li.source()).withRows(phaseLines), "label");
    }

    private String phantomCaption(Phantom ph, PhantomImages img) {
        return String.format(Locale.ROOT, "%s; %d x %d; noise sd %.3g (seed %d); phase encoding vertical",
                ph.description(), img.rows(), img.cols(), img.noiseSd(), img.seed());
    }
}
