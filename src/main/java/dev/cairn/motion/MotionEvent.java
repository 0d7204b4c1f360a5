package dev.cairn.motion;

/**
 * One event of a propagation. Body-frame state; SI units; angles in degrees.
 *
 * @param kind            what happened
 * @param t               time since the start, s
 * @param state           body-frame position (m) and velocity relative to the body (m/s), 6 values
 * @param facet           impacted facet (IMPACT), else −1
 * @param latDeg          latitude of the position about the spin pole
 * @param lonDeg          east longitude of the position about the spin pole
 * @param speed           speed relative to the body, m/s
 * @param normalSpeed     IMPACT: speed into the facet, −v·n (positive inward), m/s; else NaN
 * @param tangentialSpeed IMPACT: speed along the facet, |v − (v·n) n|, m/s; else NaN
 * @param incidenceDeg    IMPACT: angle between the incoming path and the inward normal (0 head-on, 90 grazing)
 * @param normal          IMPACT: outward unit normal of the facet, else null
 * @param threshold       ALTITUDE: the altitude threshold crossed, m; ESCAPE: the escape radius; else NaN
 * @param direction       ALTITUDE: +1 upward, −1 downward crossing; else 0
 * @param twoBodyEnergy   ½|v_inertial|² − GM/r at the event, m²/s²
 */
public record MotionEvent(Kind kind, double t, double[] state, int facet, double latDeg, double lonDeg, double speed,
                          double normalSpeed, double tangentialSpeed, double incidenceDeg, double[] normal,
                          double threshold, int direction, double twoBodyEnergy) {
    /** Kinds of events. */
    public enum Kind {
        /** The path crossed the shape model (end of the run). */
        IMPACT,
        /** Beyond the escape radius with positive two-body energy (end of the run). */
        ESCAPE,
        /** An altitude threshold was crossed. */
        ALTITUDE;

        /** Lower-case name for files. */
        public String key() {
            return name().toLowerCase(java.util.Locale.ROOT);
        }
    }

    @Override
    public double[] state() {
        return state.clone();
    }

    @Override
    public double[] normal() {
        return normal == null ? null : normal.clone();
    }
}
