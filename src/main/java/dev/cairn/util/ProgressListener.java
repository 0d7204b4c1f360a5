package dev.cairn.util;

/** Receives progress of a long computation. Called from worker threads: implementations must be thread-safe. */
@FunctionalInterface
public interface ProgressListener {
    /** A listener that ignores everything. */
    ProgressListener NONE = (done, total) -> { };

    /** {@code done} of {@code total} work units are finished. */
    void progress(long done, long total);
}
