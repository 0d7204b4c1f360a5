package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.surface.SurveyMaps;
import dev.cairn.util.ColourRamp;
import java.awt.image.BufferedImage;
import org.junit.jupiter.api.Test;

/**
 * One colour definition: every pixel of the survey's PNG maps that shows a facet has exactly the colour the viewer
 * and renderer give that facet for the same quantity with default limits (3D colours from {@code facets.csv}, map
 * colours from the survey in memory). Measured as the largest 8-bit channel difference over all map pixels; must be
 * 0 (both go through one scale; facets.csv keeps every double exactly). The 3D pixels themselves are checked against
 * these colours in {@link PickAndColourDisplayTest}. The slope map's site circles and their numbers are drawn over the
 * surface: pixels within {@value #MARK_CLEARANCE_PX} pixels of a circled aim point are left out there (counted).
 */
class ColourConsistencyTest {
    /** Circle radius 7 plus a rank label placed within a few rings (see SurveyMaps, LabelPlacer). */
    static final int MARK_CLEARANCE_PX = 45;

    static int maxChannelDiff(int a, int b) {
        int m = 0;
        for (int s = 0; s <= 16; s += 8) {
            m = Math.max(m, Math.abs(((a >> s) & 0xFF) - ((b >> s) & 0xFF)));
        }
        return m;
    }

    /** Grid positions of the circled sites of the slope map: the best 10 whose aim facet is on map layer 1. */
    static java.util.List<double[]> siteMarks(SurveyFixture.Fixture fx) throws java.io.IOException {
        com.fasterxml.jackson.databind.JsonNode sites = dev.cairn.io.StrictJson.MAPPER.readTree(
            java.nio.file.Files.readString(fx.dir().resolve("summary.json"))).get("sites");
        java.util.List<double[]> marks = new java.util.ArrayList<>();
        for (int k = 0; k < Math.min(10, sites.size()); k++) {
            if (sites.get(k).get("map_layer").asInt() == 1) {
                marks.add(new double[] {(sites.get(k).get("lon_deg").asDouble() + 180) / 360 * fx.raster().width(),
                    (90 - sites.get(k).get("lat_deg").asDouble()) / 180 * fx.raster().height()});
            }
        }
        return marks;
    }

    static boolean nearMark(java.util.List<double[]> marks, int i, int j) {
        for (double[] m : marks) {
            if (Math.hypot(i - m[0], j - m[1]) < MARK_CLEARANCE_PX) {
                return true;
            }
        }
        return false;
    }

    @Test
    void mapPixelsHaveTheViewerColourOfTheirFacet() throws Exception {
        SurveyFixture.Fixture fx = SurveyFixture.get();
        int n = fx.mesh().facetCount();
        Object[][] cases = {{SurveyMaps.SLOPE, Quantity.SLOPE}, {SurveyMaps.G_EFF, Quantity.G_EFF},
            {SurveyMaps.DYNAMIC_HEIGHT, Quantity.DYNAMIC_HEIGHT}};
        int liftOffPixels = 0;
        java.util.List<double[]> marks = siteMarks(fx);
        for (Object[] c : cases) {
            BufferedImage img = fx.map((String) c[0]);
            assertEquals(SurveyMaps.mapWidth(SurveyFixture.MAP_GRID), img.getWidth(), "--map-size honoured");
            assertEquals(SurveyMaps.mapHeight(SurveyFixture.MAP_GRID), img.getHeight());
            int[] viewer = FacetColouring.colour(fx.data(), n, (Quantity) c[1], ColourLimits.AUTO).argb();
            boolean[] seen = new boolean[n];
            int worst = 0;
            int pixels = 0;
            int skipped = 0;
            for (int j = 0; j < fx.raster().height(); j++) {
                for (int i = 0; i < fx.raster().width(); i++) {
                    int f = fx.raster().facet(i, j, 1);
                    if (f < 0 || fx.raster().crossings(i, j) > 1) {
                        continue; // no surface, or hatching may be drawn here
                    }
                    if (c[1] == Quantity.SLOPE && nearMark(marks, i, j)) {
                        skipped++;
                        continue;
                    }
                    int px = img.getRGB(SurveyMaps.LEFT + i, SurveyMaps.TOP + j);
                    worst = Math.max(worst, maxChannelDiff(px, viewer[f]));
                    seen[f] = true;
                    pixels++;
                    liftOffPixels += c[1] == Quantity.SLOPE && viewer[f] == ColourRamp.LIFT_OFF ? 1 : 0;
                }
            }
            int facetsSeen = 0;
            for (boolean b : seen) {
                facetsSeen += b ? 1 : 0;
            }
            System.out.printf("ColourConsistencyTest: %s: %d map pixels of %d facets (of %d), max channel difference "
                + "map vs 3D colour %d (%d pixels by site marks left out)%n", c[0], pixels, facetsSeen, n, worst,
                skipped);
            assertEquals(0, worst, c[0] + ": map and 3D colour of the same facet differ");
            // every facet of this star-shaped body is on the map; the site marks hide some on the slope map
            assertTrue(facetsSeen > (c[1] == Quantity.SLOPE ? 0.5 : 0.99) * n, "facets compared: " + facetsSeen);
        }
        assertTrue(liftOffPixels > 0, "the fixture has lift-off, shown in the lift-off colour on the slope map");
    }
}
