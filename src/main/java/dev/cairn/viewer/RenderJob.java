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
        long t0 = System.nanoTime();
        FxRuntime.start();
        long t1 = System.nanoTime();
        javafx.scene.image.WritableImage img = FxRuntime.call(() -> OffscreenRenderer.render(request));
        long t2 = System.nanoTime();
        OffscreenRenderer.writePng(img, out);
        long t3 = System.nanoTime();
        if (Boolean.getBoolean("cairn.timing")) {
            System.err.printf(java.util.Locale.ROOT, "cairn: timing: toolkit %.2f s, scene+snapshot %.2f s, png %.2f s%n",
                (t1 - t0) / 1e9, (t2 - t1) / 1e9, (t3 - t2) / 1e9);
        }
    }
}
