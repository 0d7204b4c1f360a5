package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;

/**
 * A {@link FieldModel} that interpolates a table: potential and acceleration (and their derivatives) by tricubic
 * Hermite interpolation in each cell.
 *
 * <p>Method: the tricubic interpolant of Lekien, F. &amp; Marsden, J. (2005) "Tricubic interpolation in three
 * dimensions", Int. J. Numer. Meth. Engng 63:455–471, written in its equivalent tensor-product Hermite form: in a
 * cell with local coordinates {@code s,t,u ∈ [0,1]} the interpolant of {@code f} is
 * {@code Σ_corners Σ_{α,β,γ∈{0,1}} ∂^{α+β+γ}f/∂x^α∂y^β∂z^γ · H_α(s)·H_β(t)·H_γ(u)·h_x^α h_y^β h_z^γ} with the cubic
 * Hermite basis {@code H} (value: 2s³−3s²+1 and 3s²−2s³; slope: s³−2s²+s and s³−s²; e.g. de Boor, C. (1978) A
 * Practical Guide to Splines, ch. IV). The 8 nodal data per function are the value, the 3 first derivatives, the
 * 3 second cross derivatives and the third cross derivative. Because each datum is single-valued per node, the
 * interpolant is C1 across cells (Lekien &amp; Marsden 2005, §2).
 * <ul>
 * <li>Potential U: first derivatives are the tabulated acceleration (exact, g = ∇U); on a Cartesian table with the
 *     gradient tensor the second cross derivatives are exact as well.</li>
 * <li>Acceleration components with the gradient tensor (Cartesian grid): first derivatives exact from the tensor,
 *     cross derivatives by second-order finite differences of the tensor: C1 acceleration, error O(h⁴).</li>
 * <li>Without the tensor: all derivatives by second-order finite differences of the values (one-sided at the table's
 *     faces): error O(h³).</li>
 * <li>Spherical tables: the same interpolation in (r, latitude, longitude) (radians), with first derivatives from the
 *     chain rule where the tensor or g is known. Longitude wraps around; latitude differences at a pole continue
 *     over the pole to the node at longitude + 180° (when the longitude count is even; otherwise one-sided).</li>
 * </ul>
 * Outside the table (or for a point table, which is not a grid) it refuses with an {@link OutsideTableException},
 * or, when a fallback model is given, evaluates that model instead: it never extrapolates. Cells with a blank
 * (NaN) node, e.g. with interior nodes excluded, give NaN. The location slot is the common location of the cell's
 * corners, or unknown (NaN) when they differ. Units SI, model frame, U &gt; 0, g = ∇U.
 */
public final class TableField implements FieldModel {
    /** Nodal data per function. */
    private static final int K = 8;
    /** Functions: U, ax, ay, az. */
    private static final int F = 4;

    private final Table table;
    private final FieldModel fallback;
    private final boolean spherical;
    private final Axis[] axes = new Axis[3];
    private final int n0;
    private final int n1;
    private final int n2;
    private final double[] centre;
    /** Node-major nodal data: node i, function f, datum k at (i·F + f)·K + k; k = 4α + 2β + γ. */
    private final double[] coef;
    private final double[] loc;
    private final double gm;
    private final boolean hasGradient;

    /** A table field that refuses points outside the table. */
    public TableField(Table table) {
        this(table, null);
    }

    /**
     * @param table    a box or sphere table (at least 2 radii for a sphere)
     * @param fallback exact model used outside the table, or null to refuse such points
     * @throws IllegalArgumentException for a point table or a one-radius sphere table
     */
    public TableField(Table table, FieldModel fallback) {
        this.table = table;
        this.fallback = fallback;
        Grid g = table.grid();
        int cols = table.columnCount();
        int gcol = table.column("gxx_s2");
        hasGradient = gcol >= 0;
        Object gmObj = table.metadata().get("gm_m3_s2");
        gm = gmObj instanceof Number num ? num.doubleValue() : Double.NaN;
        if (g instanceof BoxGrid b) {
            spherical = false;
            centre = new double[3];
            for (int a = 0; a < 3; a++) {
                axes[a] = Axis.uniform(b.counts()[a], b.origin()[a], b.spacing()[a], false);
            }
        } else if (g instanceof SphereGrid s) {
            spherical = true;
            centre = s.centre();
            if (s.radii().length < 2) {
                throw new IllegalArgumentException("a spherical table with one radius cannot be interpolated in 3-D");
            }
            axes[0] = Axis.list(s.radii());
            axes[1] = Axis.uniform(s.latCount(), -Math.PI / 2, Math.toRadians(s.latStepDeg()), false);
            axes[2] = Axis.uniform(s.lonCount(), 0, Math.toRadians(s.lonStepDeg()), true);
        } else {
            throw new IllegalArgumentException("a point table is not a grid and cannot be interpolated");
        }
        n0 = axes[0].n;
        n1 = axes[1].n;
        n2 = axes[2].n;
        int n = n0 * n1 * n2;
        double[] vals = table.values();
        loc = new double[n];
        double[][] f = new double[F][n];
        double[][][] d1 = new double[F][3][n];
        double[] jac = new double[9];
        double[] tensor = new double[9];
        double[] fd = new double[3];
        for (int i = 0; i < n; i++) {
            int o = i * cols;
            loc[i] = vals[o + TableLayout.LOCATION];
            for (int q = 0; q < F; q++) {
                f[q][i] = vals[o + TableLayout.U + q];
            }
            jacobian(i, jac);
            // U: first derivatives from g = ∇U by the chain rule (identity on a box).
            for (int a = 0; a < 3; a++) {
                d1[0][a][i] = chain(jac, a, vals[o + TableLayout.AX], vals[o + TableLayout.AX + 1],
                    vals[o + TableLayout.AX + 2]);
            }
            if (hasGradient) {
                int t = o + gcol;
                double[] tt = {vals[t], vals[t + 1], vals[t + 2], vals[t + 1], vals[t + 3], vals[t + 4], vals[t + 2],
                    vals[t + 4], vals[t + 5]};
                System.arraycopy(tt, 0, tensor, 0, 9);
                for (int q = 0; q < 3; q++) {
                    for (int a = 0; a < 3; a++) {
                        d1[1 + q][a][i] = chain(jac, a, tensor[3 * q], tensor[3 * q + 1], tensor[3 * q + 2]);
                    }
                }
            }
        }
        if (!hasGradient) {
            for (int q = 1; q < F; q++) {
                for (int a = 0; a < 3; a++) {
                    d1[q][a] = derive(f[q], a);
                }
            }
        }
        coef = new double[n * F * K];
        for (int q = 0; q < F; q++) {
            double[] fu = d1[q][0];
            double[] fv = d1[q][1];
            double[] fw = d1[q][2];
            double[] fuv;
            double[] fuw;
            double[] fvw;
            if (!spherical && q == 0 && hasGradient) {
                // U's second cross derivatives are tabulated exactly (gxy, gxz, gyz).
                fuv = new double[n];
                fuw = new double[n];
                fvw = new double[n];
                for (int i = 0; i < n; i++) {
                    int t = i * cols + gcol;
                    fuv[i] = vals[t + 1];
                    fuw[i] = vals[t + 2];
                    fvw[i] = vals[t + 4];
                }
            } else {
                fuv = derive(fu, 1);
                fuw = derive(fu, 2);
                fvw = derive(fv, 2);
            }
            double[] fuvw = derive(fuv, 2);
            double[][] data = {f[q], fw, fv, fvw, fu, fuw, fuv, fuvw};
            for (int i = 0; i < n; i++) {
                int b = (i * F + q) * K;
                for (int k = 0; k < K; k++) {
                    coef[b + k] = data[k][i];
                }
            }
        }
    }

    /** Columns of d(position)/d(grid coordinate) at node i: row-major 3×3, column a = ∂P/∂u_a. */
    private void jacobian(int node, double[] j) {
        if (!spherical) {
            java.util.Arrays.fill(j, 0);
            j[0] = 1;
            j[4] = 1;
            j[8] = 1;
            return;
        }
        int k = node % n2;
        int jj = (node / n2) % n1;
        int i = node / (n1 * n2);
        sphereJacobian(axes[0].c[i], axes[1].c[jj], axes[2].c[k], j);
    }

    private static void sphereJacobian(double r, double lat, double lon, double[] j) {
        double cp = Math.cos(lat);
        double sp = Math.sin(lat);
        double cl = Math.cos(lon);
        double sl = Math.sin(lon);
        // ∂P/∂r = r̂, ∂P/∂lat = r·(−sinφ cosλ, −sinφ sinλ, cosφ), ∂P/∂lon = r cosφ·(−sinλ, cosλ, 0)
        j[0] = cp * cl;
        j[3] = cp * sl;
        j[6] = sp;
        j[1] = -r * sp * cl;
        j[4] = -r * sp * sl;
        j[7] = r * cp;
        j[2] = -r * cp * sl;
        j[5] = r * cp * cl;
        j[8] = 0;
    }

    /**
     * ∇f · ∂P/∂u_a, the derivative along grid coordinate a. On a box it is the a-th component itself (taken directly,
     * so that it stays exact and a NaN in another component does not leak in through a product with 0).
     */
    private double chain(double[] j, int a, double gx, double gy, double gz) {
        if (!spherical) {
            return a == 0 ? gx : a == 1 ? gy : gz;
        }
        return gx * j[a] + gy * j[3 + a] + gz * j[6 + a];
    }

    /** Second-order finite-difference derivative of a nodal array along axis {@code a} (grid coordinates). */
    private double[] derive(double[] f, int a) {
        int n = f.length;
        double[] d = new double[n];
        int[] idx = new int[3];
        int[] nb = new int[3];
        double[] w = new double[3];
        for (int i = 0; i < n; i++) {
            idx[2] = i % n2;
            idx[1] = (i / n2) % n1;
            idx[0] = i / (n1 * n2);
            int m = stencil(a, idx, nb, w);
            double s = 0;
            for (int q = 0; q < m; q++) {
                s += w[q] * f[nb[q]];
            }
            d[i] = s;
        }
        return d;
    }

    private int node(int i, int j, int k) {
        return (i * n1 + j) * n2 + k;
    }

    /** Stencil of the first derivative along axis a at node idx: node indices and weights; returns the count. */
    private int stencil(int a, int[] idx, int[] nb, double[] w) {
        Axis ax = axes[a];
        int p = idx[a];
        int[] q = idx.clone();
        if (ax.periodic) {
            double h = ax.h;
            q[a] = (p + ax.n - 1) % ax.n;
            nb[0] = node(q[0], q[1], q[2]);
            q[a] = (p + 1) % ax.n;
            nb[1] = node(q[0], q[1], q[2]);
            w[0] = -0.5 / h;
            w[1] = 0.5 / h;
            return 2;
        }
        boolean pole = spherical && a == 1 && n2 % 2 == 0;
        if (pole && (p == 0 || p == ax.n - 1)) {
            // Continue over the pole: latitude −90°−δ at longitude λ is latitude −90°+δ at λ+180° (and likewise north).
            int inner = p == 0 ? 1 : ax.n - 2;
            int k2 = (idx[2] + n2 / 2) % n2;
            nb[0] = node(idx[0], inner, idx[2]);
            nb[1] = node(idx[0], inner, k2);
            double sgn = p == 0 ? 1 : -1;
            w[0] = sgn * 0.5 / ax.h;
            w[1] = -sgn * 0.5 / ax.h;
            return 2;
        }
        int n = ax.n;
        double[] c = ax.c;
        if (n == 2) {
            q[a] = 0;
            nb[0] = node(q[0], q[1], q[2]);
            q[a] = 1;
            nb[1] = node(q[0], q[1], q[2]);
            double h = c[1] - c[0];
            w[0] = -1 / h;
            w[1] = 1 / h;
            return 2;
        }
        int i0;
        double w0;
        double w1;
        double w2;
        if (p == 0) {
            double h1 = c[1] - c[0];
            double h2 = c[2] - c[1];
            i0 = 0;
            w0 = -(2 * h1 + h2) / (h1 * (h1 + h2));
            w1 = (h1 + h2) / (h1 * h2);
            w2 = -h1 / (h2 * (h1 + h2));
        } else if (p == n - 1) {
            double h1 = c[n - 1] - c[n - 2];
            double h2 = c[n - 2] - c[n - 3];
            i0 = n - 3;
            w2 = (2 * h1 + h2) / (h1 * (h1 + h2));
            w1 = -(h1 + h2) / (h1 * h2);
            w0 = h1 / (h2 * (h1 + h2));
        } else {
            double h1 = c[p] - c[p - 1];
            double h2 = c[p + 1] - c[p];
            i0 = p - 1;
            w0 = -h2 / (h1 * (h1 + h2));
            w1 = (h2 - h1) / (h1 * h2);
            w2 = h1 / (h2 * (h1 + h2));
        }
        for (int s = 0; s < 3; s++) {
            q[a] = i0 + s;
            nb[s] = node(q[0], q[1], q[2]);
        }
        w[0] = w0;
        w[1] = w1;
        w[2] = w2;
        return 3;
    }

    /** The table behind this field. */
    public Table table() {
        return table;
    }

    /** Whether {@code (x, y, z)} (m, model frame) lies in the region the table covers (boundary included). */
    public boolean contains(double x, double y, double z) {
        if (!spherical) {
            return axes[0].inside(x) && axes[1].inside(y) && axes[2].inside(z);
        }
        double dx = x - centre[0];
        double dy = y - centre[1];
        double dz = z - centre[2];
        return axes[0].inside(Math.sqrt(dx * dx + dy * dy + dz * dz));
    }


    @Override
    public double gm() {
        return gm;
    }

    @Override
    public String describe() {
        return "interpolated " + table.grid().kind() + " table, " + table.grid().nodeCount() + " nodes, tricubic Hermite "
            + (hasGradient ? "with tabulated gradients" : "from values") + (fallback != null ? ", exact fallback" : "");
    }

    @Override
    public FieldEvaluator newEvaluator() {
        return new Evaluator();
    }

    /** One axis of the grid: node coordinates (m or rad), uniform or listed, periodic or not. */
    private static final class Axis {
        final int n;
        final double[] c;
        final boolean uniform;
        final boolean periodic;
        final double c0;
        final double h;

        private Axis(double[] c, boolean uniform, boolean periodic, double c0, double h) {
            this.n = c.length;
            this.c = c;
            this.uniform = uniform;
            this.periodic = periodic;
            this.c0 = c0;
            this.h = h;
        }

        static Axis uniform(int n, double c0, double h, boolean periodic) {
            double[] c = new double[n];
            for (int i = 0; i < n; i++) {
                c[i] = c0 + i * h;
            }
            return new Axis(c, true, periodic, c0, h);
        }

        static Axis list(double[] c) {
            return new Axis(c.clone(), false, false, c[0], Double.NaN);
        }

        boolean inside(double x) {
            if (periodic) {
                return !Double.isNaN(x);
            }
            return x >= c[0] && x <= c[n - 1];
        }

        /** Cell of x: writes lower index, upper index, local coordinate in [0,1] and cell width. */
        int locate(double x, double[] sh) {
            int i;
            double s;
            double width;
            if (periodic) {
                double t = (x - c0) / h;
                double fl = Math.floor(t);
                s = t - fl;
                i = (int) (((long) fl % n + n) % n);
                width = h;
            } else if (uniform) {
                double t = (x - c0) / h;
                i = (int) Math.floor(t);
                i = Math.max(0, Math.min(n - 2, i));
                s = t - i;
                width = h;
            } else {
                int lo = 0;
                int hi = n - 1;
                while (hi - lo > 1) {
                    int mid = (lo + hi) >>> 1;
                    if (c[mid] <= x) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                i = lo;
                width = c[i + 1] - c[i];
                s = (x - c[i]) / width;
            }
            sh[0] = s;
            sh[1] = width;
            return i;
        }
    }

    /** Per-thread scratch: basis weights. */
    private final class Evaluator implements FieldEvaluator {
        private final double[] sh = new double[2];
        /** Per axis: [corner0 value, corner0 slope·h, corner1 value, corner1 slope·h]. */
        private final double[][] wv = new double[3][4];
        /** Per axis: derivatives of those weights with respect to the grid coordinate. */
        private final double[][] wd = new double[3][4];
        private final double[] jac = new double[9];
        private final FieldEvaluator exact = fallback != null ? fallback.newEvaluator() : null;
        private final double[] val = new double[F];
        private final double[][] der = new double[F][3];
        private final double[] t = new double[9];
        private final double[] wgt = new double[64];
        private final double[] wgu = new double[64];
        private final double[] wgv = new double[64];
        private final double[] wgw = new double[64];

        @Override
        public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o) {
            double u;
            double v;
            double w;
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
            } else {
                u = x;
                v = y;
                w = z;
            }
            if (spherical) {
                v = Math.max(axes[1].c[0], Math.min(axes[1].c[n1 - 1], v)); // pole rows may round below ±π/2
            }
            if (!(axes[0].inside(u) && axes[1].inside(v) && axes[2].inside(w))) {
                if (exact != null) {
                    exact.evaluate(x, y, z, gradient, out, o);
                    return;
                }
                throw new OutsideTableException(String.format(java.util.Locale.ROOT,
                    "point (%.6g, %.6g, %.6g) m is outside the table (%s); no extrapolation", x, y, z, bounds()));
            }
            int i = axes[0].locate(u, sh);
            basis(0, sh[0], sh[1]);
            int j = axes[1].locate(v, sh);
            basis(1, sh[0], sh[1]);
            int k = axes[2].locate(w, sh);
            basis(2, sh[0], sh[1]);
            int k1 = axes[2].periodic ? (k + 1) % n2 : k + 1;
            java.util.Arrays.fill(val, 0);
            // Weights of the 8 nodal data of the 8 corners: corner (a,b,c) = 4a+2b+c, datum k = 4α+2β+γ.
            for (int a = 0; a < 2; a++) {
                for (int b = 0; b < 2; b++) {
                    for (int c = 0; c < 2; c++) {
                        int cb = 8 * (4 * a + 2 * b + c);
                        for (int al = 0; al < 2; al++) {
                            double bu = wv[0][2 * a + al];
                            double du = wd[0][2 * a + al];
                            for (int be = 0; be < 2; be++) {
                                double bv = wv[1][2 * b + be];
                                double dv = wd[1][2 * b + be];
                                for (int ga = 0; ga < 2; ga++) {
                                    double bw = wv[2][2 * c + ga];
                                    int idx = cb + 4 * al + 2 * be + ga;
                                    wgt[idx] = bu * bv * bw;
                                    if (gradient) {
                                        wgu[idx] = du * bv * bw;
                                        wgv[idx] = bu * dv * bw;
                                        wgw[idx] = bu * bv * wd[2][2 * c + ga];
                                    }
                                }
                            }
                        }
                    }
                }
            }
            double locCode = Double.NaN;
            boolean same = true;
            double u0 = 0;
            double ax = 0;
            double ay = 0;
            double az = 0;
            if (gradient) {
                for (double[] d : der) {
                    java.util.Arrays.fill(d, 0);
                }
            }
            for (int corner = 0; corner < 8; corner++) {
                int a = corner >> 2;
                int b = (corner >> 1) & 1;
                int c = corner & 1;
                int nodeIdx = ((i + a) * n1 + (j + b)) * n2 + (c == 0 ? k : k1);
                double lc = loc[nodeIdx];
                if (corner == 0) {
                    locCode = lc;
                } else if (Double.compare(lc, locCode) != 0) {
                    same = false;
                }
                int base = nodeIdx * F * K;
                int cb = 8 * corner;
                for (int m = 0; m < K; m++) {
                    double wm = wgt[cb + m];
                    u0 += coef[base + m] * wm;
                    ax += coef[base + K + m] * wm;
                    ay += coef[base + 2 * K + m] * wm;
                    az += coef[base + 3 * K + m] * wm;
                }
                if (gradient) {
                    for (int q = 0; q < F; q++) {
                        double[] dq = der[q];
                        int bq = base + q * K;
                        for (int m = 0; m < K; m++) {
                            double cf = coef[bq + m];
                            dq[0] += cf * wgu[cb + m];
                            dq[1] += cf * wgv[cb + m];
                            dq[2] += cf * wgw[cb + m];
                        }
                    }
                }
            }
            val[0] = u0;
            val[1] = ax;
            val[2] = ay;
            val[3] = az;
            out[o + FieldSample.U] = val[0];
            out[o + FieldSample.AX] = val[1];
            out[o + FieldSample.AY] = val[2];
            out[o + FieldSample.AZ] = val[3];
            out[o + FieldSample.LOCATION] = same ? locCode : Double.NaN;
            if (gradient) {
                if (spherical) {
                    sphereJacobian(u, v, w, jac);
                    for (int q = 0; q < 3; q++) {
                        // ∇f = r̂ f_r + φ̂ f_φ / r + λ̂ f_λ / (r cos φ); columns of jac are r̂, r φ̂, r cos φ λ̂.
                        double[] dd = der[1 + q];
                        for (int m = 0; m < 3; m++) {
                            double c1 = jac[3 * m + 1] / (u * u);
                            double cpw = Math.cos(v);
                            double c2 = jac[3 * m + 2] / (u * u * cpw * cpw);
                            t[3 * q + m] = jac[3 * m] * dd[0] + c1 * dd[1] + c2 * dd[2];
                        }
                    }
                } else {
                    for (int q = 0; q < 3; q++) {
                        for (int m = 0; m < 3; m++) {
                            t[3 * q + m] = der[1 + q][m];
                        }
                    }
                }
                out[o + FieldSample.GXX] = t[0];
                out[o + FieldSample.GXY] = 0.5 * (t[1] + t[3]);
                out[o + FieldSample.GXZ] = 0.5 * (t[2] + t[6]);
                out[o + FieldSample.GYY] = t[4];
                out[o + FieldSample.GYZ] = 0.5 * (t[5] + t[7]);
                out[o + FieldSample.GZZ] = t[8];
                out[o + FieldSample.LAPLACIAN] = t[0] + t[4] + t[8];
            } else {
                for (int m = FieldSample.GXX; m <= FieldSample.GZZ; m++) {
                    out[o + m] = Double.NaN;
                }
                out[o + FieldSample.LAPLACIAN] = Double.NaN;
            }
        }

        /** Cubic Hermite basis on one axis at local coordinate s ∈ [0,1] of a cell of width h. */
        private void basis(int a, double s, double h) {
            double s2 = s * s;
            double s3 = s2 * s;
            double[] b = wv[a];
            b[0] = 2 * s3 - 3 * s2 + 1;
            b[1] = (s3 - 2 * s2 + s) * h;
            b[2] = 3 * s2 - 2 * s3;
            b[3] = (s3 - s2) * h;
            double[] d = wd[a];
            d[0] = (6 * s2 - 6 * s) / h;
            d[1] = 3 * s2 - 4 * s + 1;
            d[2] = (6 * s - 6 * s2) / h;
            d[3] = 3 * s2 - 2 * s;
        }
    }

    private String bounds() {
        if (spherical) {
            return "radius " + axes[0].c[0] + " to " + axes[0].c[axes[0].n - 1] + " m about (" + centre[0] + ", "
                + centre[1] + ", " + centre[2] + ")";
        }
        return "x " + axes[0].c[0] + ".." + axes[0].c[n0 - 1] + ", y " + axes[1].c[0] + ".." + axes[1].c[n1 - 1]
            + ", z " + axes[2].c[0] + ".." + axes[2].c[n2 - 1] + " m";
    }
}
