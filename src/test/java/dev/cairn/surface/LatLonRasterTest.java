package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.rotation.SpinState;
import org.junit.jupiter.api.Test;

/**
 * The latitude–longitude raster behind the PNG maps, checked against its definition: the facet shown in a cell is
 * the one the ray from the centre of mass along the cell's direction passes through, so the cell direction lies inside
 * that facet's cone (the three vertex directions). Checked by brute force over all facets with the same geometry
 * (the triple product sign test for a direction inside a triangle's cone, a textbook identity).
 */
class LatLonRasterTest {
    /** Cone membership slack for directions on a shared edge (round-off). */
    private static final double CONE_TOL = 1e-9;

    private static boolean insideCone(TriangleMesh m, int f, double[] c, double[] d) {
        double[] xyz = m.xyz();
        int[] tri = m.tri();
        double[][] v = new double[3][3];
        for (int k = 0; k < 3; k++) {
            for (int q = 0; q < 3; q++) {
                v[k][q] = xyz[3 * tri[3 * f + k] + q] - c[q];
            }
        }
        for (int k = 0; k < 3; k++) {
            double[] a = v[k];
            double[] b = v[(k + 1) % 3];
            double cx = a[1] * b[2] - a[2] * b[1];
            double cy = a[2] * b[0] - a[0] * b[2];
            double cz = a[0] * b[1] - a[1] * b[0];
            double s = (cx * d[0] + cy * d[1] + cz * d[2]) / Math.sqrt(cx * cx + cy * cy + cz * cz);
            if (s < -CONE_TOL) {
                return false;
            }
        }
        return true;
    }

    @Test
    void everyCellShowsTheFacetItsRayCrosses() {
        // An off-centre ellipsoid about a tilted pole: dateline, poles and an oblique frame are all exercised.
        TriangleMesh e = Shapes.ellipsoid(2, 300, 200, 150);
        double[] shift = {40, -25, 10};
        TriangleMesh m = e.transformed(new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1}, 1, shift);
        RotatingFrame frame = new RotatingFrame(new SpinState(3600, new double[] {0.3, 0.2, 1}), shift);
        LatLonRaster r = LatLonRaster.build(m, frame, 144, 72, 2);
        double[] d = new double[3];
        for (int j = 0; j < r.height(); j++) {
            for (int i = 0; i < r.width(); i++) {
                int f = r.facet(i, j);
                assertTrue(f >= 0, "the centre is inside a convex body: every ray hits, cell " + i + "," + j);
                frame.direction(r.latDeg(j), r.lonDeg(i), d, 0);
                assertTrue(insideCone(m, f, shift, d), "cell " + i + "," + j + " facet " + f);
            }
        }
        assertEquals(1, r.layers(), "star-shaped about the centre: one crossing per ray");
        for (int l : LatLonRaster.facetLayers(m, frame, 2)) {
            assertEquals(1, l, "every facet on the outer layer");
        }
        assertEquals(144, r.width());
        assertEquals(-180 + 1.25, r.lonDeg(0), 1e-12);
        assertEquals(90 - 1.25, r.latDeg(0), 1e-12);
    }
}
