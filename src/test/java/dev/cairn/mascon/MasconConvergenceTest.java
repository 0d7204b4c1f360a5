package dev.cairn.mascon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import org.junit.jupiter.api.Test;

/**
 * Convergence of the lattice mascon field to the exact polyhedron field outside the body as the count grows:
 * the unit cube filled with k^3 cell-centre mascons against the exact field (shared references §7, values
 * re-computed there against the prism closed form of Nagy et al. 2000): |Δg|/|g| ≈ 0.3/k at a face centre
 * (1.9e-2 at k = 16), 1.9e-6 at 0.1 above a face centre for k = 16, and ≈ k^-4 at (1.5, 1.5, 1.5) (9.5e-8 at k = 16).
 */
class MasconConvergenceTest {
    private static final double RHO = 1 / Constants.G;
    /** Agreement with the tabulated reference values (2 significant digits given there). */
    private static final double REFERENCE_REL = 0.05;
    /** Allowed departure of a measured convergence order from its asymptotic value. */
    private static final double ORDER_TOL = 0.1;

    private final TriangleMesh cube = Shapes.unitCube();
    private final FieldEvaluator exact = new PolyhedronField(cube, RHO).newEvaluator();

    private double[] errors(int k) {
        MasconSet set = MasconGenerator.lattice(DensityModel.uniform(cube, RHO), 1.0 / k, 3, 2, ProgressListener.NONE);
        assertEquals(k * k * k, set.count(), "k^3 cells, all full");
        FieldEvaluator m = new MasconField(set).newEvaluator();
        return new double[] {err(m, 0.5, 0.5, 0), err(m, 0.5, 0.5, -0.1), err(m, 1.5, 1.5, 1.5)};
    }

    private double err(FieldEvaluator m, double x, double y, double z) {
        double[] a = new double[FieldSample.SIZE];
        double[] b = new double[FieldSample.SIZE];
        exact.evaluate(x, y, z, false, a, 0);
        m.evaluate(x, y, z, false, b, 0);
        double dx = a[1] - b[1];
        double dy = a[2] - b[2];
        double dz = a[3] - b[3];
        return Math.sqrt(dx * dx + dy * dy + dz * dz) / FieldSample.accelerationNorm(a, 0);
    }

    @Test
    void latticeConvergesAtTheMeasuredRates() {
        double[] e8 = errors(8);
        double[] e16 = errors(16);
        double[] e32 = errors(32);
        // Reference values at k = 16 (references §7).
        assertEquals(1.9e-2, e16[0], REFERENCE_REL * 1.9e-2, "face centre, k = 16");
        assertEquals(1.9e-6, e16[1], REFERENCE_REL * 1.9e-6, "0.1 above the face centre, k = 16");
        assertEquals(9.5e-8, e16[2], REFERENCE_REL * 9.5e-8, "(1.5,1.5,1.5), k = 16");
        // Measured orders: first order on the surface, fourth order far away.
        for (double[][] pair : new double[][][] {{e8, e16}, {e16, e32}}) {
            double pFace = Math.log(pair[0][0] / pair[1][0]) / Math.log(2);
            double pFar = Math.log(pair[0][2] / pair[1][2]) / Math.log(2);
            assertEquals(1.0, pFace, ORDER_TOL, "order at the face centre");
            assertEquals(4.0, pFar, ORDER_TOL, "order at (1.5,1.5,1.5)");
        }
        // Above the surface the error falls faster than any fixed power once the spacing is below the height.
        assertTrue(e32[1] < e16[1] / 16, "0.1 above the face: at least 4th order from k = 16 to 32");
    }
}
