package dev.cairn.surface;

/**
 * One candidate landing zone: a connected patch of <i>aim facets</i> (facets whose whole disc of the zone radius is
 * safe and smooth) together with its <i>footprint</i> (the union of those discs). SI units, model frame; angles in
 * degrees; latitude/longitude about the spin pole (see {@link dev.cairn.rotation.RotatingFrame}).
 *
 * @param rank                 1-based rank (1 = best score)
 * @param score                ranking score in [0, 1], see {@link Survey} for the formula
 * @param facetCount           facets in the footprint
 * @param aimFacetCount        aim facets (zone core)
 * @param areaM2               footprint area, m²
 * @param aimAreaM2            area of the aim facets, m²
 * @param centroid             area-weighted mean of the footprint facet centroids, m (off the surface for a curved
 *                             zone, and outside the zone for a ring-shaped one: use {@code bestPoint} for a point in it)
 * @param latDeg               latitude of {@code centroid}
 * @param lonDeg               east longitude of {@code centroid}
 * @param bestFacet            aim facet with the best individual score (a suggested aim point), 0-based OBJ order
 * @param bestPoint            centroid of {@code bestFacet}, m (on the surface, inside the zone)
 * @param bestLatDeg           latitude of {@code bestPoint}
 * @param bestLonDeg           east longitude of {@code bestPoint}
 * @param maxSlopeDeg          largest facet slope in the footprint
 * @param meanSlopeDeg         area-weighted mean slope in the footprint
 * @param roughnessDeg         area-weighted mean, over the aim facets, of the RMS normal spread in their discs
 * @param dynamicHeightRangeM  max − min dynamic height in the footprint, m
 * @param meanGravityEff       area-weighted mean effective acceleration magnitude, m/s²
 * @param meanGravity          area-weighted mean gravity magnitude (no centrifugal term), m/s²
 * @param meanEscapeSpeed      area-weighted mean escape speed (normal launch), m/s
 * @param minEscapeSpeed       smallest escape speed (normal launch) in the footprint, m/s
 */
public record LandingZone(int rank, double score, int facetCount, int aimFacetCount, double areaM2, double aimAreaM2,
                          double[] centroid, double latDeg, double lonDeg, int bestFacet, double[] bestPoint,
                          double bestLatDeg, double bestLonDeg, double maxSlopeDeg, double meanSlopeDeg, double roughnessDeg, double dynamicHeightRangeM,
                          double meanGravityEff, double meanGravity, double meanEscapeSpeed, double minEscapeSpeed) {
    public LandingZone {
        centroid = centroid.clone();
        bestPoint = bestPoint.clone();
    }

    @Override
    public double[] centroid() {
        return centroid.clone();
    }

    @Override
    public double[] bestPoint() {
        return bestPoint.clone();
    }
}
