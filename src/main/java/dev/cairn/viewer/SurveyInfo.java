package dev.cairn.viewer;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * The survey's parameters in plain words, from {@code summary.json} (keys {@code parameters.*}, {@code field_model},
 * {@code field_accuracy}): spin period and axis, density and GM, the field model and its measured accuracy, and the
 * landing limits. Shown in the viewer's status bar, its About box and the render footer, so that a picture is never
 * separated from the settings that made it. Units: hours for the spin period (as the survey report), SI otherwise,
 * angles in degrees.
 */
final class SurveyInfo {
    /** What is shown when summary.json carries no parameters (e.g. a survey assembled in memory). */
    static final String UNKNOWN = "survey parameters not recorded";

    private SurveyInfo() {
    }

    /** One item per line; {@link #UNKNOWN} alone when there is nothing to show. */
    static List<String> lines(JsonNode summary) {
        List<String> out = new ArrayList<>();
        JsonNode p = summary == null ? null : summary.get("parameters");
        if (p != null && p.isObject()) {
            JsonNode ph = p.get("spin_period_h");
            JsonNode ax = p.get("spin_axis");
            String axis = ax != null && ax.isArray() && ax.size() == 3 ? " about (" + num(ax.get(0).asDouble()) + ", "
                + num(ax.get(1).asDouble()) + ", " + num(ax.get(2).asDouble()) + ")" : "";
            out.add(ph == null || ph.isNull() ? "no spin" : "spin period " + num(ph.asDouble()) + " h" + axis);
            JsonNode rho = p.get("density_kg_m3");
            JsonNode gm = p.get("gm_m3_s2");
            out.add((rho == null || rho.isNull() ? "density not given" : "density " + num(rho.asDouble())
                + " kg/m³") + (gm == null || gm.isNull() ? "" : ", GM " + num(gm.asDouble()) + " m³/s²"));
        }
        JsonNode fm = summary == null ? null : summary.get("field_model");
        if (fm != null && fm.isTextual()) {
            out.add("field: " + fm.asText() + accuracy(summary.get("field_accuracy")));
        }
        if (p != null && p.isObject()) {
            StringBuilder sb = new StringBuilder("limits:");
            add(sb, p, "max_slope_deg", " slope < ", "°");
            add(sb, p, "max_roughness_deg", ", roughness ≤ ", "°");
            add(sb, p, "zone_radius_m", ", zone radius ", " m");
            add(sb, p, "site_radius_m", ", site radius ", " m");
            out.add(sb.toString());
        }
        return out.isEmpty() ? List.of(UNKNOWN) : List.copyOf(out);
    }

    private static String accuracy(JsonNode a) {
        if (a == null || !a.isObject()) {
            return "";
        }
        if (a.path("exact").asBoolean(false)) {
            return " (exact direct sum)";
        }
        JsonNode eg = a.get("max_relative_error_g");
        JsonNode n = a.get("check_samples");
        if (eg == null || !eg.isNumber()) {
            return "";
        }
        return String.format(Locale.ROOT, " (max relative error of g %.2g against the exact sum%s)", eg.asDouble(),
            n != null && n.canConvertToInt() ? " at " + n.asInt() + " facets" : "");
    }

    private static void add(StringBuilder sb, JsonNode p, String key, String prefix, String unit) {
        JsonNode v = p.get(key);
        if (v != null && v.isNumber()) {
            sb.append(sb.length() == "limits:".length() ? prefix.replaceFirst("^, ", " ") : prefix)
                .append(num(v.asDouble())).append(unit);
        }
    }

    private static String num(double v) {
        return dev.cairn.surface.ColourScale.format(v);
    }
}
