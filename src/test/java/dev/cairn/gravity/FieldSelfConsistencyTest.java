package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * Internal consistency of the polyhedron field (Werner &amp; Scheeres 1997, Celest. Mech. Dyn. Astron. 65:313–344):
 * g equals the central-difference gradient of U; the gradient tensor equals the central-difference Jacobian of g,
 * which is symmetric (g is curl-free); its trace is the Laplacian from the solid-angle sum; the field is invariant
 * under a rigid motion of body and point, scales as λ²U, λg and an unchanged tensor when lengths scale by λ, and
 * does not change when planar faces are re-triangulated (shared references §1, invariances [V]).
 */
class FieldSelfConsistencyTest {
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1
    /** Central-difference step, m, on bodies of size ~1 m (truncation ~h², round-off ~1e-16/h). */
    private static final double H = 1e-5;
    /** Central differences against analytic derivatives, relative to the magnitude of the derivative. */
    private static final double DIFF_REL_TOL = 1e-8;
    /** Trace of the tensor against the Laplacian (both ~4π), absolute. */
    private static final double TRACE_TOL = 1e-12;
    /** Invariances: differences of exact arithmetic in another frame, relative (shared references §1: ≤ 1e-14). */
    private static final double INVARIANCE_REL_TOL = 1e-13;

    /** Non-convex L-shape rotated and translated away from the origin, and an irregular lumpy body. */
    private static final double[] ROT = TestShapes.rotation(0.3, -0.5, 0.8, 0.7);
    private static final double[] SHIFT = {3.5, -1.25, 0.75};
    private static final TriangleMesh L_MOVED = TestShapes.lShape().transformed(ROT, 1.0, SHIFT);
    private static final TriangleMesh LUMPY = TestShapes.lumpySphere(2, 0.2, 3);

    private static double[] eval(FieldEvaluator ev, double[] p) {
        double[] s = new double[FieldSample.SIZE];
        ev.evaluate(p[0], p[1], p[2], true, s, 0);
        return s;
    }

    /** Seeded points in a cube around the body, skipping points within {@code 0.05} m of the surface. */
    private static double[][] points(TriangleMesh m, int n, long seed) {
        double[] bb = m.boundingBox();
        Random rnd = new Random(seed);
        double[][] pts = new double[n][];
        FieldEvaluator ev = new PolyhedronField(m, RHO).newEvaluator();
        int k = 0;
        while (k < n) {
            double[] p = new double[3];
            for (int i = 0; i < 3; i++) {
                double w = bb[3 + i] - bb[i];
                p[i] = bb[i] - 0.5 * w + 2 * w * rnd.nextDouble();
            }
            // Keep away from the surface: the same side in a 0.05 m cube around the point (class checked at 7 points).
            double[] s0 = eval(ev, p);
            boolean ok = true;
            for (int i = 0; i < 3 && ok; i++) {
                for (double d : new double[] {-0.05, 0.05}) {
                    double[] q = p.clone();
                    q[i] += d;
                    ok &= eval(ev, q)[FieldSample.LOCATION] == s0[FieldSample.LOCATION];
                }
            }
            if (ok) {
                pts[k++] = p;
            }
        }
        return pts;
    }

    @Test
    void accelerationIsTheGradientOfThePotentialAndTensorTheGradientOfAcceleration() {
        double worstG = 0;
        double worstT = 0;
        double worstSym = 0;
        double worstTrace = 0;
        for (TriangleMesh m : new TriangleMesh[] {L_MOVED, LUMPY}) {
            FieldEvaluator ev = new PolyhedronField(m, RHO).newEvaluator();
            for (double[] p : points(m, 16, 5)) {
                double[] s = eval(ev, p);
                double gn = FieldSample.accelerationNorm(s, 0);
                double[][] jac = new double[3][3]; // jac[i][j] = ∂g_j/∂x_i
                double[] tensor = {s[FieldSample.GXX], s[FieldSample.GXY], s[FieldSample.GXZ],
                    s[FieldSample.GXY], s[FieldSample.GYY], s[FieldSample.GYZ],
                    s[FieldSample.GXZ], s[FieldSample.GYZ], s[FieldSample.GZZ]};
                double tn = 0;
                for (double t : tensor) {
                    tn = Math.max(tn, Math.abs(t));
                }
                for (int i = 0; i < 3; i++) {
                    double[] pp = p.clone();
                    double[] pm = p.clone();
                    pp[i] += H;
                    pm[i] -= H;
                    double[] sp = eval(ev, pp);
                    double[] sm = eval(ev, pm);
                    double du = (sp[FieldSample.U] - sm[FieldSample.U]) / (2 * H);
                    double eg = Math.abs(du - s[FieldSample.AX + i]) / gn;
                    assertTrue(eg <= DIFF_REL_TOL, "dU/dx" + i + " at " + str(p) + ": " + eg);
                    worstG = Math.max(worstG, eg);
                    for (int j = 0; j < 3; j++) {
                        jac[i][j] = (sp[FieldSample.AX + j] - sm[FieldSample.AX + j]) / (2 * H);
                        double et = Math.abs(jac[i][j] - tensor[3 * i + j]) / tn;
                        assertTrue(et <= DIFF_REL_TOL, "dg" + j + "/dx" + i + " at " + str(p) + ": " + et);
                        worstT = Math.max(worstT, et);
                    }
                }
                for (int i = 0; i < 3; i++) {
                    for (int j = i + 1; j < 3; j++) {
                        double es = Math.abs(jac[i][j] - jac[j][i]) / tn;
                        assertTrue(es <= 2 * DIFF_REL_TOL, "curl-free at " + str(p));
                        worstSym = Math.max(worstSym, es);
                    }
                }
                double trace = s[FieldSample.GXX] + s[FieldSample.GYY] + s[FieldSample.GZZ];
                double et = Math.abs(trace - s[FieldSample.LAPLACIAN]);
                assertTrue(et <= TRACE_TOL, "trace vs Laplacian at " + str(p) + ": " + et);
                worstTrace = Math.max(worstTrace, et);
            }
        }
        TestShapes.achieved("g vs central difference of U, max relative error (h=1e-5)", worstG);
        TestShapes.achieved("tensor vs central difference of g, max relative error (h=1e-5)", worstT);
        TestShapes.achieved("asymmetry of the difference Jacobian of g, max relative", worstSym);
        TestShapes.achieved("|trace(tensor) - Laplacian| (Gρ=1), max", worstTrace);
    }

    @Test
    void rigidMotionOfBodyAndPoint() {
        TriangleMesh body = TestShapes.lShape();
        double[] rot = TestShapes.rotation(-0.2, 0.9, 0.4, 2.1);
        double[] shift = {-20.0, 7.5, 13.25};
        TriangleMesh moved = body.transformed(rot, 1.0, shift);
        FieldEvaluator a = new PolyhedronField(body, RHO).newEvaluator();
        FieldEvaluator b = new PolyhedronField(moved, RHO).newEvaluator();
        double worst = 0;
        for (double[] p : points(body, 12, 9)) {
            double[] q = TestShapes.apply(rot, p);
            for (int k = 0; k < 3; k++) {
                q[k] += shift[k];
            }
            double[] s = eval(a, p);
            double[] t = eval(b, q);
            double[] g = TestShapes.apply(rot, new double[] {s[FieldSample.AX], s[FieldSample.AY], s[FieldSample.AZ]});
            worst = Math.max(worst, rel(s[FieldSample.U], t[FieldSample.U], s[FieldSample.U]));
            double gn = FieldSample.accelerationNorm(s, 0);
            for (int k = 0; k < 3; k++) {
                worst = Math.max(worst, rel(g[k], t[FieldSample.AX + k], gn));
            }
            // T' = R T Rᵀ
            double[] ts = full(s);
            double[] tt = full(t);
            double tn = 4 * Math.PI;
            for (int i = 0; i < 3; i++) {
                for (int j = 0; j < 3; j++) {
                    double v = 0;
                    for (int k = 0; k < 3; k++) {
                        for (int l = 0; l < 3; l++) {
                            v += rot[3 * i + k] * ts[3 * k + l] * rot[3 * j + l];
                        }
                    }
                    worst = Math.max(worst, rel(v, tt[3 * i + j], tn));
                }
            }
            assertTrue(s[FieldSample.LOCATION] == t[FieldSample.LOCATION], "location at " + str(p));
        }
        assertTrue(worst <= INVARIANCE_REL_TOL, "rigid motion invariance, worst relative difference " + worst);
        TestShapes.achieved("rigid-motion invariance, max relative difference", worst);
    }

    @Test
    void scalingLengthsByLambda() {
        double lambda = 37.5;
        TriangleMesh body = LUMPY;
        FieldEvaluator a = new PolyhedronField(body, RHO).newEvaluator();
        FieldEvaluator b = new PolyhedronField(body.scaled(lambda), RHO).newEvaluator();
        double worst = 0;
        for (double[] p : points(body, 12, 13)) {
            double[] s = eval(a, p);
            double[] t = eval(b, new double[] {lambda * p[0], lambda * p[1], lambda * p[2]});
            worst = Math.max(worst, rel(lambda * lambda * s[FieldSample.U], t[FieldSample.U], t[FieldSample.U]));
            double gn = lambda * FieldSample.accelerationNorm(s, 0);
            for (int k = 0; k < 3; k++) {
                worst = Math.max(worst, rel(lambda * s[FieldSample.AX + k], t[FieldSample.AX + k], gn));
            }
            for (int k = FieldSample.LAPLACIAN; k <= FieldSample.GZZ; k++) {
                worst = Math.max(worst, rel(s[k], t[k], 4 * Math.PI));
            }
        }
        assertTrue(worst <= INVARIANCE_REL_TOL, "scaling λ²U, λg, same tensor: worst " + worst);
        TestShapes.achieved("scaling invariance (λ²U, λg, tensor), max relative difference", worst);
    }

    @Test
    void retriangulatingPlanarFacesChangesNothing() {
        // Coplanar edges have E_e = 0 (shared references §1 [V]); splitting each facet at its centroid adds only those.
        TriangleMesh box = Shapes.box(0.5, -1, 2, 2.5, 0.25, 3);
        FieldEvaluator a = new PolyhedronField(box, RHO).newEvaluator();
        FieldEvaluator b = new PolyhedronField(TestShapes.centroidSplit(box), RHO).newEvaluator();
        double worst = 0;
        for (double[] p : points(box, 12, 17)) {
            double[] s = eval(a, p);
            double[] t = eval(b, p);
            worst = Math.max(worst, rel(s[FieldSample.U], t[FieldSample.U], s[FieldSample.U]));
            double gn = FieldSample.accelerationNorm(s, 0);
            for (int k = 0; k < 3; k++) {
                worst = Math.max(worst, rel(s[FieldSample.AX + k], t[FieldSample.AX + k], gn));
            }
            for (int k = FieldSample.LAPLACIAN; k <= FieldSample.GZZ; k++) {
                worst = Math.max(worst, rel(s[k], t[k], 4 * Math.PI));
            }
        }
        assertTrue(worst <= INVARIANCE_REL_TOL, "re-triangulation invariance: worst " + worst);
        TestShapes.achieved("re-triangulation of planar faces, max relative difference", worst);
    }

    private static double[] full(double[] s) {
        return new double[] {s[FieldSample.GXX], s[FieldSample.GXY], s[FieldSample.GXZ],
            s[FieldSample.GXY], s[FieldSample.GYY], s[FieldSample.GYZ],
            s[FieldSample.GXZ], s[FieldSample.GYZ], s[FieldSample.GZZ]};
    }

    private static double rel(double a, double b, double scale) {
        return Math.abs(a - b) / Math.abs(scale);
    }

    private static String str(double[] p) {
        return "(" + p[0] + ", " + p[1] + ", " + p[2] + ")";
    }
}
