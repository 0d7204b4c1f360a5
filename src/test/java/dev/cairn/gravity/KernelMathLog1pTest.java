package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * {@link KernelMath#log1pSmall} against {@link StrictMath#log1p} (fdlibm, error below 1 ulp) on its whole domain
 * [0, 1/255], where the far-field edge terms of the polyhedron kernel live.
 */
class KernelMathLog1pTest {
    /** A few ulp (8-term Horner sum). */
    private static final double REL_TOL = 1e-15;

    @Test
    void matchesStrictMathLog1p() {
        SplittableRandom rnd = new SplittableRandom(8);
        double worst = 0;
        for (int i = 0; i < 200_000; i++) {
            double x = KernelMath.LOG1P_SMALL_LIMIT * Math.pow(10, -16 * rnd.nextDouble()); // 1e-16 .. 1/255 of it
            double ref = StrictMath.log1p(x);
            worst = Math.max(worst, Math.abs(KernelMath.log1pSmall(x) - ref) / ref);
        }
        double top = KernelMath.LOG1P_SMALL_LIMIT;
        worst = Math.max(worst, Math.abs(KernelMath.log1pSmall(top) - StrictMath.log1p(top)) / StrictMath.log1p(top));
        assertTrue(worst <= REL_TOL, "relative error " + worst);
        assertEquals(0.0, KernelMath.log1pSmall(0.0), 0.0);
        TestShapes.achieved("KernelMath.log1pSmall vs StrictMath.log1p on [0, 1/255], max relative error", worst);
    }
}
