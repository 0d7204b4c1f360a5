package dev.cairn.io;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Checks sizes the user asked for against the memory and disk space there is, before anything is allocated or
 * written, so a too-large request is a one-line refusal that says how much it needs, never an out-of-memory trace
 * or a full disk half-way through.
 */
public final class MemoryBudget {
    private static final double MB = 1024.0 * 1024.0;

    private MemoryBudget() {
    }

    /** Bytes the JVM can still allocate: maximum heap minus what is in use. */
    public static long available() {
        Runtime rt = Runtime.getRuntime();
        return rt.maxMemory() - (rt.totalMemory() - rt.freeMemory());
    }

    /**
     * Refuses a request that would need more than the available heap.
     *
     * @param bytes estimated bytes (may overflow to negative or be huge: both refused)
     * @param what  what needs them, e.g. "--check-samples 2147483647"
     */
    public static void require(double bytes, String what) {
        long avail = available();
        if (!(bytes >= 0) || bytes > avail) {
            throw new InputException(what + " would need about " + String.format(java.util.Locale.ROOT, "%.0f",
                Math.max(bytes, 0) / MB) + " MB of memory; " + String.format(java.util.Locale.ROOT, "%.0f", avail / MB)
                + " MB of the " + String.format(java.util.Locale.ROOT, "%.0f", Runtime.getRuntime().maxMemory() / MB)
                + " MB Java heap are free (use a smaller size or a larger heap, -Xmx)");
        }
    }

    /**
     * Refuses to start writing about {@code bytes} into the folder of {@code out} when its file system has less
     * usable space.
     */
    public static void requireDisk(Path out, double bytes, String what) {
        Path dir = out.toAbsolutePath().getParent();
        while (dir != null && !Files.isDirectory(dir)) {
            dir = dir.getParent();
        }
        if (dir == null) {
            return;
        }
        try {
            long usable = Files.getFileStore(dir).getUsableSpace();
            if (bytes > usable) {
                throw new InputException(what + " needs about " + String.format(java.util.Locale.ROOT, "%.0f",
                    bytes / MB) + " MB of disk space in " + Messages.path(dir) + ", which has "
                    + String.format(java.util.Locale.ROOT, "%.0f", usable / MB) + " MB free");
            }
        } catch (IOException e) {
            // the free space cannot be told (e.g. a special file system): the writes themselves report failures
        }
    }
}
