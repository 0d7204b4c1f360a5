package dev.cairn.mass;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import org.junit.jupiter.api.Test;

/**
 * Mass properties against handbook formulas: box (I_x = M(b²+c²)/12), unit cube (I = 1/6·1), L-shape of three unit
 * cubes (shared references §4 [V] and the parallel-axis theorem), tetrahedron (Tonon, F. (2005) Explicit exact
 * formulas for the 3-D tetrahedron inertia tensor in terms of its vertex coordinates, J. Math. Stat. 1(1):8–11 [M],
 * implemented independently here), solid ellipsoid (I_x = M(b²+c²)/5, converging with refinement), invariance under
 * rigid motion (I' = R I Rᵀ, COM' = R·COM + d) and principal axes of a rotated box. Handbook: e.g. any mechanics
 * text's table of moments of inertia (common practice, formulas from memory).
 */
class MassPropertiesHandbookTest {
    /** Relative error allowed for exact formulas on exact polyhedra (round-off of a few hundred flops). */
    private static final double EXACT_REL_TOL = 1e-13;
    /**
     * Tonon's example prints vertices to 5 decimals; all six published values differ from the exact tetrahedron on
     * those vertices by the same factor 1 + 1.6e-8 (the rounding of the vertices), hence this tolerance.
     */
    private static final double TONON_PUBLISHED_REL_TOL = 5e-8;
    /** Principal axes against the known rotation: 1 − |cos angle|. */
    private static final double AXIS_TOL = 1e-12;
    /** Measured order of convergence of polyhedral ellipsoids (expected 2). Common practice, no source. */
    private static final double ORDER_MIN = 1.8;
    private static final double ORDER_MAX = 2.2;

    /** Worst relative error of the exact checks in the running test (printed as an achieved figure). */
    private double worst;

    private void rel(double expected, double actual, double scale, String what) {
        assertEquals(expected, actual, EXACT_REL_TOL * Math.abs(scale), what);
        worst = Math.max(worst, Math.abs(expected - actual) / Math.abs(scale));
    }

    private void matrix(double[] expected, double[] actual, String what) {
        double scale = 0;
        for (double v : expected) {
            scale = Math.max(scale, Math.abs(v));
        }
        for (int i = 0; i < 9; i++) {
            rel(expected[i], actual[i], scale, what + " [" + i / 3 + "][" + i % 3 + "]");
        }
    }

    @Test
    void boxOffTheOrigin() {
        double a = 2;
        double b = 1.5;
        double c = 1;
        double rho = 2000;
        MassProperties mp = MassPropertiesCalculator.compute(Shapes.box(1, -2, 0.5, 1 + a, -2 + b, 0.5 + c), rho);
        double m = rho * a * b * c;
        rel(a * b * c, mp.volume(), a * b * c, "volume");
        rel(2 * (a * b + b * c + c * a), mp.surfaceArea(), a * b, "area");
        rel(m, mp.mass(), m, "mass");
        double[] com = mp.centerOfMass();
        rel(2, com[0], 2, "com x");
        rel(-1.25, com[1], 2, "com y");
        rel(1, com[2], 2, "com z");
        matrix(new double[] {m * (b * b + c * c) / 12, 0, 0, 0, m * (a * a + c * c) / 12, 0, 0, 0,
            m * (a * a + b * b) / 12}, mp.inertia(), "box inertia");
        rel(Math.sqrt(a * a + b * b + c * c) / 2, mp.brillouinRadius(), 1, "Brillouin radius = half diagonal");
        rel(Math.cbrt(3 * a * b * c / (4 * Math.PI)), mp.equivalentRadius(), 1, "equivalent radius");
        rel(m * dev.cairn.gravity.Constants.G, mp.gm(), m * dev.cairn.gravity.Constants.G, "GM");
        TestShapes.achieved("mass properties, box off the origin (volume, area, COM, inertia, radii, GM), max relative error", worst);
    }

    @Test
    void unitCube() {
        MassProperties mp = MassPropertiesCalculator.unitDensity(Shapes.unitCube());
        matrix(new double[] {1.0 / 6, 0, 0, 0, 1.0 / 6, 0, 0, 0, 1.0 / 6}, mp.inertia(), "unit cube I = 1/6·1");
        TestShapes.achieved("mass properties, unit cube inertia, max relative error", worst);
    }

    @Test
    void lShapeOfThreeCubesAndTheParallelAxisTheorem() {
        MassProperties mp = MassPropertiesCalculator.unitDensity(TestShapes.lShape());
        rel(3, mp.volume(), 3, "volume");
        // shared references §4 [V]: COM (5/6, 5/6, 1/2), I_c = [[7/6, 1/3, 0], [1/3, 7/6, 0], [0, 0, 11/6]]
        rel(5.0 / 6, mp.centerOfMass()[0], 1, "com x");
        rel(5.0 / 6, mp.centerOfMass()[1], 1, "com y");
        rel(0.5, mp.centerOfMass()[2], 1, "com z");
        double[] ref = {7.0 / 6, 1.0 / 3, 0, 1.0 / 3, 7.0 / 6, 0, 0, 0, 11.0 / 6};
        matrix(ref, mp.inertia(), "L-shape inertia");
        // Parallel-axis theorem (Steiner): sum of each unit cube's I = 1/6·1 shifted to the L's centre of mass.
        double[][] centres = {{0.5, 0.5, 0.5}, {1.5, 0.5, 0.5}, {0.5, 1.5, 0.5}};
        double[] sum = new double[9];
        double[] g = mp.centerOfMass();
        for (double[] c : centres) {
            double[] d = {c[0] - g[0], c[1] - g[1], c[2] - g[2]};
            double d2 = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
            for (int i = 0; i < 3; i++) {
                for (int j = 0; j < 3; j++) {
                    sum[3 * i + j] += (i == j ? 1.0 / 6 + d2 : 0) - d[i] * d[j];
                }
            }
        }
        matrix(sum, mp.inertia(), "L-shape by the parallel-axis theorem");
        TestShapes.achieved("mass properties, L-shape COM and inertia, table and parallel-axis, max relative error", worst);
    }

    @Test
    void tetrahedronAgainstTonon() {
        // Vertices of Tonon's (2005) numerical example [M]; density 1.
        double[][] p = {{8.33220, -11.86875, 0.93355}, {0.75523, 5.00000, 16.37072}, {52.61236, 5.00000, -5.38580},
            {2.00000, 5.00000, 3.00000}};
        MassProperties mp = MassPropertiesCalculator.unitDensity(tetrahedron(p));
        double[] expected = tononInertia(p);
        matrix(expected, mp.inertia(), "tetrahedron inertia (Tonon 2005)");
        TestShapes.achieved("tetrahedron vs Tonon's formulas, max relative error", worst);
        // Tonon's published results for this example [M]: a = 43520.33257, b = 194711.28938, c = 191168.76173,
        // a' = 4417.66150, b' = −46343.16662, c' = 11996.20119 (density 1).
        double[] published = {43520.33257, -11996.20119, 46343.16662, -11996.20119, 194711.28938, -4417.66150,
            46343.16662, -4417.66150, 191168.76173};
        double worst = 0;
        for (int i = 0; i < 9; i++) {
            double e = Math.abs(mp.inertia()[i] - published[i]) / Math.abs(published[i]);
            assertTrue(e <= TONON_PUBLISHED_REL_TOL, "Tonon published value [" + i + "]: " + mp.inertia()[i]);
            worst = Math.max(worst, e);
        }
        TestShapes.achieved("tetrahedron vs Tonon's published example, max relative difference", worst);
    }

    /** Outward tetrahedron mesh on four points. */
    static TriangleMesh tetrahedron(double[][] p) {
        double[] xyz = new double[12];
        for (int i = 0; i < 4; i++) {
            System.arraycopy(p[i], 0, xyz, 3 * i, 3);
        }
        double[] u = sub(p[1], p[0]);
        double[] v = sub(p[2], p[0]);
        double[] w = sub(p[3], p[0]);
        double det = u[0] * (v[1] * w[2] - v[2] * w[1]) - u[1] * (v[0] * w[2] - v[2] * w[0])
            + u[2] * (v[0] * w[1] - v[1] * w[0]);
        int[] tri = det > 0 ? new int[] {0, 2, 1, 0, 1, 3, 0, 3, 2, 1, 2, 3} : new int[] {0, 1, 2, 0, 3, 1, 0, 2, 3, 1, 3, 2};
        return new TriangleMesh(xyz, tri);
    }

    /**
     * Tonon (2005) eqs.: with coordinates relative to the centroid and |J| = 6V, I_xx = |J| Σ_{i≤j}(y_i y_j + z_i z_j)/60
     * (likewise I_yy, I_zz) and the products a' (yz), b' (xz), c' (xy) = |J| Σ_i Σ_j (1+δ_ij) ·/120; the tensor is
     * [[a, −b', −c'], [−b', b, −a'], [−c', −a', c]]. Density 1.
     */
    static double[] tononInertia(double[][] p) {
        double[] g = new double[3];
        for (double[] q : p) {
            for (int k = 0; k < 3; k++) {
                g[k] += q[k] / 4;
            }
        }
        double[][] r = new double[4][3];
        for (int i = 0; i < 4; i++) {
            r[i] = sub(p[i], g);
        }
        double[] u = sub(r[1], r[0]);
        double[] v = sub(r[2], r[0]);
        double[] w = sub(r[3], r[0]);
        double jac = Math.abs(u[0] * (v[1] * w[2] - v[2] * w[1]) - u[1] * (v[0] * w[2] - v[2] * w[0])
            + u[2] * (v[0] * w[1] - v[1] * w[0]));
        double[] sq = new double[3]; // Σ_{i≤j} x_i x_j per axis
        double[] prod = new double[3]; // Σ_i Σ_j (1+δ_ij) : yz, xz, xy
        int[][] pairs = {{1, 2}, {0, 2}, {0, 1}};
        for (int i = 0; i < 4; i++) {
            for (int j = 0; j < 4; j++) {
                for (int k = 0; k < 3; k++) {
                    if (j >= i) {
                        sq[k] += r[i][k] * r[j][k];
                    }
                    prod[k] += (i == j ? 2 : 1) * r[i][pairs[k][0]] * r[j][pairs[k][1]];
                }
            }
        }
        double a = jac * (sq[1] + sq[2]) / 60;
        double b = jac * (sq[0] + sq[2]) / 60;
        double c = jac * (sq[0] + sq[1]) / 60;
        double ap = jac * prod[0] / 120;
        double bp = jac * prod[1] / 120;
        double cp = jac * prod[2] / 120;
        return new double[] {a, -cp, -bp, -cp, b, -ap, -bp, -ap, c};
    }

    private static double[] sub(double[] a, double[] b) {
        return new double[] {a[0] - b[0], a[1] - b[1], a[2] - b[2]};
    }

    @Test
    void polyhedralEllipsoidsConvergeToTheSolidEllipsoid() {
        double a = 3;
        double b = 2;
        double c = 1;
        double[] prev = null;
        for (int level = 2; level <= 5; level++) {
            MassProperties mp = MassPropertiesCalculator.unitDensity(Shapes.ellipsoid(level, a, b, c));
            double m = mp.mass();
            double[] in = mp.inertia();
            // solid ellipsoid: I_x = M(b²+c²)/5, I_y = M(a²+c²)/5, I_z = M(a²+b²)/5, products 0
            double[] err = {
                Math.abs(in[0] / m - (b * b + c * c) / 5) / ((b * b + c * c) / 5),
                Math.abs(in[4] / m - (a * a + c * c) / 5) / ((a * a + c * c) / 5),
                Math.abs(in[8] / m - (a * a + b * b) / 5) / ((a * a + b * b) / 5),
                Math.abs(m - 4 * Math.PI * a * b * c / 3) / (4 * Math.PI * a * b * c / 3)};
            for (int k : new int[] {1, 2, 3, 5, 6, 7}) {
                assertEquals(0, in[k] / m, 1e-13, "ellipsoid product of inertia " + k);
            }
            if (prev != null) {
                for (int k = 0; k < 4; k++) {
                    double order = Math.log(prev[k] / err[k]) / Math.log(2);
                    TestShapes.achieved("ellipsoid 3:2:1 mass properties " + (k < 3 ? "I" + "xyz".charAt(k) + "/M" : "volume")
                        + " level " + (level - 1) + "->" + level + " order", order);
                    assertTrue(order >= ORDER_MIN && order <= ORDER_MAX, "order " + order + " for quantity " + k);
                }
            }
            if (level == 5) {
                for (int k = 0; k < 4; k++) {
                    TestShapes.achieved("ellipsoid 3:2:1 mass properties level 5 relative error " + k, err[k]);
                }
            }
            prev = err;
        }
    }

    @Test
    void rigidMotionRotatesTheTensorAndMovesTheCentreOfMass() {
        TriangleMesh body = TestShapes.lShape();
        double[] rot = TestShapes.rotation(0.4, -1, 0.3, 1.1);
        double[] shift = {100.0, -250.0, 42.0};
        MassProperties a = MassPropertiesCalculator.compute(body, 1500);
        MassProperties b = MassPropertiesCalculator.compute(body.transformed(rot, 1.0, shift), 1500);
        rel(a.volume(), b.volume(), a.volume(), "volume");
        rel(a.surfaceArea(), b.surfaceArea(), a.surfaceArea(), "area");
        double[] c = TestShapes.apply(rot, a.centerOfMass());
        for (int k = 0; k < 3; k++) {
            // translation by ~250 m: round-off relative to the coordinates, not to the body
            assertEquals(c[k] + shift[k], b.centerOfMass()[k], 1e-12 * 250, "com " + k);
        }
        double[] expected = new double[9];
        double[] in = a.inertia();
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                for (int k = 0; k < 3; k++) {
                    for (int l = 0; l < 3; l++) {
                        expected[3 * i + j] += rot[3 * i + k] * in[3 * k + l] * rot[3 * j + l];
                    }
                }
            }
        }
        // About the centre of mass after a shift of ~250 sizes: the parallel-axis subtraction loses ~250² in scale.
        double scale = a.principalMoments()[2];
        for (int i = 0; i < 9; i++) {
            assertEquals(expected[i], b.inertia()[i], 1e-9 * scale, "R I Rᵀ [" + i + "]");
        }
        TestShapes.achieved("mass properties, rigid motion (volume, area), max relative error", worst);
    }

    @Test
    void principalAxesOfARotatedBoxRecoverTheRotation() {
        double[] rot = TestShapes.rotation(1, 1, 0.2, 0.8);
        TriangleMesh box = Shapes.box(-1, -0.75, -0.5, 1, 0.75, 0.5).transformed(rot, 1.0, new double[] {3, 4, 5});
        MassProperties mp = MassPropertiesCalculator.compute(box, 1000);
        double m = mp.mass();
        // smallest moment about the longest side (x, 2 m), largest about the shortest (z, 1 m)
        double[] expected = {m * (2.25 + 1) / 12, m * (4 + 1) / 12, m * (4 + 2.25) / 12};
        double[] axes = mp.principalAxes();
        double worst = 0;
        for (int k = 0; k < 3; k++) {
            rel(expected[k], mp.principalMoments()[k], expected[2], "principal moment " + k);
            double[] e = new double[3];
            e[k] = 1;
            double[] col = TestShapes.apply(rot, e);
            double dot = Math.abs(axes[3 * k] * col[0] + axes[3 * k + 1] * col[1] + axes[3 * k + 2] * col[2]);
            worst = Math.max(worst, 1 - dot);
            assertTrue(1 - dot <= AXIS_TOL, "axis " + k + " vs rotated box axis: |cos| = " + dot);
        }
        double det = axes[0] * (axes[4] * axes[8] - axes[5] * axes[7]) - axes[1] * (axes[3] * axes[8] - axes[5] * axes[6])
            + axes[2] * (axes[3] * axes[7] - axes[4] * axes[6]);
        assertEquals(1.0, det, 1e-12, "right-handed axes");
        TestShapes.achieved("principal axes of a rotated box, max 1-|cos|", worst);
    }
}
