package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;

/** The spherical-harmonic field against the exact polyhedron field, Laplace's equation and finite differences. */
class HarmonicFieldTest {
    private static final double RHO = 2000;
    /** Box 2×1×1 about its centre: R_B = √1.5 (shared references §5 uses this body). */
    private static final TriangleMesh BOX = Shapes.box(-1, -0.5, -0.5, 1, 0.5, 0.5);
    private static final double RB = Math.sqrt(1.5);

    private static HarmonicField field(TriangleMesh mesh, double[] origin, int degree) {
        return new HarmonicField(HarmonicCoefficients.ofPolyhedra(List.of(mesh), new double[] {RHO}, origin,
            HarmonicCoefficients.maxDistance(mesh, origin), degree, 2));
    }

    /** Largest relative acceleration error of {@code f} against the exact sum at {@code pts}. */
    private static double maxError(FieldModel f, FieldModel exact, double[] pts) {
        double[] a = BatchEvaluation.evaluate(f, pts, false, 1, ProgressListener.NONE);
        double[] b = BatchEvaluation.evaluate(exact, pts, false, 1, ProgressListener.NONE);
        double worst = 0;
        for (int i = 0; i < pts.length / 3; i++) {
            int o = i * FieldSample.SIZE;
            double dx = a[o + FieldSample.AX] - b[o + FieldSample.AX];
            double dy = a[o + FieldSample.AY] - b[o + FieldSample.AY];
            double dz = a[o + FieldSample.AZ] - b[o + FieldSample.AZ];
            worst = Math.max(worst, Math.sqrt(dx * dx + dy * dy + dz * dz) / FieldSample.accelerationNorm(b, o));
        }
        return worst;
    }

    private static double[] sphere(double r, int n) {
        double[] d = new double[3 * n];
        double golden = Math.PI * (3 - Math.sqrt(5));
        for (int i = 0; i < n; i++) {
            double z = 1 - (2 * i + 1.0) / n;
            double s = Math.sqrt(1 - z * z);
            d[3 * i] = r * s * Math.cos(golden * i);
            d[3 * i + 1] = r * s * Math.sin(golden * i);
            d[3 * i + 2] = r * z;
        }
        return d;
    }

    /**
     * Outside the Brillouin sphere the series converges geometrically to the exact field; inside it (but outside the
     * body) it diverges (shared references §5: box 2×1×1, r/R_B = 1.29: 3.9e-3 at N = 2 falling to 1.5e-15 at
     * N = 80; r/R_B = 0.49: 1.5 at N = 8, growing without bound).
     */
    @Test
    void convergesOutsideAndDivergesInsideTheBrillouinSphere() {
        PolyhedronField exact = new PolyhedronField(BOX, RHO);
        double[] out = sphere(1.29 * RB, 60);
        double[] in = {0, 0.49 * RB, 0}; // above the face y = 0.5: outside the body, inside the sphere
        int[] degrees = {2, 6, 10, 14, 18, 22, 26, 30, 34, 38, 42};
        double[] eOut = new double[degrees.length];
        double[] eIn = new double[degrees.length];
        StringBuilder table = new StringBuilder();
        for (int k = 0; k < degrees.length; k++) {
            HarmonicField h = field(BOX, new double[3], degrees[k]);
            eOut[k] = maxError(h, exact, out);
            eIn[k] = maxError(h, exact, in);
            assertEquals(1, h.insideCount(), "one of the points lies inside the sphere");
            table.append(String.format(Locale.ROOT, " N=%d out %.2e in %.2e;", degrees[k], eOut[k], eIn[k]));
        }
        TestShapes.achieved("harmonic field box 2x1x1 convergence table (relative |dg|)" + table, eOut[0]);
        for (int k = 1; k < degrees.length; k++) {
            // Geometric convergence outside: every 4 degrees at least a factor 2 smaller (the rate (R_B/r)^4 = 0.36),
            // until rounding (1e-13) is reached.
            assertTrue(eOut[k] < 0.5 * eOut[k - 1] || eOut[k] < 1e-13, "outside, N=" + degrees[k] + ": " + table);
        }
        assertTrue(eOut[degrees.length - 1] < 1e-7 && eOut[degrees.length - 1] < 1e-5 * eOut[0], table.toString());
        // Divergence inside: the error grows with degree (not monotonically step by step: compare 8 degrees apart)
        // and without bound, above 1e9 (relative) at N = 42.
        for (int k = 2; k < degrees.length; k++) {
            assertTrue(eIn[k] > eIn[k - 2], "inside, N=" + degrees[k] + ": " + table);
        }
        assertTrue(eIn[degrees.length - 1] > 1e9, table.toString());
    }

    /**
     * Far from a lumpy body, the harmonic field to degree 20 equals the exact field (the series remainder there is
     * below rounding: Greengard &amp; Rokhlin 1987 bound (a/r)^{N+1} with a/r = 1/3), potential and acceleration; the
     * gradient tensor matches central differences of g and is traceless (Laplace's equation outside the mass).
     */
    @Test
    void potentialAccelerationAndTensorOutside() {
        TriangleMesh body = TestShapes.lumpySphere(3, 0.2, 11);
        double[] com = dev.cairn.mass.MassPropertiesCalculator.compute(body, RHO).centerOfMass();
        HarmonicField h = field(body, com, 20);
        PolyhedronField exact = new PolyhedronField(body, RHO);
        double rb = h.convergenceRadius();
        double[] pts = sphere(3 * rb, 40);
        double[] a = BatchEvaluation.evaluate(h, pts, true, 1, ProgressListener.NONE);
        double[] b = BatchEvaluation.evaluate(exact, pts, true, 1, ProgressListener.NONE);
        double worstU = 0;
        double worstG = 0;
        double worstT = 0;
        double worstTrace = 0;
        FieldEvaluator ev = h.newEvaluator();
        double[] sp = new double[FieldSample.SIZE];
        double[] sm = new double[FieldSample.SIZE];
        for (int i = 0; i < pts.length / 3; i++) {
            int o = i * FieldSample.SIZE;
            worstU = Math.max(worstU, Math.abs(a[o] / b[o] - 1));
            double dx = a[o + FieldSample.AX] - b[o + FieldSample.AX];
            double dy = a[o + FieldSample.AY] - b[o + FieldSample.AY];
            double dz = a[o + FieldSample.AZ] - b[o + FieldSample.AZ];
            double gn = FieldSample.accelerationNorm(b, o);
            worstG = Math.max(worstG, Math.sqrt(dx * dx + dy * dy + dz * dz) / gn);
            double tn = Math.abs(a[o + FieldSample.GXX]) + Math.abs(a[o + FieldSample.GYY])
                + Math.abs(a[o + FieldSample.GZZ]);
            worstTrace = Math.max(worstTrace, Math.abs(a[o + FieldSample.GXX] + a[o + FieldSample.GYY]
                + a[o + FieldSample.GZZ]) / tn);
            assertEquals(0.0, a[o + FieldSample.LOCATION], "outside");
            // central differences of g along each axis, step 1e-4 of the distance (error ~ step², common practice)
            double step = 1e-4 * 3 * rb;
            int[][] slots = {{FieldSample.GXX, FieldSample.GXY, FieldSample.GXZ},
                {FieldSample.GXY, FieldSample.GYY, FieldSample.GYZ}, {FieldSample.GXZ, FieldSample.GYZ, FieldSample.GZZ}};
            for (int axis = 0; axis < 3; axis++) {
                double[] p = {pts[3 * i], pts[3 * i + 1], pts[3 * i + 2]};
                double[] q = p.clone();
                p[axis] += step;
                q[axis] -= step;
                ev.evaluate(p[0], p[1], p[2], false, sp, 0);
                ev.evaluate(q[0], q[1], q[2], false, sm, 0);
                for (int c = 0; c < 3; c++) {
                    double fd = (sp[FieldSample.AX + c] - sm[FieldSample.AX + c]) / (2 * step);
                    worstT = Math.max(worstT, Math.abs(fd - a[o + slots[axis][c]]) / tn);
                }
            }
        }
        assertTrue(worstU < 1e-12, "U " + worstU);
        assertTrue(worstG < 1e-11, "g " + worstG);
        assertTrue(worstT < 1e-6, "tensor vs central differences " + worstT);
        assertTrue(worstTrace < 1e-13, "trace " + worstTrace);
        TestShapes.achieved("harmonic field N=20 at 3 R_B vs exact polyhedron, relative U", worstU);
        TestShapes.achieved("harmonic field N=20 at 3 R_B vs exact polyhedron, relative |dg|", worstG);
        TestShapes.achieved("harmonic field tensor vs central differences of g, relative to |diag|", worstT);
        TestShapes.achieved("harmonic field tensor trace relative to |diag| (Laplace)", worstTrace);
    }

    /** Bit-identical results for 1 and 2 threads (DEVELOPERS.md contract for field models). */
    @Test
    void threadCountIndependent() {
        HarmonicField h = field(BOX, new double[] {0.1, 0, 0}, 16);
        double[] pts = sphere(2.1, 300);
        double[] a = BatchEvaluation.evaluate(h, pts, true, 1, ProgressListener.NONE);
        double[] b = BatchEvaluation.evaluate(h, pts, true, 2, ProgressListener.NONE);
        for (int i = 0; i < a.length; i++) {
            assertEquals(Double.doubleToLongBits(a[i]), Double.doubleToLongBits(b[i]), "slot " + i);
        }
    }
}
