package dev.cairn.cli;

import dev.cairn.gravity.FieldCheck;
import dev.cairn.gravity.FieldModel;
import dev.cairn.body.BodyModel;
import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import dev.cairn.io.MemoryBudget;
import dev.cairn.io.Numbers;
import dev.cairn.io.OutputLock;
import dev.cairn.body.ModelSidecar;
import dev.cairn.io.PointsCsv;
import dev.cairn.tables.AccuracyCheck;
import dev.cairn.tables.BoxGrid;
import dev.cairn.tables.Grid;
import dev.cairn.tables.PointGrid;
import dev.cairn.tables.SphereGrid;
import dev.cairn.tables.Table;
import dev.cairn.tables.TableBench;
import dev.cairn.tables.TableBuilder;
import dev.cairn.tables.TableField;
import dev.cairn.tables.TableFiles;
import dev.cairn.tables.TableJob;
import dev.cairn.tables.TableLayout;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code cairn table}: an acceleration table on a box, spherical or point grid, with an accuracy report. */
@Command(name = "table", mixinStandardHelpOptions = true,
    header = "Tabulate the field on a grid for simulators (.npy or .csv, with accuracy report).",
    description = {"Tabulate potential and acceleration (optionally the gradient tensor and",
        "the effective quantities of the rotating body) on a grid, for fast",
        "interpolation in simulators. Writes FILE (.npy or .csv) and FILE.json",
        "(metadata and accuracy report). See docs/tables.md.",
        "Conventions: SI units, model (body-fixed) frame, potential U > 0,",
        "acceleration = grad U.",
        "Caution: results must be verified independently before operational use;",
        "mission rules and the responsible flight-dynamics authority decide.",
        "Examples:",
        "  cairn table M.obj --grid box --box -3000,3000,-3000,3000,-2000,2000 \\",
        "      --spacing 100 --gradient --out t.npy",
        "  cairn table M.obj --grid sphere --radii 2000:6000:250 \\",
        "      --lat-step 5 --lon-step 5 --out s.npy",
        "  cairn table M.obj --grid points --points traj.csv --out p.csv",
        "  cairn table M.obj --grid box ... --out big.npy --slurm 64 --slurm-submit",
        "      (a Slurm job array of 64 shards and a merge job; see docs/cluster.md)"})
public final class TableCommand implements Callable<Integer> {
    /** Default node limit without --force. */
    public static final int DEFAULT_MAX_NODES = 2_000_000;

    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spinOptions = new SpinOptions();

    @Mixin
    MasconOptions fieldChoice = new MasconOptions();

    @Option(names = "--grid", paramLabel = "box|sphere|points", description = "Grid kind (required except with --bench).")
    String gridKind;

    @Option(names = "--box", split = ",", paramLabel = "XMIN,XMAX,YMIN,YMAX,ZMIN,ZMAX",
        description = "Box bounds, m (grid box).")
    double[] box;

    @Option(names = "--spacing", split = ",", paramLabel = "S|SX,SY,SZ",
        description = "Node spacing, m (grid box); the upper bounds move up to a whole number of steps.")
    double[] spacing;

    @Option(names = "--nodes", split = ",", paramLabel = "N|NX,NY,NZ",
        description = "Node counts instead of a spacing (grid box), nodes on both bounds.")
    int[] nodes;

    @Option(names = "--radii", paramLabel = "R1,R2,..|FROM:TO:STEP", description = "Shell radii, m (grid sphere).")
    String radii;

    @Option(names = "--lat-step", paramLabel = "DEG", description = "Latitude spacing, degrees, dividing 180.")
    Double latStep;

    @Option(names = "--lon-step", paramLabel = "DEG", description = "Longitude spacing, degrees, dividing 360.")
    Double lonStep;

    @Option(names = "--centre", split = ",", paramLabel = "X,Y,Z",
        description = "Sphere centre, m (default: the centre of mass).")
    double[] centre;

    @Option(names = "--points", paramLabel = "FILE", description = "CSV of points x,y,z in m (grid points).")
    Path points;

    @Option(names = "--out", paramLabel = "FILE", description = "Output data file (.npy or .csv).")
    Path out;

    @Option(names = "--format", paramLabel = "npy|csv", description = "Output format (default: from the extension, "
        + "else npy).")
    String format;

    @Option(names = "--gradient", description = "Also tabulate the gravity-gradient tensor (6 components).")
    boolean gradient;

    @Option(names = "--effective", description = "Also tabulate effective potential and acceleration of the "
        + "rotating body (gravity + centrifugal).")
    boolean effective;

    @Option(names = "--distance", description = "Also tabulate the exact signed distance to the surface "
        + "(distance_to_surface_m, negative inside).")
    boolean distance;

    @Option(names = "--exclude-interior", description = "Leave nodes inside the body as NaN (they stay flagged).")
    boolean excludeInterior;

    @Option(names = "--max-nodes", paramLabel = "N", description = "Refuse grids with more nodes unless --force "
        + "(default ${DEFAULT-VALUE}).")
    int maxNodes = DEFAULT_MAX_NODES;

    @Option(names = "--force", description = "Allow a grid above --max-nodes.")
    boolean force;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Option(names = "--resume", description = "Continue an interrupted run from its last completed chunk.")
    boolean resume;

    @Option(names = "--shard", paramLabel = "I/N", description = "Compute only shard I of N (1-based); merge the "
        + "shards with 'cairn table-merge'.")
    String shard;

    @Option(names = "--chunk-nodes", paramLabel = "N", description = "Nodes per checkpoint chunk (default "
        + "${DEFAULT-VALUE}).")
    int chunkNodes = TableJob.DEFAULT_CHUNK_NODES;

    @Option(names = "--check-samples", paramLabel = "N", description = "Independent random points of the accuracy "
        + "report (the bands beyond 3 cell sizes from the surface; default " + AccuracyCheck.DEFAULT_RANDOM_POINTS
        + ", with --bench 2000; 0 skips the report).")
    Integer checkSamples;

    @Option(names = "--check-cell-points", paramLabel = "N", description = "Random points per cell near the surface "
        + "in the accuracy report, besides its centre and 6 face centres (default ${DEFAULT-VALUE}).")
    int checkCellPoints = AccuracyCheck.DEFAULT_RANDOM_PER_CELL;

    @Option(names = "--seed", paramLabel = "S", description = "Seed of the accuracy report (default ${DEFAULT-VALUE}).")
    long seed = 1;

    @Option(names = "--bench", description = "Print throughput, interpolation cost and an error study instead of "
        + "writing a table (uses the grid options when given).")
    boolean bench;

    @Option(names = "--bench-spacings", split = ",", paramLabel = "F,..", description = "Box spacings of the error "
        + "study as fractions of the Brillouin radius (default ${DEFAULT-VALUE}).")
    double[] benchSpacings = {0.4, 0.2, 0.1};

    @Mixin
    SlurmOptions slurmJob = new SlurmOptions();

    @Option(names = "--stop-after-chunks", hidden = true, paramLabel = "N", description = "Stop after N checkpoint "
        + "chunks as if interrupted (to try --resume; exit code 3).")
    int stopAfterChunks;

    /** Exit code of a run stopped by --stop-after-chunks (resumable). */
    public static final int EXIT_INCOMPLETE = 3;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        PrintWriter outw = spec.commandLine().getOut();
        if (threads < 1) {
            throw new InputException("--threads: must be at least 1, got " + threads);
        }
        if (checkSamples != null) {
            requireCount("--check-samples", checkSamples, MAX_CHECK_SAMPLES);
        }
        if (chunkNodes < 1) {
            throw new InputException("--chunk-nodes: must be at least 1, got " + chunkNodes);
        }
        if (gridKind == null && !bench) {
            throw new InputException("--grid: missing (box, sphere or points)");
        }
        if (gridKind != null) {
            preCheckGrid();
        }
        checkAccuracyOptions(checkSamples, checkCellPoints);
        checkSlurmOptions();
        BodyModel body = model.load(spinOptions);
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        if (slurmJob.slurm != null) {
            return slurm(body, err, outw);
        }
        FieldModel field = fieldChoice.build(body, Long.MAX_VALUE, threads, err);
        if (bench) {
            return bench(body, field, outw);
        }
        Grid grid = grid(body);
        requireGridInRange(grid);
        if (grid.nodeCount() > maxNodes && !force) {
            throw new InputException("--grid " + gridKind + ": " + grid.nodeCount() + " nodes is more than the limit of "
                + maxNodes + "; use --force (or raise --max-nodes) if you mean it");
        }
        if (out == null) {
            throw new InputException("--out: missing output file");
        }
        String fmt = format != null ? format.toLowerCase(Locale.ROOT) : TableFiles.formatOf(out);
        if (!fmt.equals(TableFiles.NPY) && !fmt.equals(TableFiles.CSV)) {
            throw new InputException("--format: unknown format '" + format + "' (use npy or csv)");
        }
        int shardIndex = 0;
        int shardCount = 0;
        if (shard != null) {
            if (!shard.strip().matches("[0-9]{1,9}/[0-9]{1,9}")) {
                throw new InputException("--shard: expected I/N with 1 <= I <= N, got " + dev.cairn.io.Messages.quote(shard));
            }
            String[] p = shard.split("/", -1);
            try {
                shardIndex = Integer.parseInt(p[0].trim());
                shardCount = p.length == 2 ? Integer.parseInt(p[1].trim()) : -1;
            } catch (NumberFormatException e) {
                shardCount = -1;
            }
            if (p.length != 2 || shardCount < 1 || shardIndex < 1 || shardIndex > shardCount) {
                throw new InputException("--shard: expected I/N with 1 <= I <= N, got '" + shard + "'");
            }
        }
        if (effective && body.spin().omega() == 0) {
            err.println("cairn: warning: --effective on a body without spin: effective quantities equal the gravity "
                + "ones (give --spin-period or spin_period_s in the model sidecar)");
        }
        TableLayout layout = layout(body, grid);
        // Before anything is locked or computed: the output and its sidecar must not be inputs or special files.
        dev.cairn.io.RunInputs.requireWritable(out.toAbsolutePath());
        dev.cairn.io.RunInputs.requireWritable(TableFiles.sidecarPath(out).toAbsolutePath());
        try (OutputLock lock = OutputLock.acquire(out)) {
            AtomicFiles.cleanStale(out, 0);
            AtomicFiles.cleanStale(TableFiles.sidecarPath(out), 0);
            double bytes = 8.0 * grid.nodeCount() * layout.columnCount();
            MemoryBudget.requireDisk(out, 2 * bytes + (1 << 20), "the table (" + grid.nodeCount() + " nodes x "
                + layout.columnCount() + " columns, with its checkpoints)");
            if (shard == null && (checkSamples == null || checkSamples > 0) && !(grid instanceof PointGrid)) {
                // the accuracy check holds the table and its interpolation data (about 4 copies) in memory
                MemoryBudget.require(4 * bytes, "the accuracy check of a table of " + grid.nodeCount() + " nodes");
            }
            Object before = stamp(out);
            Object beforeSide = stamp(TableFiles.sidecarPath(out));
            try {
                return build(body, field, grid, layout, fmt, shardIndex, shardCount, err, outw);
            } catch (RuntimeException | Error e) {
                // A failed run leaves nothing under its final names: remove what this run wrote there.
                if (!java.util.Objects.equals(before, stamp(out))) {
                    removeQuietly(out);
                }
                if (!java.util.Objects.equals(beforeSide, stamp(TableFiles.sidecarPath(out)))) {
                    removeQuietly(TableFiles.sidecarPath(out));
                }
                throw e;
            }
        }
    }

    /** Refuses --slurm with options it cannot go with, and --slurm-* without --slurm (before the model is loaded). */
    private void checkSlurmOptions() {
        if (slurmJob.slurm == null) {
            refuse(slurmJob.slurmSubmit || slurmJob.slurmSbatch != null || slurmJob.slurmCpus != 1,
                "--slurm-submit, --slurm-cpus and --slurm-sbatch go with --slurm N");
            return;
        }
        refuse(bench, "--slurm: not with --bench");
        refuse(shard != null, "--slurm: not with --shard (each task of the array computes one shard)");
        refuse(gridKind == null, "--slurm: give the grid (--grid ...)");
        if (slurmJob.slurm < 1 || slurmJob.slurm > SlurmArray.MAX_TASKS) {
            throw new InputException("--slurm: expected 1 to " + SlurmArray.MAX_TASKS + " array tasks, got " + slurmJob.slurm);
        }
        if (slurmJob.slurmCpus < 1 || slurmJob.slurmCpus > SlurmArray.MAX_CPUS) {
            throw new InputException("--slurm-cpus: expected 1 to " + SlurmArray.MAX_CPUS + " CPUs per task, got "
                + slurmJob.slurmCpus);
        }
        if (out == null) {
            throw new InputException("--out: missing output file");
        }
    }

    /**
     * Options that are not passed on to the tasks of a Slurm array: they belong to --slurm or are set per task
     * (--resume is added by the task itself when its checkpoints exist).
     */
    private static final java.util.Set<String> NOT_PASSED = java.util.Set.of("--slurm", "--slurm-submit",
        "--slurm-cpus", "--slurm-sbatch", "--slurm-sbatch-command", "--out", "--format", "--threads", "--shard",
        "--resume");

    /** --slurm N: writes (and with --slurm-submit submits) the job array and its merge job; computes nothing. */
    private int slurm(BodyModel body, PrintWriter err, PrintWriter outw) {
        Grid grid = grid(body);
        requireGridInRange(grid);
        if (grid.nodeCount() > maxNodes && !force) {
            throw new InputException("--grid " + gridKind + ": " + grid.nodeCount() + " nodes is more than the limit of "
                + maxNodes + "; use --force (or raise --max-nodes) if you mean it");
        }
        if (slurmJob.slurm > grid.nodeCount()) {
            throw new InputException("--slurm: " + slurmJob.slurm + " shards for a grid of " + grid.nodeCount() + " nodes; "
                + "give at most one shard per node");
        }
        String fmt = format != null ? format.toLowerCase(Locale.ROOT) : TableFiles.formatOf(out);
        if (!fmt.equals(TableFiles.NPY) && !fmt.equals(TableFiles.CSV)) {
            throw new InputException("--format: unknown format '" + format + "' (use npy or csv)");
        }
        dev.cairn.io.RunInputs.requireWritable(out.toAbsolutePath());
        dev.cairn.io.RunInputs.requireWritable(TableFiles.sidecarPath(out).toAbsolutePath());
        List<String> sbatchOptions = slurmJob.slurmSbatch != null ? SlurmArray.readOptions(slurmJob.slurmSbatch) : List.of();
        picocli.CommandLine.ParseResult pr = spec.commandLine().getParseResult();
        String taskThreads = String.valueOf(pr.hasMatchedOption("--threads") ? threads : slurmJob.slurmCpus);
        List<String> args = new ArrayList<>(List.of("table", body.source().toAbsolutePath().normalize().toString()));
        args.addAll(ForwardedArguments.of(pr, o -> !NOT_PASSED.contains(o.longestName())));
        args.addAll(List.of("--format", fmt, "--threads", taskThreads));
        List<String> merge = new ArrayList<>(List.of("--format", fmt, "--threads", taskThreads));
        if (checkSamples != null) {
            merge.addAll(List.of("--check-samples", String.valueOf(checkSamples)));
        }
        merge.addAll(List.of("--check-cell-points", String.valueOf(checkCellPoints), "--seed", String.valueOf(seed)));
        SlurmArray job = new SlurmArray(slurmJob.slurm, slurmJob.slurmCpus, SlurmArray.launcher(), args, merge, out, sbatchOptions);
        job.write();
        int[] first = TableJob.shardRange((int) grid.nodeCount(), 1, slurmJob.slurm);
        err.printf(Locale.ROOT, "cairn: wrote %s and %s: %d task(s) x %d CPU(s), about %d of %d nodes each; shards, "
            + "logs and checkpoints go to %s%n", job.arrayScript().getFileName(), job.mergeScript().getFileName(), slurmJob.slurm,
            slurmJob.slurmCpus, first[1] - first[0], grid.nodeCount(), job.dir());
        if (!slurmJob.slurmSubmit) {
            err.println("cairn: submit with: " + job.submitLine());
            err.flush();
            return 0;
        }
        err.flush();
        SlurmArray.Submission s = job.submit(slurmJob.sbatchCommand);
        err.printf(Locale.ROOT, "cairn: submitted array job %s (%d tasks) and merge job %s (runs after all tasks "
            + "succeed; writes %s)%n", s.arrayJob(), slurmJob.slurm, s.mergeJob(), out);
        outw.println("array_job_id " + s.arrayJob());
        outw.println("merge_job_id " + s.mergeJob());
        outw.flush();
        err.flush();
        return 0;
    }

    /**
     * A table this job finished earlier whose run was stopped during its accuracy check (checkpoints already
     * removed, data and sidecar written, no accuracy report): with --resume only the check is run again. Null when
     * there is no such table (then the checkpoints decide).
     */
    private TableBuilder.Outcome finishedEarlier(TableLayout layout, Map<String, Object> modelInfo, PrintWriter err) {
        Path side = TableFiles.sidecarPath(out);
        if (Files.exists(TableJob.workDir(out)) || !Files.isRegularFile(out) || !Files.isRegularFile(side)) {
            return null;
        }
        Map<String, Object> meta = TableFiles.readJson(side);
        dev.cairn.io.StrictJson.Fields f = new dev.cairn.io.StrictJson.Fields(meta, side, "");
        if (meta.containsKey("accuracy") || meta.containsKey("shard") || !f.has("job_fingerprint")
            || !f.string("job_fingerprint").equals(TableBuilder.fingerprint(layout, modelInfo))
            || !TableFiles.sha256(out).equals(f.optString("data_sha256"))) {
            return null;
        }
        err.println("cairn: " + out + " is complete; running its accuracy check again");
        return new TableBuilder.Outcome(true, new TableJob.Result(true, f.optString("created_utc"), 0, 0), meta);
    }

    /** Largest --check-samples accepted. */
    static final int MAX_CHECK_SAMPLES = 10_000_000;

    static void requireCount(String option, long value, long max) {
        if (value < 0 || value > max) {
            throw new InputException(option + ": must be from 0 to " + max + ", got " + value);
        }
    }

    /** Identity of a file's current content (file key and modification time), or null when absent. */
    static Object stamp(Path p) {
        try {
            var a = Files.readAttributes(p, java.nio.file.attribute.BasicFileAttributes.class);
            return java.util.List.of(String.valueOf(a.fileKey()), a.lastModifiedTime(), a.size());
        } catch (java.io.IOException e) {
            return null;
        }
    }

    static void removeQuietly(Path p) {
        try {
            Files.deleteIfExists(p);
        } catch (java.io.IOException ignored) {
            // best effort: the original failure is what the user needs to see
        }
    }

    /** Refuses grids whose nodes lie beyond the field-point range (squares would overflow: NaN rows). */
    private static void requireGridInRange(Grid grid) {
        double far = 0;
        if (grid instanceof BoxGrid b) {
            for (int a = 0; a < 3; a++) {
                far = Math.max(far, Math.max(Math.abs(b.coordinate(a, 0)), Math.abs(b.coordinate(a, b.counts()[a] - 1))));
            }
        } else if (grid instanceof SphereGrid g) {
            double c = Math.max(Math.abs(g.centre()[0]), Math.max(Math.abs(g.centre()[1]), Math.abs(g.centre()[2])));
            far = c + g.radii()[g.radii().length - 1];
        }
        if (!(far <= Numbers.MAX_POINT_M)) {
            throw new InputException("--grid: nodes reach " + String.format(Locale.ROOT, "%.3g", far) + " m from the "
                + "origin, beyond the " + Numbers.MAX_POINT_M + " m this program accepts for field points");
        }
    }

    private int build(BodyModel body, FieldModel field, Grid grid, TableLayout layout, String fmt, int shardIndex,
                      int shardCount, PrintWriter err, PrintWriter outw) {
        Map<String, Object> info = modelInfo(body, field);
        FieldCheck check = fieldCheck(field, grid, threads);
        if (check.samples() > 0) {
            info.put("field_accuracy", check.json());
            err.println("cairn: " + check.line());
        }
        TableBuilder.Request req = new TableBuilder.Request(field, layout, out, fmt, chunkNodes, resume, shardIndex,
            shardCount, threads, info, VersionProvider.version());
        long t0 = System.nanoTime();
        TableBuilder.Outcome outcome = resume && shard == null ? finishedEarlier(layout, req.modelInfo(), err) : null;
        boolean recheck = outcome != null;
        java.util.concurrent.atomic.AtomicInteger chunks = new java.util.concurrent.atomic.AtomicInteger();
        if (outcome == null) {
            try (ProgressBar bar = new ProgressBar(shard != null ? "table " + shard : "table")) {
                if (field instanceof dev.cairn.gravity.HarmonicField h) {
                    h.resetInsideCount();
                }
                outcome = TableBuilder.build(req, bar,
                    () -> stopAfterChunks > 0 && chunks.incrementAndGet() >= stopAfterChunks, now());
            }
            MasconOptions.warnTooClose(field, (int) Math.min(Integer.MAX_VALUE, grid.nodeCount()), err);
        }
        double secs = (System.nanoTime() - t0) / 1e9;
        if (!outcome.complete()) {
            err.printf(Locale.ROOT, "cairn: stopped after %d chunk(s) as asked; run again with --resume to finish%n",
                outcome.job().chunksReused() + outcome.job().chunksDone());
            err.flush();
            return EXIT_INCOMPLETE;
        }
        if (!recheck) {
            int computedNodes = shard != null ? ((Number) ((Map<?, ?>) outcome.metadata().get("shard")).get("end_node"))
                .intValue() - ((Number) ((Map<?, ?>) outcome.metadata().get("shard")).get("first_node")).intValue()
                : grid.nodeCount();
            err.printf(Locale.ROOT, "cairn: wrote %s (%s, %d nodes x %d columns) and %s%s%n", out,
                shard != null ? "npy shard" : fmt, computedNodes, layout.columnCount(), TableFiles.sidecarPath(out).getFileName(),
                outcome.job().chunksReused() > 0 ? " (resumed: " + outcome.job().chunksReused() + " chunk(s) reused)" : "");
            if (outcome.job().chunksReused() == 0) {
                err.printf(Locale.ROOT, "cairn: %.2f s, %.0f nodes/s with %d thread(s)%n", secs, computedNodes / secs,
                    threads);
            }
        }
        int samples = checkSamples != null ? checkSamples : AccuracyCheck.DEFAULT_RANDOM_POINTS;
        if (shard == null && samples > 0 && !(grid instanceof PointGrid)) {
            AccuracyCheck.BoundReport rep = accuracy(TableFiles.read(out), field, body.mesh(),
                AccuracyCheck.Spin.of(layout), samples, checkCellPoints, seed, threads, err);
            if (rep != null) {
                TableBuilder.addAccuracy(out, outcome.metadata(), rep);
                printAccuracy(outw, rep);
            }
        }
        outw.println(TableBuilder.CAUTION);
        outw.flush();
        err.flush();
        return 0;
    }

    /** Validates the accuracy-report options (before anything is computed). */
    static void checkAccuracyOptions(Integer samples, int cellPoints) {
        if (samples != null && (samples < 0 || samples > 10_000_000)) {
            throw new InputException("--check-samples: expected 0 to 10000000 points, got " + samples);
        }
        if (cellPoints < 0 || cellPoints > 100) {
            throw new InputException("--check-cell-points: expected 0 to 100 points per cell, got " + cellPoints);
        }
    }

    /** The bound report of a written table, or null (with a note on {@code err}) when it cannot be interpolated. */
    static AccuracyCheck.BoundReport accuracy(Table table, FieldModel field, dev.cairn.mesh.TriangleMesh surface,
                                              AccuracyCheck.Spin spin, int samples, int cellPoints, long seed,
                                              int threads, PrintWriter err) {
        try {
            new TableField(table);
        } catch (IllegalArgumentException e) {
            err.println("cairn: note: no accuracy report: " + e.getMessage());
            return null;
        }
        try (ProgressBar bar = new ProgressBar("accuracy check")) {
            return AccuracyCheck.bound(table, field, new dev.cairn.mascon.SurfaceQuery(surface), spin, samples,
                cellPoints, seed, threads, bar);
        } catch (IllegalArgumentException e) {
            err.println("cairn: note: no accuracy report: " + e.getMessage() + " (lower --check-samples or "
                + "--check-cell-points)");
            return null;
        }
    }

    /** Terminal form of the bound report. */
    static void printAccuracy(PrintWriter w, AccuracyCheck.BoundReport rep) {
        w.printf(Locale.ROOT, "Accuracy of interpolation against the exact field, relative error |da|/|g| by distance "
            + "from the surface%n  (in cell sizes; bound = stated upper bound, see docs/tables.md): %d cells near the "
            + "surface x %d points, %d random points, seed %d%n", rep.denseCells(), rep.perCell(), rep.randomPoints(),
            rep.seed());
        w.printf(Locale.ROOT, "  %-17s %-23s %-7s %8s %10s %10s %10s%n", "interpolation", "quantity", "band", "points",
            "bound", "max found", "p50");
        for (AccuracyCheck.Interpolant in : rep.interpolants()) {
            for (AccuracyCheck.Band b : in.bands()) {
                String band = Double.isInfinite(b.to()) ? ">" + (int) b.from() : (int) b.from() + "-" + (int) b.to();
                if (b.stats().count() == 0) {
                    w.printf(Locale.ROOT, "  %-17s %-23s %-7s %8d %10s%n", in.interpolation(), in.quantity(), band, 0,
                        "no points");
                    continue;
                }
                w.printf(Locale.ROOT, "  %-17s %-23s %-7s %8d %10.3e %10.3e %10.3e%n", in.interpolation(),
                    in.quantity(), band, b.stats().count(), b.bound(), b.stats().max(), b.stats().p50());
            }
            if (in.inside().count() > 0) {
                w.printf(Locale.ROOT, "  %-17s %-23s %-7s %8d %10s %10.3e %10.3e%n", in.interpolation(), in.quantity(),
                    "inside", in.inside().count(), "(none)", in.inside().max(), in.inside().p50());
            }
        }
        if (rep.blank() > 0) {
            w.printf(Locale.ROOT, "  %d point(s) in cells with blank (NaN) nodes left out%n", rep.blank());
        }
    }

    private static String now() {
        return Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
    }

    /** Checks what can be checked before the model is loaded (so bad specs fail fast). */
    private void preCheckGrid() {
        switch (gridKind) {
            case "box":
                refuse(radii != null || latStep != null || lonStep != null || centre != null || points != null,
                    "--grid box takes --box with --spacing or --nodes (not --radii, --lat-step, --lon-step, --centre, "
                        + "--points)");
                boxGrid();
                break;
            case "sphere":
                refuse(box != null || spacing != null || nodes != null || points != null,
                    "--grid sphere takes --radii, --lat-step, --lon-step and optionally --centre");
                if (radii == null || latStep == null || lonStep == null) {
                    throw new InputException("--grid sphere: give --radii, --lat-step and --lon-step");
                }
                for (String tok : radii.split("[,:]", -1)) {
                    if (!Numbers.isDecimal(tok.strip())) {
                        throw new InputException("--radii: " + dev.cairn.io.Messages.quote(radii) + " is not a list "
                            + "r1,r2,... or a range from:to:step of decimal numbers (metres)");
                    }
                }
                new SphereGrid(new double[3], SphereGrid.parseRadii(radii), latStep, lonStep);
                if (centre != null && centre.length != 3) {
                    throw new InputException("--centre: expected X,Y,Z, got " + centre.length + " number(s)");
                }
                break;
            case "points":
                refuse(box != null || spacing != null || nodes != null || radii != null || latStep != null
                    || lonStep != null || centre != null, "--grid points takes only --points FILE");
                if (points == null) {
                    throw new InputException("--grid points: give --points FILE");
                }
                break;
            default:
                throw new InputException("--grid: unknown grid '" + gridKind + "' (use box, sphere or points)");
        }
    }

    private static void refuse(boolean bad, String msg) {
        if (bad) {
            throw new InputException(msg);
        }
    }

    private BoxGrid boxGrid() {
        if (box == null) {
            throw new InputException("--grid box: give --box XMIN,XMAX,YMIN,YMAX,ZMIN,ZMAX");
        }
        if ((spacing == null) == (nodes == null)) {
            throw new InputException("--grid box: give exactly one of --spacing and --nodes");
        }
        if (spacing != null) {
            if (spacing.length != 1 && spacing.length != 3) {
                throw new InputException("--spacing: expected 1 or 3 numbers, got " + spacing.length);
            }
            double[] s = spacing.length == 1 ? new double[] {spacing[0], spacing[0], spacing[0]} : spacing;
            return BoxGrid.ofSpacing(box, s);
        }
        if (nodes.length != 1 && nodes.length != 3) {
            throw new InputException("--nodes: expected 1 or 3 counts, got " + nodes.length);
        }
        int[] n = nodes.length == 1 ? new int[] {nodes[0], nodes[0], nodes[0]} : nodes;
        return BoxGrid.ofCounts(box, n);
    }

    private Grid grid(BodyModel body) {
        switch (gridKind) {
            case "box":
                return boxGrid();
            case "sphere":
                return new SphereGrid(centre != null ? centre : body.massProperties().centerOfMass(),
                    SphereGrid.parseRadii(radii), latStep, lonStep);
            default:
                return new PointGrid(PointsCsv.read(points), points.getFileName().toString(),
                    TableFiles.sha256(points));
        }
    }

    private TableLayout layout(BodyModel body, Grid grid) {
        return new TableLayout(grid, gradient, effective, excludeInterior, body.spin().omega(), body.spin().axis(),
            body.massProperties().centerOfMass(), distance ? new dev.cairn.mascon.SurfaceQuery(body.mesh()) : null);
    }

    /**
     * The hierarchical field's measured accuracy against the exact sum on nodes sampled evenly from the whole grid
     * (the same nodes for every shard, so shards and their merge agree).
     */
    static FieldCheck fieldCheck(FieldModel field, Grid grid, int threads) {
        if (field.exactModel() == field) {
            return FieldCheck.measure(field, new double[0], 0, 0, threads);
        }
        int n = (int) Math.min(FieldCheck.DEFAULT_SAMPLES, grid.nodeCount());
        double[] xyz = new double[3 * n];
        for (int i = 0; i < n; i++) {
            grid.node((int) ((long) i * grid.nodeCount() / n), xyz, 3 * i);
        }
        return FieldCheck.measure(field, xyz, n, 1L, threads);
    }

    /** Model identity for the sidecar. */
    static Map<String, Object> modelInfo(BodyModel body, FieldModel field) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("file", body.source().toString());
        m.put("sha256", TableFiles.sha256(body.source()));
        Path side = ModelSidecar.pathFor(body.source());
        m.put("sidecar_sha256", body.sidecar() != null && Files.isRegularFile(side) ? TableFiles.sha256(side) : null);
        Map<String, Object> files = new LinkedHashMap<>();
        for (Path f : body.files()) {
            files.put(f.toAbsolutePath().normalize().toString(), TableFiles.sha256(f));
        }
        m.put("files_sha256", files);
        m.put("length_unit_of_file", body.lengthUnit());
        m.put("density_kg_m3", body.density());
        m.put("gm_m3_s2", body.gm());
        m.put("field", field.describe());
        return m;
    }

    private int bench(BodyModel body, FieldModel field, PrintWriter w) {
        double rb = body.massProperties().brillouinRadius();
        double[] com = body.massProperties().centerOfMass();
        Grid grid = gridKind != null ? grid(body) : null;
        w.printf(Locale.ROOT, "Model: %s (%s), Brillouin radius %.1f m%n", body.source(), field.describe(), rb);
        TableBench.Report r = TableBench.run(field, body.mesh(), layout(body, grid != null ? grid
            : TableBench.defaultGrid(com, rb)), com, rb, benchSpacings, gradient, threads, checkSamples != null ? checkSamples : 2000, seed);
        w.print(r.text());
        w.println(TableBuilder.CAUTION);
        w.flush();
        return 0;
    }
}
