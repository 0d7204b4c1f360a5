package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Colour-bar ticks: exact ends plus round numbers in between (common practice for axis labelling, no source: steps
 * of 1, 2, 2.5 or 5 times a power of ten).
 */
class LegendTicksTest {
    /** Labels closer than this fraction of the range would overlap on the 280-pixel bar (common practice, no source). */
    private static final double MIN_GAP = 0.08;

    @Test
    void slopeRangeGetsRoundInnerTicks() {
        assertArrayEquals(new double[] {0.01216, 10, 20, 30}, Legend.ticks(0.01216, 30), 1e-12);
        assertArrayEquals(new double[] {0, 5, 10, 15}, Legend.ticks(0, 15), 1e-12);
        assertArrayEquals(new double[] {-130.5, -100, -50, 0, 50, 70.47}, Legend.ticks(-130.5, 70.47), 1e-12);
    }

    @Test
    void randomRangesKeepEndsOrderRoundnessAndSpacing() {
        SplittableRandom rnd = new SplittableRandom(3);
        for (int i = 0; i < 10_000; i++) {
            double scale = Math.pow(10, rnd.nextInt(-6, 7));
            double a = (rnd.nextDouble() * 2 - 1) * scale;
            double b = a + rnd.nextDouble() * scale + 1e-3 * scale;
            double[] t = Legend.ticks(a, b);
            assertEquals(a, t[0]);
            assertEquals(b, t[t.length - 1]);
            assertTrue(t.length >= 2 && t.length <= 8, "tick count " + t.length);
            for (int k = 1; k < t.length; k++) {
                assertTrue(t[k] - t[k - 1] >= MIN_GAP * (b - a) * (1 - 1e-9), "ticks too close: " + a + ".." + b);
            }
        }
    }

    @Test
    void degenerateRangeHasOneTick() {
        assertArrayEquals(new double[] {2.0}, Legend.ticks(2.0, 2.0));
    }
}
