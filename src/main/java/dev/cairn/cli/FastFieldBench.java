package dev.cairn.cli;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldCheck;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.HierarchicalField;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import dev.cairn.surface.Survey;
import dev.cairn.surface.SurveyParameters;
import dev.cairn.surface.SurveyResult;
import dev.cairn.surface.SurveyTarget;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.util.Locale;

/**
 * Benchmark of the hierarchical field printed by {@code cairn bench --fast-field}: per body and tolerance the
 * build time, memory per facet, throughput on facet centroids (the survey's workload) and on points of a shell
 * at 1.5 Brillouin radii (a table's), the fraction of points that fell back to the exact sum, and the largest
 * relative errors of |g| and U against the exact sum on sampled facet centroids; side by side, the exact direct
 * sum's throughput on the same points in the same run. Optionally a whole survey of the largest body. Figures,
 * not assertions.
 */
final class FastFieldBench {
    private FastFieldBench() {
    }

    static void run(PrintWriter out, TriangleMesh demo, String demoName, double demoDensity, int[] levels,
                    double[] tolerances, int checks, int threads, boolean survey) {
        out.println("Hierarchical field (threads " + threads + "; errors relative to the exact sum at each point):");
        out.println("body                      facets  tol      p  theta build_s  B/facet  centroid_pts/s  "
            + "exact_pts/s  speed-up  shell_pts/s  fallback  max_err_g  max_err_U");
        TriangleMesh last = demo;
        double lastDensity = demoDensity;
        String lastName = demoName;
        if (demo != null) {
            body(out, demoName, demo, demoDensity, tolerances, checks, threads);
        }
        for (int level : levels) {
            TriangleMesh m = Shapes.lumpyIcosphere(level, 1000, 0.3, 7);
            body(out, "lumpy icosphere level " + level, m, 2000, tolerances, checks, threads);
            last = m;
            lastDensity = 2000;
            lastName = "lumpy icosphere level " + level;
        }
        if (survey && last != null) {
            PolyhedronField exact = new PolyhedronField(last, lastDensity);
            long t0 = System.nanoTime();
            HierarchicalField h = new HierarchicalField(last, exact, 1e-9, threads);
            double build = (System.nanoTime() - t0) / 1e9;
            SurveyTarget t = new SurveyTarget(lastName, null, last, dev.cairn.mesh.EdgeTable.of(last), h,
                centroid(last), new SpinState(5.2 * 3600, new double[] {0, 0, 1}), lastDensity, exact.volume());
            SurveyResult r = Survey.run(t, new SurveyParameters(15, 25, 10, null, threads), ProgressListener.NONE);
            FieldCheck c = r.fieldCheck();
            out.printf(Locale.ROOT, "Survey of %s (%d facets) at tolerance 1e-9: build %.1f s + survey %.1f s (field "
                + "stage %.1f s) = %.1f s; measured max relative error on %d sampled facets: |g| %.2e, U %.2e%n",
                lastName, last.facetCount(), build, r.seconds(), r.stageSeconds()[0], build + r.seconds(), c.samples(),
                c.maxRelG(), c.maxRelU());
        }
        out.flush();
    }

    private static double[] centroid(TriangleMesh m) {
        dev.cairn.mass.MassProperties mp = dev.cairn.mass.MassPropertiesCalculator.compute(m, 1.0);
        return mp.centerOfMass();
    }

    private static void body(PrintWriter out, String name, TriangleMesh m, double density, double[] tolerances,
                             int checks, int threads) {
        PolyhedronField exact = new PolyhedronField(m, density);
        int nf = m.facetCount();
        int n = Math.min(nf, 20000);
        double[] cen = new double[3 * n];
        double[] xyz = m.xyz();
        int[] tri = m.tri();
        for (int i = 0; i < n; i++) {
            int f = (int) ((long) i * nf / n);
            for (int k = 0; k < 3; k++) {
                cen[3 * i + k] = (xyz[3 * tri[3 * f] + k] + xyz[3 * tri[3 * f + 1] + k] + xyz[3 * tri[3 * f + 2] + k])
                    / 3;
            }
        }
        double rb = exact.expansion().brillouinRadius();
        double[] c = exact.expansion().centre();
        double[] shell = BenchCommand.shellPoints(n, 1.5 * rb, c, 3);
        // the exact sum on a subset of the same centroids, in the same run
        int ne = Math.max(20, (int) Math.min(n, 4e9 / ((long) nf * 40)));
        double[] sub = java.util.Arrays.copyOf(cen, 3 * ne);
        BatchEvaluation.evaluate(exact, java.util.Arrays.copyOf(sub, 3 * Math.min(ne, 20)), false, threads,
            ProgressListener.NONE);
        long e0 = System.nanoTime();
        BatchEvaluation.evaluate(exact, sub, false, threads, ProgressListener.NONE);
        double exactRate = ne / ((System.nanoTime() - e0) / 1e9);
        for (double tol : tolerances) {
            long t0 = System.nanoTime();
            HierarchicalField h = new HierarchicalField(m, exact, tol, threads);
            double build = (System.nanoTime() - t0) / 1e9;
            BatchEvaluation.evaluate(h, java.util.Arrays.copyOf(cen, 3 * Math.min(n, 2000)), false, threads,
                ProgressListener.NONE); // warm-up
            long f0 = h.fallbacks();
            long v0 = h.evaluations();
            long t1 = System.nanoTime();
            BatchEvaluation.evaluate(h, cen, false, threads, ProgressListener.NONE);
            double rate = n / ((System.nanoTime() - t1) / 1e9);
            long t2 = System.nanoTime();
            BatchEvaluation.evaluate(h, shell, false, threads, ProgressListener.NONE);
            double shellRate = n / ((System.nanoTime() - t2) / 1e9);
            double fb = (double) (h.fallbacks() - f0) / (h.evaluations() - v0);
            FieldCheck chk = FieldCheck.measure(h, cen, checks, 99, threads);
            out.printf(Locale.ROOT, "%-24s %8d  %.0e %3d  %.2f %7.1f %8.0f  %14.0f  %11.0f  %8.1f  %11.0f  %8.1e  "
                + "%9.2e  %9.2e%n", name, nf, tol, h.degree(), h.openingRatio(), build, h.bytesPerFacet(), rate,
                exactRate, rate / exactRate, shellRate, fb, chk.maxRelG(), chk.maxRelU());
            out.flush();
        }
        assert FieldSample.SIZE > 0;
    }
}
