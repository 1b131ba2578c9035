package org.echotrellis.fit;

import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Tissue;

/**
 * Everything a T2 fit needs besides the data, immutable. The acquisition (pulses, slice profile,
 * repetition time, diffusion) is the protocol's; the fit adds only the fixed T1 and its bounds.
 *
 * @param protocol the acquisition; must be a CPMG train ({@link Protocol#cpmg()})
 * @param t1Ms fixed T1 in ms (the echo train depends weakly on it; Lebel &amp; Wilman 2010)
 * @param t2MinMs lower T2 bound in ms
 * @param t2MaxMs upper T2 bound in ms
 * @param b1Min lower B1 bound
 * @param b1Max upper B1 bound (before folding)
 * @param fold report the folded B1 where the train is symmetric about a refocusing angle of 180°
 *        (constant refocusing, no slice selection): α and 360° − α give identical magnitude trains
 * @param noiseSigma channel noise σ for the Rician mean model, or NaN for plain least squares
 * @param monoOffset fit a constant offset in the mono-exponential model
 * @param monoSkipFirst drop the first echo in the mono-exponential model
 */
public record FitSettings(Protocol protocol, double t1Ms, double t2MinMs, double t2MaxMs, double b1Min, double b1Max,
                          boolean fold, double noiseSigma, boolean monoOffset, boolean monoSkipFirst) {

    /**
     * Validates.
     *
     * @param protocol the acquisition; must be a CPMG train ({@link Protocol#cpmg()})
     * @param t1Ms fixed T1 in ms (the echo train depends weakly on it; Lebel &amp; Wilman 2010)
     * @param t2MinMs lower T2 bound in ms
     * @param t2MaxMs upper T2 bound in ms
     * @param b1Min lower B1 bound
     * @param b1Max upper B1 bound (before folding)
     * @param fold report the folded B1 where the train is symmetric about a refocusing angle of 180°
     *        (constant refocusing, no slice selection): α and 360° − α give identical magnitude trains
     * @param noiseSigma channel noise σ for the Rician mean model, or NaN for plain least squares
     * @param monoOffset fit a constant offset in the mono-exponential model
     * @param monoSkipFirst drop the first echo in the mono-exponential model
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public FitSettings {
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.positive("t2_min_ms", t2MinMs, null);
        Checks.positive("t2_max_ms", t2MaxMs, null);
        Checks.require(t2MaxMs > t2MinMs, "t2_max_ms must be > t2_min_ms, got " + t2MaxMs + " <= " + t2MinMs);
        Checks.positive("b1_min", b1Min, null);
        Checks.positive("b1_max", b1Max, null);
        Checks.require(b1Max > b1Min, "b1_max must be > b1_min, got " + b1Max + " <= " + b1Min);
        Checks.require(Double.isNaN(noiseSigma) || noiseSigma > 0 && Double.isFinite(noiseSigma),
                "noise_sigma must be a finite number > 0, got " + noiseSigma);
        Checks.require(protocol.cpmg().isPresent(),
                "the protocol's refocusing phases are not CPMG (excitation phase ± 90°); fit needs a CPMG train");
    }

    /**
     * Defaults of the command for a protocol: T1 of the protocol's tissue, T2 1–5000 ms, B1 0.3–1.7
     * folded where the train is symmetric, no noise model, mono without offset using all echoes.
     *
     * @param protocol the acquisition
     * @return the settings
     */
    public static FitSettings defaults(Protocol protocol) {
        return new FitSettings(protocol, protocol.tissue().t1Ms(), 1, 5000, 0.3, 1.7, true, Double.NaN, false, false);
    }

    /**
     * Defaults for a bare CPMG train with ideal pulses and T1 1000 ms.
     *
     * @param train the train
     * @return the settings
     */
    public static FitSettings defaults(CpmgTrain train) {
        return defaults(Protocol.ofTrain("train", "", new Tissue("", 1000, 100), 1, train, "built-in"));
    }

    /** @return the protocol's CPMG train */
    public CpmgTrain train() {
        return protocol.cpmg().orElseThrow();
    }

    /**
     * @param sigma channel noise σ in signal units for the Rician mean model, or NaN for plain least squares
     * @return a copy with another noise σ (NaN for none)
     * @throws org.echotrellis.InputException if the new values break the rules of the constructor
     */
    public FitSettings withNoiseSigma(double sigma) {
        return new FitSettings(protocol, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, sigma, monoOffset, monoSkipFirst);
    }

    /**
     * @param t1 fixed T1 in ms, &gt; 0 (+Infinity for none)
     * @return a copy with another fixed T1
     * @throws org.echotrellis.InputException if the new values break the rules of the constructor
     */
    public FitSettings withT1Ms(double t1) {
        return new FitSettings(protocol, t1, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, monoOffset, monoSkipFirst);
    }

    /**
     * @param lo lower T2 bound in ms, &gt; 0
     * @param hi upper T2 bound in ms, &gt; {@code lo}
     * @return a copy with other T2 bounds
     * @throws org.echotrellis.InputException if the new values break the rules of the constructor
     */
    public FitSettings withT2Bounds(double lo, double hi) {
        return new FitSettings(protocol, t1Ms, lo, hi, b1Min, b1Max, fold, noiseSigma, monoOffset, monoSkipFirst);
    }

    /**
     * @param lo lower B1 bound (scale of the nominal flips), &gt; 0
     * @param hi upper B1 bound before folding, &gt; {@code lo}
     * @return a copy with other B1 bounds
     * @throws org.echotrellis.InputException if the new values break the rules of the constructor
     */
    public FitSettings withB1Bounds(double lo, double hi) {
        return new FitSettings(protocol, t1Ms, t2MinMs, t2MaxMs, lo, hi, fold, noiseSigma, monoOffset, monoSkipFirst);
    }

    /**
     * @param offset fit a constant offset in the mono-exponential model
     * @param skipFirst drop the first echo in the mono-exponential model
     * @return a copy with other mono-exponential options
     */
    public FitSettings withMono(boolean offset, boolean skipFirst) {
        return new FitSettings(protocol, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, offset, skipFirst);
    }

    /**
     * @param f report the folded B1 where the train is symmetric about a 180° refocusing angle
     * @return a copy with folding on or off
     */
    public FitSettings withFold(boolean f) {
        return new FitSettings(protocol, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, f, noiseSigma, monoOffset, monoSkipFirst);
    }

    /**
     * The B1 upper bound used by the fit: with folding, a constant refocusing flip α and a train
     * symmetric about 180° (no slice selection), the smaller of b1Max and 180°/α. With a slice
     * profile each position folds at its own B1, so the summed train is not symmetric about any one
     * B1 and is not folded (METHODS §10).
     *
     * @return the effective upper bound
     */
    public double effectiveB1Max() {
        if (!fold || !constantRefocusing() || Acquisitions.sliceSelective(protocol)) {
            return b1Max;
        }
        double limit = 180.0 / train().refocusFlipDeg(0);
        return Math.max(b1Min * 1.0001, Math.min(b1Max, limit));
    }

    /** @return true if folding lowers the B1 bound (a fit ending there has not hit a bound) */
    public boolean foldActive() {
        return effectiveB1Max() < b1Max;
    }

    private boolean constantRefocusing() {
        CpmgTrain train = train();
        double a = train.refocusFlipDeg(0);
        for (int i = 1; i < train.echoes(); i++) {
            if (train.refocusFlipDeg(i) != a) {
                return false;
            }
        }
        return true;
    }
}
