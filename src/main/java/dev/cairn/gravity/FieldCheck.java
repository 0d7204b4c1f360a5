package dev.cairn.gravity;

import dev.cairn.util.ProgressListener;
import java.util.LinkedHashMap;
import java.util.Locale;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * The measured accuracy of an approximate field model against its exact counterpart ({@link FieldModel#exactModel()})
 * on points sampled from a job's own points: the largest relative errors of |g| and of U, each relative to the exact
 * value at the point. What every command that uses the hierarchical field reports beside its stated tolerance.
 *
 * @param model      description of the model checked
 * @param samples    points compared (0 when the model is exact: nothing to check)
 * @param maxRelG    largest |Δg|/|g| (0 when exact)
 * @param maxRelU    largest |ΔU|/U
 */
public record FieldCheck(String model, int samples, double maxRelG, double maxRelU) {
    /** Points sampled by default. */
    public static final int DEFAULT_SAMPLES = 200;

    /**
     * Samples up to {@code samples} of the {@code n = xyz.length/3} points (seeded, without repetition when n is
     * small) and compares {@code model} with its exact counterpart.
     */
    public static FieldCheck measure(FieldModel model, double[] xyz, int samples, long seed, int threads) {
        FieldModel exact = model.exactModel();
        int n = xyz.length / 3;
        if (exact == model || n == 0 || samples <= 0) {
            return new FieldCheck(model.describe(), 0, 0, 0);
        }
        int k = Math.min(samples, n);
        double[] pts = new double[3 * k];
        SplittableRandom rnd = new SplittableRandom(seed);
        for (int i = 0; i < k; i++) {
            int j = k == n ? i : rnd.nextInt(n);
            System.arraycopy(xyz, 3 * j, pts, 3 * i, 3);
        }
        double[] a = BatchEvaluation.evaluate(model, pts, false, threads, ProgressListener.NONE);
        double[] b = BatchEvaluation.evaluate(exact, pts, false, threads, ProgressListener.NONE);
        double eg = 0;
        double eu = 0;
        for (int i = 0; i < k; i++) {
            int o = i * FieldSample.SIZE;
            double dx = a[o + FieldSample.AX] - b[o + FieldSample.AX];
            double dy = a[o + FieldSample.AY] - b[o + FieldSample.AY];
            double dz = a[o + FieldSample.AZ] - b[o + FieldSample.AZ];
            double gn = FieldSample.accelerationNorm(b, o);
            if (gn > 0) {
                eg = Math.max(eg, Math.sqrt(dx * dx + dy * dy + dz * dz) / gn);
            }
            double u = Math.abs(b[o + FieldSample.U]);
            if (u > 0) {
                eu = Math.max(eu, Math.abs(a[o + FieldSample.U] - b[o + FieldSample.U]) / u);
            }
        }
        return new FieldCheck(model.describe(), k, eg, eu);
    }

    /** One line for the terminal. */
    public String line() {
        if (samples == 0) {
            return "field: " + model + " (exact direct sum)";
        }
        return String.format(Locale.ROOT, "field: %s; measured against the exact sum on %d sampled points: max "
            + "relative error |g| %.2e, U %.2e", model, samples, maxRelG, maxRelU);
    }

    /** Keys for JSON reports and sidecars. */
    public Map<String, Object> json() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("model", model);
        m.put("exact", samples == 0);
        m.put("check_samples", samples);
        m.put("max_relative_error_g", maxRelG);
        m.put("max_relative_error_u", maxRelU);
        return m;
    }
}
