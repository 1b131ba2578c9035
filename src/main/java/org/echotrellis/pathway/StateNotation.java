package org.echotrellis.pathway;

import java.util.List;

/**
 * The compact pathway notation of echotrellis. A pathway is written as its origin followed by the
 * state it is in right after each later RF pulse, separated by spaces:
 * <ul>
 *   <li>origin {@code Z0}: the equilibrium magnetization before the first pulse;
 *       origin {@code R<i>p</i>}: longitudinal magnetization regrown by T1 during period p (after
 *       pulse p), which the next pulse is the first to act on;</li>
 *   <li>{@code F<i>k</i>}: transverse, the coefficient of e<sup>ik&theta;</sup> in M+ with the signed
 *       dephasing order k right after the pulse ({@code F0}, {@code F+2}, {@code F-1}). A negative
 *       order is on its way back to an echo; each interval adds its dephasing step to k;</li>
 *   <li>{@code Z<i>k</i>}: longitudinal with order k; the sign tells in which direction the
 *       magnetization re-emerges when a later pulse tips it back ({@code Z-1} gives {@code F-1}, a
 *       stimulated echo); {@code Z0} is undephased longitudinal magnetization;</li>
 *   <li>{@code S*n}: the same state token after n consecutive pulses.</li>
 * </ul>
 * Example, CPMG echo 2: {@code Z0 F0 F-1*2} is the double spin echo, {@code Z0 F0 Z-1 F-1} the
 * stimulated echo (stored by pulse 2, recalled by pulse 3).
 */
final class StateNotation {
    private StateNotation() { }

    /**
     * @param origin 0 for the equilibrium magnetization, p &ge; 1 for T1 regrowth in period p
     * @return the origin token
     */
    public static String origin(int origin) {
        return origin == 0 ? "Z0" : "R" + origin;
    }

    /**
     * @param longitudinal true for Z, false for F
     * @param order signed dephasing order
     * @return the state token, e.g. {@code F-1}, {@code Z+2}, {@code F0}
     */
    public static String token(boolean longitudinal, int order) {
        String sign = order > 0 ? "+" : "";
        return (longitudinal ? "Z" : "F") + sign + order;
    }

    /**
     * Joins tokens with spaces, writing runs of the same token as {@code S*n}.
     *
     * @param tokens origin token followed by one token per pulse
     * @return the compact notation
     */
    public static String join(List<String> tokens) {
        StringBuilder sb = new StringBuilder();
        int i = 0;
        while (i < tokens.size()) {
            int j = i + 1;
            while (j < tokens.size() && tokens.get(j).equals(tokens.get(i))) {
                j++;
            }
            if (sb.length() > 0) {
                sb.append(' ');
            }
            sb.append(tokens.get(i));
            if (j - i > 1) {
                sb.append('*').append(j - i);
            }
            i = j;
        }
        return sb.toString();
    }
}
