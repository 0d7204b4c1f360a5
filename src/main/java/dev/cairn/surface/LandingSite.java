package dev.cairn.surface;

/**
 * One ranked landing site: the disc of the site radius R_s about an aim-facet centroid (the aim point), i.e. every
 * facet with a point within R_s of it (exact point-to-triangle distance). Sites are chosen greedily by score and do not
 * overlap: centres at least 2 R_s apart and no facet in two sites (see {@link Survey}). SI units, model frame; angles
 * in degrees; latitude/longitude about the spin pole from the centre of mass.
 *
 * @param rank                 1-based rank (1 = best score)
 * @param score                site score in [0, 1] (formula in {@link Survey})
 * @param facet                the aim facet at the centre, 0-based OBJ order
 * @param position             the aim point (centroid of {@code facet}), m, on the surface
 * @param latDeg               latitude of the aim point
 * @param lonDeg               east longitude of the aim point
 * @param zone                 rank of the landing zone the aim facet belongs to
 * @param facetCount           facets in the site disc
 * @param areaM2               area of those facets, m² (whole facets: about πR_s² on flat ground, more on rough)
 * @param maxSlopeDeg          largest facet slope in the disc
 * @param meanSlopeDeg         area-weighted mean slope in the disc
 * @param roughnessDeg         area-weighted RMS angle between the disc's facet normals and their mean
 * @param dynamicHeightRangeM  max − min dynamic height in the disc, m
 * @param meanGravityEff       area-weighted mean |a_eff|, m/s²
 * @param meanGravity          area-weighted mean |g|, m/s²
 * @param meanEscapeSpeed      area-weighted mean escape speed (normal launch), m/s
 * @param minEscapeSpeed       least escape speed (normal launch) in the disc, m/s
 * @param safeAreaFraction     area fraction of the disc below the slope limit (1 when R_s ≤ the zone radius)
 */
public record LandingSite(int rank, double score, int facet, double[] position, double latDeg, double lonDeg,
                          int zone, int facetCount, double areaM2, double maxSlopeDeg, double meanSlopeDeg,
                          double roughnessDeg, double dynamicHeightRangeM, double meanGravityEff, double meanGravity,
                          double meanEscapeSpeed, double minEscapeSpeed, double safeAreaFraction) {
    public LandingSite {
        position = position.clone();
    }

    @Override
    public double[] position() {
        return position.clone();
    }
}
