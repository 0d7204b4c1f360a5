package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import org.junit.jupiter.api.Test;

/**
 * Far away, the potential of any body is U ≈ GM/r + G(A+B+C−3I_r)/(2r³) with r from the centre of mass and
 * I_r = r̂ᵀ I r̂ its moment about the line to the point (MacCullagh's formula, from memory [M]: e.g. Murray, C.D. &amp;
 * Dermott, S.F. (1999) Solar System Dynamics, ch. 4; it is the degree-2 term of the multipole expansion of
 * Heiskanen &amp; Moritz (1967) Physical Geodesy, ch. 2). The residual
 * is the degree-3 term, O(r⁻⁴), or the degree-4 term, O(r⁻⁵), for a centrally symmetric body. This checks the
 * polyhedron field and the mass properties (mass, centre of mass, inertia tensor) together.
 *
 * <p>Distances stay below ~100 body sizes: beyond, double-precision round-off of the field itself (~1e-11
 * relative at 100 sizes, shared references §1) would hide the r⁻⁵ residual.
 */
class MacCullaghFarFieldTest {
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1, so G·I is the unit-density inertia
    /** Range of the measured decay order of the residual, r⁻⁴ (asymmetric body) or r⁻⁵ (centrally symmetric). */
    private static final double ORDER_TOL = 0.15;
    /** At the farthest distance the residual must be below this fraction of the inertia (degree-2) correction. */
    private static final double RESIDUAL_VS_CORRECTION = 0.05;

    private static final double[][] DIRECTIONS = {
        {0.48, 0.6, 0.64}, {-0.8, 0.36, 0.48}, {0.0, -0.6, 0.8}, {0.2672612419124244, -0.8017837257372732, -0.5345224838248488}};

    @Test
    void rotatedTranslatedLShapeResidualFallsAsInverseFourthPower() {
        TriangleMesh l = TestShapes.lShape().transformed(TestShapes.rotation(1, 2, -0.5, 0.9), 1.0,
            new double[] {12.0, -7.0, 3.5});
        check("L-shape (rotated, translated)", l, 4.0, new double[] {4, 8, 16, 32});
    }

    @Test
    void rotatedTranslatedEllipsoidResidualFallsAsInverseFifthPower() {
        TriangleMesh e = Shapes.ellipsoid(3, 3, 2, 1).transformed(TestShapes.rotation(-0.3, 0.2, 1, 0.6), 1.0,
            new double[] {-5.0, 2.0, 8.0});
        check("ellipsoid 3:2:1 polyhedron (rotated, translated)", e, 5.0, new double[] {3, 6, 12, 24});
    }

    /**
     * From 1e4 (centrally symmetric body, residual O(r⁻⁴) below 1e-16 there) or 1e5 (asymmetric, O(r⁻³)) to 1e9
     * Brillouin radii, U and g of the exact field (its exterior expansion there) and of the hierarchical field equal
     * MacCullagh's U and its gradient to 1e-13 relative, and U stays positive. The gradient of the inertia term,
     * U₂ = G(T − 3 r̂ᵀIr̂)/(2r³), is g₂ = G[(15 q/(2r⁷) − 3T/(2r⁵)) x − 3 I x/r⁵], q = xᵀIx (differentiated here).
     */
    @Test
    void extremeDistancesMatchMacCullaghToRounding() {
        TriangleMesh e = Shapes.ellipsoid(3, 3, 2, 1).transformed(TestShapes.rotation(-0.3, 0.2, 1, 0.6), 1.0,
            new double[] {-5.0, 2.0, 8.0});
        TriangleMesh l = TestShapes.lShape().transformed(TestShapes.rotation(1, 2, -0.5, 0.9), 1.0,
            new double[] {12.0, -7.0, 3.5});
        extreme(e, 1e4);
        extreme(l, 1e5);
    }

    private static void extreme(TriangleMesh mesh, double from) {
        MassProperties mp = MassPropertiesCalculator.compute(mesh, RHO);
        PolyhedronField exact = new PolyhedronField(mesh, RHO);
        FieldEvaluator[] evs = {exact.newEvaluator(), new HierarchicalField(mesh, exact, 1e-10, 1).newEvaluator()};
        double gm = mp.gm();
        double[] c = mp.centerOfMass();
        double[] in = mp.inertia();
        double trace = in[0] + in[4] + in[8];
        double[] s = new double[FieldSample.SIZE];
        double worst = 0;
        for (double k = from; k <= 1e9; k *= 10) {
            double r = k * mp.brillouinRadius();
            for (double[] d : DIRECTIONS) {
                double[] x = {r * d[0], r * d[1], r * d[2]};
                double[] ix = new double[3];
                double q = 0;
                for (int i = 0; i < 3; i++) {
                    for (int j = 0; j < 3; j++) {
                        ix[i] += in[3 * i + j] * x[j];
                    }
                    q += x[i] * ix[i];
                }
                double r2 = r * r;
                double r5 = r2 * r2 * r;
                double u = gm / r + Constants.G * (trace - 3 * q / r2) / (2 * r * r2);
                double[] g = new double[3];
                for (int i = 0; i < 3; i++) {
                    g[i] = -gm * x[i] / (r2 * r) + Constants.G * ((15 * q / (2 * r5 * r2) - 3 * trace / (2 * r5)) * x[i]
                        - 3 * ix[i] / r5);
                }
                double gn = Math.sqrt(g[0] * g[0] + g[1] * g[1] + g[2] * g[2]);
                for (FieldEvaluator ev : evs) {
                    ev.evaluate(c[0] + x[0], c[1] + x[1], c[2] + x[2], false, s, 0);
                    double du = Math.abs(s[FieldSample.U] - u) / u;
                    double dg = Math.sqrt(Math.pow(s[FieldSample.AX] - g[0], 2) + Math.pow(s[FieldSample.AY] - g[1], 2)
                        + Math.pow(s[FieldSample.AZ] - g[2], 2)) / gn;
                    worst = Math.max(worst, Math.max(du, dg));
                    assertTrue(s[FieldSample.U] > 0, "U > 0 at " + k + " R_B");
                    assertTrue(du <= 1e-13 && dg <= 1e-13, "at " + k + " R_B: U " + du + ", g " + dg);
                }
            }
        }
        TestShapes.achieved("MacCullagh from " + from + " to 1e9 R_B (exact and hierarchical), max rel. error", worst);
    }

    private static void check(String what, TriangleMesh mesh, double expectedOrder, double[] distances) {
        MassProperties mp = MassPropertiesCalculator.compute(mesh, RHO);
        FieldEvaluator ev = new PolyhedronField(mesh, RHO).newEvaluator();
        double gm = mp.gm();
        double[] c = mp.centerOfMass();
        double[] in = mp.inertia();
        double trace = in[0] + in[4] + in[8];
        double size = mp.brillouinRadius();
        double[] err = new double[distances.length];
        double[] corr = new double[distances.length];
        double[] s = new double[FieldSample.SIZE];
        for (int k = 0; k < distances.length; k++) {
            double r = distances[k] * size;
            for (double[] d : DIRECTIONS) {
                ev.evaluate(c[0] + r * d[0], c[1] + r * d[1], c[2] + r * d[2], false, s, 0);
                double ir = 0;
                for (int i = 0; i < 3; i++) {
                    for (int j = 0; j < 3; j++) {
                        ir += d[i] * in[3 * i + j] * d[j];
                    }
                }
                double correction = Constants.G * (trace - 3 * ir) / (2 * r * r * r);
                double mac = gm / r + correction;
                err[k] = Math.max(err[k], Math.abs(s[FieldSample.U] - mac) / (gm / r));
                corr[k] = Math.max(corr[k], Math.abs(correction) / (gm / r));
            }
        }
        for (int k = 0; k + 1 < distances.length; k++) {
            // err is relative to GM/r, so it falls as r^-(order-1)
            double order = 1 + Math.log(err[k] / err[k + 1]) / Math.log(distances[k + 1] / distances[k]);
            TestShapes.achieved("MacCullagh " + what + " at " + distances[k] + " R_B: rel. residual "
                + String.format(java.util.Locale.ROOT, "%.3g", err[k]) + ", decay order", order);
            assertTrue(Math.abs(order - expectedOrder) <= ORDER_TOL,
                what + ": residual decay order " + order + " between " + distances[k] + " and " + distances[k + 1]);
        }
        int last = distances.length - 1;
        TestShapes.achieved("MacCullagh " + what + " at " + distances[last] + " R_B: rel. residual", err[last]);
        assertTrue(err[last] <= RESIDUAL_VS_CORRECTION * corr[last],
            what + ": residual " + err[last] + " vs inertia correction " + corr[last]);
    }
}
