package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import org.junit.jupiter.api.Test;

/** Overlay and proxy geometry on an icosphere, whose answers follow from spherical geometry. */
class BodyGeometryTest {
    private static final double R = 100;
    private static final double[] ID = {1, 0, 0, 0, 1, 0, 0, 0, 1};
    /** Float coordinates of a 100 m body: relative precision 1e-7 (24-bit mantissa), with margin. */
    private static final double FLOAT_TOL = 1e-4;

    private static BodyGeometry sphere(int level) {
        return BodyGeometry.of(Shapes.icosphere(level, R), new double[3], ID, new double[] {0, 0, 1}, "s");
    }

    @Test
    void graticuleLatitudeSegmentsLieOnTheirParallel() {
        BodyGeometry g = sphere(3);
        double lift = 0.01;
        float[] seg = g.graticule(30, lift);
        assertTrue(seg.length > 0);
        int onParallel = 0;
        for (int i = 0; i < seg.length; i += 6) {
            double z1 = seg[i + 2];
            double z2 = seg[i + 5];
            // a segment of latitude c has both ends at the same latitude c, a multiple of 30°; on a chord between
            // sphere vertices the interpolated point sits inside the sphere, so compare the angle, not the radius
            double lat1 = Math.toDegrees(Math.asin(z1 / Math.sqrt(seg[i] * seg[i] + seg[i + 1] * seg[i + 1] + z1 * z1)));
            double lat2 = Math.toDegrees(Math.asin(z2 / Math.sqrt(seg[i + 3] * seg[i + 3] + seg[i + 4] * seg[i + 4]
                + z2 * z2)));
            double r1 = Math.sqrt(seg[i] * seg[i] + seg[i + 1] * seg[i + 1] + z1 * z1);
            assertTrue(r1 <= R * (1 + lift) * (1 + FLOAT_TOL) && r1 > R * 0.97, "on the lifted surface: " + r1);
            if (Math.abs(lat1 - lat2) < 0.5 && Math.abs(lat1 - 30 * Math.round(lat1 / 30)) < 1.0) {
                onParallel++;
            }
        }
        assertTrue(onParallel > 50, "latitude segments found: " + onParallel);
    }

    @Test
    void outlineOfAVertexFanIsItsRing() {
        BodyGeometry g = sphere(2);
        TriangleMesh m = g.mesh();
        int[] tri = m.tri();
        java.util.List<Integer> fan = new java.util.ArrayList<>();
        for (int f = 0; f < m.facetCount(); f++) {
            if (tri[3 * f] == 0 || tri[3 * f + 1] == 0 || tri[3 * f + 2] == 0) {
                fan.add(f);
            }
        }
        int[] facets = fan.stream().mapToInt(Integer::intValue).toArray();
        float[] seg = g.outline(facets, 0);
        // the fan around an icosahedron vertex has 5 facets and a ring of 5 boundary edges (Euler, closed surface)
        assertEquals(5, facets.length);
        assertEquals(5 * 6, seg.length);
    }

    @Test
    void clusteredProxyKeepsTheShapeWithFewerFacets() {
        BodyGeometry g = sphere(5); // 20480 facets
        BodyGeometry.Proxy p = g.clustered(16);
        assertTrue(p.facetCount() < g.mesh().facetCount() / 4, "proxy facets " + p.facetCount());
        assertTrue(p.facetCount() > 500, "proxy facets " + p.facetCount());
        double cell = 2 * R / 16;
        // merged vertices are means of sphere points within one cell: inside the sphere, within a cell diagonal
        for (int i = 0; i < p.points().length; i += 3) {
            double r = Math.sqrt(p.points()[i] * p.points()[i] + p.points()[i + 1] * p.points()[i + 1]
                + p.points()[i + 2] * p.points()[i + 2]);
            assertTrue(r <= R * (1 + FLOAT_TOL) && r >= R - Math.sqrt(3) * cell, "proxy vertex radius " + r);
        }
        for (int s : p.sourceFacet()) {
            assertTrue(s >= 0 && s < g.mesh().facetCount());
        }
    }
}
