package org.echotrellis.fit;

import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgTrain;

/**
 * Everything a T2 fit needs besides the data, immutable.
 *
 * @param train the protocol's CPMG train (real excitation and refocusing schedule)
 * @param t1Ms fixed T1 in ms (the echo train depends weakly on it; Lebel &amp; Wilman 2010)
 * @param t2MinMs lower T2 bound in ms
 * @param t2MaxMs upper T2 bound in ms
 * @param b1Min lower B1 bound
 * @param b1Max upper B1 bound (before folding)
 * @param fold report the folded B1 for constant trains: the refocusing angle B1·α is kept ≤ 180°,
 *        since α and 360° − α give identical magnitude trains
 * @param noiseSigma channel noise σ for the Rician mean model, or NaN for plain least squares
 * @param profile slice profile (or {@link SliceProfile#none()})
 * @param monoOffset fit a constant offset in the mono-exponential model
 * @param monoSkipFirst drop the first echo in the mono-exponential model
 */
public record FitSettings(CpmgTrain train, double t1Ms, double t2MinMs, double t2MaxMs, double b1Min, double b1Max,
                          boolean fold, double noiseSigma, SliceProfile profile, boolean monoOffset,
                          boolean monoSkipFirst) {

    /** Validates. */
    public FitSettings {
        Checks.positiveOrInfinite("--t1-ms", t1Ms, null);
        Checks.positive("--t2-min-ms", t2MinMs, null);
        Checks.positive("--t2-max-ms", t2MaxMs, null);
        Checks.require(t2MaxMs > t2MinMs, "--t2-max-ms must be > --t2-min-ms, got " + t2MaxMs + " <= " + t2MinMs);
        Checks.positive("--b1-min", b1Min, null);
        Checks.positive("--b1-max", b1Max, null);
        Checks.require(b1Max > b1Min, "--b1-max must be > --b1-min, got " + b1Max + " <= " + b1Min);
        Checks.require(Double.isNaN(noiseSigma) || noiseSigma > 0 && Double.isFinite(noiseSigma),
                "--noise-sigma must be a finite number > 0, got " + noiseSigma);
        Checks.require(train.isCpmgPhased(), "the protocol's refocusing phases are not CPMG (excitation phase ± 90°); fit needs a CPMG train");
    }

    /**
     * Defaults of the command: T1 1000 ms, T2 1–5000 ms, B1 0.3–1.7 folded, no noise model, no
     * slice profile, mono without offset using all echoes.
     *
     * @param train the protocol's train
     * @return the settings
     */
    public static FitSettings defaults(CpmgTrain train) {
        return new FitSettings(train, 1000, 1, 5000, 0.3, 1.7, true, Double.NaN, SliceProfile.none(), false, false);
    }

    /** @return a copy with another slice profile */
    public FitSettings withProfile(SliceProfile p) {
        return new FitSettings(train, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, p, monoOffset, monoSkipFirst);
    }

    /** @return a copy with another noise σ (NaN for none) */
    public FitSettings withNoiseSigma(double sigma) {
        return new FitSettings(train, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, sigma, profile, monoOffset, monoSkipFirst);
    }

    /** @return a copy with other T2 bounds */
    public FitSettings withT2Bounds(double lo, double hi) {
        return new FitSettings(train, t1Ms, lo, hi, b1Min, b1Max, fold, noiseSigma, profile, monoOffset, monoSkipFirst);
    }

    /** @return a copy with other mono-exponential options */
    public FitSettings withMono(boolean offset, boolean skipFirst) {
        return new FitSettings(train, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, profile, offset, skipFirst);
    }

    /** @return a copy with folding on or off */
    public FitSettings withFold(boolean f) {
        return new FitSettings(train, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, f, noiseSigma, profile, monoOffset, monoSkipFirst);
    }

    /**
     * The B1 upper bound used by the fit: with folding, a constant refocusing flip α and no slice
     * profile, the smaller of b1Max and 180°/α. With a slice profile each position folds at its own
     * B1 = 180°/(f·α), so the summed train is not symmetric about any one B1 and is not folded.
     *
     * @return the effective upper bound
     */
    public double effectiveB1Max() {
        if (!fold || !constantRefocusing() || profile.positions() > 1) {
            return b1Max;
        }
        double limit = 180.0 / (train.refocusFlipDeg(0) * profile.refocusingFactors()[0]);
        return Math.max(b1Min * 1.0001, Math.min(b1Max, limit));
    }

    /** @return true if folding lowers the B1 bound (a fit ending there has not hit a bound) */
    public boolean foldActive() {
        return effectiveB1Max() < b1Max;
    }

    private boolean constantRefocusing() {
        double a = train.refocusFlipDeg(0);
        for (int i = 1; i < train.echoes(); i++) {
            if (train.refocusFlipDeg(i) != a) {
                return false;
            }
        }
        return true;
    }
}
