package org.echotrellis.report;

import java.nio.file.Path;
import java.util.Random;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;

/**
 * The volume of the report size and time measurement in BENCHMARKS.md: a 128 × 128 × 122 phantom
 * (1 998 848 voxels), 32 echoes, ESP 10 ms: noise-free EPG decays (T2 40–200 ms across x, B1
 * 0.7–1.1 across y) plus Gaussian noise of SD 5 on amplitudes near 800, fixed seed.
 */
public final class ReportPhantom {
    private ReportPhantom() { }

    /**
     * @param a the output path (.nii or .nii.gz)
     * @throws Exception on write errors
     */
    public static void main(String[] a) throws Exception {
        int nx = 128;
        int ny = 128;
        int nz = 122;
        int ne = 32;
        CpmgTrain train = CpmgTrain.constant(ne, 10, 180);
        CpmgEngine eng = new CpmgEngine(1);
        double[][] table = new double[64 * 16][];
        for (int i = 0; i < 64; i++) {
            for (int j = 0; j < 16; j++) {
                table[i * 16 + j] = eng.echoes(train, 1000, 40 + 160.0 * i / 63, 0.7 + 0.4 * j / 15);
            }
        }
        int nv = nx * ny * nz;
        float[] data = new float[nv * ne];
        Random rnd = new Random(7);
        for (int v = 0; v < nv; v++) {
            int x = v % nx;
            int y = (v / nx) % ny;
            int z = v / (nx * ny);
            double[] d = table[(x / 2) * 16 + (y / 8)];
            double amp = 800 + 200 * Math.sin(z * 0.05);
            for (int k = 0; k < ne; k++) {
                data[k * nv + v] = (float) (amp * Math.abs(d[k]) + 5 * rnd.nextGaussian());
            }
        }
        Nifti.write(Path.of(a[0]), NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz, ne), data, true);
    }
}
