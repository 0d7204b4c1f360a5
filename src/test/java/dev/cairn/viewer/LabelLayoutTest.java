package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.nio.file.Files;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * Site and zone labels stand at their aim points (the facets summary.json names, on the surface), only on the visible
 * side, and never overlap. Geometry checks by construction (pinhole projection of {@link ViewState}); no display.
 */
class LabelLayoutTest {
    private static final double W = 900;
    private static final double H = 700;

    @Test
    void labelsAnchorAtTheAimPointsOfTheSurveyAndDoNotOverlap() throws Exception {
        SurveyFixture.Fixture fx = SurveyFixture.get();
        JsonNode sum = dev.cairn.io.StrictJson.MAPPER.readTree(Files.readString(fx.dir().resolve("summary.json")));
        BodyGeometry g = fx.geometry();
        int shownTotal = 0;
        for (ViewPreset preset : ViewPreset.values()) {
            ViewState v = new ViewState(preset, ViewState.fitDistance(g.radius(), W, H));
            List<LabelLayout.Item> items = LabelLayout.layout(g, v, fx.data(), W, H, true, true);
            for (LabelLayout.Item it : items) {
                boolean site = it.text().startsWith("S");
                int rank = Integer.parseInt(it.text().substring(1));
                JsonNode z = find(sum.get(site ? "sites" : "zones"), rank);
                int aim = z.get(site ? "aim_facet" : "best_aim_facet").asInt();
                assertEquals(aim, it.facet(), it.text() + ": the aim facet summary.json names");
                JsonNode pt = z.get(site ? "aim_point_m" : "best_aim_point_m");
                double[] p = g.toScene(new double[] {pt.get(0).asDouble(), pt.get(1).asDouble(), pt.get(2).asDouble()});
                double[] px = v.project(p, W, H);
                assertEquals(px[0], it.x(), 1e-6, it.text() + " anchor x at the projected aim point");
                assertEquals(px[1], it.y(), 1e-6, it.text() + " anchor y");
                double[] n = LabelLayout.normal(g, it.facet());
                double[] e = v.eye();
                assertTrue(n[0] * (e[0] - p[0]) + n[1] * (e[1] - p[1]) + n[2] * (e[2] - p[2]) > 0,
                    it.text() + " on the visible side");
                for (LabelLayout.Item o : items) {
                    if (o != it && o.box().placed() && it.box().placed()) {
                        assertFalse(it.box().overlaps(o.box()), it.text() + " overlaps " + o.text());
                    }
                }
            }
            long s = items.stream().filter(i -> i.text().startsWith("S")).count();
            assertTrue(s <= LabelLayout.MAX_PER_KIND && items.size() - s <= LabelLayout.MAX_PER_KIND, "label cap");
            shownTotal += items.size();
        }
        assertTrue(shownTotal > 0, "some labels shown");
        System.out.println("LabelLayoutTest: " + shownTotal + " labels over the 7 preset views");
    }

    private static JsonNode find(JsonNode arr, int rank) {
        for (JsonNode z : arr) {
            if (z.get("rank").asInt() == rank) {
                return z;
            }
        }
        throw new AssertionError("rank " + rank + " not in summary.json");
    }

    @Test
    void aLabelBehindAnotherBodyPartIsHidden() {
        // two spheres of radius 100 m on the z axis, 1000 m apart; looking down from +z the far sphere's top is
        // hidden behind the near one (its normal faces the camera, so only the occlusion test can hide it)
        TriangleMesh a = Shapes.icosphere(2, 100);
        TriangleMesh b = Shapes.icosphere(2, 100);
        int na = a.xyz().length;
        double[] xyz = new double[na + b.xyz().length];
        System.arraycopy(a.xyz(), 0, xyz, 0, na);
        for (int i = 0; i < b.xyz().length; i += 3) {
            xyz[na + i] = b.xyz()[i];
            xyz[na + i + 1] = b.xyz()[i + 1];
            xyz[na + i + 2] = b.xyz()[i + 2] - 1000;
        }
        int[] tri = new int[a.tri().length + b.tri().length];
        System.arraycopy(a.tri(), 0, tri, 0, a.tri().length);
        for (int i = 0; i < b.tri().length; i++) {
            tri[a.tri().length + i] = b.tri()[i] + na / 3;
        }
        TriangleMesh m = new TriangleMesh(xyz, tri);
        BodyGeometry g = BodyGeometry.of(m, new double[3], new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1},
            new double[] {0, 0, 1}, "two spheres");
        double[] nrm = m.facetNormals();
        int topA = -1;
        int topB = -1;
        int nfA = a.facetCount();
        for (int f = 0; f < m.facetCount(); f++) {
            if (f < nfA && (topA < 0 || nrm[3 * f + 2] > nrm[3 * topA + 2])) {
                topA = f;
            }
            if (f >= nfA && (topB < 0 || nrm[3 * f + 2] > nrm[3 * topB + 2])) {
                topB = f;
            }
        }
        int n = m.facetCount();
        double[] site = new double[n];
        site[topA] = 1;
        site[topB] = 2;
        double[] c = m.facetCentroids();
        double[] cx = new double[n];
        double[] cy = new double[n];
        double[] cz = new double[n];
        for (int f = 0; f < n; f++) {
            cx[f] = c[3 * f];
            cy[f] = c[3 * f + 1];
            cz[f] = c[3 * f + 2];
        }
        Map<String, double[]> cols = new HashMap<>(Map.of("site", site, "cx_m", cx, "cy_m", cy, "cz_m", cz));
        SurveyData s = SurveyData.ofColumns(cols, n);
        ViewState v = new ViewState(ViewPreset.PZ, 3000);
        List<LabelLayout.Item> items = LabelLayout.layout(g, v, s, W, H, false, true);
        assertEquals(1, items.size(), "only the near sphere's site: " + items);
        assertEquals("S1", items.get(0).text());
        assertTrue(LabelLayout.occluded(g, v.eye(), g.facetCentroidScene(topB), topB));
        assertFalse(LabelLayout.occluded(g, v.eye(), g.facetCentroidScene(topA), topA));
        // from below (-z) it is the other way round
        List<LabelLayout.Item> below = LabelLayout.layout(g, new ViewState(ViewPreset.MZ, 3000), s, W, H, false,
            true);
        assertEquals(0, below.size(), "both tops face away from a camera below");
        assertArrayEquals(new double[] {cx[topA], cy[topA], cz[topA]}, s.sites().get(0).aim(), 0.0);
    }
}
