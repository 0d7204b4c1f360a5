package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.surface.FacetColumns;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;

/**
 * The pick panel shows every per-facet column the survey writes ({@link FacetColumns#ALL}, the list the facets.csv
 * writer itself uses), each value as stored, plus any column it does not know by name.
 */
class PickReportTest {
    private static SurveyData survey(int n, Map<String, double[]> extra) {
        Map<String, double[]> cols = new HashMap<>();
        int k = 0;
        for (FacetColumns.Column c : FacetColumns.ALL) {
            double[] v = new double[n];
            for (int f = 0; f < n; f++) {
                // distinct, recognisable values per column and facet (invented, not physics)
                v[f] = c.integer() ? (f + k) % 3 : 1000 + 17 * k + 0.25 * f;
            }
            cols.put(c.name(), v);
            k++;
        }
        double[] facet = new double[n];
        for (int f = 0; f < n; f++) {
            facet[f] = f;
        }
        cols.put("facet", facet);
        cols.putAll(extra);
        return SurveyData.ofColumns(cols, n);
    }

    @Test
    void everySurveyColumnAppearsInTheReport() {
        SurveyData s = survey(4, Map.of("future_quantity_x", new double[] {1.5, 2.5, 3.5, 4.5}));
        List<PickReport.Row> rows = PickReport.rows(s, 2);
        Set<String> covered = new HashSet<>();
        for (PickReport.Row r : rows) {
            covered.addAll(r.columns());
        }
        for (FacetColumns.Column c : FacetColumns.ALL) {
            assertTrue(covered.contains(c.name()), "pick report lacks column " + c.name());
        }
        assertTrue(covered.contains("future_quantity_x"), "unknown columns are shown by name");
        String text = PickReport.text(s, 2);
        assertTrue(text.contains("future_quantity_x  3.5") || text.matches("(?s).*future_quantity_x\\s+3\\.5.*"),
            text);
        assertEquals(covered.size(), s.columnNames().size(), "no column twice, none missing");
    }

    @Test
    void valuesAreTheStoredOnes() {
        Map<String, double[]> cols = new HashMap<>();
        cols.put("slope_deg", new double[] {12.345, 95});
        cols.put("lift_off", new double[] {0, 1});
        cols.put("roughness_deg", new double[] {3.21, Double.NaN});
        cols.put("escape_speed_m_s", new double[] {0.7654, 0.5});
        cols.put("hover_accel_m_s2", new double[] {1.25e-4, 2e-4});
        cols.put("zone", new double[] {2, 0});
        SurveyData s = SurveyData.ofColumns(cols, 2);
        String t0 = PickReport.text(s, 0);
        assertTrue(t0.contains("12.35°"), t0);
        assertTrue(t0.contains("3.21°"), t0);
        assertTrue(t0.contains("0.7654 m/s"), t0);
        assertTrue(t0.contains("1.2500e-04 m/s²"), t0);
        assertTrue(t0.contains("rank 2"), t0);
        String t1 = PickReport.text(s, 1);
        assertTrue(t1.contains("yes (a_eff points away"), t1);
        assertTrue(t1.contains("roughness (disc)") && t1.contains("–"), "NaN shown as a dash: " + t1);
    }
}
