package dev.cairn.cli;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldCheck;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.io.AtomicFiles;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.motion.Deployment;
import dev.cairn.motion.DeploymentSettings;
import dev.cairn.motion.DeploymentSummary;
import dev.cairn.motion.Frame;
import dev.cairn.motion.Landing;
import dev.cairn.motion.MotionSettings;
import dev.cairn.motion.Propagator;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.surface.LatLonRaster;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.image.BufferedImage;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code cairn deploy}: seeded Monte Carlo of ballistic releases near the spinning body, to first impact and bounce
 * after bounce (coefficients of restitution) until rest, escape or the time limit; {@code landings.csv},
 * {@code summary.json} and a map of the rest points over the slope. See docs/trajectories.md.
 */
@Command(name = "deploy", mixinStandardHelpOptions = true,
    header = "Monte Carlo of ballistic releases with bounces: where a released lander comes to rest.",
    description = {"Seeded Monte Carlo of ballistic releases (Gaussian dispersion of position and velocity) in the",
        "rotating body frame, to first impact, bouncing with normal/tangential restitution on the impacted facet",
        "until rest, escape or the time limit. Writes landings.csv, summary.json and map-landings.png to --out.",
        "SI units, model (body-fixed) frame, velocities relative to the body; see docs/trajectories.md.",
        "Caution: results inform but do not replace the responsible flight-dynamics analysis; verify them",
        "independently before operational use."})
public final class DeployCommand implements Callable<Integer> {
    /** Most samples per run. */
    static final int MAX_COUNT = 1_000_000;
    /**
     * Field tolerance of deploy when neither --tolerance nor --exact nor --table is given (the hierarchical field;
     * other commands default to 1e-10). Measured on the demo deployment: see docs/trajectories.md, "Speed".
     */
    static final double DEFAULT_FIELD_TOLERANCE = 1e-6;
    /** Integrator tolerance of deploy (other commands default to 1e-12); measured as above. */
    static final double DEFAULT_INTEGRATOR_TOLERANCE = 1e-8;

    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spinOptions = new SpinOptions();

    @Option(names = "--release", required = true, paramLabel = "X,Y,Z",
        converter = NumberList.Converter.class,
        description = "Nominal release position, m, body frame.")
    NumberList release;

    @Option(names = "--velocity", required = true, paramLabel = "VX,VY,VZ",
        converter = NumberList.Converter.class,
        description = "Nominal release velocity relative to the body, m/s, body frame.")
    NumberList velocity;

    @Option(names = "--count", paramLabel = "N", description = "Number of samples (default ${DEFAULT-VALUE}).")
    int count = 100;

    @Option(names = "--position-sigma", paramLabel = "M", description = "Standard deviation of each release position "
        + "component, m (default ${DEFAULT-VALUE}).")
    double positionSigma = 0;

    @Option(names = "--velocity-sigma", paramLabel = "M_S", description = "Standard deviation of each release "
        + "velocity component, m/s (default ${DEFAULT-VALUE}).")
    double velocitySigma = 0;

    @Option(names = "--restitution", paramLabel = "EN,ET",
        converter = NumberList.Converter.class, description = "Normal and tangential "
        + "coefficients of restitution, each in [0, 1] (default 0.5,0.8; chosen, no source).")
    NumberList restitution = new NumberList(new double[] {0.5, 0.8});

    @Option(names = "--seed", paramLabel = "S", description = "Seed of the dispersion (default ${DEFAULT-VALUE}).")
    long seed = 1;

    @Option(names = "--rest-speed", paramLabel = "M_S", description = "At rest when the speed after a bounce is "
        + "below this, m/s (default ${DEFAULT-VALUE}).")
    double restSpeed = 1e-3;

    @Option(names = "--rest-apex", paramLabel = "M", description = "At rest when the next hop's apex "
        + "v_n^2/(2 g_n) is below this, m (default ${DEFAULT-VALUE}).")
    double restApex = 0.01;

    @Option(names = "--time-limit", paramLabel = "T", description = "Time limit per sample, with unit suffix s, min, "
        + "h or d (default ${DEFAULT-VALUE}).")
    String timeLimit = "3d";

    @Option(names = "--max-bounces", paramLabel = "N", description = "Bounce limit per sample (default "
        + "${DEFAULT-VALUE}).")
    int maxBounces = 1000;

    @Option(names = "--integrator-tolerance", paramLabel = "REL", description = "Relative (and scaled absolute) local "
        + "error per step of the Dormand-Prince 8(5,3) integrator, 1e-15 to 1e-3 (default ${DEFAULT-VALUE}; "
        + "with the default field tolerance 1e-6, see docs/trajectories.md for the measured accuracy).")
    double integratorTolerance = DEFAULT_INTEGRATOR_TOLERANCE;

    @Option(names = "--table", paramLabel = "FILE", description = "Use an acceleration table of this body (from "
        + "'cairn table'; tricubic interpolation, the body's field outside the table) instead of the body's field.")
    Path table;

    @Option(names = "--views", description = "Also render the rest points over a 3D view of the body coloured by "
        + "slope (rest-points-3d.png, via the 'render' command, which surveys the body first); needs a display "
        + "(e.g. xvfb-run), skipped with a warning without.")
    boolean views;

    @Option(names = "--out", paramLabel = "DIR", description = "Output directory (default: deploy-out/).")
    Path out = Paths.get("deploy-out");

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (results do not depend on it; "
        + "default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Option(names = "--shard", paramLabel = "I/N", description = "Compute only shard I of N: a contiguous range of "
        + "sample indices (the split rule of table shards); writes that range's landings.csv rows and shard.json "
        + "(settings fingerprint and range) to --out, for --merge-shards. Results do not depend on the split.")
    String shard;

    @Option(names = "--merge-shards", paramLabel = "DIR", split = ",", description = "Instead of propagating, read "
        + "the landings of these shard folders (from --shard; comma-separated or repeated; same options as the "
        + "shards) and write every output of a single run; landings.csv is byte-identical to a single run's.")
    List<Path> mergeShards;

    @Mixin
    SlurmOptions slurmJob = new SlurmOptions();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** Checks the options and builds the settings; one-line InputException on bad values. */
    DeploymentSettings settings() {
        double[] r = TrajectoryCommand.vector(release.values(), 3, "--release");
        double[] v = TrajectoryCommand.vector(velocity.values(), 3, "--velocity");
        if (count < 1 || count > MAX_COUNT) {
            throw new InputException("--count: must be between 1 and " + MAX_COUNT + ", got " + count);
        }
        if (!(positionSigma >= 0 && Double.isFinite(positionSigma))) {
            throw new InputException("--position-sigma: must be a finite number >= 0 m, got " + positionSigma);
        }
        if (!(velocitySigma >= 0 && Double.isFinite(velocitySigma))) {
            throw new InputException("--velocity-sigma: must be a finite number >= 0 m/s, got " + velocitySigma);
        }
        double[] e = TrajectoryCommand.vector(restitution.values(), 2, "--restitution");
        if (!(e[0] >= 0 && e[0] <= 1 && e[1] >= 0 && e[1] <= 1)) {
            throw new InputException("--restitution: coefficients must be in [0, 1], got " + e[0] + "," + e[1]);
        }
        if (!(restSpeed >= 0 && Double.isFinite(restSpeed))) {
            throw new InputException("--rest-speed: must be a finite number >= 0 m/s, got " + restSpeed);
        }
        if (!(restApex >= 0 && Double.isFinite(restApex))) {
            throw new InputException("--rest-apex: must be a finite number >= 0 m, got " + restApex);
        }
        if (maxBounces < 1 || maxBounces > 1_000_000) {
            throw new InputException("--max-bounces: must be between 1 and 1000000, got " + maxBounces);
        }
        if (!(integratorTolerance >= 1e-15 && integratorTolerance <= 1e-3)) {
            throw new InputException("--integrator-tolerance: must be in [1e-15, 1e-3], got " + integratorTolerance);
        }
        TrajectoryCommand.checkThreads(threads);
        double limit = TrajectoryCommand.parseDuration(timeLimit, "--time-limit");
        return new DeploymentSettings(r, v, count, positionSigma, velocitySigma, e[0], e[1], seed, restSpeed,
            restApex, limit, maxBounces);
    }

    @Override
    public Integer call() {
        System.setProperty("java.awt.headless", "true");
        DeploymentSettings ds = settings();
        spinOptions.periodSeconds();
        spinOptions.axis();
        checkShardOptions();
        DeployShards.Shard part = shard == null ? null : DeployShards.parse(shard, ds.count());
        if (mergeShards != null) {
            Path o = out.toAbsolutePath().normalize();
            for (Path d : mergeShards) {
                refuse(d.toAbsolutePath().normalize().equals(o), "--out: " + dev.cairn.io.Messages.path(out)
                    + " is one of the --merge-shards folders; write the merge elsewhere");
            }
        }
        if (model.tolerance == null && !model.exact && table == null) {
            model.tolerance = DEFAULT_FIELD_TOLERANCE;
        }
        BodyModel body = model.load(spinOptions);
        PrintWriter err = spec.commandLine().getErr();
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        if (slurmJob.slurm != null) {
            return slurm(body, ds, err);
        }
        FieldModel field = TrajectoryCommand.field(body, table);
        MotionSettings ms = MotionSettings.defaults(Frame.BODY).withTolerances(integratorTolerance,
            integratorTolerance);
        Propagator prop = TrajectoryCommand.propagator(body, field, ms);
        double[] r = ds.release();
        double alt = prop.altitude(r[0], r[1], r[2]);
        if (!(alt > 0)) {
            throw new InputException("--release: " + r[0] + "," + r[1] + "," + r[2] + " is inside the body or on its "
                + "surface (" + TrajectoryCommand.fmt(-alt) + " m below it)");
        }
        long t0 = System.nanoTime();
        List<Landing> landings;
        if (mergeShards != null) {
            landings = DeployShards.merge(mergeShards, DeployShards.fingerprint(body, field, table,
                integratorTolerance, ds), ds, body.mesh().facetCount());
        } else {
            try (ProgressBar bar = new ProgressBar("deploy")) {
                landings = part == null ? Deployment.run(prop, ds, threads, bar)
                    : Deployment.run(prop, ds, part.first(), part.end(), threads, bar);
            }
        }
        double seconds = (System.nanoTime() - t0) / 1e9;
        if (part != null) {
            // shard.json last, and an old one removed first: a folder with shard.json holds a finished shard
            try {
                java.nio.file.Files.deleteIfExists(out.resolve(DeployShards.SHARD_JSON));
            } catch (java.io.IOException e) {
                throw new InputException("--out: cannot remove the old " + out.resolve(DeployShards.SHARD_JSON) + ": "
                    + e.getMessage());
            }
            LandingsCsv.write(out.resolve("landings.csv"), landings);
            DeployShards.writeShardJson(out, DeployShards.fingerprint(body, field, table, integratorTolerance, ds),
                part);
            err.printf(Locale.ROOT, "cairn: shard %d/%d: samples %d to %d of %d in %.3f s; wrote %s and %s%n",
                part.index(), part.count(), part.first(), part.end() - 1, ds.count(), seconds,
                out.resolve("landings.csv"), out.resolve(DeployShards.SHARD_JSON));
            err.flush();
            return 0;
        }
        DeploymentSummary sum = DeploymentSummary.of(landings, prop.frame());
        double[] pts = new double[3 * (landings.size() + 1)];
        for (int i = 0; i < landings.size(); i++) {
            System.arraycopy(landings.get(i).position(), 0, pts, 3 * i, 3);
        }
        System.arraycopy(r, 0, pts, 3 * landings.size(), 3);
        FieldCheck check = FieldCheck.measure(field, pts, FieldCheck.DEFAULT_SAMPLES, 1, threads);
        LandingsCsv.write(out.resolve("landings.csv"), landings);
        TrajectoryCommand.writeJson(out.resolve("summary.json"), summaryJson(body, field, check, prop, ds, sum,
            seconds));
        writeMap(out.resolve("map-landings.png"), body, prop.frame(), field, landings, sum, ds);
        report(spec.commandLine().getOut(), body, field, check, sum, seconds);
        if (views) {
            renderRestPoints(err());
        }
        return 0;
    }

    /** Refuses combinations of --shard, --merge-shards, --slurm and --views that do not go together. */
    private void checkShardOptions() {
        refuse(shard != null && mergeShards != null, "--shard: not with --merge-shards (merge the shards in a "
            + "separate run)");
        refuse(shard != null && views, "--views: not with --shard (give it to the merge)");
        if (slurmJob.slurm == null) {
            refuse(slurmJob.slurmSubmit || slurmJob.slurmSbatch != null || slurmJob.slurmCpus != 1,
                "--slurm-submit, --slurm-cpus and --slurm-sbatch go with --slurm N");
            return;
        }
        refuse(shard != null, "--slurm: not with --shard (each task of the array computes one shard)");
        refuse(mergeShards != null, "--slurm: not with --merge-shards (the array writes its own merge job)");
        if (slurmJob.slurm < 1 || slurmJob.slurm > SlurmArray.MAX_TASKS) {
            throw new InputException("--slurm: expected 1 to " + SlurmArray.MAX_TASKS + " array tasks, got " + slurmJob.slurm);
        }
        if (slurmJob.slurm > count) {
            throw new InputException("--slurm: " + slurmJob.slurm + " shards for " + count + " samples (--count); give at "
                + "most one shard per sample");
        }
        if (slurmJob.slurmCpus < 1 || slurmJob.slurmCpus > SlurmArray.MAX_CPUS) {
            throw new InputException("--slurm-cpus: expected 1 to " + SlurmArray.MAX_CPUS + " CPUs per task, got "
                + slurmJob.slurmCpus);
        }
    }

    private static void refuse(boolean bad, String message) {
        if (bad) {
            throw new InputException(message);
        }
    }

    /** Options not passed on to the tasks and the merge of a Slurm array (they belong to --slurm or are set here). */
    private static final java.util.Set<String> NOT_PASSED = java.util.Set.of("--slurm", "--slurm-submit",
        "--slurm-cpus", "--slurm-sbatch", "--slurm-sbatch-command", "--out", "--threads", "--shard", "--merge-shards",
        "--views");

    /** --slurm N: writes (and with --slurm-submit submits) the job array and its merge job; computes nothing. */
    private int slurm(BodyModel body, DeploymentSettings ds, PrintWriter err) {
        List<String> sbatchOptions = slurmJob.slurmSbatch != null ? SlurmArray.readOptions(slurmJob.slurmSbatch) : List.of();
        picocli.CommandLine.ParseResult pr = spec.commandLine().getParseResult();
        String taskThreads = String.valueOf(pr.hasMatchedOption("--threads") ? threads : slurmJob.slurmCpus);
        List<String> args = new java.util.ArrayList<>(List.of("deploy",
            body.source().toAbsolutePath().normalize().toString()));
        args.addAll(ForwardedArguments.of(pr, o -> !NOT_PASSED.contains(o.longestName())));
        args.addAll(List.of("--threads", taskThreads));
        List<String> merge = new java.util.ArrayList<>(args);
        if (views) {
            merge.add("--views");
        }
        SlurmArray job = new SlurmArray(SlurmArray.Kind.DEPLOY, slurmJob.slurm, slurmJob.slurmCpus, SlurmArray.launcher(), args, merge,
            out, sbatchOptions);
        job.write();
        int[] first = dev.cairn.tables.TableJob.shardRange(ds.count(), 1, slurmJob.slurm);
        err.printf(Locale.ROOT, "cairn: wrote %s and %s: %d task(s) x %d CPU(s), about %d of %d samples each; shards "
            + "and logs go to %s%n", job.arrayScript().getFileName(), job.mergeScript().getFileName(), slurmJob.slurm,
            slurmJob.slurmCpus, first[1] - first[0], ds.count(), job.dir());
        PrintWriter outw = spec.commandLine().getOut();
        if (!slurmJob.slurmSubmit) {
            err.println("cairn: submit with: " + job.submitLine());
            err.flush();
            return 0;
        }
        err.flush();
        SlurmArray.Submission sub = job.submit(slurmJob.sbatchCommand);
        err.printf(Locale.ROOT, "cairn: submitted array job %s (%d tasks) and merge job %s (runs after all tasks "
            + "succeed; writes %s)%n", sub.arrayJob(), slurmJob.slurm, sub.mergeJob(), out);
        outw.println("array_job_id " + sub.arrayJob());
        outw.println("merge_job_id " + sub.mergeJob());
        outw.flush();
        err.flush();
        return 0;
    }

    private PrintWriter err() {
        return spec.commandLine().getErr();
    }

    /**
     * {@code rest-points-3d.png}: the rest points of {@code landings.csv} over an iso view coloured by slope, through
     * the {@code render} subcommand (this package holds no JavaFX types) with the model and spin options given here.
     */
    private void renderRestPoints(PrintWriter err) {
        Path png = out.resolve("rest-points-3d.png");
        java.util.List<String> args = new java.util.ArrayList<>(java.util.List.of("render"));
        picocli.CommandLine.ParseResult pr = spec.commandLine().getParseResult();
        for (String p : pr.matchedPositionals().isEmpty() ? java.util.List.<String>of()
            : pr.matchedPositionals().get(0).originalStringValues()) {
            args.add(p);
        }
        args.addAll(ForwardedArguments.of(pr, ForwardedArguments::modelOrSpin));
        args.addAll(java.util.List.of("--quantity", "slope", "--view", "iso", "--markers",
            out.resolve("landings.csv").toString(), "--out", png.toString()));
        java.io.StringWriter renderErr = new java.io.StringWriter();
        int code = CairnMain.execute(new PrintWriter(new java.io.StringWriter()), new PrintWriter(renderErr),
            args.toArray(new String[0]));
        if (code != 0) {
            err.println("cairn: warning: 3D view of the rest points skipped: " + renderErr.toString().strip()
                .replaceFirst("^cairn: error: ", "").lines().reduce((a, b) -> b).orElse(""));
        } else {
            err.println("cairn: wrote " + png);
        }
        err.flush();
    }

    private static Map<String, Object> summaryJson(BodyModel body, FieldModel field, FieldCheck check, Propagator p,
                                                   DeploymentSettings ds, DeploymentSummary s, double seconds) {
        Map<String, Object> root = new LinkedHashMap<>();
        root.put("caution", TrajectoryCommand.CAUTION);
        root.put("conventions", TrajectoryCommand.conventions());
        root.put("body", body.name());
        root.put("source", body.source().toString());
        root.put("spin_period_s", TrajectoryCommand.num(body.spin().periodSeconds()));
        root.put("spin_axis", body.spin().axis());
        root.put("field", TrajectoryCommand.fieldJson(field, check));
        root.put("integrator", TrajectoryCommand.integratorJson(p));
        Map<String, Object> set = new LinkedHashMap<>();
        set.put("release_m", ds.release());
        set.put("velocity_m_s", ds.velocity());
        set.put("count", ds.count());
        set.put("position_sigma_m", ds.positionSigma());
        set.put("velocity_sigma_m_s", ds.velocitySigma());
        set.put("restitution_normal", ds.restitutionNormal());
        set.put("restitution_tangential", ds.restitutionTangential());
        set.put("seed", ds.seed());
        set.put("rest_speed_m_s", ds.restSpeed());
        set.put("rest_apex_m", ds.restApex());
        set.put("time_limit_s", ds.timeLimit());
        set.put("max_bounces", ds.maxBounces());
        set.put("bounce_model", "point lander; v' = -e_n v_n n + e_t v_t on the impacted facet; no friction beyond e_t");
        root.put("settings", set);
        double n = s.count();
        Map<String, Object> fr = new LinkedHashMap<>();
        fr.put("rest", s.rest() / n);
        fr.put("escaped", s.escaped() / n);
        fr.put("timed_out", s.timedOut() / n);
        fr.put("bounce_limit", s.bounceLimit() / n);
        fr.put("start_inside", s.startInside() / n);
        root.put("fractions", fr);
        Map<String, Object> cnt = new LinkedHashMap<>();
        cnt.put("rest", s.rest());
        cnt.put("escaped", s.escaped());
        cnt.put("timed_out", s.timedOut());
        cnt.put("bounce_limit", s.bounceLimit());
        cnt.put("start_inside", s.startInside());
        root.put("counts", cnt);
        Map<String, Object> el = new LinkedHashMap<>();
        double[] mr = s.meanRest();
        el.put("mean_rest_point_m", new Object[] {TrajectoryCommand.num(mr[0]), TrajectoryCommand.num(mr[1]),
            TrajectoryCommand.num(mr[2])});
        el.put("mean_lat_deg", TrajectoryCommand.num(s.meanLatDeg()));
        el.put("mean_lon_deg", TrajectoryCommand.num(s.meanLonDeg()));
        el.put("sigma_major_m", TrajectoryCommand.num(s.sigmaMajor()));
        el.put("sigma_minor_m", TrajectoryCommand.num(s.sigmaMinor()));
        el.put("azimuth_major_deg_east_of_north", TrajectoryCommand.num(s.azimuthDeg()));
        el.put("note", "1-sigma ellipse of rest points projected on the plane normal to the mean rest direction; "
            + "x2.4477 for the 95% ellipse of Gaussian scatter");
        root.put("dispersion_ellipse", el);
        Map<String, Object> st = new LinkedHashMap<>();
        st.put("mean_time_to_rest_s", TrajectoryCommand.num(s.meanTime()));
        st.put("max_time_to_rest_s", TrajectoryCommand.num(s.maxTime()));
        st.put("mean_bounces_at_rest", TrajectoryCommand.num(s.meanBounces()));
        st.put("max_bounces_at_rest", s.maxBounces());
        st.put("mean_first_impact_speed_m_s", TrajectoryCommand.num(s.meanFirstSpeed()));
        st.put("max_first_impact_speed_m_s", TrajectoryCommand.num(s.maxFirstSpeed()));
        st.put("mean_slope_at_rest_deg", TrajectoryCommand.num(s.meanSlopeDeg()));
        st.put("max_slope_at_rest_deg", TrajectoryCommand.num(s.maxSlopeDeg()));
        st.put("max_jacobi_drift_relative", s.maxJacobiDrift());
        root.put("statistics", st);
        Map<String, Object> sp = new LinkedHashMap<>();
        sp.put("seconds", seconds);
        sp.put("steps", s.totalSteps());
        sp.put("field_evaluations", s.totalEvaluations());
        sp.put("field_evaluations_per_sample", s.totalEvaluations() / n);
        root.put("cost", sp);
        return root;
    }

    /** Rest points (and release point) on a latitude/longitude map of the slope of the surface. */
    private static void writeMap(Path file, BodyModel body, RotatingFrame frame, FieldModel field, List<Landing> ls,
                                 DeploymentSummary s, DeploymentSettings ds) {
        TriangleMesh mesh = body.mesh();
        double[] cen = mesh.facetCentroids();
        double[] nrm = mesh.facetNormals();
        double[] g = BatchEvaluation.evaluate(field, cen, false, ParallelChunks.defaultThreads(),
            ProgressListener.NONE);
        int f = mesh.facetCount();
        double[] slope = new double[f];
        double[] eff = new double[4];
        for (int k = 0; k < f; k++) {
            int o = k * FieldSample.SIZE;
            frame.effective(cen[3 * k], cen[3 * k + 1], cen[3 * k + 2], g[o + FieldSample.U], g, o + FieldSample.AX,
                eff, 0);
            double nx = nrm[3 * k];
            double ny = nrm[3 * k + 1];
            double nz = nrm[3 * k + 2];
            double cx = ny * eff[3] - nz * eff[2];
            double cy = nz * eff[1] - nx * eff[3];
            double cz = nx * eff[2] - ny * eff[1];
            slope[k] = Math.toDegrees(Math.atan2(Math.sqrt(cx * cx + cy * cy + cz * cz),
                -(nx * eff[1] + ny * eff[2] + nz * eff[3])));
        }
        int gw = 720;
        int gh = 360;
        LatLonRaster raster = LatLonRaster.build(mesh, frame, gw, gh, ParallelChunks.defaultThreads());
        int left = 60;
        int top = 44;
        BufferedImage img = new BufferedImage(left + gw + 150, top + gh + 90, BufferedImage.TYPE_INT_RGB);
        Graphics2D gr = TrajectoryCommand.graphics(img);
        for (int j = 0; j < gh; j++) {
            for (int i = 0; i < gw; i++) {
                int fc = raster.facet(i, j);
                img.setRGB(left + i, top + j, fc < 0 ? 0x808080 : slopeColour(slope[fc]).getRGB());
            }
        }
        gr.setColor(Color.BLACK);
        gr.drawRect(left, top, gw, gh);
        for (int lat = -60; lat <= 60; lat += 30) {
            int y = top + (int) Math.round((90 - lat) / 180.0 * gh);
            gr.drawString(lat + "°", left - 36, y + 4);
        }
        for (int lon = -180; lon <= 180; lon += 60) {
            int x = left + (int) Math.round((lon + 180) / 360.0 * gw);
            gr.drawString(lon + "°", x - 12, top + gh + 16);
        }
        gr.setStroke(new BasicStroke(1f));
        for (Landing l : ls) {
            if (l.outcome() != Landing.Outcome.REST) {
                continue;
            }
            int x = left + (int) Math.round((l.lonDeg() + 180) / 360.0 * gw);
            int y = top + (int) Math.round((90 - l.latDeg()) / 180.0 * gh);
            gr.setColor(Color.WHITE);
            gr.fillOval(x - 3, y - 3, 6, 6);
            gr.setColor(Color.BLACK);
            gr.drawOval(x - 3, y - 3, 6, 6);
        }
        double[] r = ds.release();
        int rx = left + (int) Math.round((frame.longitudeDeg(r[0], r[1], r[2]) + 180) / 360.0 * gw);
        int ry = top + (int) Math.round((90 - frame.latitudeDeg(r[0], r[1], r[2])) / 180.0 * gh);
        gr.setColor(new Color(0xD01010));
        gr.setStroke(new BasicStroke(2f));
        gr.drawLine(rx - 6, ry, rx + 6, ry);
        gr.drawLine(rx, ry - 6, rx, ry + 6);
        if (s.rest() > 0) {
            int mx = left + (int) Math.round((s.meanLonDeg() + 180) / 360.0 * gw);
            int my = top + (int) Math.round((90 - s.meanLatDeg()) / 180.0 * gh);
            gr.setColor(new Color(0x1010D0));
            gr.drawLine(mx - 5, my - 5, mx + 5, my + 5);
            gr.drawLine(mx - 5, my + 5, mx + 5, my - 5);
        }
        // Legend: slope ramp.
        int lx = left + gw + 30;
        for (int y = 0; y < gh; y++) {
            gr.setColor(slopeColour(90.0 * (gh - 1 - y) / (gh - 1)));
            gr.fillRect(lx, top + y, 18, 1);
        }
        gr.setColor(Color.BLACK);
        gr.setStroke(new BasicStroke(1f));
        gr.drawRect(lx, top, 18, gh);
        for (int d = 0; d <= 90; d += 15) {
            gr.drawString(d + "°", lx + 24, top + (int) Math.round((90 - d) / 90.0 * gh) + 4);
        }
        gr.drawString("slope", lx - 2, top - 8);
        gr.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 14));
        gr.drawString("Rest points of " + ds.count() + " releases on " + body.name() + " (white dots; red + = below "
            + "the release point, blue x = mean)", left, 24);
        gr.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 11));
        gr.drawString(String.format(Locale.ROOT, "%d at rest, %d escaped, %d timed out; slope map (lat/lon about the "
            + "spin pole, outermost surface); field: %s", s.rest(), s.escaped(), s.timedOut() + s.bounceLimit(),
            field.describe()), left, top + gh + 40);
        gr.drawString("Caution: results inform but do not replace the responsible flight-dynamics analysis; verify "
            + "independently before operational use.", left, top + gh + 60);
        gr.dispose();
        TrajectoryCommand.writeImage(file, img);
    }

    private static final int[] SLOPE_STOPS = {0x2F5A8C, 0x35967A, 0xC9B85A, 0xD7876E, 0x9E2A22};

    private static Color slopeColour(double deg) {
        double t = Math.max(0, Math.min(1, deg / 90)) * (SLOPE_STOPS.length - 1);
        int i = Math.min(SLOPE_STOPS.length - 2, (int) Math.floor(t));
        double u = t - i;
        int a = SLOPE_STOPS[i];
        int b = SLOPE_STOPS[i + 1];
        int rr = (int) Math.round(((a >> 16) & 255) * (1 - u) + ((b >> 16) & 255) * u);
        int gg = (int) Math.round(((a >> 8) & 255) * (1 - u) + ((b >> 8) & 255) * u);
        int bb = (int) Math.round((a & 255) * (1 - u) + (b & 255) * u);
        return new Color(rr, gg, bb);
    }

    private void report(PrintWriter o, BodyModel body, FieldModel field, FieldCheck check, DeploymentSummary s,
                        double seconds) {
        o.printf(Locale.ROOT, "Body         %s (%s), %d facets%n", body.name(), body.source(), body.mesh().facetCount());
        o.printf(Locale.ROOT, "Field        %s, tolerance %s%n", field.describe(),
            Double.isNaN(field.tolerance()) ? "exact" : String.format(Locale.ROOT, "%.1e", field.tolerance()));
        o.printf(Locale.ROOT, "Integrator   Dormand-Prince 8(5,3), relative tolerance %.1e (absolute: the same times "
            + "the body radius and sqrt(GM/radius))%s%n", integratorTolerance,
            integratorTolerance == DEFAULT_INTEGRATOR_TOLERANCE && Double.valueOf(DEFAULT_FIELD_TOLERANCE)
                .equals(model.tolerance) ? "; deploy defaults, accuracy measured in docs/trajectories.md" : "");
        if (check.samples() > 0) {
            o.println("Field check  " + check.line());
        }
        double n = s.count();
        o.printf(Locale.ROOT, "Outcomes     %d samples: %.1f%% at rest, %.1f%% escaped, %.1f%% timed out, %.1f%% bounce "
            + "limit, %.1f%% released inside%n", s.count(), 100 * s.rest() / n, 100 * s.escaped() / n,
            100 * s.timedOut() / n, 100 * s.bounceLimit() / n, 100 * s.startInside() / n);
        if (s.rest() > 0) {
            o.printf(Locale.ROOT, "Rest points  mean lat %.3f lon %.3f deg; 1-sigma ellipse %.4g x %.4g m, major axis "
                + "%.1f deg east of north%n", s.meanLatDeg(), s.meanLonDeg(), s.sigmaMajor(), s.sigmaMinor(),
                s.azimuthDeg());
            o.printf(Locale.ROOT, "At rest      time mean %.5g s max %.5g s; bounces mean %.2f max %d; slope mean %.1f "
                + "max %.1f deg%n", s.meanTime(), s.maxTime(), s.meanBounces(), s.maxBounces(), s.meanSlopeDeg(),
                s.maxSlopeDeg());
        }
        o.printf(Locale.ROOT, "First impact speed mean %.4g max %.4g m/s; max Jacobi drift per arc %.2e (relative)%n",
            s.meanFirstSpeed(), s.maxFirstSpeed(), s.maxJacobiDrift());
        if (mergeShards != null) {
            o.printf(Locale.ROOT, "Merged       %d shards read in %.3f s (%d steps, %.0f field evaluations per sample "
                + "in the shards); outputs in %s%n", mergeShards.size(), seconds, s.totalSteps(),
                s.totalEvaluations() / n, out.toAbsolutePath());
        } else {
            o.printf(Locale.ROOT, "Speed        %.3f s, %d steps (%.0f steps/s), %.0f field evaluations per sample; "
                + "outputs in %s%n", seconds, s.totalSteps(), s.totalSteps() / Math.max(seconds, 1e-9),
                s.totalEvaluations() / n, out.toAbsolutePath());
        }
        o.println("Caution: " + TrajectoryCommand.CAUTION);
        o.flush();
    }
}
