package dev.cairn.viewer;

import dev.cairn.io.AtomicFiles;
import java.awt.image.BufferedImage;
import java.nio.file.Path;
import javafx.embed.swing.SwingFXUtils;
import javafx.geometry.Insets;
import javafx.scene.Scene;
import javafx.scene.SceneAntialiasing;
import javafx.scene.control.Label;
import javafx.scene.image.WritableImage;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.Pane;
import javafx.scene.layout.VBox;
import javafx.scene.paint.Color;
import javax.imageio.ImageIO;

/**
 * Renders a view to an image without opening a window: the {@link BodyScene} in a {@link Scene} that is never shown,
 * captured with {@link Scene#snapshot}, with the legend at the right and a footer carrying the body, quantity and
 * view and the operational caution. Layout: the 3D viewport is the rectangle {@link #viewport(int, int)} at the
 * top left; the legend is {@link #LEGEND_WIDTH} pixels wide; the footer {@link #FOOTER_HEIGHT} pixels high.
 */
public final class OffscreenRenderer {
    /** Width of the legend column, pixels. */
    public static final int LEGEND_WIDTH = 240;
    /** Height of the footer, pixels. */
    public static final int FOOTER_HEIGHT = 92;
    static final Color PANEL = Color.rgb(36, 38, 44);

    private OffscreenRenderer() {
    }

    /** The 3D viewport inside a {@code width × height} image: {@code [x, y, w, h]}. */
    public static int[] viewport(int width, int height) {
        return new int[] {0, 0, width - LEGEND_WIDTH, height - FOOTER_HEIGHT};
    }

    /** Renders on the JavaFX thread (call from it, e.g. through {@link FxRuntime#call}). */
    public static WritableImage render(RenderRequest q) {
        return renderScene(q).snapshot();
    }

    /** The scene of a request, for tests that look inside (picking). */
    static Rendered renderScene(RenderRequest q) {
        int[] vp = viewport(q.width(), q.height());
        BodyScene body = new BodyScene(q.geometry(), vp[2], vp[3], SceneAntialiasing.BALANCED);
        FacetColouring.Result c = FacetColouring.colour(q.survey(), q.geometry().mesh().facetCount(), q.quantity(),
            q.limits());
        body.setColours(c.argb());
        body.setSurvey(q.survey());
        body.setMarkers(q.markers());
        body.setLighting(q.lighting());
        for (Overlay o : q.overlays()) {
            body.setOverlay(o, true);
        }
        body.resetView(q.view());
        Pane labels = ZoneLabels.pane(body, vp[2], vp[3], q.overlays().contains(Overlay.ZONES),
            q.overlays().contains(Overlay.SITES));
        Pane view3d = new Pane(body.node(), labels);
        view3d.setPrefSize(vp[2], vp[3]);
        LegendView legend = new LegendView();
        legend.show(c.legend());
        legend.setPrefWidth(LEGEND_WIDTH);
        legend.setMinWidth(LEGEND_WIDTH);
        legend.setBackground(new javafx.scene.layout.Background(new javafx.scene.layout.BackgroundFill(PANEL, null,
            null)));
        Label l1 = LegendView.label(q.geometry().name() + "  ·  " + q.quantity().label() + "  ·  view from "
            + q.view().cliName() + "  ·  " + q.geometry().mesh().facetCount() + " facets"
            + (q.markers().length > 0 ? "  ·  " + q.markers().length / 3 + " marked points (white)" : "")
            + "  ·  Cairn " + dev.cairn.cli.VersionProvider.version(), 13, false);
        Label lp = LegendView.label(q.survey() == null ? "no survey" : q.survey().parametersLine(), 12, false);
        lp.setWrapText(true);
        lp.setMaxWidth(q.width() - 24);
        Label l2 = LegendView.label(Caution.TEXT, 12, false);
        l2.setWrapText(true);
        l2.setMaxWidth(q.width() - 24);
        VBox footer = new VBox(4, l1, lp, l2);
        footer.setPadding(new Insets(8, 12, 8, 12));
        footer.setPrefHeight(FOOTER_HEIGHT);
        footer.setMinHeight(FOOTER_HEIGHT);
        footer.setBackground(legend.getBackground());
        BorderPane root = new BorderPane(view3d, null, legend, footer, null);
        Scene scene = new Scene(root, q.width(), q.height());
        scene.setFill(PANEL);
        return new Rendered(scene, body);
    }

    /** A built, unshown scene and its 3D part. */
    record Rendered(Scene scene, BodyScene body) {
        WritableImage snapshot() {
            return scene.snapshot(new WritableImage((int) scene.getWidth(), (int) scene.getHeight()));
        }
    }

    /** Writes an image as PNG, atomically. */
    public static void writePng(WritableImage img, Path out) {
        BufferedImage argb = SwingFXUtils.fromFXImage(img, null);
        BufferedImage rgb = new BufferedImage(argb.getWidth(), argb.getHeight(), BufferedImage.TYPE_INT_RGB);
        rgb.getGraphics().drawImage(argb, 0, 0, null);
        AtomicFiles.write(out, os -> {
            if (!ImageIO.write(rgb, "png", os)) {
                throw new java.io.IOException("no PNG writer available");
            }
        });
    }
}
