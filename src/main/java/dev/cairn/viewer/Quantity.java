package dev.cairn.viewer;

import dev.cairn.io.InputException;
import java.util.Locale;

/**
 * The surveyed quantities the viewer can colour the surface by, with the {@code facets.csv} column each comes from.
 * Conventions of the survey: SI units, model frame, potential U &gt; 0 (effective potential includes the
 * centrifugal term ω²ρ²/2, Scheeres 2012), slope = angle between the inward normal and the effective gravity.
 */
public enum Quantity {
    /** Slope of the surface against the local effective gravity, degrees. */
    SLOPE("slope", "slope", "deg", "slope_deg", Kind.SEQUENTIAL),
    /** Magnitude of the effective (gravity plus centrifugal) acceleration, m/s². */
    G_EFF("g-eff", "effective gravity", "m/s²", "g_eff_m_s2", Kind.SEQUENTIAL),
    /** Magnitude of the gravity alone (no centrifugal term), m/s². */
    G("g", "gravity without spin", "m/s²", "g_m_s2", Kind.SEQUENTIAL),
    /** Effective acceleration component along the inward normal, m/s²; negative where material lifts off. */
    G_EFF_NORMAL("g-eff-normal", "effective gravity, normal (inward +)", "m/s²", "g_eff_normal_m_s2",
        Kind.DIVERGING),
    /** Tangential magnitude of the effective acceleration, m/s². */
    G_EFF_TANGENTIAL("g-eff-tangential", "effective gravity, tangential", "m/s²", "g_eff_tangential_m_s2",
        Kind.SEQUENTIAL),
    /** Gravity component along the inward normal, m/s². */
    G_NORMAL("g-normal", "gravity, normal (inward +)", "m/s²", "g_normal_m_s2", Kind.DIVERGING),
    /** Tangential magnitude of gravity, m/s². */
    G_TANGENTIAL("g-tangential", "gravity, tangential", "m/s²", "g_tangential_m_s2", Kind.SEQUENTIAL),
    /** Effective potential (U &gt; 0 convention, centrifugal term included), m²/s². */
    POTENTIAL_EFF("potential-eff", "effective potential", "m²/s²", "potential_eff_m2_s2", Kind.SEQUENTIAL),
    /** Gravitational potential U &gt; 0 (no centrifugal term), m²/s². */
    POTENTIAL("potential", "potential U", "m²/s²", "potential_m2_s2", Kind.SEQUENTIAL),
    /** Dynamic height (effective potential difference over local effective gravity), m; signed. */
    DYNAMIC_HEIGHT("dynamic-height", "dynamic height", "m", "dynamic_height_m", Kind.DIVERGING),
    /** Escape speed for a launch along the outward normal, relative to the surface, m/s. */
    ESCAPE_SPEED("escape-speed", "escape speed (normal launch)", "m/s", "escape_speed_m_s", Kind.SEQUENTIAL),
    /** Least escape speed over launch directions, m/s. */
    ESCAPE_SPEED_MIN("escape-speed-min", "escape speed (best direction)", "m/s", "escape_speed_min_m_s",
        Kind.SEQUENTIAL),
    /** Thrust acceleration to hover at rest in the body frame just above the facet, m/s². */
    HOVER_ACCEL("hover-accel", "hover acceleration", "m/s²", "hover_accel_m_s2", Kind.SEQUENTIAL),
    /** RMS normal spread in the facet's zone disc, degrees. */
    ROUGHNESS("roughness", "roughness", "deg", "roughness_deg", Kind.SEQUENTIAL),
    /** Largest slope in the facet's zone disc, degrees. */
    DISC_MAX_SLOPE("disc-max-slope", "largest slope in the zone disc", "deg", "disc_max_slope_deg",
        Kind.SEQUENTIAL),
    /** Facet area, m². */
    AREA("area", "facet area", "m²", "area_m2", Kind.SEQUENTIAL),
    /** 1 where the effective gravity points away from the surface (material would lift off). */
    LIFT_OFF("lift-off", "lift-off", "", "lift_off", Kind.CATEGORY),
    /** Rank of the landing site whose disc holds a facet, 0 for none. */
    SITES("sites", "landing site", "rank", "site", Kind.CATEGORY),
    /** Rank of the landing zone a facet belongs to, 0 for none. */
    ZONES("zones", "landing zone", "rank", "zone", Kind.CATEGORY),
    /** Plain surface. */
    NONE("none", "none", "", null, Kind.NONE);

    /** How a quantity is mapped to colour. */
    public enum Kind { SEQUENTIAL, DIVERGING, CATEGORY, NONE }

    private final String cliName;
    private final String label;
    private final String units;
    private final String column;
    private final Kind kind;

    Quantity(String cliName, String label, String units, String column, Kind kind) {
        this.cliName = cliName;
        this.label = label;
        this.units = units;
        this.column = column;
        this.kind = kind;
    }

    /** Name on the command line ({@code --quantity}). */
    public String cliName() {
        return cliName;
    }

    /** Plain-words label for legends and menus. */
    public String label() {
        return label;
    }

    /** Units for the legend ("" when dimensionless or categorical). */
    public String units() {
        return units;
    }

    /** Column of {@code facets.csv}, or null for {@link #NONE}. */
    public String column() {
        return column;
    }

    public Kind kind() {
        return kind;
    }

    /** Whether a survey has this quantity's column ({@link #NONE} always). */
    public boolean availableIn(SurveyData s) {
        return column == null || (s != null && s.hasColumn(column));
    }

    /** Command-line names of every quantity, comma-separated. */
    public static String names() {
        StringBuilder sb = new StringBuilder();
        for (Quantity q : values()) {
            sb.append(sb.length() == 0 ? "" : ", ").append(q.cliName);
        }
        return sb.toString();
    }

    /** Looks up a quantity by its command-line name; unknown names give a one-line {@link InputException}. */
    public static Quantity parse(String name) {
        String n = name.trim().toLowerCase(Locale.ROOT);
        for (Quantity q : values()) {
            if (q.cliName.equals(n)) {
                return q;
            }
        }
        StringBuilder sb = new StringBuilder();
        for (Quantity q : values()) {
            sb.append(sb.length() == 0 ? "" : ", ").append(q.cliName);
        }
        throw new InputException("--quantity: unknown quantity '" + name + "' (use one of " + sb + ")");
    }

    @Override
    public String toString() {
        return label;
    }
}
