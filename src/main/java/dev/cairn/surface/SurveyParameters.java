package dev.cairn.surface;

import dev.cairn.util.ParallelChunks;

/**
 * Thresholds and options of a surface survey.
 *
 * @param maxSlopeDeg      landing slope limit, degrees, in (0, 90): a facet is <i>safe</i> when its slope is below it
 *                         (default {@link #DEFAULT_MAX_SLOPE_DEG}, common practice, no source)
 * @param zoneRadiusM      radius of the disc that must be safe all round a landing aim point, metres, &gt; 0
 * @param maxRoughnessDeg  largest area-weighted RMS angle between facet normals and their mean inside the disc,
 *                         degrees, in (0, 90] (default {@link #DEFAULT_MAX_ROUGHNESS_DEG}, chosen, no source)
 * @param hoverAltitudesM  altitudes above the surface (along the facet normal), metres, ≥ 0, at which hovering is
 *                         assessed; {@code null} for the default fractions {@link #DEFAULT_HOVER_ALTITUDE_FRACTIONS}
 *                         of the body's equivalent radius
 * @param threads          worker threads, ≥ 1 (results do not depend on it)
 * @param siteRadiusM      radius of a landing site (landing dispersion), metres, &gt; 0, or NaN for the zone radius
 */
public record SurveyParameters(double maxSlopeDeg, double zoneRadiusM, double maxRoughnessDeg,
                               double[] hoverAltitudesM, int threads, double siteRadiusM) {
    /** Default landing slope limit, degrees (common practice, no source: landing limits of 15–30° are usual). */
    public static final double DEFAULT_MAX_SLOPE_DEG = 15.0;
    /** Default zone radius, metres (chosen, no source). */
    public static final double DEFAULT_ZONE_RADIUS_M = 25.0;
    /** Default roughness limit, degrees RMS normal spread inside the zone disc (chosen, no source). */
    public static final double DEFAULT_MAX_ROUGHNESS_DEG = 10.0;
    /** Default hover altitudes as fractions of the equivalent radius (the surface itself first). */
    public static final double[] DEFAULT_HOVER_ALTITUDE_FRACTIONS = {0.0, 0.02, 0.05, 0.1, 0.2};

    public SurveyParameters {
        if (!(maxSlopeDeg > 0 && maxSlopeDeg < 90)) {
            throw new IllegalArgumentException("max slope must be between 0 and 90 degrees, got " + maxSlopeDeg);
        }
        if (!(zoneRadiusM > 0) || !Double.isFinite(zoneRadiusM)) {
            throw new IllegalArgumentException("zone radius must be a positive number of metres, got " + zoneRadiusM);
        }
        if (!(maxRoughnessDeg > 0 && maxRoughnessDeg <= 90)) {
            throw new IllegalArgumentException("max roughness must be in (0, 90] degrees, got " + maxRoughnessDeg);
        }
        if (hoverAltitudesM != null) {
            hoverAltitudesM = hoverAltitudesM.clone();
            for (double h : hoverAltitudesM) {
                if (!(h >= 0) || !Double.isFinite(h)) {
                    throw new IllegalArgumentException("hover altitudes must be finite and >= 0 m, got " + h);
                }
            }
        }
        if (threads < 1) {
            throw new IllegalArgumentException("threads must be at least 1, got " + threads);
        }
        if (!Double.isNaN(siteRadiusM) && !(siteRadiusM > 0 && Double.isFinite(siteRadiusM))) {
            throw new IllegalArgumentException("site radius must be a positive number of metres, got " + siteRadiusM);
        }
    }

    /** Parameters whose site radius is the zone radius. */
    public SurveyParameters(double maxSlopeDeg, double zoneRadiusM, double maxRoughnessDeg, double[] hoverAltitudesM,
                            int threads) {
        this(maxSlopeDeg, zoneRadiusM, maxRoughnessDeg, hoverAltitudesM, threads, Double.NaN);
    }

    /** The site radius in effect, metres: {@link #siteRadiusM()}, or the zone radius when that is NaN. */
    public double siteRadius() {
        return Double.isNaN(siteRadiusM) ? zoneRadiusM : siteRadiusM;
    }

    /** These parameters with another site radius (metres; NaN for the zone radius). */
    public SurveyParameters withSiteRadius(double m) {
        return new SurveyParameters(maxSlopeDeg, zoneRadiusM, maxRoughnessDeg, hoverAltitudesM, threads, m);
    }

    /** Defaults: 15°, 25 m, 10°, default altitudes, all processors. */
    public static SurveyParameters defaults() {
        return new SurveyParameters(DEFAULT_MAX_SLOPE_DEG, DEFAULT_ZONE_RADIUS_M, DEFAULT_MAX_ROUGHNESS_DEG, null,
            ParallelChunks.defaultThreads());
    }

    /** These parameters with another slope limit. */
    public SurveyParameters withMaxSlope(double deg) {
        return new SurveyParameters(deg, zoneRadiusM, maxRoughnessDeg, hoverAltitudesM, threads, siteRadiusM);
    }

    /** These parameters with another zone radius. */
    public SurveyParameters withZoneRadius(double m) {
        return new SurveyParameters(maxSlopeDeg, m, maxRoughnessDeg, hoverAltitudesM, threads, siteRadiusM);
    }

    /** These parameters with another roughness limit. */
    public SurveyParameters withMaxRoughness(double deg) {
        return new SurveyParameters(maxSlopeDeg, zoneRadiusM, deg, hoverAltitudesM, threads, siteRadiusM);
    }

    /** These parameters with explicit hover altitudes (metres; null for the default). */
    public SurveyParameters withHoverAltitudes(double[] m) {
        return new SurveyParameters(maxSlopeDeg, zoneRadiusM, maxRoughnessDeg, m, threads, siteRadiusM);
    }

    /** These parameters with another thread count. */
    public SurveyParameters withThreads(int n) {
        return new SurveyParameters(maxSlopeDeg, zoneRadiusM, maxRoughnessDeg, hoverAltitudesM, n, siteRadiusM);
    }

    /** Hover altitudes (a copy), or null for the default. */
    @Override
    public double[] hoverAltitudesM() {
        return hoverAltitudesM == null ? null : hoverAltitudesM.clone();
    }
}
