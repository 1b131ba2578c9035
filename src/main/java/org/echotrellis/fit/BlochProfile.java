package org.echotrellis.fit;

import org.echotrellis.sequence.PulseShape;

/**
 * Bloch simulation of an amplitude-modulated RF pulse across the slice with the Cayley–Klein
 * (spinor) parameters (Pauly, Le Roux, Nishimura &amp; Macovski, "Parameter relations for the
 * Shinnar–Le Roux selective excitation pulse design algorithm", IEEE Trans Med Imaging 10:53,
 * 1991). A hard-pulse step of rotation φ about the unit axis n gives a = cos(φ/2) − i n_z sin(φ/2),
 * b = −i(n_x + i n_y) sin(φ/2); steps compose as a ← a_j a − b_j* b, b ← b_j a + a_j* b.
 * From the result: the transverse magnetisation after excitation |M_xy| = 2|a||b|, and for a
 * crushed refocusing pulse the spin-echo fraction |b|², so the EPG-equivalent flip is 2 asin|b|
 * in both cases.
 *
 * <p>Frequencies are in cycles per pulse duration; the pulse is scaled so that its on-resonance
 * flip is the nominal flip (area = flip for a real envelope).
 */
final class BlochProfile {
    private BlochProfile() { }

    /**
     * @param shape the envelope
     * @param flipRad nominal on-resonance flip in radians
     * @param freq offset in cycles per duration
     * @return the EPG-equivalent flip 2 asin|b| in radians
     */
    static double effectiveFlip(PulseShape shape, double flipRad, double freq) {
        double[] s = shape.samples();
        int n = s.length;
        double area = 0;
        for (double v : s) {
            area += v;
        }
        double dt = 1.0 / n;
        double w1Scale = flipRad / (area * dt);       // rad per unit time per unit amplitude
        double dw = 2 * Math.PI * freq;               // rad per unit time
        double ar = 1;
        double ai = 0;
        double br = 0;
        double bi = 0;
        for (double v : s) {
            double wx = w1Scale * v;
            double w = Math.hypot(wx, dw);
            double phi = w * dt;
            double sn = w > 0 ? Math.sin(phi / 2) / w : 0;
            double jr = Math.cos(phi / 2);            // a_j = jr + i·ji
            double ji = -dw * sn;
            double kr = 0;                            // b_j = kr + i·ki = −i·n_x·sin
            double ki = -wx * sn;
            // a' = a_j a − conj(b_j) b
            double nar = jr * ar - ji * ai - (kr * br + ki * bi);
            double nai = jr * ai + ji * ar - (kr * bi - ki * br);
            // b' = b_j a + conj(a_j) b
            double nbr = kr * ar - ki * ai + (jr * br + ji * bi);
            double nbi = kr * ai + ki * ar + (jr * bi - ji * br);
            ar = nar;
            ai = nai;
            br = nbr;
            bi = nbi;
        }
        double mb = Math.min(1.0, Math.hypot(br, bi));
        return 2 * Math.asin(mb);
    }

    /**
     * The full width at half maximum, in cycles per duration, of the excitation profile
     * |M_xy| = sin(effective flip) at the given flip.
     *
     * @param shape envelope
     * @param flipRad excitation flip
     * @return FWHM
     */
    static double excitationFwhm(PulseShape shape, double flipRad) {
        double centre = Math.sin(effectiveFlip(shape, flipRad, 0));
        double step = 0.02;
        double prevF = 0;
        double prev = centre;
        for (double f = step; f < 200; f += step) {
            double v = Math.sin(effectiveFlip(shape, flipRad, f));
            if (v < 0.5 * centre) {
                double frac = (prev - 0.5 * centre) / (prev - v);
                return 2 * (prevF + frac * step);
            }
            prevF = f;
            prev = v;
        }
        throw new org.echotrellis.InputException("pulse shape " + shape.label() + " has no half-maximum width within 200 cycles");
    }
}
