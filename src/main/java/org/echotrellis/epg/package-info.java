/**
 * The extended phase graph (EPG) engine: configuration states F+<sub>k</sub>, F&minus;<sub>k</sub>,
 * Z<sub>k</sub> and their operators (RF rotation, relaxation, dephasing shift), a general complex
 * engine for any event list and a real-valued CPMG fast path.
 *
 * <p>Method: J. Hennig, "Multiecho imaging sequences with low refocusing flip angles", J Magn Reson
 * 78:397 (1988); M. Weigel, "Extended phase graphs: dephasing, RF pulses, and echoes — pure and
 * simple", J Magn Reson Imaging 41:266 (2015). Conventions: M0 = 1, echo = F+<sub>0</sub>.
 *
 * <p>This package owns the physics kernels only. It must not import anything from
 * {@code org.echotrellis.sequence}, {@code pathway}, {@code fit}, {@code design}, {@code io},
 * {@code plot} or {@code cli}.
 */
package org.echotrellis.epg;
