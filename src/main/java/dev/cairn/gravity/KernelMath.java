package dev.cairn.gravity;

/**
 * Fast, accurate {@code atan2} and {@code log} for the inner loops of the polyhedron kernel.
 *
 * <p>On Java 17 {@link Math#atan2} calls the native fdlibm routine and {@link Math#log} costs about as much as the
 * rest of an edge term; together they took about 60 % of the kernel's time. Both functions here use the classic
 * table-plus-short-series reduction and agree with {@link Math} for the arguments the kernel passes (finite, and for
 * {@code log} positive), which {@code KernelMathTest} checks on millions of random arguments: {@code atan2} to a few
 * ulp; {@code log} to a few ulp, except within a factor e of 1 where its absolute error stays below 2 ulp of 1
 * (4.4e-16) — the same size as the effect of rounding the argument itself, which is what limits the edge term.
 * <ul>
 * <li>{@link #atan2}: reduce to {@code t = min/max ∈ [0, 1]}, then {@code atan t = atan c + atan u} with
 *     {@code c = k/16} the nearest table point and {@code u = (t − c)/(1 + t c)}, {@code |u| ≤ 1/32}; the odd Taylor
 *     series of {@code atan u} to {@code u^11} truncates below 4e-21. Signed zeros follow {@code Math.atan2}.</li>
 * <li>{@link #log}: {@code x = 2^e m}, {@code m ∈ [1, 2)}; with {@code inv} the rounded reciprocal of the centre of
 *     m's 1/128-wide bin, {@code ln x = e ln 2 − ln(inv) + log1p(m·inv − 1)}, {@code |m·inv − 1| ≤ 1/256}, series
 *     to the 8th power (truncation below 1e-20). Non-normal or non-positive arguments fall back to
 *     {@link Math#log}.</li>
 * </ul>
 */
final class KernelMath {
    private static final int ATAN_STEPS = 16;
    private static final double[] ATAN_TABLE = new double[ATAN_STEPS + 1];
    private static final int LOG_BITS = 7;
    private static final int LOG_BINS = 1 << LOG_BITS;
    private static final double[] LOG_INV = new double[LOG_BINS];
    private static final double[] LOG_NEG_LN_INV = new double[LOG_BINS];
    private static final double LN2 = Math.log(2.0);

    static {
        for (int k = 0; k <= ATAN_STEPS; k++) {
            ATAN_TABLE[k] = Math.atan((double) k / ATAN_STEPS);
        }
        for (int k = 0; k < LOG_BINS; k++) {
            double centre = 1.0 + (k + 0.5) / LOG_BINS;
            LOG_INV[k] = 1.0 / centre;
            LOG_NEG_LN_INV[k] = -Math.log(LOG_INV[k]);
        }
    }

    private KernelMath() {
    }

    /** {@code atan2(y, x)} for finite arguments, radians in {@code [−π, π]}. */
    static double atan2(double y, double x) {
        double ay = Math.abs(y);
        double ax = Math.abs(x);
        boolean swap = ay > ax;
        double num = swap ? ax : ay;
        double den = swap ? ay : ax;
        double a;
        if (den == 0) {
            a = 0; // both zero
        } else {
            double t = num / den;
            int k = (int) (t * ATAN_STEPS + 0.5);
            double c = (double) k / ATAN_STEPS;
            double u = (t - c) / (1 + t * c);
            double u2 = u * u;
            double p = u2 * (-1.0 / 3 + u2 * (1.0 / 5 + u2 * (-1.0 / 7 + u2 * (1.0 / 9 + u2 * (-1.0 / 11)))));
            a = ATAN_TABLE[k] + (u + u * p);
        }
        if (swap) {
            a = Math.PI / 2 - a;
        }
        if (x < 0 || (x == 0 && 1 / x < 0)) {
            a = Math.PI - a;
        }
        return Math.copySign(a, y);
    }

    /** Largest argument for which {@link #log1pSmall} is accurate to a few ulp. */
    static final double LOG1P_SMALL_LIMIT = 1.0 / 255;

    /**
     * {@code ln(1 + x)} for {@code 0 ≤ x ≤ 1/255} by its Taylor series to x⁸ (truncation below 2e-20 relative): a few
     * ulp, where {@code log(1 + x)} would lose digits to the rounding of {@code 1 + x} (far-field edge terms).
     */
    static double log1pSmall(double x) {
        return x * (1 + x * (-1.0 / 2 + x * (1.0 / 3 + x * (-1.0 / 4 + x * (1.0 / 5 + x * (-1.0 / 6 + x * (1.0 / 7
            + x * (-1.0 / 8))))))));
    }

    /** Natural logarithm; exact to a few ulp for positive normal arguments, {@link Math#log} otherwise. */
    static double log(double x) {
        long bits = Double.doubleToRawLongBits(x);
        int biased = (int) (bits >>> 52);
        if (biased <= 0 || biased >= 0x7ff) {
            return Math.log(x); // zero, negative, subnormal, infinite or NaN
        }
        int e = biased - 1023;
        int k = (int) (bits >>> (52 - LOG_BITS)) & (LOG_BINS - 1);
        double m = Double.longBitsToDouble((bits & 0x000fffffffffffffL) | 0x3ff0000000000000L);
        double r = m * LOG_INV[k] - 1.0;
        double p = r * (-1.0 / 2 + r * (1.0 / 3 + r * (-1.0 / 4 + r * (1.0 / 5 + r * (-1.0 / 6 + r * (1.0 / 7
            + r * (-1.0 / 8)))))));
        return e * LN2 + LOG_NEG_LN_INV[k] + (r + r * p);
    }
}
