package dev.cairn.cli;

import dev.cairn.io.InputException;
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
    description = {"Merge table shards (made with 'cairn table ... --shard I/N') into one",
        "table. The data file is byte-identical to the one a single run writes;",
        "the sidecar keeps the earliest shard's creation time. No accuracy report",
        "is made here (run 'cairn table' on a coarse grid of the same model).",
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
        o.println(TableBuilder.CAUTION);
        o.flush();
        return 0;
    }
}
