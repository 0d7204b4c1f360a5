package dev.cairn.gravity;

/**
 * Fast, accurate {@code atan2} and {@code log} for the inner loops of the polyhedron kernel.
 *
 * <p>The kernel's main loops use the table-free {@link #atan2Fast} and {@link #twoAtanhSmall} (polynomials, one
 * division each), which the scalar and the vector path evaluate with the same operations; {@link #log} serves the
 * few edges within a few edge lengths of a point. The table-based {@link #atan2} and {@link #log1pSmall} are the
 * previous kernel's and are kept, with their tests, for comparison.
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

    // ---------------------------------------------------------------------------------------------------------------
    // Table-free functions of the lane kernel (PolyhedronField's scalar path and VectorKernel's vector path). Both
    // paths evaluate exactly these operations in exactly this order (fma where written), so they agree bit for bit.

    /** Largest {@code t} for which {@link #twoAtanhSmall} is accurate (truncation below 2e-18 relative). */
    static final double ATANH_LIMIT = 0.125;
    /** Taylor coefficients 1/(2k+3), k = 0..8, of (atanh(t) − t)/t³ in z = t². */
    static final double AH0 = 1.0 / 3;
    static final double AH1 = 1.0 / 5;
    static final double AH2 = 1.0 / 7;
    static final double AH3 = 1.0 / 9;
    static final double AH4 = 1.0 / 11;
    static final double AH5 = 1.0 / 13;
    static final double AH6 = 1.0 / 15;
    static final double AH7 = 1.0 / 17;
    static final double AH8 = 1.0 / 19;
    /** Taylor coefficients (−1)^(k+1)/(2k+3), k = 0..8, of (atan(u) − u)/u³ in z = u². */
    static final double AT0 = -1.0 / 3;
    static final double AT1 = 1.0 / 5;
    static final double AT2 = -1.0 / 7;
    static final double AT3 = 1.0 / 9;
    static final double AT4 = -1.0 / 11;
    static final double AT5 = 1.0 / 13;
    static final double AT6 = -1.0 / 15;
    static final double AT7 = 1.0 / 17;
    static final double AT8 = -1.0 / 19;
    /** atan of the reduction points 1/4, 1/2, 3/4, 1 of {@link #atan2Fast}. */
    static final double ATAN_QUARTER = StrictMath.atan(0.25);
    static final double ATAN_HALF = StrictMath.atan(0.5);
    static final double ATAN_THREE_QUARTERS = StrictMath.atan(0.75);
    static final double ATAN_ONE = StrictMath.atan(1.0);
    static final double HALF_PI = Math.PI / 2;

    /**
     * {@code 2 atanh(t) = ln((1 + t)/(1 − t))} for {@code 0 ≤ t ≤ }{@link #ATANH_LIMIT}: its Taylor series to
     * t^19 (Estrin scheme; truncation below 2e-18 relative), no division. With {@code t = e/(a+b)} this is the
     * Werner–Scheeres edge factor {@code L_e = ln((a+b+e)/(a+b−e))} without the cancellation of {@code a+b−e} far away.
     */
    static double twoAtanhSmall(double t) {
        double z = t * t;
        double z2 = z * z;
        double z4 = z2 * z2;
        double z8 = z4 * z4;
        double q01 = Math.fma(AH1, z, AH0);
        double q23 = Math.fma(AH3, z, AH2);
        double q45 = Math.fma(AH5, z, AH4);
        double q67 = Math.fma(AH7, z, AH6);
        double q03 = Math.fma(q23, z2, q01);
        double q47 = Math.fma(q67, z2, q45);
        double q07 = Math.fma(q47, z4, q03);
        double q = Math.fma(AH8, z8, q07);
        double h = Math.fma(t * z, q, t);
        return h + h;
    }

    /**
     * {@code atan2(y, x)} for finite arguments not both zero, with one division and no table: with
     * {@code m = min(|y|, |x|)}, {@code M = max(|y|, |x|)} and the reduction point {@code c ∈ {0, 1/4, 1/2, 3/4, 1}}
     * nearest to {@code m/M}, {@code atan(m/M) = atan c + atan u}, {@code u = (m − cM)/(M + cm)}, {@code |u| ≤ 1/8},
     * and the Taylor series of {@code atan u} to u^19 (truncation below 4e-20 relative). Then the octant: M = |y|
     * gives π/2 − a, x &lt; 0 gives π − a, and y &lt; 0 the sign (so, unlike {@link Math#atan2}, y = −0 counts as +0:
     * the kernel never needs the difference, as a point with y = ±0 and x ≤ 0 lies on the facet, whose term it skips).
     * Accurate to 2 ulp of {@link StrictMath#atan2} (measured by {@code KernelMathFastTest}).
     */
    static double atan2Fast(double y, double x) {
        double ay = Math.abs(y);
        double ax = Math.abs(x);
        boolean swap = ay > ax;
        double mn = swap ? ax : ay;
        double mx = swap ? ay : ax;
        double c = 0;
        double ac = 0;
        if (mn > 0.125 * mx) {
            c = 0.25;
            ac = ATAN_QUARTER;
        }
        if (mn > 0.375 * mx) {
            c = 0.5;
            ac = ATAN_HALF;
        }
        if (mn > 0.625 * mx) {
            c = 0.75;
            ac = ATAN_THREE_QUARTERS;
        }
        if (mn > 0.875 * mx) {
            c = 1.0;
            ac = ATAN_ONE;
        }
        double u = Math.fma(-c, mx, mn) / Math.fma(c, mn, mx);
        double z = u * u;
        double z2 = z * z;
        double z4 = z2 * z2;
        double z8 = z4 * z4;
        double p01 = Math.fma(AT1, z, AT0);
        double p23 = Math.fma(AT3, z, AT2);
        double p45 = Math.fma(AT5, z, AT4);
        double p67 = Math.fma(AT7, z, AT6);
        double p03 = Math.fma(p23, z2, p01);
        double p47 = Math.fma(p67, z2, p45);
        double p07 = Math.fma(p47, z4, p03);
        double p = Math.fma(AT8, z8, p07);
        double a = ac + Math.fma(u * z, p, u);
        if (swap) {
            a = HALF_PI - a;
        }
        if (x < 0) {
            a = Math.PI - a;
        }
        return y < 0 ? -a : a;
    }
}
