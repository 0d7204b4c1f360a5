package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The survey parameters the status bar, About box and render footer show are the ones the survey ran with (the
 * fixture's options: spin 2.5 h about +z, density 2000 kg/m³, default limits 15°, 10°, 25 m).
 */
class SurveyInfoTest {
    @Test
    void parameterLinesCarryTheSurveySettings() throws Exception {
        SurveyFixture.Fixture fx = SurveyFixture.get();
        List<String> lines = fx.data().parameterLines();
        String all = String.join("\n", lines);
        assertTrue(all.contains("spin period 2.5 h about (0, 0, 1)"), all);
        assertTrue(all.contains("density 2000 kg/m³"), all);
        assertTrue(all.contains("GM "), all);
        assertTrue(all.contains("field: ") && all.contains("exact direct sum"), all);
        assertTrue(all.contains("slope < 15°") && all.contains("roughness ≤ 10°") && all.contains("zone radius 25 m")
            && all.contains("site radius 25 m"), all);
        assertEquals(String.join("  ·  ", lines), fx.data().parametersLine());
    }

    @Test
    void aSurveyWithoutSummarySaysSo() {
        SurveyData s = SurveyData.ofColumns(Map.of("slope_deg", new double[] {1}), 1);
        assertEquals(List.of(SurveyInfo.UNKNOWN), s.parameterLines());
    }
}
