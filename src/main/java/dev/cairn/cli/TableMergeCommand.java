package dev.cairn.cli;

import dev.cairn.body.BodyModel;
import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import dev.cairn.io.OutputLock;
import dev.cairn.io.RunInputs;
import dev.cairn.io.StrictJson;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import dev.cairn.tables.AccuracyCheck;
import dev.cairn.tables.TableBuilder;
import dev.cairn.tables.TableFiles;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code cairn table-merge}: joins the shards of a table made with {@code cairn table --shard I/N}. */
@Command(name = "table-merge", mixinStandardHelpOptions = true,
    header = "Merge table shards into one table.",
    description = {"Merge table shards (made with 'cairn table ... --shard I/N') into one",
        "table. The data file is byte-identical to the one a single run writes;",
        "the sidecar keeps the earliest shard's creation time. The accuracy report",
        "is made as by 'cairn table' when the model file recorded in the shards is",
        "found unchanged (same SHA-256); otherwise it is skipped with a note.",
        "Caution: results must be verified independently before operational use;",
        "mission rules and the responsible flight-dynamics authority decide."})
public final class TableMergeCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "SHARD", description = "Shard data files (any order).")
    List<Path> shards;

    @Option(names = "--out", required = true, paramLabel = "FILE", description = "Merged data file.")
    Path out;

    @Option(names = "--format", paramLabel = "npy|csv", description = "Output format (default: the one given when "
        + "the shards were made).")
    String format;

    @Option(names = "--check-samples", paramLabel = "N", description = "Random points of the accuracy report "
        + "(default ${DEFAULT-VALUE}; 0 skips it).")
    int checkSamples = AccuracyCheck.DEFAULT_RANDOM_POINTS;

    @Option(names = "--check-cell-points", paramLabel = "N", description = "Random points per cell near the surface "
        + "in the accuracy report, besides its centre and 6 face centres (default ${DEFAULT-VALUE}, as for 'table').")
    int checkCellPoints = AccuracyCheck.DEFAULT_RANDOM_PER_CELL;

    @Option(names = "--seed", paramLabel = "S", description = "Seed of the accuracy report (default ${DEFAULT-VALUE}).")
    long seed = 1;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads of the accuracy report (default: "
        + "all processors).")
    int threads = dev.cairn.util.ParallelChunks.defaultThreads();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        String fmt = format == null ? null : format.toLowerCase(Locale.ROOT);
        if (fmt != null && !fmt.equals(TableFiles.NPY) && !fmt.equals(TableFiles.CSV)) {
            throw new InputException("--format: unknown format '" + format + "' (use npy or csv)");
        }
        TableCommand.requireCount("--check-samples", checkSamples, TableCommand.MAX_CHECK_SAMPLES);
        TableCommand.checkAccuracyOptions(checkSamples, checkCellPoints);
        if (threads < 1) {
            throw new InputException("--threads: must be at least 1, got " + threads);
        }
        for (Path s : shards) {
            RunInputs.register(s);
            RunInputs.register(TableFiles.sidecarPath(s));
        }
        RunInputs.requireWritable(out.toAbsolutePath());
        RunInputs.requireWritable(TableFiles.sidecarPath(out).toAbsolutePath());
        try (OutputLock lock = OutputLock.acquire(out)) {
            AtomicFiles.cleanStale(out, 0);
            AtomicFiles.cleanStale(TableFiles.sidecarPath(out), 0);
            Object before = TableCommand.stamp(out);
            Object beforeSide = TableCommand.stamp(TableFiles.sidecarPath(out));
            try {
                return mergeLocked(fmt);
            } catch (RuntimeException | Error e) {
                // A failed run leaves nothing under its final names.
                if (!java.util.Objects.equals(before, TableCommand.stamp(out))) {
                    TableCommand.removeQuietly(out);
                }
                if (!java.util.Objects.equals(beforeSide, TableCommand.stamp(TableFiles.sidecarPath(out)))) {
                    TableCommand.removeQuietly(TableFiles.sidecarPath(out));
                }
                throw e;
            }
        }
    }

    private int mergeLocked(String fmt) {
        Map<String, Object> meta = TableBuilder.merge(shards, out, fmt,
            Instant.now().truncatedTo(ChronoUnit.SECONDS).toString());
        PrintWriter err = spec.commandLine().getErr();
        err.printf(Locale.ROOT, "cairn: merged %d shard(s) into %s (%s, shape %s) and %s%n", shards.size(), out,
            meta.get("data_format"), meta.get("shape"), TableFiles.sidecarPath(out).getFileName());
        err.flush();
        PrintWriter o = spec.commandLine().getOut();
        if (checkSamples > 0) {
            check(meta, err, o);
        }
        o.println(TableBuilder.CAUTION);
        o.flush();
        return 0;
    }

    /** Whether every file recorded under {@code files_sha256} is present with the same SHA-256. */
    private static boolean filesUnchanged(StrictJson.Fields model) {
        if (!model.has("files_sha256")) {
            return true; // shards written before files were fingerprinted: the model's own SHA-256 was checked
        }
        Map<?, ?> files = (Map<?, ?>) model.object("files_sha256").raw();
        for (Map.Entry<?, ?> e : files.entrySet()) {
            Path p;
            try {
                p = Path.of(String.valueOf(e.getKey()));
            } catch (java.nio.file.InvalidPathException ex) {
                return false;
            }
            if (!java.nio.file.Files.isRegularFile(p) || !TableFiles.sha256(p).equals(e.getValue())) {
                return false;
            }
        }
        return true;
    }

    /** Accuracy report against the model recorded in the sidecar, when that file is present and unchanged. */
    private void check(Map<String, Object> meta, PrintWriter err, PrintWriter o) {
        Path side = TableFiles.sidecarPath(out);
        StrictJson.Fields top = new StrictJson.Fields(meta, side, "");
        StrictJson.Fields model = top.object("model");
        String file = model.optString("file");
        Path modelPath = null;
        try {
            modelPath = file == null ? null : Path.of(file);
        } catch (java.nio.file.InvalidPathException e) {
            modelPath = null;
        }
        if (modelPath == null || !java.nio.file.Files.isRegularFile(modelPath)
            || !TableFiles.sha256(modelPath).equals(model.optString("sha256")) || !filesUnchanged(model)) {
            err.println("cairn: note: no accuracy report: the model file recorded in the shards ("
                + dev.cairn.io.Messages.path(file) + ") or one of its files is missing here or has changed");
            return;
        }
        if ("points".equals(top.object("grid").string("kind"))) {
            return;
        }
        String unit = model.string("length_unit_of_file");
        boolean description = dev.cairn.regions.RegionBodyLoader.isDescription(modelPath);
        Double density = description ? null : model.number("density_kg_m3", ModelLoader.DENSITY_MIN,
            ModelLoader.DENSITY_MAX);
        BodyModel body = ModelLoader.load(modelPath, new ModelRequest(unit, density, null, null, null, null));
        AccuracyCheck.BoundReport rep = TableCommand.accuracy(TableFiles.read(out), body.fieldModel(), body.mesh(),
            AccuracyCheck.Spin.fromMetadata(meta), checkSamples, checkCellPoints, seed,
            Math.max(1, threads), err);
        if (rep == null) {
            return;
        }
        TableBuilder.addAccuracy(out, meta, rep);
        TableCommand.printAccuracy(o, rep);
    }
}
