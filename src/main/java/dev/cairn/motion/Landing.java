package dev.cairn.motion;

/**
 * Result of one deployment sample. Body frame, SI units, angles in degrees; NaN where a value does not apply
 * (e.g. rest position of an escaped sample).
 *
 * @param sample            sample index
 * @param outcome           how the sample ended
 * @param start             dispersed release state (position m, velocity m/s), 6 values
 * @param position          rest position (REST), else the last position, m
 * @param facet             facet at rest (REST), else −1
 * @param latDeg            latitude of the rest position about the spin pole
 * @param lonDeg            east longitude of the rest position
 * @param time              time to rest (REST), else the time the sample ended, s
 * @param bounces           impacts with the surface (the last one included)
 * @param firstImpactSpeed  speed at the first impact, m/s
 * @param firstIncidenceDeg angle of the first impact from the inward normal (0 head-on)
 * @param slopeDeg          slope at rest: angle between the inward facet normal and the effective acceleration
 * @param maxJacobiDrift    largest relative Jacobi drift over the ballistic arcs (between bounces)
 * @param steps             integrator steps
 * @param fieldEvaluations  field evaluations
 */
public record Landing(int sample, Outcome outcome, double[] start, double[] position, int facet, double latDeg,
                      double lonDeg, double time, int bounces, double firstImpactSpeed, double firstIncidenceDeg,
                      double slopeDeg, double maxJacobiDrift, long steps, long fieldEvaluations) {
    /** How a deployment sample ended. */
    public enum Outcome {
        /** Came to rest on the surface. */
        REST,
        /** Escaped. */
        ESCAPED,
        /** Still moving at the time limit (or at the bound on field evaluations). */
        TIMED_OUT,
        /** Still bouncing after the bounce limit. */
        BOUNCE_LIMIT,
        /** The dispersed release point lies inside the body (not propagated). */
        START_INSIDE;

        public String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }
}
