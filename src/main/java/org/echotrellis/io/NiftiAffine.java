package org.echotrellis.io;

/**
 * Voxel-to-world affines of NIfTI headers and their comparison, following {@code nifti1.h}
 * (R. W. Cox, NIH DFWG 2003/2007; METHODS §9): the sform rows when sform_code &gt; 0, else the
 * qform (quaternion b, c, d with a = √(1 − b² − c² − d²), voxel sizes, qfac, offsets) when
 * qform_code &gt; 0, else the voxel sizes on the diagonal ("method 1").
 */
final class NiftiAffine {
    /** Largest affine difference accepted as the same grid, in voxels (common practice: float32 round-off is far below). */
    static final double TOLERANCE_VOXELS = 1e-3;

    private NiftiAffine() { }

    /** Quaternion parameters of an orthogonal affine. */
    record Quatern(double b, double c, double d, double dx, double dy, double dz, double qfac) { }

    /** @return the 12 affine values of a header, rows x, y, z */
    static double[] of(NiftiHeader h) {
        double[] m = new double[12];
        if (h.sformCode() > 0) {
            float[] s = h.srow();
            for (int i = 0; i < 12; i++) {
                m[i] = s[i];
            }
            return m;
        }
        double dx = h.pixdim(1);
        double dy = h.pixdim(2);
        double dz = h.pixdim(3);
        if (h.qformCode() <= 0) {
            m[0] = dx;
            m[5] = dy;
            m[10] = dz;
            return m;
        }
        float[] q = h.quatern();
        double b = q[0];
        double c = q[1];
        double d = q[2];
        double a = Math.sqrt(Math.max(0, 1 - b * b - c * c - d * d));
        double qfac = h.pixdim(0) < 0 ? -1 : 1;
        double[][] r = {
            {a * a + b * b - c * c - d * d, 2 * (b * c - a * d), 2 * (b * d + a * c)},
            {2 * (b * c + a * d), a * a + c * c - b * b - d * d, 2 * (c * d - a * b)},
            {2 * (b * d - a * c), 2 * (c * d + a * b), a * a + d * d - b * b - c * c}};
        double[] size = {dx, dy, qfac * dz};
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                m[4 * i + j] = r[i][j] * size[j];
            }
            m[4 * i + 3] = q[3 + i];
        }
        return m;
    }

    /**
     * The quaternion form of an affine whose 3×3 part is a rotation (possibly with a reflection of
     * the third axis) times voxel sizes.
     *
     * @param m 12 affine values
     * @return the parameters, or null for a sheared or degenerate matrix
     */
    static Quatern toQuatern(double[] m) {
        double[] size = new double[3];
        double[][] r = new double[3][3];
        for (int j = 0; j < 3; j++) {
            size[j] = Math.sqrt(m[j] * m[j] + m[4 + j] * m[4 + j] + m[8 + j] * m[8 + j]);
            if (!(size[j] > 0) || !Double.isFinite(size[j])) {
                return null;
            }
            for (int i = 0; i < 3; i++) {
                r[i][j] = m[4 * i + j] / size[j];
            }
        }
        double det = r[0][0] * (r[1][1] * r[2][2] - r[1][2] * r[2][1]) - r[0][1] * (r[1][0] * r[2][2] - r[1][2] * r[2][0])
                + r[0][2] * (r[1][0] * r[2][1] - r[1][1] * r[2][0]);
        double qfac = det < 0 ? -1 : 1;
        for (int i = 0; i < 3; i++) {
            r[i][2] *= qfac;
        }
        for (int i = 0; i < 3; i++) {
            for (int j = i + 1; j < 3; j++) {
                double dot = r[0][i] * r[0][j] + r[1][i] * r[1][j] + r[2][i] * r[2][j];
                if (Math.abs(dot) > 1e-4) {
                    return null;
                }
            }
        }
        // rotation matrix to unit quaternion (a, b, c, d), largest pivot first; derivation: the
        // off-diagonal sums and differences of R (METHODS §9) are 4ab, 4ac, 4ad, 4bc, 4bd, 4cd
        double tr = r[0][0] + r[1][1] + r[2][2];
        double a;
        double b;
        double c;
        double d;
        if (tr > 0) {
            a = 0.5 * Math.sqrt(1 + tr);
            b = 0.25 * (r[2][1] - r[1][2]) / a;
            c = 0.25 * (r[0][2] - r[2][0]) / a;
            d = 0.25 * (r[1][0] - r[0][1]) / a;
        } else if (r[0][0] >= r[1][1] && r[0][0] >= r[2][2]) {
            b = 0.5 * Math.sqrt(1 + r[0][0] - r[1][1] - r[2][2]);
            c = 0.25 * (r[0][1] + r[1][0]) / b;
            d = 0.25 * (r[0][2] + r[2][0]) / b;
            a = 0.25 * (r[2][1] - r[1][2]) / b;
        } else if (r[1][1] >= r[2][2]) {
            c = 0.5 * Math.sqrt(1 - r[0][0] + r[1][1] - r[2][2]);
            b = 0.25 * (r[0][1] + r[1][0]) / c;
            d = 0.25 * (r[1][2] + r[2][1]) / c;
            a = 0.25 * (r[0][2] - r[2][0]) / c;
        } else {
            d = 0.5 * Math.sqrt(1 - r[0][0] - r[1][1] + r[2][2]);
            b = 0.25 * (r[0][2] + r[2][0]) / d;
            c = 0.25 * (r[1][2] + r[2][1]) / d;
            a = 0.25 * (r[1][0] - r[0][1]) / d;
        }
        if (a < 0) {
            b = -b;
            c = -c;
            d = -d;
        }
        return new Quatern(b, c, d, size[0], size[1], size[2], qfac);
    }

    /**
     * Whether two headers place their voxels at the same world positions. When both carry an
     * orientation (sform or qform code &gt; 0) the affines must agree within
     * {@link #TOLERANCE_VOXELS} of the smallest voxel size; when either has none, only the voxel
     * sizes are compared (an image without orientation cannot contradict one).
     *
     * @param a one header
     * @param b the other
     * @return null if they agree, else a short description of the difference
     */
    static String difference(NiftiHeader a, NiftiHeader b) {
        double voxel = Double.POSITIVE_INFINITY;
        for (int i = 1; i <= 3; i++) {
            voxel = Math.min(voxel, Math.abs(a.pixdim(i)) > 0 ? Math.abs(a.pixdim(i)) : 1);
        }
        double tol = TOLERANCE_VOXELS * voxel;
        boolean oriented = (a.sformCode() > 0 || a.qformCode() > 0) && (b.sformCode() > 0 || b.qformCode() > 0);
        if (!oriented) {
            for (int i = 1; i <= 3; i++) {
                if (Math.abs(Math.abs(a.pixdim(i)) - Math.abs(b.pixdim(i))) > tol) {
                    return "voxel size " + a.pixdim(1) + "x" + a.pixdim(2) + "x" + a.pixdim(3) + " vs "
                            + b.pixdim(1) + "x" + b.pixdim(2) + "x" + b.pixdim(3) + " mm";
                }
            }
            return null;
        }
        double[] ma = of(a);
        double[] mb = of(b);
        for (int i = 0; i < 12; i++) {
            if (!(Math.abs(ma[i] - mb[i]) <= tol)) {
                return "affine " + text(ma) + " vs " + text(mb);
            }
        }
        return null;
    }

    private static String text(double[] m) {
        StringBuilder sb = new StringBuilder("[");
        for (int i = 0; i < 12; i++) {
            sb.append(i == 0 ? "" : i % 4 == 0 ? "; " : " ").append(String.format(java.util.Locale.ROOT, "%.4g", m[i]));
        }
        return sb.append(']').toString();
    }
}
