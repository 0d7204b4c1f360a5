package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.TriangleMesh;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * {@link FacetGeometry#distanceSquared} (Ericson 2005 §5.1.5, Voronoi regions of the triangle's features) against the
 * independent projection-and-segments distance of {@link BruteGeometry}, on random triangles (including slivers)
 * and points near and far, on every side. The reported p − q must have the reported length and q must lie on the
 * triangle's plane within round-off.
 */
class ClosestPointTest {
    /** Relative agreement of two distance algorithms (round-off; chosen, no source). */
    private static final double REL = 1e-9;

    @Test
    void agreesWithProjectionAndSegmentDistances() {
        SplittableRandom rnd = new SplittableRandom(5);
        int[] features = new int[7];
        for (int trial = 0; trial < 4000; trial++) {
            double[] xyz = new double[9];
            for (int i = 0; i < 9; i++) {
                xyz[i] = rnd.nextDouble(-100, 100);
            }
            if (trial % 10 == 0) { // sliver: third vertex near the first edge
                for (int k = 0; k < 3; k++) {
                    xyz[6 + k] = 0.5 * (xyz[k] + xyz[3 + k]) + rnd.nextDouble(-1e-3, 1e-3);
                }
            }
            TriangleMesh m = new TriangleMesh(xyz, new int[] {0, 1, 2});
            double scale = trial % 3 == 0 ? 10 : 300;
            double[] p = {rnd.nextDouble(-scale, scale), rnd.nextDouble(-scale, scale), rnd.nextDouble(-scale, scale)};
            double[] w = new double[4];
            double d2 = FacetGeometry.distanceSquared(xyz, m.tri(), 0, p[0], p[1], p[2], w);
            double brute = BruteGeometry.distance(m, 0, p);
            assertEquals(brute, Math.sqrt(d2), REL * Math.max(1, brute), "trial " + trial);
            assertEquals(d2, w[0] * w[0] + w[1] * w[1] + w[2] * w[2], 1e-12 * Math.max(1, d2));
            features[(int) w[3]]++;
        }
        for (int k = 0; k < 7; k++) {
            assertTrue(features[k] > 0, "feature " + k + " (face, vertices, edges) exercised");
        }
    }
}
