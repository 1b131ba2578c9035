package org.echotrellis.image;

import java.util.List;

/**
 * Result of {@link FseImaging#analyse}: the ordering, the echo times, every tissue's figures and
 * every tissue pair's contrast.
 *
 * @param ordering k-space ordering
 * @param echoTimesMs echo times of the train in ms (copied)
 * @param tissues per-tissue figures, in input order
 * @param pairs every pair (i &lt; j) in input order
 * @param noiseSd noise standard deviation per pixel, or NaN
 */
public record ImageReport(KSpaceOrdering ordering, double[] echoTimesMs, List<TissueImage> tissues,
                          List<ContrastPair> pairs, double noiseSd) {
    /**
     * Copies.
     *
     * @param ordering k-space ordering
     * @param echoTimesMs echo times of the train in ms (copied)
     * @param tissues per-tissue figures, in input order
     * @param pairs every pair (i &lt; j) in input order
     * @param noiseSd noise standard deviation per pixel, or NaN
     */
    public ImageReport {
        echoTimesMs = echoTimesMs.clone();
        tissues = List.copyOf(tissues);
        pairs = List.copyOf(pairs);
    }

    /** @return echo times of the train in ms (a copy) */
    @Override
    public double[] echoTimesMs() {
        return echoTimesMs.clone();
    }
}
