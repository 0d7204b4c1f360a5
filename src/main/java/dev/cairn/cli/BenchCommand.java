package dev.cairn.cli;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.HierarchicalField;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.util.Locale;
import java.util.SplittableRandom;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code cairn bench}: throughput of the polyhedron kernel in facet-evaluations per second (points × facets / time,
 * potential + acceleration), single thread and all threads, and bytes of precomputed state per facet; then the same
 * kernel side by side with the straightforward baseline ({@link dev.cairn.bench.KernelBench}, on the model and, with
 * {@code --lumpy-level}, on a generated lumpy icosphere); then the mascon kernel in point-mass evaluations per second on a tetrahedral mascon set of the same body. Figures, not
 * assertions: machines are shared and noisy, so speed targets are checked here and never in unit tests.
 */
@Command(name = "bench", mixinStandardHelpOptions = true,
    header = "Measure the speed of the field kernels (figures, not tests).",
    description = "Measure polyhedron field throughput on a model (default: the demo body).")
public final class BenchCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Option(names = "--points", paramLabel = "N", description = "Field points per timed run (default ${DEFAULT-VALUE}).")
    int points = 400;

    @Option(names = "--repeat", paramLabel = "N", description = "Timed runs per configuration; the best counts "
        + "(default ${DEFAULT-VALUE}).")
    int repeat = 3;

    @Option(names = "--mascons", paramLabel = "N", description = "Also time a tetrahedral mascon set of about N "
        + "point masses (0: skip; default ${DEFAULT-VALUE}; the count made is a whole number per facet, printed "
        + "beside N when it differs).")
    int mascons = 20000;

    @Option(names = "--fast-field", description = "Also benchmark the hierarchical field: build time, memory, "
        + "throughput beside the exact sum, and measured error, per body and tolerance.")
    boolean fastField;

    @Option(names = "--lumpy-levels", split = ",", paramLabel = "L", description = "With --fast-field: also on "
        + "invented lumpy icospheres of these levels (20*4^L facets; 6 = 81,920, 7 = 327,680, 8 = 1,310,720).")
    int[] lumpyLevels = new int[0];

    @Option(names = "--tolerances", split = ",", paramLabel = "REL", description = "With --fast-field: tolerances "
        + "(default: 1e-6,1e-9,1e-12).")
    double[] tolerances = {1e-6, 1e-9, 1e-12};

    @Option(names = "--check-samples", paramLabel = "N", description = "With --fast-field: facet centroids compared "
        + "with the exact sum (default: ${DEFAULT-VALUE}).")
    int checkSamples = 1000;

    @Option(names = "--survey-largest", description = "With --fast-field: also time a whole survey of the largest "
        + "body at tolerance 1e-9.")
    boolean surveyLargest;
    @Option(names = "--harmonics", description = "Also time spherical-harmonic coefficients (degrees "
        + "--harmonics-degrees) on this body and on a generated lumpy body (--harmonics-level), beside the direct "
        + "baseline.")
    boolean harmonics;

    @Option(names = "--harmonics-degrees", split = ",", paramLabel = "N", description = "With --harmonics: degrees "
        + "(default: 10,20,50).")
    int[] harmonicsDegrees = {10, 20, 50};

    @Option(names = "--harmonics-level", paramLabel = "L", description = "With --harmonics: icosphere level of the "
        + "large lumpy body, 0 (none) to 8 (1.3 M facets; default ${DEFAULT-VALUE}).")
    int harmonicsLevel = 8;

    @Option(names = "--harmonics-baseline", description = "With --harmonics: also run the (slow) direct baseline on "
        + "the large body.")
    boolean harmonicsBaseline;

    @Option(names = "--skip-baseline", description = "Do not time the straightforward baseline kernel beside the "
        + "product kernel (timed by default on the same body and points).")
    boolean skipBaseline;

    @Option(names = "--lumpy-level", paramLabel = "L", description = "Also compare kernel and baseline on a generated "
        + "lumpy icosphere of 20·4^L facets (6: 81 920; 0: skip; default ${DEFAULT-VALUE}).")
    int lumpyLevel = 0;

    @Option(names = "--motion", description = "Only benchmark motion: trajectory steps/s and field evaluations "
        + "(exact, hierarchical, table) and the deployment Monte Carlo beside its baseline (MotionBench).")
    boolean motion;

    @Option(names = "--motion-samples", paramLabel = "N", description = "With --motion: deployment samples "
        + "(default ${DEFAULT-VALUE}).")
    int motionSamples = 1000;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        if (lumpyLevel < 0 || lumpyLevel > 8) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(),
                "--lumpy-level: " + lumpyLevel + " is outside 0..8 (8: 1.3 M facets)");
        }
        // Sizes first, before anything is loaded or allocated (points: 3 doubles in, about 20 doubles out each).
        TableCommand.requireCount("--points", points, 10_000_000);
        if (points < 1 || repeat < 1 || repeat > 1000) {
            throw new InputException("--points and --repeat: need 1 <= points and 1 <= repeat <= 1000, got " + points
                + " and " + repeat);
        }
        MasconOptions.requireMasconCount("--mascons", mascons, true);
        dev.cairn.io.MemoryBudget.require(200.0 * points, "--points " + points);
        BodyModel body = model.load(null);
        if (!body.hasDensity()) {
            body = dev.cairn.body.ModelLoader.load(model.modelPath(),
                new dev.cairn.body.ModelRequest(model.units, 2000.0, null, null, null, null));
        }
        if (motion) {
            if (motionSamples < 2 || motionSamples > 100_000) {
                throw new InputException("--motion-samples: 2 to 100000, got " + motionSamples);
            }
            MotionBench.run(spec.commandLine().getOut(), body, motionSamples, ParallelChunks.defaultThreads());
            spec.commandLine().getOut().flush();
            return 0;
        }
        PolyhedronField field = body.polyhedronField();
        PrintWriter out = spec.commandLine().getOut();
        double r = 1.5 * body.massProperties().brillouinRadius();
        double[] c = body.massProperties().centerOfMass();
        double[] xyz = shellPoints(points, r, c, 42);
        int all = ParallelChunks.defaultThreads();
        out.printf(Locale.ROOT, "Model: %s, %d facets, %d vertices, %d edges%n", body.source(), field.facetCount(),
            field.vertexCount(), field.edgeCount());
        out.printf(Locale.ROOT, "Precomputed state: %.1f bytes/facet%n", field.bytesPerFacet());
        // Warm-up so the JIT has compiled the kernel (not only its loops on-stack) before timing: a few seconds'
        // worth of short batches, which makes the evaluate method itself hot.
        double[] warm = shellPoints(8, r, c, 7);
        long warmUntil = System.nanoTime() + 3_000_000_000L;
        while (System.nanoTime() < warmUntil) {
            BatchEvaluation.evaluate(field, warm, false, 1, ProgressListener.NONE);
        }
        for (int threads : new int[] {1, all}) {
            double best = Double.POSITIVE_INFINITY;
            for (int k = 0; k < repeat; k++) {
                long t0 = System.nanoTime();
                BatchEvaluation.evaluate(field, xyz, false, threads, ProgressListener.NONE);
                best = Math.min(best, (System.nanoTime() - t0) / 1e9);
            }
            double rate = (double) points * field.facetCount() / best;
            out.printf(Locale.ROOT, "threads %d: %d points in %.3f s = %.1f M facet-evaluations/s (%.1f M per thread)%n",
                threads, points, best, rate / 1e6, rate / 1e6 / threads);
        }
        if (!skipBaseline) {
            dev.cairn.bench.KernelBench.run(out, body.source().toString(), body.mesh(), field.density(), xyz, repeat,
                all);
        }
        if (lumpyLevel > 0) {
            dev.cairn.mesh.TriangleMesh lumpy = dev.cairn.bench.KernelBench.lumpyIcosphere(lumpyLevel, 1000.0, 6);
            double[] sphere = dev.cairn.bench.KernelBench.enclosingSphere(lumpy);
            double[] pts = dev.cairn.bench.KernelBench.shellPoints(points, 1.5 * sphere[0],
                new double[] {sphere[1], sphere[2], sphere[3]}, 42);
            dev.cairn.bench.KernelBench.run(out, "lumpy icosphere level " + lumpyLevel, lumpy, field.density(), pts,
                repeat, all);
        }
        if (mascons > 0) {
            benchMascons(out, body, xyz, all);
        }
        if (harmonics) {
            if (harmonicsLevel < 0 || harmonicsLevel > 8) {
                throw new InputException("--harmonics-level: 0 to 8, got " + harmonicsLevel);
            }
            for (int n : harmonicsDegrees) {
                if (n < 0 || n > dev.cairn.gravity.HarmonicCoefficients.MAX_DEGREE) {
                    throw new InputException("--harmonics-degrees: 0 to "
                        + dev.cairn.gravity.HarmonicCoefficients.MAX_DEGREE + ", got " + n);
                }
            }
            HarmonicsBench.run(out, body.mesh(), body.name(), body.density(), harmonicsDegrees, harmonicsLevel,
                harmonicsBaseline, all);
        }
        if (fastField) {
            for (int l : lumpyLevels) {
                if (l < 1 || l > 9) {
                    throw new dev.cairn.io.InputException("--lumpy-levels: levels 1 to 9, got " + l);
                }
            }
            for (double t : tolerances) {
                if (!(t >= HierarchicalField.MIN_TOLERANCE && t <= HierarchicalField.MAX_TOLERANCE)) {
                    throw new dev.cairn.io.InputException("--tolerances: " + t + " is outside 1e-13 to 1e-2");
                }
            }
            if (checkSamples < 1 || checkSamples > 100000) {
                throw new dev.cairn.io.InputException("--check-samples: 1 to 100000, got " + checkSamples);
            }
            FastFieldBench.run(out, body.mesh(), body.name(), body.density(), lumpyLevels, tolerances, checkSamples,
                all, surveyLargest);
        }
        out.flush();
        return 0;
    }

    /** Mascon kernel throughput in point-mass evaluations per second (points × mascons / time). */
    private void benchMascons(PrintWriter out, BodyModel body, double[] xyz, int all) {
        dev.cairn.mascon.MasconField field = new dev.cairn.mascon.MasconField(
            MasconOptions.generate(body, "tetra", mascons, all));
        out.printf(Locale.ROOT, "Mascons: %s%n", field.describe());
        int facets = body.mesh().facetCount();
        if (field.count() != mascons) {
            // --mascons N cannot always be met exactly: say what was made and why
            out.printf(Locale.ROOT, "Mascons: %d requested, %d made: the tetrahedral scheme puts the same whole number "
                + "(divisions^2 x shells) under each of the %d facets, so the count is a multiple of %d%s%n", mascons,
                field.count(), facets, facets, mascons < facets ? ", at least one per facet" : " near the request");
        }
        BatchEvaluation.evaluate(field, xyz, false, all, ProgressListener.NONE);
        for (int threads : new int[] {1, all}) {
            double best = Double.POSITIVE_INFINITY;
            for (int k = 0; k < repeat; k++) {
                long t0 = System.nanoTime();
                BatchEvaluation.evaluate(field, xyz, false, threads, ProgressListener.NONE);
                best = Math.min(best, (System.nanoTime() - t0) / 1e9);
            }
            double rate = (double) points * field.count() / best;
            out.printf(Locale.ROOT, "threads %d: %d points in %.3f s = %.1f M point-mass evaluations/s (%.1f M per "
                + "thread)%n", threads, points, best, rate / 1e6, rate / 1e6 / threads);
        }
    }

    /** {@code n} seeded random points on the sphere of radius {@code r} about {@code c}. */
    static double[] shellPoints(int n, double r, double[] c, long seed) {
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
}
