package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.TriangleMesh;
import java.util.Arrays;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The polyhedron kernel's vector path (several points per pass, lanes = field points) and its scalar path must give
 * the same bits for every point, whatever points share a pass and however a batch is cut into calls, so that results
 * do not depend on the thread count, the chunking or whether {@code jdk.incubator.vector} is present. Common
 * practice, no source: reproducibility is checked bit for bit ({@code Arrays.equals} compares raw bits, NaN
 * included). The points mix every branch of the kernel in one pass: inside, outside, far away, on vertices, on edges,
 * on facets, within a few edge lengths of an edge.
 */
class KernelPathsBitIdentityTest {
    private static final TriangleMesh BODY = TestShapes.lumpySphere(3, 0.25, 21);

    /** Points of every kind, shuffled so that each pass of lanes mixes kinds. */
    private static double[] mixedPoints() {
        Random rnd = new Random(9);
        double[] v = BODY.xyz();
        int[] t = BODY.tri();
        double[] c = BODY.facetCentroids();
        int n = 700;
        double[] xyz = new double[3 * n];
        for (int i = 0; i < n; i++) {
            int kind = i % 7;
            int f = rnd.nextInt(BODY.facetCount());
            int a = 3 * t[3 * f];
            int b = 3 * t[3 * f + 1];
            for (int k = 0; k < 3; k++) {
                double p;
                switch (kind) {
                    case 0: p = 2.5 * (2 * rnd.nextDouble() - 1); break; // inside or outside
                    case 1: p = v[a + k]; break; // on a vertex
                    case 2: p = 0.5 * (v[a + k] + v[b + k]); break; // on an edge
                    case 3: p = c[3 * f + k]; break; // on a facet
                    case 4: p = 0.5 * (v[a + k] + v[b + k]) + 1e-3 * (2 * rnd.nextDouble() - 1); break; // near an edge
                    case 5: p = c[3 * f + k] * (1 + 0.05 * rnd.nextDouble()); break; // just above a facet
                    default: p = 1e5 * (2 * rnd.nextDouble() - 1); break; // far away
                }
                xyz[3 * i + k] = p;
            }
        }
        return xyz;
    }

    private static double[] onePointAtATime(FieldEvaluator ev, double[] xyz, boolean gradient) {
        int n = xyz.length / 3;
        double[] out = new double[n * FieldSample.SIZE];
        for (int i = 0; i < n; i++) {
            ev.evaluate(xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2], gradient, out, i * FieldSample.SIZE);
        }
        return out;
    }

    @Test
    void vectorPathGivesTheScalarPathsBits() {
        assumeTrue(PolyhedronField.VECTOR_PATH, "jdk.incubator.vector not present: only the scalar path exists");
        PolyhedronField field = new PolyhedronField(BODY, 2100.0);
        double[] xyz = mixedPoints();
        int n = xyz.length / 3;
        for (boolean gradient : new boolean[] {false, true}) {
            double[] scalar = onePointAtATime(field.newEvaluator(false), xyz, gradient);
            double[] vector = new double[n * FieldSample.SIZE];
            field.newEvaluator(true).evaluateBatch(xyz, 0, n, gradient, vector);
            for (int i = 0; i < n; i++) {
                double[] s = Arrays.copyOfRange(scalar, i * FieldSample.SIZE, (i + 1) * FieldSample.SIZE);
                double[] v = Arrays.copyOfRange(vector, i * FieldSample.SIZE, (i + 1) * FieldSample.SIZE);
                assertTrue(Arrays.equals(s, v), "point " + i + " (kind " + i % 7 + "), gradient=" + gradient + ": "
                    + Arrays.toString(s) + " vs " + Arrays.toString(v));
            }
        }
    }

    @Test
    void batchResultsDoNotDependOnChunkingOrNeighbours() {
        PolyhedronField field = new PolyhedronField(BODY, 2100.0);
        double[] xyz = mixedPoints();
        int n = xyz.length / 3;
        double[] single = onePointAtATime(field.newEvaluator(), xyz, true);
        // uneven chunks: 1, 2, 3, ... points per call, so the same point meets different neighbours in its pass
        double[] chunked = new double[n * FieldSample.SIZE];
        FieldEvaluator ev = field.newEvaluator();
        for (int from = 0, size = 1; from < n; from += size, size = size % 19 + 1) {
            ev.evaluateBatch(xyz, from, Math.min(n, from + size), true, chunked);
        }
        assertTrue(Arrays.equals(single, chunked), "uneven chunks vs one point at a time");
        // the same points in reverse order: each now shares its pass with other points
        double[] rev = new double[xyz.length];
        for (int i = 0; i < n; i++) {
            System.arraycopy(xyz, 3 * (n - 1 - i), rev, 3 * i, 3);
        }
        double[] reversed = new double[n * FieldSample.SIZE];
        field.newEvaluator().evaluateBatch(rev, 0, n, true, reversed);
        for (int i = 0; i < n; i++) {
            for (int k = 0; k < FieldSample.SIZE; k++) {
                assertEquals(Double.doubleToRawLongBits(single[i * FieldSample.SIZE + k]),
                    Double.doubleToRawLongBits(reversed[(n - 1 - i) * FieldSample.SIZE + k]), "point " + i + " slot " + k);
            }
        }
    }
}
