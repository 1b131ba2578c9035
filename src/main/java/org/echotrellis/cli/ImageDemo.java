package org.echotrellis.cli;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.echotrellis.design.DesignJob;
import org.echotrellis.design.DesignProblem;
import org.echotrellis.design.DesignReport;
import org.echotrellis.design.ExposureLimits;
import org.echotrellis.design.IecLimits;
import org.echotrellis.design.Objective;
import org.echotrellis.design.RfExposure;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.image.FseImaging;
import org.echotrellis.image.ImageReport;
import org.echotrellis.image.KSpaceOrdering;
import org.echotrellis.image.Phantom;
import org.echotrellis.image.PhantomImager;
import org.echotrellis.image.PhantomImages;
import org.echotrellis.image.TissueImage;
import org.echotrellis.plot.ChartFiles;
import org.echotrellis.plot.LineChart;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.PulseShape;
import org.echotrellis.sequence.Tissue;
import org.echotrellis.sequence.TissuePresets;
import org.jfree.chart.JFreeChart;

/**
 * Demo part: an invented 32-echo 3 T brain T2-weighted fast spin echo, 256 lines in linear order with
 * echo 16 at k = 0 (effective TE 96 ms), refocused three ways — constant 180°, the best constant
 * flip and a designed schedule for the narrowest white-matter PSF, the last two within 40 % of the
 * all-180° RF energy — and the PSFs and phantom images of white matter and CSF that result.
 */
final class ImageDemo implements DemoSection {
    static final int LINES = 256;
    static final int CENTRE_ECHO = 16;
    static final double BUDGET = 0.4;
    static final double MIN_SIGNAL = 0.2;
    static final double NOISE_SD = 0.01;
    static final long SEED = 20261202L;

    @Override
    public String title() {
        return "from echo train to image: PSF and phantom images (brain FSE, 32 echoes, 3 T)";
    }

    @Override
    public void run(DemoContext ctx) {
        Protocol p = ProtocolReader.readBuiltIn("brain-fse-t2-3t.yaml");
        CpmgTrain train = p.cpmg().orElseThrow();
        Tissue csf = p.tissue();
        Tissue wm = TissuePresets.get("white_matter_3t");
        Tissue gm = TissuePresets.get("grey_matter_3t");
        int n = train.echoes();
        DesignProblem problem = new DesignProblem(wm.name(), n, train.echoSpacingMs(), train.excitationFlipDeg(),
                wm.t1Ms(), wm.t2Ms(), 1.0, 10, 180);
        Objective narrow = new Objective.PsfWidth(CENTRE_ECHO, LINES, n, wm.name(), wm.t1Ms(), wm.t2Ms(), MIN_SIGNAL,
                Objective.PsfWidth.DEFAULT_MAX_SIDELOBE);
        RfExposure rf = new RfExposure(PulseShape.sinc(4), 2.0, PulseShape.sinc(4), 2.0, 4000, 20);
        DesignReport designed = DesignJob.optimised(problem, narrow, rf, new ExposureLimits(BUDGET, Double.POSITIVE_INFINITY),
                null, 6, 3000, List.of());
        double[] flat180 = filled(n, 180);
        double[] lowConstant = filled(n, designed.constantFlipDeg());
        double[] designedFlips = designed.flipsDeg();
        List<String> names = List.of("constant 180°",
                String.format(Locale.ROOT, "constant %.0f° (best constant)", designed.constantFlipDeg()), "designed");
        List<double[]> schedules = List.of(flat180, lowConstant, designedFlips);
        KSpaceOrdering o = KSpaceOrdering.linear(LINES, n, CENTRE_ECHO);
        List<ImageReport> reports = new ArrayList<>();
        List<PhantomImages> images = new ArrayList<>();
        Phantom phantom = Phantom.builtin(LINES, 3);
        for (double[] flips : schedules) {
            Protocol q = Protocol.ofTrain(p.name(), p.description(), csf, 1.0, train.withRefocusFlipsDeg(flips), p.source());
            ImageReport r = FseImaging.analyse(q, o, List.of(wm, csf, gm), NOISE_SD);
            reports.add(r);
            images.add(PhantomImager.image(phantom, r.tissues(), NOISE_SD, SEED));
        }
        both(ctx, psfChart(reports, names), "image-psf", new int[] {900, 560});
        both(ctx, weightsChart(reports, names), "image-weights", new int[] {900, 560});
        JFreeChart ph = ImageOutputs.phantomChart("White matter with CSF discs (lower row) and grey-matter discs (upper row), TE 96 ms",
                String.format(Locale.ROOT, "%d x %d, phase encoding vertical, noise sd %.2f (seed %d); ideal: all-180° "
                        + "centre weights", LINES, LINES, NOISE_SD, SEED), images.get(0), names, images);
        both(ctx, ph, "image-phantom", ImageOutputs.phantomSize(images.get(0), 4));
        summary(ctx, p, names, schedules, reports, designed);
    }

    private static void summary(DemoContext ctx, Protocol p, List<String> names, List<double[]> schedules,
                                List<ImageReport> reports, DesignReport designed) {
        StringBuilder s = ctx.summary();
        s.append("## From echo train to image: blurring and contrast\n\n")
                .append(String.format(Locale.ROOT, "Protocol `%s` (%s), %d phase-encoding lines (8 shots), linear "
                        + "ordering with echo %d at k = 0: effective TE %.0f ms for every schedule. White matter "
                        + "(`white_matter_3t`) and CSF (T1 %s ms, T2 %s ms, defined in the protocol). The designed "
                        + "schedule maximises 1/FWHM of the white-matter PSF (objective `%s`) within %.0f %% of the "
                        + "all-180° RF energy, 6 spline knots; the best constant flip is the one that does best on the "
                        + "same objective in the same limits.%n%n", p.name(), p.description(), LINES, CENTRE_ECHO,
                        reports.get(0).tissues().get(0).effectiveTeMs(), Tables.num(p.tissue().t1Ms()),
                        Tables.num(p.tissue().t2Ms()), designed.spec(), 100 * BUDGET))
                .append("| schedule | relative SAR | WM centre signal | WM FWHM (px) | WM side lobe | CSF centre signal "
                        + "| CSF FWHM (px) | CSF − WM contrast | CNR (σ = 0.01) |\n|---|---|---|---|---|---|---|---|---|\n");
        for (int i = 0; i < names.size(); i++) {
            TissueImage w = reports.get(i).tissues().get(0);
            TissueImage c = reports.get(i).tissues().get(1);
            s.append(String.format(Locale.ROOT, "| %s | %.3f | %.4f | %.2f | %.3f | %.4f | %.2f | %.4f | %.1f |%n",
                    names.get(i), RfExposure.relativeSar(schedules.get(i)), w.centerSignal(), w.figures().fwhmPx(),
                    w.figures().sidelobe(), c.centerSignal(), c.figures().fwhmPx(), -reports.get(i).pairs().get(0).contrast(),
                    reports.get(i).pairs().get(0).cnr()));
        }
        s.append("\nThe decaying white-matter weights across k-space widen its PSF under constant refocusing; the "
                + "designed schedule flattens them (narrower main lobe, side lobes kept small) at a fraction of the RF "
                + "energy, and CSF, whose long T2 kept it bright and sharp at 180°, loses signal to the low flips: "
                + "contrast is traded for sharpness and SAR (Busse et al. 2006; Mugler 2014). One phase-encoding "
                + "direction, no motion, no T2* or off-resonance in the read-out. " + IecLimits.CAUTION + "\n\n")
                .append(String.format(Locale.ROOT, "The phantom images (white matter with a row of CSF discs and a row "
                        + "of grey-matter discs, radii 23 px down to 4 px) show the small, low-contrast grey-matter discs "
                        + "(grey matter − white matter %.3f at 180°, %.3f designed) fading first.%n%n",
                        -reports.get(0).pairs().get(1).contrast(), -reports.get(2).pairs().get(1).contrast()))
                .append("Figures: `image-psf.png`, `image-weights.png`, `image-phantom.png` (and `.svg`).\n\n");
    }

    private static JFreeChart psfChart(List<ImageReport> reports, List<String> names) {
        double[] x = new double[LINES];
        for (int i = 0; i < LINES; i++) {
            x[i] = i - LINES / 2;
        }
        LineChart c = LineChart.create("PSF of white matter and CSF, effective TE 96 ms",
                "pixel offset along phase encoding (px)", "PSF magnitude (flat weights: 1)")
                .subtitle("32 echoes, ESP 6 ms, 256 lines, linear ordering with echo 16 at k = 0");
        for (int i = 0; i < reports.size(); i++) {
            for (int t = 0; t < 2; t++) {
                TissueImage ti = reports.get(i).tissues().get(t);
                c.add(String.format(Locale.ROOT, "%s, %s (FWHM %.2f px)", t == 0 ? "WM" : "CSF", names.get(i),
                        ti.figures().fwhmPx()), x, ti.psf(), t == 0 ? LineChart.Look.LINE_MARKERS : LineChart.Look.DASHED, i);
            }
        }
        return c.xRange(-8.5, 8.5).build();
    }

    private static JFreeChart weightsChart(List<ImageReport> reports, List<String> names) {
        double[] k = new double[LINES];
        for (int j = 0; j < LINES; j++) {
            k[j] = j - LINES / 2;
        }
        LineChart c = LineChart.create("k-space weights of white matter and CSF", "phase-encoding k-index (line − L/2)",
                "k-space weight (echo magnitude, M0 = 1)").subtitle("echo 16 at k = 0; 8 lines per echo");
        for (int i = 0; i < reports.size(); i++) {
            for (int t = 0; t < 2; t++) {
                c.add((t == 0 ? "WM, " : "CSF, ") + names.get(i), k, reports.get(i).tissues().get(t).weights(),
                        t == 0 ? LineChart.Look.LINE : LineChart.Look.DASHED, i);
            }
        }
        return c.build();
    }

    private static void both(DemoContext ctx, JFreeChart chart, String stem, int[] size) {
        ChartFiles.write(chart, ctx.file(stem + ".png"), size[0], size[1], ctx.force());
        ChartFiles.write(chart, ctx.file(stem + ".svg"), size[0], size[1], ctx.force());
    }

    private static double[] filled(int n, double v) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, v);
        return a;
    }
}
