/**
 * Refocusing-schedule design for multi-echo spin-echo trains under RF exposure limits: the
 * echo-by-echo prescribed-signal inversion ({@link org.echotrellis.design.FlipInverter}, with a
 * small real CPMG stepper that exposes the states before each pulse), budgeted optimisation of a
 * smooth spline-knot schedule ({@link org.echotrellis.design.ScheduleOptimizer}), and the RF
 * exposure model (pulse shapes, B1 amplitudes, B1+rms, relative and scaled absolute SAR,
 * IEC 60601-2-33 operating-mode limits for context). All exposure figures are estimates for
 * planning only: the scanner's own SAR monitor, local regulations and the responsible MR
 * physicist decide.
 *
 * <p>This package may use {@code org.echotrellis.epg}, {@code org.echotrellis.sequence} and {@code
 * org.echotrellis.image} (objectives on image figures); it must
 * not import {@code io}, {@code plot}, {@code cli}, {@code fit} or {@code pathway}.
 */
package org.echotrellis.design;
