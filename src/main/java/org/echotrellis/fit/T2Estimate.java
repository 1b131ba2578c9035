package org.echotrellis.fit;

import org.echotrellis.io.VoxelStatus;

/**
 * The fit of one decay. Values that a model does not produce are NaN (B1 for the mono model,
 * {@code monoT2Ms} without the comparison); an undetermined standard error is +Infinity.
 *
 * @param t2Ms fitted T2 in ms
 * @param t2SeMs Cramér–Rao standard error of T2 in ms
 * @param b1Scale fitted (folded) or given B1 scale
 * @param b1Se standard error of B1 (NaN when B1 was given)
 * @param amplitude fitted amplitude (signal units at M0·e^0 of the model)
 * @param residualRms root-mean-square residual in signal units
 * @param status outcome
 * @param monoT2Ms mono-exponential T2 in ms for comparison, or NaN
 */
public record T2Estimate(double t2Ms, double t2SeMs, double b1Scale, double b1Se, double amplitude,
                         double residualRms, VoxelStatus status, double monoT2Ms) {
}
