package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Speed and accuracy figures of tables for one body, as text: table throughput (nodes/s), the cost of one
 * interpolated evaluation against one exact evaluation (ns), and the interpolation error against grid spacing and
 * against distance from the surface. Figures, not assertions: machines are shared and noisy, so this runs from the
 * command line ({@code cairn table --bench}) and never in unit tests.
 */
public final class TableBench {
    /** Half-width of the study box in Brillouin radii. */
    public static final double STUDY_HALF_WIDTH = 1.5;
    /** Distance-from-surface bin edges in Brillouin radii. */
    static final double[] DISTANCE_BINS = {0, 0.02, 0.05, 0.1, 0.2, 0.5, Double.POSITIVE_INFINITY};

    private TableBench() {
    }

    /**
     * The report.
     *
     * @param text printable lines
     */
    public record Report(String text) {
    }

    /** Default throughput grid: a 25³ box of half-width {@link #STUDY_HALF_WIDTH} Brillouin radii about {@code c}. */
    public static Grid defaultGrid(double[] c, double rb) {
        double h = STUDY_HALF_WIDTH * rb;
        return BoxGrid.ofCounts(new double[] {c[0] - h, c[0] + h, c[1] - h, c[1] + h, c[2] - h, c[2] + h},
            new int[] {25, 25, 25});
    }

    /**
     * Runs the benchmark and the error study.
     *
     * @param layout    grid and columns of the throughput run
     * @param spacings  study spacings as fractions of the Brillouin radius
     * @param samples   random points per study table
     */
    public static Report run(FieldModel exact, TriangleMesh mesh, TableLayout layout, double[] com, double rb,
                             double[] spacings, boolean gradient, int threads, int samples, long seed) {
        StringBuilder sb = new StringBuilder();
        // 1. Throughput (a warm-up run first so that the JIT has compiled the kernels).
        TableBuilder.compute(exact, new TableLayout(defaultGridSmall(com, rb), layout.gradient(), layout.effective(),
            false, layout.omega(), layout.spinAxis(), layout.centreOfMass()), threads, Map.of());
        long t0 = System.nanoTime();
        Table t = TableBuilder.compute(exact, layout, threads, Map.of());
        double secs = (System.nanoTime() - t0) / 1e9;
        int n = layout.grid().nodeCount();
        sb.append(String.format(Locale.ROOT, "Table throughput: %d nodes (%s grid, %d columns%s) in %.2f s = %.0f "
            + "nodes/s with %d thread(s)%n", n, layout.grid().kind(), layout.columnCount(),
            layout.gradient() ? ", with gradient" : "", secs, n / secs, threads));
        // 2. Cost of one evaluation, single thread.
        if (!(layout.grid() instanceof PointGrid)) {
            TableField tf = new TableField(t);
            double[] pts = AccuracyCheck.samplePoints(layout.grid(), 4096, seed);
            double nsTable = nsPerEval(tf.newEvaluator(), pts, 200_000, false);
            double nsTableG = nsPerEval(tf.newEvaluator(), pts, 100_000, true);
            double nsExact = nsPerEval(exact.newEvaluator(), pts, 2_000, false);
            sb.append(String.format(Locale.ROOT, "One evaluation, single thread: table %.0f ns (%.0f ns with gradient), "
                + "exact %.0f ns: %.0fx faster%n", nsTable, nsTableG, nsExact, nsExact / nsTable));
        }
        // 3. Error against spacing and distance from the surface.
        sb.append(String.format(Locale.ROOT, "Error study: boxes of half-width %.1f Brillouin radii (R = %.1f m) about "
            + "the centre of mass, %d random points each (seed %d); relative acceleration error at points outside the "
            + "body%n", STUDY_HALF_WIDTH, rb, samples, seed));
        sb.append(String.format(Locale.ROOT, "  %-10s %-9s %-8s %-10s %-10s %-10s %-10s%n", "spacing_m", "h/R", "nodes",
            "method", "max", "rms", "p99"));
        List<String> distRows = new ArrayList<>();
        for (double f : spacings) {
            double h = f * rb;
            double half = STUDY_HALF_WIDTH * rb;
            BoxGrid g = BoxGrid.ofSpacing(new double[] {com[0] - half, com[0] + half, com[1] - half, com[1] + half,
                com[2] - half, com[2] + half}, new double[] {h, h, h});
            TableLayout lg = new TableLayout(g, true, false, false, 0, new double[] {0, 0, 1}, com);
            Table full = TableBuilder.compute(exact, lg, threads, Map.of());
            Table valuesOnly = dropGradient(full);
            for (Table tab : new Table[] {full, valuesOnly}) {
                boolean withG = tab == full;
                AccuracyCheck.Report rep = AccuracyCheck.run(new TableField(tab), exact, samples, seed, threads,
                    ProgressListener.NONE);
                AccuracyCheck.Stats s = rep.outside();
                sb.append(String.format(Locale.ROOT, "  %-10.1f %-9.3f %-8d %-10s %-10.3e %-10.3e %-10.3e%n", h, f,
                    g.nodeCount(), withG ? "hermite" : "values", s.max(), s.rms(), s.p99()));
                distRows.add(distanceRow(h, f, withG ? "hermite" : "values", rep, mesh, rb));
            }
        }
        sb.append("Error against distance d from the surface (bins in Brillouin radii R): rms / max relative error, "
            + "[points]\n");
        StringBuilder head = new StringBuilder(String.format(Locale.ROOT, "  %-10s %-8s", "spacing_m", "method"));
        for (int b = 0; b + 1 < DISTANCE_BINS.length; b++) {
            head.append(String.format(Locale.ROOT, " %-26s", "d/R " + DISTANCE_BINS[b] + "-" + DISTANCE_BINS[b + 1]));
        }
        sb.append(head).append('\n');
        for (String r : distRows) {
            sb.append(r).append('\n');
        }
        return new Report(sb.toString());
    }

    private static Grid defaultGridSmall(double[] c, double rb) {
        double h = STUDY_HALF_WIDTH * rb;
        return BoxGrid.ofCounts(new double[] {c[0] - h, c[0] + h, c[1] - h, c[1] + h, c[2] - h, c[2] + h},
            new int[] {8, 8, 8});
    }

    private static String distanceRow(double h, double f, String method, AccuracyCheck.Report rep, TriangleMesh mesh,
                                      double rb) {
        int bins = DISTANCE_BINS.length - 1;
        double[] sum2 = new double[bins];
        double[] max = new double[bins];
        int[] cnt = new int[bins];
        double[] p = rep.points();
        dev.cairn.mascon.SurfaceQuery surface = new dev.cairn.mascon.SurfaceQuery(mesh);
        double[] w = new double[4];
        for (int i = 0; i < rep.samples(); i++) {
            if (rep.where()[i] != Location.OUTSIDE.code() || Double.isNaN(rep.errors()[i])) { // exact code comparison
                continue;
            }
            double d = Math.abs(surface.signedDistance(p[3 * i], p[3 * i + 1], p[3 * i + 2], w)) / rb;
            for (int b = 0; b < bins; b++) {
                if (d >= DISTANCE_BINS[b] && d < DISTANCE_BINS[b + 1]) {
                    double e = rep.errors()[i];
                    sum2[b] += e * e;
                    max[b] = Math.max(max[b], e);
                    cnt[b]++;
                }
            }
        }
        StringBuilder sb = new StringBuilder(String.format(Locale.ROOT, "  %-10.1f %-8s", h, method));
        for (int b = 0; b < bins; b++) {
            sb.append(cnt[b] == 0 ? String.format(Locale.ROOT, " %-26s", "-")
                : String.format(Locale.ROOT, " %-26s", String.format(Locale.ROOT, "%.1e / %.1e [%d]",
                Math.sqrt(sum2[b] / cnt[b]), max[b], cnt[b])));
        }
        return sb.toString();
    }

    /** The same table without its gradient columns (so it is interpolated from values alone). */
    public static Table dropGradient(Table t) {
        int g = t.column("gxx_s2");
        if (g < 0) {
            return t;
        }
        int cols = t.columnCount();
        int nc = cols - 6;
        int n = t.values().length / cols;
        double[] v = new double[n * nc];
        for (int i = 0; i < n; i++) {
            System.arraycopy(t.values(), i * cols, v, i * nc, g);
            System.arraycopy(t.values(), i * cols + g + 6, v, i * nc + g, cols - g - 6);
        }
        List<String> c = new ArrayList<>(t.columns());
        c.subList(g, g + 6).clear();
        return new Table(t.grid(), c, v, t.metadata());
    }

    private static double nsPerEval(FieldEvaluator ev, double[] pts, int evals, boolean gradient) {
        double[] out = new double[FieldSample.SIZE];
        int m = pts.length / 3;
        double sink = 0;
        for (int rep = 0; rep < 2; rep++) { // first pass warms up the JIT
            long t0 = System.nanoTime();
            for (int i = 0; i < evals; i++) {
                int k = i % m;
                ev.evaluate(pts[3 * k], pts[3 * k + 1], pts[3 * k + 2], gradient, out, 0);
                sink += out[FieldSample.AX];
            }
            if (rep == 1) {
                double ns = (System.nanoTime() - t0) / (double) evals;
                return sink == 0.123456789 ? ns + 1e-300 : ns; // keep the loop from being optimised away
            }
        }
        return Double.NaN;
    }
}
