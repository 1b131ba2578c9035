package org.echotrellis.fit.spectrum;

import java.io.Serializable;
import java.util.List;
import org.echotrellis.sequence.Protocol;

/**
 * What a caller chose for spectrum fits whose protocols are known only later (one per BIDS collection
 * or cohort subject): each choice left open takes the protocol's own default of
 * {@link SpectrumOptions#defaults(Protocol)} (grid from its echo times, T1 of its tissue, window from
 * its grid). Serialisable, so a distributed job can ship it to workers.
 *
 * @param t1Ms fixed T1 of the basis in ms, or NaN for the protocol tissue's T1
 * @param windows T2 windows whose fractions are reported, or empty for the default window
 */
public record SpectrumChoices(double t1Ms, List<FractionWindow> windows) implements Serializable {

    /** Every choice left to the protocol. */
    public static final SpectrumChoices PROTOCOL_DEFAULTS = new SpectrumChoices(Double.NaN, List.of());

    /**
     * Copies.
     *
     * @param t1Ms fixed T1 of the basis in ms, or NaN for the protocol tissue's T1
     * @param windows T2 windows whose fractions are reported, or empty for the default window
     */
    public SpectrumChoices {
        windows = windows == null ? List.of() : List.copyOf(windows);
    }

    /**
     * @param p the protocol of one collection
     * @return the options for it
     */
    public SpectrumOptions resolve(Protocol p) {
        SpectrumOptions o = SpectrumOptions.defaults(p);
        if (!Double.isNaN(t1Ms)) {
            o = o.withT1Ms(t1Ms);
        }
        return windows.isEmpty() ? o : o.withWindows(windows);
    }
}
