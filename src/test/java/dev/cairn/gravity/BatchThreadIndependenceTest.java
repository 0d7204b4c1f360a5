package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.util.ProgressListener;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * Results must not depend on the number of threads (issue 2, item 7): {@link BatchEvaluation} with 1 and 2 threads
 * gives bit-identical arrays, equal to single-point evaluation. Common practice, no source: reproducibility is
 * checked bit for bit ({@code Arrays.equals} compares raw bits, NaN included).
 */
class BatchThreadIndependenceTest {
    @Test
    void oneAndTwoThreadsAreBitIdentical() {
        PolyhedronField field = new PolyhedronField(TestShapes.lumpySphere(3, 0.25, 21), 2100.0);
        Random rnd = new Random(4);
        int n = 1000; // several chunks of ParallelChunks.CHUNK
        double[] xyz = new double[3 * n];
        for (int i = 0; i < xyz.length; i++) {
            xyz[i] = 3 * (2 * rnd.nextDouble() - 1);
        }
        for (boolean gradient : new boolean[] {false, true}) {
            double[] one = BatchEvaluation.evaluate(field, xyz, gradient, 1, ProgressListener.NONE);
            double[] two = BatchEvaluation.evaluate(field, xyz, gradient, 2, ProgressListener.NONE);
            double[] five = BatchEvaluation.evaluate(field, xyz, gradient, 5, ProgressListener.NONE);
            assertTrue(Arrays.equals(one, two), "1 vs 2 threads, gradient=" + gradient);
            assertTrue(Arrays.equals(one, five), "1 vs 5 threads, gradient=" + gradient);
            FieldEvaluator ev = field.newEvaluator();
            double[] direct = new double[FieldSample.SIZE];
            for (int i = 0; i < n; i += 97) {
                ev.evaluate(xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2], gradient, direct, 0);
                assertArrayEquals(direct, Arrays.copyOfRange(one, i * FieldSample.SIZE, (i + 1) * FieldSample.SIZE),
                    "point " + i);
            }
        }
    }
}
