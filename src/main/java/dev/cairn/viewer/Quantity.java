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
    /** Effective potential (U &gt; 0 convention, centrifugal term included), m²/s². */
    POTENTIAL_EFF("potential-eff", "effective potential", "m²/s²", "potential_eff_m2_s2", Kind.SEQUENTIAL),
    /** Dynamic height (effective potential difference over local effective gravity), m; signed. */
    DYNAMIC_HEIGHT("dynamic-height", "dynamic height", "m", "dynamic_height_m", Kind.DIVERGING),
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
