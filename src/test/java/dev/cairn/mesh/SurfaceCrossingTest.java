package dev.cairn.mesh;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import org.junit.jupiter.api.Test;

/**
 * Surface-crossing detection against configurations whose answer follows from elementary geometry (convexity of a
 * sphere and a box; the notch of an L-shape), no outside source needed beyond that.
 */
class SurfaceCrossingTest {
    /** Relative slack for touching contacts, as the region loader uses. */
    private static final double TOL = 1e-9;

    @Test
    void nestedConvexSurfacesDoNotCross() {
        TriangleMesh outer = Shapes.icosphere(3, 1000);
        TriangleMesh inner = Shapes.icosphere(2, 400);
        assertNull(SurfaceCrossing.firstCrossing(outer, inner, TOL));
        assertNull(SurfaceCrossing.firstCrossing(inner, outer, TOL));
    }

    @Test
    void disjointSurfacesDoNotCross() {
        TriangleMesh a = Shapes.box(0, 0, 0, 1, 1, 1);
        TriangleMesh b = Shapes.box(2, 0, 0, 3, 1, 1);
        assertNull(SurfaceCrossing.firstCrossing(a, b, TOL));
        assertNull(SurfaceCrossing.firstCrossing(b, a, TOL));
    }

    @Test
    void sharedFaceIsTouchingNotCrossing() {
        TriangleMesh a = Shapes.box(0, 0, 0, 1, 1, 1);
        TriangleMesh b = Shapes.box(1, 0, 0, 2, 1, 1);
        assertNull(SurfaceCrossing.firstCrossing(a, b, TOL));
        assertNull(SurfaceCrossing.firstCrossing(b, a, TOL));
    }

    /** Shifted along x the two icospheres are mirror-symmetric: b's edges cross a exactly on a's edges. */
    @Test
    void overlappingSpheresCrossEvenThroughEdges() {
        TriangleMesh a = Shapes.icosphere(2, 1000);
        TriangleMesh b = Shapes.icosphere(2, 1000).transformed(new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1}, 1,
            new double[] {700, 0, 0});
        assertNotNull(SurfaceCrossing.firstCrossing(a, b, TOL));
        double c = Math.cos(0.3);
        double s = Math.sin(0.3);
        TriangleMesh turned = Shapes.icosphere(2, 1000).transformed(new double[] {c, -s, 0, s, c, 0, 0, 0, 1}, 1,
            new double[] {700, 120, -50});
        assertNotNull(SurfaceCrossing.firstCrossing(a, turned, TOL));
        assertNotNull(SurfaceCrossing.firstCrossing(turned, a, TOL));
    }

    @Test
    void barAcrossTheNotchOfAnLShapeIsFoundThoughAllItsVerticesAreInside() {
        TriangleMesh ell = TestShapes.lShape();
        TriangleMesh bar = TestShapes.bar(new double[] {1.8, 0.8, 0.5}, new double[] {0.8, 1.8, 0.5}, 0.1);
        // Every vertex of the bar lies inside the L (winding number 1) ...
        double[] v = bar.xyz();
        for (int i = 0; i < v.length; i += 3) {
            double omega = 0;
            for (int f = 0; f < ell.facetCount(); f++) {
                omega += FacetGeometry.solidAngle(ell.xyz(), ell.tri(), f, v[i], v[i + 1], v[i + 2]);
            }
            assertEquals(4 * Math.PI, omega, 1e-9, "vertex " + i / 3 + " inside the L");
        }
        // ... yet its long edges leave through the re-entrant faces x = 1 and y = 1 of the L.
        int[] c = SurfaceCrossing.firstCrossing(ell, bar, TOL);
        assertNotNull(c);
        int f = c[2];
        double[] n = ell.facetNormals();
        // The notch x > 1, y > 1 is bounded by the faces x = 1 (outward normal +x) and y = 1 (outward normal +y).
        boolean reentrant = Math.abs(n[3 * f] - 1) < 1e-12 || Math.abs(n[3 * f + 1] - 1) < 1e-12;
        assertTrue(reentrant, "pierced facet " + f + " should face +x or +y (into the notch)");
        // The piercing edge is a long edge of the bar: its ends lie in different arms of the L.
        double[] p0 = {v[3 * c[0]], v[3 * c[0] + 1]};
        double[] p1 = {v[3 * c[1]], v[3 * c[1] + 1]};
        assertArrayEquals(new boolean[] {true, true}, new boolean[] {Math.abs(p0[0] - p1[0]) > 0.5,
            Math.abs(p0[1] - p1[1]) > 0.5});
    }
}
