package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Random;
import java.util.Set;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.imageio.ImageIO;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.RunSummary;
import org.echotrellis.report.Html;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Opens reports in headless Chromium: no console errors, no network requests, the expected
 * sections and numbers in the rendered DOM, a non-blank screenshot and a printed PDF with a page
 * count in the expected range.
 */
class ReportBrowserTest {
    private static final String PROTOCOL = "sequences/brain-mwi-32.yaml";   // 32 echoes, ESP 10 ms, 180°
    private static final int NX = 24;
    private static final int NY = 20;
    private static final int NZ = 5;

    @TempDir
    Path dir;

    /** A disc phantom whose T2 rises with x, B1 falls with y, Rician-free Gaussian noise (seed fixed). */
    private Path[] phantom() {
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        CpmgEngine engine = new CpmgEngine(1);
        int nv = NX * NY * NZ;
        double[] data = new double[nv * 32];
        double[] mask = new double[nv];
        Random rnd = new Random(20261202L);
        for (int z = 0; z < NZ; z++) {
            for (int y = 0; y < NY; y++) {
                for (int x = 0; x < NX; x++) {
                    int v = x + NX * (y + NY * z);
                    double dx = x - NX / 2.0;
                    double dy = y - NY / 2.0;
                    boolean inside = dx * dx + dy * dy < 81;
                    mask[v] = inside ? 1 : 0;
                    double[] e = engine.echoes(train, 1000, 40 + 3 * x + 5 * z, 1.0 - 0.01 * y);
                    for (int k = 0; k < 32; k++) {
                        data[k * nv + v] = (inside ? 1000 * Math.abs(e[k]) : 0) + 2 * rnd.nextGaussian();
                    }
                }
            }
        }
        Path series = dir.resolve("series.nii.gz");
        Nifti.write(series, NiftiHeader.create(NiftiDatatype.FLOAT32, NX, NY, NZ, 32), data, false);
        Path maskFile = dir.resolve("mask.nii");
        Nifti.write(maskFile, NiftiHeader.create(NiftiDatatype.UINT8, NX, NY, NZ), mask, false);
        return new Path[] {series, maskFile};
    }

    @Test
    void fitVolumeReportRendersPrintsAndMakesNoRequests() throws Exception {
        HeadlessChromium browser = HeadlessChromium.require();
        Path[] in = phantom();
        Path out = dir.resolve("maps");
        Path html = dir.resolve("fit report.html");
        CliRun r = CliRun.of("fit", in[0].toString(), "--protocol", PROTOCOL, "--mask", in[1].toString(),
                "--out", out.toString(), "--compare-mono", "--threads", "2", "--quiet", "--report", html.toString());
        assertEquals(0, r.code(), r.err());

        try (HeadlessChromium.Session session = browser.start()) {
            checkFitPage(session, html, in[0], out);
        }
    }

    private void checkFitPage(HeadlessChromium.Session session, Path html, Path series, Path out) throws Exception {
        HeadlessChromium.Load page = session.load(html);
        assertEquals(List.of(), page.consoleErrors());
        for (String url : page.requests()) {
            assertTrue(url.startsWith("file:") || url.startsWith("data:"), "network request " + url);
        }
        for (String heading : List.of("What was run", "Headline numbers", "Maps, every slice", "Histograms inside the mask",
                "Sample decays and fitted curves", "Inputs")) {
            assertTrue(page.text().contains(heading), heading);
        }
        // the median T2 in the page equals the median of the written map (independent recomputation)
        NiftiImage t2 = Nifti.read(out.resolve("t2_ms.nii.gz"));
        NiftiImage status = Nifti.read(out.resolve("status.nii.gz"));
        double[] fitted = new double[NX * NY * NZ];
        int n = 0;
        for (int v = 0; v < fitted.length; v++) {
            int s = (int) status.get(v);
            if (s != 0 && s != 4 && Double.isFinite(t2.get(v))) {
                fitted[n++] = t2.get(v);
            }
        }
        double[] sorted = Arrays.copyOf(fitted, n);
        Arrays.sort(sorted);
        String median = Html.num(RunSummary.percentile(sorted, 50));
        assertTrue(page.text().contains("median T2 (ms)\t" + median) || page.text().contains("median T2 (ms) " + median),
                "median " + median);
        // the SHA-256 of the series appears (checked against the JDK digest of the file)
        assertTrue(page.text().contains(sha256(series)), "checksum of the series");
        // every slice of each of the 7 maps is a tile with alt text; the slider script ran
        assertEquals(7 * NZ, count(page.html(), "<figure class=\"tile\"><img"));
        assertEquals(7 * NZ, count(page.html(), "alt=\"[^\"]+, slice z = \\d+\""));
        assertEquals(7, count(page.html(), "<input type=\"range\""));
        assertTrue(page.text().contains("echotrellis fit"), "command line");

        BufferedImage img = ImageIO.read(new ByteArrayInputStream(session.screenshot(1000, 1400)));
        Set<Integer> colours = new HashSet<>();
        int background = img.getRGB(2, 2);
        long differing = 0;
        long sampled = 0;
        for (int y = 0; y < img.getHeight(); y += 2) {
            for (int x = 0; x < img.getWidth(); x += 2) {
                int c = img.getRGB(x, y);
                colours.add(c);
                differing += c != background ? 1 : 0;
                sampled++;
            }
        }
        assertTrue(colours.size() > 50, "screenshot colours " + colours.size());
        assertTrue(differing > sampled / 20, "screenshot is nearly blank: " + differing + " of " + sampled);

        // A4 (8.27 × 11.69 in) and Letter (8.5 × 11 in): 7 maps of 5 slices, 7 histograms, 6 decays
        for (double[] paper : new double[][] {{8.27, 11.69}, {8.5, 11}}) {
            int pages = pdfPages(session.printToPdf(paper[0], paper[1]));
            assertTrue(pages >= 6 && pages <= 30, "printed pages " + pages + " on " + paper[0] + " × " + paper[1] + " in");
        }
    }

    @Test
    void otherCommandReportsLoadCleanly() throws Exception {
        HeadlessChromium browser = HeadlessChromium.require();
        Path[] in = phantom();
        double[] oneSlice = new double[NX * NY * NZ];
        NiftiImage mask = Nifti.read(in[1]);
        for (int v = 2 * NX * NY; v < 3 * NX * NY; v++) {
            oneSlice[v] = mask.get(v);
        }
        Path sliceMask = dir.resolve("slice-mask.nii");
        Nifti.write(sliceMask, NiftiHeader.create(NiftiDatatype.UINT8, NX, NY, NZ), oneSlice, false);
        Path spectrum = dir.resolve("spectrum.html");
        CliRun sp = CliRun.of("spectrum", in[0].toString(), "--protocol", PROTOCOL, "--mask", sliceMask.toString(),
                "--refocus-deg", "180", "--t2-bins", "20", "--out", dir.resolve("spec").toString(), "--quiet",
                "--report", spectrum.toString());
        assertEquals(0, sp.code(), sp.err());
        Path design = dir.resolve("design.html");
        CliRun d = CliRun.of("design", "--protocol", "sequences/fse-variable-1p5t.yaml", "--target", "constant:0.4",
                "--tr-ms", "3000", "--b1rms-limit-ut", "3", "--quiet", "--report", design.toString());
        assertEquals(0, d.code(), d.err());
        Path sim = dir.resolve("simulate.html");
        CliRun s = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--report", sim.toString());
        assertEquals(0, s.code(), s.err());
        Path path = dir.resolve("pathways.html");
        CliRun p = CliRun.of("pathways", "sequences/knee-t2-16.yaml", "--report", path.toString());
        assertEquals(0, p.code(), p.err());
        String[][] expect = {
            {spectrum.toString(), "Spectra", "Mean spectrum", "Maps, every slice", "Histograms inside the mask",
                "geometric-mean T2"},
            {design.toString(), "Schedule", "Echoes", "RF exposure", "the scanner's own SAR monitor"},
            {sim.toString(), "Echo train", "knee-t2-16"},
            {path.toString(), "Echo classes", "Phase graph"},
        };
        try (HeadlessChromium.Session session = browser.start()) {
            for (String[] e : expect) {
                checkPage(session, e);
            }
        }
    }

    private static void checkPage(HeadlessChromium.Session session, String[] e) throws Exception {
        {
            HeadlessChromium.Load page = session.load(Path.of(e[0]));
            assertEquals(List.of(), page.consoleErrors(), e[0]);
            for (String url : page.requests()) {
                assertTrue(url.startsWith("file:") || url.startsWith("data:"), "network request " + url);
            }
            for (int i = 1; i < e.length; i++) {
                assertTrue(page.text().contains(e[i]), e[0] + ": " + e[i]);
            }
            assertFalse(page.text().contains("<svg"), "SVG markup shown as text");
        }
    }

    private static int count(String s, String regex) {
        Matcher m = Pattern.compile(regex).matcher(s);
        int n = 0;
        while (m.find()) {
            n++;
        }
        return n;
    }

    /** Page objects of a PDF ("/Type /Page" but not "/Pages"); Chromium writes them uncompressed. */
    static int pdfPages(byte[] pdf) {
        String s = new String(pdf, StandardCharsets.ISO_8859_1);
        return count(s, "/Type\\s*/Page(?![s\\w])");
    }

    private static String sha256(Path f) throws Exception {
        java.security.MessageDigest md = java.security.MessageDigest.getInstance("SHA-256");
        return java.util.HexFormat.of().formatHex(md.digest(Files.readAllBytes(f)));
    }
}
