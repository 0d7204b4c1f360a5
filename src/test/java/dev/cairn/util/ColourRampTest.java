package dev.cairn.util;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * The colour ramps judged with CIELAB computed independently of the OKLab design space: sRGB decoding per
 * IEC 61966-2-1, relative luminance Y = 0.2126 R + 0.7152 G + 0.0722 B (ITU-R BT.709 primaries, D65), and CIE 1976
 * L* = 116 f(Y) − 16, a* and b* from X, Z (CIE 15:2004). A greyscale print shows L*; readers with a colour-vision
 * deficiency keep lightness contrast, so a ramp ordered by L* alone stays readable for them.
 */
class ColourRampTest {
    /** Samples along the ramp. */
    private static final int N = 101;
    /**
     * Smallest L* rise between neighbouring samples 1/100 of the ramp apart. The design rises ≈ 0.62 L* per step;
     * rounding to 8-bit sRGB moves each colour's L* by up to ≈ 0.25, so a step may shrink to ≈ 0.12 and no lower
     * while the ramp stays strictly ordered (quantisation estimate, ours).
     */
    private static final double MIN_STEP_L = 0.1;
    /** Greyscale contrast end to end, L* units: at least 45 (common practice, no source). */
    private static final double MIN_RANGE_L = 45;
    /** Symmetry of the diverging ramp, L* units (8-bit sRGB quantisation moves L* by up to ≈ 0.4). */
    private static final double SYMMETRY_TOL_L = 1.5;

    static double lin(int c8) {
        double c = c8 / 255.0;
        return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
    }

    static double f(double t) {
        double d = 6.0 / 29;
        return t > d * d * d ? Math.cbrt(t) : t / (3 * d * d) + 4.0 / 29;
    }

    /** CIELAB (D65) of a packed sRGB colour: {L*, a*, b*}. */
    static double[] lab(int argb) {
        double r = lin((argb >> 16) & 0xFF);
        double g = lin((argb >> 8) & 0xFF);
        double b = lin(argb & 0xFF);
        double x = 0.4124 * r + 0.3576 * g + 0.1805 * b;
        double y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
        double z = 0.0193 * r + 0.1192 * g + 0.9505 * b;
        double fx = f(x / 0.95047);
        double fy = f(y);
        double fz = f(z / 1.08883);
        return new double[] {116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)};
    }

    @Test
    void sequentialLightnessRisesMonotonicallyOverAWideRange() {
        double prev = -1;
        double first = lab(ColourRamp.SEQUENTIAL.argb(0))[0];
        for (int i = 0; i < N; i++) {
            double l = lab(ColourRamp.SEQUENTIAL.argb(i / (N - 1.0)))[0];
            if (i > 0) {
                assertTrue(l - prev >= MIN_STEP_L, "L* must rise at t=" + i / (N - 1.0) + ": " + prev + " -> " + l);
            }
            prev = l;
        }
        assertTrue(prev - first >= MIN_RANGE_L, "greyscale contrast " + (prev - first));
    }

    @Test
    void sequentialRunsFromBlueToYellowAlongTheAxisDichromatsKeep() {
        // b* < 0 is bluish, b* > 0 yellowish (CIE 1976); the ramp's information rides on L* and b*.
        assertTrue(lab(ColourRamp.SEQUENTIAL.argb(0))[2] < -15, "low end bluish");
        assertTrue(lab(ColourRamp.SEQUENTIAL.argb(1))[2] > 15, "high end yellowish");
    }

    @Test
    void warningColourIsDarkerThanTheWholeRamp() {
        double lw = lab(ColourRamp.WARNING)[0];
        double lmin = lab(ColourRamp.SEQUENTIAL.argb(0))[0];
        assertTrue(lmin - lw > 10, "warning L* " + lw + " vs ramp low end " + lmin);
    }

    @Test
    void divergingIsSymmetricInLightnessWithBlueNegativeAndOrangePositive() {
        double mid = lab(ColourRamp.DIVERGING.argb(0.5))[0];
        double prevNeg = mid;
        for (int i = 1; i <= 50; i++) {
            double d = i / 100.0;
            double lp = lab(ColourRamp.DIVERGING.argb(0.5 + d))[0];
            double ln = lab(ColourRamp.DIVERGING.argb(0.5 - d))[0];
            assertEquals(lp, ln, SYMMETRY_TOL_L, "symmetry at ±" + d);
            assertTrue(ln < prevNeg, "lightness falls away from zero");
            prevNeg = ln;
        }
        assertTrue(mid - lab(ColourRamp.DIVERGING.argb(0))[0] >= MIN_RANGE_L);
        assertTrue(lab(ColourRamp.DIVERGING.argb(0.1))[2] < -10, "negative side bluish");
        assertTrue(lab(ColourRamp.DIVERGING.argb(0.9))[2] > 10, "positive side orange");
    }

    @Test
    void liftOffColourStandsApartFromBothRampsAndTheWarning() {
        // CIE 1976 colour difference (Euclidean in L*a*b*); 20 units is a plainly visible difference (common
        // practice, no source)
        double[] lift = lab(ColourRamp.LIFT_OFF);
        for (int i = 0; i < N; i++) {
            for (ColourRamp r : new ColourRamp[] {ColourRamp.SEQUENTIAL, ColourRamp.DIVERGING}) {
                assertTrue(deltaE(lift, lab(r.argb(i / (N - 1.0)))) > 20, "lift-off against ramp at " + i);
            }
        }
        assertTrue(deltaE(lift, lab(ColourRamp.WARNING)) > 20, "lift-off against warning");
    }

    static double deltaE(double[] a, double[] b) {
        return Math.sqrt((a[0] - b[0]) * (a[0] - b[0]) + (a[1] - b[1]) * (a[1] - b[1]) + (a[2] - b[2]) * (a[2] - b[2]));
    }
}
