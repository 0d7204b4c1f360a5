package dev.cairn.viewer;

import java.util.EnumMap;
import java.util.Map;
import java.util.function.IntConsumer;
import javafx.scene.AmbientLight;
import javafx.scene.DirectionalLight;
import javafx.scene.Group;
import javafx.scene.PerspectiveCamera;
import javafx.scene.SceneAntialiasing;
import javafx.scene.SubScene;
import javafx.scene.image.WritableImage;
import javafx.scene.input.PickResult;
import javafx.scene.paint.Color;
import javafx.scene.paint.PhongMaterial;
import javafx.scene.shape.CullFace;
import javafx.scene.shape.DrawMode;
import javafx.scene.shape.MeshView;
import javafx.scene.shape.TriangleMesh;
import javafx.scene.transform.Affine;

/**
 * The 3D part of the viewer and renderer (JavaFX thread only): the body as one flat-shaded {@link MeshView} whose
 * facets take their colour from a {@link TextureAtlas} texture (one texel per facet, all smoothing groups 0, so
 * every facet is lit with its own normal), the camera, the lights and the overlays.
 *
 * <p>Lighting: {@link Lighting#SHADED} is a dim ambient light plus a key light from over the viewer's shoulder, so
 * relief reads; {@link Lighting#FLAT} is a full-strength white ambient light only, under which every facet shows
 * exactly its texel colour (the legend's colour), used for colour-exact images and tests.
 */
public final class BodyScene {
    /** Models with more facets get a clustered proxy for dragging. */
    public static final int PROXY_ABOVE_FACETS = 200_000;
    /** Clustering grid of the proxy: cells along the longest side (≈ 50–100 k proxy facets for a round body). */
    public static final int PROXY_CELLS = 110;
    /** Graticule spacing, degrees. */
    public static final double GRATICULE_STEP_DEG = 15;
    /** Outward lift of surface lines, fraction of the radius (keeps them above the surface in the depth test). */
    private static final double LINE_LIFT = 0.002;
    /** Shaded mode: ambient grey level and key-light grey level (common practice, no source). */
    private static final double AMBIENT_SHADED = 0.38;
    private static final double KEY_SHADED = 0.72;

    private final BodyGeometry geometry;
    private final TextureAtlas atlas;
    private final WritableImage texture;
    private final MeshView surface;
    private final BodyGeometry.Proxy proxy;
    private final TextureAtlas proxyAtlas;
    private final WritableImage proxyTexture;
    private final MeshView proxyView;
    private final Group overlayRoot = new Group();
    private final Map<Overlay, Group> overlays = new EnumMap<>(Overlay.class);
    private final PerspectiveCamera camera = new PerspectiveCamera(true);
    private final Affine cameraPose = new Affine();
    private final AmbientLight ambient = new AmbientLight();
    private final DirectionalLight key = new DirectionalLight();
    private final SubScene subScene;
    private ViewState view;
    private SurveyData survey;
    private IntConsumer pickListener = f -> { };
    private int lastPick = -1;
    private final Group highlight = new Group();
    private final Group markers = new Group();
    private int highlighted = -1;
    /** Colour of the picked-facet highlight: bright cyan (unlit, so it reads the same in both light modes). */
    public static final Color HIGHLIGHT = Color.rgb(0, 235, 255);
    /** Outward offset of the highlight along the facet normal, fraction of the body radius. */
    static final double HIGHLIGHT_LIFT = 0.004;

    /**
     * Builds the scene for a body at a viewport size.
     *
     * @param geometry the body
     * @param width    viewport width, pixels
     * @param height   viewport height, pixels
     * @param aa       antialiasing of the 3D view
     */
    public BodyScene(BodyGeometry geometry, double width, double height, SceneAntialiasing aa) {
        this.geometry = geometry;
        int nf = geometry.mesh().facetCount();
        atlas = new TextureAtlas(nf);
        texture = new WritableImage(atlas.width(), atlas.height());

        surface = meshView(geometry.scenePoints(), geometry.mesh().tri(), atlas, texture);
        if (nf > PROXY_ABOVE_FACETS) {
            proxy = geometry.clustered(PROXY_CELLS);
            proxyAtlas = new TextureAtlas(Math.max(1, proxy.facetCount()));
            proxyTexture = new WritableImage(proxyAtlas.width(), proxyAtlas.height());
            proxyView = meshView(proxy.points(), proxy.tri(), proxyAtlas, proxyTexture);
            proxyView.setVisible(false);
            proxyView.setMouseTransparent(true);
        } else {
            proxy = null;
            proxyAtlas = null;
            proxyTexture = null;
            proxyView = null;
        }
        setColours(FacetColouring.colour(null, nf, Quantity.NONE, ColourLimits.AUTO).argb());

        for (Overlay o : Overlay.values()) {
            Group g = new Group();
            g.setVisible(false);
            overlays.put(o, g);
            overlayRoot.getChildren().add(g);
        }
        buildFixedOverlays();

        camera.setFieldOfView(ViewState.FOV_DEG);
        camera.setVerticalFieldOfView(true);
        camera.getTransforms().add(cameraPose);
        highlight.setMouseTransparent(true);
        markers.setMouseTransparent(true);
        Group world = new Group(surface, overlayRoot, highlight, markers, camera, ambient, key);
        if (proxyView != null) {
            world.getChildren().add(proxyView);
        }
        subScene = new SubScene(world, width, height, true, aa);
        subScene.setFill(Color.rgb(24, 26, 30));
        subScene.setCamera(camera);
        subScene.setOnMouseClicked(e -> {
            if (e.isStillSincePress()) {
                pick(e.getPickResult());
            }
        });
        setLighting(Lighting.SHADED);
        resetView(ViewPreset.ISO);
    }

    /** A flat-shaded mesh node: texel-centre texture coordinates per facet, all smoothing groups 0. */
    private static MeshView meshView(float[] points, int[] tri, TextureAtlas atlas, WritableImage texture) {
        int nf = tri.length / 3;
        TriangleMesh fx = new TriangleMesh();
        fx.getPoints().setAll(points);
        fx.getTexCoords().setAll(atlas.texCoords());
        int[] faces = new int[6 * nf];
        for (int f = 0; f < nf; f++) {
            faces[6 * f] = tri[3 * f];
            faces[6 * f + 1] = f;
            faces[6 * f + 2] = tri[3 * f + 1];
            faces[6 * f + 3] = f;
            faces[6 * f + 4] = tri[3 * f + 2];
            faces[6 * f + 5] = f;
        }
        fx.getFaces().setAll(faces);
        fx.getFaceSmoothingGroups().setAll(new int[nf]); // all 0: flat shading, one normal per facet
        PhongMaterial material = new PhongMaterial(Color.WHITE);
        material.setDiffuseMap(texture);
        MeshView v = new MeshView(fx);
        v.setMaterial(material);
        v.setCullFace(CullFace.BACK); // outward facets are counter-clockwise seen from outside
        return v;
    }

    /**
     * While {@code on}, large models show their clustered proxy instead of the full mesh, so that dragging stays
     * fluid on slow (software) OpenGL; no effect on models up to {@link #PROXY_ABOVE_FACETS} facets.
     */
    public void setInteracting(boolean on) {
        if (proxyView != null) {
            proxyView.setVisible(on);
            surface.setVisible(!on);
        }
    }

    /** Facets of the proxy shown while dragging, or 0 when the model needs none. */
    public int proxyFacets() {
        return proxy == null ? 0 : proxy.facetCount();
    }

    /** The JavaFX node to put in a layout. */
    public SubScene node() {
        return subScene;
    }

    public BodyGeometry geometry() {
        return geometry;
    }

    public TextureAtlas atlas() {
        return atlas;
    }

    /** The surface node (for picking checks). */
    public MeshView surface() {
        return surface;
    }

    /** Sets one colour per facet ({@code 0xAARRGGBB}, OBJ order). */
    public void setColours(int[] argb) {
        texture.getPixelWriter().setPixels(0, 0, atlas.width(), atlas.height(),
            javafx.scene.image.PixelFormat.getIntArgbInstance(), atlas.pixels(argb), 0, atlas.width());
        if (proxy != null) {
            int[] src = proxy.sourceFacet();
            int[] pc = new int[Math.max(1, src.length)];
            for (int i = 0; i < src.length; i++) {
                pc[i] = argb[src[i]];
            }
            proxyTexture.getPixelWriter().setPixels(0, 0, proxyAtlas.width(), proxyAtlas.height(),
                javafx.scene.image.PixelFormat.getIntArgbInstance(), proxyAtlas.pixels(pc), 0, proxyAtlas.width());
        }
    }

    /** Sets the lighting mode. */
    public void setLighting(Lighting mode) {
        if (mode == Lighting.FLAT) {
            ambient.setColor(Color.WHITE);
            key.setLightOn(false);
        } else {
            ambient.setColor(Color.gray(AMBIENT_SHADED));
            key.setColor(Color.gray(KEY_SHADED));
            key.setLightOn(true);
        }
    }

    /** The current view (live object: call {@link #applyView()} after changing it). */
    public ViewState view() {
        return view;
    }

    /** Back to a preset at the fitted distance. */
    public void resetView(ViewPreset preset) {
        view = new ViewState(preset, ViewState.fitDistance(geometry.radius(), subScene.getWidth(),
            subScene.getHeight()));
        applyView();
    }

    /** Looks along {@code -from} (scene frame) with {@code up}, at the fitted distance. */
    public void lookFrom(double[] from, double[] up) {
        view.look(ViewState.normalised(from), up);
        view.setDistance(ViewState.fitDistance(geometry.radius(), subScene.getWidth(), subScene.getHeight()));
        applyView();
    }

    /** Moves the camera and the key light to the current {@link #view()}. */
    public void applyView() {
        double[] r = view.orientation();
        double[] e = view.eye();
        cameraPose.setToTransform(r[0], r[1], r[2], e[0], r[3], r[4], r[5], e[1], r[6], r[7], r[8], e[2]);
        double d = Math.hypot(view.distance(), 0);
        camera.setNearClip(Math.max(d - 2 * geometry.radius(), d * 1e-3));
        camera.setFarClip(d + 2 * geometry.radius());
        // key light from over the viewer's upper-left shoulder: direction in scene frame
        double[] dir = {0.35, 0.45, 1.0}; // camera frame: right, down, forward
        double n = Math.sqrt(dir[0] * dir[0] + dir[1] * dir[1] + dir[2] * dir[2]);
        key.setDirection(new javafx.geometry.Point3D(
            (r[0] * dir[0] + r[1] * dir[1] + r[2] * dir[2]) / n,
            (r[3] * dir[0] + r[4] * dir[1] + r[5] * dir[2]) / n,
            (r[6] * dir[0] + r[7] * dir[1] + r[8] * dir[2]) / n));
    }

    /** Resizes the viewport (the view keeps its distance). */
    public void resize(double width, double height) {
        subScene.setWidth(width);
        subScene.setHeight(height);
    }

    /** Shows or hides an overlay. */
    public void setOverlay(Overlay o, boolean on) {
        if (o == Overlay.GRATICULE && on && overlays.get(o).getChildren().isEmpty()) {
            overlays.get(o).getChildren().add(Lines.of(geometry.graticule(GRATICULE_STEP_DEG, LINE_LIFT),
                Color.rgb(235, 235, 235)));
        }
        if (o == Overlay.WIREFRAME && on && overlays.get(o).getChildren().isEmpty()) {
            MeshView wire = new MeshView(surface.getMesh());
            wire.setDrawMode(DrawMode.LINE);
            wire.setCullFace(CullFace.BACK);
            wire.setMaterial(Lines.material(Color.rgb(20, 20, 20)));
            wire.setScaleX(1 + LINE_LIFT);
            wire.setScaleY(1 + LINE_LIFT);
            wire.setScaleZ(1 + LINE_LIFT);
            wire.setMouseTransparent(true);
            overlays.get(o).getChildren().add(wire);
        }
        overlays.get(o).setVisible(on);
    }

    /** Whether an overlay is shown. */
    public boolean overlayShown(Overlay o) {
        return overlays.get(o).isVisible();
    }

    /** Sets the survey (for zone and site outlines); may be null. */
    public void setSurvey(SurveyData s) {
        survey = s;
        Group z = overlays.get(Overlay.ZONES);
        Group st = overlays.get(Overlay.SITES);
        z.getChildren().clear();
        st.getChildren().clear();
        if (s != null) {
            for (SurveyData.Zone zone : s.zones()) {
                z.getChildren().add(Lines.of(geometry.outline(zone.facets(), LINE_LIFT), Color.WHITE));
            }
            for (SurveyData.Zone site : s.sites()) {
                st.getChildren().add(Lines.of(geometry.outline(site.facets(), LINE_LIFT), Color.rgb(255, 225, 90)));
            }
        }
    }

    public SurveyData survey() {
        return survey;
    }

    /** Colour of the marker points: a white that no colour ramp ends in, with a dark rim from the shading. */
    static final Color MARKER = Color.rgb(255, 255, 255);

    /**
     * Shows small spheres at {@code xyz} (x, y, z triples, metres, model frame), e.g. the rest points of a
     * deployment; radius 0.8 % of the body's radius. Replaces earlier markers; an empty array removes them.
     */
    public void setMarkers(double[] xyz) {
        markers.getChildren().clear();
        PhongMaterial m = new PhongMaterial(MARKER);
        double r = 0.008 * geometry.radius();
        for (int i = 0; i + 2 < xyz.length; i += 3) {
            double[] p = geometry.toScene(new double[] {xyz[i], xyz[i + 1], xyz[i + 2]});
            javafx.scene.shape.Sphere s = new javafx.scene.shape.Sphere(r, 8);
            s.setMaterial(m);
            s.setTranslateX(p[0]);
            s.setTranslateY(p[1]);
            s.setTranslateZ(p[2]);
            markers.getChildren().add(s);
        }
    }

    /** Number of marker points shown. */
    public int markerCount() {
        return markers.getChildren().size();
    }

    private void buildFixedOverlays() {
        double len = 1.3 * geometry.radius();
        double[] s = geometry.spinAxis();
        overlays.get(Overlay.SPIN_AXIS).getChildren().add(Lines.of(new float[] {
            (float) (-len * s[0]), (float) (-len * s[1]), (float) (-len * s[2]),
            (float) (len * s[0]), (float) (len * s[1]), (float) (len * s[2])}, Color.rgb(255, 210, 60)));
        double[] a = geometry.principalAxes();
        Color[] pc = {Color.rgb(250, 120, 200), Color.rgb(120, 230, 230), Color.rgb(250, 250, 250)};
        for (int k = 0; k < 3; k++) {
            overlays.get(Overlay.PRINCIPAL_AXES).getChildren().add(Lines.of(new float[] {
                (float) (-len * a[3 * k]), (float) (-len * a[3 * k + 1]), (float) (-len * a[3 * k + 2]),
                (float) (len * a[3 * k]), (float) (len * a[3 * k + 1]), (float) (len * a[3 * k + 2])}, pc[k]));
        }
        double[] o = geometry.toScene(new double[] {0, 0, 0});
        Color[] bc = {Color.rgb(255, 90, 60), Color.rgb(80, 220, 90), Color.rgb(80, 140, 255)};
        for (int k = 0; k < 3; k++) {
            float[] seg = {(float) o[0], (float) o[1], (float) o[2], (float) o[0], (float) o[1], (float) o[2]};
            seg[3 + k] += (float) len;
            overlays.get(Overlay.BODY_AXES).getChildren().add(Lines.of(seg, bc[k]));
        }
    }

    /** Registers a listener for picked facets (index in OBJ order). */
    public void setPickListener(IntConsumer l) {
        pickListener = l;
    }

    /** The last picked facet, or -1. */
    public int lastPick() {
        return lastPick;
    }

    private void pick(PickResult r) {
        if (r != null && r.getIntersectedNode() == surface && r.getIntersectedFace() >= 0) {
            lastPick = r.getIntersectedFace(); // faces are in OBJ order
            setHighlight(lastPick);
            pickListener.accept(lastPick);
        }
    }

    /**
     * Marks facet {@code f} (OBJ order; -1 clears): a copy of the triangle lifted {@link #HIGHLIGHT_LIFT} of the
     * radius along its outward normal, filled in {@link #HIGHLIGHT} (unlit) and outlined in black, so it stands above
     * the surface in the depth test and is seen wherever the facet is.
     */
    public void setHighlight(int f) {
        highlight.getChildren().clear();
        highlighted = f;
        if (f < 0) {
            return;
        }
        float[] tri = highlightTriangle(f);
        TriangleMesh m = new TriangleMesh();
        m.getPoints().setAll(tri);
        m.getTexCoords().setAll(0.5f, 0.5f);
        m.getFaces().setAll(0, 0, 1, 0, 2, 0);
        MeshView fill = new MeshView(m);
        fill.setMaterial(Lines.material(HIGHLIGHT));
        fill.setCullFace(CullFace.BACK);
        fill.setMouseTransparent(true);
        float[] rim = new float[18];
        for (int k = 0; k < 3; k++) {
            int a = k;
            int b = (k + 1) % 3;
            System.arraycopy(tri, 3 * a, rim, 6 * k, 3);
            System.arraycopy(tri, 3 * b, rim, 6 * k + 3, 3);
        }
        highlight.getChildren().addAll(fill, Lines.of(rim, Color.BLACK));
    }

    /** The facet highlighted, or -1. */
    public int highlighted() {
        return highlighted;
    }

    /** The highlight triangle's corners, scene frame: the facet's vertices lifted along its outward normal. */
    float[] highlightTriangle(int f) {
        int[] t = geometry.mesh().tri();
        double[] xyz = geometry.mesh().xyz();
        double[] c = geometry.centreOfMass();
        double[][] v = new double[3][];
        for (int k = 0; k < 3; k++) {
            int i = 3 * t[3 * f + k];
            v[k] = new double[] {xyz[i] - c[0], xyz[i + 1] - c[1], xyz[i + 2] - c[2]};
        }
        // outward normal of a counter-clockwise (seen from outside) facet: (v1 - v0) x (v2 - v0), normalised
        double ax = v[1][0] - v[0][0];
        double ay = v[1][1] - v[0][1];
        double az = v[1][2] - v[0][2];
        double bx = v[2][0] - v[0][0];
        double by = v[2][1] - v[0][1];
        double bz = v[2][2] - v[0][2];
        double[] n = {ay * bz - az * by, az * bx - ax * bz, ax * by - ay * bx};
        double len = Math.sqrt(n[0] * n[0] + n[1] * n[1] + n[2] * n[2]);
        double lift = len > 0 ? HIGHLIGHT_LIFT * geometry.radius() / len : 0;
        float[] out = new float[9];
        for (int k = 0; k < 3; k++) {
            for (int q = 0; q < 3; q++) {
                out[3 * k + q] = (float) (v[k][q] + lift * n[q]);
            }
        }
        return out;
    }
}
