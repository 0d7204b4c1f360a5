package dev.cairn.viewer;

import java.nio.file.Path;

/** Renders a request to a PNG file: starts JavaFX if needed, snapshots offscreen, writes atomically. */
public final class RenderJob {
    private RenderJob() {
    }

    /**
     * @throws DisplayUnavailableException when JavaFX cannot start (no display server)
     * @throws dev.cairn.io.InputException when 3D rendering is unsupported
     */
    public static void renderToFile(RenderRequest request, Path out) {
        FxRuntime.start();
        javafx.scene.image.WritableImage img = FxRuntime.call(() -> OffscreenRenderer.render(request));
        OffscreenRenderer.writePng(img, out);
    }
}
