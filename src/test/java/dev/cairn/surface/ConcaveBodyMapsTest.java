package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.MeshInspector;
import dev.cairn.mesh.MeshReport;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.rotation.SpinState;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Locale;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Maps of a body that is not star-shaped about its centre of mass: an invented C shape (a thick 270° arc, radii
 * 300–500 m, 200 m tall) whose centre of mass lies in the hole, outside the body, so every ray from it that meets the
 * body crosses the surface at least twice. The map layers and the hidden area are checked against brute force: a ray
 * from the centre of mass through each facet's centroid (and through each checked cell's direction) intersected with
 * every facet by the independent plane-crossing test of {@link BruteGeometry}; distinct crossings counted from the
 * outside (definition in docs/survey.md; common practice, no source).
 */
class ConcaveBodyMapsTest {
    private static final double DENSITY = 2000.0;
    /** Hits closer than this (relative) are one crossing (shared edges), as in the definition. */
    private static final double SAME = 1e-9;

    private static TriangleMesh mesh;
    private static SurveyResult res;
    private static double[] com;
    private static int[] bruteLayer;

    @BeforeAll
    static void setUp() {
        mesh = TestBoxes.cShape(300, 500, 100, 135, 54, 4, 2.0, 77);
        SurveyTarget t = SurveyTestBodies.target("C", mesh, DENSITY, new SpinState(6 * 3600,
            new double[] {0.1, 0.05, 1}));
        com = t.centreOfMass();
        res = SurveyTestBodies.survey(t, SurveyParameters.defaults().withZoneRadius(30)
            .withHoverAltitudes(new double[] {0}));
        bruteLayer = new int[mesh.facetCount()];
        for (int f = 0; f < mesh.facetCount(); f++) {
            double[] c = BruteGeometry.centroid(mesh, f);
            double[] d = {c[0] - com[0], c[1] - com[1], c[2] - com[2]};
            double tc = Math.sqrt(d[0] * d[0] + d[1] * d[1] + d[2] * d[2]);
            double[] hits = crossings(new double[] {d[0] / tc, d[1] / tc, d[2] / tc}, f);
            int beyond = 0;
            for (double h : hits) {
                beyond += h > tc * (1 + SAME) ? 1 : 0;
            }
            bruteLayer[f] = 1 + beyond;
        }
    }

    /** Distinct crossings of the ray from the centre of mass along unit d (skipping facet {@code skip}), decreasing. */
    private static double[] crossings(double[] d, int skip) {
        double[] t = new double[mesh.facetCount()];
        int n = 0;
        for (int g = 0; g < mesh.facetCount(); g++) {
            double h = g == skip ? Double.NaN : BruteGeometry.ray(mesh, g, com, d);
            if (h > 0) {
                t[n++] = h;
            }
        }
        double[] s = Arrays.copyOf(t, n);
        Arrays.sort(s);
        double[] out = new double[n];
        int k = 0;
        for (int i = n - 1; i >= 0; i--) {
            if (k == 0 || out[k - 1] - s[i] > SAME * out[k - 1]) {
                out[k++] = s[i];
            }
        }
        return Arrays.copyOf(out, k);
    }

    @Test
    void theBodyIsClosedAndItsCentreOfMassOutside() {
        MeshReport r = MeshInspector.inspect(mesh);
        assertTrue(r.fitForGravity(), "closed, consistently oriented, no degenerate facet");
        assertTrue(MassPropertiesCalculator.compute(mesh, DENSITY).volume() > 0, "outward");
        double rho = Math.hypot(com[0], com[1]);
        assertTrue(rho < 300, "centre of mass in the hole, " + rho + " m from the axis");
    }

    @Test
    void facetLayersAndHiddenAreaMatchBruteForce() {
        int[] layer = res.mapLayer();
        double total = 0;
        double hidden = 0;
        double[] area = res.areas();
        int max = 0;
        for (int f = 0; f < layer.length; f++) {
            assertEquals(bruteLayer[f], layer[f], "map layer of facet " + f);
            total += area[f];
            hidden += bruteLayer[f] > 1 ? area[f] : 0;
            max = Math.max(max, bruteLayer[f]);
        }
        assertEquals(hidden / total, res.hiddenAreaFraction(), 1e-12);
        // Inner wall alone (270° of radius 300 m, 200 m tall) is about 18 % of the area: hidden from outside.
        assertTrue(res.hiddenAreaFraction() > 0.15, "hidden fraction " + res.hiddenAreaFraction());
        assertTrue(max >= 2);
        String sub = SurveyMaps.mapSubtitle(res, 1);
        String pct = String.format(Locale.ROOT, "%.1f%%", 100 * hidden / total);
        assertTrue(sub.contains(pct + " of area hidden below"), sub);
        for (int l = 1; l <= max; l++) {
            double below = 0;
            for (int f = 0; f < layer.length; f++) {
                below += bruteLayer[f] > l ? area[f] : 0;
            }
            assertEquals(below > 0, SurveyMaps.mapSubtitle(res, l).contains("hidden below"), "layer " + l);
        }
        System.out.println("ConcaveBodyMapsTest: " + mesh.facetCount() + " facets, hidden on the outer maps "
            + pct + ", deepest layer " + max);
    }

    @Test
    void rasterLayersAreTheCrossingsFromOutside() {
        RotatingFrame frame = new RotatingFrame(res.target().spin(), com);
        LatLonRaster r = LatLonRaster.build(mesh, frame, 180, 90, 2);
        int max = Arrays.stream(bruteLayer).max().orElseThrow();
        assertEquals(Math.min(max, LatLonRaster.MAX_LAYERS), r.layers(), "a layer for every facet's depth");
        double[] d = new double[3];
        int checked = 0;
        int multi = 0;
        for (int j = 0; j < r.height(); j += 3) {
            for (int i = 0; i < r.width(); i += 3) {
                frame.direction(r.latDeg(j), r.lonDeg(i), d, 0);
                double[] x = crossings(d, -1);
                assertEquals(x.length, r.crossings(i, j), "crossings of cell " + i + "," + j);
                for (int l = 1; l <= r.layers(); l++) {
                    int f = r.facet(i, j, l);
                    if (l > x.length) {
                        assertEquals(-1, f);
                        continue;
                    }
                    double tf = BruteGeometry.ray(mesh, f, com, d);
                    assertEquals(x[l - 1], tf, 1e-6 * x[l - 1], "layer " + l + " of cell " + i + "," + j);
                }
                checked++;
                multi += x.length > 1 ? 1 : 0;
            }
        }
        assertTrue(multi > checked / 10, multi + " of " + checked + " checked cells cross more than once");
    }

    @Test
    void layerMapsAreWrittenAndSummaryCountsThem(@TempDir Path dir) throws IOException {
        SurveyOutputs.writeAll(res, dir);
        int max = Arrays.stream(bruteLayer).max().orElseThrow();
        int layers = Math.min(max, LatLonRaster.MAX_LAYERS);
        for (String m : new String[] {SurveyMaps.SLOPE, SurveyMaps.G_EFF, SurveyMaps.DYNAMIC_HEIGHT}) {
            for (int l = 1; l <= layers; l++) {
                assertTrue(Files.isRegularFile(dir.resolve(SurveyMaps.layerFile(m, l))), m + " layer " + l);
            }
            assertFalse(Files.exists(dir.resolve(SurveyMaps.layerFile(m, layers + 1))));
        }
        JsonNode j = new ObjectMapper().readTree(dir.resolve(SurveyOutputs.JSON).toFile());
        JsonNode ml = j.get("map_layers");
        assertEquals(layers, ml.get("layers").asInt());
        assertEquals(res.hiddenAreaFraction(), ml.get("hidden_on_outer_maps_area_fraction").asDouble(), 0.0);
        double sum = ml.get("on_no_map_area_fraction").asDouble();
        for (JsonNode x : ml.get("area_fraction_per_layer")) {
            sum += x.asDouble();
        }
        assertEquals(1.0, sum, 1e-12, "every facet on exactly one layer or on none");
        // facets.csv carries each facet's layer
        String header = Files.readAllLines(dir.resolve(SurveyOutputs.CSV)).get(0);
        assertTrue(Arrays.asList(header.split(",")).contains("map_layer"));
        assertTrue(Arrays.asList(header.split(",")).contains("site"));
    }
}
