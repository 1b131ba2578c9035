package org.echotrellis.fit.volume;

import java.io.Serializable;

import org.echotrellis.Checks;
import org.echotrellis.fit.FitModel;
import org.echotrellis.fit.FitSettings;
import org.echotrellis.sequence.Protocol;

/**
 * The settings of a T2 fit that do not come from the protocol, as plain serialisable values (a
 * distributed job ships them with the {@link org.echotrellis.sequence.ProtocolText}; the workers
 * build {@link FitSettings} from both with {@link #settings(Protocol)}). The acquisition (pulses,
 * slice selection, repetition time, diffusion) is the protocol's, never an option. Immutable; change through
 * the {@code withX} copies.
 *
 * @param model the decay model
 * @param t1Ms fixed T1 in ms (may be +Infinity), or NaN for the protocol tissue's T1
 * @param t2MinMs lower T2 bound in ms
 * @param t2MaxMs upper T2 bound in ms
 * @param b1Min lower B1 bound
 * @param b1Max upper B1 bound before folding
 * @param fold report the folded B1 for constant trains (see {@link FitSettings#effectiveB1Max()})
 * @param noiseSigma channel noise σ for the Rician mean model, NaN for plain least squares
 * @param noiseFromBackground estimate σ from the voxels outside the mask (volumes with a mask only;
 *        {@code noiseSigma} is then ignored)
 * @param monoOffset fit a constant offset in the mono-exponential model
 * @param monoSkipFirst drop the first echo in the mono-exponential model
 * @param compareMono also fit the mono-exponential model (EPG model only; map {@code mono_t2_ms})
 * @serial exclude
 */
public record FitOptions(FitModel model, double t1Ms, double t2MinMs, double t2MaxMs, double b1Min, double b1Max,
                         boolean fold, double noiseSigma, boolean noiseFromBackground, boolean monoOffset,
                         boolean monoSkipFirst, boolean compareMono) implements Serializable {
    private static final long serialVersionUID = 1L;

    /** The defaults of the {@code fit} command: EPG, T1 of the protocol tissue, T2 1–5000 ms, B1 0.3–1.7 folded, no noise model. */
    public static final FitOptions DEFAULT = new FitOptions(FitModel.EPG, Double.NaN, 1, 5000, 0.3, 1.7, true, Double.NaN,
            false, false, false, false);

    /**
     * Validates the values that need no protocol (parameters are named by their summary keys).
     *
     * @param model the decay model
     * @param t1Ms fixed T1 in ms (may be +Infinity), or NaN for the protocol tissue's T1
     * @param t2MinMs lower T2 bound in ms
     * @param t2MaxMs upper T2 bound in ms
     * @param b1Min lower B1 bound
     * @param b1Max upper B1 bound before folding
     * @param fold report the folded B1 for constant trains (see {@link FitSettings#effectiveB1Max()})
     * @param noiseSigma channel noise σ for the Rician mean model, NaN for plain least squares
     * @param noiseFromBackground estimate σ from the voxels outside the mask (volumes with a mask only;
     *        {@code noiseSigma} is then ignored)
     * @param monoOffset fit a constant offset in the mono-exponential model
     * @param monoSkipFirst drop the first echo in the mono-exponential model
     * @param compareMono also fit the mono-exponential model (EPG model only; map {@code mono_t2_ms})
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public FitOptions {
        Checks.require(model != null, "model must be epg or mono, got null");
        Checks.require(Double.isNaN(t1Ms) || t1Ms > 0, "t1_ms must be > 0 (or NaN for the protocol tissue's), got " + t1Ms);
        Checks.positive("t2_min_ms", t2MinMs, null);
        Checks.positive("t2_max_ms", t2MaxMs, null);
        Checks.require(t2MaxMs > t2MinMs, "t2_max_ms must be > t2_min_ms, got " + t2MaxMs + " <= " + t2MinMs);
        Checks.positive("b1_min", b1Min, null);
        Checks.positive("b1_max", b1Max, null);
        Checks.require(b1Max > b1Min, "b1_max must be > b1_min, got " + b1Max + " <= " + b1Min);
        Checks.require(Double.isNaN(noiseSigma) || noiseSigma > 0 && Double.isFinite(noiseSigma),
                "noise_sigma must be a finite number > 0 (or NaN for none), got " + noiseSigma);
    }

    /**
     * Builds the fit settings for a protocol (its whole acquisition is the model).
     *
     * @param protocol the acquisition (a CPMG train)
     * @return the settings; the noise σ is NaN when it is to be estimated from the background
     */
    public FitSettings settings(Protocol protocol) {
        return new FitSettings(protocol, Double.isNaN(t1Ms) ? protocol.tissue().t1Ms() : t1Ms, t2MinMs, t2MaxMs, b1Min,
                b1Max, fold, noiseFromBackground ? Double.NaN : noiseSigma, monoOffset, monoSkipFirst);
    }

    /** @return where the fixed T1 comes from: {@code t1_ms} (given) or {@code protocol tissue} */
    public String t1Source() {
        return Double.isNaN(t1Ms) ? "protocol tissue" : "t1_ms";
    }

    /**
     * @param m the model
     * @return a copy with another model
     */
    public FitOptions withModel(FitModel m) {
        return new FitOptions(m, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, noiseFromBackground,
                monoOffset, monoSkipFirst, compareMono);
    }

    /**
     * @param ms fixed T1 in ms
     * @return a copy with another T1
     */
    public FitOptions withT1Ms(double ms) {
        return new FitOptions(model, ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, noiseFromBackground,
                monoOffset, monoSkipFirst, compareMono);
    }

    /**
     * @param lo lower T2 bound in ms
     * @param hi upper T2 bound in ms
     * @return a copy with other T2 bounds
     */
    public FitOptions withT2BoundsMs(double lo, double hi) {
        return new FitOptions(model, t1Ms, lo, hi, b1Min, b1Max, fold, noiseSigma, noiseFromBackground,
                monoOffset, monoSkipFirst, compareMono);
    }

    /**
     * @param lo lower B1 bound
     * @param hi upper B1 bound before folding
     * @return a copy with other B1 bounds
     */
    public FitOptions withB1Bounds(double lo, double hi) {
        return new FitOptions(model, t1Ms, t2MinMs, t2MaxMs, lo, hi, fold, noiseSigma, noiseFromBackground,
                monoOffset, monoSkipFirst, compareMono);
    }

    /**
     * @param sigma channel noise σ (NaN for none)
     * @param fromBackground estimate σ outside the mask instead
     * @return a copy with another noise model
     */
    public FitOptions withNoise(double sigma, boolean fromBackground) {
        return new FitOptions(model, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, sigma, fromBackground,
                monoOffset, monoSkipFirst, compareMono);
    }

    /**
     * @param offset fit a constant offset in the mono-exponential model
     * @param skipFirst drop the first echo in the mono-exponential model
     * @param compare also fit the mono-exponential model beside the EPG model
     * @return a copy with other mono-exponential options
     */
    public FitOptions withMono(boolean offset, boolean skipFirst, boolean compare) {
        return new FitOptions(model, t1Ms, t2MinMs, t2MaxMs, b1Min, b1Max, fold, noiseSigma, noiseFromBackground,
                offset, skipFirst, compare);
    }
}
