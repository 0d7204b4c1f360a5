package dev.cairn.surface;

/**
 * A place where holding station in the body-fixed frame is cheap: the thrust acceleration needed to stay at rest
 * relative to the spinning surface is {@code |a_eff| = |g + ω² r⊥|} (no Coriolis term at rest). SI units, model frame.
 *
 * @param altitudeM   height above the facet centroid along its outward normal, m (0 = on the surface)
 * @param rank        1-based rank among the points listed for this altitude (1 = least acceleration)
 * @param facet       facet below the point, 0-based OBJ order
 * @param position    the point, m, model frame
 * @param latDeg      latitude about the spin pole, degrees
 * @param lonDeg      east longitude about the spin pole, degrees
 * @param hoverAccel  required thrust acceleration |a_eff|, m/s²
 * @param gravity     gravity magnitude |g| there, m/s²
 */
public record HoverPoint(double altitudeM, int rank, int facet, double[] position, double latDeg, double lonDeg,
                         double hoverAccel, double gravity) {
    public HoverPoint {
        position = position.clone();
    }

    @Override
    public double[] position() {
        return position.clone();
    }
}
