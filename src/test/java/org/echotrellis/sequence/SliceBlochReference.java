package org.echotrellis.sequence;

import java.util.Arrays;

/**
 * Independent reference for 2-D multi-echo spin-echo trains: a brute-force Bloch simulation of
 * isochromats across the slice and across one crusher cycle (Bloch 1946). Shares no code with the
 * engine, the acquisition model or {@code PulseShape}.
 *
 * <ul>
 *   <li>Pulses: the envelope (Hann-windowed sinc with TBW/2 zero crossings per side, or a Gaussian
 *   truncated to the pulse whose untruncated spectrum has FWHM TBW/duration) in {@link #STEPS}
 *   piecewise-constant steps, each an exact right-handed rotation about (&omega;<sub>1</sub>cos&phi;,
 *   &omega;<sub>1</sub>sin&phi;, &Delta;&omega;) with the slice-select gradient's offset &Delta;&omega; = 2&pi;f, f in
 *   cycles per pulse duration. B1 scales &omega;<sub>1</sub>. Excitation about y (phase 90&deg;),
 *   refocusing about x (phase 0&deg;): CPMG.</li>
 *   <li>Gradients: after the excitation a rephasing lobe of half the pulse's moment (free precession
 *   by &minus;&pi;f); around each refocusing pulse the slice-select moment outside the pulse centre is
 *   balanced by the crushers (free precession by &minus;&pi;f before and after the pulse); every half echo
 *   spacing adds one crusher cycle (phase &theta; across the isochromats of the cycle).</li>
 *   <li>Slice: the slice width is the FWHM of the excitation |M<sub>xy</sub>| profile at the nominal
 *   flip (found here by bisection); the refocusing pulse's gradient makes its slice
 *   {@code widthRatio} times wider (offsets divided by the ratio, same envelope). Positions span
 *   &plusmn;{@link #HALF_RANGE} slice widths; the echo is the complex signal summed over positions times the
 *   spacing (per unit slice width) and averaged over the crusher cycle.</li>
 *   <li>Relaxation over each half echo spacing (pulses act at their centres); with a repetition time,
 *   ideal spoiling before each excitation (transverse magnetization and the modulated part of
 *   M<sub>z</sub> removed) and T1 recovery until the next excitation, repeated until the echoes change by
 *   less than 1e-12.</li>
 * </ul>
 * Cost: about 0.1–0.5 s per 32-echo train on one core.
 */
public final class SliceBlochReference {
    /** Piecewise-constant steps per pulse. */
    public static final int STEPS = 1000;
    /** Half range of the simulated positions in slice widths. */
    public static final double HALF_RANGE = 2.5;
    /** Position spacing in slice widths. */
    public static final double SPACING = 1.0 / 50;

    private SliceBlochReference() { }

    /**
     * One acquisition.
     *
     * @param shape {@code sinc} or {@code gauss}
     * @param timeBandwidth TBW of both pulses
     * @param excitationMs excitation duration (no effect: pulses act at their centres, no diffusion)
     * @param refocusingMs refocusing duration (no effect, as above)
     * @param widthRatio refocusing slice width / excitation slice width
     * @param excitationFlipDeg nominal excitation flip
     * @param refocusingFlipsDeg nominal refocusing flip per echo
     * @param echoSpacingMs ESP
     * @param t1Ms T1 (ms)
     * @param t2Ms T2 (ms)
     * @param b1 B1 scale of every pulse's amplitude
     * @param repetitionMs TR (ms), or +Infinity for one train from equilibrium
     */
    public record Settings(String shape, double timeBandwidth, double excitationMs, double refocusingMs,
                           double widthRatio, double excitationFlipDeg, double[] refocusingFlipsDeg,
                           double echoSpacingMs, double t1Ms, double t2Ms, double b1, double repetitionMs) {

        /**
         * Constant refocusing flip, one train from equilibrium.
         *
         * @param shape sinc or gauss
         * @param tbw time-bandwidth product
         * @param widthRatio refocusing width ratio
         * @param excitationFlipDeg excitation flip
         * @param refocusingFlipDeg refocusing flip
         * @param echoes echoes
         * @param espMs echo spacing
         * @param t1Ms T1
         * @param t2Ms T2
         * @param b1 B1 scale
         * @return the settings (2 ms pulses)
         */
        public static Settings of(String shape, double tbw, double widthRatio, double excitationFlipDeg,
                                  double refocusingFlipDeg, int echoes, double espMs, double t1Ms, double t2Ms, double b1) {
            double[] f = new double[echoes];
            Arrays.fill(f, refocusingFlipDeg);
            return new Settings(shape, tbw, 2, 2, widthRatio, excitationFlipDeg, f, espMs, t1Ms, t2Ms, b1,
                    Double.POSITIVE_INFINITY);
        }

        /** @return a copy with another B1 */
        public Settings withB1(double v) {
            return new Settings(shape, timeBandwidth, excitationMs, refocusingMs, widthRatio, excitationFlipDeg,
                    refocusingFlipsDeg, echoSpacingMs, t1Ms, t2Ms, v, repetitionMs);
        }

        /** @return a copy with another T2 */
        public Settings withT2Ms(double v) {
            return new Settings(shape, timeBandwidth, excitationMs, refocusingMs, widthRatio, excitationFlipDeg,
                    refocusingFlipsDeg, echoSpacingMs, t1Ms, v, b1, repetitionMs);
        }

        /** @return a copy with a repetition time */
        public Settings withRepetitionMs(double v) {
            return new Settings(shape, timeBandwidth, excitationMs, refocusingMs, widthRatio, excitationFlipDeg,
                    refocusingFlipsDeg, echoSpacingMs, t1Ms, t2Ms, b1, v);
        }
    }

    /**
     * @param s the acquisition
     * @return {re[], im[]}: the complex echoes per unit slice width (excitation along y puts the echoes on
     *     the real axis up to the slice-profile phase)
     */
    public static double[][] echoes(Settings s) {
        double[] env = envelope(s.shape(), s.timeBandwidth());
        double exc = Math.toRadians(s.excitationFlipDeg());
        double width = fwhm(env, exc);
        int n = s.refocusingFlipsDeg().length;
        int spins = 2 * n + 2;
        int half = (int) Math.round(HALF_RANGE / SPACING);
        double[] re = new double[n];
        double[] im = new double[n];
        double[] distinct = Arrays.stream(s.refocusingFlipsDeg()).distinct().toArray();
        double[][] refRot = new double[distinct.length][];
        for (int i = -half; i <= half; i++) {
            double z = i * SPACING;
            double fe = z * width;
            double fr = fe / s.widthRatio();
            double[] excRot = pulse(env, s.b1() * exc, Math.PI / 2, fe);
            for (int d = 0; d < distinct.length; d++) {
                refRot[d] = pulse(env, s.b1() * Math.toRadians(distinct[d]), 0, fr);
            }
            double[][] e = position(s, excRot, distinct, refRot, spins);
            for (int k = 0; k < n; k++) {
                re[k] += SPACING * e[0][k];
                im[k] += SPACING * e[1][k];
            }
        }
        return new double[][] {re, im};
    }

    /**
     * The same acquisition with ideal non-selective pulses (one position; shape and width ratio unused).
     *
     * @param s the acquisition
     * @return {re[], im[]}
     */
    public static double[][] nonSelectiveEchoes(Settings s) {
        double[] distinct = Arrays.stream(s.refocusingFlipsDeg()).distinct().toArray();
        double[][] refRot = new double[distinct.length][];
        for (int d = 0; d < distinct.length; d++) {
            refRot[d] = rodrigues(s.b1() * Math.toRadians(distinct[d]), 0, 0);
        }
        double[] excRot = rodrigues(0, s.b1() * Math.toRadians(s.excitationFlipDeg()), 0);
        return position(s, excRot, distinct, refRot, 2 * s.refocusingFlipsDeg().length + 2);
    }

    /**
     * @param s the acquisition
     * @return echo magnitudes per unit slice width
     */
    public static double[] magnitudes(Settings s) {
        double[][] e = echoes(s);
        double[] m = new double[e[0].length];
        for (int i = 0; i < m.length; i++) {
            m[i] = Math.hypot(e[0][i], e[1][i]);
        }
        return m;
    }

    /** Envelope at the step mid-points, peak 1. */
    static double[] envelope(String shape, double tbw) {
        double[] b = new double[STEPS];
        double sigma = Math.sqrt(2 * Math.log(2)) / (Math.PI * tbw);
        for (int j = 0; j < STEPS; j++) {
            double x = (j + 0.5) / STEPS - 0.5;
            if (shape.equals("sinc")) {
                double a = Math.PI * tbw * x;
                b[j] = (a == 0 ? 1 : Math.sin(a) / a) * (0.5 + 0.5 * Math.cos(2 * Math.PI * x));
            } else if (shape.equals("gauss")) {
                b[j] = Math.exp(-x * x / (2 * sigma * sigma));
            } else {
                throw new IllegalArgumentException(shape);
            }
        }
        return b;
    }

    /**
     * The 3x3 rotation (row-major) of the pulse at offset f (cycles per duration) including the balancing
     * free precession of -pi f before and after it.
     */
    static double[] pulse(double[] env, double flipRad, double phaseRad, double f) {
        double area = 0;
        for (double v : env) {
            area += v;
        }
        double dt = 1.0 / env.length;
        double scale = flipRad / (area * dt);
        double dw = 2 * Math.PI * f;
        double[] r = zRotation(-0.5 * dw);
        for (double v : env) {
            double w1 = scale * v;
            double[] step = rodrigues(w1 * Math.cos(phaseRad) * dt, w1 * Math.sin(phaseRad) * dt, dw * dt);
            r = multiply(step, r);
        }
        return multiply(zRotation(-0.5 * dw), r);
    }

    static double[] zRotation(double angle) {
        return rodrigues(0, 0, angle);
    }

    /** Right-handed rotation by |v| about v. */
    static double[] rodrigues(double vx, double vy, double vz) {
        double a = Math.sqrt(vx * vx + vy * vy + vz * vz);
        if (a == 0) {
            return new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1};
        }
        double x = vx / a;
        double y = vy / a;
        double z = vz / a;
        double c = Math.cos(a);
        double s = Math.sin(a);
        double t = 1 - c;
        return new double[] {
            c + x * x * t, x * y * t - z * s, x * z * t + y * s,
            y * x * t + z * s, c + y * y * t, y * z * t - x * s,
            z * x * t - y * s, z * y * t + x * s, c + z * z * t};
    }

    static double[] multiply(double[] a, double[] b) {
        double[] c = new double[9];
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                c[3 * i + j] = a[3 * i] * b[j] + a[3 * i + 1] * b[3 + j] + a[3 * i + 2] * b[6 + j];
            }
        }
        return c;
    }

    /** FWHM in cycles per duration of |Mxy| after the excitation from Mz = 1. */
    static double fwhm(double[] env, double flipRad) {
        double centre = transverse(env, flipRad, 0);
        double f = 0;
        while (transverse(env, flipRad, f + 0.05) >= 0.5 * centre) {
            f += 0.05;
        }
        double lo = f;
        double hi = f + 0.05;
        for (int i = 0; i < 50; i++) {
            double m = 0.5 * (lo + hi);
            if (transverse(env, flipRad, m) >= 0.5 * centre) {
                lo = m;
            } else {
                hi = m;
            }
        }
        return lo + hi;
    }

    static double transverse(double[] env, double flipRad, double f) {
        double[] r = pulse(env, flipRad, Math.PI / 2, f);
        return Math.hypot(r[2], r[5]); // rotation applied to (0, 0, 1): third column
    }

    /** Echoes at one slice position: isochromats over one crusher cycle, repeated to steady state. */
    private static double[][] position(Settings s, double[] excRot, double[] distinct, double[][] refRot, int spins) {
        int n = s.refocusingFlipsDeg().length;
        double esp = s.echoSpacingMs();
        double e1 = Math.exp(-0.5 * esp / s.t1Ms());
        double e2 = Math.exp(-0.5 * esp / s.t2Ms());
        boolean tr = Double.isFinite(s.repetitionMs());
        double eRec = tr ? Math.exp(-(s.repetitionMs() - n * esp) / s.t1Ms()) : 0;
        double[] mx = new double[spins];
        double[] my = new double[spins];
        double[] mz = new double[spins];
        double[] cosT = new double[spins];
        double[] sinT = new double[spins];
        for (int j = 0; j < spins; j++) {
            cosT[j] = Math.cos(2 * Math.PI * j / spins);
            sinT[j] = Math.sin(2 * Math.PI * j / spins);
        }
        int[] which = new int[n];
        for (int p = 0; p < n; p++) {
            which[p] = Arrays.binarySearch(sortedCopy(distinct), s.refocusingFlipsDeg()[p]);
        }
        double[][] sortedRot = new double[distinct.length][];
        double[] sorted = sortedCopy(distinct);
        for (int d = 0; d < distinct.length; d++) {
            for (int e = 0; e < distinct.length; e++) {
                if (distinct[e] == sorted[d]) {
                    sortedRot[d] = refRot[e];
                }
            }
        }
        double mz0 = 1;
        double[] re = new double[n];
        double[] im = new double[n];
        double[] prev = new double[n];
        for (int rep = 0; rep < 100_000; rep++) {
            for (int j = 0; j < spins; j++) {
                mx[j] = excRot[2] * mz0;
                my[j] = excRot[5] * mz0;
                mz[j] = excRot[8] * mz0;
            }
            for (int p = 0; p < n; p++) {
                interval(mx, my, mz, cosT, sinT, e1, e2);
                rotate(sortedRot[which[p]], mx, my, mz);
                interval(mx, my, mz, cosT, sinT, e1, e2);
                double sx = 0;
                double sy = 0;
                for (int j = 0; j < spins; j++) {
                    sx += mx[j];
                    sy += my[j];
                }
                re[p] = sx / spins;
                im[p] = sy / spins;
            }
            if (!tr) {
                break;
            }
            double zMean = 0;
            for (int j = 0; j < spins; j++) {
                zMean += mz[j];
            }
            zMean /= spins; // spoiling keeps only the unmodulated longitudinal magnetization
            mz0 = zMean * eRec + 1 - eRec;
            double change = 0;
            for (int p = 0; p < n; p++) {
                change = Math.max(change, Math.abs(re[p] - prev[p]));
                prev[p] = re[p];
            }
            if (rep > 0 && change < 1e-12) {
                break;
            }
        }
        return new double[][] {re, im};
    }

    private static double[] sortedCopy(double[] v) {
        double[] c = v.clone();
        Arrays.sort(c);
        return c;
    }

    private static void interval(double[] mx, double[] my, double[] mz, double[] cosT, double[] sinT, double e1, double e2) {
        for (int j = 0; j < mx.length; j++) {
            double x = mx[j];
            double y = my[j];
            mx[j] = e2 * (x * cosT[j] - y * sinT[j]);
            my[j] = e2 * (x * sinT[j] + y * cosT[j]);
            mz[j] = e1 * mz[j] + 1 - e1;
        }
    }

    private static void rotate(double[] r, double[] mx, double[] my, double[] mz) {
        for (int j = 0; j < mx.length; j++) {
            double x = mx[j];
            double y = my[j];
            double z = mz[j];
            mx[j] = r[0] * x + r[1] * y + r[2] * z;
            my[j] = r[3] * x + r[4] * y + r[5] * z;
            mz[j] = r[6] * x + r[7] * y + r[8] * z;
        }
    }
}
