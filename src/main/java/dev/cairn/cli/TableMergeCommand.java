package dev.cairn.cli;

import dev.cairn.io.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.io.ModelLoader;
import dev.cairn.io.ModelRequest;
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

    /** Accuracy report against the model recorded in the sidecar, when that file is present and unchanged. */
    private void check(Map<String, Object> meta, PrintWriter err, PrintWriter o) {
        Map<?, ?> model = (Map<?, ?>) meta.get("model");
        Object file = model == null ? null : model.get("file");
        if (file == null || !java.nio.file.Files.isRegularFile(Path.of(file.toString()))
            || !TableFiles.sha256(Path.of(file.toString())).equals(model.get("sha256"))) {
            err.println("cairn: note: no accuracy report: the model file recorded in the shards (" + file
                + ") is missing here or has changed");
            return;
        }
        if ("points".equals(((Map<?, ?>) meta.get("grid")).get("kind"))) {
            return;
        }
        Object density = model.get("density_kg_m3");
        BodyModel body = ModelLoader.load(Path.of(file.toString()), new ModelRequest(
            String.valueOf(model.get("length_unit_of_file")), ((Number) density).doubleValue(), null, null, null, null));
        AccuracyCheck.BoundReport rep = TableCommand.accuracy(TableFiles.read(out), body.fieldModel(), body.mesh(),
            AccuracyCheck.Spin.fromMetadata(meta), checkSamples, AccuracyCheck.DEFAULT_RANDOM_PER_CELL, seed,
            Math.max(1, threads), err);
        if (rep == null) {
            return;
        }
        TableBuilder.addAccuracy(out, meta, rep);
        TableCommand.printAccuracy(o, rep);
    }
}
