package org.echotrellis.fit;

import org.echotrellis.sequence.PulseShape;

import java.nio.file.Path;

import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;

/**
 * Builds {@link SliceProfile}s for 2-D multi-slice data by Bloch-simulating the excitation and
 * refocusing pulses across the slice ({@link BlochProfile}), following the slice-profile EPG model
 * of Lebel &amp; Wilman (Magn Reson Med 64:1005, 2010) and McPhee &amp; Wilman (Magn Reson Med
 * 77:2057, 2017).
 *
 * <p>Assumptions: both pulses have the same envelope and duration, so at the same slice-select
 * gradient their frequency axes coincide; the refocusing slice is {@code ratio} times thicker
 * (the gradient is lowered by that factor). Positions are in units of the excitation slice
 * thickness (the FWHM of its Bloch-simulated |M_xy| profile), sampled at the mid-points of
 * {@code positions} equal intervals over [0, 1.5] (the profile is symmetric, so half is
 * simulated), with equal weights (uniform receive sensitivity). The slice-select rephasing is
 * ideal, so the excitation enters through sin of its effective flip (the parity result of the CPMG
 * model). The refocusing profile is simulated at the train's largest refocusing flip and scaled
 * for the others; B1 scales every local flip (the usual approximation of the fitting model).
 */
public final class SliceProfiles {
    /** Half-range of the simulated positions in slice thicknesses. */
    static final double HALF_RANGE = 1.5;

    private SliceProfiles() { }

    /**
     * Parses {@code none}, {@code sinc:TBW}, {@code gauss:TBW} or a pulse file.
     *
     * @param spec the option value
     * @param train the protocol's train (nominal flips)
     * @param positions number of positions (2 to 256)
     * @param ratio refocusing-to-excitation slice thickness ratio (0.5 to 10)
     * @return the profile
     */
    public static SliceProfile parse(String spec, CpmgTrain train, int positions, double ratio) {
        if (spec == null || spec.equals("none")) {
            return SliceProfile.none();
        }
        if ((spec.equals("sinc") || spec.equals("gauss")) && !java.nio.file.Files.exists(Path.of(spec))) {
            throw new InputException("--slice-profile " + spec + " needs the pulse's time-bandwidth product: "
                    + spec + ":TBW, e.g. " + spec + ":4");
        }
        PulseShape shape;
        if (spec.startsWith("sinc:") || spec.startsWith("gauss:")) {
            String num = spec.substring(spec.indexOf(':') + 1);
            double tbw;
            try {
                tbw = Double.parseDouble(num);
            } catch (NumberFormatException e) {
                throw new InputException("--slice-profile " + spec + ": TBW must be a number, e.g. sinc:4");
            }
            Checks.inRange("--slice-profile TBW", tbw, 1, 32, spec);
            shape = spec.startsWith("sinc:") ? PulseShape.sinc(tbw) : PulseShape.gauss(tbw);
        } else {
            shape = PulseShape.fromFile(Path.of(spec), "--slice-profile");
        }
        return simulate(shape, train, positions, ratio);
    }

    /**
     * @param shape the envelope of both pulses
     * @param train the protocol's train
     * @param positions number of positions (2 to 256)
     * @param ratio refocusing-to-excitation slice thickness ratio (0.5 to 10)
     * @return the profile
     */
    public static SliceProfile simulate(PulseShape shape, CpmgTrain train, int positions, double ratio) {
        Checks.inRange("--slice-positions", positions, 2, 256, null);
        Checks.inRange("--refocus-slice-ratio", ratio, 0.5, 10, null);
        double exc = Math.toRadians(train.excitationFlipDeg());
        double ref = 0;
        for (int i = 0; i < train.echoes(); i++) {
            ref = Math.max(ref, Math.toRadians(train.refocusFlipDeg(i)));
        }
        double fwhm = BlochProfile.excitationFwhm(shape, exc);
        double[] fe = new double[positions];
        double[] fr = new double[positions];
        double[] w = new double[positions];
        for (int i = 0; i < positions; i++) {
            double z = (i + 0.5) * HALF_RANGE / positions;
            double f = z * fwhm;
            fe[i] = exc > 0 ? BlochProfile.effectiveFlip(shape, exc, f) / exc : 0;
            fr[i] = ref > 0 ? BlochProfile.effectiveFlip(shape, ref, f / ratio) / ref : 0;
            w[i] = 1.0 / positions;
        }
        return new SliceProfile(shape.label() + (ratio != 1 ? " ratio " + ratio : ""), fe, fr, w);
    }
}
