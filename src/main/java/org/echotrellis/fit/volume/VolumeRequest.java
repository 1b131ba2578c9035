package org.echotrellis.fit.volume;

import java.io.Serializable;

import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.sequence.ProtocolText;

/**
 * A volume analysis as plain serialisable values: the protocol text and the settings. A
 * distributed job ships this to its workers; each worker calls {@link #analysis()} once (the
 * result is heavy and not serialisable) and runs it for its series.
 *
 * @param protocol the protocol document
 * @param kind fit or spectrum
 * @param fit the fit settings ({@link VolumeAnalysis.Kind#FIT}; null otherwise)
 * @param spectrum the spectrum settings ({@link VolumeAnalysis.Kind#SPECTRUM}; null otherwise)
 * @serial exclude
 */
public record VolumeRequest(ProtocolText protocol, VolumeAnalysis.Kind kind, FitOptions fit,
                            SpectrumOptions spectrum) implements Serializable {
    private static final long serialVersionUID = 1L;

    /**
     * Validates that the settings of the kind are present.
     *
     * @param protocol the protocol document
     * @param kind fit or spectrum
     * @param fit the fit settings ({@link VolumeAnalysis.Kind#FIT}; null otherwise)
     * @param spectrum the spectrum settings ({@link VolumeAnalysis.Kind#SPECTRUM}; null otherwise)
     * @throws IllegalArgumentException if the protocol or the kind is null, or the settings of the
     *         requested kind are missing
     */
    public VolumeRequest {
        if (protocol == null || kind == null) {
            throw new IllegalArgumentException("protocol and kind must not be null");
        }
        if (kind == VolumeAnalysis.Kind.FIT && fit == null || kind == VolumeAnalysis.Kind.SPECTRUM && spectrum == null) {
            throw new IllegalArgumentException("a " + kind + " request needs its settings");
        }
    }

    /**
     * @param protocol the protocol document
     * @param options the fit settings
     * @return a fit request
     */
    public static VolumeRequest fit(ProtocolText protocol, FitOptions options) {
        return new VolumeRequest(protocol, VolumeAnalysis.Kind.FIT, options, null);
    }

    /**
     * @param protocol the protocol document
     * @param options the spectrum settings
     * @return a spectrum request
     */
    public static VolumeRequest spectrum(ProtocolText protocol, SpectrumOptions options) {
        return new VolumeRequest(protocol, VolumeAnalysis.Kind.SPECTRUM, null, options);
    }

    /**
     * Parses the protocol and builds the analysis (start dictionary or basis cache).
     *
     * @return the analysis, ready to run
     */
    public VolumeAnalysis analysis() {
        return kind == VolumeAnalysis.Kind.FIT ? VolumeAnalysis.fit(protocol.parse(), fit)
                : VolumeAnalysis.spectrum(protocol.parse(), spectrum);
    }
}
