package dev.cairn.tables;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldModel;
import dev.cairn.io.InputException;
import dev.cairn.util.ProgressListener;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.function.BooleanSupplier;

/**
 * Builds a table file from a field model: checkpointed computation ({@link TableJob}), assembly of the data file
 * and the JSON sidecar. A full table and a shard share the same code path, so a single run, a resumed run and
 * merged shards give byte-identical data files.
 */
public final class TableBuilder {
    /** One-line caution carried by every table sidecar. */
    public static final String CAUTION = "Caution: results must be verified independently before operational use; "
        + "mission rules and the responsible flight-dynamics authority decide.";
    /** Conventions carried by every table sidecar. */
    public static final String CONVENTIONS = "SI units; model (body-fixed) frame of the shape model; potential U > 0 "
        + "(U -> GM/r far away); acceleration = grad U (points toward the body); gradient tensor = grad grad U";

    private TableBuilder() {
    }

    /**
     * What to build.
     *
     * @param model        the exact field evaluated at the nodes
     * @param layout       grid and columns
     * @param out          data file
     * @param format       {@link TableFiles#NPY} or {@link TableFiles#CSV} (a shard is always written as npy)
     * @param chunkNodes   nodes per checkpoint chunk
     * @param resume       continue an interrupted run
     * @param shardIndex   1-based shard index, or 0 for the whole table
     * @param shardCount   number of shards, or 0
     * @param threads      worker threads
     * @param modelInfo    model identity for the sidecar (file, sha256, unit, density, GM, description)
     * @param version      Cairn version string
     */
    public record Request(FieldModel model, TableLayout layout, Path out, String format, int chunkNodes,
                         boolean resume, int shardIndex, int shardCount, int threads, Map<String, Object> modelInfo,
                         String version) {
    }

    /**
     * Result of {@link #build}.
     *
     * @param complete  false when stopped before the end (resumable)
     * @param job       checkpoint statistics
     * @param metadata  the sidecar written (null when incomplete)
     */
    public record Outcome(boolean complete, TableJob.Result job, Map<String, Object> metadata) {
    }

    /** Fingerprint of what determines the data: model identity, grid, columns and options (not the shard). */
    public static String fingerprint(TableLayout layout, Map<String, Object> modelInfo) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("model", modelInfo);
        m.put("grid", layout.grid().toJson());
        if (layout.grid() instanceof PointGrid p) {
            m.put("points_sha256", TableFiles.sha256(java.util.Arrays.toString(p.xyz())));
        }
        m.put("columns", layout.columns());
        m.put("exclude_interior", layout.excludeInterior());
        if (layout.distance()) {
            m.put("distance_column", true); // only when present, so older fingerprints stay valid
        }
        m.put("omega", layout.omega());
        m.put("axis", List.of(layout.spinAxis()[0], layout.spinAxis()[1], layout.spinAxis()[2]));
        m.put("centre_of_mass", List.of(layout.centreOfMass()[0], layout.centreOfMass()[1],
            layout.centreOfMass()[2]));
        return TableFiles.sha256(TableFiles.toJson(m));
    }

    /**
     * Builds (or resumes) the table or shard and writes its data file and sidecar.
     *
     * @param nowUtc        current time, ISO-8601 UTC (recorded as the start time of a new job)
     * @param stopRequested polled between checkpoint chunks
     */
    public static Outcome build(Request r, ProgressListener progress, BooleanSupplier stopRequested, String nowUtc) {
        TableLayout layout = r.layout();
        int nodes = layout.grid().nodeCount();
        int first = 0;
        int end = nodes;
        boolean shard = r.shardCount() > 0;
        if (shard) {
            int[] range = TableJob.shardRange(nodes, r.shardIndex(), r.shardCount());
            first = range[0];
            end = range[1];
        }
        String fp = fingerprint(layout, r.modelInfo());
        Path work = TableJob.workDir(r.out());
        TableJob.Result job = TableJob.compute(r.model(), layout, first, end, r.chunkNodes(), fp, work, r.resume(),
            r.threads(), progress, stopRequested, nowUtc);
        if (!job.complete()) {
            return new Outcome(false, job, null);
        }
        String format = shard ? TableFiles.NPY : r.format();
        long[] shape = shard ? new long[] {end - first, layout.columnCount()} : layout.dataShape();
        String sha = TableFiles.writeData(r.out(), format, shape, layout.columns(),
            TableJob.chunkSource(work, end - first, r.chunkNodes(), layout.columnCount(), fp));
        Map<String, Object> meta = metadata(layout, r.modelInfo(), r.version(), job.startedUtc(), nowUtc, fp);
        putData(meta, r.out(), format, shape, sha);
        if (shard) {
            Map<String, Object> s = new LinkedHashMap<>();
            s.put("index", r.shardIndex());
            s.put("count", r.shardCount());
            s.put("first_node", first);
            s.put("end_node", end);
            s.put("table_format", r.format());
            s.put("table_shape", toList(layout.dataShape()));
            meta.put("shard", s);
        }
        TableFiles.writeSidecar(r.out(), meta);
        try {
            TableJob.clean(work);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return new Outcome(true, job, meta);
    }

    static List<Long> toList(long[] a) {
        List<Long> l = new java.util.ArrayList<>();
        for (long v : a) {
            l.add(v);
        }
        return l;
    }

    static void putData(Map<String, Object> meta, Path out, String format, long[] shape, String sha) {
        meta.put("data_file", out.getFileName().toString());
        meta.put("data_format", format);
        meta.put("data_layout", TableFiles.NPY.equals(format)
            ? "NumPy .npy v1.0, dtype '<f8' (little-endian float64), C order, shape = grid shape + (columns,)"
            : "CSV, header line of column names, one row per node in node order (C order of the grid shape)");
        meta.put("shape", toList(shape));
        meta.put("data_sha256", sha);
    }

    /** The sidecar keys common to tables and shards (see docs/tables.md). */
    static Map<String, Object> metadata(TableLayout layout, Map<String, Object> modelInfo, String version,
                                        String createdUtc, String finishedUtc, String fingerprint) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("kind", "cairn acceleration table");
        m.put("caution", CAUTION);
        m.put("conventions", CONVENTIONS);
        m.put("cairn_version", version);
        m.put("created_utc", createdUtc);
        m.put("finished_utc", finishedUtc);
        m.put("model", modelInfo);
        m.put("G_m3_kg_s2", Constants.G);
        m.put("density_kg_m3", modelInfo.get("density_kg_m3"));
        m.put("gm_m3_s2", modelInfo.get("gm_m3_s2"));
        Map<String, Object> spin = new LinkedHashMap<>();
        spin.put("omega_rad_s", layout.omega());
        spin.put("period_s", layout.omega() > 0 ? 2 * Math.PI / layout.omega() : null);
        spin.put("axis", List.of(layout.spinAxis()[0], layout.spinAxis()[1], layout.spinAxis()[2]));
        m.put("spin", spin);
        m.put("center_of_mass_m", List.of(layout.centreOfMass()[0], layout.centreOfMass()[1],
            layout.centreOfMass()[2]));
        m.put("frame", "model (body-fixed) frame, metres");
        m.put("grid", layout.grid().toJson());
        m.put("columns", layout.columns());
        m.put("column_units", units(layout.columns()));
        m.put("interior_nodes", layout.excludeInterior()
            ? "computed, then blanked: value columns NaN where location = 1"
            : "computed (the polyhedron field is valid inside) and flagged by location = 1");
        m.put("effective_quantities", layout.effective()
            ? "eff_potential = U + 0.5*omega^2*|axis x (r - centre_of_mass)|^2, eff_a = g + omega^2 * r_perp "
              + "(rotating body-fixed frame; Coriolis not included)" : null);
        if (layout.distance()) {
            m.put("distance_to_surface", "distance_to_surface_m: exact signed distance from the node to the body's "
                + "surface (closest point on the facets), negative inside, m");
        }
        m.put("job_fingerprint", fingerprint);
        return m;
    }

    private static Map<String, String> units(List<String> columns) {
        Map<String, String> u = new LinkedHashMap<>();
        for (String c : columns) {
            u.put(c, c.endsWith("_m2_s2") ? "m^2/s^2" : c.endsWith("_m_s2") ? "m/s^2" : c.endsWith("_s2") ? "1/s^2"
                : c.endsWith("_m") ? "m" : c.equals("location") ? "1 inside, 0 outside, 0.5 on the surface" : "");
        }
        return u;
    }

    /** Adds the bound accuracy report to a written table's sidecar (rewritten atomically). */
    public static void addAccuracy(Path data, Map<String, Object> meta, AccuracyCheck.BoundReport report) {
        meta.put("accuracy", report.toJson());
        TableFiles.writeSidecar(data, meta);
    }

    /** Adds the accuracy report to a written table's sidecar (rewritten atomically). */
    public static void addAccuracy(Path data, Map<String, Object> meta, AccuracyCheck.Report report) {
        meta.put("accuracy", report.toJson());
        TableFiles.writeSidecar(data, meta);
    }

    /**
     * Merges shards (any order) into one table. The data file is byte-identical to the one a single run writes;
     * the sidecar takes the earliest shard's creation time and {@code finishedUtc}.
     *
     * @param format output format, or null for the format the shards were made for
     * @return the sidecar written
     */
    @SuppressWarnings("unchecked")
    public static Map<String, Object> merge(List<Path> shards, Path out, String format, String finishedUtc) {
        if (shards.isEmpty()) {
            throw new InputException("table-merge: no shard files given");
        }
        int m = shards.size();
        Map<String, Object>[] metas = new Map[m];
        Path[] files = new Path[m];
        String fp = null;
        int count = -1;
        List<String> columns = null;
        long[] shape = null;
        String tableFormat = null;
        long[] ranges = new long[2 * m];
        for (Path p : shards) {
            Path side = TableFiles.sidecarPath(p);
            if (!java.nio.file.Files.isRegularFile(p) || !java.nio.file.Files.isRegularFile(side)) {
                throw new InputException(dev.cairn.io.Messages.path(p) + ": shard or its sidecar " + side.getFileName()
                    + " is missing");
            }
            Map<String, Object> meta = TableFiles.readJson(side);
            dev.cairn.io.StrictJson.Fields f = new dev.cairn.io.StrictJson.Fields(meta, side, "");
            if (!f.has("shard")) {
                throw new InputException(side + ": not a shard (no 'shard' key)");
            }
            dev.cairn.io.StrictJson.Fields s = f.object("shard");
            int cnt = s.integer("count", 1, 100_000);
            int idx = s.integer("index", 1, cnt);
            String fpi = f.string("job_fingerprint");
            if (fp == null) {
                fp = fpi;
                count = cnt;
            } else if (!fp.equals(fpi) || cnt != count) {
                throw new InputException(p + ": shard of a different table (model, grid, options or shard count differ)");
            }
            if (cnt != m) {
                throw new InputException("table-merge: " + m + " shard file(s) given, the table has " + cnt + " shards");
            }
            if (metas[idx - 1] != null) {
                throw new InputException(p + ": shard " + idx + "/" + cnt + " given twice");
            }
            String dataSha = f.string("data_sha256");
            if (!TableFiles.sha256(p).equals(dataSha)) {
                throw new InputException(p + ": data does not match the SHA-256 in its sidecar (damaged or changed)");
            }
            List<String> cols = f.strings("columns", 1, 1000);
            long[] ts = s.integers("table_shape", 2, 4, 1, Integer.MAX_VALUE);
            String tf = s.string("table_format");
            if (!TableFiles.NPY.equals(tf) && !TableFiles.CSV.equals(tf)) {
                throw new InputException(side + ": key 'shard.table_format' must be \"npy\" or \"csv\"");
            }
            if (columns == null) {
                columns = cols;
                shape = ts;
                tableFormat = tf;
            } else if (!columns.equals(cols) || !java.util.Arrays.equals(shape, ts) || !tableFormat.equals(tf)) {
                throw new InputException(p + ": shard of a different table (columns or shape differ)");
            }
            if (ts[ts.length - 1] != cols.size()) {
                throw new InputException(side + ": table_shape " + java.util.Arrays.toString(ts) + " does not have "
                    + cols.size() + " columns");
            }
            long rows = TableFiles.rowCount(ts, side);
            long first = s.integer("first_node", 0L, rows);
            long end = s.integer("end_node", first, rows);
            int[] want = TableJob.shardRange((int) rows, idx, cnt);
            if (first != want[0] || end != want[1]) {
                throw new InputException(side + ": shard " + idx + "/" + cnt + " covers nodes " + first + "-" + end
                    + ", expected " + want[0] + "-" + want[1]);
            }
            f.string("created_utc");
            ranges[2 * (idx - 1)] = first;
            ranges[2 * (idx - 1) + 1] = end;
            metas[idx - 1] = meta;
            files[idx - 1] = p;
        }
        Map<String, Object> first = metas[0];
        String fmt = format != null ? format : tableFormat;
        int cols = columns.size();
        String created = String.valueOf(first.get("created_utc"));
        for (Map<String, Object> meta : metas) {
            String c = String.valueOf(meta.get("created_utc"));
            if (c.compareTo(created) < 0) {
                created = c;
            }
        }
        String sha = TableFiles.writeData(out, fmt, shape, columns, sink -> {
            for (int i = 0; i < files.length; i++) {
                TableFiles.npySource(files[i], cols, ranges[2 * i + 1] - ranges[2 * i]).forEach(sink);
            }
        });
        Map<String, Object> meta = new LinkedHashMap<>(first);
        meta.remove("shard");
        meta.remove("accuracy"); // shards carry none; the merge command adds one when it can
        meta.put("created_utc", created);
        meta.put("finished_utc", finishedUtc);
        putData(meta, out, fmt, shape, sha);
        meta.put("merged_from", shards.size() + " shards");
        TableFiles.writeSidecar(out, meta);
        return meta;
    }

    /**
     * Computes a whole table in memory (no files, no checkpoints): the same rows {@link #build} writes. For
     * benchmarks, studies and tests; {@code metadata} becomes the table's metadata.
     */
    public static Table compute(FieldModel model, TableLayout layout, int threads, Map<String, Object> metadata) {
        int n = layout.grid().nodeCount();
        int cols = layout.columnCount();
        double[] rows = new double[n * cols];
        dev.cairn.util.ParallelChunks.run(n, threads,
            () -> new Object[] {model.newEvaluator(), new double[dev.cairn.gravity.FieldSample.SIZE]},
            (ctx, from, to) -> {
                for (int i = from; i < to; i++) {
                    layout.computeRow((dev.cairn.gravity.FieldEvaluator) ctx[0], i, (double[]) ctx[1], rows, i * cols);
                }
            }, ProgressListener.NONE);
        Map<String, Object> meta = new LinkedHashMap<>(metadata);
        meta.putIfAbsent("gm_m3_s2", model.gm());
        return new Table(layout.grid(), layout.columns(), rows, meta);
    }
}
