package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * {@link KernelMath#log1p} against {@link StrictMath#log1p} (fdlibm, error below 1 ulp): relative error of a few ulp
 * below {@link KernelMath#LOG1P_SERIES_LIMIT}, where the far-field edge terms live, and the documented 6e-14 above.
 */
class KernelMathLog1pTest {
    /** Series branch: a few ulp (9-term Horner sum). */
    private static final double SERIES_REL_TOL = 1e-15;
    /** log(1 + x) branch: KernelMath.log's 4.4e-16 absolute error near 1, over ln(1 + 1/128). */
    private static final double LOG_REL_TOL = 6e-14;

    @Test
    void matchesStrictMathLog1p() {
        SplittableRandom rnd = new SplittableRandom(8);
        double worstSeries = 0;
        double worstLog = 0;
        for (int i = 0; i < 200_000; i++) {
            double x = Math.pow(10, -18 + 21 * rnd.nextDouble()); // 1e-18 .. 1e3
            double ref = StrictMath.log1p(x);
            double e = Math.abs(KernelMath.log1p(x) - ref) / ref;
            if (x < KernelMath.LOG1P_SERIES_LIMIT) {
                worstSeries = Math.max(worstSeries, e);
            } else {
                worstLog = Math.max(worstLog, e);
            }
        }
        assertTrue(worstSeries <= SERIES_REL_TOL, "series branch " + worstSeries);
        assertTrue(worstLog <= LOG_REL_TOL, "log branch " + worstLog);
        assertEquals(0.0, KernelMath.log1p(0.0), 0.0);
        TestShapes.achieved("KernelMath.log1p vs StrictMath.log1p, x < 1/128, max relative error", worstSeries);
        TestShapes.achieved("KernelMath.log1p vs StrictMath.log1p, x >= 1/128, max relative error", worstLog);
    }
}
