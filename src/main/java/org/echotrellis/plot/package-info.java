/**
 * Charts with JFreeChart in one visual style of our own, written as PNG or SVG (Apache Batik's SVG
 * generator), headless and atomically. SVG output is deterministic: the same chart gives the same bytes.
 *
 * <p>May depend on {@code epg}, {@code sequence}, {@code pathway} and {@code io}; must not import {@code cli}.
 */
package org.echotrellis.plot;
