package dev.cairn.cli;

import dev.cairn.util.ProgressListener;
import java.io.PrintStream;

/**
 * A one-line progress bar with percentage and ETA on stderr, shown only when a terminal is attached (quiet when
 * output is piped or redirected, and in CI). Thread-safe; redraws at most a few times per second.
 */
public final class ProgressBar implements ProgressListener, AutoCloseable {
    private static final int WIDTH = 30;
    private final String label;
    private final PrintStream out;
    private final boolean enabled;
    private final long start = System.nanoTime();
    private long lastDraw;
    private boolean drawn;

    /** A bar for {@code label}; enabled only on an interactive terminal. */
    public ProgressBar(String label) {
        this(label, System.err, System.console() != null && System.getenv("CI") == null);
    }

    ProgressBar(String label, PrintStream out, boolean enabled) {
        this.label = label;
        this.out = out;
        this.enabled = enabled;
    }

    @Override
    public synchronized void progress(long done, long total) {
        if (!enabled || total <= 0) {
            return;
        }
        long now = System.nanoTime();
        if (done < total && now - lastDraw < 200_000_000L) {
            return;
        }
        lastDraw = now;
        double frac = Math.min(1.0, (double) done / total);
        int filled = (int) Math.round(frac * WIDTH);
        double elapsed = (now - start) / 1e9;
        String eta = frac > 0 && done < total ? "ETA " + formatSeconds(elapsed * (1 - frac) / frac)
            : "took " + formatSeconds(elapsed);
        out.print("\r" + label + " [" + "#".repeat(filled) + " ".repeat(WIDTH - filled) + "] "
            + String.format(java.util.Locale.ROOT, "%5.1f%%", 100 * frac) + "  " + eta + "   ");
        out.flush();
        drawn = true;
    }

    /** Formats seconds as {@code 12s}, {@code 3m05s} or {@code 1h02m}. */
    static String formatSeconds(double s) {
        long t = Math.round(s);
        if (t < 60) {
            return t + "s";
        }
        if (t < 3600) {
            return String.format(java.util.Locale.ROOT, "%dm%02ds", t / 60, t % 60);
        }
        return String.format(java.util.Locale.ROOT, "%dh%02dm", t / 3600, (t % 3600) / 60);
    }

    @Override
    public synchronized void close() {
        if (enabled && drawn) {
            out.println();
            out.flush();
        }
    }
}
