package dev.cairn.tables;

import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The stated accuracy of a table is an upper bound: fresh, independent points (other seeds, other sampling: uniform
 * over the table, and points placed at random heights above random surface points) never show a larger relative
 * error in any band of distance from the surface than the report states, for the tricubic Hermite reader, a
 * trilinear reader and the effective acceleration. Reference: the exact polyhedron field (Werner &amp; Scheeres 1997;
 * itself checked against the Nagy et al. 2000 prism in the gravity tests); exact distances point to mesh computed
 * here by brute force over all facets (Ericson 2005 closest point, via {@link SurfaceQuery#windingAndDistance}, not
 * the bucket grid the report uses). The body is a lumpy
 * test shape (320 facets), not the demo body.
 */
class TableAccuracyBoundTest {
    private static final double RHO = 2000;
    /** Fresh points of each kind (uniform over the table; just above the surface): 20,000 in all. */
    private static final int FRESH = 10_000;
    private static final double OMEGA = 2 * Math.PI / 15_000;

    private static TriangleMesh body() {
        return TestShapes.lumpySphere(2, 0.25, 21).transformed(TestShapes.rotation(1, 2, 3, 0.4), 600.0,
            new double[] {20, -10, 5});
    }

    @Test
    void boxTableBoundHoldsAtFreshPoints() {
        check(true);
    }

    @Test
    void shellTableBoundHoldsAtFreshPoints() {
        check(false);
    }

    private void check(boolean box) {
        TriangleMesh mesh = body();
        MassProperties mp = MassPropertiesCalculator.compute(mesh, RHO);
        FieldModel exact = new PolyhedronField(mesh, RHO);
        double[] com = mp.centerOfMass();
        double[] axis = {0, 0.6, 0.8};
        Grid grid = box ? BoxGrid.ofSpacing(new double[] {-1000, 1000, -900, 900, -800, 800}, new double[] {50, 50, 50})
            : new SphereGrid(com, SphereGrid.parseRadii("700:1500:50"), 5, 5);
        TableLayout layout = new TableLayout(grid, box, true, false, OMEGA, axis, com);
        Table table = TableBuilder.compute(exact, layout, 2, Map.of("gm_m3_s2", mp.gm()));
        SurfaceQuery surface = new SurfaceQuery(mesh);
        AccuracyCheck.BoundReport rep = AccuracyCheck.bound(table, exact, surface, AccuracyCheck.Spin.of(layout),
            AccuracyCheck.DEFAULT_RANDOM_POINTS, AccuracyCheck.DEFAULT_RANDOM_PER_CELL, 1, 2, ProgressListener.NONE);
        // Fresh points: uniform over the table (another seed) and at random heights 0–3 cell sizes above random
        // surface points (area-weighted facets), kept where they fall inside the table.
        double[] uniform = AccuracyCheck.samplePoints(grid, FRESH, 987_654);
        double[] nearSurface = abovePoints(mesh, box ? 50 : 130, FRESH, 4242);
        List<AccuracyCheck.Interpolant> ints = rep.interpolants();
        FieldModel[] readers = {new TableField(table), new TrilinearField(table, TableLayout.U),
            new TableField(AccuracyCheck.effectiveTable(table, AccuracyCheck.Spin.of(layout))),
            new TrilinearField(table, table.column("eff_potential_m2_s2"))};
        AccuracyCheck.CellGeometry cells = new AccuracyCheck.CellGeometry(grid);
        for (int m = 0; m < readers.length; m++) {
            double[] fresh = new double[AccuracyCheck.BAND_EDGES.length - 1];
            int[] counts = new int[fresh.length];
            for (double[] pts : new double[][] {uniform, nearSurface}) {
                measure(readers[m], m >= 2, exact, mesh, pts, cells, layout, fresh, counts, new TableField(table));
            }
            AccuracyCheck.Interpolant in = ints.get(m);
            for (int b = 0; b < fresh.length; b++) {
                AccuracyCheck.Band band = in.bands().get(b);
                String what = (box ? "box" : "shell") + " table, " + in.interpolation() + " " + in.quantity() + ", band "
                    + AccuracyCheck.BAND_EDGES[b] + "-" + AccuracyCheck.BAND_EDGES[b + 1];
                TestShapes.achieved(what + ": fresh max / stated bound", fresh[b] / band.bound());
                System.out.printf("%s: stated %.3e (measured in report %.3e, %d pts), fresh max %.3e (%d pts), ratio "
                        + "fresh/report-max %.2f%n", what, band.bound(), band.stats().count() > 0 ? band.stats().max()
                        : Double.NaN, band.stats().count(), fresh[b], counts[b],
                    fresh[b] / band.stats().max());
                if (counts[b] > 0) {
                    assertTrue(band.stats().count() > 0, what + ": fresh points in a band the report has none in");
                    assertTrue(fresh[b] <= band.bound(), what + ": fresh maximum " + fresh[b] + " above the stated "
                        + band.bound());
                }
            }
        }
    }

    /** Points at heights uniform in (0, hmax) along the facet normal above uniform random surface points. */
    static double[] abovePoints(TriangleMesh mesh, double hmax, int n, long seed) {
        double[] v = mesh.xyz();
        int[] t = mesh.tri();
        int f = mesh.facetCount();
        double[] cum = new double[f];
        double[] nrm = mesh.facetNormals();
        double total = 0;
        for (int i = 0; i < f; i++) {
            total += area(v, t, i);
            cum[i] = total;
        }
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] p = new double[3 * n];
        for (int k = 0; k < n; k++) {
            double u = rnd.nextDouble() * total;
            int i = java.util.Arrays.binarySearch(cum, u);
            i = i < 0 ? Math.min(f - 1, -i - 1) : i;
            double a = rnd.nextDouble();
            double b = rnd.nextDouble();
            if (a + b > 1) {
                a = 1 - a;
                b = 1 - b;
            }
            double h = hmax * rnd.nextDouble();
            for (int d = 0; d < 3; d++) {
                double p0 = v[3 * t[3 * i] + d];
                double p1 = v[3 * t[3 * i + 1] + d];
                double p2 = v[3 * t[3 * i + 2] + d];
                p[3 * k + d] = p0 + a * (p1 - p0) + b * (p2 - p0) + h * nrm[3 * i + d];
            }
        }
        return p;
    }

    private static double area(double[] v, int[] t, int i) {
        double[] e1 = new double[3];
        double[] e2 = new double[3];
        for (int d = 0; d < 3; d++) {
            e1[d] = v[3 * t[3 * i + 1] + d] - v[3 * t[3 * i] + d];
            e2[d] = v[3 * t[3 * i + 2] + d] - v[3 * t[3 * i] + d];
        }
        double cx = e1[1] * e2[2] - e1[2] * e2[1];
        double cy = e1[2] * e2[0] - e1[0] * e2[2];
        double cz = e1[0] * e2[1] - e1[1] * e2[0];
        return 0.5 * Math.sqrt(cx * cx + cy * cy + cz * cz);
    }

    /** Largest relative error per band at the points inside the table and outside the body. */
    private static void measure(FieldModel reader, boolean effective, FieldModel exact, TriangleMesh mesh, double[] pts,
                                AccuracyCheck.CellGeometry cells, TableLayout layout, double[] max, int[] counts,
                                TableField region) {
        FieldEvaluator r = reader.newEvaluator();
        SurfaceQuery brute = new SurfaceQuery(mesh);
        double[] wd = new double[2];
        FieldEvaluator e = exact.newEvaluator();
        double[] a = new double[FieldSample.SIZE];
        double[] b = new double[FieldSample.SIZE];
        double w2 = layout.omega() * layout.omega();
        double[] ax = layout.spinAxis();
        double[] com = layout.centreOfMass();
        for (int i = 0; i < pts.length / 3; i++) {
            double x = pts[3 * i];
            double y = pts[3 * i + 1];
            double z = pts[3 * i + 2];
            if (!region.contains(x, y, z)) {
                continue;
            }
            brute.windingAndDistance(x, y, z, wd);
            double d = wd[1];
            e.evaluate(x, y, z, false, a, 0);
            if (a[FieldSample.LOCATION] != dev.cairn.gravity.Location.OUTSIDE.code()) {
                continue; // inside the body or on it (exact solid-angle test of the field model)
            }
            double hcell = cells.size(cells.cellOf(x, y, z));
            double rx = x - com[0];
            double ry = y - com[1];
            double rz = z - com[2];
            double along = rx * ax[0] + ry * ax[1] + rz * ax[2];
            double gx = a[FieldSample.AX] + (effective ? w2 * (rx - along * ax[0]) : 0);
            double gy = a[FieldSample.AY] + (effective ? w2 * (ry - along * ax[1]) : 0);
            double gz = a[FieldSample.AZ] + (effective ? w2 * (rz - along * ax[2]) : 0);
            r.evaluate(x, y, z, false, b, 0);
            double dx = b[FieldSample.AX] - gx;
            double dy = b[FieldSample.AY] - gy;
            double dz = b[FieldSample.AZ] - gz;
            // Relative to |g| for both quantities (as the report states it).
            double err = Math.sqrt(dx * dx + dy * dy + dz * dz) / FieldSample.accelerationNorm(a, 0);
            double s = d / hcell;
            for (int k = 0; k + 1 < AccuracyCheck.BAND_EDGES.length; k++) {
                if (s >= AccuracyCheck.BAND_EDGES[k] && s < AccuracyCheck.BAND_EDGES[k + 1]) {
                    max[k] = Math.max(max[k], err);
                    counts[k]++;
                }
            }
        }
    }
}
