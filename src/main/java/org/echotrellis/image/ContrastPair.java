package org.echotrellis.image;

/**
 * Contrast between two tissues: the difference of their centre weights (the values of large
 * regions), and the contrast-to-noise ratio |contrast| / σ for an image with noise standard
 * deviation σ per pixel (NaN when no σ was given).
 *
 * @param a first tissue name
 * @param b second tissue name
 * @param contrast centre weight of a minus centre weight of b
 * @param cnr |contrast| / σ, or NaN
 */
public record ContrastPair(String a, String b, double contrast, double cnr) { }
