package org.echotrellis.cohort;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.SplittableRandom;

import org.echotrellis.cli.Main;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import picocli.CommandLine;

/**
 * Side-by-side throughput of the cohort job: an invented BIDS cohort (two-compartment decays, 32
 * echoes, ESP 10 ms) processed (1) one subject after another by the CLI's {@code fit} command in
 * this JVM (the same data as one 4-D series per subject, all cores per subject), and (2) by
 * {@code cohort} in Spark local mode on all cores (one subject per core), in the same run. Prints
 * voxels/s of both and their ratio (Spark session start shown separately).
 *
 * <pre>
 * mvn -B -q -Pbench,cohort package -DskipTests
 * java -Xmx3g [Spark's --add-opens flags] -cp target/benchmarks.jar \
 *     org.echotrellis.cohort.CohortThroughput SUBJECTS NX NY NZ
 * </pre>
 */
public final class CohortThroughput {
    private static final int ECHOES = 32;
    private static final double ESP_MS = 10;

    private CohortThroughput() { }

    /**
     * @param args subjects (default 20), nx, ny, nz (default 128 128 8)
     * @throws IOException if the scratch dataset cannot be written
     */
    public static void main(String[] args) throws IOException {
        int subjects = args.length > 0 ? Integer.parseInt(args[0]) : 20;
        int nx = args.length > 1 ? Integer.parseInt(args[1]) : 128;
        int ny = args.length > 2 ? Integer.parseInt(args[2]) : 128;
        int nz = args.length > 3 ? Integer.parseInt(args[3]) : 8;
        Path dir = Files.createTempDirectory("echotrellis-cohort-bench");
        Path bids = dir.resolve("bids");
        writeCohort(dir, bids, subjects, nx, ny, nz);
        long voxels = (long) subjects * nx * ny * nz;
        System.out.printf(Locale.ROOT, "cohort of %d subjects, %dx%dx%d voxels x %d echoes each (%d voxels)%n",
                subjects, nx, ny, nz, ECHOES, voxels);
        Path protocol = dir.resolve("protocol.yaml");
        Files.writeString(protocol, "name: throughput\ntrain:\n  echoes: 32\n  echo_spacing_ms: 10\n"
                + "  excitation: {flip_deg: 90, phase_deg: 90}\n  refocusing: {flip_deg: 180, phase_deg: 0}\n");
        // JIT warm-up on a subject of its own (not timed)
        run("fit", dir.resolve("series-000.nii.gz").toString(), "--protocol", protocol.toString(), "--out",
                dir.resolve("warm").toString(), "--quiet");
        long t0 = System.nanoTime();
        for (int s = 1; s <= subjects; s++) {
            run("fit", dir.resolve("series-" + label(s) + ".nii.gz").toString(), "--protocol", protocol.toString(),
                    "--out", dir.resolve("sequential-" + label(s)).toString(), "--quiet");
        }
        double seq = (System.nanoTime() - t0) * 1e-9;
        long t1 = System.nanoTime();
        try (CohortSpark spark = CohortSpark.open(null)) {
            double start = (System.nanoTime() - t1) * 1e-9;
            String[] labels = new String[subjects];
            for (int s = 1; s <= subjects; s++) {
                labels[s - 1] = label(s);
            }
            long t2 = System.nanoTime();
            String[] a = new String[6 + subjects];
            a[0] = "cohort";
            a[1] = bids.toString();
            a[2] = dir.resolve("spark").toString();
            a[3] = "--analysis";
            a[4] = "fit";
            a[5] = "--participant-label";
            System.arraycopy(labels, 0, a, 6, subjects);
            int code = run(a);
            double job = (System.nanoTime() - t2) * 1e-9;
            System.out.printf(Locale.ROOT, "sequential CLI: %.1f s, %.0f voxels/s%n", seq, voxels / seq);
            System.out.printf(Locale.ROOT, "Spark local[*]: %.1f s job (+ %.1f s session start), %.0f voxels/s "
                    + "(%.0f with the start); exit %d%n", job, start, voxels / job, voxels / (job + start), code);
            System.out.printf(Locale.ROOT, "ratio Spark/sequential: %.2f (%.2f with the session start)%n",
                    seq / job, seq / (job + start));
        }
    }

    private static String label(int s) {
        return String.format(Locale.ROOT, "%03d", s);
    }

    private static int run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        CommandLine cl = Main.newCommandLine();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(args);
        if (code != 0) {
            System.out.println(String.join(" ", args) + " -> exit " + code + "\n" + err);
        }
        if (args[0].equals("cohort")) {
            System.out.print(out);   // the job's own figures: processing stage without the table writing
        }
        return code;
    }

    /**
     * Subjects 000 (warm-up) to SUBJECTS: myelin-like (T2 15–25 ms) and intra/extra-cellular water;
     * per-echo BIDS files and the same data as {@code DIR/series-L.nii.gz}.
     */
    private static void writeCohort(Path dir, Path bids, int subjects, int nx, int ny, int nz) throws IOException {
        Files.createDirectories(bids);
        Files.writeString(bids.resolve("dataset_description.json"),
                "{\"Name\": \"invented throughput cohort\", \"BIDSVersion\": \"1.10.0\"}\n");
        CpmgTrain train = CpmgTrain.constant(ECHOES, ESP_MS, 180);
        CpmgEngine engine = new CpmgEngine(1);
        int nv = nx * ny * nz;
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz);
        for (int s = 0; s <= subjects; s++) {
            SplittableRandom rnd = new SplittableRandom(1000 + s);
            Path anat = Files.createDirectories(bids.resolve("sub-" + label(s)).resolve("anat"));
            float[][] echo = new float[ECHOES][nv];
            for (int v = 0; v < nv; v++) {
                double b1 = 0.75 + 0.35 * rnd.nextDouble();
                double mwf = 0.05 + 0.15 * rnd.nextDouble();
                double[] a = engine.echoes(train, 1000, 15 + 10 * rnd.nextDouble(), b1);
                double[] b = engine.echoes(train, 1000, 70 + 40 * rnd.nextDouble(), b1);
                for (int k = 0; k < ECHOES; k++) {
                    double x = 800 * (mwf * a[k] + (1 - mwf) * b[k]);
                    echo[k][v] = (float) Math.hypot(x + 5 * gauss(rnd), 5 * gauss(rnd));
                }
            }
            float[] all = new float[ECHOES * nv];
            for (int k = 0; k < ECHOES; k++) {
                System.arraycopy(echo[k], 0, all, k * nv, nv);
            }
            Nifti.write(dir.resolve("series-" + label(s) + ".nii.gz"), h.withVolumes(ECHOES), all, false);
            for (int k = 0; k < ECHOES; k++) {
                String name = "sub-" + label(s) + "_echo-" + (k + 1) + "_MESE";
                Nifti.write(anat.resolve(name + ".nii.gz"), h, echo[k], false);
                Files.writeString(anat.resolve(name + ".json"), String.format(Locale.ROOT,
                        "{\"EchoTime\": %.3f, \"RepetitionTime\": 2.5, \"FlipAngle\": 90, \"RefocusingFlipAngle\": 180}%n",
                        (k + 1) * ESP_MS / 1000));
            }
        }
    }

    /** Standard normal by Box–Muller (Box &amp; Muller 1958). */
    private static double gauss(SplittableRandom rnd) {
        return Math.sqrt(-2 * Math.log(1 - rnd.nextDouble())) * Math.cos(2 * Math.PI * rnd.nextDouble());
    }
}
