package dev.cairn.bench;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.util.Locale;
import java.util.SplittableRandom;

/**
 * Side-by-side timing of the product polyhedron kernel ({@link PolyhedronField}) and the straightforward baseline
 * ({@link ReferenceKernel}) on the same body, the same points, in the same run: facet-evaluations per second
 * (points × facets / time, potential + acceleration, best of {@code repeat} after a warm-up, the runs of the two
 * kernels alternating) on 1 thread and on
 * {@code threads} threads, the speed-up, and the largest relative difference of U and of g between the two; then, on
 * one thread, the same with the gradient tensor and at facet centroids (the survey's workload, where the kernel's
 * on-facet and near-edge branches are taken).
 * Figures, not assertions (shared machines are noisy: only the ratio within one run means much).
 */
public final class KernelBench {
    private KernelBench() {
    }

    /**
     * Times both kernels and prints one block of lines to {@code out}.
     *
     * @param label   name of the body in the report
     * @param mesh    closed outward mesh, metres
     * @param xyz     field points, metres (3 per point; read)
     * @param repeat  timed runs per configuration (the best counts), at least 1
     * @param threads the second thread count to time besides 1
     */
    public static void run(PrintWriter out, String label, TriangleMesh mesh, double density, double[] xyz,
                           int repeat, int threads) {
        PolyhedronField product = new PolyhedronField(mesh, density);
        ReferenceKernel baseline = new ReferenceKernel(mesh, density);
        int n = xyz.length / 3;
        out.printf(Locale.ROOT, "Kernel vs baseline on %s: %d facets, %d points; product path: %s%n", label,
            product.facetCount(), n, PolyhedronField.VECTOR_PATH ? "vector lanes" : "scalar (no jdk.incubator.vector)");
        double[] centroids = everyKth(mesh.facetCentroids(), n);
        warmUp(product, xyz, centroids);
        warmUp(baseline, xyz, centroids);
        double[] ref = BatchEvaluation.evaluate(baseline, xyz, false, threads, ProgressListener.NONE);
        double[] res = BatchEvaluation.evaluate(product, xyz, false, threads, ProgressListener.NONE);
        double[] rate = new double[4];
        int[] counts = {1, threads};
        for (int c = 0; c < 2; c++) {
            double[] r = rates(baseline, product, xyz, repeat, counts[c], product.facetCount(), false);
            rate[2 * c] = r[0];
            rate[2 * c + 1] = r[1];
            out.printf(Locale.ROOT, "  threads %d: baseline %.1f M facet-evaluations/s, kernel %.1f M/s, speed-up %.2fx%n",
                counts[c], rate[2 * c] / 1e6, rate[2 * c + 1] / 1e6, rate[2 * c + 1] / rate[2 * c]);
        }
        double du = 0;
        double dg = 0;
        for (int i = 0; i < n; i++) {
            int o = i * FieldSample.SIZE;
            du = Math.max(du, Math.abs(res[o + FieldSample.U] - ref[o + FieldSample.U]) / Math.abs(ref[o + FieldSample.U]));
            double ex = res[o + FieldSample.AX] - ref[o + FieldSample.AX];
            double ey = res[o + FieldSample.AY] - ref[o + FieldSample.AY];
            double ez = res[o + FieldSample.AZ] - ref[o + FieldSample.AZ];
            dg = Math.max(dg, Math.sqrt(ex * ex + ey * ey + ez * ez) / FieldSample.accelerationNorm(ref, o));
        }
        out.printf(Locale.ROOT, "  max relative difference kernel vs baseline: U %.1e, g %.1e%n", du, dg);
        double[] gr = rates(baseline, product, xyz, repeat, 1, product.facetCount(), true);
        double gBase = gr[0];
        double gKernel = gr[1];
        out.printf(Locale.ROOT, "  with gradient tensor, threads 1: baseline %.1f M/s, kernel %.1f M/s, speed-up %.2fx%n",
            gBase / 1e6, gKernel / 1e6, gKernel / gBase);
        double[] cr = rates(baseline, product, centroids, repeat, 1, product.facetCount(), false);
        double cBase = cr[0];
        double cKernel = cr[1];
        out.printf(Locale.ROOT, "  at %d facet centroids (survey workload), threads 1: baseline %.1f M/s, kernel %.1f M/s, "
            + "speed-up %.2fx%n", centroids.length / 3, cBase / 1e6, cKernel / 1e6, cKernel / cBase);
    }

    /** {@code n} points (or all if fewer) spread evenly through the 3-value records of {@code xyz}. */
    private static double[] everyKth(double[] xyz, int n) {
        int total = xyz.length / 3;
        int m = Math.min(n, total);
        double[] out = new double[3 * m];
        for (int i = 0; i < m; i++) {
            int k = (int) ((long) i * total / m);
            System.arraycopy(xyz, 3 * k, out, 3 * i, 3);
        }
        return out;
    }

    /** About 3 s of short batches of every timed kind, so the JIT has compiled every branch before timing. */
    private static void warmUp(FieldModel model, double[] xyz, double[] centroids) {
        double[] few = java.util.Arrays.copyOf(xyz, Math.min(xyz.length, 3 * 16));
        double[] fewC = java.util.Arrays.copyOf(centroids, Math.min(centroids.length, 3 * 16));
        long until = System.nanoTime() + 3_000_000_000L;
        for (int k = 0; System.nanoTime() < until; k++) {
            BatchEvaluation.evaluate(model, k % 3 == 2 ? fewC : few, k % 3 == 1, 1, ProgressListener.NONE);
        }
    }

    /**
     * Best facet-evaluations per second of {@code a} and of {@code b} over {@code repeat} runs each, the runs of the two
     * alternating so that both see the same load of a shared machine.
     */
    private static double[] rates(FieldModel a, FieldModel b, double[] xyz, int repeat, int threads, int facets,
                                  boolean gradient) {
        double bestA = Double.POSITIVE_INFINITY;
        double bestB = Double.POSITIVE_INFINITY;
        for (int k = 0; k < repeat; k++) {
            bestA = Math.min(bestA, seconds(a, xyz, threads, gradient));
            bestB = Math.min(bestB, seconds(b, xyz, threads, gradient));
        }
        double evals = (double) (xyz.length / 3) * facets;
        return new double[] {evals / bestA, evals / bestB};
    }

    private static double seconds(FieldModel model, double[] xyz, int threads, boolean gradient) {
        long t0 = System.nanoTime();
        BatchEvaluation.evaluate(model, xyz, gradient, threads, ProgressListener.NONE);
        return (System.nanoTime() - t0) / 1e9;
    }

    /**
     * A lumpy, flattened icosphere of {@code 20·4^level} facets (level 6: 81 920), mean radius {@code radius} metres:
     * each vertex of {@link Shapes#icosphere} is moved radially by a few smooth bumps and a little seeded noise and the
     * axes are scaled 1 : 0.8 : 0.6. Star-shaped, so closed and outward like the sphere it comes from.
     */
    public static TriangleMesh lumpyIcosphere(int level, double radius, long seed) {
        TriangleMesh s = Shapes.icosphere(level, 1.0);
        double[] xyz = s.xyz().clone();
        SplittableRandom rnd = new SplittableRandom(seed);
        for (int i = 0; i < xyz.length; i += 3) {
            double x = xyz[i];
            double y = xyz[i + 1];
            double z = xyz[i + 2];
            double f = 1 + 0.12 * Math.sin(3 * x + 1) * Math.cos(2 * y) + 0.08 * Math.cos(5 * z - 2 * x)
                + 0.01 * (2 * rnd.nextDouble() - 1);
            xyz[i] = radius * f * x;
            xyz[i + 1] = radius * f * 0.8 * y;
            xyz[i + 2] = radius * f * 0.6 * z;
        }
        return new TriangleMesh(xyz, s.tri());
    }

    /** {@code n} seeded random points on the sphere of radius {@code r} about {@code c}. */
    public static double[] shellPoints(int n, double r, double[] c, long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        double[] xyz = new double[3 * n];
        for (int i = 0; i < n; i++) {
            double z = 2 * rnd.nextDouble() - 1;
            double phi = 2 * Math.PI * rnd.nextDouble();
            double s = Math.sqrt(1 - z * z);
            xyz[3 * i] = c[0] + r * s * Math.cos(phi);
            xyz[3 * i + 1] = c[1] + r * s * Math.sin(phi);
            xyz[3 * i + 2] = c[2] + r * z;
        }
        return xyz;
    }

    /** Radius of the smallest sphere about the vertex centroid that holds every vertex, and that centroid. */
    public static double[] enclosingSphere(TriangleMesh mesh) {
        double[] p = mesh.xyz();
        int nv = mesh.vertexCount();
        double cx = 0;
        double cy = 0;
        double cz = 0;
        for (int i = 0; i < p.length; i += 3) {
            cx += p[i];
            cy += p[i + 1];
            cz += p[i + 2];
        }
        cx /= nv;
        cy /= nv;
        cz /= nv;
        double r2 = 0;
        for (int i = 0; i < p.length; i += 3) {
            double dx = p[i] - cx;
            double dy = p[i + 1] - cy;
            double dz = p[i + 2] - cz;
            r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
        }
        return new double[] {Math.sqrt(r2), cx, cy, cz};
    }
}
