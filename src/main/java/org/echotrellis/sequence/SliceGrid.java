package org.echotrellis.sequence;

import org.echotrellis.epg.CpmgTrain;

/**
 * Positions across the slice at which the acquisition is simulated, in units of the slice width (the
 * FWHM of the excitation profile at its nominal flip), with trapezoid weights, and each pulse's offset
 * frequency at a position. The refocusing pulse's slice-select gradient is chosen so that its slice is
 * {@code refocusingWidthRatio} times as wide, its width measured the same way (FWHM of |M<sub>xy</sub>| at the
 * excitation's nominal flip); for equal envelopes its frequency axis is the excitation's divided by the ratio.
 *
 * <p>The grid extends until the integrand bound |M<sub>xy</sub>|&middot;|b<sub>refocusing</sub>| beyond it, at the
 * largest tabulated B1, integrates to below {@link #TAIL}; the spacing is {@link #SPACING} slice widths
 * (trapezoid rule on a smooth integrand that decays to zero: error far below 1e-4, checked by test).
 *
 * @param z positions in slice widths (z &ge; 0 when {@code halfLine}, else symmetric about 0)
 * @param weights integration weights (per unit slice width)
 * @param excitationFreq offset of the excitation pulse at each position, cycles per its duration
 * @param refocusingFreq offset of the refocusing pulse, cycles per its duration
 * @param halfLine true if only z &ge; 0 is simulated and the mirror half is added by symmetry
 */
record SliceGrid(double[] z, double[] weights, double[] excitationFreq, double[] refocusingFreq, boolean halfLine) {
    /** Grid spacing in slice widths. */
    static final double SPACING = 1.0 / 40;
    /** Tail left out of the integral, relative to a full echo. */
    static final double TAIL = 2e-5;
    private static final double FAR = 8;

    static SliceGrid of(Acquisition acq, CpmgTrain train, double[] excSteps, double[] refSteps, double b1Max,
                        boolean halfLine) {
        double exc = Math.toRadians(train.excitationFlipDeg());
        double maxRef = 0;
        for (int i = 0; i < train.echoes(); i++) {
            maxRef = Math.max(maxRef, Math.toRadians(train.refocusFlipDeg(i)));
        }
        String excLabel = acq.excitationPulse().get().label();
        double we = PulseRotation.fwhm(excSteps, exc, excLabel);
        double wr = PulseRotation.fwhm(refSteps, exc, acq.refocusingPulse().get().label());
        double ratio = acq.refocusingWidthRatio();
        double fe = we;
        double fr = wr / ratio;
        // tail bound at the largest amplitude
        int scan = (int) Math.round(FAR / SPACING);
        double[] g = new double[scan + 1];
        double[] r = new double[4];
        for (int i = 0; i <= scan; i++) {
            double zz = i * SPACING;
            double mxy = 0;
            double bmax = 0;
            for (double s : new double[] {1.0, b1Max}) {
                mxy = Math.max(mxy, PulseRotation.transverse(excSteps, s * exc, zz * fe));
                PulseRotation.centre(refSteps, s * maxRef, zz * fr, r);
                bmax = Math.max(bmax, Math.hypot(r[2], r[3]));
            }
            g[i] = mxy * bmax;
        }
        double tail = 0;
        int last = scan;
        for (int i = scan; i > 0; i--) {
            tail += g[i] * SPACING;
            if (tail > TAIL) {
                last = i;
                break;
            }
        }
        int m = Math.min(scan, last + 2);
        int count = halfLine ? m + 1 : 2 * m + 1;
        double[] z = new double[count];
        double[] w = new double[count];
        double[] ef = new double[count];
        double[] rf = new double[count];
        for (int i = 0; i < count; i++) {
            int j = halfLine ? i : i - m;
            z[i] = j * SPACING;
            w[i] = halfLine ? (j == 0 ? SPACING : 2 * SPACING) : SPACING;
            ef[i] = z[i] * fe;
            rf[i] = z[i] * fr;
        }
        return new SliceGrid(z, w, ef, rf, halfLine);
    }

    int size() {
        return z.length;
    }
}
