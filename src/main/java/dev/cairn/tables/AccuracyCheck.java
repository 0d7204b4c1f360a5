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
                    p[3 * i + a] = Math.min(hi, lo + (hi - lo) * rnd.nextDouble());
                }
            } else if (grid instanceof SphereGrid s) {
                double[] r = s.radii();
                double[] c = s.centre();
                double rr = Math.min(r[r.length - 1], r[0] + (r[r.length - 1] - r[0]) * rnd.nextDouble());
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
}
