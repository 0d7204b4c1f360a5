package dev.cairn.util;

import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.Supplier;

/**
 * Runs {@code count} independent work items on a number of threads, in chunks taken from a shared counter.
 *
 * <p>Each item must write only its own outputs, so the results do not depend on the thread count or on which
 * thread ran which chunk. Each thread gets its own context object (e.g. a field evaluator with scratch space)
 * from {@code contextFactory}.
 */
public final class ParallelChunks {
    /** Items per chunk: small enough to balance, large enough to keep the counter cheap. */
    public static final int CHUNK = 64;

    private ParallelChunks() {
    }

    /** Body of the loop: processes items {@code [from, to)} with the thread's context. */
    @FunctionalInterface
    public interface Body<C> {
        void run(C context, int from, int to);
    }

    /** Default thread count: the number of available processors. */
    public static int defaultThreads() {
        return Runtime.getRuntime().availableProcessors();
    }

    /**
     * Runs the loop; returns when every item is done. An exception in any worker is rethrown here.
     *
     * @param threads number of threads, at least 1
     */
    public static <C> void run(int count, int threads, Supplier<C> contextFactory, Body<C> body,
                               ProgressListener progress) {
        int chunks = (count + CHUNK - 1) / CHUNK;
        int nThreads = Math.max(1, Math.min(threads, chunks));
        AtomicInteger next = new AtomicInteger();
        AtomicLong done = new AtomicLong();
        Throwable[] failure = new Throwable[1];
        Runnable worker = () -> {
            C ctx = contextFactory.get();
            int c;
            while ((c = next.getAndIncrement()) < chunks) {
                synchronized (failure) {
                    if (failure[0] != null) {
                        return;
                    }
                }
                int from = c * CHUNK;
                int to = Math.min(count, from + CHUNK);
                body.run(ctx, from, to);
                progress.progress(done.addAndGet(to - from), count);
            }
        };
        if (nThreads == 1) {
            worker.run();
            return;
        }
        Thread[] pool = new Thread[nThreads];
        for (int t = 0; t < nThreads; t++) {
            pool[t] = new Thread(() -> {
                try {
                    worker.run();
                } catch (Throwable e) {
                    synchronized (failure) {
                        if (failure[0] == null) {
                            failure[0] = e;
                        }
                    }
                }
            }, "cairn-worker-" + t);
            pool[t].setDaemon(true);
            pool[t].start();
        }
        for (Thread t : pool) {
            try {
                t.join();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted", e);
            }
        }
        if (failure[0] instanceof RuntimeException) {
            throw (RuntimeException) failure[0];
        }
        if (failure[0] instanceof Error) {
            throw (Error) failure[0];
        }
        if (failure[0] != null) {
            throw new IllegalStateException(failure[0]);
        }
    }
}
