package dev.cairn.bench;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The benchmark's baseline ({@link ReferenceKernel}, the Werner &amp; Scheeres 1997 sums written straight from the
 * paper) and the product kernel ({@link PolyhedronField}) must agree to 1e-12 relative in U, g and the gradient tensor
 * on random points inside and outside a lumpy body, so that the speed-up {@code cairn bench} reports compares two
 * evaluations of the same field (issue 9, item 3). The tolerance is the accuracy target for the product kernel
 * off the surface; both must also satisfy the published checks elsewhere in the suite (prism, sphere, ellipsoid).
 */
class ReferenceKernelAgreementTest {
    private static final double REL_TOL = 1e-12;

    @Test
    void baselineAndProductKernelAgreeOnRandomPoints() {
        TriangleMesh body = TestShapes.lumpySphere(3, 0.2, 17);
        double density = 2300.0;
        ReferenceKernel ref = new ReferenceKernel(body, density);
        PolyhedronField product = new PolyhedronField(body, density);
        Random rnd = new Random(5);
        int n = 600;
        double[] xyz = new double[3 * n];
        for (int i = 0; i < n; i++) {
            // directions uniform, radii 0.3 .. 3 body radii: inside, near the surface and outside
            double z = 2 * rnd.nextDouble() - 1;
            double phi = 2 * Math.PI * rnd.nextDouble();
            double r = 0.3 + 2.7 * rnd.nextDouble();
            double s = Math.sqrt(1 - z * z);
            xyz[3 * i] = r * s * Math.cos(phi);
            xyz[3 * i + 1] = r * s * Math.sin(phi) * 0.8;
            xyz[3 * i + 2] = r * z * 0.6;
        }
        double[] a = BatchEvaluation.evaluate(ref, xyz, true, 1, ProgressListener.NONE);
        double[] b = BatchEvaluation.evaluate(product, xyz, true, 2, ProgressListener.NONE);
        double worstU = 0;
        double worstG = 0;
        double worstT = 0;
        for (int i = 0; i < n; i++) {
            int o = i * FieldSample.SIZE;
            worstU = Math.max(worstU, Math.abs(a[o + FieldSample.U] - b[o + FieldSample.U]) / a[o + FieldSample.U]);
            worstG = Math.max(worstG, norm(a, b, o, FieldSample.AX, 3) / FieldSample.accelerationNorm(a, o));
            double t = 0;
            for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                t = Math.max(t, Math.abs(a[o + k]));
            }
            worstT = Math.max(worstT, norm(a, b, o, FieldSample.GXX, 6) / t);
        }
        TestShapes.achieved("product kernel vs baseline on random points, max relative difference in U", worstU);
        TestShapes.achieved("product kernel vs baseline on random points, max relative difference in g", worstG);
        TestShapes.achieved("product kernel vs baseline on random points, max relative difference in grad g", worstT);
        assertTrue(worstU <= REL_TOL, "U: " + worstU);
        assertTrue(worstG <= REL_TOL, "g: " + worstG);
        assertTrue(worstT <= REL_TOL, "gradient tensor: " + worstT);
    }

    private static double norm(double[] a, double[] b, int o, int first, int count) {
        double s = 0;
        for (int k = first; k < first + count; k++) {
            s = Math.max(s, Math.abs(a[o + k] - b[o + k]));
        }
        return s;
    }
}
