package org.echotrellis.image;

import java.util.ArrayList;
import java.util.List;
import org.echotrellis.Checks;
import org.echotrellis.InputException;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Tissue;

/**
 * The {@code image} job: echo amplitudes of every tissue from the protocol's one acquisition model
 * ({@link Simulator#simulate(Protocol, double, double, double)}), laid out across k-space by a
 * {@link KSpaceOrdering}; effective TE, PSF figures and pairwise contrast and CNR (METHODS §13).
 */
public final class FseImaging {
    private FseImaging() { }

    /**
     * @param protocol the acquisition (its B1 scale is used)
     * @param ordering the ordering; its echo count must be the protocol's
     * @param tissues tissues to image (at least one, distinct names)
     * @param noiseSd noise standard deviation per pixel for the CNR, or NaN for none
     * @return the report
     */
    public static ImageReport analyse(Protocol protocol, KSpaceOrdering ordering, List<Tissue> tissues, double noiseSd) {
        Checks.require(!tissues.isEmpty(), "at least one tissue is needed");
        if (ordering.echoes() != protocol.echoCount()) {
            throw new InputException(protocol.source() + ": the ordering is for " + ordering.echoes()
                    + " echoes but the protocol has " + protocol.echoCount());
        }
        if (!Double.isNaN(noiseSd)) {
            Checks.positive("noise_sd", noiseSd, null);
        }
        int[] echoOf = ordering.echoOfLine();
        int centre = echoOf[ordering.centreLine()];
        double[] times = protocol.echoTimesMs();
        List<TissueImage> out = new ArrayList<>();
        for (Tissue t : tissues) {
            EchoTrain train = Simulator.simulate(protocol, t.t1Ms(), t.t2Ms(), protocol.b1Scale());
            double[] w = weights(train.magnitudes(), echoOf);
            double[] psf = PointSpread.psf(w);
            out.add(new TissueImage(t, times[centre], w[ordering.centreLine()], w, psf, PointSpread.figures(psf)));
        }
        return new ImageReport(ordering, times, out, pairs(out, noiseSd), noiseSd);
    }

    /**
     * @param echoMagnitudes magnitude of every echo (not modified)
     * @param echoOfLine the 0-based echo of every line ({@link KSpaceOrdering#echoOfLine()})
     * @return the weight of every line
     */
    public static double[] weights(double[] echoMagnitudes, int[] echoOfLine) {
        double[] w = new double[echoOfLine.length];
        for (int j = 0; j < w.length; j++) {
            w[j] = Math.abs(echoMagnitudes[echoOfLine[j]]);
        }
        return w;
    }

    /** Every pair i &lt; j: contrast = centre(i) − centre(j), CNR = |contrast| / σ. */
    static List<ContrastPair> pairs(List<TissueImage> tissues, double noiseSd) {
        List<ContrastPair> pairs = new ArrayList<>();
        for (int i = 0; i < tissues.size(); i++) {
            for (int j = i + 1; j < tissues.size(); j++) {
                double c = tissues.get(i).centerSignal() - tissues.get(j).centerSignal();
                pairs.add(new ContrastPair(tissues.get(i).name(), tissues.get(j).name(), c,
                        Double.isNaN(noiseSd) ? Double.NaN : Math.abs(c) / noiseSd));
            }
        }
        return pairs;
    }
}
