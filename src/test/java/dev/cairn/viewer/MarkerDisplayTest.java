package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.EnumSet;
import java.util.List;
import javafx.application.ConditionalFeature;
import javafx.application.Platform;
import javafx.scene.image.PixelReader;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Real pixels (Xvfb + Mesa in CI): {@code render --markers} draws each marker point where it is. Markers are placed
 * just above the centroids of well-seen facets of {@link SurveyFixture}; under ambient-only white light a marker
 * shows its material colour exactly (GPU rounding ±1, as in RenderDisplayTest), the surface there does not.
 */
@Tag("display")
class MarkerDisplayTest {
    private static final int W = 900;
    private static final int H = 760;
    private static final int TOL = 2;

    @BeforeAll
    static void toolkit() {
        FxRuntime.start();
        assertTrue(Platform.isSupported(ConditionalFeature.SCENE3D),
            "JavaFX 3D unsupported: run with -Dprism.forceGPU=true under a display with OpenGL (xvfb-run + Mesa)");
    }

    @Test
    void markersAppearAtTheirPoints() throws Exception {
        SurveyFixture.Fixture fx = SurveyFixture.get();
        BodyGeometry g = fx.geometry();
        int[] vp = OffscreenRenderer.viewport(W, H);
        RenderRequest plain = new RenderRequest(g, fx.data(), Quantity.SLOPE, ColourLimits.AUTO, ViewPreset.PZ,
            Lighting.FLAT, EnumSet.noneOf(Overlay.class), W, H);
        int white = 0xFFFFFFFF;
        int[] res = FxRuntime.call(() -> {
            OffscreenRenderer.Rendered s = OffscreenRenderer.renderScene(plain);
            PixelReader before = s.snapshot().getPixelReader();
            ViewState v = s.body().view();
            List<Integer> seen = PickAndColourDisplayTest.wellSeen(g, v, vp, before);
            int n = Math.min(6, seen.size());
            double[] marks = new double[3 * n];
            double[][] at = new double[n][];
            double[] com = g.toScene(new double[] {0, 0, 0});
            for (int k = 0; k < n; k++) {
                int f = seen.get(k * Math.max(1, seen.size() / n));
                double[] c = g.facetCentroidScene(f);
                double[] nrm = ViewState.normalised(LabelLayout.normal(g, f));
                double lift = 0.002 * g.radius();
                for (int i = 0; i < 3; i++) {
                    marks[3 * k + i] = c[i] + lift * nrm[i] - com[i]; // scene → model frame
                }
                at[k] = v.project(c, vp[2], vp[3]);
            }
            s.body().setMarkers(marks);
            PixelReader after = s.snapshot().getPixelReader();
            int shown = 0;
            int whiteBefore = 0;
            for (double[] p : at) {
                int x = (int) p[0];
                int y = (int) p[1];
                if (ColourConsistencyTest.maxChannelDiff(after.getArgb(x, y), white) <= TOL) {
                    shown++;
                }
                if (ColourConsistencyTest.maxChannelDiff(before.getArgb(x, y), white) <= TOL) {
                    whiteBefore++;
                }
            }
            return new int[] {n, shown, whiteBefore, s.body().markerCount()};
        });
        System.out.printf("[achieved] render markers: %d of %d shown in the marker colour at their projected "
            + "points (%d of those pixels were already white without markers)%n", res[1], res[0], res[2]);
        assertTrue(res[0] >= 4, "too few well-seen facets: " + res[0]);
        assertEquals(res[0], res[3]);
        assertEquals(res[0], res[1]);
        assertEquals(0, res[2]);
    }
}
