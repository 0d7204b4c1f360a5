package dev.cairn.tables;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.util.ProgressListener;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** {@link TableField} against closed-form fields. */
class TableInterpolationTest {
    /** Rounding-level relative tolerance for an interpolant that is exact in exact arithmetic (common practice). */
    private static final double ROUNDING = 1e-12;
    /** Check values of shared references §3 are given to 7–9 significant digits. */
    private static final double REF_DIGITS = 2e-7;
    /** g(1, 0.5, 0.3) is given to 8 decimals in shared references §3. */
    private static final double REF_G_DIGITS = 1e-8;
    /** U(1, 0.5, 0.3) is given to 14 significant digits in shared references §3. */
    private static final double REF_U_DIGITS = 1e-12;
    /** The query's tensor is a derivative of the interpolant: rounding grows by about 1/h (common practice). */
    private static final double TENSOR_ROUNDING = 1e-10;
    /**
     * Across a cell face at ±ε the tensor may differ only by O(ε·|∂³U|) for a C1 interpolant (|∂³U| ≈ 6/r⁴ ≲ 1 here);
     * a jump of the order of the cell's tensor error (~1e-5) would exceed it.
     */
    private static final double C1_JUMP_TOL = 1e-6;
    /** Tricubic Hermite with exact first derivatives is 4th order (Lekien & Marsden 2005); we ask at least this. */
    private static final double MIN_ORDER_HERMITE = 3.5;
    /** From values alone, with 2nd-order difference derivatives, the error is O(h³); we ask at least this. */
    private static final double MIN_ORDER_VALUES = 2.5;
    /**
     * Derivative of a 4th-order interpolant is 3rd order: at h/r ≈ 0.03 (box, shells) the tensor error stays below
     * this (common practice, no source; measured 2.2e-5 on the box and 9.4e-5 on the shells).
     */
    private static final double TENSOR_TOL = 1e-3;

    private static TableLayout layout(Grid g, boolean gradient) {
        return new TableLayout(g, gradient, false, false, 0, new double[] {0, 0, 1}, new double[3]);
    }

    @Test
    void ellipsoidClosedFormMatchesReferenceValues() {
        // Shared references §3 [V]: a,b,c = 3,2,1, Gρ = 1.
        TestFields.EllipsoidInterior e = new TestFields.EllipsoidInterior(3, 2, 1, 1);
        assertEquals(0.3126014, e.kx / Math.PI, REF_DIGITS);
        assertEquals(0.53430808, e.ky / Math.PI, REF_DIGITS);
        assertEquals(1.15309052, e.kz / Math.PI, REF_DIGITS);
        double[] s = new double[FieldSample.SIZE];
        e.newEvaluator().evaluate(1, 0.5, 0.3, false, s, 0);
        assertEquals(17.447710860229, s[FieldSample.U], REF_U_DIGITS * 17.4);
        assertEquals(-1.96413251, s[FieldSample.AX], REF_G_DIGITS);
        assertEquals(-1.67857834, s[FieldSample.AY], REF_G_DIGITS);
        assertEquals(-2.17352443, s[FieldSample.AZ], REF_G_DIGITS);
    }

    /** Quadratic potential (Chandrasekhar 1969 ellipsoid interior): tricubic Hermite reproduces it exactly. */
    @Test
    void reproducesUniformGradientFieldExactly() {
        FieldModel f = new TestFields.EllipsoidInterior(3, 2, 1, 1);
        BoxGrid g = BoxGrid.ofCounts(new double[] {-1.5, 1.2, -1, 0.9, -0.5, 0.4}, new int[] {5, 4, 6});
        for (boolean gradient : new boolean[] {true, false}) {
            Table t = TableBuilder.compute(f, layout(g, gradient), 1, Map.of());
            FieldEvaluator tab = new TableField(t).newEvaluator();
            FieldEvaluator ex = f.newEvaluator();
            SplittableRandom rnd = new SplittableRandom(5);
            double[] a = new double[FieldSample.SIZE];
            double[] b = new double[FieldSample.SIZE];
            for (int i = 0; i < 500; i++) {
                double x = -1.5 + 2.7 * rnd.nextDouble();
                double y = -1 + 1.9 * rnd.nextDouble();
                double z = -0.5 + 0.9 * rnd.nextDouble();
                tab.evaluate(x, y, z, true, a, 0);
                ex.evaluate(x, y, z, true, b, 0);
                double scaleU = Math.abs(b[FieldSample.U]);
                double scaleG = 2 * Math.PI * 1.2; // |g| scale: 2πGρabc·A·|x| ≲ this
                assertEquals(b[FieldSample.U], a[FieldSample.U], ROUNDING * scaleU, "U, gradient=" + gradient);
                for (int k = FieldSample.AX; k <= FieldSample.AZ; k++) {
                    assertEquals(b[k], a[k], ROUNDING * scaleG, "g, gradient=" + gradient);
                }
                for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                    assertEquals(b[k], a[k], TENSOR_ROUNDING * scaleG, "tensor, gradient=" + gradient);
                }
            }
        }
    }

    private static double maxRelError(FieldModel exact, Table t, int samples) {
        AccuracyCheck.Report r = AccuracyCheck.run(new TableField(t), exact, samples, 11, 1, ProgressListener.NONE);
        return r.outside().max();
    }

    /** Inverse-square field of a point mass: the error falls at the method's order as the spacing halves. */
    @Test
    void pointMassErrorFallsAtExpectedOrderOnBox() {
        FieldModel pm = TestFields.pointMass(1.0, 0, 0, 0);
        double[] h = {0.25, 0.125, 0.0625};
        double[] eh = new double[3];
        double[] ev = new double[3];
        for (int i = 0; i < 3; i++) {
            BoxGrid g = BoxGrid.ofSpacing(new double[] {2, 3, -0.5, 0.5, -0.5, 0.5}, new double[] {h[i], h[i], h[i]});
            Table t = TableBuilder.compute(pm, layout(g, true), 2, Map.of());
            eh[i] = maxRelError(pm, t, 3000);
            ev[i] = maxRelError(pm, TableBench.dropGradient(t), 3000);
        }
        double orderH = Math.log(eh[1] / eh[2]) / Math.log(2);
        double orderV = Math.log(ev[1] / ev[2]) / Math.log(2);
        assertTrue(orderH >= MIN_ORDER_HERMITE, "Hermite order " + orderH + " errors " + java.util.Arrays.toString(eh));
        assertTrue(orderV >= MIN_ORDER_VALUES, "values order " + orderV + " errors " + java.util.Arrays.toString(ev));
        assertTrue(eh[2] < ev[2], "tabulated gradients must help");
    }

    /** The same on spherical shells: (r, lat, lon) interpolation, wrap-around and poles included. */
    @Test
    void pointMassErrorFallsAtExpectedOrderOnSphere() {
        FieldModel pm = TestFields.pointMass(1.0, 0.01, -0.02, 0.03); // off-centre: a non-trivial field in (r,φ,λ)
        double[] eh = new double[2];
        double[] ev = new double[2];
        double[] steps = {10, 5};
        for (int i = 0; i < 2; i++) {
            double dr = 0.05 * steps[i];
            SphereGrid g = new SphereGrid(new double[3], SphereGrid.parseRadii("2:3:" + dr), steps[i], steps[i]);
            Table t = TableBuilder.compute(pm, layout(g, true), 2, Map.of());
            eh[i] = maxRelError(pm, t, 3000);
            ev[i] = maxRelError(pm, TableBench.dropGradient(t), 3000);
        }
        double orderH = Math.log(eh[0] / eh[1]) / Math.log(2);
        double orderV = Math.log(ev[0] / ev[1]) / Math.log(2);
        assertTrue(orderH >= MIN_ORDER_HERMITE, "sphere Hermite order " + orderH + " " + java.util.Arrays.toString(eh));
        assertTrue(orderV >= MIN_ORDER_VALUES, "sphere values order " + orderV + " " + java.util.Arrays.toString(ev));
    }

    @Test
    void polesAndLongitudeWrapAreInterpolatedLikeAnyOtherPoint() {
        FieldModel pm = TestFields.pointMass(1.0, 0.01, -0.02, 0.03);
        SphereGrid g = new SphereGrid(new double[3], SphereGrid.parseRadii("2:3:0.25"), 5, 5);
        Table t = TableBuilder.compute(pm, layout(g, false), 1, Map.of());
        double typical = maxRelError(pm, t, 2000);
        FieldEvaluator tab = new TableField(t).newEvaluator();
        FieldEvaluator ex = pm.newEvaluator();
        double[] a = new double[FieldSample.SIZE];
        double[] b = new double[FieldSample.SIZE];
        double r = 2.37;
        double[][] pts = {{0, 0, r}, {0, 0, -r}, {1e-9, 2e-9, r}, {r * Math.cos(Math.toRadians(359.9)),
            r * Math.sin(Math.toRadians(359.9)), 0.1}, {r * Math.cos(Math.toRadians(0.05)),
            r * Math.sin(Math.toRadians(0.05)), 0.1}, {0.05, -0.03, -r}};
        for (double[] p : pts) {
            tab.evaluate(p[0], p[1], p[2], false, a, 0);
            ex.evaluate(p[0], p[1], p[2], false, b, 0);
            double d = Math.sqrt(Math.pow(a[1] - b[1], 2) + Math.pow(a[2] - b[2], 2) + Math.pow(a[3] - b[3], 2));
            assertTrue(d / FieldSample.accelerationNorm(b, 0) <= typical,
                "error at special point " + java.util.Arrays.toString(p) + " exceeds the random-point maximum");
        }
    }

    @Test
    void valuesAtNodesAreReproducedExactly() {
        FieldModel pm = TestFields.pointMass(3.0, 0, 0, 0);
        BoxGrid g = BoxGrid.ofSpacing(new double[] {2, 3, -0.5, 0.5, -0.5, 0.5}, new double[] {0.25, 0.25, 0.25});
        Table t = TableBuilder.compute(pm, layout(g, true), 1, Map.of());
        FieldEvaluator tab = new TableField(t).newEvaluator();
        double[] a = new double[FieldSample.SIZE];
        double[] p = new double[3];
        for (int n = 0; n < g.nodeCount(); n++) {
            g.node(n, p, 0);
            tab.evaluate(p[0], p[1], p[2], false, a, 0);
            assertEquals(t.value(n, TableLayout.U), a[FieldSample.U], 0.0, "U at node " + n);
            assertEquals(t.value(n, TableLayout.AX), a[FieldSample.AX], 0.0, "ax at node " + n);
        }
    }

    /** C1: with tabulated gradients the acceleration's derivative is continuous across a cell face. */
    @Test
    void accelerationIsC1AcrossCellFaces() {
        FieldModel pm = TestFields.pointMass(1.0, 0, 0, 0);
        BoxGrid g = BoxGrid.ofSpacing(new double[] {2, 3, -0.5, 0.5, -0.5, 0.5}, new double[] {0.25, 0.25, 0.25});
        FieldEvaluator tab = new TableField(TableBuilder.compute(pm, layout(g, true), 1, Map.of())).newEvaluator();
        double[] lo = new double[FieldSample.SIZE];
        double[] hi = new double[FieldSample.SIZE];
        double eps = 1e-9;
        double face = 2.5; // a node plane in x
        tab.evaluate(face - eps, 0.1, -0.07, true, lo, 0);
        tab.evaluate(face + eps, 0.1, -0.07, true, hi, 0);
        for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
            assertEquals(lo[k], hi[k], C1_JUMP_TOL, "gradient slot " + k + " across x = " + face);
        }
    }

    @Test
    void refusesOutsideOrFallsBackToTheExactModel() {
        FieldModel pm = TestFields.pointMass(1.0, 0, 0, 0);
        BoxGrid g = BoxGrid.ofSpacing(new double[] {2, 3, -0.5, 0.5, -0.5, 0.5}, new double[] {0.25, 0.25, 0.25});
        Table t = TableBuilder.compute(pm, layout(g, false), 1, Map.of());
        double[] a = new double[FieldSample.SIZE];
        FieldEvaluator refuse = new TableField(t).newEvaluator();
        assertThrows(OutsideTableException.class, () -> refuse.evaluate(3.0000001, 0, 0, false, a, 0));
        assertThrows(OutsideTableException.class, () -> refuse.evaluate(2.5, 0, Double.NaN, false, a, 0));
        new TableField(t, pm).newEvaluator().evaluate(4, 0.1, 0.2, false, a, 0);
        double[] b = new double[FieldSample.SIZE];
        pm.newEvaluator().evaluate(4, 0.1, 0.2, false, b, 0);
        assertEquals(b[FieldSample.AX], a[FieldSample.AX], 0.0);
        SphereGrid s = new SphereGrid(new double[3], new double[] {2, 3}, 30, 30);
        FieldEvaluator sph = new TableField(TableBuilder.compute(pm, layout(s, false), 1, Map.of())).newEvaluator();
        assertThrows(OutsideTableException.class, () -> sph.evaluate(0, 0, 1.9, false, a, 0));
        assertThrows(IllegalArgumentException.class, () -> new TableField(TableBuilder.compute(pm,
            layout(new PointGrid(new double[] {2, 0, 0}, "x", null), false), 1, Map.of())));
    }

    /** The gradient tensor of a query (derivative of the interpolant) approaches the exact tensor, on both grids. */
    @Test
    void queryGradientTensorApproachesExactTensor() {
        FieldModel pm = TestFields.pointMass(1.0, 0.01, -0.02, 0.03);
        Grid[] grids = {BoxGrid.ofSpacing(new double[] {2, 3, -0.5, 0.5, -0.5, 0.5}, new double[] {0.0625, 0.0625, 0.0625}),
            new SphereGrid(new double[3], SphereGrid.parseRadii("2:3:0.125"), 2.5, 2.5)};
        for (Grid g : grids) {
            FieldEvaluator tab = new TableField(TableBuilder.compute(pm, layout(g, true), 2, Map.of())).newEvaluator();
            FieldEvaluator ex = pm.newEvaluator();
            double[] pts = AccuracyCheck.samplePoints(g, 300, 3);
            double[] a = new double[FieldSample.SIZE];
            double[] b = new double[FieldSample.SIZE];
            double worst = 0;
            for (int i = 0; i < 300; i++) {
                tab.evaluate(pts[3 * i], pts[3 * i + 1], pts[3 * i + 2], true, a, 0);
                ex.evaluate(pts[3 * i], pts[3 * i + 1], pts[3 * i + 2], true, b, 0);
                double num = 0;
                double den = 0;
                for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                    num += (a[k] - b[k]) * (a[k] - b[k]);
                    den += b[k] * b[k];
                }
                worst = Math.max(worst, Math.sqrt(num / den));
            }
            assertTrue(worst < TENSOR_TOL, g.kind() + ": tensor relative error " + worst);
        }
    }
}
