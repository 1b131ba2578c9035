package org.echotrellis.epg;

/**
 * Brute-force Bloch simulation of M isochromats spread uniformly over one cycle of dephasing phase
 * theta in [0, 2 pi). Shares no code with the engine. Each RF pulse is a right-handed rotation by
 * the flip about the axis (cos phi, sin phi, 0); an interval multiplies M+ = Mx + i My by
 * exp(i d theta) and E2, and relaxes Mz toward 1 with E1 (Bloch 1946). The echo is the mean of M+.
 * With M larger than the total dephasing, the mean is exactly the k = 0 Fourier coefficient, i.e.
 * the EPG echo, so both must agree to rounding.
 */
final class IsochromatReference {
    /** Event kinds of the reference's own little program format. */
    static final int RF = 0;
    static final int INTERVAL = 1;
    static final int ECHO = 2;

    private IsochromatReference() { }

    /**
     * @param kinds event kinds
     * @param a flip deg (RF) or duration ms (INTERVAL)
     * @param b phase deg (RF) or dephasing (INTERVAL)
     * @param t1 T1 ms
     * @param t2 T2 ms
     * @param b1 flip scale
     * @param spins number of isochromats
     * @return echoes as [re0, im0, re1, im1, ...]
     */
    static double[] simulate(int[] kinds, double[] a, double[] b, double t1, double t2, double b1, int spins) {
        double[] mx = new double[spins];
        double[] my = new double[spins];
        double[] mz = new double[spins];
        java.util.Arrays.fill(mz, 1.0);
        int echoes = 0;
        for (int k : kinds) {
            if (k == ECHO) {
                echoes++;
            }
        }
        double[] out = new double[2 * echoes];
        int e = 0;
        for (int i = 0; i < kinds.length; i++) {
            switch (kinds[i]) {
                case RF -> {
                    double alpha = Math.toRadians(a[i]) * b1;
                    double phi = Math.toRadians(b[i]);
                    double ux = Math.cos(phi);
                    double uy = Math.sin(phi);
                    double c = Math.cos(alpha);
                    double s = Math.sin(alpha);
                    for (int j = 0; j < spins; j++) {
                        // Rodrigues: v' = v c + (u x v) s + u (u.v)(1 - c), u = (ux, uy, 0)
                        double x = mx[j];
                        double y = my[j];
                        double z = mz[j];
                        double dot = ux * x + uy * y;
                        double cx = uy * z;
                        double cy = -ux * z;
                        double cz = ux * y - uy * x;
                        mx[j] = x * c + cx * s + ux * dot * (1 - c);
                        my[j] = y * c + cy * s + uy * dot * (1 - c);
                        mz[j] = z * c + cz * s;
                    }
                }
                case INTERVAL -> {
                    double e1 = Math.exp(-a[i] / t1);
                    double e2 = Math.exp(-a[i] / t2);
                    int d = (int) b[i];
                    for (int j = 0; j < spins; j++) {
                        double theta = 2 * Math.PI * j / spins;
                        double c = Math.cos(d * theta);
                        double s = Math.sin(d * theta);
                        double x = mx[j];
                        double y = my[j];
                        mx[j] = e2 * (x * c - y * s);
                        my[j] = e2 * (x * s + y * c);
                        mz[j] = e1 * mz[j] + (1 - e1);
                    }
                }
                default -> {
                    double sx = 0;
                    double sy = 0;
                    for (int j = 0; j < spins; j++) {
                        sx += mx[j];
                        sy += my[j];
                    }
                    out[2 * e] = sx / spins;
                    out[2 * e + 1] = sy / spins;
                    e++;
                }
            }
        }
        return out;
    }
}
