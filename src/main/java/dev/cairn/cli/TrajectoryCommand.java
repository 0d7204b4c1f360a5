package dev.cairn.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.gravity.FieldCheck;
import dev.cairn.gravity.FieldModel;
import dev.cairn.io.AtomicFiles;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.motion.Frame;
import dev.cairn.motion.MotionEvent;
import dev.cairn.motion.MotionSettings;
import dev.cairn.motion.Propagator;
import dev.cairn.motion.ThirdBody;
import dev.cairn.motion.Trajectory;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.util.ParallelChunks;
import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Graphics2D;
import java.awt.RenderingHints;
import java.awt.geom.Path2D;
import java.awt.image.BufferedImage;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
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

/**
 * {@code cairn trajectory}: propagates initial states from a CSV file near the spinning body, with impact, escape and
 * altitude events; writes one CSV per trajectory, {@code events.json}, a PNG of the paths in three planes and a
 * legacy VTK file of line segments. See docs/trajectories.md.
 */
@Command(name = "trajectory", mixinStandardHelpOptions = true,
    header = "Propagate trajectories near the body (impact, escape, altitude events; Jacobi drift).",
    description = {"Propagate initial states (CSV rows x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s, header optional) in the",
        "body's gravity field, in the rotating body frame or the inertial frame aligned with it at t = 0.",
        "Writes trajectory-NNNN.csv (body frame), events.json, paths.png and trajectories.vtk to --out.",
        "SI units, model (body-fixed) frame, U > 0, g = grad U; see docs/trajectories.md.",
        "Caution: results inform but do not replace the responsible flight-dynamics analysis; verify them",
        "independently before operational use."})
public final class TrajectoryCommand implements Callable<Integer> {
    /** The caution every output carries. */
    static final String CAUTION = "Results inform but do not replace the responsible flight-dynamics analysis; "
        + "they must be verified independently before operational use; mission rules and the responsible "
        + "flight-dynamics authority decide.";
    /** Most initial states per run. */
    static final int MAX_STATES = 100_000;
    /** Most output rows per trajectory. */
    static final long MAX_ROWS = 2_000_000;

    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spinOptions = new SpinOptions();

    @Mixin
    MasconOptions fieldChoice = new MasconOptions();

    @Option(names = "--states", required = true, paramLabel = "FILE.csv",
        description = "Initial states, one per row: x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s in the chosen frame at t = 0 "
            + "(header line optional; # comments and blank lines skipped).")
    Path states;

    @Option(names = "--duration", required = true, paramLabel = "T",
        description = "Time span, with unit suffix s, min, h or d (plain numbers are seconds).")
    String duration;

    @Option(names = "--frame", paramLabel = "body|inertial", description = "Frame of the initial states and of the "
        + "equations of motion (default ${DEFAULT-VALUE}). Output CSVs are in the body frame; inertial adds columns.")
    String frameName = "body";

    @Option(names = "--step", paramLabel = "S", description = "Output step, with unit suffix (default: duration/1000).")
    String step;

    @Option(names = "--srp", paramLabel = "AX,AY,AZ", split = ",", description = "Constant extra acceleration fixed "
        + "in the inertial frame (e.g. solar radiation pressure), m/s^2.")
    double[] srp;

    @Option(names = "--third-body", paramLabel = "GM,DIST", split = ",", description = "Third-body point mass on a "
        + "circular orbit in the spin-equator plane, starting on the equator at longitude 0: GM (m^3/s^2), distance (m).")
    double[] thirdBody;

    @Option(names = "--altitudes", paramLabel = "M,M,...", split = ",", description = "Altitude thresholds above the "
        + "surface whose crossings are events, m.")
    double[] altitudes;

    @Option(names = "--escape-radius", paramLabel = "M", description = "Radius about the centre of mass beyond which "
        + "positive two-body energy is an escape, m (default: 10 body radii).")
    Double escapeRadius;

    @Option(names = "--integrator-tolerance", paramLabel = "REL", description = "Relative (and scaled absolute) local "
        + "error per step of the Dormand-Prince 8(5,3) integrator, 1e-15 to 1e-3 (default ${DEFAULT-VALUE}).")
    double integratorTolerance = MotionSettings.DEFAULT_RELATIVE_TOLERANCE;

    @Option(names = "--table", paramLabel = "FILE", description = "Use an acceleration table of this body (from "
        + "'cairn table'; tricubic interpolation, the body's field outside the table) instead of the body's field.")
    Path table;

    @Option(names = "--out", paramLabel = "DIR", description = "Output directory (default: trajectory-out/).")
    Path out = Paths.get("trajectory-out");

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (results do not depend on it; "
        + "default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        System.setProperty("java.awt.headless", "true");
        double dur = parseDuration(duration, "--duration");
        double stepS = step == null ? dur / 1000 : parseDuration(step, "--step");
        if (dur / stepS > MAX_ROWS) {
            throw new InputException("--step: " + step + " gives more than " + MAX_ROWS + " rows per trajectory");
        }
        Frame frame = parseFrame(frameName);
        checkThreads(threads);
        spinOptions.periodSeconds();
        spinOptions.axis();
        List<double[]> initial = readStates(states);
        double bytes = initial.size() * (dur / stepS + 2) * Trajectory.COLUMNS * 8.0;
        if (bytes > 0.5 * Runtime.getRuntime().maxMemory()) {
            throw new InputException("--step: " + initial.size() + " trajectories of " + (long) (dur / stepS + 1)
                + " rows need about " + (long) (bytes / 1e6) + " MB, more than half the memory available (raise "
                + "--step or set CAIRN_JAVA_OPTS=-Xmx...)");
        }
        BodyModel body = model.load(spinOptions);
        PrintWriter err = spec.commandLine().getErr();
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        FieldModel field;
        if (fieldChoice.polyhedron()) {
            field = field(body, table);
        } else {
            if (table != null) {
                throw new InputException("--table: tables are of the polyhedron field; leave out --model, or --table");
            }
            field = fieldChoice.build(body, Long.MAX_VALUE, threads, err);
        }
        MotionSettings ms = settings(frame, body);
        Propagator prop = propagator(body, field, ms);
        for (int i = 0; i < initial.size(); i++) {
            double[] s = initial.get(i);
            double alt = prop.altitude(s[0], s[1], s[2]);
            if (!(alt > 0)) {
                throw new InputException(states + ":" + (int) s[6] + ": initial position is inside the body or on its "
                    + "surface (" + fmt(-alt) + " m below it)");
            }
        }
        Trajectory[] result = new Trajectory[initial.size()];
        long t0 = System.nanoTime();
        int per = ParallelChunks.CHUNK; // one trajectory per chunk: trajectories are long, balance them one by one
        try (ProgressBar bar = new ProgressBar("trajectory")) {
            ParallelChunks.run(initial.size() * per, threads, () -> null, (ctx, from, to) -> {
                for (int i = (from + per - 1) / per; i * per < to; i++) {
                    result[i] = prop.propagate(java.util.Arrays.copyOf(initial.get(i), 6), dur, stepS);
                }
            }, bar);
        }
        double seconds = (System.nanoTime() - t0) / 1e9;
        if (field instanceof dev.cairn.gravity.HarmonicField h && h.insideCount() > 0) {
            err.println(String.format(Locale.ROOT, "cairn: warning: %d field evaluation(s) of the trajectories lay "
                + "inside the Brillouin sphere (radius %.6g m) of the spherical-harmonic model, where the series "
                + "diverges: those parts of the paths are not valid", h.insideCount(), h.convergenceRadius()));
        }
        if (!(field instanceof dev.cairn.gravity.HarmonicField)) {
            MasconOptions.warnTooClose(field, initial.size(), err);
        }
        FieldCheck check = FieldCheck.measure(field, samplePositions(result), FieldCheck.DEFAULT_SAMPLES, 1, threads);
        writeOutputs(body, field, prop, initial, result, frame, dur, stepS, check, seconds);
        report(spec.commandLine().getOut(), body, field, check, result, seconds);
        return 0;
    }

    private MotionSettings settings(Frame frame, BodyModel body) {
        MotionSettings ms = MotionSettings.defaults(frame);
        if (!(integratorTolerance >= 1e-15 && integratorTolerance <= 1e-3)) {
            throw new InputException("--integrator-tolerance: must be in [1e-15, 1e-3], got " + integratorTolerance);
        }
        ms = ms.withTolerances(integratorTolerance, integratorTolerance);
        if (srp != null) {
            ms = ms.withSrp(vector(srp, 3, "--srp"));
        }
        if (thirdBody != null) {
            double[] tb = vector(thirdBody, 2, "--third-body");
            if (!(tb[0] > 0 && tb[1] > 0)) {
                throw new InputException("--third-body: GM and distance must be positive, got " + tb[0] + "," + tb[1]);
            }
            RotatingFrame rf = rotatingFrame(body);
            double[] d = new double[3];
            rf.direction(0, 0, d, 0);
            ms = ms.withThirdBody(new ThirdBody(tb[0], tb[1], d, rf.axis()));
        }
        if (altitudes != null) {
            for (double h : altitudes) {
                if (!Double.isFinite(h)) {
                    throw new InputException("--altitudes: thresholds must be finite numbers of metres, got " + h);
                }
            }
            ms = ms.withAltitudes(altitudes);
        }
        if (escapeRadius != null) {
            if (!(escapeRadius > 0 && Double.isFinite(escapeRadius))) {
                throw new InputException("--escape-radius: must be a positive number of metres, got " + escapeRadius);
            }
            ms = ms.withEscapeRadius(escapeRadius);
        }
        return ms;
    }

    /**
     * The body's field, or an interpolated table of it (refused when the table was made for another model file or
     * another GM); points outside the table use the body's field.
     */
    static FieldModel field(BodyModel body, Path tableFile) {
        FieldModel exact = body.fieldModel();
        if (tableFile == null) {
            return exact;
        }
        dev.cairn.tables.Table t = dev.cairn.tables.TableFiles.read(tableFile);
        Object m = t.metadata().get("model");
        String sha = m instanceof Map<?, ?> mm && mm.get("sha256") != null ? mm.get("sha256").toString() : null;
        if (sha == null || !sha.equals(dev.cairn.tables.TableFiles.sha256(body.source()))) {
            throw new InputException(tableFile + ": this table was made for another model file than " + body.source());
        }
        Object gm = m instanceof Map<?, ?> mm ? mm.get("gm_m3_s2") : null;
        if (!(gm instanceof Number num) || Math.abs(num.doubleValue() / body.gm() - 1) > 1e-12) {
            throw new InputException(tableFile + ": this table was made for GM " + gm + " m^3/s^2, the body has "
                + body.gm());
        }
        try {
            return new dev.cairn.tables.TableField(t, exact);
        } catch (IllegalArgumentException e) {
            throw new InputException(tableFile + ": " + e.getMessage());
        }
    }

    static RotatingFrame rotatingFrame(BodyModel body) {
        return new RotatingFrame(body.spin(), body.massProperties().centerOfMass());
    }

    static Propagator propagator(BodyModel body, FieldModel field, MotionSettings ms) {
        body.requireFitForGravity();
        return new Propagator(field, body.mesh(), rotatingFrame(body), ms);
    }

    static void checkThreads(int threads) {
        if (threads < 1 || threads > 4096) {
            throw new InputException("--threads: must be between 1 and 4096, got " + threads);
        }
    }

    static Frame parseFrame(String name) {
        return switch (name.toLowerCase(Locale.ROOT)) {
            case "body" -> Frame.BODY;
            case "inertial" -> Frame.INERTIAL;
            default -> throw new InputException("--frame: unknown frame '" + name + "' (use body or inertial)");
        };
    }

    /** Checks an option vector: exactly n finite numbers. */
    static double[] vector(double[] v, int n, String option) {
        if (v.length != n) {
            throw new InputException(option + ": expected " + n + " comma-separated numbers, got " + v.length);
        }
        for (double x : v) {
            if (!Double.isFinite(x)) {
                throw new InputException(option + ": values must be finite numbers, got " + x);
            }
        }
        return v.clone();
    }

    /** Parses a time span "90", "90s", "15min", "2.5h", "3d" into seconds; positive and finite. */
    static double parseDuration(String text, String option) {
        String t = text.trim().toLowerCase(Locale.ROOT);
        double factor = 1;
        String num = t;
        int i = 0;
        while (i < t.length() && (Character.isDigit(t.charAt(i)) || ".+-eE".indexOf(t.charAt(i)) >= 0)) {
            // exponents: an 'e' followed by a digit or sign belongs to the number
            if ((t.charAt(i) == 'e' || t.charAt(i) == 'E') && !(i + 1 < t.length()
                && (Character.isDigit(t.charAt(i + 1)) || t.charAt(i + 1) == '-' || t.charAt(i + 1) == '+'))) {
                break;
            }
            i++;
        }
        String suffix = t.substring(i).trim();
        num = t.substring(0, i);
        switch (suffix) {
            case "", "s" -> factor = 1;
            case "min" -> factor = 60;
            case "h" -> factor = 3600;
            case "d" -> factor = 86400;
            default -> throw new InputException(option + ": unknown unit suffix '" + suffix + "' in '" + text
                + "' (use s, min, h or d)");
        }
        double v;
        try {
            v = Double.parseDouble(num) * factor;
        } catch (NumberFormatException e) {
            throw new InputException(option + ": '" + text + "' is not a time span (e.g. 3600, 90min, 2.5h, 3d)");
        }
        if (!(v > 0) || !Double.isFinite(v)) {
            throw new InputException(option + ": must be positive and finite, got '" + text + "'");
        }
        if (v > 1e12) {
            throw new InputException(option + ": " + text + " is longer than 1e12 s");
        }
        return v;
    }

    /** Reads initial states: 6 finite numbers per row (plus the line number as a 7th value). */
    static List<double[]> readStates(Path file) {
        List<String> lines;
        try {
            if (Files.size(file) > 200_000_000L) {
                throw new InputException(file + ": larger than 200 MB");
            }
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (java.nio.file.NoSuchFileException e) {
            throw new InputException(file + ": no such file");
        } catch (IOException e) {
            throw new InputException(file + ": cannot read: " + e.getMessage());
        }
        List<double[]> out = new ArrayList<>();
        boolean first = true;
        for (int ln = 0; ln < lines.size(); ln++) {
            String line = lines.get(ln).strip();
            if (line.isEmpty() || line.startsWith("#")) {
                continue;
            }
            String[] f = line.split("\\s*,\\s*");
            if (first && !f[0].isEmpty() && Character.isLetter(f[0].charAt(0)) && !f[0].equalsIgnoreCase("nan")
                && !f[0].toLowerCase(Locale.ROOT).startsWith("inf")) {
                first = false;
                continue; // header
            }
            first = false;
            if (f.length != 6) {
                throw new InputException(file + ":" + (ln + 1) + ": expected 6 values x_m,y_m,z_m,vx_m_s,vy_m_s,"
                    + "vz_m_s, got " + f.length);
            }
            double[] s = new double[7];
            for (int k = 0; k < 6; k++) {
                try {
                    s[k] = Double.parseDouble(f[k]);
                } catch (NumberFormatException e) {
                    throw new InputException(file + ":" + (ln + 1) + ": value " + (k + 1) + " '" + f[k]
                        + "' is not a number");
                }
                if (!Double.isFinite(s[k])) {
                    throw new InputException(file + ":" + (ln + 1) + ": value " + (k + 1) + " is not finite ('"
                        + f[k] + "')");
                }
            }
            s[6] = ln + 1;
            out.add(s);
            if (out.size() > MAX_STATES) {
                throw new InputException(file + ": more than " + MAX_STATES + " initial states");
            }
        }
        if (out.isEmpty()) {
            throw new InputException(file + ": no initial states");
        }
        return out;
    }

    /** Up to a few thousand output positions of the trajectories, for the sampled field check. */
    private static double[] samplePositions(Trajectory[] ts) {
        List<double[]> pts = new ArrayList<>();
        for (Trajectory t : ts) {
            int n = t.rowCount();
            int stride = Math.max(1, n / 50);
            for (int r = 0; r < n; r += stride) {
                int o = r * Trajectory.COLUMNS;
                pts.add(new double[] {t.rows()[o + 1], t.rows()[o + 2], t.rows()[o + 3]});
            }
        }
        double[] xyz = new double[3 * pts.size()];
        for (int i = 0; i < pts.size(); i++) {
            System.arraycopy(pts.get(i), 0, xyz, 3 * i, 3);
        }
        return xyz;
    }

    static String fmt(double v) {
        return String.format(Locale.ROOT, "%.6g", v);
    }

    /** NaN and infinities as JSON null. */
    static Object num(double v) {
        return Double.isFinite(v) ? v : null;
    }

    static Map<String, Object> fieldJson(FieldModel field, FieldCheck check) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("model", field.describe());
        m.put("tolerance", num(field.tolerance()));
        m.put("exact", field.exactModel() == field);
        m.put("gm_m3_s2", field.gm());
        if (check != null) {
            m.put("accuracy_check", check.json());
        }
        return m;
    }

    static Map<String, Object> integratorJson(Propagator p) {
        MotionSettings s = p.settings();
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("method", "Dormand-Prince 8(5,3), Commons Math 3.6.1, dense output");
        m.put("frame", s.frame().name().toLowerCase(Locale.ROOT));
        m.put("relative_tolerance", s.relativeTolerance());
        m.put("absolute_tolerance_position_m", s.absoluteScale() * p.boundingRadius());
        m.put("absolute_tolerance_velocity_m_s", s.absoluteScale() * Math.sqrt(p.field().gm() / p.boundingRadius()));
        m.put("chord_sagitta_m", s.chordTolerance() * p.boundingRadius());
        m.put("escape_radius_m", p.escapeRadius());
        m.put("srp_inertial_m_s2", s.srpInertial());
        ThirdBody tb = s.thirdBody();
        m.put("third_body", tb == null ? null : Map.of("gm_m3_s2", tb.gm(), "distance_m", tb.distance()));
        m.put("altitude_thresholds_m", s.altitudes());
        m.put("inside_trial_points", p.isStrict() ? "strict: the body's own field at every trial point"
            : "the exterior field continued across the facet entered since the step start (impact found exactly)");
        return m;
    }

    static Map<String, Object> conventions() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("units", "SI (m, s, m/s, m^2/s^2)");
        m.put("frame", "model (body-fixed) frame; inertial frame aligned with it at t = 0, same origin");
        m.put("potential", "U > 0, acceleration = grad U (Werner-Scheeres)");
        m.put("jacobi", "J = |v_rel|^2/2 - U - omega^2 |r_perp|^2/2 (body frame)");
        m.put("angles", "degrees; latitude/longitude about the spin pole, east longitude from +x");
        return m;
    }

    static void writeJson(Path file, Object value) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        AtomicFiles.write(file, o -> m.writeValue(new java.io.FilterOutputStream(o) {
            @Override
            public void close() throws IOException {
                flush(); // the stream is closed by AtomicFiles
            }
        }, value));
    }

    static Map<String, Object> eventJson(MotionEvent e) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("kind", e.kind().key());
        m.put("t_s", e.t());
        double[] s = e.state();
        m.put("position_m", new double[] {s[0], s[1], s[2]});
        m.put("velocity_m_s", new double[] {s[3], s[4], s[5]});
        m.put("lat_deg", num(e.latDeg()));
        m.put("lon_deg", num(e.lonDeg()));
        m.put("speed_m_s", e.speed());
        if (e.kind() == MotionEvent.Kind.IMPACT) {
            m.put("facet", e.facet());
            m.put("normal_speed_m_s", e.normalSpeed());
            m.put("tangential_speed_m_s", e.tangentialSpeed());
            m.put("incidence_deg", e.incidenceDeg());
            m.put("facet_normal", e.normal());
        }
        if (e.kind() == MotionEvent.Kind.ALTITUDE) {
            m.put("altitude_m", e.threshold());
            m.put("direction", e.direction() > 0 ? "up" : "down");
        }
        if (e.kind() == MotionEvent.Kind.ESCAPE) {
            m.put("escape_radius_m", e.threshold());
        }
        m.put("two_body_energy_m2_s2", e.twoBodyEnergy());
        return m;
    }

    private void writeOutputs(BodyModel body, FieldModel field, Propagator prop, List<double[]> initial,
                              Trajectory[] ts, Frame frame, double dur, double stepS, FieldCheck check,
                              double seconds) {
        boolean inertial = frame == Frame.INERTIAL;
        List<Object> list = new ArrayList<>();
        for (int i = 0; i < ts.length; i++) {
            Trajectory t = ts[i];
            Path csv = out.resolve(csvName(i));
            AtomicFiles.write(csv, o -> {
                StringBuilder sb = new StringBuilder(1 << 16);
                sb.append("t_s,x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s,jacobi_m2_s2");
                if (inertial) {
                    sb.append(",xi_m,yi_m,zi_m,vxi_m_s,vyi_m_s,vzi_m_s");
                }
                sb.append('\n');
                double[] r = t.rows();
                int cols = inertial ? 14 : 8;
                for (int row = 0; row < t.rowCount(); row++) {
                    for (int c = 0; c < cols; c++) {
                        if (c > 0) {
                            sb.append(',');
                        }
                        sb.append(r[row * Trajectory.COLUMNS + c]);
                    }
                    sb.append('\n');
                    if (sb.length() > 1 << 20) {
                        o.write(sb.toString().getBytes(StandardCharsets.UTF_8));
                        sb.setLength(0);
                    }
                }
                o.write(sb.toString().getBytes(StandardCharsets.UTF_8));
            });
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("index", i + 1);
            m.put("states_line", (int) initial.get(i)[6]);
            m.put("file", csv.getFileName().toString());
            m.put("outcome", t.outcome().key());
            m.put("end_time_s", t.endTime());
            m.put("jacobi0_m2_s2", t.jacobi0());
            m.put("max_jacobi_drift_m2_s2", t.maxJacobiDrift());
            m.put("max_jacobi_drift_relative", num(t.maxJacobiDriftRelative()));
            m.put("steps", t.steps());
            m.put("field_evaluations", t.fieldEvaluations());
            List<Object> ev = new ArrayList<>();
            for (MotionEvent e : t.events()) {
                ev.add(eventJson(e));
            }
            m.put("events", ev);
            list.add(m);
        }
        Map<String, Object> root = new LinkedHashMap<>();
        root.put("caution", CAUTION);
        root.put("conventions", conventions());
        root.put("body", body.name());
        root.put("source", body.source().toString());
        root.put("spin_period_s", num(body.spin().periodSeconds()));
        root.put("spin_axis", body.spin().axis());
        root.put("field", fieldJson(field, check));
        root.put("integrator", integratorJson(prop));
        root.put("duration_s", dur);
        root.put("output_step_s", stepS);
        root.put("note", inertial ? "CSV columns x..vz are body-frame values; xi..vzi inertial" : null);
        root.put("seconds", seconds);
        root.put("trajectories", list);
        writeJson(out.resolve("events.json"), root);
        writePng(out.resolve("paths.png"), body, ts);
        writeVtk(out.resolve("trajectories.vtk"), ts);
    }

    static String csvName(int i) {
        return String.format(Locale.ROOT, "trajectory-%04d.csv", i + 1);
    }

    /**
     * Legacy VTK 3.0 ASCII unstructured grid (opens unaided in VTK, ParaView and meshio 5, which reads no
     * polylines): each trajectory's body-frame points joined by line segments (VTK_LINE, cell type 3), the
     * trajectory number (1-based, as in the CSV names) as cell data, time as point data.
     */
    static void writeVtk(Path file, Trajectory[] ts) {
        AtomicFiles.write(file, o -> {
            long n = 0;
            long segments = 0;
            for (Trajectory t : ts) {
                n += t.rowCount();
                segments += Math.max(0, t.rowCount() - 1);
            }
            StringBuilder sb = new StringBuilder();
            sb.append("# vtk DataFile Version 3.0\ncairn trajectories, body frame, metres\nASCII\n"
                + "DATASET UNSTRUCTURED_GRID\n");
            sb.append("POINTS ").append(n).append(" double\n");
            for (Trajectory t : ts) {
                for (int r = 0; r < t.rowCount(); r++) {
                    int q = r * Trajectory.COLUMNS;
                    sb.append(t.rows()[q + 1]).append(' ').append(t.rows()[q + 2]).append(' ')
                        .append(t.rows()[q + 3]).append('\n');
                }
                flushIf(o, sb);
            }
            sb.append("CELLS ").append(segments).append(' ').append(3 * segments).append('\n');
            long base = 0;
            for (Trajectory t : ts) {
                for (int r = 0; r + 1 < t.rowCount(); r++) {
                    sb.append("2 ").append(base + r).append(' ').append(base + r + 1).append('\n');
                }
                base += t.rowCount();
                flushIf(o, sb);
            }
            sb.append("CELL_TYPES ").append(segments).append('\n');
            for (long k = 0; k < segments; k++) {
                sb.append("3\n");
                if ((k & 0xFFFF) == 0) {
                    flushIf(o, sb);
                }
            }
            sb.append("CELL_DATA ").append(segments).append("\nSCALARS trajectory int 1\nLOOKUP_TABLE default\n");
            for (int i = 0; i < ts.length; i++) {
                for (int r = 0; r + 1 < ts[i].rowCount(); r++) {
                    sb.append(i + 1).append('\n');
                }
                flushIf(o, sb);
            }
            sb.append("POINT_DATA ").append(n).append("\nSCALARS t_s double 1\nLOOKUP_TABLE default\n");
            for (Trajectory t : ts) {
                for (int r = 0; r < t.rowCount(); r++) {
                    sb.append(t.rows()[r * Trajectory.COLUMNS]).append('\n');
                }
                flushIf(o, sb);
            }
            o.write(sb.toString().getBytes(StandardCharsets.US_ASCII));
        });
    }

    private static void flushIf(java.io.OutputStream o, StringBuilder sb) throws IOException {
        if (sb.length() > 1 << 20) {
            o.write(sb.toString().getBytes(StandardCharsets.US_ASCII));
            sb.setLength(0);
        }
    }

    static final Color[] PALETTE = {new Color(0x1F5FA8), new Color(0xC0392B), new Color(0x2E8B57),
        new Color(0x8E44AD), new Color(0xD4810A), new Color(0x17899B), new Color(0x7A5230), new Color(0xB0306A)};

    static Graphics2D graphics(BufferedImage img) {
        Graphics2D g = img.createGraphics();
        g.setRenderingHint(RenderingHints.KEY_ANTIALIASING, RenderingHints.VALUE_ANTIALIAS_ON);
        g.setRenderingHint(RenderingHints.KEY_TEXT_ANTIALIASING, RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
        g.setColor(Color.WHITE);
        g.fillRect(0, 0, img.getWidth(), img.getHeight());
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 12));
        return g;
    }

    static void writeImage(Path file, BufferedImage img) {
        AtomicFiles.write(file, o -> {
            if (!javax.imageio.ImageIO.write(img, "png", o)) {
                throw new IOException("no PNG writer");
            }
        });
    }

    /** Panel size of the path plot, pixels. */
    static final int PANEL = 420;

    /** The paths over the body's projected outline in the x-y, x-z and y-z planes of the body frame. */
    static void writePng(Path file, BodyModel body, Trajectory[] ts) {
        int w = 3 * PANEL + 40;
        int h = PANEL + 110;
        BufferedImage img = new BufferedImage(w, h, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = graphics(img);
        TriangleMesh mesh = body.mesh();
        double[] bb = mesh.boundingBox();
        double ext = 0;
        for (int a = 0; a < 3; a++) {
            ext = Math.max(ext, Math.max(Math.abs(bb[a]), Math.abs(bb[3 + a])));
        }
        double pathExt = 0;
        for (Trajectory t : ts) {
            for (int r = 0; r < t.rowCount(); r++) {
                for (int a = 0; a < 3; a++) {
                    pathExt = Math.max(pathExt, Math.abs(t.rows()[r * Trajectory.COLUMNS + 1 + a]));
                }
            }
        }
        double half = Math.max(1.15 * ext, 1.05 * pathExt);
        int[][] planes = {{0, 1}, {0, 2}, {1, 2}};
        String[] names = {"x-y (view from +z)", "x-z (view from -y)", "y-z (view from +x)"};
        String[] axes = {"x", "y", "z"};
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        for (int p = 0; p < 3; p++) {
            int ox = 20 + p * (PANEL + 0);
            int oy = 40;
            int a = planes[p][0];
            int b = planes[p][1];
            double sc = (PANEL - 30) / (2 * half);
            double cx = ox + PANEL / 2.0;
            double cy = oy + PANEL / 2.0;
            g.setColor(new Color(0xF4F4F4));
            g.fillRect(ox + 5, oy, PANEL - 10, PANEL - 10);
            g.setColor(new Color(0xB8B8B8));
            Path2D.Double poly = new Path2D.Double();
            for (int f = 0; f < mesh.facetCount(); f++) {
                poly.reset();
                for (int k = 0; k < 3; k++) {
                    int v = 3 * tri[3 * f + k];
                    double px = cx + sc * xyz[v + a];
                    double py = cy - sc * xyz[v + b];
                    if (k == 0) {
                        poly.moveTo(px, py);
                    } else {
                        poly.lineTo(px, py);
                    }
                }
                poly.closePath();
                g.fill(poly);
            }
            g.setStroke(new BasicStroke(1.4f));
            for (int i = 0; i < ts.length; i++) {
                Trajectory t = ts[i];
                g.setColor(PALETTE[i % PALETTE.length]);
                Path2D.Double line = new Path2D.Double();
                for (int r = 0; r < t.rowCount(); r++) {
                    int q = r * Trajectory.COLUMNS;
                    double px = cx + sc * t.rows()[q + 1 + a];
                    double py = cy - sc * t.rows()[q + 1 + b];
                    if (r == 0) {
                        line.moveTo(px, py);
                        g.drawOval((int) px - 3, (int) py - 3, 6, 6);
                    } else {
                        line.lineTo(px, py);
                    }
                }
                g.draw(line);
                MotionEvent end = t.terminal();
                if (end != null && end.kind() == MotionEvent.Kind.IMPACT) {
                    double[] s = end.state();
                    int px = (int) Math.round(cx + sc * s[a]);
                    int py = (int) Math.round(cy - sc * s[b]);
                    g.drawLine(px - 4, py - 4, px + 4, py + 4);
                    g.drawLine(px - 4, py + 4, px + 4, py - 4);
                }
            }
            g.setColor(Color.BLACK);
            g.setStroke(new BasicStroke(1f));
            g.drawRect(ox + 5, oy, PANEL - 10, PANEL - 10);
            g.drawString(names[p] + ", half-width " + fmt(half) + " m", ox + 8, oy - 6);
            g.drawString(axes[a] + " →", ox + PANEL - 40, oy + PANEL - 14);
            g.drawString("↑ " + axes[b], ox + 10, oy + 14);
        }
        g.setColor(Color.BLACK);
        g.setFont(new Font(Font.SANS_SERIF, Font.BOLD, 14));
        g.drawString("Trajectories near " + body.name() + " (body frame; circle = start, cross = impact)", 20, 22);
        g.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 11));
        g.drawString("Caution: " + CAUTION.substring(0, CAUTION.indexOf(';')) + "; verify independently before "
            + "operational use.", 20, h - 40);
        g.drawString(ts.length + " trajectories; body outline = projected facets", 20, h - 22);
        g.dispose();
        writeImage(file, img);
    }

    private void report(PrintWriter o, BodyModel body, FieldModel field, FieldCheck check, Trajectory[] ts,
                        double seconds) {
        long steps = 0;
        long evals = 0;
        int[] outcomes = new int[Trajectory.Outcome.values().length];
        for (Trajectory t : ts) {
            steps += t.steps();
            evals += t.fieldEvaluations();
            outcomes[t.outcome().ordinal()]++;
        }
        o.printf(Locale.ROOT, "Body         %s (%s), %d facets%n", body.name(), body.source(), body.mesh().facetCount());
        o.printf(Locale.ROOT, "Field        %s, tolerance %s%n", field.describe(),
            Double.isNaN(field.tolerance()) ? "exact" : String.format(Locale.ROOT, "%.1e", field.tolerance()));
        if (check.samples() > 0) {
            o.println("Field check  " + check.line());
        }
        for (int i = 0; i < Math.min(ts.length, 20); i++) {
            Trajectory t = ts[i];
            MotionEvent e = t.terminal();
            o.printf(Locale.ROOT, "  #%-4d %-10s t_end %-12s Jacobi drift %.2e (rel %.2e)%s%n", i + 1, t.outcome().key(),
                fmt(t.endTime()), t.maxJacobiDrift(), t.maxJacobiDriftRelative(),
                e != null && e.kind() == MotionEvent.Kind.IMPACT ? String.format(Locale.ROOT,
                    "  impact lat %.2f lon %.2f speed %.4g m/s incidence %.1f deg", e.latDeg(), e.lonDeg(), e.speed(),
                    e.incidenceDeg()) : "");
        }
        if (ts.length > 20) {
            o.println("  ... (" + ts.length + " trajectories; all in events.json)");
        }
        StringBuilder sb = new StringBuilder();
        for (Trajectory.Outcome oc : Trajectory.Outcome.values()) {
            if (outcomes[oc.ordinal()] > 0) {
                sb.append(sb.length() > 0 ? ", " : "").append(outcomes[oc.ordinal()]).append(' ').append(oc.key());
            }
        }
        o.printf(Locale.ROOT, "Outcomes     %s%n", sb);
        o.printf(Locale.ROOT, "Speed        %.3f s, %d steps (%.0f steps/s), %.0f field evaluations per trajectory; "
            + "outputs in %s%n", seconds, steps, steps / Math.max(seconds, 1e-9), (double) evals / ts.length,
            out.toAbsolutePath());
        o.println("Caution: " + CAUTION);
        o.flush();
    }
}
