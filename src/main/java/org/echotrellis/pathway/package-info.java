/**
 * Pathway analysis: which coherence pathways form each echo. The exact class decomposition of every
 * echo by the number of periods spent as dephased longitudinal magnetization
 * ({@link org.echotrellis.pathway.ClassTracker}), the largest individual pathways of one echo by a
 * pruned best-first search ({@link org.echotrellis.pathway.PathwaySearch}) written in a compact
 * notation of our own ({@link org.echotrellis.pathway.StateNotation}), and the data of a phase-graph
 * diagram ({@link org.echotrellis.pathway.PhaseGraphTracer}).
 *
 * <p>Method: J. Hennig, "Multiecho imaging sequences with low refocusing flip angles", J Magn Reson
 * 78:397 (1988) (echo pathways and their classification); M. Weigel, "Extended phase graphs:
 * dephasing, RF pulses, and echoes — pure and simple", J Magn Reson Imaging 41:266 (2015) (operators).
 *
 * <p>Depends on {@code org.echotrellis.sequence} (event model) and the shared {@code Checks}; it runs
 * its own class-tracking engine and must not import {@code fit}, {@code design}, {@code io},
 * {@code plot} or {@code cli}.
 */
package org.echotrellis.pathway;
