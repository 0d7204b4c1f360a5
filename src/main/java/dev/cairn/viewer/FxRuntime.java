package dev.cairn.viewer;

import dev.cairn.io.InputException;
import java.util.concurrent.Callable;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.ExecutionException;
import javafx.application.ConditionalFeature;
import javafx.application.Platform;

/**
 * Starts the JavaFX toolkit once per process, lazily, and runs work on its thread.
 *
 * <p>JavaFX 3D needs a GPU-capable Prism pipeline. On a machine without a GPU that is Mesa's software OpenGL (under
 * Xvfb when there is no screen), which Prism only uses when told {@code -Dprism.forceGPU=true} before the toolkit
 * starts; otherwise it falls back silently to its software pipeline, reports {@link ConditionalFeature#SCENE3D} as
 * unsupported and draws only the background. {@link #start()} sets that property unless the user set it, and refuses
 * to go on without 3D support rather than produce blank images.
 */
public final class FxRuntime {
    private static boolean started;
    /** Held so the level setting is not lost to garbage collection (JUL keeps loggers weakly). */
    private static final java.util.logging.Logger FX_STARTUP_LOG =
        java.util.logging.Logger.getLogger("javafx");

    private FxRuntime() {
    }

    /**
     * Starts the toolkit (once) and checks 3D support.
     *
     * @throws DisplayUnavailableException when the toolkit cannot start (no display)
     * @throws InputException     when 3D rendering is unsupported (see {@link #requireScene3D(boolean)})
     */
    public static synchronized void start() {
        if (!started) {
            if (System.getProperty("prism.forceGPU") == null) {
                System.setProperty("prism.forceGPU", "true");
            }
            // JavaFX warns that it runs from the class path (our single jar): true and harmless, so not shown
            FX_STARTUP_LOG.setLevel(java.util.logging.Level.SEVERE);
            try {
                Platform.startup(() -> { });
            } catch (IllegalStateException alreadyRunning) {
                // started elsewhere in this process (e.g. by a test): fine
            } catch (RuntimeException | Error e) { // Unable to open DISPLAY, missing GTK, ...
                String why = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
                throw new DisplayUnavailableException("cannot start the graphics toolkit: no usable display (" + why
                    + "); on a machine without a screen run under xvfb-run -a -s '-screen 0 1280x1024x24'", e);
            }
            Platform.setImplicitExit(false);
            started = true;
        }
        requireScene3D(Platform.isSupported(ConditionalFeature.SCENE3D));
    }

    /** Throws a loud one-line error when JavaFX reports 3D unsupported, instead of rendering a blank image. */
    public static void requireScene3D(boolean supported) {
        if (!supported) {
            throw new InputException("JavaFX reports 3D rendering (SCENE3D) unsupported: no OpenGL pipeline. Start "
                + "Java with -Dprism.forceGPU=true and install OpenGL (Mesa: libgl1 libgl1-mesa-dri libglx-mesa0); "
                + "refusing to render a blank image");
        }
    }

    /** Runs {@code task} on the JavaFX thread and waits for its result; its exceptions are rethrown. */
    public static <T> T call(Callable<T> task) {
        if (Platform.isFxApplicationThread()) {
            try {
                return task.call();
            } catch (RuntimeException e) {
                throw e;
            } catch (Exception e) {
                throw new IllegalStateException(e);
            }
        }
        CompletableFuture<T> f = new CompletableFuture<>();
        Platform.runLater(() -> {
            try {
                f.complete(task.call());
            } catch (Throwable t) {
                f.completeExceptionally(t);
            }
        });
        try {
            return f.get();
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted", e);
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof RuntimeException re) {
                throw re;
            }
            if (c instanceof Error er) {
                throw er;
            }
            throw new IllegalStateException(c);
        }
    }
}
