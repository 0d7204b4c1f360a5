package dev.cairn.surface;

import java.util.List;

/**
 * The immutable result of a {@link Survey}: per-facet values (index = 0-based facet in OBJ order), the ranked landing
 * zones and the hovering points. Array accessors return copies.
 *
 * <p>Conventions: SI units; model (body-fixed) frame; U &gt; 0 and g = ∇U; V = U + ½ω²|r⊥|² and a_eff = ∇V =
 * g + ω² r⊥ (see {@link dev.cairn.rotation.RotatingFrame}); normals are outward unit vectors; "normal" components are
 * positive <b>inward</b> (toward the body), so a negative effective normal component means loose material lifts
 * off; angles in degrees; latitude/longitude about the spin pole.
 */
public final class SurveyResult {
    final SurveyTarget target;
    final SurveyParameters parameters;
    final int facets;
    final double[] centroid;
    final double[] normal;
    final double[] area;
    final double[] lat;
    final double[] lon;
    final double[] gVec;
    final double[] g;
    final double[] potential;
    final double[] aEffVec;
    final double[] gEff;
    final double[] potentialEff;
    final double[] gNormal;
    final double[] gTangential;
    final double[] gEffNormal;
    final double[] gEffTangential;
    final double[] slope;
    final boolean[] liftOff;
    final double[] dynamicHeight;
    final double[] escapeSpeed;
    final double[] escapeSpeedMin;
    final double[] roughness;
    final double[] discMaxSlope;
    final int[] zone;
    final int[] aimZone;
    final int[] site;
    final int[] mapLayer;
    final List<int[]> zoneFootprints;
    final List<LandingSite> sites;
    final boolean[] aimFacet;
    final double referencePotentialEff;
    final double meanGEff;
    final double[] hoverAltitudes;
    final List<LandingZone> zones;
    final List<HoverPoint> hovering;
    final double seconds;
    final double[] stageSeconds;
    final List<String> notes;
    final dev.cairn.gravity.FieldCheck fieldCheck;

    SurveyResult(Survey.Work w, List<LandingZone> zones, List<LandingSite> sites, List<HoverPoint> hovering,
                 double[] hoverAltitudes,
                 double seconds, double[] stageSeconds, List<String> notes) {
        this.fieldCheck = w.fieldCheck;
        this.target = w.target;
        this.parameters = w.params;
        this.facets = w.nf;
        this.centroid = w.centroid;
        this.normal = w.normal;
        this.area = w.area;
        this.lat = w.lat;
        this.lon = w.lon;
        this.gVec = w.gVec;
        this.g = w.g;
        this.potential = w.potential;
        this.aEffVec = w.aEffVec;
        this.gEff = w.gEff;
        this.potentialEff = w.potentialEff;
        this.gNormal = w.gNormal;
        this.gTangential = w.gTangential;
        this.gEffNormal = w.gEffNormal;
        this.gEffTangential = w.gEffTangential;
        this.slope = w.slope;
        this.liftOff = w.liftOff;
        this.dynamicHeight = w.dynamicHeight;
        this.escapeSpeed = w.escapeSpeed;
        this.escapeSpeedMin = w.escapeSpeedMin;
        this.roughness = w.roughness;
        this.discMaxSlope = w.discMaxSlope;
        this.zone = w.zone;
        this.aimZone = w.aimZone;
        this.site = w.site;
        this.mapLayer = w.mapLayer;
        this.zoneFootprints = List.copyOf(w.zoneFootprints);
        this.sites = List.copyOf(sites);
        this.aimFacet = w.aim;
        this.referencePotentialEff = w.referenceV;
        this.meanGEff = w.meanGEff;
        this.hoverAltitudes = hoverAltitudes.clone();
        this.zones = List.copyOf(zones);
        this.hovering = List.copyOf(hovering);
        this.seconds = seconds;
        this.stageSeconds = stageSeconds.clone();
        this.notes = List.copyOf(notes);
    }

    /** Which field model produced the survey and its measured accuracy against the exact sum on sampled facets. */
    public dev.cairn.gravity.FieldCheck fieldCheck() {
        return fieldCheck;
    }

    /** Remarks on the resolution of the results (e.g. a zone radius smaller than the facets). */
    public List<String> notes() {
        return notes;
    }

    /** The surveyed body. */
    public SurveyTarget target() {
        return target;
    }

    public SurveyParameters parameters() {
        return parameters;
    }

    /** Number of facets. */
    public int facetCount() {
        return facets;
    }

    /** Facet centroids, m, {@code 3F} values. */
    public double[] centroids() {
        return centroid.clone();
    }

    /** Outward unit facet normals, {@code 3F} values. */
    public double[] normals() {
        return normal.clone();
    }

    /** Facet areas, m². */
    public double[] areas() {
        return area.clone();
    }

    /** Latitude of the centroid about the spin pole, degrees. */
    public double[] latitudeDeg() {
        return lat.clone();
    }

    /** East longitude of the centroid about the spin pole, degrees in (−180, 180]. */
    public double[] longitudeDeg() {
        return lon.clone();
    }

    /** Gravity g = ∇U at the centroid, m/s², {@code 3F} values. */
    public double[] gravityVectors() {
        return gVec.clone();
    }

    /** |g|, m/s². */
    public double[] gravity() {
        return g.clone();
    }

    /** Gravitational potential U &gt; 0, m²/s². */
    public double[] potential() {
        return potential.clone();
    }

    /** Effective acceleration a_eff = g + ω²r⊥, m/s², {@code 3F} values. */
    public double[] effectiveAccelerationVectors() {
        return aEffVec.clone();
    }

    /** |a_eff|, m/s². */
    public double[] gravityEff() {
        return gEff.clone();
    }

    /** Effective potential V = U + ½ω²|r⊥|², m²/s². */
    public double[] potentialEff() {
        return potentialEff.clone();
    }

    /** Inward normal component of gravity −n·g, m/s² (positive = toward the body). */
    public double[] gravityNormal() {
        return gNormal.clone();
    }

    /** Tangential gravity magnitude |g − (n·g)n|, m/s². */
    public double[] gravityTangential() {
        return gTangential.clone();
    }

    /** Inward normal component of a_eff, −n·a_eff, m/s² (negative = lift-off). */
    public double[] gravityEffNormal() {
        return gEffNormal.clone();
    }

    /** Tangential magnitude of a_eff, m/s². */
    public double[] gravityEffTangential() {
        return gEffTangential.clone();
    }

    /** Slope: angle between the inward normal and a_eff, degrees in [0, 180] (&gt; 90 = lift-off). */
    public double[] slopeDeg() {
        return slope.clone();
    }

    /** True where the effective acceleration's normal component points outward (loose material lifts off). */
    public boolean[] liftOff() {
        return liftOff.clone();
    }

    /** Dynamic height (V_ref − V)/ḡ_eff, m; increases with altitude; see {@link #referencePotentialEff()}. */
    public double[] dynamicHeight() {
        return dynamicHeight.clone();
    }

    /** Escape speed for a launch along the outward normal, relative to the surface, m/s (see {@link Survey}). */
    public double[] escapeSpeed() {
        return escapeSpeed.clone();
    }

    /** Least escape speed over launch directions, relative to the surface, max(0, √(2U) − ω|r⊥|), m/s. */
    public double[] escapeSpeedMin() {
        return escapeSpeedMin.clone();
    }

    /** Thrust acceleration needed to hover at rest in the body frame just above the facet, |a_eff|, m/s². */
    public double[] hoverAccel() {
        return gEff.clone();
    }

    /** RMS normal spread inside the facet's zone disc, degrees (NaN for unsafe facets, where it is not computed). */
    public double[] roughnessDeg() {
        return roughness.clone();
    }

    /** Largest slope inside the facet's zone disc, degrees (NaN for unsafe facets). */
    public double[] discMaxSlopeDeg() {
        return discMaxSlope.clone();
    }

    /** Rank of the landing zone whose footprint holds the facet (1 = best), 0 for none. */
    public int[] zoneRank() {
        return zone.clone();
    }

    /** Rank of the zone of which the facet is an aim facet (1 = best), 0 for none. */
    public int[] aimZoneRank() {
        return aimZone.clone();
    }

    /** Rank of the landing site whose disc holds the facet (1 = best), 0 for none (sites do not share facets). */
    public int[] siteRank() {
        return site.clone();
    }

    /** Landing sites, best first. */
    public List<LandingSite> sites() {
        return sites;
    }

    /**
     * Footprint facets of the zone of rank {@code rank} (1-based), increasing facet order (a copy). Footprints may
     * overlap; {@link #zoneRank()} holds only the best rank per facet.
     */
    public int[] zoneFootprint(int rank) {
        return zoneFootprints.get(rank - 1).clone();
    }

    /**
     * Layer of the latitude–longitude maps that shows the facet: 1 for the outermost crossing of the ray from the
     * centre of mass through its centroid, k when k − 1 crossings lie farther out (hidden on the outer maps).
     */
    public int[] mapLayer() {
        return mapLayer.clone();
    }

    /** Area fraction of the surface hidden on the outer maps (map layer above 1). */
    public double hiddenAreaFraction() {
        double total = 0;
        double hidden = 0;
        for (int f = 0; f < facets; f++) {
            total += area[f];
            hidden += mapLayer[f] > 1 ? area[f] : 0;
        }
        return hidden / total;
    }

    /** True for aim facets (zone cores). */
    public boolean[] aimFacets() {
        return aimFacet.clone();
    }

    /** Reference level of dynamic height: area-weighted mean of V over the surface, m²/s². */
    public double referencePotentialEff() {
        return referencePotentialEff;
    }

    /** Area-weighted mean |a_eff| over the surface, m/s²: the divisor of dynamic height. */
    public double meanGravityEff() {
        return meanGEff;
    }

    /** Hover altitudes used, m. */
    public double[] hoverAltitudesM() {
        return hoverAltitudes.clone();
    }

    /** Landing zones, best first. */
    public List<LandingZone> zones() {
        return zones;
    }

    /** Hovering points: for each altitude, the best few, in altitude then rank order. */
    public List<HoverPoint> hovering() {
        return hovering;
    }

    /** Wall-clock time of the survey, s. */
    public double seconds() {
        return seconds;
    }

    /** Wall-clock seconds of the stages: field at the centroids, discs and zones, hovering. */
    public double[] stageSeconds() {
        return stageSeconds.clone();
    }

    /** Spin rate, rad/s. */
    public double omega() {
        return target.spin().omega();
    }
}
