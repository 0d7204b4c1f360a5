package dev.cairn.surface;

import java.util.List;

/**
 * The per-facet columns of {@code facets.csv} and the cell arrays of {@code surface.vtk}, in file order. Names carry
 * their units ({@code _m}, {@code _m_s2}, {@code _m2_s2}, {@code _deg}); conventions of {@link SurveyResult}.
 * The first ten names and their spelling are a contract other tools rely on.
 */
public final class FacetColumns {
    private FacetColumns() {
    }

    /** Value of one column for one facet. */
    @FunctionalInterface
    public interface Getter {
        double value(SurveyResult r, int f);
    }

    /**
     * One column.
     *
     * @param name        column name with unit suffix
     * @param integer     whether the values are integers (written without a decimal point)
     * @param description one-line meaning, units and sign convention
     * @param getter      the value
     */
    public record Column(String name, boolean integer, String description, Getter getter) {
    }

    /** All columns in file order. */
    public static final List<Column> ALL = List.of(
        new Column("facet", true, "facet index, 0-based, OBJ order", (r, f) -> f),
        new Column("cx_m", false, "facet centroid x, m, model frame", (r, f) -> r.centroid[3 * f]),
        new Column("cy_m", false, "facet centroid y, m", (r, f) -> r.centroid[3 * f + 1]),
        new Column("cz_m", false, "facet centroid z, m", (r, f) -> r.centroid[3 * f + 2]),
        new Column("lat_deg", false, "latitude of the centroid about the spin pole (from the centre of mass), deg",
            (r, f) -> r.lat[f]),
        new Column("lon_deg", false, "east longitude about the spin pole from the model +x axis, deg, (-180, 180]",
            (r, f) -> r.lon[f]),
        new Column("slope_deg", false, "angle between the inward normal and the effective acceleration, deg "
            + "(> 90 = lift-off)", (r, f) -> r.slope[f]),
        new Column("g_eff_m_s2", false, "|a_eff| = |g + w^2 r_perp|, m/s^2", (r, f) -> r.gEff[f]),
        new Column("potential_eff_m2_s2", false, "effective potential V = U + w^2 r_perp^2 / 2, m^2/s^2 (> 0)",
            (r, f) -> r.potentialEff[f]),
        new Column("dynamic_height_m", false, "(V_ref - V) / mean |a_eff|, m; grows with altitude",
            (r, f) -> r.dynamicHeight[f]),
        new Column("g_m_s2", false, "gravity magnitude |g| (no centrifugal term), m/s^2", (r, f) -> r.g[f]),
        new Column("g_normal_m_s2", false, "normal component of gravity, positive inward (-n.g), m/s^2",
            (r, f) -> r.gNormal[f]),
        new Column("g_tangential_m_s2", false, "tangential gravity magnitude, m/s^2", (r, f) -> r.gTangential[f]),
        new Column("lift_off", true, "1 when the normal component of a_eff points outward, else 0",
            (r, f) -> r.liftOff[f] ? 1 : 0),
        new Column("escape_speed_m_s", false, "escape speed for a launch along the outward normal, relative to the "
            + "surface, m/s", (r, f) -> r.escapeSpeed[f]),
        new Column("hover_accel_m_s2", false, "thrust acceleration to hover at rest in the body frame, |a_eff|, m/s^2",
            (r, f) -> r.gEff[f]),
        new Column("zone", true, "best rank of the landing zones whose footprints hold the facet (1 = best), 0 = "
            + "none; every membership is in zones.csv", (r, f) -> r.zone[f]),
        new Column("aim", true, "1 for a zone aim facet (its whole disc is safe and smooth), else 0",
            (r, f) -> r.aimFacet[f] ? 1 : 0),
        new Column("g_eff_normal_m_s2", false, "normal component of a_eff, positive inward (-n.a_eff), m/s^2",
            (r, f) -> r.gEffNormal[f]),
        new Column("g_eff_tangential_m_s2", false, "tangential magnitude of a_eff, m/s^2",
            (r, f) -> r.gEffTangential[f]),
        new Column("potential_m2_s2", false, "gravitational potential U > 0, m^2/s^2", (r, f) -> r.potential[f]),
        new Column("escape_speed_min_m_s", false, "least escape speed over launch directions, max(0, sqrt(2U) - w "
            + "r_perp), m/s", (r, f) -> r.escapeSpeedMin[f]),
        new Column("area_m2", false, "facet area, m^2", (r, f) -> r.area[f]),
        new Column("nx", false, "outward unit normal x", (r, f) -> r.normal[3 * f]),
        new Column("ny", false, "outward unit normal y", (r, f) -> r.normal[3 * f + 1]),
        new Column("nz", false, "outward unit normal z", (r, f) -> r.normal[3 * f + 2]),
        new Column("gx_m_s2", false, "gravity g = grad U, x, m/s^2", (r, f) -> r.gVec[3 * f]),
        new Column("gy_m_s2", false, "gravity y, m/s^2", (r, f) -> r.gVec[3 * f + 1]),
        new Column("gz_m_s2", false, "gravity z, m/s^2", (r, f) -> r.gVec[3 * f + 2]),
        new Column("aeff_x_m_s2", false, "effective acceleration a_eff = g + w^2 r_perp, x, m/s^2",
            (r, f) -> r.aEffVec[3 * f]),
        new Column("aeff_y_m_s2", false, "effective acceleration y, m/s^2", (r, f) -> r.aEffVec[3 * f + 1]),
        new Column("aeff_z_m_s2", false, "effective acceleration z, m/s^2", (r, f) -> r.aEffVec[3 * f + 2]),
        new Column("roughness_deg", false, "RMS normal spread in the facet's zone disc, deg (NaN if the facet is "
            + "not safe)", (r, f) -> r.roughness[f]),
        new Column("disc_max_slope_deg", false, "largest slope in the facet's zone disc, deg (NaN if the facet is "
            + "not safe)", (r, f) -> r.discMaxSlope[f]),
        new Column("site", true, "rank of the landing site whose disc holds the facet (1 = best), 0 = none; sites "
            + "share no facet", (r, f) -> r.site[f]),
        new Column("map_layer", true, "layer of the lat/lon maps that shows the facet: 1 = outermost along the ray "
            + "from the centre of mass, k = below k - 1 other crossings", (r, f) -> r.mapLayer[f]));

    /** The column called {@code name}. */
    public static Column byName(String name) {
        for (Column c : ALL) {
            if (c.name().equals(name)) {
                return c;
            }
        }
        throw new IllegalArgumentException("no facet column " + name);
    }

    /** The header line of facets.csv (no trailing newline). */
    public static String csvHeader() {
        StringBuilder sb = new StringBuilder();
        for (Column c : ALL) {
            if (sb.length() > 0) {
                sb.append(',');
            }
            sb.append(c.name());
        }
        return sb.toString();
    }
}
