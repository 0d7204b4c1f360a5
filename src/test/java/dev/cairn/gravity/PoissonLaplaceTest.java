package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * Poisson's and Laplace's equations for a constant-density body: ∇²U = −4πGρ inside, 0 outside, and on the surface
 * −Gρ times the solid angle the body's interior subtends at the point (2π on a facet interior, π on a right-angled
 * edge, π/2 at a cube corner), from the solid-angle sum of Werner &amp; Scheeres (1997), Celest. Mech. Dyn. Astron.
 * 65:313–344, with the triangle solid angle of Van Oosterom &amp; Strackee (1983), IEEE Trans. Biomed. Eng. 30:125.
 * Also the inside/outside/surface classification that the same sum provides.
 */
class PoissonLaplaceTest {
    /** Relative error allowed on the Laplacian (it is a sum of a few thousand atan2 terms). */
    private static final double LAPLACIAN_REL_TOL = 1e-12;
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1
    /** An irregular, star-shaped body: lumpy radii in [0.8, 1.2] on an ellipsoid 1 : 0.8 : 0.6 (test shape). */
    private static final TriangleMesh LUMPY = TestShapes.lumpySphere(3, 0.2, 7);
    private final FieldEvaluator ev = new PolyhedronField(LUMPY, RHO).newEvaluator();

    private double[] at(FieldEvaluator e, double x, double y, double z) {
        double[] s = new double[FieldSample.SIZE];
        e.evaluate(x, y, z, false, s, 0);
        return s;
    }

    @Test
    void poissonInsideLaplaceOutside() {
        Random rnd = new Random(11);
        double worst = 0;
        for (int n = 0; n < 60; n++) {
            double[] d = randomDirection(rnd);
            boolean inside = n % 2 == 0;
            // Every vertex lies within the ellipsoid 1.2·(1, 0.8, 0.6) and outside 0.8·(1, 0.8, 0.6); facets are chords
            // of a star-shaped surface, so scale 0.5 is safely inside and 1.3 safely outside.
            double k = inside ? 0.5 * rnd.nextDouble() : 1.3 + 2 * rnd.nextDouble();
            double[] s = at(ev, k * d[0], k * 0.8 * d[1], k * 0.6 * d[2]);
            if (inside) {
                double err = Math.abs(s[FieldSample.LAPLACIAN] + 4 * Math.PI) / (4 * Math.PI);
                assertTrue(err <= LAPLACIAN_REL_TOL, "Poisson inside, rel error " + err);
                assertEquals(Location.INSIDE, Location.fromCode(s[FieldSample.LOCATION]));
                worst = Math.max(worst, err);
            } else {
                double err = Math.abs(s[FieldSample.LAPLACIAN]) / (4 * Math.PI);
                assertTrue(err <= LAPLACIAN_REL_TOL, "Laplace outside, error " + err);
                assertEquals(Location.OUTSIDE, Location.fromCode(s[FieldSample.LOCATION]));
                worst = Math.max(worst, err);
            }
        }
        TestShapes.achieved("Poisson/Laplace inside/outside, max |ΔLaplacian|/(4πGρ)", worst);
    }

    @Test
    void facetInteriorPointsGiveHalfThePoissonValue() {
        double[] c = LUMPY.facetCentroids();
        double worst = 0;
        for (int f = 0; f < LUMPY.facetCount(); f += 37) {
            double[] s = at(ev, c[3 * f], c[3 * f + 1], c[3 * f + 2]);
            double err = Math.abs(s[FieldSample.LAPLACIAN] + 2 * Math.PI) / (2 * Math.PI);
            assertTrue(err <= LAPLACIAN_REL_TOL, "facet " + f + ": Laplacian " + s[FieldSample.LAPLACIAN]);
            assertEquals(Location.SURFACE, Location.fromCode(s[FieldSample.LOCATION]), "facet " + f);
            worst = Math.max(worst, err);
        }
        TestShapes.achieved("Laplacian on facet interiors, max relative error vs -2πGρ", worst);
    }

    @Test
    void edgesAndVerticesOfABoxGiveTheirInteriorSolidAngle() {
        // Interior solid angle of a right dihedral wedge is 2·(π/2) = π; of a box corner 4π/8 = π/2 (geometry).
        FieldEvaluator box = new PolyhedronField(Shapes.box(-1, 2, 0.5, 1.5, 3, 1.25), RHO).newEvaluator();
        double[] edge = at(box, 0.2, 2, 0.5);
        assertEquals(-Math.PI, edge[FieldSample.LAPLACIAN], LAPLACIAN_REL_TOL * Math.PI, "edge");
        assertEquals(Location.SURFACE, Location.fromCode(edge[FieldSample.LOCATION]));
        double[] corner = at(box, 1.5, 3, 1.25);
        assertEquals(-Math.PI / 2, corner[FieldSample.LAPLACIAN], LAPLACIAN_REL_TOL * Math.PI, "corner");
        assertEquals(Location.SURFACE, Location.fromCode(corner[FieldSample.LOCATION]));
        // A diagonal edge inside a face (two coplanar facets) is a facet interior point: 2π.
        double[] diag = at(box, 0.25, 2.5, 0.5);
        assertEquals(-2 * Math.PI, diag[FieldSample.LAPLACIAN], LAPLACIAN_REL_TOL * Math.PI, "face diagonal");
        TestShapes.achieved("Laplacian on box edge / corner / face diagonal, max error / π", Math.max(
            Math.abs(edge[FieldSample.LAPLACIAN] + Math.PI), Math.max(Math.abs(corner[FieldSample.LAPLACIAN] + Math.PI / 2),
            Math.abs(diag[FieldSample.LAPLACIAN] + 2 * Math.PI))) / Math.PI);
    }

    @Test
    void verticesAndEdgeMidpointsOfAnIrregularMeshAreOnTheSurface() {
        double[] xyz = LUMPY.xyz();
        int[] tri = LUMPY.tri();
        for (int v = 0; v < LUMPY.vertexCount(); v += 29) {
            double[] s = at(ev, xyz[3 * v], xyz[3 * v + 1], xyz[3 * v + 2]);
            assertEquals(Location.SURFACE, Location.fromCode(s[FieldSample.LOCATION]), "vertex " + v);
            assertTrue(s[FieldSample.LAPLACIAN] < 0 && s[FieldSample.LAPLACIAN] > -4 * Math.PI, "vertex " + v);
        }
        for (int f = 0; f < LUMPY.facetCount(); f += 41) {
            int a = 3 * tri[3 * f];
            int b = 3 * tri[3 * f + 1];
            double[] s = at(ev, 0.5 * (xyz[a] + xyz[b]), 0.5 * (xyz[a + 1] + xyz[b + 1]), 0.5 * (xyz[a + 2] + xyz[b + 2]));
            assertEquals(Location.SURFACE, Location.fromCode(s[FieldSample.LOCATION]), "edge of facet " + f);
        }
    }

    @Test
    void classificationToleranceAroundAFacet() {
        // PolyhedronField.ON_FACET_TOLERANCE is relative (distance to the plane over the facet size, about 1e-10):
        // 1e-13 off a facet is "surface", 1e-6 inward is "inside", 1e-6 outward is "outside".
        double[] c = LUMPY.facetCentroids();
        double[] n = LUMPY.facetNormals();
        for (int f = 0; f < LUMPY.facetCount(); f += 53) {
            for (double off : new double[] {1e-13, -1e-13}) {
                double[] s = at(ev, c[3 * f] + off * n[3 * f], c[3 * f + 1] + off * n[3 * f + 1],
                    c[3 * f + 2] + off * n[3 * f + 2]);
                assertEquals(Location.SURFACE, Location.fromCode(s[FieldSample.LOCATION]), "facet " + f + " " + off);
            }
            double[] in = at(ev, c[3 * f] - 1e-6 * n[3 * f], c[3 * f + 1] - 1e-6 * n[3 * f + 1],
                c[3 * f + 2] - 1e-6 * n[3 * f + 2]);
            assertEquals(Location.INSIDE, Location.fromCode(in[FieldSample.LOCATION]), "facet " + f + " inward");
            assertEquals(-4 * Math.PI, in[FieldSample.LAPLACIAN], 1e-9, "Poisson just inside facet " + f);
            double[] out = at(ev, c[3 * f] + 1e-6 * n[3 * f], c[3 * f + 1] + 1e-6 * n[3 * f + 1],
                c[3 * f + 2] + 1e-6 * n[3 * f + 2]);
            assertEquals(Location.OUTSIDE, Location.fromCode(out[FieldSample.LOCATION]), "facet " + f + " outward");
            assertEquals(0.0, out[FieldSample.LAPLACIAN], 1e-9, "Laplace just outside facet " + f);
        }
    }

    @Test
    void nonConvexBodyClassification() {
        // L-shape of three unit cubes: the notch (1.5, 1.5, 0.5) is outside although inside the bounding box.
        FieldEvaluator l = new PolyhedronField(TestShapes.lShape(), RHO).newEvaluator();
        assertEquals(Location.OUTSIDE, Location.fromCode(at(l, 1.5, 1.5, 0.5)[FieldSample.LOCATION]));
        assertEquals(Location.INSIDE, Location.fromCode(at(l, 1.5, 0.5, 0.5)[FieldSample.LOCATION]));
        assertEquals(Location.INSIDE, Location.fromCode(at(l, 0.5, 1.5, 0.5)[FieldSample.LOCATION]));
        // On the reflex edge (1,1,z) the interior solid angle is 3/4 of the full 2π·2 wedge: 3π.
        double[] reflex = at(l, 1, 1, 0.5);
        assertEquals(Location.SURFACE, Location.fromCode(reflex[FieldSample.LOCATION]));
        assertEquals(-3 * Math.PI, reflex[FieldSample.LAPLACIAN], LAPLACIAN_REL_TOL * Math.PI, "reflex edge");
    }

    private static double[] randomDirection(Random rnd) {
        double z = 2 * rnd.nextDouble() - 1;
        double phi = 2 * Math.PI * rnd.nextDouble();
        double s = Math.sqrt(1 - z * z);
        return new double[] {s * Math.cos(phi), s * Math.sin(phi), z};
    }
}
