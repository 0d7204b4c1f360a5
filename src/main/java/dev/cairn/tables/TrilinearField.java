package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;

/**
 * What a simple table reader computes: trilinear interpolation of four consecutive value columns (potential and the
 * three acceleration components, or their effective counterparts) in the cell holding the point, in grid coordinates
 * (x, y, z for a box; radius, latitude, longitude for a sphere table, longitude periodic). The cell of a point and
 * its local coordinates are those {@link TableField} uses, so the two readers differ only in the interpolant.
 * Trilinear interpolation: e.g. Press, W.H. et al. (2007) Numerical Recipes, 3rd ed., §3.6 (bilinear, extended to
 * three dimensions). Used by the accuracy report to state the error a reader without Hermite data would see; the
 * gradient slots are NaN, the location is that of the cell's first corner when all corners agree, else NaN.
 * Outside the table it refuses with an {@link OutsideTableException}.
 */
public final class TrilinearField implements FieldModel {
    private final Table table;
    private final int first;
    private final boolean spherical;
    private final double[][] c = new double[3][];
    private final boolean[] periodic = new boolean[3];
    private final double[] centre;
    private final int n1;
    private final int n2;

    /**
     * @param table a box or sphere table
     * @param first index of the potential column; the acceleration follows in the next three columns
     */
    public TrilinearField(Table table, int first) {
        this.table = table;
        this.first = first;
        Grid g = table.grid();
        if (g instanceof BoxGrid b) {
            spherical = false;
            centre = new double[3];
            for (int a = 0; a < 3; a++) {
                c[a] = new double[b.counts()[a]];
                for (int i = 0; i < c[a].length; i++) {
                    c[a][i] = b.coordinate(a, i);
                }
            }
        } else if (g instanceof SphereGrid s) {
            spherical = true;
            centre = s.centre();
            if (s.radii().length < 2) {
                throw new IllegalArgumentException("a spherical table with one radius cannot be interpolated in 3-D");
            }
            c[0] = s.radii().clone();
            c[1] = new double[s.latCount()];
            for (int j = 0; j < c[1].length; j++) {
                c[1][j] = s.latitude(j);
            }
            c[2] = new double[s.lonCount()];
            for (int k = 0; k < c[2].length; k++) {
                c[2][k] = s.longitude(k);
            }
            periodic[2] = true;
        } else {
            throw new IllegalArgumentException("a point table is not a grid and cannot be interpolated");
        }
        n1 = c[1].length;
        n2 = c[2].length;
    }

    @Override
    public double gm() {
        Object gmObj = table.metadata().get("gm_m3_s2");
        return gmObj instanceof Number num ? num.doubleValue() : Double.NaN;
    }

    @Override
    public String describe() {
        return "trilinear reader of a " + table.grid().kind() + " table";
    }

    @Override
    public FieldEvaluator newEvaluator() {
        return new FieldEvaluator() {
            private final int[] idx = new int[3];
            private final double[] s = new double[3];
            private final double[] p = new double[3];
            private final double[] acc = new double[4];

            @Override
            public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o) {
                double u = x;
                double v = y;
                double w = z;
                if (spherical) {
                    double dx = x - centre[0];
                    double dy = y - centre[1];
                    double dz = z - centre[2];
                    u = Math.sqrt(dx * dx + dy * dy + dz * dz);
                    v = Math.atan2(dz, Math.sqrt(dx * dx + dy * dy));
                    w = Math.atan2(dy, dx);
                    if (w < 0) {
                        w += 2 * Math.PI;
                    }
                    v = Math.max(c[1][0], Math.min(c[1][n1 - 1], v));
                }
                p[0] = u;
                p[1] = v;
                p[2] = w;
                for (int a = 0; a < 3; a++) {
                    if (!locate(a, p[a])) {
                        throw new OutsideTableException(String.format(java.util.Locale.ROOT,
                            "point (%.6g, %.6g, %.6g) m is outside the table", x, y, z));
                    }
                }
                int cols = table.columnCount();
                double[] vals = table.values();
                java.util.Arrays.fill(acc, 0);
                double loc = Double.NaN;
                boolean same = true;
                for (int corner = 0; corner < 8; corner++) {
                    int a = corner >> 2;
                    int b = (corner >> 1) & 1;
                    int cc = corner & 1;
                    int k = idx[2] + cc;
                    if (periodic[2]) {
                        k %= n2;
                    }
                    int node = ((idx[0] + a) * n1 + idx[1] + b) * n2 + k;
                    double wt = (a == 0 ? 1 - s[0] : s[0]) * (b == 0 ? 1 - s[1] : s[1]) * (cc == 0 ? 1 - s[2] : s[2]);
                    for (int q = 0; q < 4; q++) {
                        acc[q] += wt * vals[node * cols + first + q];
                    }
                    double lc = vals[node * cols + TableLayout.LOCATION];
                    if (corner == 0) {
                        loc = lc;
                    } else if (Double.compare(lc, loc) != 0) {
                        same = false;
                    }
                }
                out[o + FieldSample.U] = acc[0];
                out[o + FieldSample.AX] = acc[1];
                out[o + FieldSample.AY] = acc[2];
                out[o + FieldSample.AZ] = acc[3];
                out[o + FieldSample.LOCATION] = same ? loc : Double.NaN;
                for (int m = FieldSample.GXX; m <= FieldSample.GZZ; m++) {
                    out[o + m] = Double.NaN;
                }
                out[o + FieldSample.LAPLACIAN] = Double.NaN;
            }

            private boolean locate(int a, double x) {
                double[] ca = c[a];
                int n = ca.length;
                if (periodic[a]) {
                    double h = ca[1] - ca[0];
                    double t = x / h;
                    double fl = Math.floor(t);
                    idx[a] = (int) (((long) fl % n + n) % n);
                    s[a] = t - fl;
                    return !Double.isNaN(x);
                }
                if (!(x >= ca[0] && x <= ca[n - 1])) {
                    return false;
                }
                int lo = 0;
                int hi = n - 1;
                while (hi - lo > 1) {
                    int mid = (lo + hi) >>> 1;
                    if (ca[mid] <= x) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                idx[a] = lo;
                s[a] = (x - ca[lo]) / (ca[lo + 1] - ca[lo]);
                return true;
            }
        };
    }
}
