package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The solid-harmonic machinery against its definitions: the Laplace expansion of 1/|x − y| (Legendre's addition
 * theorem, e.g. Jackson, J.D. (1999) Classical Electrodynamics, 3rd ed., eq. 3.70), the multipole translation
 * (Greengard &amp; Rokhlin 1987, J. Comput. Phys. 73:325, translation of multipole expansions), the derivative
 * relations (checked against central differences) and the triangle rule's exactness (monomial integrals over the
 * reference triangle, ∫ x^a y^b = a! b!/(a+b+2)!, a standard result).
 */
class SolidHarmonicsTest {
    private static final int P = 14;
    private static final double EXPANSION_TOL = 1e-13;

    /** φ(x) from an expansion M (degree ≤ p) at separation d, scale a. */
    static double evaluate(double[] mRe, double[] mIm, int p, double a, double dx, double dy, double dz) {
        double r2 = dx * dx + dy * dy + dz * dz;
        double[] jr = new double[SolidHarmonics.size(p)];
        double[] ji = new double[SolidHarmonics.size(p)];
        SolidHarmonics.irregularScaled(a * dx / r2, a * dy / r2, a * dz / r2, a * a / r2, p, jr, ji);
        double s = 0;
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                int k = SolidHarmonics.index(n, m);
                double t = mRe[k] * jr[k] - mIm[k] * ji[k];
                s += m == 0 ? t : 2 * t;
            }
        }
        return s / Math.sqrt(r2);
    }

    /** Moments of unit point sources at ys about c with scale a. */
    static void pointMoments(double[][] ys, double[] c, double a, int p, double[] re, double[] im) {
        double[] tr = new double[SolidHarmonics.size(p)];
        double[] ti = new double[SolidHarmonics.size(p)];
        for (double[] y : ys) {
            SolidHarmonics.regular((y[0] - c[0]) / a, (y[1] - c[1]) / a, (y[2] - c[2]) / a, p, tr, ti);
            for (int k = 0; k < tr.length; k++) {
                re[k] += tr[k];
                im[k] -= ti[k];
            }
        }
    }

    @Test
    void expansionOfInverseDistanceConvergesToTheKernel() {
        SplittableRandom rnd = new SplittableRandom(5);
        double[][] ys = new double[6][3];
        for (double[] y : ys) {
            for (int i = 0; i < 3; i++) {
                y[i] = 0.5 * (2 * rnd.nextDouble() - 1);
            }
        }
        double[] c = {0, 0, 0};
        int p = 40;
        double[] re = new double[SolidHarmonics.size(p)];
        double[] im = new double[SolidHarmonics.size(p)];
        pointMoments(ys, c, 1.0, p, re, im);
        double[] x = {2.1, -1.3, 1.7};
        double exact = 0;
        for (double[] y : ys) {
            exact += 1 / Math.sqrt(sq(x[0] - y[0]) + sq(x[1] - y[1]) + sq(x[2] - y[2]));
        }
        double got = evaluate(re, im, p, 1.0, x[0], x[1], x[2]);
        assertEquals(exact, got, EXPANSION_TOL * exact);
    }

    @Test
    void translatedMomentsEqualMomentsComputedAboutTheNewCentre() {
        SplittableRandom rnd = new SplittableRandom(9);
        double[][] ys = new double[5][3];
        for (double[] y : ys) {
            for (int i = 0; i < 3; i++) {
                y[i] = 0.3 + 0.4 * rnd.nextDouble();
            }
        }
        double[] c = {0.5, 0.5, 0.5};
        double[] c2 = {0.1, -0.2, 0.35};
        double ac = 0.4;
        double ap = 1.1;
        int n = SolidHarmonics.size(P);
        double[] re = new double[n];
        double[] im = new double[n];
        pointMoments(ys, c, ac, P, re, im);
        double[] direct = new double[n];
        double[] directIm = new double[n];
        pointMoments(ys, c2, ap, P, direct, directIm);
        double[] shifted = new double[n];
        double[] shiftedIm = new double[n];
        SolidHarmonics.translateMultipole(re, 0, im, 0, ac, shifted, 0, shiftedIm, 0, ap, (c[0] - c2[0]) / ap,
            (c[1] - c2[1]) / ap, (c[2] - c2[2]) / ap, P, new double[n], new double[n], new double[P + 1]);
        for (int k = 0; k < n; k++) {
            assertEquals(direct[k], shifted[k], 1e-13 * (1 + Math.abs(direct[k])), "re " + k);
            assertEquals(directIm[k], shiftedIm[k], 1e-13 * (1 + Math.abs(directIm[k])), "im " + k);
        }
    }

    @Test
    void derivativeCoefficientsMatchCentralDifferences() {
        SplittableRandom rnd = new SplittableRandom(3);
        double[][] ys = new double[4][3];
        for (double[] y : ys) {
            for (int i = 0; i < 3; i++) {
                y[i] = 0.3 * (2 * rnd.nextDouble() - 1);
            }
        }
        int p = 10;
        double a = 0.5;
        double[] re = new double[SolidHarmonics.size(p)];
        double[] im = new double[SolidHarmonics.size(p)];
        pointMoments(ys, new double[3], a, p, re, im);
        double[] x = {1.9, 1.2, -1.4};
        double h = 1e-5;
        for (int axis = 0; axis < 3; axis++) {
            double[] dr = new double[SolidHarmonics.size(p + 1)];
            double[] di = new double[SolidHarmonics.size(p + 1)];
            SolidHarmonics.derivative(axis, re, im, p, dr, di);
            double analytic = evaluate(dr, di, p + 1, a, x[0], x[1], x[2]) / a;
            double[] xp = x.clone();
            double[] xm = x.clone();
            xp[axis] += h;
            xm[axis] -= h;
            double fd = (evaluate(re, im, p, a, xp[0], xp[1], xp[2]) - evaluate(re, im, p, a, xm[0], xm[1], xm[2]))
                / (2 * h);
            assertEquals(fd, analytic, 1e-8 * Math.abs(fd) + 1e-10, "axis " + axis);
        }
    }

    @Test
    void triangleRuleIsExactForMonomialsUpToItsDegree() {
        for (int deg : new int[] {0, 3, 8, 15, 20}) {
            TriangleQuadrature q = new TriangleQuadrature(deg);
            for (int a = 0; a <= deg; a++) {
                int b = deg - a;
                double s = 0;
                for (int i = 0; i < q.size(); i++) {
                    s += q.weight(i) * Math.pow(q.l2(i), a) * Math.pow(q.l3(i), b);
                }
                // mean over the reference triangle (area 1/2): 2 a! b!/(a+b+2)!
                double exact = 2 * fact(a) * fact(b) / fact(a + b + 2);
                assertEquals(exact, s, 1e-14 * exact, "degree " + deg + " monomial " + a + "," + b);
            }
        }
        assertTrue(new TriangleQuadrature(10).size() > 0);
    }

    private static double fact(int n) {
        double f = 1;
        for (int i = 2; i <= n; i++) {
            f *= i;
        }
        return f;
    }

    private static double sq(double v) {
        return v * v;
    }
}
