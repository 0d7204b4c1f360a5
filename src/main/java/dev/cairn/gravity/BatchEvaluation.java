package dev.cairn.gravity;

import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;

/**
 * Evaluates a {@link FieldModel} at many points in parallel, a chunk of {@link ParallelChunks#CHUNK} points per
 * {@link FieldEvaluator#evaluateBatch} call (so a model can evaluate several points per pass over its data). Each point
 * is computed by exactly the same arithmetic whatever the thread count and chunking, so results are bit-identical for
 * any number of threads.
 */
public final class BatchEvaluation {
    private BatchEvaluation() {
    }

    /**
     * @param model    the field
     * @param xyz      points, metres, model frame, {@code 3n} values (read)
     * @param gradient whether to compute gradient tensors
     * @param threads  worker threads (≥ 1)
     * @param progress progress listener (points done), may be {@link ProgressListener#NONE}
     * @return {@code n·}{@link FieldSample#SIZE} values, point {@code i} at offset {@code i·SIZE}
     */
    public static double[] evaluate(FieldModel model, double[] xyz, boolean gradient, int threads,
                                    ProgressListener progress) {
        int n = xyz.length / 3;
        double[] out = new double[n * FieldSample.SIZE];
        ParallelChunks.run(n, threads, model::newEvaluator,
            (ev, from, to) -> ev.evaluateBatch(xyz, from, to, gradient, out), progress);
        return out;
    }

    /** All available processors, no progress reporting. */
    public static double[] evaluate(FieldModel model, double[] xyz, boolean gradient) {
        return evaluate(model, xyz, gradient, ParallelChunks.defaultThreads(), ProgressListener.NONE);
    }
}
