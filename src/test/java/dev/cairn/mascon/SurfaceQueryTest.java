package dev.cairn.mascon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Geometric queries against their definitions: the winding number is 1 inside and 0 outside a closed surface
 * (Σω = 4π inside, 0 outside: shared references §1); the distance to the unit cube's surface is elementary; the
 * local pseudo-normal sign test (Bærentzen &amp; Aanæs 2005) agrees with the global winding number; the ray crossing
 * of a sphere is its radius.
 */
class SurfaceQueryTest {
    /** Winding number away from the surface: rounding only. */
    private static final double WINDING_TOL = 1e-10;
    /** Distance: rounding only. */
    private static final double DISTANCE_TOL = 1e-12;

    @Test
    void windingAndDistanceOfTheUnitCube() {
        SurfaceQuery q = new SurfaceQuery(Shapes.unitCube());
        double[] o = new double[2];
        q.windingAndDistance(0.2, 0.3, 0.4, o);
        assertEquals(1.0, o[0], WINDING_TOL);
        assertEquals(0.2, o[1], DISTANCE_TOL, "nearest face x = 0");
        q.windingAndDistance(2, 0.3, -0.7, o);
        assertEquals(0.0, o[0], WINDING_TOL);
        assertEquals(Math.hypot(1, 0.7), o[1], DISTANCE_TOL, "nearest edge x = 1, z = 0");
        q.windingAndDistance(-1, -2, 3, o);
        assertEquals(Math.sqrt(1 + 4 + 4), o[1], DISTANCE_TOL, "nearest vertex (0, 0, 1)");
    }

    @Test
    void localSignTestAgreesWithTheWindingNumber() {
        // Property test, seeded: points near a lumpy closed surface, classified by the local view of random
        // neighbourhoods, against the global winding number (the definition).
        TriangleMesh m = Shapes.ellipsoid(2, 1.5, 1.0, 0.7);
        SurfaceQuery q = new SurfaceQuery(m);
        SplittableRandom rnd = new SplittableRandom(11);
        double[] g = new double[2];
        double[] l = new double[2];
        int checked = 0;
        for (int n = 0; n < 60; n++) {
            double cx = rnd.nextDouble(-1.6, 1.6);
            double cy = rnd.nextDouble(-1.1, 1.1);
            double cz = rnd.nextDouble(-0.8, 0.8);
            double radius = rnd.nextDouble(0.05, 0.4);
            SurfaceQuery.Local local = q.near(cx, cy, cz, radius);
            boolean surfaceReaches = q.distance(cx, cy, cz) <= radius;
            for (int k = 0; k < 20; k++) {
                double x = cx + radius * rnd.nextDouble(-0.57, 0.57);
                double y = cy + radius * rnd.nextDouble(-0.57, 0.57);
                double z = cz + radius * rnd.nextDouble(-0.57, 0.57);
                q.windingAndDistance(x, y, z, g);
                local.windingAndDistance(x, y, z, l);
                assertEquals(g[0] > 0.5 ? 1.0 : 0.0, l[0], "inside/outside at " + x + "," + y + "," + z);
                assertTrue(l[1] <= g[1] + DISTANCE_TOL, "local distance is exact or a lower bound");
                if (surfaceReaches) {
                    assertEquals(g[1], l[1], DISTANCE_TOL, "exact when the surface reaches the neighbourhood");
                    checked++;
                }
            }
        }
        assertTrue(checked > 100, "enough points near the surface: " + checked);
    }

    @Test
    void farthestRayCrossingOfASphereIsItsRadius() {
        SurfaceQuery q = new SurfaceQuery(Shapes.icosphere(3, 2.0));
        double t = q.farthestHit(0, 0, 0, 0, 0, 1);
        assertEquals(2.0, t, 1e-12, "the +z pole is a vertex of the icosphere");
        double u = q.farthestHit(0, 0, 0, 0.6, 0.0, 0.8);
        assertTrue(u <= 2.0 && u > 2.0 * 0.99, "inside the sphere, within the facets' sag: " + u);
    }

    /**
     * Signed distance through the bucket grid against the elementary signed distance of a box (outside: length of the
     * excess over the faces; inside: minus the smallest distance to a face; common practice, no source), and on a
     * lumpy body against a brute-force minimum over all facets with the sign of the winding number.
     */
    @Test
    void signedDistanceThroughTheIndex() {
        SurfaceQuery cube = new SurfaceQuery(Shapes.box(-1, -2, -3, 1, 2, 3));
        double[] w = new double[4];
        SplittableRandom rnd = new SplittableRandom(3);
        double[] h = {1, 2, 3};
        for (int i = 0; i < 3000; i++) {
            double s = i < 1500 ? 4 : 400; // near and far points
            double[] p = {s * (2 * rnd.nextDouble() - 1), s * (2 * rnd.nextDouble() - 1), s * (2 * rnd.nextDouble() - 1)};
            double out = 0;
            double in = Double.POSITIVE_INFINITY;
            for (int a = 0; a < 3; a++) {
                double e = Math.abs(p[a]) - h[a];
                out += Math.max(0, e) * Math.max(0, e);
                in = Math.min(in, -e);
            }
            double expected = out > 0 ? Math.sqrt(out) : -in;
            assertEquals(expected, cube.signedDistance(p[0], p[1], p[2], w), DISTANCE_TOL * (1 + Math.abs(expected)));
        }
        TriangleMesh lumpy = dev.cairn.TestShapes.lumpySphere(3, 0.3, 8);
        SurfaceQuery q = new SurfaceQuery(lumpy);
        double[] o = new double[2];
        for (int i = 0; i < 2000; i++) {
            double s = i < 1000 ? 1.3 : 30;
            double x = s * (2 * rnd.nextDouble() - 1);
            double y = s * (2 * rnd.nextDouble() - 1);
            double z = s * (2 * rnd.nextDouble() - 1);
            q.windingAndDistance(x, y, z, o);
            double expected = o[0] > 0.5 ? -o[1] : o[1];
            assertEquals(expected, q.signedDistance(x, y, z, w), DISTANCE_TOL * (1 + Math.abs(expected)));
        }
    }
}
