package dev.cairn.gravity;

/**
 * A gravity field model of one body: the constant-density polyhedron, a set of mascons, a superposition of
 * regions, an interpolated table, ...
 *
 * <p>Implementations are immutable and thread-safe; per-thread scratch lives in the {@link FieldEvaluator}s they
 * hand out. Units SI, model (body-fixed) frame, sign convention of {@link FieldSample} (U &gt; 0, g = ∇U).
 * {@link BatchEvaluation} evaluates many points in parallel with results that do not depend on the thread count.
 */
public interface FieldModel {
    /** A new evaluator with its own scratch space, for use by one thread. */
    FieldEvaluator newEvaluator();

    /** Total {@code G·M} of the model, m^3/s^2. */
    double gm();

    /** One-line human description, e.g. "constant-density polyhedron, 20000 facets, 2100 kg/m^3". */
    String describe();

    /**
     * The exact model this one approximates to a stated tolerance (e.g. the direct sum behind
     * {@link HierarchicalField}), for sampled accuracy checks; the model itself when it is exact or has no exact
     * counterpart.
     */
    default FieldModel exactModel() {
        return this;
    }

    /** The relative tolerance this model is built for (NaN when it is exact or states none). */
    default double tolerance() {
        return Double.NaN;
    }
}
