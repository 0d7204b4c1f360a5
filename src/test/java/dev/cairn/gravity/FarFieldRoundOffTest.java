package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.TriangleMesh;
import org.junit.jupiter.api.Test;

/**
 * Regression test for far-field round-off (found by this suite): the facet solid angle's triple product
 * r1·(r2×r3) cancelled ~D² digits and the edge log ln((a+b+e)/(a+b−e)) lost ~D digits at D body radii, so U was
 * wrong by 5e-5 at 1e4 radii and by 13× at 1e6 on an irregular body. The field must follow MacCullagh's formula
 * (U ≈ GM/r + G(A+B+C−3I_r)/(2r³), and its gradient) far away, up to the round-off floor of the Werner–Scheeres
 * edge sum (terms ~D cancelling to ~1/D: relative error ~1e-16·D²; shared references §1, far-field pitfalls).
 */
class FarFieldRoundOffTest {
    private static final double RHO = 1.0 / Constants.G;
    /** Distances in Brillouin radii and the relative error allowed there (measured floor ~1e-16·D² with margin). */
    private static final double[] DISTANCES = {1e3, 1e4, 1e5};
    private static final double[] U_REL_TOL = {1e-9, 1e-7, 1e-5};
    private static final double[] G_REL_TOL = {1e-8, 1e-6, 1e-4};

    private static final double[][] DIRECTIONS = {
        {0.48, 0.6, 0.64}, {-0.8, 0.36, 0.48}, {0.0, -0.6, -0.8}, {0.2672612419124244, -0.8017837257372732, 0.5345224838248488}};

    @Test
    void irregularBodyFollowsMacCullaghFarAway() {
        TriangleMesh m = TestShapes.lumpySphere(2, 0.2, 5).transformed(TestShapes.rotation(1, 2, 3, 0.4), 1.0,
            new double[] {0.3, -0.2, 0.1});
        MassProperties mp = MassPropertiesCalculator.compute(m, RHO);
        FieldEvaluator ev = new PolyhedronField(m, RHO).newEvaluator();
        double gm = mp.gm();
        double[] c = mp.centerOfMass();
        double[] in = mp.inertia().clone();
        for (int i = 0; i < 9; i++) {
            in[i] *= Constants.G; // G·I, so that the correction below is G(A+B+C−3I_r)/(2r³)
        }
        double tr = in[0] + in[4] + in[8];
        double[] s = new double[FieldSample.SIZE];
        for (int k = 0; k < DISTANCES.length; k++) {
            double r = DISTANCES[k] * mp.brillouinRadius();
            double worstU = 0;
            double worstG = 0;
            for (double[] d : DIRECTIONS) {
                double[] p = {r * d[0], r * d[1], r * d[2]};
                ev.evaluate(c[0] + p[0], c[1] + p[1], c[2] + p[2], false, s, 0);
                double[] ip = TestShapes.apply(in, p);
                double pip = p[0] * ip[0] + p[1] * ip[1] + p[2] * ip[2];
                double r2 = r * r;
                double r5 = r2 * r2 * r;
                double u = gm / r + (tr * r2 - 3 * pip) / (2 * r5);
                worstU = Math.max(worstU, Math.abs(s[FieldSample.U] - u) / u);
                double dg = 0;
                for (int i = 0; i < 3; i++) {
                    // ∇ of GM/r + (tr r² − 3 rᵀIr)/(2r⁵)
                    double g = -gm * p[i] / (r2 * r) + (2 * tr * p[i] - 6 * ip[i]) / (2 * r5)
                        - 5 * (tr * r2 - 3 * pip) * p[i] / (2 * r5 * r2);
                    dg += (s[FieldSample.AX + i] - g) * (s[FieldSample.AX + i] - g);
                }
                worstG = Math.max(worstG, Math.sqrt(dg) / (gm / r2));
            }
            TestShapes.achieved("far field at " + DISTANCES[k] + " R_B, U relative error vs MacCullagh", worstU);
            TestShapes.achieved("far field at " + DISTANCES[k] + " R_B, g relative error vs MacCullagh", worstG);
            assertTrue(worstU <= U_REL_TOL[k], "U at " + DISTANCES[k] + " R_B: " + worstU);
            assertTrue(worstG <= G_REL_TOL[k], "g at " + DISTANCES[k] + " R_B: " + worstG);
        }
    }
}
