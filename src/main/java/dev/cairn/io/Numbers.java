package dev.cairn.io;

/** Strict number syntax for the text readers (OBJ, points CSV, survey CSV), and limits of field-point positions. */
public final class Numbers {
    /**
     * Largest field-point coordinate accepted, metres (1e15 m, about 7000 au): squares and products stay far from
     * overflow (common practice, no source).
     */
    public static final double MAX_POINT_M = 1e15;

    private Numbers() {
    }

    /**
     * Plain decimal syntax only: {@code [+-] digits [. digits] [e|E [+-] digits]} (at least one digit before the
     * exponent). Java's extras (hex floats, {@code f}/{@code d} suffixes, NaN, Infinity) are refused.
     */
    public static boolean isDecimal(String s, int from, int to) {
        int p = from;
        if (p < to && (s.charAt(p) == '+' || s.charAt(p) == '-')) {
            p++;
        }
        int digits = 0;
        while (p < to && s.charAt(p) >= '0' && s.charAt(p) <= '9') {
            p++;
            digits++;
        }
        if (p < to && s.charAt(p) == '.') {
            p++;
            while (p < to && s.charAt(p) >= '0' && s.charAt(p) <= '9') {
                p++;
                digits++;
            }
        }
        if (digits == 0) {
            return false;
        }
        if (p < to && (s.charAt(p) == 'e' || s.charAt(p) == 'E')) {
            p++;
            if (p < to && (s.charAt(p) == '+' || s.charAt(p) == '-')) {
                p++;
            }
            int exp = 0;
            while (p < to && s.charAt(p) >= '0' && s.charAt(p) <= '9') {
                p++;
                exp++;
            }
            if (exp == 0) {
                return false;
            }
        }
        return p == to;
    }

    /** {@code isDecimal} over the whole string. */
    public static boolean isDecimal(String s) {
        return isDecimal(s, 0, s.length());
    }
}
