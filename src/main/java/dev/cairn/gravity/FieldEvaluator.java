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
}
