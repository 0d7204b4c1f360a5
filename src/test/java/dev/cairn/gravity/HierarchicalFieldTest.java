package dev.cairn.gravity;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.util.HashMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The hierarchical field against the exact Werner–Scheeres direct sum and against outside references:
 * <ul>
 * <li>a single facet's multipole expansion against S_f = ∫ dS/|x − x'| (the layer-potential form of shared references
 *     §10, here integrated directly by a degree-40 triangle rule far from the facet): the error falls geometrically
 *     with the degree (Greengard &amp; Rokhlin 1987, J. Comput. Phys. 73:325, the (a/r)^{p+1} truncation bound);</li>
 * <li>random lumpy bodies at random points inside, outside, on the surface and next to edges, for several
 *     tolerances: the relative errors of |g| and U stay within the stated tolerance, and the location is the same
 *     as the direct sum's;</li>
 * <li>the closed-form prism (Nagy, Papp &amp; Benedek 2000, J. Geodesy 74:552; values of shared references §2) for a
 *     finely triangulated unit cube at tolerance 1e-12;</li>
 * <li>Poisson's equation inside (∇²U = −4πGρ) and central differences of g against the gradient tensor;</li>
 * <li>U &gt; 0 everywhere outside, and bit-identical results for 1 and 2 threads.</li>
 * </ul>
 */
class HierarchicalFieldTest {
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1

    @Test
    void singleFacetExpansionErrorFallsGeometricallyWithDegree() {
        double[] a = {0.1, -0.2, 0.05};
        double[] b = {0.9, 0.1, -0.1};
        double[] c = {0.2, 0.7, 0.15};
        double[] ctr = {(a[0] + b[0] + c[0]) / 3, (a[1] + b[1] + c[1]) / 3, (a[2] + b[2] + c[2]) / 3};
        double rad = 0;
        for (double[] v : new double[][] {a, b, c}) {
            rad = Math.max(rad, Math.sqrt(sq(v[0] - ctr[0]) + sq(v[1] - ctr[1]) + sq(v[2] - ctr[2])));
        }
        double area = 0.5 * norm(cross(sub(b, a), sub(c, a)));
        double[] dir = {0.36, -0.48, 0.8};
        for (double ratio : new double[] {3, 6}) {
            double[] x = {ctr[0] + ratio * rad * dir[0], ctr[1] + ratio * rad * dir[1], ctr[2] + ratio * rad * dir[2]};
            double exact = directS(a, b, c, x, area);
            double previous = Double.POSITIVE_INFINITY;
            for (int p = 2; p <= 14; p += 3) {
                int size = SolidHarmonics.size(p);
                double[] re = new double[size];
                double[] im = new double[size];
                TriangleQuadrature rule = new TriangleQuadrature(p);
                double[] tr = new double[size];
                double[] ti = new double[size];
                for (int q = 0; q < rule.size(); q++) {
                    double[] y = bary(a, b, c, rule.l1(q), rule.l2(q), rule.l3(q));
                    SolidHarmonics.regular((y[0] - ctr[0]) / rad, (y[1] - ctr[1]) / rad, (y[2] - ctr[2]) / rad, p, tr,
                        ti);
                    for (int k = 0; k < size; k++) {
                        re[k] += rule.weight(q) * area * tr[k];
                        im[k] -= rule.weight(q) * area * ti[k];
                    }
                }
                double got = SolidHarmonicsTest.evaluate(re, im, p, rad, x[0] - ctr[0], x[1] - ctr[1], x[2] - ctr[2]);
                double err = Math.abs(got - exact) / exact;
                // truncation bound (a/r)^{p+1}/(1 − a/r) relative to area/r ≈ S_f
                double bound = Math.pow(1 / ratio, p + 1) / (1 - 1 / ratio) * (area / (ratio * rad)) / exact;
                assertTrue(err <= bound + 1e-15, "ratio " + ratio + " degree " + p + ": " + err + " > " + bound);
                assertTrue(err < previous || err < 1e-15, "no geometric decrease at degree " + p);
                previous = err;
            }
        }
    }

    @Test
    void lumpyBodiesWithinToleranceEverywhere() {
        for (long seed : new long[] {3, 8}) {
            TriangleMesh m = TestShapes.lumpySphere(4, 0.3, seed);
            PolyhedronField exact = new PolyhedronField(m, RHO);
            double[] pts = probePoints(m, 480, seed);
            double[] ref = BatchEvaluation.evaluate(exact, pts, false, 2, ProgressListener.NONE);
            for (double tol : new double[] {1e-6, 1e-9, 1e-12}) {
                HierarchicalField h = new HierarchicalField(m, exact, tol, 2);
                double[] got = BatchEvaluation.evaluate(h, pts, false, 2, ProgressListener.NONE);
                double worstG = 0;
                double worstU = 0;
                for (int i = 0; i < pts.length / 3; i++) {
                    int o = i * FieldSample.SIZE;
                    double gn = FieldSample.accelerationNorm(ref, o);
                    double dg = Math.sqrt(sq(got[o + 1] - ref[o + 1]) + sq(got[o + 2] - ref[o + 2])
                        + sq(got[o + 3] - ref[o + 3]));
                    worstG = Math.max(worstG, dg / gn);
                    worstU = Math.max(worstU, Math.abs(got[o] - ref[o]) / ref[o]);
                    assertEquals(ref[o + FieldSample.LOCATION], got[o + FieldSample.LOCATION],
                        "location at point " + i + " (seed " + seed + ", tolerance " + tol + ")");
                }
                TestShapes.achieved("hierarchical field, lumpy body seed " + seed + ", tolerance " + tol
                    + ": max rel. error |g|", worstG);
                TestShapes.achieved("hierarchical field, lumpy body seed " + seed + ", tolerance " + tol
                    + ": max rel. error U", worstU);
                assertTrue(worstG <= tol, "|g| error " + worstG + " above tolerance " + tol);
                assertTrue(worstU <= tol, "U error " + worstU + " above tolerance " + tol);
            }
        }
    }

    @Test
    void finelyTriangulatedUnitCubeMatchesThePrismClosedForm() {
        TriangleMesh cube = subdivide(Shapes.unitCube(), 5); // 12,288 facets
        HierarchicalField h = new HierarchicalField(cube, RHO, 1e-12, 2);
        assertTrue(h.tree().nodeCount() > 100, "the test must exercise the tree");
        FieldEvaluator ev = h.newEvaluator();
        double[] s = new double[FieldSample.SIZE];
        // shared references §2, Gρ = 1 [V]
        double[][] cases = {
            {0.5, 0.5, 0.5, 2.380077363979554, 0, 0, 0},
            {0.2, 0.3, 0.4, 2.091891625243910, 1.275395167441784, 0.745680592519306, 0.345922139094193},
            {2, 0.3, -0.7, 0.517880541626438, -0.208602877535082, 0.027610977640465, 0.166517539001699},
            {0.5, 0.5, 1, 1.792810243178775, 0, 0, -2.596896578258365},
            {0.5, 0, 0, 1.427260179700358, 0, 1.551694097314306, 1.551694097314306}};
        for (double[] c : cases) {
            ev.evaluate(c[0], c[1], c[2], false, s, 0);
            assertEquals(c[3], s[FieldSample.U], 1e-11 * c[3], "U at " + c[0] + "," + c[1] + "," + c[2]);
            double gn = Math.max(1, Math.sqrt(c[4] * c[4] + c[5] * c[5] + c[6] * c[6]));
            for (int k = 0; k < 3; k++) {
                assertEquals(c[4 + k], s[FieldSample.AX + k], 1e-11 * gn, "g at " + c[0] + "," + c[1] + "," + c[2]);
            }
        }
        ev.evaluate(0.5, 0.5, 0.5, false, s, 0);
        assertEquals(-4 * Math.PI, s[FieldSample.LAPLACIAN], 1e-12 * 4 * Math.PI, "Poisson at the centre");
    }

    @Test
    void gradientTensorMatchesCentralDifferencesAndLaplacianIsPoisson() {
        TriangleMesh m = TestShapes.lumpySphere(4, 0.25, 5);
        HierarchicalField h = new HierarchicalField(m, RHO, 1e-12, 2);
        FieldEvaluator ev = h.newEvaluator();
        double[] s = new double[FieldSample.SIZE];
        double[] sp = new double[FieldSample.SIZE];
        double[] sm = new double[FieldSample.SIZE];
        double[][] pts = {{0.1, 0.05, -0.02}, {1.6, 0.4, -0.3}, {0.2, 1.3, 0.7}, {-0.3, -0.2, 0.1}};
        double step = 1e-5;
        for (double[] x : pts) {
            ev.evaluate(x[0], x[1], x[2], true, s, 0);
            double tn = 0;
            for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                tn = Math.max(tn, Math.abs(s[k]));
            }
            int[][] idx = {{FieldSample.GXX, FieldSample.GXY, FieldSample.GXZ},
                {FieldSample.GXY, FieldSample.GYY, FieldSample.GYZ}, {FieldSample.GXZ, FieldSample.GYZ, FieldSample.GZZ}};
            for (int j = 0; j < 3; j++) {
                double[] xp = x.clone();
                double[] xm = x.clone();
                xp[j] += step;
                xm[j] -= step;
                ev.evaluate(xp[0], xp[1], xp[2], false, sp, 0);
                ev.evaluate(xm[0], xm[1], xm[2], false, sm, 0);
                for (int i = 0; i < 3; i++) {
                    double fd = (sp[FieldSample.AX + i] - sm[FieldSample.AX + i]) / (2 * step);
                    assertEquals(fd, s[idx[i][j]], 1e-7 * tn, "d g_" + i + "/d x_" + j + " at " + x[0]);
                }
            }
            boolean inside = Location.fromCode(s[FieldSample.LOCATION]) == Location.INSIDE;
            double trace = s[FieldSample.GXX] + s[FieldSample.GYY] + s[FieldSample.GZZ];
            assertEquals(inside ? -4 * Math.PI : 0, s[FieldSample.LAPLACIAN], 1e-12 * 4 * Math.PI);
            assertEquals(inside ? -4 * Math.PI : 0, trace, 1e-9 * 4 * Math.PI, "trace of the tensor (Poisson)");
        }
    }

    @Test
    void farFieldAgreesWithTheIndependentlyIntegratedExteriorExpansion() {
        // Two independent routes to the exterior field: the tree's moments translated to its root (exact
        // multipole translation) and the exact model's expansion from a degree-20 triangle rule over every facet
        // (cone formula, BodyExpansion). Beyond 8 Brillouin radii both are exact to rounding.
        TriangleMesh m = TestShapes.lumpySphere(4, 0.3, 3);
        PolyhedronField exact = new PolyhedronField(m, RHO);
        HierarchicalField h = new HierarchicalField(m, exact, 1e-12, 2);
        FieldEvaluator he = h.newEvaluator();
        FieldEvaluator ee = exact.newEvaluator();
        double[] a = new double[FieldSample.SIZE];
        double[] b = new double[FieldSample.SIZE];
        double rb = exact.expansion().brillouinRadius();
        double[] d = {0.48, 0.6, 0.64};
        double worst = 0;
        for (double k = 10; k <= 1e9; k *= 10) {
            double r = k * rb;
            he.evaluate(r * d[0], r * d[1], r * d[2], true, a, 0);
            ee.evaluate(r * d[0], r * d[1], r * d[2], true, b, 0);
            double gn = FieldSample.accelerationNorm(b, 0);
            double dg = Math.sqrt(sq(a[1] - b[1]) + sq(a[2] - b[2]) + sq(a[3] - b[3])) / gn;
            double du = Math.abs(a[0] - b[0]) / b[0];
            worst = Math.max(worst, Math.max(dg, du));
            assertTrue(dg <= 1e-14 && du <= 1e-14, "at " + k + " R_B: |g| " + dg + ", U " + du);
            assertTrue(a[0] > 0 && b[0] > 0);
        }
        TestShapes.achieved("two exterior expansions, 10 to 1e9 R_B: max rel. difference", worst);
    }

    @Test
    void potentialPositiveOutsideAndResultsIndependentOfThreadCount() {
        TriangleMesh m = TestShapes.lumpySphere(4, 0.3, 21);
        HierarchicalField h = new HierarchicalField(m, RHO, 1e-10, 2);
        SplittableRandom rnd = new SplittableRandom(4);
        int n = 600;
        double[] pts = new double[3 * n];
        for (int i = 0; i < n; i++) {
            double r = 1.3 * Math.pow(10, 12 * rnd.nextDouble()); // 1.3 to 1.3e12 body radii
            double z = 2 * rnd.nextDouble() - 1;
            double ph = 2 * Math.PI * rnd.nextDouble();
            double sn = Math.sqrt(1 - z * z);
            pts[3 * i] = r * sn * Math.cos(ph);
            pts[3 * i + 1] = r * sn * Math.sin(ph);
            pts[3 * i + 2] = r * z;
        }
        double[] one = BatchEvaluation.evaluate(h, pts, true, 1, ProgressListener.NONE);
        double[] two = BatchEvaluation.evaluate(h, pts, true, 2, ProgressListener.NONE);
        for (int i = 0; i < one.length; i++) {
            assertEquals(Double.doubleToRawLongBits(one[i]), Double.doubleToRawLongBits(two[i]), "slot " + i);
        }
        for (int i = 0; i < n; i++) {
            assertTrue(one[i * FieldSample.SIZE + FieldSample.U] > 0, "U > 0 outside at point " + i);
        }
    }

    /** Points on facet centroids, next to edges, inside, just outside and far outside the body. */
    static double[] probePoints(TriangleMesh m, int n, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] xyz = m.xyz();
        int[] tri = m.tri();
        double[] pts = new double[3 * n];
        for (int i = 0; i < n; i++) {
            int f = rnd.nextInt(m.facetCount());
            double[] a = vertex(xyz, tri[3 * f]);
            double[] b = vertex(xyz, tri[3 * f + 1]);
            double[] c = vertex(xyz, tri[3 * f + 2]);
            double[] p;
            switch (i % 5) {
                case 0: // centroid (on the surface)
                    p = bary(a, b, c, 1.0 / 3, 1.0 / 3, 1.0 / 3);
                    break;
                case 1: { // a hair off an edge midpoint, along the facet normal
                    double[] nrm = cross(sub(b, a), sub(c, a));
                    double l = norm(nrm);
                    double off = (rnd.nextBoolean() ? 1 : -1) * 1e-7;
                    p = bary(a, b, c, 0.5, 0.5, 0);
                    for (int k = 0; k < 3; k++) {
                        p[k] += off * nrm[k] / l;
                    }
                    break;
                }
                case 2: // inside: a fraction of the way to the centre
                    p = bary(a, b, c, 1.0 / 3, 1.0 / 3, 1.0 / 3);
                    double s = 0.1 + 0.7 * rnd.nextDouble();
                    for (int k = 0; k < 3; k++) {
                        p[k] *= s;
                    }
                    break;
                case 3: // just outside
                    p = bary(a, b, c, 1.0 / 3, 1.0 / 3, 1.0 / 3);
                    double t = 1.02 + 0.3 * rnd.nextDouble();
                    for (int k = 0; k < 3; k++) {
                        p[k] *= t;
                    }
                    break;
                default: // farther outside, up to 4 body radii (beyond, the direct sum's own round-off grows as
                    // r² and reaches ~1e-12 at 6-8 radii: the far range is checked against the exterior expansions)
                    p = bary(a, b, c, 1.0 / 3, 1.0 / 3, 1.0 / 3);
                    double u = 1.5 + 2.5 * rnd.nextDouble();
                    for (int k = 0; k < 3; k++) {
                        p[k] *= u;
                    }
            }
            System.arraycopy(p, 0, pts, 3 * i, 3);
        }
        return pts;
    }

    /** Midpoint subdivision, {@code levels} times: planar faces stay planar (the same solid, more facets). */
    static TriangleMesh subdivide(TriangleMesh m, int levels) {
        double[] xyz = m.xyz();
        int[] tri = m.tri();
        for (int l = 0; l < levels; l++) {
            int nv = xyz.length / 3;
            Map<Long, Integer> mid = new HashMap<>();
            double[] nx = java.util.Arrays.copyOf(xyz, xyz.length + 3 * (tri.length)); // enough room
            int next = nv;
            int[] nt = new int[4 * tri.length];
            int q = 0;
            for (int f = 0; f < tri.length / 3; f++) {
                int a = tri[3 * f];
                int b = tri[3 * f + 1];
                int c = tri[3 * f + 2];
                int[] abc = {a, b, c};
                int[] m3 = new int[3];
                for (int k = 0; k < 3; k++) {
                    int i = abc[k];
                    int j = abc[(k + 1) % 3];
                    long key = Math.min(i, j) * (long) Integer.MAX_VALUE + Math.max(i, j);
                    Integer id = mid.get(key);
                    if (id == null) {
                        id = next++;
                        for (int d = 0; d < 3; d++) {
                            nx[3 * id + d] = 0.5 * (xyz[3 * i + d] + xyz[3 * j + d]);
                        }
                        mid.put(key, id);
                    }
                    m3[k] = id;
                }
                int[][] kids = {{a, m3[0], m3[2]}, {m3[0], b, m3[1]}, {m3[2], m3[1], c}, {m3[0], m3[1], m3[2]}};
                for (int[] t : kids) {
                    nt[q++] = t[0];
                    nt[q++] = t[1];
                    nt[q++] = t[2];
                }
            }
            xyz = java.util.Arrays.copyOf(nx, 3 * next);
            tri = nt;
        }
        return new TriangleMesh(xyz, tri);
    }

    /** S_f by a degree-40 triangle rule (the integrand is smooth far from the facet). */
    private static double directS(double[] a, double[] b, double[] c, double[] x, double area) {
        TriangleQuadrature rule = new TriangleQuadrature(40);
        double s = 0;
        for (int q = 0; q < rule.size(); q++) {
            double[] y = bary(a, b, c, rule.l1(q), rule.l2(q), rule.l3(q));
            s += rule.weight(q) / Math.sqrt(sq(x[0] - y[0]) + sq(x[1] - y[1]) + sq(x[2] - y[2]));
        }
        return s * area;
    }

    private static double[] vertex(double[] xyz, int i) {
        return new double[] {xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2]};
    }

    private static double[] bary(double[] a, double[] b, double[] c, double l1, double l2, double l3) {
        return new double[] {l1 * a[0] + l2 * b[0] + l3 * c[0], l1 * a[1] + l2 * b[1] + l3 * c[1],
            l1 * a[2] + l2 * b[2] + l3 * c[2]};
    }

    private static double[] sub(double[] p, double[] q) {
        return new double[] {p[0] - q[0], p[1] - q[1], p[2] - q[2]};
    }

    private static double[] cross(double[] u, double[] v) {
        return new double[] {u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]};
    }

    private static double norm(double[] v) {
        return Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
    }

    private static double sq(double v) {
        return v * v;
    }
}
