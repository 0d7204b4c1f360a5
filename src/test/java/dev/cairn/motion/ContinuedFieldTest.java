package dev.cairn.motion;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.HierarchicalField;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.rotation.SpinState;
import dev.cairn.util.ProgressListener;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The exterior field continued across a facet ({@link Propagator#continuedField}) and the propagation path that uses
 * it at inside trial points, against the exterior field itself and against the strict path.
 */
class ContinuedFieldTest {
    private static Propagator propagator(FieldModel f, TriangleMesh m, SpinState spin) {
        double[] c = MassPropertiesCalculator.compute(m, 1.0).centerOfMass();
        return new Propagator(f, m, new RotatingFrame(spin, c), MotionSettings.defaults(Frame.BODY));
    }

    /**
     * The exterior field is harmonic (analytic) across the interior of a facet, so its continuation to a point at
     * depth h below the facet equals the polynomial extrapolation of exterior values at heights h, 2h, ..., 6h
     * above it, to the extrapolation's truncation error (Lagrange interpolation remainder, any numerical analysis
     * text; it falls as (h/ρ)⁶ with ρ the distance to the facet's edges). The strict interior field differs from it
     * by 4πGρ·h (Gauss's law for the layer between the two sides), orders of magnitude more: the check can fail.
     */
    @Test
    void continuedFieldMatchesExtrapolatedExteriorField() {
        TriangleMesh box = Shapes.box(-1, -1, -1, 1, 1, 1);
        PolyhedronField exact = new PolyhedronField(box, 2000);
        check("box, exact sum", box, exact, 2e-3);
        TriangleMesh ball = Shapes.icosphere(4, 1000.0);
        check("icosphere 5120, exact sum", ball, new PolyhedronField(ball, 2000), 0.02);
        check("icosphere 5120, hierarchical 1e-12", ball, new HierarchicalField(ball, 2000, 1e-12, 1), 0.02);
    }

    private static void check(String label, TriangleMesh m, FieldModel f, double h) {
        Propagator p = propagator(f, m, SpinState.NONE);
        FieldEvaluator ev = f.newEvaluator();
        double[] xyz = m.xyz();
        int[] tri = m.tri();
        double[] fn = m.facetNormals();
        double worstG = 0;
        double worstU = 0;
        double strictG = Double.POSITIVE_INFINITY;
        for (int face : new int[] {0, m.facetCount() / 3, m.facetCount() - 1}) {
            double[] c = new double[3];
            for (int k = 0; k < 3; k++) {
                c[k] = (xyz[3 * tri[3 * face] + k] + xyz[3 * tri[3 * face + 1] + k] + xyz[3 * tri[3 * face + 2] + k]) / 3;
            }
            double[] n = {fn[3 * face], fn[3 * face + 1], fn[3 * face + 2]};
            // Exterior values at heights s·h, s = 1..6; Lagrange weights for s = −1.
            int q = 6;
            double[] ext = new double[4];
            double[] s = new double[FieldSample.SIZE];
            for (int j = 1; j <= q; j++) {
                double w = 1;
                for (int m2 = 1; m2 <= q; m2++) {
                    if (m2 != j) {
                        w *= (-1.0 - m2) / (j - m2);
                    }
                }
                ev.evaluate(c[0] + j * h * n[0], c[1] + j * h * n[1], c[2] + j * h * n[2], false, s, 0);
                assertEquals(0.0, s[FieldSample.LOCATION], "outside");
                for (int k = 0; k < 4; k++) {
                    ext[k] += w * s[k];
                }
            }
            double ix = c[0] - h * n[0];
            double iy = c[1] - h * n[1];
            double iz = c[2] - h * n[2];
            double[] cont = new double[FieldSample.SIZE];
            assertTrue(p.continuedField(ev, ix, iy, iz, face, cont, 0), "continuation applied inside");
            double gn = Math.sqrt(ext[1] * ext[1] + ext[2] * ext[2] + ext[3] * ext[3]);
            double dg = Math.sqrt(sq(cont[1] - ext[1]) + sq(cont[2] - ext[2]) + sq(cont[3] - ext[3])) / gn;
            worstG = Math.max(worstG, dg);
            worstU = Math.max(worstU, Math.abs(cont[0] - ext[0]) / ext[0]);
            ev.evaluate(ix, iy, iz, false, s, 0);
            assertEquals(1.0, s[FieldSample.LOCATION], "inside");
            strictG = Math.min(strictG, Math.sqrt(sq(s[1] - ext[1]) + sq(s[2] - ext[2]) + sq(s[3] - ext[3])) / gn);
            // An outside point is left alone.
            double[] out = new double[FieldSample.SIZE];
            assertTrue(!p.continuedField(ev, c[0] + h * n[0], c[1] + h * n[1], c[2] + h * n[2], face, out, 0));
        }
        TestShapes.achieved("continued field vs extrapolated exterior, |g| relative, " + label, worstG);
        TestShapes.achieved("continued field vs extrapolated exterior, U relative, " + label, worstU);
        TestShapes.achieved("strict interior field vs extrapolated exterior, |g| relative, " + label, strictG);
        assertTrue(worstG < 1e-9, label + ": continued g off by " + worstG);
        assertTrue(worstU < 1e-9, label + ": continued U off by " + worstU);
        assertTrue(strictG > 1000 * worstG, label + ": the interior field should differ: " + strictG);
    }

    private static double sq(double v) {
        return v * v;
    }

    /**
     * Impacts on the default path (continued field at inside trial points, reused evaluations) against the strict
     * path: same facet, impact time and position within a few integrator tolerances (1e-12 relative local error;
     * both paths integrate the same exterior solution up to the crossing), and fewer field evaluations.
     * Consistency of two code paths (common practice, no source).
     */
    @Test
    void impactsMatchTheStrictPath() {
        TriangleMesh m = TestShapes.lumpySphere(3, 0.08, 5);
        double density = 2000;
        Propagator p = propagator(new PolyhedronField(m, density), m, new SpinState(24 * 3600.0,
            new double[] {0.2, 0, 1}));
        Propagator strict = p.withStrict(true);
        // GM ≈ 5.6e-7 m³/s² on a body of radius ≈ 1 m: escape speed ≈ 1e-3 m/s, speeds here well below it.
        double[][] starts = {{0, 0, 1.6, 1e-4, 0, -2e-4}, {1.5, 0.3, 0.2, -1e-4, 2e-4, 0}, {0.7, -0.9, 0.8, 0, 0, 0},
            {-1.2, 0.1, -0.9, 2e-4, 1e-4, 1e-4}};
        double worstT = 0;
        double worstX = 0;
        long evalsDefault = 0;
        long evalsStrict = 0;
        for (double[] s0 : starts) {
            Trajectory a = p.propagate(s0, 1e6, 1e6, p.newEvaluator(), Double.NaN);
            Trajectory b = strict.propagate(s0, 1e6, 1e6);
            assertEquals(Trajectory.Outcome.IMPACT, a.outcome());
            assertEquals(Trajectory.Outcome.IMPACT, b.outcome());
            assertEquals(b.terminal().facet(), a.terminal().facet());
            worstT = Math.max(worstT, Math.abs(a.endTime() - b.endTime()) / b.endTime());
            double[] xa = a.terminal().state();
            double[] xb = b.terminal().state();
            worstX = Math.max(worstX, Math.sqrt(sq(xa[0] - xb[0]) + sq(xa[1] - xb[1]) + sq(xa[2] - xb[2])));
            evalsDefault += a.fieldEvaluations();
            evalsStrict += b.fieldEvaluations();
        }
        TestShapes.achieved("impact time, default vs strict path, relative", worstT);
        TestShapes.achieved("impact position, default vs strict path, / body radius", worstX);
        TestShapes.achieved("field evaluations, default / strict path", (double) evalsDefault / evalsStrict);
        assertTrue(worstT < 1e-8, "impact time differs by " + worstT);
        assertTrue(worstX < 1e-8, "impact position differs by " + worstX);
        assertTrue(evalsDefault < evalsStrict, evalsDefault + " vs " + evalsStrict);
    }

    /**
     * A deployment on the default path (one evaluator per sample, first hop step 1/16 of the predicted flight time)
     * against the strict path: the same outcomes and bounce counts and rest points within 1e-6 body radii, at the
     * default integrator tolerance; results for 1 and 2 threads identical (the Monte Carlo's definition).
     */
    @Test
    void deploymentMatchesTheStrictPath() {
        TriangleMesh m = TestShapes.lumpySphere(3, 0.08, 5);
        Propagator p = propagator(new PolyhedronField(m, 2000), m, new SpinState(6 * 3600.0, new double[] {0, 0, 1}));
        DeploymentSettings ds = new DeploymentSettings(new double[] {0, 0, 1.4}, new double[] {1e-4, 0, -2e-4}, 6,
            0.05, 5e-5, 0.5, 0.8, 3, 1e-5, 1e-4, 30 * 86400, 1000);
        List<Landing> a = Deployment.run(p, ds, 2, ProgressListener.NONE);
        List<Landing> one = Deployment.run(p, ds, 1, ProgressListener.NONE);
        List<Landing> b = Deployment.run(p.withStrict(true), ds, 2, ProgressListener.NONE);
        double worst = 0;
        for (int i = 0; i < a.size(); i++) {
            assertEquals(b.get(i).outcome(), a.get(i).outcome());
            assertEquals(b.get(i).bounces(), a.get(i).bounces());
            assertEquals(one.get(i).fieldEvaluations(), a.get(i).fieldEvaluations());
            assertTrue(java.util.Arrays.equals(one.get(i).position(), a.get(i).position()));
            double[] x = a.get(i).position();
            double[] y = b.get(i).position();
            worst = Math.max(worst, Math.sqrt(sq(x[0] - y[0]) + sq(x[1] - y[1]) + sq(x[2] - y[2])));
        }
        TestShapes.achieved("deployment rest points, default vs strict path, / body radius", worst);
        assertTrue(worst < 1e-6, "rest points differ by " + worst);
    }
}
