package dev.cairn.gravity;

/**
 * Evaluates a field at single points. An evaluator owns scratch space and is <b>not</b> thread-safe: use one per
 * thread (see {@link FieldModel#newEvaluator()}).
 */
public interface FieldEvaluator {
    /**
     * Evaluates the field at {@code (x, y, z)}, metres, model frame.
     *
     * @param gradient whether to compute the gradient tensor (slots {@code GXX..GZZ}; NaN otherwise)
     * @param out      receives {@link FieldSample#SIZE} values starting at {@code offset} (modified)
     */
    void evaluate(double x, double y, double z, boolean gradient, double[] out, int offset);

    /**
     * Evaluates the field at points {@code from} (inclusive) to {@code to} (exclusive) of {@code xyz} (metres, model
     * frame, 3 values per point; read); point {@code i} goes to {@code out[i·SIZE .. (i+1)·SIZE)} (modified). A model
     * may override this to evaluate several points per pass over its data, but each point's result must be the same,
     * bit for bit, as {@link #evaluate} gives it, whichever other points share the call.
     */
    default void evaluateBatch(double[] xyz, int from, int to, boolean gradient, double[] out) {
        for (int i = from; i < to; i++) {
            evaluate(xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2], gradient, out, i * FieldSample.SIZE);
        }
    }
}
