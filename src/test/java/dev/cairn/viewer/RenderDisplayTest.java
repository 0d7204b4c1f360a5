package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.sun.javafx.scene.SceneHelper;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ColourRamp;
import java.util.EnumSet;
import java.util.HashMap;
import java.util.Map;
import javafx.application.ConditionalFeature;
import javafx.application.Platform;
import javafx.scene.Node;
import javafx.scene.Parent;
import javafx.scene.image.ImageView;
import javafx.scene.image.PixelReader;
import javafx.scene.image.WritableImage;
import javafx.scene.input.MouseButton;
import javafx.scene.input.MouseEvent;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;

/**
 * Real pixels from the offscreen renderer (needs a display server with OpenGL: Xvfb + Mesa in CI). Fails loudly
 * when JavaFX reports 3D unsupported, instead of passing on a blank image.
 */
@Tag("display")
class RenderDisplayTest {
    private static final int W = 640;
    private static final int H = 520;
    private static final double R = 1000;
    /** Subscene background (BodyScene's fill). */
    private static final int BG = 0xFF181A1E;
    /**
     * Disc radius tolerance, relative: the level-4 icosphere's silhouette lies between its vertex sphere and the
     * sphere through its facet centres, 1 − cos(2.3°) ≈ 8e-4 apart (largest facet circumradius ≈ edge angle/√3 with
     * edge ≈ 63.4°/16, spherical geometry); doubled for margin.
     */
    private static final double DISC_REL_TOL = 2e-3;
    /** Plus one pixel for the rasteriser's edge rule and antialiasing at the rim. */
    private static final double DISC_ABS_TOL_PX = 1.0;
    /**
     * Colour tolerance per 8-bit channel between a facet under ambient-only white light and the ramp colour of its
     * value: the texel is stored in 8 bits and multiplied by 1.0, so only the GPU's float-to-8-bit rounding (±1)
     * remains.
     */
    private static final int EXACT_TOL = 1;
    /**
     * Facet pixel against the legend bar pixel for the same value: ±1 as above, plus the bar row may land one row off
     * by layout rounding; neighbouring rows of the 280-row bar differ by at most 2 levels per channel (ramp design).
     */
    private static final int LEGEND_TOL = 3;

    @BeforeAll
    static void toolkit() {
        FxRuntime.start(); // throws when SCENE3D is unsupported
        assertTrue(Platform.isSupported(ConditionalFeature.SCENE3D),
            "JavaFX 3D unsupported: run with -Dprism.forceGPU=true under a display with OpenGL (xvfb-run + Mesa)");
    }

    private static BodyGeometry sphere(int level) {
        // an icosphere is centrally symmetric about the origin, so its centre of mass is the origin
        TriangleMesh m = Shapes.icosphere(level, R);
        return BodyGeometry.of(m, new double[3], new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1}, new double[] {0, 0, 1},
            "test sphere");
    }

    private static double dist(int a, int b) {
        double dr = ((a >> 16) & 0xFF) - ((b >> 16) & 0xFF);
        double dg = ((a >> 8) & 0xFF) - ((b >> 8) & 0xFF);
        double db = (a & 0xFF) - (b & 0xFF);
        return Math.sqrt(dr * dr + dg * dg + db * db);
    }

    private static void assertColour(int expected, int actual, int tol, String what) {
        for (int s = 0; s <= 16; s += 8) {
            int e = (expected >> s) & 0xFF;
            int a = (actual >> s) & 0xFF;
            assertTrue(Math.abs(e - a) <= tol, String.format("%s: expected %06x, got %06x", what,
                expected & 0xFFFFFF, actual & 0xFFFFFF));
        }
    }

    @Test
    void sphereCoversTheDiscThePinholeModelPredicts() {
        RenderRequest q = new RenderRequest(sphere(4), null, Quantity.NONE, ColourLimits.AUTO, ViewPreset.PZ,
            Lighting.FLAT, EnumSet.noneOf(Overlay.class), W, H);
        WritableImage img = FxRuntime.call(() -> OffscreenRenderer.render(q));
        int[] vp = OffscreenRenderer.viewport(W, H);
        PixelReader px = img.getPixelReader();
        double full = dist(ColourRamp.PLAIN, BG);
        double area = 0;
        double sx = 0;
        double sy = 0;
        for (int y = vp[1]; y < vp[1] + vp[3]; y++) {
            for (int x = vp[0]; x < vp[0] + vp[2]; x++) {
                // coverage: 0 on background, 1 on the surface, fractional on antialiased rim pixels
                double c = Math.min(1, dist(px.getArgb(x, y), BG) / full);
                area += c;
                sx += c * (x + 0.5);
                sy += c * (y + 0.5);
            }
        }
        double d = ViewState.fitDistance(R, vp[2], vp[3]);
        // sphere silhouette: half-angle asin(R/d); image radius f·tan(half-angle) (pinhole projection)
        double expected = ViewState.focalPixels(vp[3]) * Math.tan(Math.asin(R / d));
        double measured = Math.sqrt(area / Math.PI);
        assertEquals(expected, measured, DISC_REL_TOL * expected + DISC_ABS_TOL_PX, "disc radius, pixels");
        assertEquals(vp[0] + vp[2] / 2.0, sx / area, DISC_ABS_TOL_PX, "disc centre x");
        assertEquals(vp[1] + vp[3] / 2.0, sy / area, DISC_ABS_TOL_PX, "disc centre y");
        assertTrue(expected > 100, "a disc large enough to measure: " + expected);
    }

    /** The facet most directly facing the +z camera, and a neighbour sharing an edge with it. */
    private static int[] facingFacets(TriangleMesh m) {
        double[] n = m.facetNormals();
        int best = 0;
        for (int f = 1; f < m.facetCount(); f++) {
            if (n[3 * f + 2] > n[3 * best + 2]) {
                best = f;
            }
        }
        int[] tri = m.tri();
        int neighbour = -1;
        double nz = -2;
        for (int f = 0; f < m.facetCount(); f++) {
            int shared = 0;
            for (int a = 0; a < 3; a++) {
                for (int b = 0; b < 3; b++) {
                    shared += tri[3 * f + a] == tri[3 * best + b] ? 1 : 0;
                }
            }
            if (f != best && shared == 2 && n[3 * f + 2] > nz) {
                nz = n[3 * f + 2];
                neighbour = f;
            }
        }
        return new int[] {best, neighbour};
    }

    @Test
    void facetShowsTheLegendColourOfItsValueAndSteeperShowsWarning() {
        BodyGeometry g = sphere(2);
        int n = g.mesh().facetCount();
        int[] ff = facingFacets(g.mesh());
        double[] slope = new double[n];
        for (int f = 0; f < n; f++) {
            slope[f] = f % 200;
        }
        // value 186 on a 0..279 range sits exactly on row 93 of the 280-row legend bar (t = 186/279 = 1 - 93/279)
        slope[ff[0]] = 186;
        slope[ff[1]] = 300; // above the limit: warning colour
        Map<String, double[]> cols = new HashMap<>();
        cols.put("slope_deg", slope);
        SurveyData s = SurveyData.ofColumns(cols, n);
        RenderRequest q = new RenderRequest(g, s, Quantity.SLOPE, new ColourLimits(0.0, 279.0), ViewPreset.PZ,
            Lighting.FLAT, EnumSet.noneOf(Overlay.class), W, H);
        int[] vp = OffscreenRenderer.viewport(W, H);
        int[] got = FxRuntime.call(() -> {
            OffscreenRenderer.Rendered r = OffscreenRenderer.renderScene(q);
            WritableImage img = r.snapshot();
            ViewState v = r.body().view();
            double[] p0 = v.project(g.facetCentroidScene(ff[0]), vp[2], vp[3]);
            double[] p1 = v.project(g.facetCentroidScene(ff[1]), vp[2], vp[3]);
            ImageView bar = find(r.scene().getRoot(), ImageView.class);
            javafx.geometry.Bounds b = bar.localToScene(bar.getBoundsInLocal());
            PixelReader px = img.getPixelReader();
            return new int[] {px.getArgb((int) p0[0], (int) p0[1]), px.getArgb((int) p1[0], (int) p1[1]),
                px.getArgb((int) Math.floor(b.getCenterX()), (int) Math.floor(b.getMinY() + 93.5))};
        });
        int expected = ColourRamp.SEQUENTIAL.argb(186.0 / 279.0);
        assertColour(expected, got[0], EXACT_TOL, "facet of value 186 against the ramp");
        assertColour(got[2], got[0], LEGEND_TOL, "facet of value 186 against the legend bar at 186");
        assertColour(ColourRamp.WARNING, got[1], EXACT_TOL, "facet steeper than the limit");
    }

    private static <T> T find(Parent p, Class<T> type) {
        for (Node c : p.getChildrenUnmodifiable()) {
            if (type.isInstance(c)) {
                return type.cast(c);
            }
            if (c instanceof Parent q) {
                T t = find(q, type);
                if (t != null) {
                    return t;
                }
            }
        }
        return null;
    }

    @Test
    void renderCommandWritesAPngOfTheAskedSize(@org.junit.jupiter.api.io.TempDir java.nio.file.Path tmp)
        throws Exception {
        java.nio.file.Path obj = SyntheticSurvey.writeObj(Shapes.icosphere(2, R), tmp.resolve("s.obj"));
        java.nio.file.Path png = tmp.resolve("out/s.png");
        java.io.StringWriter err = new java.io.StringWriter();
        int rc = dev.cairn.cli.CairnMain.execute(new java.io.PrintWriter(new java.io.StringWriter()),
            new java.io.PrintWriter(err, true), "render", obj.toString(), "--quantity", "none", "--view", "+x",
            "--size", "500x440", "--out", png.toString());
        assertEquals(0, rc, err.toString());
        java.awt.image.BufferedImage img = javax.imageio.ImageIO.read(png.toFile());
        assertEquals(500, img.getWidth());
        assertEquals(440, img.getHeight());
        int[] vp = OffscreenRenderer.viewport(500, 440);
        assertTrue(dist(img.getRGB(vp[2] / 2, vp[3] / 2), BG) > 20, "body at the centre of the view");
        assertEquals(BG & 0xFFFFFF, img.getRGB(2, 2) & 0xFFFFFF, "background in the corner");
    }

    private static MouseEvent mouse(javafx.event.EventType<MouseEvent> type, double[] p, boolean down) {
        return new MouseEvent(type, p[0], p[1], p[0], p[1], MouseButton.PRIMARY, 1, false, false, false, false, down,
            false, false, true, false, true, null);
    }

    @Test
    void clickingAFacetPicksThatFacet() {
        BodyGeometry g = sphere(2);
        RenderRequest q = new RenderRequest(g, null, Quantity.NONE, ColourLimits.AUTO, ViewPreset.ISO,
            Lighting.SHADED, EnumSet.noneOf(Overlay.class), W, H);
        int[] vp = OffscreenRenderer.viewport(W, H);
        double[] nrm = g.mesh().facetNormals();
        int[] result = FxRuntime.call(() -> {
            OffscreenRenderer.Rendered r = OffscreenRenderer.renderScene(q);
            r.snapshot(); // lays out and renders once, as on screen
            ViewState v = r.body().view();
            double[] eye = v.eye();
            int tried = 0;
            int matched = 0;
            for (int f = 0; f < g.mesh().facetCount(); f++) {
                double[] c = g.facetCentroidScene(f);
                double[] toEye = ViewState.normalised(new double[] {eye[0] - c[0], eye[1] - c[1], eye[2] - c[2]});
                if (nrm[3 * f] * toEye[0] + nrm[3 * f + 1] * toEye[1] + nrm[3 * f + 2] * toEye[2] < 0.5) {
                    continue; // only facets seen well from the camera
                }
                double[] p = v.project(c, vp[2], vp[3]);
                // the JavaFX scene does the picking, as for a real click (SceneHelper is how JavaFX's own tests
                // deliver mouse events to a scene); press and release in place make the scene generate the click
                SceneHelper.processMouseEvent(r.scene(), mouse(MouseEvent.MOUSE_PRESSED, p, true));
                SceneHelper.processMouseEvent(r.scene(), mouse(MouseEvent.MOUSE_RELEASED, p, false));
                tried++;
                matched += r.body().lastPick() == f ? 1 : 0;
                if (r.body().lastPick() != f) {
                    return new int[] {tried, matched, f, r.body().lastPick()};
                }
            }
            return new int[] {tried, matched, -1, -1};
        });
        assertEquals(result[0], result[1], "click at facet " + result[2] + "'s centroid picked " + result[3]);
        assertTrue(result[0] > 20, "enough facets tried: " + result[0]);
    }
}
