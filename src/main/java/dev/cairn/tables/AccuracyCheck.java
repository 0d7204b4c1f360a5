package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Measures how well a {@link TableField} reproduces the exact field: seeded random points inside the table (uniform
 * in the box; uniform in radius and direction for a sphere table, so almost never on a node), interpolated against
 * exact acceleration, relative error {@code |g_table − g_exact| / |g_exact|}. Points are split by the exact model's
 * location: outside the body (what a trajectory sees) and inside it (where the table only serves crash detection).
 * Points are drawn sequentially from the seed and evaluated in parallel, so the report does not depend on the thread
 * count.
 */
public final class AccuracyCheck {
    private AccuracyCheck() {
    }

    /**
     * Error statistics of one group of points.
     *
     * @param count   points in the group with finite values
     * @param max     largest relative error
     * @param rms     root mean square relative error
     * @param p50     median relative error
     * @param p90     90th percentile
     * @param p99     99th percentile
     * @param maxAbs  largest absolute error, m/s^2
     * @param worst   the point of the largest relative error, m, model frame (null when empty)
     */
    public record Stats(int count, double max, double rms, double p50, double p90, double p99, double maxAbs,
                        double[] worst) {
        Map<String, Object> toJson() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("points", count);
            if (count == 0) {
                return m; // no statistics of an empty group (JSON has no NaN)
            }
            m.put("max", max);
            m.put("rms", rms);
            m.put("p50", p50);
            m.put("p90", p90);
            m.put("p99", p99);
            m.put("max_abs_m_s2", maxAbs);
            m.put("worst_point_m", worst == null ? null : List.of(worst[0], worst[1], worst[2]));
            return m;
        }
    }

    /**
     * Result of a check.
     *
     * @param samples points drawn
     * @param seed    random seed
     * @param outside points outside the body
     * @param inside  points inside the body or on its surface
     * @param blank   points where the table gave NaN (cells touching excluded interior nodes)
     * @param points  the points, {@code 3·samples} values, m
     * @param errors  relative error per point (NaN for blank points)
     * @param where   exact {@link Location#code()} per point
     */
    public record Report(int samples, long seed, Stats outside, Stats inside, int blank, double[] points,
                         double[] errors, double[] where) {
        /** Sidecar form (without the per-point arrays). */
        public Map<String, Object> toJson() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("metric", "relative acceleration error |g_table - g_exact| / |g_exact| at random points");
            m.put("samples", samples);
            m.put("seed", seed);
            m.put("outside_body", outside.toJson());
            m.put("inside_body", inside.toJson());
            m.put("blank_points", blank);
            return m;
        }
    }

    /** Draws {@code samples} seeded random points in the region the table covers. */
    public static double[] samplePoints(Grid grid, int samples, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] p = new double[3 * samples];
        for (int i = 0; i < samples; i++) {
            if (grid instanceof BoxGrid b) {
                for (int a = 0; a < 3; a++) {
                    double lo = b.coordinate(a, 0);
                    double hi = b.coordinate(a, b.counts()[a] - 1);
                    p[3 * i + a] = Math.min(hi, lo + (hi - lo) * (1e-12 + (1 - 2e-12) * rnd.nextDouble()));
                }
            } else if (grid instanceof SphereGrid s) {
                double[] r = s.radii();
                double[] c = s.centre();
                // Inset by 1e-12 of the range so that rounding in x, y, z never moves a point out of the table.
                double rr = r[0] + (r[r.length - 1] - r[0]) * (1e-12 + (1 - 2e-12) * rnd.nextDouble());
                double z = 2 * rnd.nextDouble() - 1;
                double phi = 2 * Math.PI * rnd.nextDouble();
                double q = Math.sqrt(1 - z * z);
                p[3 * i] = c[0] + rr * q * Math.cos(phi);
                p[3 * i + 1] = c[1] + rr * q * Math.sin(phi);
                p[3 * i + 2] = c[2] + rr * z;
            } else {
                throw new IllegalArgumentException("a point table has no region between nodes to sample");
            }
        }
        return p;
    }

    /** Runs the check. */
    public static Report run(TableField table, FieldModel exact, int samples, long seed, int threads,
                             ProgressListener progress) {
        double[] pts = samplePoints(table.table().grid(), samples, seed);
        double[] err = new double[samples];
        double[] abs = new double[samples];
        double[] where = new double[samples];
        ParallelChunks.run(samples, threads, () -> new FieldEvaluator[] {table.newEvaluator(), exact.newEvaluator()},
            (ev, from, to) -> {
                double[] a = new double[FieldSample.SIZE];
                double[] b = new double[FieldSample.SIZE];
                for (int i = from; i < to; i++) {
                    ev[0].evaluate(pts[3 * i], pts[3 * i + 1], pts[3 * i + 2], false, a, 0);
                    ev[1].evaluate(pts[3 * i], pts[3 * i + 1], pts[3 * i + 2], false, b, 0);
                    double dx = a[FieldSample.AX] - b[FieldSample.AX];
                    double dy = a[FieldSample.AY] - b[FieldSample.AY];
                    double dz = a[FieldSample.AZ] - b[FieldSample.AZ];
                    abs[i] = Math.sqrt(dx * dx + dy * dy + dz * dz);
                    err[i] = abs[i] / FieldSample.accelerationNorm(b, 0);
                    where[i] = b[FieldSample.LOCATION];
                }
            }, progress);
        int blank = 0;
        for (double e : err) {
            if (Double.isNaN(e)) {
                blank++;
            }
        }
        return new Report(samples, seed, stats(pts, err, abs, where, false), stats(pts, err, abs, where, true), blank,
            pts, err, where);
    }

    private static Stats stats(double[] pts, double[] err, double[] abs, double[] where, boolean inside) {
        int n = 0;
        double[] sel = new double[err.length];
        double sum2 = 0;
        double max = -1;
        double maxAbs = 0;
        double[] worst = null;
        for (int i = 0; i < err.length; i++) {
            boolean in = where[i] != Location.OUTSIDE.code(); // exact code comparison: codes are exact
            if (in != inside || Double.isNaN(err[i])) {
                continue;
            }
            sel[n++] = err[i];
            sum2 += err[i] * err[i];
            maxAbs = Math.max(maxAbs, abs[i]);
            if (err[i] > max) {
                max = err[i];
                worst = new double[] {pts[3 * i], pts[3 * i + 1], pts[3 * i + 2]};
            }
        }
        if (n == 0) {
            return new Stats(0, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, null);
        }
        double[] s = Arrays.copyOf(sel, n);
        Arrays.sort(s);
        return new Stats(n, max, Math.sqrt(sum2 / n), percentile(s, 0.5), percentile(s, 0.9), percentile(s, 0.99),
            maxAbs, worst);
    }

    /** Nearest-rank percentile of sorted values (common practice, no source). */
    static double percentile(double[] sorted, double q) {
        int k = (int) Math.ceil(q * sorted.length) - 1;
        return sorted[Math.max(0, Math.min(sorted.length - 1, k))];
    }

    // ------------------------------------------------------------------------------------------------------------
    // Bounds by distance from the surface
    // ------------------------------------------------------------------------------------------------------------

    /** Band edges in cell sizes from the surface (outside the body): 0–1, 1–3, 3–10, beyond 10. */
    public static final double[] BAND_EDGES = {0, 1, 3, 10, Double.POSITIVE_INFINITY};
    /** Bands checked cell by cell (every cell reaching into them): the first two. */
    public static final int DENSE_BANDS = 2;
    /** Fixed points per dense cell: centre and the six face centres, in local cell coordinates. */
    private static final double[][] PATTERN = {{0.5, 0.5, 0.5}, {0, 0.5, 0.5}, {1, 0.5, 0.5}, {0.5, 0, 0.5},
        {0.5, 1, 0.5}, {0.5, 0.5, 0}, {0.5, 0.5, 1}};
    /** Default independent uniform points over the table (the sampled bands). */
    public static final int DEFAULT_RANDOM_POINTS = 8000;
    /** Default random points per dense cell besides the fixed pattern. */
    public static final int DEFAULT_RANDOM_PER_CELL = 4;
    /**
     * Safety factor on the largest error found in the dense bands (measured, no source: on the test bodies of
     * {@code TableAccuracyBoundTest} the largest error at 20 000 fresh points came to at most 1.14 times the largest
     * found by the dense check; see docs/tables.md, accuracy report).
     */
    public static final double DENSE_FACTOR = 2.0;
    /** Safety factor on the sampled far bands (measured, no source; same test: fresh maxima at most 1.13 times). */
    public static final double FAR_FACTOR = 2.0;
    /**
     * Order k of each interpolant's error, {@code ∝ h^k·|∂^k g|} (tricubic Hermite 4, trilinear 2; e.g. de Boor 1978,
     * A Practical Guide to Splines, ch. IV, for the cubic Hermite error). Relative to |g| the error falls with the
     * distance d from the surface as {@code (h/d)^p} with p between k − 1 (near an edge or vertex of the polyhedron,
     * where ∂g grows as ln d, so ∂^k g as d^(1−k)) and k (far away, ∂^k g ∝ r^(−k−2) against |g| ∝ r^(−2)): scaling a
     * sampled error at distance d to the band's inner edge d_0 by (d/d_0)^k over-estimates, never under-estimates,
     * the error there as long as p ≤ k.
     */
    static final int[] ORDER = {4, 2};
    /** Confidence of the order-statistics statement. */
    public static final double CONFIDENCE = 0.999;

    /**
     * Spin of the body, for the effective quantities: rate ω (rad/s), unit axis and the centre of mass the axis runs
     * through (model frame, m).
     */
    public record Spin(double omega, double[] axis, double[] centreOfMass) {
        /** From a layout. */
        public static Spin of(TableLayout layout) {
            return new Spin(layout.omega(), layout.spinAxis(), layout.centreOfMass());
        }

        /**
         * From a table sidecar ({@code spin.omega_rad_s}, {@code spin.axis}, {@code center_of_mass_m}; sidecars
         * written before the key was spelled as in every other output carry {@code centre_of_mass_m}, still read).
         */
        public static Spin fromMetadata(Map<String, Object> meta) {
            Object sp = meta.get("spin");
            double omega = 0;
            double[] axis = {0, 0, 1};
            if (sp instanceof Map<?, ?> m) {
                if (m.get("omega_rad_s") instanceof Number n) {
                    omega = n.doubleValue();
                }
                axis = vector(m.get("axis"), axis);
            }
            Object com = meta.containsKey("center_of_mass_m") ? meta.get("center_of_mass_m")
                : meta.get("centre_of_mass_m");
            return new Spin(omega, axis, vector(com, new double[3]));
        }

        private static double[] vector(Object o, double[] dflt) {
            if (o instanceof List<?> l && l.size() == 3 && l.get(0) instanceof Number && l.get(1) instanceof Number
                && l.get(2) instanceof Number) {
                return new double[] {((Number) l.get(0)).doubleValue(), ((Number) l.get(1)).doubleValue(),
                    ((Number) l.get(2)).doubleValue()};
            }
            return dflt;
        }
    }

    /**
     * Statistics and stated bound of one band for one interpolant.
     *
     * @param from        inner edge, cell sizes from the surface
     * @param to          outer edge (infinite for the last band)
     * @param dense       whether every cell reaching into the band was checked
     * @param stats       error statistics of the points in the band
     * @param bound       stated upper bound of the relative error in the band (NaN when no point fell in it)
     * @param exceedShare with {@link #CONFIDENCE}, at most this share of the band exceeds the measured maximum
     *                    (order statistics of {@code stats.count()} independent uniform points; NaN for dense bands)
     */
    public record Band(double from, double to, boolean dense, Stats stats, double bound, double exceedShare) {
        Map<String, Object> toJson() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("band_cell_sizes", Double.isInfinite(to) ? "> " + fmt(from) : fmt(from) + "-" + fmt(to));
            m.put("check", dense ? "dense: every cell reaching into the band, fixed and random points in each"
                : "sampled: independent uniform random points");
            m.putAll(stats.toJson());
            if (stats.count() > 0) {
                m.put("bound", bound);
                if (!dense) {
                    m.put("share_above_measured_max_at_confidence", exceedShare);
                }
            }
            return m;
        }
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? String.valueOf((long) v) : String.valueOf(v);
    }

    /**
     * Bands of one interpolant and quantity.
     *
     * @param interpolation {@code tricubic_hermite} or {@code trilinear}
     * @param quantity      {@code acceleration} or {@code effective_acceleration}
     * @param bands         the four bands outside the body
     * @param inside        points inside the body (statistics only: the table serves crash detection there)
     */
    public record Interpolant(String interpolation, String quantity, List<Band> bands, Stats inside) {
        /** Largest stated bound over the bands (NaN when none). */
        public double maxBound() {
            double m = Double.NaN;
            for (Band b : bands) {
                if (!Double.isNaN(b.bound()) && !(b.bound() <= m)) {
                    m = b.bound();
                }
            }
            return m;
        }

        Map<String, Object> toJson() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("interpolation", interpolation);
            m.put("quantity", quantity);
            List<Object> b = new java.util.ArrayList<>();
            for (Band band : bands) {
                b.add(band.toJson());
            }
            m.put("outside_body_by_distance", b);
            m.put("inside_body", inside.toJson());
            return m;
        }
    }

    /**
     * The bound report.
     *
     * @param denseCells     cells checked point by point
     * @param perCell        points per dense cell
     * @param randomPoints   independent uniform points over the table
     * @param seed           random seed
     * @param blank          points in cells with blank (NaN) nodes, left out
     * @param interpolants   per interpolant and quantity
     * @param points         all points checked, 3 per point, m
     * @param distance       signed distance of each point to the surface, m (negative inside)
     * @param cellSize       cell size at each point (largest cell edge), m
     */
    public record BoundReport(int denseCells, int perCell, int randomPoints, long seed, int blank,
                              List<Interpolant> interpolants, double[] points, double[] distance, double[] cellSize) {
        /** Sidecar form (without the per-point arrays). */
        public Map<String, Object> toJson() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("metric", "relative acceleration error |a_interpolated - a_exact| / |g_exact| against the exact "
                + "field model (a = g for acceleration, a = g + omega^2 r_perp for effective_acceleration, always "
                + "divided by the gravitational |g|: the effective acceleration vanishes where the parts balance)"
                + ", in bands of distance from the surface (in cell sizes: the largest edge of the cell "
                + "holding the point; distance exact, point to mesh)");
            m.put("interpolation", "tricubic_hermite: the reader of docs/tables.md (Lekien & Marsden 2005 tensor-"
                + "product Hermite, derivatives from the tabulated acceleration and gradient tensor); trilinear: a "
                + "plain reader interpolating the value columns linearly along each grid axis");
            m.put("bound_method", "dense bands (0-1, 1-3 cell sizes): every cell reaching into the band checked at "
                + "its centre, its 6 face centres and " + (perCell - PATTERN.length) + " random points; bound = "
                + DENSE_FACTOR + " x the largest error found. Sampled bands (3-10, > 10): independent uniform points; "
                + "bound = " + FAR_FACTOR + " x max(largest error, largest of error x (d/d_inner)^k, the error moved "
                + "to the band's inner edge assuming it falls no faster than (cell size / distance)^k, k = 4 for "
                + "tricubic Hermite and 2 for trilinear, the orders of the interpolants); with confidence "
                + CONFIDENCE + " at most the stated share of the band exceeds the measured maximum (order "
                + "statistics). Safety factors measured against independent checks (docs/tables.md), not proved.");
            m.put("confidence", CONFIDENCE);
            m.put("dense_cells", denseCells);
            m.put("points_per_dense_cell", perCell);
            m.put("random_points", randomPoints);
            m.put("seed", seed);
            m.put("blank_points", blank);
            List<Object> l = new java.util.ArrayList<>();
            for (Interpolant i : interpolants) {
                l.add(i.toJson());
            }
            m.put("reports", l);
            return m;
        }
    }

    /**
     * Checks a table against the exact field in bands of distance from the surface, for the tricubic Hermite reader
     * and a trilinear reader, and for the effective acceleration when the table has it.
     *
     * @param table        a box or sphere table as written
     * @param exact        the exact field model
     * @param surface      the body's surface (for the exact distance)
     * @param spin         spin for the effective quantities (ignored without them)
     * @param randomPoints independent uniform points over the table (the sampled bands)
     * @param randomPerCell random points per dense cell besides the 7 fixed ones
     */
    public static BoundReport bound(Table table, FieldModel exact, dev.cairn.mascon.SurfaceQuery surface, Spin spin,
                                    int randomPoints, int randomPerCell, long seed, int threads,
                                    ProgressListener progress) {
        Grid grid = table.grid();
        CellGeometry cells = new CellGeometry(grid);
        int nc = cells.count();
        // 1. Cells reaching within 3 cell sizes outside the surface (centre distance and circumradius).
        boolean[] near = new boolean[nc];
        double reach = BAND_EDGES[DENSE_BANDS];
        ParallelChunks.run(nc, threads, () -> new double[8], (sc, from, to) -> {
            for (int c = from; c < to; c++) {
                cells.point(c, 0.5, 0.5, 0.5, sc, 0);
                double rho = cells.circumradius(c, sc);
                double h = cells.size(c);
                double d = surface.signedDistance(sc[0], sc[1], sc[2], sc);
                near[c] = d - rho < reach * h && d + rho > 0;
            }
        }, ProgressListener.NONE);
        int dense = 0;
        for (boolean b : near) {
            if (b) {
                dense++;
            }
        }
        int perCell = PATTERN.length + Math.max(0, randomPerCell);
        long total = (long) dense * perCell + randomPoints;
        if (total > 50_000_000L) {
            throw new IllegalArgumentException("accuracy check of " + total + " points is too large");
        }
        int n = (int) total;
        double[] pts = new double[3 * n];
        double[] hs = new double[n];
        int q = 0;
        double[] tmp = new double[3];
        for (int c = 0; c < nc; c++) {
            if (!near[c]) {
                continue;
            }
            SplittableRandom rnd = new SplittableRandom(seed * 0x9E3779B97F4A7C15L + c);
            double h = cells.size(c);
            for (int k = 0; k < perCell; k++) {
                double s;
                double t;
                double u;
                if (k < PATTERN.length) {
                    s = PATTERN[k][0];
                    t = PATTERN[k][1];
                    u = PATTERN[k][2];
                } else {
                    s = rnd.nextDouble();
                    t = rnd.nextDouble();
                    u = rnd.nextDouble();
                }
                cells.point(c, s, t, u, tmp, 0);
                System.arraycopy(tmp, 0, pts, 3 * q, 3);
                hs[q++] = h;
            }
        }
        int denseEnd = q;
        double[] rp = samplePoints(grid, randomPoints, seed);
        System.arraycopy(rp, 0, pts, 3 * q, rp.length);
        for (int i = 0; i < randomPoints; i++) {
            hs[q + i] = cells.size(cells.cellOf(rp[3 * i], rp[3 * i + 1], rp[3 * i + 2]));
        }
        // 2. Interpolants.
        List<String[]> names = new java.util.ArrayList<>();
        List<FieldModel> models = new java.util.ArrayList<>();
        names.add(new String[] {"tricubic_hermite", "acceleration"});
        models.add(new TableField(table));
        names.add(new String[] {"trilinear", "acceleration"});
        models.add(new TrilinearField(table, TableLayout.U));
        int eff = table.column("eff_potential_m2_s2");
        if (eff >= 0) {
            names.add(new String[] {"tricubic_hermite", "effective_acceleration"});
            models.add(new TableField(effectiveTable(table, spin)));
            names.add(new String[] {"trilinear", "effective_acceleration"});
            models.add(new TrilinearField(table, eff));
        }
        int e = models.size();
        double[][] err = new double[e][n];
        double[][] abs = new double[e][n];
        double[] dist = new double[n];
        double w2 = spin.omega() * spin.omega();
        double[] ax = spin.axis();
        double[] com = spin.centreOfMass();
        ParallelChunks.run(n, threads, () -> {
            Object[] ctx = new Object[e + 3];
            for (int m = 0; m < e; m++) {
                ctx[m] = models.get(m).newEvaluator();
            }
            ctx[e] = exact.newEvaluator();
            ctx[e + 1] = new double[FieldSample.SIZE];
            ctx[e + 2] = new double[FieldSample.SIZE + 4];
            return ctx;
        }, (ctx, from, to) -> {
            FieldEvaluator ex = (FieldEvaluator) ctx[e];
            double[] a = (double[]) ctx[e + 1];
            double[] b = (double[]) ctx[e + 2];
            for (int i = from; i < to; i++) {
                double x = pts[3 * i];
                double y = pts[3 * i + 1];
                double z = pts[3 * i + 2];
                dist[i] = surface.signedDistance(x, y, z, b);
                ex.evaluate(x, y, z, false, a, 0);
                double gnorm = FieldSample.accelerationNorm(a, 0);
                double rx = x - com[0];
                double ry = y - com[1];
                double rz = z - com[2];
                double along = rx * ax[0] + ry * ax[1] + rz * ax[2];
                double cx = w2 * (rx - along * ax[0]);
                double cy = w2 * (ry - along * ax[1]);
                double cz = w2 * (rz - along * ax[2]);
                for (int m = 0; m < e; m++) {
                    boolean effective = m >= 2;
                    double gx = a[FieldSample.AX] + (effective ? cx : 0);
                    double gy = a[FieldSample.AY] + (effective ? cy : 0);
                    double gz = a[FieldSample.AZ] + (effective ? cz : 0);
                    ((FieldEvaluator) ctx[m]).evaluate(x, y, z, false, b, 0);
                    double dx = b[FieldSample.AX] - gx;
                    double dy = b[FieldSample.AY] - gy;
                    double dz = b[FieldSample.AZ] - gz;
                    abs[m][i] = Math.sqrt(dx * dx + dy * dy + dz * dz);
                    // Relative to |g| (gravity alone) for both quantities: the effective acceleration vanishes where
                    // centrifugal and gravitational parts balance, so an error relative to it has no bound.
                    err[m][i] = abs[m][i] / gnorm;
                }
            }
        }, progress);
        int blank = 0;
        for (double v : err[0]) {
            if (Double.isNaN(v)) {
                blank++;
            }
        }
        // 3. Statistics and bounds per band.
        List<Interpolant> out = new java.util.ArrayList<>();
        double[] where = new double[n];
        for (int m = 0; m < e; m++) {
            List<Band> bands = new java.util.ArrayList<>();
            int order = ORDER[m % 2];
            for (int bnd = 0; bnd + 1 < BAND_EDGES.length; bnd++) {
                double lo = BAND_EDGES[bnd];
                double hi = BAND_EDGES[bnd + 1];
                boolean isDense = bnd < DENSE_BANDS;
                double scaled = 0;
                int count = 0;
                for (int i = 0; i < n; i++) {
                    double x = dist[i] / hs[i];
                    boolean in = dist[i] > 0 && x >= lo && x < hi && !Double.isNaN(err[m][i]);
                    // A sampled band uses only the independent random points (order statistics need them).
                    if (in && !isDense && i < denseEnd) {
                        in = false;
                    }
                    where[i] = in ? Location.INSIDE.code() : Location.OUTSIDE.code();
                    if (in) {
                        count++;
                        if (!isDense) {
                            scaled = Math.max(scaled, err[m][i] * Math.pow(x / lo, order));
                        }
                    }
                }
                Stats st = stats(pts, err[m], abs[m], where, true);
                double bound = Double.NaN;
                double share = Double.NaN;
                if (count > 0) {
                    if (isDense) {
                        bound = DENSE_FACTOR * st.max();
                    } else {
                        bound = FAR_FACTOR * Math.max(st.max(), scaled);
                        share = 1 - Math.pow(1 - CONFIDENCE, 1.0 / count);
                    }
                }
                bands.add(new Band(lo, hi, isDense, st, bound, share));
            }
            for (int i = 0; i < n; i++) {
                where[i] = dist[i] <= 0 ? Location.INSIDE.code() : Location.OUTSIDE.code();
            }
            out.add(new Interpolant(names.get(m)[0], names.get(m)[1], bands, stats(pts, err[m], abs[m], where, true)));
        }
        return new BoundReport(dense, perCell, randomPoints, seed, blank, out, pts, dist, hs);
    }

    /**
     * The table with its effective columns in place of the potential and acceleration (and, with the gradient,
     * the tensor plus the centrifugal part ω²(1 − âââ^T)), so that {@link TableField} interpolates the effective
     * acceleration with the same tricubic Hermite scheme.
     */
    static Table effectiveTable(Table t, Spin spin) {
        int cols = t.columnCount();
        int eff = t.column("eff_potential_m2_s2");
        int g = t.column("gxx_s2");
        double[] v = t.values().clone();
        double w2 = spin.omega() * spin.omega();
        double[] a = spin.axis();
        double[] cen = {w2 * (1 - a[0] * a[0]), -w2 * a[0] * a[1], -w2 * a[0] * a[2], w2 * (1 - a[1] * a[1]),
            -w2 * a[1] * a[2], w2 * (1 - a[2] * a[2])};
        int nodes = v.length / cols;
        for (int i = 0; i < nodes; i++) {
            int o = i * cols;
            for (int q = 0; q < 4; q++) {
                v[o + TableLayout.U + q] = v[o + eff + q];
            }
            if (g >= 0) {
                for (int q = 0; q < 6; q++) {
                    v[o + g + q] += cen[q];
                }
            }
        }
        return new Table(t.grid(), t.columns(), v, t.metadata());
    }

    /** Cells of a box or sphere grid: points by local coordinates, size and circumradius. */
    static final class CellGeometry {
        private static final double INSET = 1e-9;
        private final BoxGrid box;
        private final SphereGrid sphere;
        private final int[] n = new int[3];

        CellGeometry(Grid g) {
            if (g instanceof BoxGrid b) {
                box = b;
                sphere = null;
                for (int a = 0; a < 3; a++) {
                    n[a] = b.counts()[a] - 1;
                }
            } else if (g instanceof SphereGrid s) {
                box = null;
                sphere = s;
                n[0] = s.radii().length - 1;
                n[1] = s.latCount() - 1;
                n[2] = s.lonCount();
            } else {
                throw new IllegalArgumentException("a point table has no cells");
            }
            if (n[0] < 1 || n[1] < 1 || n[2] < 1) {
                throw new IllegalArgumentException("a table needs at least two nodes along each axis");
            }
        }

        int count() {
            return n[0] * n[1] * n[2];
        }

        /** Point at local coordinates (s, t, u) ∈ [0,1]³ of cell c, into out[off..off+2]. */
        void point(int c, double s, double t, double u, double[] out, int off) {
            // Inset by 1e-9 of a cell so that rounding never moves a face point out of the table.
            s = Math.max(INSET, Math.min(1 - INSET, s));
            t = Math.max(INSET, Math.min(1 - INSET, t));
            u = Math.max(INSET, Math.min(1 - INSET, u));
            int k = c % n[2];
            int j = (c / n[2]) % n[1];
            int i = c / (n[1] * n[2]);
            if (box != null) {
                out[off] = box.coordinate(0, i) + s * box.spacing()[0];
                out[off + 1] = box.coordinate(1, j) + t * box.spacing()[1];
                out[off + 2] = box.coordinate(2, k) + u * box.spacing()[2];
                return;
            }
            double[] r = sphere.radii();
            double rr = r[i] + s * (r[i + 1] - r[i]);
            double lat = sphere.latitude(j) + t * Math.toRadians(sphere.latStepDeg());
            double lon = sphere.longitude(k) + u * Math.toRadians(sphere.lonStepDeg());
            double[] c0 = sphere.centre();
            double cl = Math.cos(lat);
            out[off] = c0[0] + rr * cl * Math.cos(lon);
            out[off + 1] = c0[1] + rr * cl * Math.sin(lon);
            out[off + 2] = c0[2] + rr * Math.sin(lat);
        }

        /** Largest edge of cell c, m (sphere: radial step, outer meridian arc, widest parallel arc). */
        double size(int c) {
            if (box != null) {
                double[] h = box.spacing();
                return Math.max(h[0], Math.max(h[1], h[2]));
            }
            int j = (c / n[2]) % n[1];
            int i = c / (n[1] * n[2]);
            double[] r = sphere.radii();
            double dlat = Math.toRadians(sphere.latStepDeg());
            double dlon = Math.toRadians(sphere.lonStepDeg());
            double maxCos = Math.max(Math.cos(sphere.latitude(j)), Math.cos(sphere.latitude(j + 1)));
            if (sphere.latitude(j) < 0 && sphere.latitude(j + 1) > 0) {
                maxCos = 1;
            }
            return Math.max(r[i + 1] - r[i], Math.max(r[i + 1] * dlat, r[i + 1] * maxCos * dlon));
        }

        /**
         * Radius of a ball about the cell's centre point (local (½,½,½), in sc[0..2]) that holds the whole cell: the
         * largest distance to its 8 corners and 12 edge midpoints, times 1.1 for the curvature of sphere cells.
         */
        double circumradius(int c, double[] sc) {
            double cx = sc[0];
            double cy = sc[1];
            double cz = sc[2];
            double best = 0;
            for (int q = 0; q < 27; q++) {
                double s = 0.5 * (q % 3);
                double t = 0.5 * ((q / 3) % 3);
                double u = 0.5 * (q / 9);
                point(c, s, t, u, sc, 3);
                double dx = sc[3] - cx;
                double dy = sc[4] - cy;
                double dz = sc[5] - cz;
                best = Math.max(best, Math.sqrt(dx * dx + dy * dy + dz * dz));
            }
            sc[0] = cx;
            sc[1] = cy;
            sc[2] = cz;
            return box != null ? best : 1.1 * best;
        }

        /** Cell holding a point inside the table (clamped to the last cell on the far faces). */
        int cellOf(double x, double y, double z) {
            int i;
            int j;
            int k;
            if (box != null) {
                i = clamp((int) Math.floor((x - box.origin()[0]) / box.spacing()[0]), n[0]);
                j = clamp((int) Math.floor((y - box.origin()[1]) / box.spacing()[1]), n[1]);
                k = clamp((int) Math.floor((z - box.origin()[2]) / box.spacing()[2]), n[2]);
            } else {
                double[] c0 = sphere.centre();
                double dx = x - c0[0];
                double dy = y - c0[1];
                double dz = z - c0[2];
                double r = Math.sqrt(dx * dx + dy * dy + dz * dz);
                double[] rr = sphere.radii();
                int lo = 0;
                int hi = rr.length - 1;
                while (hi - lo > 1) {
                    int mid = (lo + hi) >>> 1;
                    if (rr[mid] <= r) {
                        lo = mid;
                    } else {
                        hi = mid;
                    }
                }
                i = clamp(lo, n[0]);
                double lat = Math.toDegrees(Math.atan2(dz, Math.sqrt(dx * dx + dy * dy)));
                j = clamp((int) Math.floor((lat + 90) / sphere.latStepDeg()), n[1]);
                double lon = Math.toDegrees(Math.atan2(dy, dx));
                if (lon < 0) {
                    lon += 360;
                }
                k = clamp((int) Math.floor(lon / sphere.lonStepDeg()), n[2]);
            }
            return (i * n[1] + j) * n[2] + k;
        }

        private static int clamp(int i, int n) {
            return Math.max(0, Math.min(n - 1, i));
        }
    }
}
