package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Polyhedron field of a non-cubic box off the origin against the prism closed form (Nagy, Papp &amp; Benedek 2000,
 * J. Geodesy 74:552–560), implemented independently in {@link PrismClosedForm}: points outside, inside, on face
 * centres, on edges and on vertices. Tolerances are the requirements.
 */
class PrismClosedFormTest {
    /** Relative error allowed off edges and vertices (issue 2, item 10). */
    private static final double REL_TOL = 1e-12;
    /** Relative error allowed on edges and vertices (issue 2, item 10). */
    private static final double REL_TOL_EDGE = 1e-10;
    /** The closed form against the [V] unit-cube table of shared references §2 (15-digit values). */
    private static final double TABLE_TOL = 1e-13;
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1
    /** Box [1,3] x [-2,-0.5] x [0.5,1.5]: sides 2, 1.5, 1, away from the origin. */
    private static final double[] BOX = {1.0, -2.0, 0.5, 3.0, -0.5, 1.5};

    private final FieldEvaluator ev =
        new PolyhedronField(Shapes.box(BOX[0], BOX[1], BOX[2], BOX[3], BOX[4], BOX[5]), RHO).newEvaluator();

    @Test
    void closedFormReproducesUnitCubeTable() {
        // Shared references §2 [V]: unit cube values recomputed by quadrature (≥ 11 digits).
        double[] cube = {0, 0, 0, 1, 1, 1};
        double[][] rows = {
            {0.5, 0.5, 0.5, 2.380077363979554, 0, 0, 0},
            {0.2, 0.3, 0.4, 2.091891625243910, 1.275395167441784, 0.745680592519306, 0.345922139094193},
            {2, 0.3, -0.7, 0.517880541626438, -0.208602877535082, 0.027610977640465, 0.166517539001699},
            {0, 0, 0, 1.190038681989777, 0.969388052712568, 0.969388052712568, 0.969388052712568},
            {0.5, 0.5, 0, 1.792810243178775, 0, 0, 2.596896578258365},
            {0.5, 0, 0, 1.427260179700358, 0, 1.551694097314306, 1.551694097314306}};
        for (double[] row : rows) {
            double[] f = PrismClosedForm.field(1.0, cube, row[0], row[1], row[2]);
            for (int k = 0; k < 4; k++) {
                assertEquals(row[3 + k], f[k], TABLE_TOL * Math.max(1, Math.abs(row[3 + k])),
                    "closed form vs table at " + row[0] + "," + row[1] + "," + row[2] + " slot " + k);
            }
        }
    }

    private static double[][] generalPoints() {
        return new double[][] {
            // outside, in every direction and near the box
            {4.2, 0.7, 3.1}, {-1.5, -3.3, -2.0}, {2.0, -1.25, 2.7}, {0.4, -1.0, 1.0}, {3.05, -0.49, 1.0},
            {1.9, 0.8, -0.3}, {-7.0, 5.0, 9.0},
            // inside
            {1.3, -1.9, 0.6}, {2.9, -0.6, 1.45}, {1.0001, -1.2, 0.9},
            // face centres
            {1.0, -1.25, 1.0}, {3.0, -1.25, 1.0}, {2.0, -2.0, 1.0}, {2.0, -0.5, 1.0}, {2.0, -1.25, 0.5},
            {2.0, -1.25, 1.5},
            // other points on faces
            {1.0, -1.9, 0.6}, {2.7, -0.5, 1.3}};
    }

    private static double[][] edgeAndVertexPoints() {
        List<double[]> pts = new ArrayList<>();
        for (int i = 0; i < 2; i++) {
            for (int j = 0; j < 2; j++) {
                for (int k = 0; k < 2; k++) {
                    pts.add(new double[] {BOX[3 * i], BOX[1 + 3 * j], BOX[2 + 3 * k]}); // 8 vertices
                }
            }
        }
        // edge midpoints and off-centre edge points along x, y and z
        pts.add(new double[] {2.0, -2.0, 0.5});
        pts.add(new double[] {1.3, -0.5, 1.5});
        pts.add(new double[] {1.0, -1.25, 0.5});
        pts.add(new double[] {3.0, -0.8, 1.5});
        pts.add(new double[] {1.0, -2.0, 1.0});
        pts.add(new double[] {3.0, -0.5, 0.7});
        return pts.toArray(new double[0][]);
    }

    @Test
    void generalPointsMatchClosedForm() {
        double worst = compare(generalPoints(), REL_TOL);
        TestShapes.achieved("prism closed form, outside/inside/faces, max relative error", worst);
    }

    @Test
    void edgesAndVerticesMatchClosedForm() {
        double worst = compare(edgeAndVertexPoints(), REL_TOL_EDGE);
        TestShapes.achieved("prism closed form, edges/vertices, max relative error", worst);
    }

    @Test
    void pointsCloseToEdgesAndVerticesMatchClosedForm() {
        // Shared references §1 [V]: close to an edge a+b−e cancels unless computed in a cancellation-free form.
        List<double[]> pts = new ArrayList<>();
        for (double d : new double[] {1e-4, 1e-7, 1e-10, 1e-13}) {
            pts.add(new double[] {2.0, -2.0 - d, 0.5 - d});        // outside, near the edge along x
            pts.add(new double[] {2.0, -2.0 + d, 0.5 + d});        // inside, near the same edge
            pts.add(new double[] {1.0 - d, -0.5 + d, 1.1});        // near the edge along z, across both faces
            pts.add(new double[] {3.0 + d, -0.5 + d, 1.5 + d});    // near a vertex, outside
            pts.add(new double[] {3.0 - d, -0.5 - d, 1.5 - d});    // near a vertex, inside
        }
        double worst = compare(pts.toArray(new double[0][]), REL_TOL_EDGE);
        TestShapes.achieved("prism closed form, 1e-4..1e-13 from edges/vertices, max relative error", worst);
    }

    /** Relative errors: |ΔU|/|U| and |Δg|/|g| (vector norm; the box centre, where g = 0, is checked separately). */
    private double compare(double[][] pts, double tol) {
        double worst = 0;
        double[] s = new double[FieldSample.SIZE];
        for (double[] p : pts) {
            double[] ref = PrismClosedForm.field(1.0, BOX, p[0], p[1], p[2]);
            ev.evaluate(p[0], p[1], p[2], false, s, 0);
            String at = "at (" + p[0] + ", " + p[1] + ", " + p[2] + ")";
            assertTrue(Double.isFinite(s[FieldSample.U]) && Double.isFinite(FieldSample.accelerationNorm(s, 0)),
                "finite " + at);
            double eu = Math.abs(s[FieldSample.U] - ref[0]) / Math.abs(ref[0]);
            double gn = Math.sqrt(ref[1] * ref[1] + ref[2] * ref[2] + ref[3] * ref[3]);
            double dg = Math.sqrt(sq(s[FieldSample.AX] - ref[1]) + sq(s[FieldSample.AY] - ref[2])
                + sq(s[FieldSample.AZ] - ref[3]));
            double eg = dg / Math.max(gn, 1e-3);
            assertTrue(eu <= tol, "U " + at + ": " + s[FieldSample.U] + " vs " + ref[0] + " rel " + eu);
            assertTrue(eg <= tol, "g " + at + ": rel " + eg);
            worst = Math.max(worst, Math.max(eu, eg));
        }
        return worst;
    }

    @Test
    void boxCentreHasZeroAttraction() {
        // Symmetry of the prism (Nagy et al. 2000): g = 0 at the centre; the closed form and the polyhedron agree.
        double[] s = new double[FieldSample.SIZE];
        ev.evaluate(2.0, -1.25, 1.0, false, s, 0);
        double[] ref = PrismClosedForm.field(1.0, BOX, 2.0, -1.25, 1.0);
        assertEquals(ref[0], s[FieldSample.U], REL_TOL * ref[0]);
        assertEquals(0.0, FieldSample.accelerationNorm(s, 0), REL_TOL);
    }

    private static double sq(double x) {
        return x * x;
    }
}
