package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.util.List;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.junit.jupiter.api.Test;

/** Spherical-harmonic coefficients of polyhedra against closed forms and an independent volume quadrature. */
class HarmonicCoefficientsTest {
    /** Agreement of exact computations up to rounding (common practice, no source). */
    private static final double EXACT = 1e-12;
    private static final double RHO = 2000;

    private static HarmonicCoefficients of(TriangleMesh mesh, double[] origin, double ref, int degree, int threads) {
        return HarmonicCoefficients.ofPolyhedra(List.of(mesh), new double[] {RHO}, origin, ref, degree, threads);
    }

    /**
     * Box about its centre of mass: C20 = (A+B−2C)/(2MR²), C22 = (B−A)/(4MR²) from the principal moments (shared
     * references §3, "any body"), with the handbook inertia of a box I_x = M(b²+c²)/12 (references §4); every odd
     * degree and the other degree ≤ 2 terms vanish by symmetry.
     */
    @Test
    void boxDegreeTwoMatchesInertiaClosedForms() {
        double lx = 2.0;
        double ly = 1.2;
        double lz = 0.7;
        TriangleMesh box = Shapes.box(0.3, -0.4, 0.1, 0.3 + lx, -0.4 + ly, 0.1 + lz);
        double[] com = {0.3 + lx / 2, -0.4 + ly / 2, 0.1 + lz / 2};
        double ref = 1.7;
        HarmonicCoefficients h = of(box, com, ref, 6, 2);
        double m = RHO * lx * ly * lz;
        double a = m * (ly * ly + lz * lz) / 12;
        double b = m * (lx * lx + lz * lz) / 12;
        double c = m * (lx * lx + ly * ly) / 12;
        double c20 = (a + b - 2 * c) / (2 * m * ref * ref);
        double c22 = (b - a) / (4 * m * ref * ref);
        assertEquals(c20, h.cUnnormalised(2, 0), EXACT * Math.abs(c20));
        assertEquals(c22, h.cUnnormalised(2, 2), EXACT * Math.abs(c22));
        assertEquals(c20 / Math.sqrt(5), h.c(2, 0), EXACT * Math.abs(c20)); // C̄20 = C20/√5 (references §3)
        assertEquals(c22 * Math.sqrt(12.0 / 5), h.c(2, 2), EXACT * Math.abs(c22)); // C̄22 = C22·√(12/5)
        assertEquals(1.0, h.c(0, 0), EXACT);
        assertEquals(Constants.G * m, h.gm(), EXACT * Constants.G * m);
        assertEquals(0, h.c(2, 1), EXACT);
        assertEquals(0, h.s(2, 1), EXACT);
        assertEquals(0, h.s(2, 2), EXACT);
        double worstOdd = 0;
        for (int n = 1; n <= 5; n += 2) {
            for (int k = 0; k <= n; k++) {
                assertEquals(0, h.c(n, k), EXACT, "C" + n + k);
                assertEquals(0, h.s(n, k), EXACT, "S" + n + k);
                worstOdd = Math.max(worstOdd, Math.max(Math.abs(h.c(n, k)), Math.abs(h.s(n, k))));
            }
        }
        TestShapes.achieved("harmonics box C20 vs inertia closed form, relative error",
            Math.abs(h.cUnnormalised(2, 0) / c20 - 1));
        TestShapes.achieved("harmonics box C22 vs inertia closed form, relative error",
            Math.abs(h.cUnnormalised(2, 2) / c22 - 1));
        TestShapes.achieved("harmonics box odd-degree coefficients, largest |value|", worstOdd);
    }

    /**
     * All coefficients to degree 6 of an off-centre box about the model origin (so that odd, tesseral and sine terms
     * are non-zero) against an independent Gauss–Legendre product quadrature of the defining integral
     * C̄_nm, S̄_nm = ∫ r^n P̄_nm(sin φ)(cos mλ, sin mλ) dm / ((2n+1) M R^n) (shared references §5: the integrand is a
     * polynomial of degree n, so 8 points per axis integrate it exactly over the box), with P_nm from the
     * Abramowitz &amp; Stegun 8.5 recurrences without the Condon–Shortley phase.
     */
    @Test
    void offCentreBoxMatchesIndependentVolumeQuadrature() {
        double[] lo = {0.3, -0.4, 0.1};
        double[] hi = {2.3, 0.8, 0.8};
        TriangleMesh box = Shapes.box(lo[0], lo[1], lo[2], hi[0], hi[1], hi[2]);
        double[] origin = {0, 0, 0};
        double ref = 2.5;
        int p = 6;
        HarmonicCoefficients h = of(box, origin, ref, p, 1);
        GaussIntegrator[] g = new GaussIntegrator[3];
        for (int i = 0; i < 3; i++) {
            g[i] = new GaussIntegratorFactory().legendreHighPrecision(8, lo[i], hi[i]);
        }
        double vol = (hi[0] - lo[0]) * (hi[1] - lo[1]) * (hi[2] - lo[2]);
        double[][] qc = new double[p + 1][p + 1];
        double[][] qs = new double[p + 1][p + 1];
        for (int i = 0; i < 8; i++) {
            for (int j = 0; j < 8; j++) {
                for (int k = 0; k < 8; k++) {
                    double x = g[0].getPoint(i);
                    double y = g[1].getPoint(j);
                    double z = g[2].getPoint(k);
                    double w = g[0].getWeight(i) * g[1].getWeight(j) * g[2].getWeight(k);
                    double r = Math.sqrt(x * x + y * y + z * z);
                    double t = z / r;
                    double lon = Math.atan2(y, x);
                    for (int n = 0; n <= p; n++) {
                        for (int m = 0; m <= n; m++) {
                            double pb = HarmonicCoefficients.normalisation(n, m) * legendre(n, m, t);
                            double f = w * Math.pow(r, n) * pb / ((2 * n + 1) * vol * Math.pow(ref, n));
                            qc[n][m] += f * Math.cos(m * lon);
                            qs[n][m] += f * Math.sin(m * lon);
                        }
                    }
                }
            }
        }
        double worst = 0;
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                assertEquals(qc[n][m], h.c(n, m), EXACT, "C" + n + m);
                assertEquals(qs[n][m], h.s(n, m), EXACT, "S" + n + m);
                worst = Math.max(worst, Math.max(Math.abs(qc[n][m] - h.c(n, m)), Math.abs(qs[n][m] - h.s(n, m))));
            }
        }
        assertTrue(Math.abs(h.s(3, 1)) > 1e-3 && Math.abs(h.c(1, 1)) > 1e-2, "the check exercises non-zero terms");
        TestShapes.achieved("harmonics off-centre box to degree 6 vs Gauss-Legendre volume quadrature, max abs. "
            + "difference", worst);
    }

    /** P_nm(t) without the Condon–Shortley phase (Abramowitz &amp; Stegun 8.5.3, 8.6.6 with the phase removed). */
    private static double legendre(int n, int m, double t) {
        double s = Math.sqrt(Math.max(0, 1 - t * t));
        double pmm = 1;
        for (int k = 1; k <= m; k++) {
            pmm *= (2 * k - 1) * s;
        }
        if (n == m) {
            return pmm;
        }
        double p1 = (2 * m + 1) * t * pmm;
        double p0 = pmm;
        for (int l = m + 2; l <= n; l++) {
            double p2 = ((2 * l - 1) * t * p1 - (l + m - 1) * p0) / (l - m);
            p0 = p1;
            p1 = p2;
        }
        return p1;
    }

    /**
     * Cube about its centre with R = half-diagonal: C̄20 = C̄22 = 0, C̄40 = −7/810, C̄44 = √(5/7)·C̄40 (shared
     * references §3, values re-computed there).
     */
    @Test
    void cubeDegreeFourValues() {
        TriangleMesh cube = Shapes.box(-0.5, -0.5, -0.5, 0.5, 0.5, 0.5);
        double ref = Math.sqrt(3) / 2;
        HarmonicCoefficients h = of(cube, new double[3], ref, 4, 2);
        double c40 = -7.0 / 810;
        assertEquals(0, h.c(2, 0), EXACT);
        assertEquals(0, h.c(2, 2), EXACT);
        assertEquals(c40, h.c(4, 0), EXACT);
        assertEquals(Math.sqrt(5.0 / 7) * c40, h.c(4, 4), EXACT);
        assertEquals(ref, h.brillouinRadius(), EXACT);
        TestShapes.achieved("harmonics cube Cbar40 vs -7/810, abs. error", Math.abs(h.c(4, 0) - c40));
        TestShapes.achieved("harmonics cube Cbar44 vs sqrt(5/7) Cbar40, abs. error",
            Math.abs(h.c(4, 4) - Math.sqrt(5.0 / 7) * c40));
    }

    /**
     * Refined polyhedral ellipsoid 3, 2, 1 with R = 3 against the ellipsoid's closed forms (shared references §3:
     * C̄20 = −0.054659439450, C̄22 = 0.043033148291, C40 = 3.531746031746e-2, C42 = −2.425044091711e-3,
     * C44 = 1.377865961199e-4): the error of the inscribed polyhedron falls about fourfold per refinement (as h²) and
     * is below 1e-3 relative at 20,480 facets.
     */
    @Test
    void refinedEllipsoidConvergesToClosedForms() {
        double[] want = {-0.054659439450, 0.043033148291, 3.531746031746e-2, -2.425044091711e-3, 1.377865961199e-4};
        double[] prevErr = null;
        for (int level = 3; level <= 5; level++) {
            TriangleMesh e = Shapes.ellipsoid(level, 3, 2, 1);
            MassProperties mp = MassPropertiesCalculator.compute(e, RHO);
            HarmonicCoefficients h = of(e, mp.centerOfMass(), 3.0, 4, 2);
            double[] got = {h.c(2, 0), h.c(2, 2), h.cUnnormalised(4, 0), h.cUnnormalised(4, 2), h.cUnnormalised(4, 4)};
            double[] err = new double[want.length];
            for (int i = 0; i < want.length; i++) {
                err[i] = Math.abs(got[i] / want[i] - 1);
                if (prevErr != null) {
                    assertTrue(err[i] < 0.4 * prevErr[i], "level " + level + " term " + i + ": " + err[i]
                        + " not below 0.4 x " + prevErr[i]);
                }
            }
            if (level == 5) {
                for (int i = 0; i < want.length; i++) {
                    assertTrue(err[i] < 1e-3, "term " + i + " relative error " + err[i]);
                    TestShapes.achieved("harmonics ellipsoid 3,2,1 (20480 facets) term " + i + " relative error",
                        err[i]);
                }
            }
            prevErr = err;
        }
    }

    /** Results do not depend on the thread count (DEVELOPERS.md contract). */
    @Test
    void threadCountIndependent() {
        TriangleMesh body = TestShapes.lumpySphere(3, 0.2, 5);
        HarmonicCoefficients a = of(body, new double[] {0.01, 0.02, -0.03}, 1.3, 12, 1);
        HarmonicCoefficients b = of(body, new double[] {0.01, 0.02, -0.03}, 1.3, 12, 2);
        for (int n = 0; n <= 12; n++) {
            double[] ca = new double[n + 1];
            double[] cb = new double[n + 1];
            for (int m = 0; m <= n; m++) {
                ca[m] = a.c(n, m) + 1e3 * a.s(n, m);
                cb[m] = b.c(n, m) + 1e3 * b.s(n, m);
                assertEquals(Double.doubleToLongBits(a.c(n, m)), Double.doubleToLongBits(b.c(n, m)));
                assertEquals(Double.doubleToLongBits(a.s(n, m)), Double.doubleToLongBits(b.s(n, m)));
            }
            assertArrayEquals(ca, cb, 0);
        }
    }
}
