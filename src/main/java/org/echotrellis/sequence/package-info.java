/**
 * Protocol files (YAML or JSON) and the one event model every command works on: a list of RF
 * pulses, free intervals with a dephasing step, and echo read-outs. The shorthand echo-train form
 * compiles to the same event list; the CPMG fast path is chosen automatically when it applies.
 *
 * <p>Depends on {@code org.echotrellis.epg} only; must not import {@code pathway}, {@code fit},
 * {@code design}, {@code io}, {@code plot} or {@code cli}.
 */
package org.echotrellis.sequence;
