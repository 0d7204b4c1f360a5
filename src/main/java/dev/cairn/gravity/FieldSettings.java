package dev.cairn.gravity;

import java.util.Locale;

/**
 * How the constant-density polyhedron field of a body is evaluated: the exact direct sum ({@link PolyhedronField})
 * or the hierarchical model ({@link HierarchicalField}) at a relative tolerance on |g| and U.
 *
 * <p>Without an explicit choice ({@link #AUTO}) the hierarchical model at {@link HierarchicalField#DEFAULT_TOLERANCE}
 * is used where it pays: jobs of at least {@link #AUTO_MIN_POINTS} points (below that, building the tree costs more
 * than the direct sum saves) on bodies of at least {@link #AUTO_MIN_FACETS} facets, or, for points on the surface
 * (a survey), {@link #AUTO_MIN_FACETS_SURFACE} facets: on the surface the exact near field dominates the
 * hierarchical model's cost, and the vectorised direct sum is faster below that size (measured in
 * docs/benchmarks.md); otherwise the exact sum.
 *
 * @param exact     force the direct sum
 * @param tolerance the stated relative tolerance, or NaN for the automatic choice
 */
public record FieldSettings(boolean exact, double tolerance) {
    /** Smallest body for which the automatic choice is the hierarchical model (points off the surface). */
    public static final int AUTO_MIN_FACETS = 4096;
    /** Smallest body for which the automatic choice is the hierarchical model for points on the surface. */
    public static final int AUTO_MIN_FACETS_SURFACE = 60_000;
    /** Smallest job (field points) for which the automatic choice is the hierarchical model. */
    public static final long AUTO_MIN_POINTS = 1000;
    /** No explicit choice. */
    public static final FieldSettings AUTO = new FieldSettings(false, Double.NaN);
    /** The exact direct sum. */
    public static final FieldSettings EXACT = new FieldSettings(true, Double.NaN);

    /** The hierarchical model at {@code tolerance}. */
    public static FieldSettings tolerance(double tolerance) {
        return new FieldSettings(false, tolerance);
    }

    /** Whether to use the hierarchical model for a body of {@code facets} facets and a job of {@code points}. */
    public boolean hierarchical(int facets, long points) {
        return hierarchical(facets, points, false);
    }

    /** As {@link #hierarchical(int, long)}; {@code onSurface} for jobs whose points lie on the surface. */
    public boolean hierarchical(int facets, long points, boolean onSurface) {
        if (exact) {
            return false;
        }
        if (!Double.isNaN(tolerance)) {
            return true;
        }
        return facets >= (onSurface ? AUTO_MIN_FACETS_SURFACE : AUTO_MIN_FACETS) && points >= AUTO_MIN_POINTS;
    }

    /** The tolerance the hierarchical model uses. */
    public double effectiveTolerance() {
        return Double.isNaN(tolerance) ? HierarchicalField.DEFAULT_TOLERANCE : tolerance;
    }

    @Override
    public String toString() {
        return exact ? "exact" : Double.isNaN(tolerance) ? "auto" : String.format(Locale.ROOT, "tolerance %.1e",
            tolerance);
    }
}
