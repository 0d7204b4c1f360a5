package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import java.math.BigDecimal;
import java.math.MathContext;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The lane kernel's table-free {@link KernelMath#atan2Fast} and {@link KernelMath#twoAtanhSmall} against independent
 * references: {@link StrictMath#atan2} (fdlibm, error below 1 ulp by its specification) over all quadrants and
 * scales, and the Taylor series atanh t = Σ t^(2k+1)/(2k+1) (handbook series, e.g. Abramowitz &amp; Stegun 4.6.22
 * from memory) summed in 40-digit {@link BigDecimal} arithmetic over the whole domain [0, 1/8].
 */
class KernelMathFastTest {
    /** Allowed difference in ulp of the result (common practice, no source). */
    private static final double ULPS = 4;
    private static final int SAMPLES = 2_000_000;

    @Test
    void atan2FastMatchesStrictMathOverAllQuadrantsAndScales() {
        SplittableRandom rnd = new SplittableRandom(11);
        double worst = 0;
        for (int i = 0; i < SAMPLES; i++) {
            double y = (rnd.nextDouble() * 2 - 1) * Math.pow(10, rnd.nextInt(-12, 13));
            double x = (rnd.nextDouble() * 2 - 1) * Math.pow(10, rnd.nextInt(-12, 13));
            if (i % 5 == 0) {
                x = y * (0.05 + 2 * rnd.nextDouble()) * (rnd.nextBoolean() ? 1 : -1); // ratios near the reduction points
            }
            double ref = StrictMath.atan2(y, x);
            double got = KernelMath.atan2Fast(y, x);
            worst = Math.max(worst, Math.abs(got - ref) / Math.ulp(ref));
            assertEquals(ref, got, ULPS * Math.ulp(ref), "atan2Fast(" + y + ", " + x + ")");
        }
        TestShapes.achieved("KernelMath.atan2Fast vs StrictMath.atan2, max error in ulp", worst);
    }

    @Test
    void atan2FastAtReductionBoundariesAndAxes() {
        double[] ratios = {0, 0.125, 0.375, 0.625, 0.875, 1.0};
        for (double q : ratios) {
            for (double m : new double[] {Math.nextDown(1.0), 1.0, Math.nextUp(1.0)}) {
                double y = q * m;
                for (int s = 0; s < 4; s++) {
                    double yy = (s & 1) == 0 ? y : -y;
                    double xx = (s & 2) == 0 ? 1.0 : -1.0;
                    double ref = StrictMath.atan2(yy == 0 ? 0.0 : yy, xx); // −0 counts as +0 (documented)
                    assertEquals(ref, KernelMath.atan2Fast(yy, xx), ULPS * Math.ulp(ref) + Double.MIN_VALUE,
                        "atan2Fast(" + yy + ", " + xx + ")");
                    double refSwap = StrictMath.atan2(xx, yy);
                    assertEquals(refSwap, KernelMath.atan2Fast(xx, yy), ULPS * Math.ulp(refSwap),
                        "atan2Fast(" + xx + ", " + yy + ")");
                }
            }
        }
        assertEquals(Math.PI / 2, KernelMath.atan2Fast(3.0, 0.0), Math.ulp(Math.PI / 2));
        assertEquals(-Math.PI / 2, KernelMath.atan2Fast(-3.0, 0.0), Math.ulp(Math.PI / 2));
        assertEquals(Math.PI, KernelMath.atan2Fast(1e-300, -1.0), Math.ulp(Math.PI));
    }

    @Test
    void twoAtanhSmallMatchesItsSeriesInExtendedPrecision() {
        SplittableRandom rnd = new SplittableRandom(12);
        MathContext mc = new MathContext(40);
        double worst = 0;
        for (int i = 0; i < 20_000; i++) {
            double t = i == 0 ? KernelMath.ATANH_LIMIT
                : KernelMath.ATANH_LIMIT * (i % 2 == 0 ? rnd.nextDouble() : Math.pow(10, -15 * rnd.nextDouble()));
            BigDecimal bt = new BigDecimal(t);
            BigDecimal t2 = bt.multiply(bt, mc);
            BigDecimal term = bt;
            BigDecimal sum = BigDecimal.ZERO;
            for (int k = 0; k < 40; k++) { // (1/8)^80 / 81: far below 40 digits
                sum = sum.add(term.divide(BigDecimal.valueOf(2L * k + 1), mc), mc);
                term = term.multiply(t2, mc);
            }
            double ref = sum.multiply(BigDecimal.valueOf(2), mc).doubleValue();
            double got = KernelMath.twoAtanhSmall(t);
            worst = Math.max(worst, Math.abs(got - ref) / Math.ulp(ref));
        }
        TestShapes.achieved("KernelMath.twoAtanhSmall vs 40-digit series on [0, 1/8], max error in ulp", worst);
        assertTrue(worst <= ULPS, "max error " + worst + " ulp");
        assertEquals(0.0, KernelMath.twoAtanhSmall(0.0), 0.0);
    }
}
