package dev.cairn.viewer;

import dev.cairn.surface.ColourScale;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.TreeSet;

/**
 * What the pick panel shows for one facet: every per-facet quantity of the survey, in plain words with units, then any
 * further column of {@code facets.csv} by its own name, so that nothing the survey wrote is left out. Also the zones
 * whose footprints hold the facet (footprints may overlap) and the site whose disc holds it. No JavaFX: testable
 * without a display.
 *
 * <p>Conventions (as written by the survey): SI units, model (body-fixed) frame; potential U &gt; 0 and g = ∇U;
 * effective values include the centrifugal term of the spin; normal components positive inward; normals outward.
 */
public final class PickReport {
    /**
     * One line of the report.
     *
     * @param label   plain-words name
     * @param value   formatted value with units
     * @param columns the {@code facets.csv} columns shown on this line
     */
    public record Row(String label, String value, List<String> columns) {
    }

    /** A known line: label, units, printf format per component, columns. */
    private record Known(String label, String units, String format, String... columns) {
    }

    private static final List<Known> KNOWN = List.of(
        new Known("facet", "", "%.0f", "facet"),
        new Known("lat, lon", "°", "%.3f", "lat_deg", "lon_deg"),
        new Known("centroid", "m", "%.2f", "cx_m", "cy_m", "cz_m"),
        new Known("outward normal", "", "%.4f", "nx", "ny", "nz"),
        new Known("area", "m²", "%.4g", "area_m2"),
        new Known("slope", "°", "%.2f", "slope_deg"),
        new Known("lift-off", "", "", "lift_off"),
        new Known("eff. gravity |a_eff|", "m/s²", "%.5e", "g_eff_m_s2"),
        new Known("a_eff vector", "m/s²", "%.4e", "aeff_x_m_s2", "aeff_y_m_s2", "aeff_z_m_s2"),
        new Known("a_eff normal (in +)", "m/s²", "%.4e", "g_eff_normal_m_s2"),
        new Known("a_eff tangential", "m/s²", "%.4e", "g_eff_tangential_m_s2"),
        new Known("gravity |g| (no spin)", "m/s²", "%.5e", "g_m_s2"),
        new Known("g vector", "m/s²", "%.4e", "gx_m_s2", "gy_m_s2", "gz_m_s2"),
        new Known("g normal (in +)", "m/s²", "%.4e", "g_normal_m_s2"),
        new Known("g tangential", "m/s²", "%.4e", "g_tangential_m_s2"),
        new Known("potential U (> 0)", "m²/s²", "%.6e", "potential_m2_s2"),
        new Known("eff. potential V", "m²/s²", "%.6e", "potential_eff_m2_s2"),
        new Known("dynamic height", "m", "%.3f", "dynamic_height_m"),
        new Known("escape speed (normal)", "m/s", "%.4f", "escape_speed_m_s"),
        new Known("escape speed (least)", "m/s", "%.4f", "escape_speed_min_m_s"),
        new Known("hover acceleration", "m/s²", "%.4e", "hover_accel_m_s2"),
        new Known("roughness (disc)", "°", "%.2f", "roughness_deg"),
        new Known("largest slope (disc)", "°", "%.2f", "disc_max_slope_deg"),
        new Known("landing zone (best)", "", "", "zone"),
        new Known("zone aim facet", "", "", "aim"),
        new Known("landing site", "", "", "site"),
        new Known("map layer", "", "%.0f", "map_layer"));

    private PickReport() {
    }

    /** Every line for facet {@code f} of the survey. */
    public static List<Row> rows(SurveyData s, int f) {
        List<Row> out = new ArrayList<>();
        Set<String> shown = new HashSet<>();
        for (Known k : KNOWN) {
            boolean any = false;
            for (String c : k.columns()) {
                any |= s.hasColumn(c);
            }
            if (!any) {
                continue;
            }
            out.add(new Row(k.label(), value(s, f, k), List.of(k.columns())));
            shown.addAll(List.of(k.columns()));
            if (k.columns()[0].equals("zone")) {
                String all = zonesHolding(s, f);
                if (!all.isEmpty()) {
                    out.add(new Row("zone footprints", all, List.of()));
                }
            }
        }
        for (String c : new TreeSet<>(s.columnNames())) {
            if (!shown.contains(c)) {
                out.add(new Row(c, ColourScale.format(s.value(c, f)), List.of(c)));
            }
        }
        return out;
    }

    /** The report as text, one "label  value" line per row, labels padded to one column. */
    public static String text(SurveyData s, int f) {
        List<Row> rows = rows(s, f);
        int w = 0;
        for (Row r : rows) {
            w = Math.max(w, r.label().length());
        }
        StringBuilder sb = new StringBuilder();
        for (Row r : rows) {
            sb.append(r.label()).append(" ".repeat(w + 2 - r.label().length())).append(r.value()).append('\n');
        }
        return sb.toString().stripTrailing();
    }

    private static String value(SurveyData s, int f, Known k) {
        String c0 = k.columns()[0];
        double v0 = s.value(c0, f);
        switch (c0) {
            case "lift_off":
                return Double.isNaN(v0) ? "–" : v0 > 0.5 ? "yes (a_eff points away from the surface)" : "no";
            case "zone":
                return Double.isNaN(v0) || v0 < 0.5 ? "none" : "rank " + Math.round(v0);
            case "site":
                return Double.isNaN(v0) || v0 < 0.5 ? "none" : "rank " + Math.round(v0);
            case "aim":
                return Double.isNaN(v0) ? "–" : v0 > 0.5 ? "yes" : "no";
            default:
                break;
        }
        StringBuilder sb = new StringBuilder();
        if (k.columns().length > 1) {
            sb.append('(');
        }
        for (int i = 0; i < k.columns().length; i++) {
            double v = s.value(k.columns()[i], f);
            sb.append(i == 0 ? "" : ", ").append(Double.isNaN(v) ? "–" : String.format(Locale.ROOT, k.format(), v));
        }
        if (k.columns().length > 1) {
            sb.append(')');
        }
        if (!k.units().isEmpty()) {
            sb.append(k.units().equals("°") ? "°" : " " + k.units());
        }
        return sb.toString();
    }

    /** Ranks of every zone footprint holding the facet ("1, 3"), or "" when none. */
    private static String zonesHolding(SurveyData s, int f) {
        StringBuilder sb = new StringBuilder();
        for (SurveyData.Zone z : s.zones()) {
            if (java.util.Arrays.binarySearch(z.facets(), f) >= 0) {
                sb.append(sb.length() == 0 ? "ranks " : ", ").append(z.rank());
            }
        }
        return sb.toString();
    }
}
