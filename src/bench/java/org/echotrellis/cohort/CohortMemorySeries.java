package org.echotrellis.cohort;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.SplittableRandom;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;

/**
 * Writes an invented one-subject BIDS dataset for measuring the memory of a cohort task on a
 * full-size series: {@code sub-01} with one 3-D float32 file per echo
 * ({@code sub-01_echo-<n>_MESE.nii.gz}, 32 echoes, ESP 10 ms) and a JSON sidecar each (EchoTime in
 * s, RepetitionTime, FlipAngle 90, RefocusingFlipAngle 180). A central box of tissue (a given
 * fraction of each axis) holds CPMG decays of the EPG engine with T2 40–120 ms and B1 0.8–1.1
 * varying smoothly across the box, amplitude 1000 and Rician noise (σ 5); every other voxel is
 * exactly 0 in all echoes, which both analyses mark invalid without fitting. The box is also written
 * as {@code sub-01_desc-brain_mask.nii.gz} (uint8, for {@code cohort --mask mask}). The memory a task
 * needs does not depend on the tissue's size (maps and slabs span the whole grid); the run time does.
 *
 * <pre>
 * mvn -B -q -Pcohort package -DskipTests
 * javac -cp target/echotrellis-cohort.jar -d /tmp/memcls src/bench/java/org/echotrellis/cohort/CohortMemorySeries.java
 * java -cp /tmp/memcls:target/echotrellis-cohort.jar org.echotrellis.cohort.CohortMemorySeries \
 *     /tmp/mem-bids [NX NY NZ [TISSUE_FRACTION]]
 * </pre>
 */
public final class CohortMemorySeries {
    private static final int ECHOES = 32;
    private static final double ESP_MS = 10;
    private static final double AMPLITUDE = 1000;
    private static final double SIGMA = 5;

    private CohortMemorySeries() { }

    /**
     * @param args output directory (must not exist), nx ny nz (default 256 256 60), tissue fraction
     *        of each axis (default 0.25)
     * @throws IOException if the dataset cannot be written
     */
    public static void main(String[] args) throws IOException {
        if (args.length != 1 && args.length != 4 && args.length != 5) {
            System.err.println("usage: CohortMemorySeries OUT_DIR [NX NY NZ [TISSUE_FRACTION]]");
            System.exit(2);
        }
        Path root = Path.of(args[0]);
        if (Files.exists(root)) {
            System.err.println(root + ": exists; give a new directory");
            System.exit(2);
        }
        int nx = args.length > 1 ? Integer.parseInt(args[1]) : 256;
        int ny = args.length > 1 ? Integer.parseInt(args[2]) : 256;
        int nz = args.length > 1 ? Integer.parseInt(args[3]) : 60;
        double fraction = args.length > 4 ? Double.parseDouble(args[4]) : 0.25;
        long t0 = System.nanoTime();
        long tissue = write(root, nx, ny, nz, fraction);
        System.out.printf(Locale.ROOT, "%s: sub-01, %dx%dx%d voxels x %d echoes, %d tissue voxels, %.1f s%n",
                root, nx, ny, nz, ECHOES, tissue, (System.nanoTime() - t0) * 1e-9);
    }

    /**
     * Writes the dataset.
     *
     * @return the number of tissue voxels
     */
    static long write(Path root, int nx, int ny, int nz, double fraction) throws IOException {
        Files.createDirectories(root);
        Files.writeString(root.resolve("dataset_description.json"),
                "{\"Name\": \"invented full-size multi-echo series\", \"BIDSVersion\": \"1.10.0\"}\n");
        Path anat = Files.createDirectories(root.resolve("sub-01").resolve("anat"));
        int[] lo = new int[3];
        int[] hi = new int[3];
        int[] n = {nx, ny, nz};
        for (int a = 0; a < 3; a++) {
            int side = Math.max(1, (int) Math.round(n[a] * fraction));
            lo[a] = (n[a] - side) / 2;
            hi[a] = lo[a] + side;
        }
        int bx = hi[0] - lo[0];
        int by = hi[1] - lo[1];
        int bz = hi[2] - lo[2];
        int nt = bx * by * bz;
        // the tissue's echoes, voxel-major; the background stays 0
        float[] decays = new float[nt * ECHOES];
        CpmgTrain train = CpmgTrain.constant(ECHOES, ESP_MS, 180);
        CpmgEngine engine = new CpmgEngine(1);
        SplittableRandom rnd = new SplittableRandom(20261202L);
        for (int t = 0; t < nt; t++) {
            int x = t % bx;
            int y = (t / bx) % by;
            int z = t / (bx * by);
            double t2 = 40 + 80 * (x + 0.5) / bx;
            double b1 = 0.8 + 0.3 * (y + 0.5) / by;
            double m0 = AMPLITUDE * (0.9 + 0.2 * (z + 0.5) / bz);
            double[] e = engine.echoes(train, 1000, t2, b1);
            for (int k = 0; k < ECHOES; k++) {
                double s = m0 * Math.abs(e[k]);
                decays[t * ECHOES + k] = (float) Math.hypot(s + SIGMA * gauss(rnd), SIGMA * gauss(rnd));
            }
        }
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz);
        float[] volume = new float[nx * ny * nz];
        for (int t = 0; t < nt; t++) {
            volume[index(t, lo, bx, by, nx, ny)] = 1;
        }
        Nifti.write(anat.resolve("sub-01_desc-brain_mask.nii.gz"), h.withDatatype(NiftiDatatype.UINT8), volume, false);
        for (int k = 0; k < ECHOES; k++) {
            for (int t = 0; t < nt; t++) {
                volume[index(t, lo, bx, by, nx, ny)] = decays[t * ECHOES + k];
            }
            String name = "sub-01_echo-" + (k + 1) + "_MESE";
            Nifti.write(anat.resolve(name + ".nii.gz"), h, volume, false);
            Files.writeString(anat.resolve(name + ".json"), String.format(Locale.ROOT,
                    "{\"EchoTime\": %.3f, \"RepetitionTime\": 3.0, \"FlipAngle\": 90, \"RefocusingFlipAngle\": 180}%n",
                    (k + 1) * ESP_MS / 1000));
        }
        return nt;
    }

    /** Linear index in the volume of tissue voxel {@code t} of a box of bx × by × … starting at lo. */
    private static int index(int t, int[] lo, int bx, int by, int nx, int ny) {
        int x = lo[0] + t % bx;
        int y = lo[1] + (t / bx) % by;
        int z = lo[2] + t / (bx * by);
        return x + nx * (y + ny * z);
    }

    /** Standard normal by Box–Muller (Box &amp; Muller 1958). */
    private static double gauss(SplittableRandom rnd) {
        return Math.sqrt(-2 * Math.log(1 - rnd.nextDouble())) * Math.cos(2 * Math.PI * rnd.nextDouble());
    }
}
