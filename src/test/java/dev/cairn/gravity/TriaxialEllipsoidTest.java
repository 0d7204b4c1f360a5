package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.junit.jupiter.api.Test;

/**
 * Homogeneous triaxial ellipsoid (Chandrasekhar, S. (1969) Ellipsoidal Figures of Equilibrium, ch. 3 [M]; formulas
 * as in shared references §3): U = πGρabc [I(λ) − A_x x² − A_y y² − A_z z²], g = −2πGρabc (A_x x, A_y y, A_z z),
 * with I(λ) = ∫_λ^∞ du/Δ, A_i(λ) = ∫_λ^∞ du/((a_i²+u)Δ), Δ = √((a²+u)(b²+u)(c²+u)); λ = 0 inside, the largest root
 * of Σ x_i²/(a_i²+λ) = 1 outside. The integrals are computed here by Gauss–Legendre quadrature (Commons Math) after
 * the change of variable u = λ + k(1/t² − 1), which maps [λ, ∞) to (0, 1] with a smooth integrand:
 * I = ∫_0^1 2k dt / √Π(k + β_i t²), A_i = ∫_0^1 2k t² dt / ((k + β_i t²) √Π(k + β_j t²)), β_i = a_i² + λ − k.
 * Refined polyhedral ellipsoids (vertices on the surface) converge to it at second order.
 */
class TriaxialEllipsoidTest {
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1
    private static final double A = 3;
    private static final double B = 2;
    private static final double C = 1;
    /** Quadrature accuracy requested from Commons Math, relative. */
    private static final double QUADRATURE_REL = 1e-15;
    /** Against the [V] values of shared references §3: abc·A_i are given to 7–8 digits. */
    private static final double COEFF_TABLE_TOL = 2e-8;
    /** Against the [V] values of shared references §3 given to 11–14 digits, relative. */
    private static final double TABLE_REL_TOL = 1e-11;
    /** abc(A_x+A_y+A_z) = 2 at λ = 0 (an identity of the integrals), absolute. */
    private static final double IDENTITY_TOL = 1e-13;
    /** Measured order of convergence of polyhedral ellipsoids (expected 2). Common practice, no source. */
    private static final double ORDER_MIN = 1.8;
    private static final double ORDER_MAX = 2.2;
    /**
     * Errors allowed at level 5 (20480 facets) for U inside, g inside, U outside, g outside: the measured values
     * (docs/validation.md) with a factor ~2.5 of margin, a regression guard; the order assertion is the real check.
     */
    private static final double[] FINEST_TOL = {1.2e-3, 1e-5, 1.5e-3, 6e-4};

    private static final double[] AXES2 = {A * A, B * B, C * C};

    /** {@code [I, A_x, A_y, A_z]} at λ. */
    static double[] coefficients(double lambda) {
        double k = (AXES2[0] + AXES2[1] + AXES2[2]) / 3 + lambda;
        double[] beta = {AXES2[0] + lambda - k, AXES2[1] + lambda - k, AXES2[2] + lambda - k};
        IterativeLegendreGaussIntegrator gl = new IterativeLegendreGaussIntegrator(16, QUADRATURE_REL, 1e-300);
        double[] out = new double[4];
        out[0] = gl.integrate(100000, t -> 2 * k / Math.sqrt(prod(k, beta, t)), 0, 1);
        for (int i = 0; i < 3; i++) {
            final int ii = i;
            out[1 + i] = gl.integrate(100000,
                t -> 2 * k * t * t / ((k + beta[ii] * t * t) * Math.sqrt(prod(k, beta, t))), 0, 1);
        }
        return out;
    }

    private static double prod(double k, double[] beta, double t) {
        double t2 = t * t;
        return (k + beta[0] * t2) * (k + beta[1] * t2) * (k + beta[2] * t2);
    }

    /** λ = 0 inside; else the largest root of Σ x_i²/(a_i²+λ) = 1 (Brent, Commons Math). */
    static double lambda(double x, double y, double z) {
        double f0 = x * x / AXES2[0] + y * y / AXES2[1] + z * z / AXES2[2] - 1;
        if (f0 <= 0) {
            return 0;
        }
        double hi = x * x + y * y + z * z; // Σ x_i²/(a_i²+λ) < |x|²/λ ≤ 1 there
        return new BrentSolver(1e-15, 1e-15).solve(1000,
            l -> x * x / (AXES2[0] + l) + y * y / (AXES2[1] + l) + z * z / (AXES2[2] + l) - 1, 0, hi);
    }

    /** {@code [U, gx, gy, gz]} of the ellipsoid with Gρ = 1. */
    static double[] field(double x, double y, double z) {
        double[] q = coefficients(lambda(x, y, z));
        double abc = A * B * C;
        double u = Math.PI * abc * (q[0] - q[1] * x * x - q[2] * y * y - q[3] * z * z);
        return new double[] {u, -2 * Math.PI * abc * q[1] * x, -2 * Math.PI * abc * q[2] * y,
            -2 * Math.PI * abc * q[3] * z};
    }

    @Test
    void quadratureReproducesTheReferenceValues() {
        double abc = A * B * C;
        double[] q = coefficients(0);
        // shared references §3 [V], a,b,c = 3,2,1
        assertEquals(2.0, abc * (q[1] + q[2] + q[3]), IDENTITY_TOL, "abc(Ax+Ay+Az) = 2");
        TestShapes.achieved("ellipsoid identity abc(Ax+Ay+Az) - 2", Math.abs(abc * (q[1] + q[2] + q[3]) - 2));
        TestShapes.achieved("ellipsoid abc·A vs 7-8 digit reference, max abs. difference", Math.max(
            Math.abs(abc * q[1] - 0.3126014), Math.max(Math.abs(abc * q[2] - 0.53430808), Math.abs(abc * q[3] - 1.15309052))));
        assertEquals(0.3126014, abc * q[1], COEFF_TABLE_TOL);
        assertEquals(0.53430808, abc * q[2], COEFF_TABLE_TOL);
        assertEquals(1.15309052, abc * q[3], COEFF_TABLE_TOL);
        assertEquals(6.1037354228, abc * q[0], 1e-10);
        rel(19.175450363851, field(0, 0, 0)[0], "U(0)");
        double[] f = field(1, 0.5, 0.3);
        rel(17.447710860229, f[0], "U(1,0.5,0.3)");
        assertEquals(-1.96413251, f[1], COEFF_TABLE_TOL * 10);
        assertEquals(-1.67857834, f[2], COEFF_TABLE_TOL * 10);
        assertEquals(-2.17352443, f[3], COEFF_TABLE_TOL * 10);
        assertEquals(8.842531, lambda(4, 1, 0.5), 1e-6, "λ at (4,1,0.5)");
        f = field(4, 1, 0.5);
        rel(6.529536811283, f[0], "U(4,1,0.5)");
        rel(-1.737877141479, f[1], "gx(4,1,0.5)");
        assertEquals(1.25, lambda(0, 0, 1.5), 1e-14, "λ at (0,0,1.5)");
        rel(12.509845710060, field(0, 0, 1.5)[0], "U(0,0,1.5)");
    }

    private static void rel(double expected, double actual, String what) {
        assertEquals(expected, actual, TABLE_REL_TOL * Math.abs(expected), what);
        TestShapes.achieved("ellipsoid reference value " + what + ", relative error",
            Math.abs(expected - actual) / Math.abs(expected));
    }

    @Test
    void polyhedralEllipsoidsConvergeInsideAndOutside() {
        double[][] inside = {{0, 0, 0}, {1, 0.5, 0.3}, {-1.5, 0.8, -0.2}, {2, -0.6, 0.1}};
        double[][] outside = {{4, 1, 0.5}, {0, 0, 1.5}, {-2.5, 2.5, 1.2}};
        double[][] refIn = new double[inside.length][];
        double[][] refOut = new double[outside.length][];
        for (int i = 0; i < inside.length; i++) {
            refIn[i] = field(inside[i][0], inside[i][1], inside[i][2]);
        }
        for (int i = 0; i < outside.length; i++) {
            refOut[i] = field(outside[i][0], outside[i][1], outside[i][2]);
        }
        int first = 2;
        int last = 5;
        double[][] err = new double[4][last - first + 1]; // U in, g in, U out, g out
        double[] s = new double[FieldSample.SIZE];
        double gScale = 2 * Math.PI * 1.15309052 * C; // |g| at the pole (0,0,c): 2πGρ·abc·A_z·c, Gρ = 1
        for (int l = first; l <= last; l++) {
            FieldEvaluator ev = new PolyhedronField(Shapes.ellipsoid(l, A, B, C), RHO).newEvaluator();
            for (int set = 0; set < 2; set++) {
                double[][] pts = set == 0 ? inside : outside;
                double[][] ref = set == 0 ? refIn : refOut;
                for (int i = 0; i < pts.length; i++) {
                    ev.evaluate(pts[i][0], pts[i][1], pts[i][2], false, s, 0);
                    assertEquals(set == 0 ? Location.INSIDE : Location.OUTSIDE, Location.fromCode(s[FieldSample.LOCATION]));
                    double eu = Math.abs(s[FieldSample.U] - ref[i][0]) / ref[i][0];
                    double dg = 0;
                    for (int k = 0; k < 3; k++) {
                        dg += (s[FieldSample.AX + k] - ref[i][1 + k]) * (s[FieldSample.AX + k] - ref[i][1 + k]);
                    }
                    err[2 * set][l - first] = Math.max(err[2 * set][l - first], eu);
                    err[2 * set + 1][l - first] = Math.max(err[2 * set + 1][l - first], Math.sqrt(dg) / gScale);
                }
            }
        }
        String[] names = {"U inside", "g inside", "U outside", "g outside"};
        for (int q = 0; q < 4; q++) {
            for (int l = 0; l + 1 < err[q].length; l++) {
                double order = Math.log(err[q][l] / err[q][l + 1]) / Math.log(2);
                TestShapes.achieved("ellipsoid 3:2:1 " + names[q] + ": level " + (first + l) + " error "
                    + String.format(java.util.Locale.ROOT, "%.3g", err[q][l]) + ", order", order);
                assertTrue(order >= ORDER_MIN && order <= ORDER_MAX, names[q] + " order " + order);
            }
            TestShapes.achieved("ellipsoid 3:2:1 " + names[q] + ": level " + last + " error", err[q][err[q].length - 1]);
            assertTrue(err[q][err[q].length - 1] <= FINEST_TOL[q], names[q] + " at level " + last);
        }
    }
}
