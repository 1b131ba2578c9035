package org.echotrellis.cohort;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;

/**
 * Writes an invented BIDS dataset of multi-echo spin-echo subjects: per subject (and session) one
 * 3-D float32 file per echo ({@code _echo-<n>_MESE.nii.gz}) with a JSON sidecar (EchoTime in s,
 * RepetitionTime, FlipAngle, RefocusingFlipAngle). Voxel decays come from the CPMG engine with T2
 * 40–120 ms and B1 0.8–1.1 (fixed seed) and a little Gaussian noise.
 */
final class SyntheticCohort {
    static final int ECHOES = 16;
    static final double ESP_MS = 10;
    private final Path root;
    private final int nx;
    private final int ny;
    private final int nz;

    SyntheticCohort(Path root, int nx, int ny, int nz) throws IOException {
        this.root = root;
        this.nx = nx;
        this.ny = ny;
        this.nz = nz;
        Files.createDirectories(root);
        Files.writeString(root.resolve("dataset_description.json"),
                "{\"Name\": \"invented multi-echo cohort\", \"BIDSVersion\": \"1.10.0\"}\n");
    }

    /** @return the anat directory of a subject/session (created) */
    Path anat(String sub, String ses) throws IOException {
        Path d = root.resolve("sub-" + sub);
        if (ses != null) {
            d = d.resolve("ses-" + ses);
        }
        return Files.createDirectories(d.resolve("anat"));
    }

    /** @return the file name prefix {@code sub-L[_ses-S]} */
    static String prefix(String sub, String ses) {
        return "sub-" + sub + (ses == null ? "" : "_ses-" + ses);
    }

    /**
     * Writes one subject's echo files and sidecars.
     *
     * @param sub participant label
     * @param ses session label or null
     * @param seed noise and tissue seed
     * @return the anat directory
     */
    Path subject(String sub, String ses, long seed) throws IOException {
        Path anat = anat(sub, ses);
        CpmgTrain train = CpmgTrain.constant(ECHOES, ESP_MS, 180);
        CpmgEngine engine = new CpmgEngine(1);
        Random rnd = new Random(seed);
        int nv = nx * ny * nz;
        double[][] echo = new double[ECHOES][nv];
        for (int v = 0; v < nv; v++) {
            double t2 = 40 + 80 * rnd.nextDouble();
            double b1 = 0.8 + 0.3 * rnd.nextDouble();
            double[] e = engine.echoes(train, 1000, t2, b1);
            for (int k = 0; k < ECHOES; k++) {
                echo[k][v] = Math.abs(1000 * e[k]) + 2 * rnd.nextGaussian();
            }
        }
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz);
        for (int k = 0; k < ECHOES; k++) {
            String name = prefix(sub, ses) + "_echo-" + (k + 1) + "_MESE";
            Nifti.write(anat.resolve(name + ".nii.gz"), h, echo[k], false);
            Files.writeString(anat.resolve(name + ".json"), String.format(Locale.ROOT,
                    "{\"EchoTime\": %.4f, \"RepetitionTime\": 3.0, \"FlipAngle\": 90, \"RefocusingFlipAngle\": 180}%n",
                    (k + 1) * ESP_MS / 1000));
        }
        return anat;
    }

    /**
     * Writes a segmentation with labels 1 (x below the middle) and 2 (the rest) beside a subject.
     *
     * @return the label values per voxel
     */
    float[] labels(String sub, String ses) throws IOException {
        int nv = nx * ny * nz;
        float[] l = new float[nv];
        for (int v = 0; v < nv; v++) {
            l[v] = (v % nx) < nx / 2 ? 1 : 2;
        }
        Nifti.write(anat(sub, ses).resolve(prefix(sub, ses) + "_dseg.nii.gz"),
                NiftiHeader.create(NiftiDatatype.UINT8, nx, ny, nz), l, false);
        return l;
    }

    /**
     * Writes a brain mask (every voxel but the first row, y = 0) for a subject under
     * {@code derivatives/masks/}, as a mask pattern {@code derivatives/masks/sub-{sub}_mask.nii.gz} finds it.
     *
     * @return the mask values per voxel
     */
    float[] mask(String sub) throws IOException {
        int nv = nx * ny * nz;
        float[] m = new float[nv];
        for (int v = 0; v < nv; v++) {
            m[v] = (v / nx) % ny == 0 ? 0 : 1;
        }
        Path dir = Files.createDirectories(root.resolve("derivatives").resolve("masks"));
        Nifti.write(dir.resolve("sub-" + sub + "_mask.nii.gz"), NiftiHeader.create(NiftiDatatype.UINT8, nx, ny, nz), m, false);
        return m;
    }
}
