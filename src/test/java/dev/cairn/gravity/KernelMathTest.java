package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The kernel's own atan2 and log against the JDK's fdlibm-based {@link Math#atan2} and {@link Math#log}
 * (themselves accurate to 1-2 ulp by their specification), over the argument ranges the kernel uses.
 */
class KernelMathTest {
    /** Allowed difference in units of the last place of the reference value (common practice, no source). */
    private static final double ULPS = 4;
    private static final int SAMPLES = 2_000_000;

    @Test
    void atan2MatchesMathOverAllQuadrantsAndScales() {
        SplittableRandom rnd = new SplittableRandom(1);
        for (int i = 0; i < SAMPLES; i++) {
            double y = (rnd.nextDouble() * 2 - 1) * Math.pow(10, rnd.nextInt(-12, 13));
            double x = (rnd.nextDouble() * 2 - 1) * Math.pow(10, rnd.nextInt(-12, 13));
            double ref = Math.atan2(y, x);
            assertEquals(ref, KernelMath.atan2(y, x), ULPS * Math.ulp(ref) + Double.MIN_VALUE, "atan2(" + y + ", " + x + ")");
        }
    }

    @Test
    void atan2SpecialCasesFollowMath() {
        double[] v = {0.0, -0.0, 1.0, -1.0, 1e-300, -1e-300, 3.0, -3.0};
        for (double y : v) {
            for (double x : v) {
                assertEquals(Math.atan2(y, x), KernelMath.atan2(y, x), 2 * Math.ulp(Math.atan2(y, x)) + Double.MIN_VALUE,
                    "atan2(" + y + ", " + x + ")");
                assertEquals(Math.copySign(1, Math.atan2(y, x)), Math.copySign(1, KernelMath.atan2(y, x)));
            }
        }
        // Exactly on the table points and at the reduction boundary t = 1.
        for (int k = 0; k <= 16; k++) {
            assertEquals(Math.atan2(k, 16), KernelMath.atan2(k, 16), ULPS * Math.ulp(1.0));
        }
    }

    @Test
    void logMatchesMathFromTinyToHugeArguments() {
        SplittableRandom rnd = new SplittableRandom(2);
        for (int i = 0; i < SAMPLES; i++) {
            double x = (1 + rnd.nextDouble()) * Math.pow(2, rnd.nextInt(-1000, 1000));
            double ref = Math.log(x);
            // Within a factor e of 1 the argument's own rounding (half an ulp of 1) already limits ln x to an
            // absolute accuracy of ~1e-16, so absolute error is what counts there; elsewhere, relative ulps.
            double tol = Math.abs(ref) < 1 ? 2 * Math.ulp(1.0) : ULPS * Math.ulp(ref);
            assertEquals(ref, KernelMath.log(x), tol, "log(" + x + ")");
        }
        // Near 1, where ln x is small, the absolute error must stay at the ulp level of 1 (cancellation-free).
        for (int i = 0; i < SAMPLES / 10; i++) {
            double x = 1 + (rnd.nextDouble() - 0.5) * 1e-6;
            assertEquals(Math.log(x), KernelMath.log(x), 2 * Math.ulp(1.0), "log(" + x + ")");
        }
    }

    @Test
    void logFallsBackOutsideNormalRange() {
        assertEquals(Math.log(0.0), KernelMath.log(0.0));
        assertEquals(Math.log(Double.MIN_VALUE), KernelMath.log(Double.MIN_VALUE));
        assertEquals(Math.log(Double.POSITIVE_INFINITY), KernelMath.log(Double.POSITIVE_INFINITY));
        assertEquals(Double.NaN, KernelMath.log(-1.0));
    }
}
