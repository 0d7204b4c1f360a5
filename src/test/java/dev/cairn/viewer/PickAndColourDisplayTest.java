package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.sun.javafx.scene.SceneHelper;
import dev.cairn.surface.SurveyMaps;
import java.awt.image.BufferedImage;
import java.util.EnumSet;
import javafx.application.ConditionalFeature;
import javafx.application.Platform;
import javafx.scene.image.PixelReader;
import javafx.scene.image.WritableImage;
import javafx.scene.input.MouseButton;
import javafx.scene.input.MouseEvent;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Real pixels (Xvfb + Mesa in CI): the picked facet is highlighted where it is, and the 3D view shows each facet in
 * exactly the colour the survey's PNG map gives it for the same quantity. Fixture: {@link SurveyFixture}.
 */
@Tag("display")
class PickAndColourDisplayTest {
    private static final int W = 900;
    private static final int H = 760;
    /**
     * Per 8-bit channel: a facet under ambient-only white light shows its texel colour times 1.0, so only the GPU's
     * float-to-8-bit rounding (±1) remains (as in RenderDisplayTest).
     */
    private static final int EXACT_TOL = 1;
    /** Facets compared must face the camera this well (cosine) and cover this many pixels around the centroid. */
    private static final double MIN_FACING = 0.6;
    private static final int PROBE_HALF = 2;

    @BeforeAll
    static void toolkit() {
        FxRuntime.start();
        assertTrue(Platform.isSupported(ConditionalFeature.SCENE3D),
            "JavaFX 3D unsupported: run with -Dprism.forceGPU=true under a display with OpenGL (xvfb-run + Mesa)");
    }

    private static int maxDiff(int a, int b) {
        return ColourConsistencyTest.maxChannelDiff(a, b);
    }

    private static MouseEvent mouse(javafx.event.EventType<MouseEvent> type, double[] p, boolean down) {
        return new MouseEvent(type, p[0], p[1], p[0], p[1], MouseButton.PRIMARY, 1, false, false, false, false, down,
            false, false, true, false, true, null);
    }

    /** Facets seen well from the camera whose centroid's neighbourhood shows only that facet. */
    static java.util.List<Integer> wellSeen(BodyGeometry g, ViewState v, int[] vp, PixelReader px) {
        double[] eye = v.eye();
        java.util.List<Integer> out = new java.util.ArrayList<>();
        for (int f = 0; f < g.mesh().facetCount(); f++) {
            double[] c = g.facetCentroidScene(f);
            double[] n = ViewState.normalised(LabelLayout.normal(g, f));
            double[] toEye = ViewState.normalised(new double[] {eye[0] - c[0], eye[1] - c[1], eye[2] - c[2]});
            if (n[0] * toEye[0] + n[1] * toEye[1] + n[2] * toEye[2] < MIN_FACING
                || LabelLayout.occluded(g, eye, c, f)) {
                continue;
            }
            double[] p = v.project(c, vp[2], vp[3]);
            int x = (int) p[0];
            int y = (int) p[1];
            if (x < PROBE_HALF || y < PROBE_HALF || x >= vp[2] - PROBE_HALF || y >= vp[3] - PROBE_HALF) {
                continue;
            }
            boolean uniform = true;
            int c0 = px.getArgb(x, y);
            for (int dy = -PROBE_HALF; dy <= PROBE_HALF && uniform; dy++) {
                for (int dx = -PROBE_HALF; dx <= PROBE_HALF && uniform; dx++) {
                    uniform = maxDiff(c0, px.getArgb(x + dx, y + dy)) <= 2 * EXACT_TOL;
                }
            }
            if (uniform) {
                out.add(f);
            }
        }
        return out;
    }

    @Test
    void clickingAFacetHighlightsThatFacet() throws Exception {
        SurveyFixture.Fixture fx = SurveyFixture.get();
        BodyGeometry g = fx.geometry();
        RenderRequest q = new RenderRequest(g, fx.data(), Quantity.SLOPE, ColourLimits.AUTO, ViewPreset.PZ,
            Lighting.FLAT, EnumSet.noneOf(Overlay.class), W, H);
        int[] vp = OffscreenRenderer.viewport(W, H);
        int hl = argb(BodyScene.HIGHLIGHT);
        int[] r = FxRuntime.call(() -> {
            OffscreenRenderer.Rendered s = OffscreenRenderer.renderScene(q);
            PixelReader before = s.snapshot().getPixelReader();
            ViewState v = s.body().view();
            java.util.List<Integer> cand = wellSeen(g, v, vp, before);
            int tried = 0;
            int ok = 0;
            int firstBad = -1;
            for (int k = 0; k < cand.size() && tried < 12; k += Math.max(1, cand.size() / 12)) {
                int f = cand.get(k);
                double[] p = v.project(g.facetCentroidScene(f), vp[2], vp[3]);
                SceneHelper.processMouseEvent(s.scene(), mouse(MouseEvent.MOUSE_PRESSED, p, true));
                SceneHelper.processMouseEvent(s.scene(), mouse(MouseEvent.MOUSE_RELEASED, p, false));
                PixelReader after = s.snapshot().getPixelReader();
                tried++;
                boolean picked = s.body().lastPick() == f && s.body().highlighted() == f;
                boolean lit = maxDiff(after.getArgb((int) p[0], (int) p[1]), hl) <= EXACT_TOL;
                // the previous pick's highlight has moved: the earlier facet shows its own colour again
                boolean onlyOne = true;
                if (k > 0) {
                    int prev = cand.get(k - Math.max(1, cand.size() / 12));
                    double[] pp = v.project(g.facetCentroidScene(prev), vp[2], vp[3]);
                    onlyOne = maxDiff(after.getArgb((int) pp[0], (int) pp[1]),
                        before.getArgb((int) pp[0], (int) pp[1])) <= EXACT_TOL;
                }
                if (picked && lit && onlyOne) {
                    ok++;
                } else if (firstBad < 0) {
                    firstBad = f;
                }
            }
            return new int[] {tried, ok, firstBad};
        });
        System.out.printf("PickAndColourDisplayTest: highlight shown on %d of %d clicked facets%n", r[1], r[0]);
        assertTrue(r[0] >= 8, "enough facets clicked: " + r[0]);
        assertEquals(r[0], r[1], "facet " + r[2] + ": not picked, not highlighted at its centroid, or an old "
            + "highlight left behind");
    }

    private static int argb(javafx.scene.paint.Color c) {
        return 0xFF000000 | ((int) Math.round(c.getRed() * 255) << 16) | ((int) Math.round(c.getGreen() * 255) << 8)
            | (int) Math.round(c.getBlue() * 255);
    }

    @Test
    void threeDColoursMatchTheMapColoursOfTheSameFacets() throws Exception {
        SurveyFixture.Fixture fx = SurveyFixture.get();
        BodyGeometry g = fx.geometry();
        int n = g.mesh().facetCount();
        Object[][] cases = {{SurveyMaps.SLOPE, Quantity.SLOPE}, {SurveyMaps.G_EFF, Quantity.G_EFF},
            {SurveyMaps.DYNAMIC_HEIGHT, Quantity.DYNAMIC_HEIGHT}};
        int[] vp = OffscreenRenderer.viewport(W, H);
        for (Object[] c : cases) {
            // map colour of each facet: a map pixel showing it, away from the slope map's site marks
            // (ColourConsistencyTest shows that all those pixels of a facet have one colour)
            BufferedImage map = fx.map((String) c[0]);
            int[] mapColour = mapColour(fx, map, n, c[1] == Quantity.SLOPE);
            int worst = 0;
            int compared = 0;
            int liftOff = 0;
            for (ViewPreset view : new ViewPreset[] {ViewPreset.PZ, ViewPreset.PX, ViewPreset.MY}) {
                RenderRequest q = new RenderRequest(g, fx.data(), (Quantity) c[1], ColourLimits.AUTO, view,
                    Lighting.FLAT, EnumSet.noneOf(Overlay.class), W, H);
                int[] res = FxRuntime.call(() -> {
                    OffscreenRenderer.Rendered s = OffscreenRenderer.renderScene(q);
                    PixelReader px = s.snapshot().getPixelReader();
                    ViewState v = s.body().view();
                    int w = 0;
                    int k = 0;
                    int lo = 0;
                    for (int f : wellSeen(g, v, vp, px)) {
                        if (mapColour[f] == 0) {
                            continue;
                        }
                        double[] p = v.project(g.facetCentroidScene(f), vp[2], vp[3]);
                        w = Math.max(w, maxDiff(px.getArgb((int) p[0], (int) p[1]), mapColour[f]));
                        k++;
                        lo += mapColour[f] == dev.cairn.util.ColourRamp.LIFT_OFF ? 1 : 0;
                    }
                    return new int[] {w, k, lo};
                });
                worst = Math.max(worst, res[0]);
                compared += res[1];
                liftOff += res[2];
            }
            System.out.printf("PickAndColourDisplayTest: %s: %d facet views compared, max channel difference 3D vs "
                + "map %d (%d lift-off)%n", c[0], compared, worst, liftOff);
            assertTrue(compared > 200, c[0] + ": enough facets compared: " + compared);
            assertTrue(worst <= EXACT_TOL, c[0] + ": 3D and map colours differ by " + worst);
            if (c[1] == Quantity.SLOPE) {
                assertTrue(liftOff > 0, "lift-off facets compared too");
            }
        }
    }

    /** Per facet, the colour of a map pixel showing it away from the site marks (0 when there is none). */
    private static int[] mapColour(SurveyFixture.Fixture fx, BufferedImage map, int n, boolean marked)
        throws java.io.IOException {
        java.util.List<double[]> marks = marked ? ColourConsistencyTest.siteMarks(fx) : java.util.List.of();
        int[] out = new int[n];
        for (int j = 0; j < fx.raster().height(); j++) {
            for (int i = 0; i < fx.raster().width(); i++) {
                int f = fx.raster().facet(i, j, 1);
                if (f >= 0 && fx.raster().crossings(i, j) <= 1 && !ColourConsistencyTest.nearMark(marks, i, j)) {
                    out[f] = map.getRGB(SurveyMaps.LEFT + i, SurveyMaps.TOP + j);
                }
            }
        }
        return out;
    }
}
