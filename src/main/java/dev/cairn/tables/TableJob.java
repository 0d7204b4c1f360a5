package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import dev.cairn.io.Messages;
import dev.cairn.io.StrictJson;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.io.BufferedInputStream;
import java.io.DataInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.atomic.AtomicLong;
import java.util.function.BooleanSupplier;

/**
 * Computes the rows of a node range {@code [first, end)} in checkpoint chunks of {@code chunkNodes} nodes, each
 * written atomically to a work folder beside the output ({@code OUT.partial/chunk-NNNNNNNN.f64}, raw little-endian
 * float64 rows) with a manifest {@code job.json} holding the job fingerprint. An interrupted run leaves the finished
 * chunks; a resumed run checks the fingerprint, skips them and computes the rest. Every row is computed by the same
 * arithmetic from its node index alone (in parallel with {@link ParallelChunks}), so the assembled file is
 * byte-identical whatever the thread count, the interruptions or the sharding.
 *
 * <p>Every chunk has a checksum file {@code chunk-NNNNNNNN.sha256}: the SHA-256 of the job fingerprint, the chunk
 * number and the chunk's bytes. A resumed run reuses a chunk only when its size and checksum match (a flipped,
 * zeroed or copied chunk is computed again), and assembly checks every chunk once more as it reads it.
 */
public final class TableJob {
    /** Default nodes per checkpoint chunk. */
    public static final int DEFAULT_CHUNK_NODES = 16384;
    private static final String MANIFEST = "job.json";

    private TableJob() {
    }

    /**
     * Outcome of {@link #compute}.
     *
     * @param complete      whether every chunk is on disk
     * @param startedUtc    when this job was first started (kept across resumes), ISO-8601 UTC
     * @param chunksReused  chunks found from an earlier run
     * @param chunksDone    chunks computed now
     */
    public record Result(boolean complete, String startedUtc, int chunksReused, int chunksDone) {
    }

    /** The checkpoint folder for output {@code out}. */
    public static Path workDir(Path out) {
        return out.toAbsolutePath().resolveSibling(out.getFileName() + ".partial");
    }

    /** The node range of shard {@code index} (1-based) of {@code count} over {@code nodes} nodes: {@code [first, end)}. */
    public static int[] shardRange(int nodes, int index, int count) {
        if (count < 1 || index < 1 || index > count) {
            throw new InputException("--shard: expected I/N with 1 <= I <= N, got " + index + "/" + count);
        }
        return new int[] {(int) ((long) (index - 1) * nodes / count), (int) ((long) index * nodes / count)};
    }

    /**
     * Computes (or resumes) the rows of nodes {@code [first, end)}.
     *
     * @param fingerprint   identifies the job (model, grid, quantities, range); a resume with another is refused
     * @param resume        continue from the chunks in {@code workDir}; otherwise any old chunks there are removed
     * @param stopRequested polled after each chunk; when true the run stops, leaving a resumable state
     * @param progress      nodes done of the range (including reused chunks)
     * @param nowUtc        the current time, recorded as the start time of a new job
     */
    public static Result compute(FieldModel model, TableLayout layout, int first, int end, int chunkNodes,
                                 String fingerprint, Path workDir, boolean resume, int threads,
                                 ProgressListener progress, BooleanSupplier stopRequested, String nowUtc) {
        if (chunkNodes < 1) {
            throw new InputException("--chunk-nodes: must be at least 1, got " + chunkNodes);
        }
        int total = end - first;
        int chunks = (total + chunkNodes - 1) / chunkNodes;
        int cols = layout.columnCount();
        String started = nowUtc;
        try {
            Path manifest = workDir.resolve(MANIFEST);
            if (resume) {
                if (!Files.isRegularFile(manifest)) {
                    throw new InputException("--resume: no interrupted run found (" + manifest + " is missing)");
                }
                StrictJson.Fields m = new StrictJson.Fields(TableFiles.readJson(manifest), manifest, "");
                if (!fingerprint.equals(m.string("fingerprint"))
                    || m.integer("chunk_nodes", 1, Integer.MAX_VALUE) != chunkNodes
                    || m.integer("first_node", 0, Integer.MAX_VALUE) != first
                    || m.integer("end_node", 0, Integer.MAX_VALUE) != end) {
                    throw new InputException("--resume: " + workDir + " belongs to a different table (model, grid, "
                        + "options or --chunk-nodes differ); run without --resume to start again");
                }
                started = m.string("started_utc");
                if (!started.matches("\\d{4}-\\d{2}-\\d{2}T\\d{2}:\\d{2}:\\d{2}(\\.\\d+)?Z")) {
                    throw new InputException(Messages.path(manifest) + ": key 'started_utc' is not an ISO-8601 UTC "
                        + "time");
                }
                removeStaleTemporaries(workDir);
            } else {
                clean(workDir);
                Files.createDirectories(workDir);
                Map<String, Object> m = new LinkedHashMap<>();
                m.put("fingerprint", fingerprint);
                m.put("first_node", first);
                m.put("end_node", end);
                m.put("chunk_nodes", chunkNodes);
                m.put("started_utc", nowUtc);
                AtomicFiles.writeString(manifest, TableFiles.toJson(m));
            }
            int reused = 0;
            AtomicLong done = new AtomicLong();
            boolean[] valid = new boolean[chunks];
            for (int c = 0; c < chunks && resume; c++) {
                if (chunkIntact(workDir, c, 8L * cols * chunkLength(c, total, chunkNodes), fingerprint)) {
                    valid[c] = true;
                    reused++;
                    done.addAndGet(chunkLength(c, total, chunkNodes));
                }
            }
            progress.progress(done.get(), total);
            int computed = 0;
            double[] rows = new double[Math.min(chunkNodes, Math.max(total, 1)) * cols];
            for (int c = 0; c < chunks; c++) {
                int len = chunkLength(c, total, chunkNodes);
                if (valid[c]) {
                    continue;
                }
                int from = first + c * chunkNodes;
                long base = done.get();
                ParallelChunks.run(len, threads, () -> new Scratch(model.newEvaluator()), (s, a, b) -> {
                    for (int i = a; i < b; i++) {
                        layout.computeRow(s.ev, from + i, s.sample, rows, i * cols);
                    }
                }, (d, t) -> progress.progress(base + d, total));
                Files.deleteIfExists(sumFile(workDir, c));
                java.security.MessageDigest md = chunkDigest(fingerprint, c);
                AtomicFiles.write(chunkFile(workDir, c), out -> Npy.writeDoubles(
                    new java.security.DigestOutputStream(out, md), rows, 0, len * cols));
                AtomicFiles.writeString(sumFile(workDir, c), java.util.HexFormat.of().formatHex(md.digest()) + "\n");
                done.addAndGet(len);
                computed++;
                if (c + 1 < chunks && stopRequested.getAsBoolean()) {
                    return new Result(false, started, reused, computed);
                }
            }
            return new Result(true, started, reused, computed);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write checkpoints in " + workDir + ": " + e.getMessage(), e);
        }
    }

    private static final class Scratch {
        final FieldEvaluator ev;
        final double[] sample = new double[FieldSample.SIZE];

        Scratch(FieldEvaluator ev) {
            this.ev = ev;
        }
    }

    private static int chunkLength(int c, int total, int chunkNodes) {
        return Math.min(chunkNodes, total - c * chunkNodes);
    }

    private static Path chunkFile(Path dir, int c) {
        return dir.resolve(String.format(java.util.Locale.ROOT, "chunk-%08d.f64", c));
    }

    private static Path sumFile(Path dir, int c) {
        return dir.resolve(String.format(java.util.Locale.ROOT, "chunk-%08d.sha256", c));
    }

    /** Digest of a chunk, seeded with the job fingerprint and chunk number (a chunk copied elsewhere fails). */
    private static java.security.MessageDigest chunkDigest(String fingerprint, int c) {
        try {
            java.security.MessageDigest md = java.security.MessageDigest.getInstance("SHA-256");
            md.update((fingerprint + ":" + c + ":").getBytes(java.nio.charset.StandardCharsets.UTF_8));
            return md;
        } catch (java.security.NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }

    /** Whether chunk {@code c} is on disk with the expected size and a matching checksum file. */
    private static boolean chunkIntact(Path dir, int c, long bytes, String fingerprint) throws IOException {
        Path f = chunkFile(dir, c);
        Path sum = sumFile(dir, c);
        if (!Files.isRegularFile(f) || Files.size(f) != bytes || !Files.isRegularFile(sum) || Files.size(sum) > 128) {
            return false;
        }
        String want = Files.readString(sum, java.nio.charset.StandardCharsets.ISO_8859_1).strip();
        java.security.MessageDigest md = chunkDigest(fingerprint, c);
        try (InputStream in = Files.newInputStream(f)) {
            byte[] buf = new byte[1 << 16];
            int n;
            while ((n = in.read(buf)) > 0) {
                md.update(buf, 0, n);
            }
        }
        return want.equals(java.util.HexFormat.of().formatHex(md.digest()));
    }

    /** Temporary files of chunk writes that a killed run left behind. */
    private static void removeStaleTemporaries(Path workDir) throws IOException {
        try (var s = Files.list(workDir)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                String n = p.getFileName().toString();
                if (n.startsWith(".") && n.endsWith(".tmp") && Files.isRegularFile(p)) {
                    Files.deleteIfExists(p);
                }
            }
        }
    }

    /**
     * A source of rows for the writers: the finished chunks of {@code workDir}, in node order, each checked against
     * its checksum as it is read.
     */
    public static TableFiles.RowSource chunkSource(Path workDir, int nodes, int chunkNodes, int cols,
                                                   String fingerprint) {
        return sink -> {
            int chunks = (nodes + chunkNodes - 1) / chunkNodes;
            double[] rows = new double[Math.min(chunkNodes, Math.max(nodes, 1)) * cols];
            for (int c = 0; c < chunks; c++) {
                int len = chunkLength(c, nodes, chunkNodes);
                if (!chunkIntact(workDir, c, 8L * cols * len, fingerprint)) {
                    throw new InputException(Messages.path(chunkFile(workDir, c)) + ": checkpoint chunk changed or "
                        + "damaged after it was written; run again with --resume to compute it again");
                }
                try (DataInputStream in = new DataInputStream(new BufferedInputStream(
                    Files.newInputStream(chunkFile(workDir, c)), 1 << 16))) {
                    Npy.readDoubles(in, rows, 0, len * cols);
                }
                sink.accept(rows, len);
            }
        };
    }

    /** Removes the checkpoint folder (only the files this class writes, then the folder if empty). */
    public static void clean(Path workDir) throws IOException {
        if (!Files.isDirectory(workDir)) {
            return;
        }
        try (var s = Files.list(workDir)) {
            for (Path p : (Iterable<Path>) s::iterator) {
                String n = p.getFileName().toString();
                if (n.equals(MANIFEST) || n.startsWith("chunk-") || n.startsWith(".chunk-") || n.startsWith("." + MANIFEST)) {
                    Files.deleteIfExists(p);
                }
            }
        }
        try (var s = Files.list(workDir)) {
            if (s.findAny().isEmpty()) {
                Files.delete(workDir);
            }
        }
    }
}
