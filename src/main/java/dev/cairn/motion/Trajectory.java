package dev.cairn.motion;

import java.util.List;

/**
 * Result of one propagation.
 *
 * <p>{@link #rows()} holds {@link #COLUMNS} values per output row, in time order: t (s), body-frame position (m) and
 * velocity relative to the body (m/s), the Jacobi integral J = ½|v_rel|² − U − ½ω²|r⊥|² (m²/s²), then the inertial
 * position and velocity (frame aligned with the body at t = 0). Rows are written at every multiple of the output step,
 * at every event and at the end.
 *
 * @param outcome          how the run ended
 * @param rows             output rows, {@link #COLUMNS} values each
 * @param events           events in time order
 * @param endTime          time at which the run ended, s
 * @param jacobi0          Jacobi integral at t = 0, m²/s²
 * @param maxJacobiDrift   largest |J(t) − J(0)| over the step ends and events, m²/s²
 * @param steps            accepted integrator steps
 * @param fieldEvaluations field evaluations (integrator stages, Jacobi values, impact refinement)
 */
public record Trajectory(Outcome outcome, double[] rows, List<MotionEvent> events, double endTime, double jacobi0,
                         double maxJacobiDrift, long steps, long fieldEvaluations) {
    /** Values per output row. */
    public static final int COLUMNS = 14;

    /** How a propagation ended. */
    public enum Outcome {
        /** Reached the requested duration. */
        DURATION,
        /** Hit the surface. */
        IMPACT,
        /** Escaped. */
        ESCAPE,
        /** Reached the bound on field evaluations. */
        STEP_LIMIT;

        public String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    /** Number of output rows. */
    public int rowCount() {
        return rows.length / COLUMNS;
    }

    /** Largest Jacobi drift relative to |J(0)| (infinite when J(0) = 0). */
    public double maxJacobiDriftRelative() {
        return maxJacobiDrift / Math.abs(jacobi0);
    }

    /** The event ending the run (IMPACT or ESCAPE), or null. */
    public MotionEvent terminal() {
        for (MotionEvent e : events) {
            if (e.kind() != MotionEvent.Kind.ALTITUDE) {
                return e;
            }
        }
        return null;
    }

    /** Body-frame state (6 values) of the last row. */
    public double[] finalState() {
        int o = rows.length - COLUMNS;
        return java.util.Arrays.copyOfRange(rows, o + 1, o + 7);
    }
}
