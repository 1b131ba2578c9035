package org.echotrellis.sequence;

import org.echotrellis.Checks;

/**
 * Bloch simulation of an amplitude-modulated RF pulse played with its slice-select gradient, in
 * Cayley–Klein (spinor) form (Pauly, Le Roux, Nishimura &amp; Macovski, "Parameter relations for the
 * Shinnar–Le Roux selective excitation pulse design algorithm", IEEE Trans Med Imaging 10:53, 1991).
 *
 * <p>The envelope is played in {@link #STEPS} piecewise-constant steps; each step is the exact rotation
 * by &phi; = |&omega;|&middot;dt about &omega; = (&omega;<sub>1</sub>, 0, &Delta;&omega;) (RF phase 0, right-handed
 * like the EPG operator), i.e. the spinor U = exp(&minus;i&phi;/2 n&middot;&sigma;) = [[a, &minus;b*], [b, a*]] with
 * a = cos(&phi;/2) &minus; i n<sub>z</sub> sin(&phi;/2), b = &minus;i(n<sub>x</sub> + i n<sub>y</sub>) sin(&phi;/2); steps
 * compose as a &larr; a<sub>j</sub>a &minus; b<sub>j</sub>*b, b &larr; b<sub>j</sub>a + a<sub>j</sub>*b.
 *
 * <p><b>Referred to the centre.</b> The free precession of the two halves of the pulse under the
 * slice-select gradient is removed (the excitation's rephasing lobe, and for a refocusing pulse the
 * balanced slice-select lobes counted with the crushers): U<sub>c</sub> = P(&minus;T/2)&middot;U&middot;P(&minus;T/2).
 * With P a z-rotation this multiplies a by e<sup>i&Delta;&omega;T/2</sup> and leaves b unchanged. An RF phase
 * &phi; multiplies b by e<sup>i&phi;</sup>.
 *
 * <p>Units: time in pulse durations (T = 1), offsets in cycles per duration, so a shape's profile is
 * the same for every duration.
 */
final class PulseRotation {
    /** Piecewise-constant steps of every simulated pulse (hard-pulse error about 1e-6 of a flip). */
    public static final int STEPS = 400;

    private PulseRotation() { }

    /**
     * Resamples an envelope to {@code m} steps, each the mean of the envelope (piecewise constant over
     * its own samples) over the step.
     *
     * @param shape the envelope
     * @param m number of steps (&ge; 1)
     * @return step amplitudes normalised so that their mean is 1 (on-resonance flip = amplitude scale)
     */
    public static double[] steps(PulseShape shape, int m) {
        double[] s = shape.samples();
        int n = s.length;
        double[] out = new double[m];
        for (int j = 0; j < m; j++) {
            double lo = (double) j * n / m;
            double hi = (double) (j + 1) * n / m;
            double acc = 0;
            int i = (int) Math.floor(lo);
            while (i < hi && i < n) {
                double from = Math.max(lo, i);
                double to = Math.min(hi, i + 1);
                acc += s[i] * (to - from);
                i++;
            }
            out[j] = acc / (hi - lo);
        }
        double mean = 0;
        for (double v : out) {
            mean += v;
        }
        mean /= m;
        for (int j = 0; j < m; j++) {
            out[j] /= mean;
        }
        return out;
    }

    /**
     * The rotation of the pulse referred to its centre, RF phase 0.
     *
     * @param steps step amplitudes with mean 1 ({@link #steps})
     * @param flipRad on-resonance flip in radians (the actual one: B1 &times; nominal)
     * @param freq offset in cycles per pulse duration
     * @param out receives {Re a, Im a, Re b, Im b}; modified
     */
    public static void centre(double[] steps, double flipRad, double freq, double[] out) {
        int m = steps.length;
        double dt = 1.0 / m;
        double dw = 2 * Math.PI * freq;
        double ar = 1;
        double ai = 0;
        double br = 0;
        double bi = 0;
        for (int j = 0; j < m; j++) {
            double wx = flipRad * steps[j];
            double w = Math.sqrt(wx * wx + dw * dw);
            double half = 0.5 * w * dt;
            double sn = w > 0 ? Math.sin(half) / w : 0.5 * dt;
            double jr = Math.cos(half);
            double ji = -dw * sn;
            double ki = -wx * sn; // b_j = i*ki (n_y = 0)
            // a' = a_j a - conj(b_j) b = a_j a + i ki b ; b' = b_j a + conj(a_j) b
            double nar = jr * ar - ji * ai - ki * bi;
            double nai = jr * ai + ji * ar + ki * br;
            double nbr = -ki * ai + jr * br + ji * bi;
            double nbi = ki * ar + jr * bi - ji * br;
            ar = nar;
            ai = nai;
            br = nbr;
            bi = nbi;
        }
        // refer to the centre: a *= exp(i dw/2)
        double c = Math.cos(0.5 * dw);
        double s = Math.sin(0.5 * dw);
        out[0] = ar * c - ai * s;
        out[1] = ar * s + ai * c;
        out[2] = br;
        out[3] = bi;
    }

    /**
     * |M<sub>xy</sub>| = 2|a||b| after the pulse from M<sub>z</sub> = 1.
     *
     * @param steps step amplitudes
     * @param flipRad flip in radians
     * @param freq offset in cycles per duration
     * @return the transverse magnetization
     */
    public static double transverse(double[] steps, double flipRad, double freq) {
        double[] r = new double[4];
        centre(steps, flipRad, freq, r);
        return 2 * Math.hypot(r[0], r[1]) * Math.hypot(r[2], r[3]);
    }

    /**
     * Full width at half maximum of the excitation profile |M<sub>xy</sub>(f)| of the pulse at the given
     * flip, in cycles per duration (the slice width in these units).
     *
     * @param steps step amplitudes
     * @param flipRad flip in radians (&gt; 0)
     * @param label shape name for messages
     * @return the FWHM
     */
    public static double fwhm(double[] steps, double flipRad, String label) {
        Checks.require(flipRad > 0, "a slice-selective excitation needs a flip > 0");
        double centre = transverse(steps, flipRad, 0);
        Checks.require(centre > 1e-6, "pulse " + label + " excites no transverse magnetization at the slice centre");
        double step = 0.01;
        double prev = centre;
        for (double f = step; f < 200; f += step) {
            double v = transverse(steps, flipRad, f);
            if (v < 0.5 * centre) {
                double lo = f - step;
                double hi = f;
                for (int it = 0; it < 60; it++) {
                    double mid = 0.5 * (lo + hi);
                    if (transverse(steps, flipRad, mid) < 0.5 * centre) {
                        hi = mid;
                    } else {
                        lo = mid;
                    }
                }
                return lo + hi;
            }
            prev = v;
        }
        throw new org.echotrellis.InputException("pulse " + label + " has no half-maximum width within 200 cycles per duration ("
                + prev + ")");
    }
}
