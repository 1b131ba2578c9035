package org.echotrellis.cohort;

import java.util.Arrays;
import java.util.Locale;

import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.ProtocolText;

/**
 * The protocol of a multi-echo collection from its sidecars (BIDS: {@code EchoTime} in seconds per
 * echo, {@code FlipAngle} in degrees; the refocusing flip from {@code RefocusingFlipAngle}) or from a
 * protocol file, which must then agree with the sidecars' echo count and spacing. The echo times must
 * be n·ESP (a CPMG train, 1 % tolerance).
 */
final class SidecarProtocol {
    private SidecarProtocol() { }

    /**
     * @param c the collection
     * @param given the {@code --protocol} document, or null
     * @return the protocol text for the collection's analyses
     * @throws InputException naming the file and keys when information is missing or disagrees
     */
    static ProtocolText of(MeseCollection c, ProtocolText given) {
        double[] te = c.echoTimesS();
        double espMs = te[0] * 1000;
        for (int i = 0; i < te.length; i++) {
            if (Math.abs(te[i] * 1000 - (i + 1) * espMs) > 0.01 * espMs) {
                throw new InputException(c.echoFiles().get(i) + ": echo times " + Arrays.toString(te)
                        + " s are not evenly spaced multiples of the first (a CPMG train is needed)");
            }
        }
        double refocus = c.number("RefocusingFlipAngle");
        if (given != null) {
            CpmgTrain t = given.parse().cpmg().orElseThrow(() -> new InputException("--protocol " + given.source()
                    + ": not a CPMG train"));
            if (t.echoes() != te.length || Math.abs(t.echoSpacingMs() - espMs) > 0.01 * espMs) {
                throw new InputException("--protocol " + given.source() + " has " + t.echoes() + " echoes, ESP "
                        + t.echoSpacingMs() + " ms, but the sidecars of " + c.entities() + " give " + te.length
                        + " echoes, ESP " + espMs + " ms");
            }
            if (Double.isFinite(refocus) && Math.abs(t.refocusFlipDeg(0) - refocus) > 0.5) {
                throw new InputException("--protocol " + given.source() + " refocusing flip " + t.refocusFlipDeg(0)
                        + " deg disagrees with RefocusingFlipAngle " + refocus + " of " + c.echoFiles().get(0));
            }
            return given;
        }
        if (!Double.isFinite(refocus)) {
            throw new InputException(c.echoFiles().get(0) + ": the sidecars give no RefocusingFlipAngle; "
                    + "give --protocol FILE with the refocusing flip");
        }
        double excitation = c.number("FlipAngle");
        excitation = Double.isFinite(excitation) ? excitation : 90;   // spin echo (common practice)
        String yaml = String.format(Locale.ROOT, "name: %s%ntrain:%n  echoes: %d%n  echo_spacing_ms: %s%n"
                + "  excitation: {flip_deg: %s, phase_deg: 90}%n  refocusing: {flip_deg: %s, phase_deg: 0}%n",
                c.entities(), te.length, espMs, excitation, refocus);
        return new ProtocolText(yaml, c.echoFiles().get(0) + " (sidecars)", true);
    }
}
