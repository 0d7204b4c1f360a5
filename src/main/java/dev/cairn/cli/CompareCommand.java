package dev.cairn.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.io.AtomicFiles;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.body.ModelLoader;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mass.MassProperties;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
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
 * {@code cairn compare}: two field models of the same body (e.g. the polyhedron against mascon sets of several sizes,
 * or two density assumptions) evaluated on shells: at given altitudes above the surface (exact distance to the
 * surface, one point per direction from the centre of mass; or, with {@code --radial-altitudes}, measured along the
 * radial direction beyond the outermost surface crossing) or on spheres of given radii. Reports the relative acceleration error {@code |g_test − g_ref| / |g_ref|} per shell: max, RMS and
 * percentiles (nearest rank), and the largest relative potential error. Points inside the body are left out.
 */
@Command(name = "compare", mixinStandardHelpOptions = true,
    header = "Compare two field models of one body on shells above the surface.",
    description = {"Compare two gravity field models of one body on spherical shells (relative acceleration error).",
        "Shells: --altitudes above the surface (exact distance to the surface; --radial-altitudes: radially from the",
        "centre of mass) or --radii from the centre of mass, metres. Conventions: SI units, model frame, U > 0, acceleration = grad U.",
        "Caution: results must be verified independently before operational use; mission rules and the",
        "responsible flight-dynamics authority decide."})
public final class CompareCommand implements Callable<Integer> {
    /** One-line caution carried by every output. */
    public static final String CAUTION = "Caution: verify independently before operational use; mission rules and "
        + "the responsible flight-dynamics authority decide.";
    /** CSV header, a contract for tools that read the output. */
    public static final String CSV_HEADER = "test_model,mascon_count,shell,shell_value_m,points,accel_rel_err_max,"
        + "accel_rel_err_rms,accel_rel_err_p50,accel_rel_err_p90,accel_rel_err_p99,potential_rel_err_max";

    @Mixin
    ModelOptions model = new ModelOptions();

    @Option(names = "--reference", paramLabel = "polyhedron|mascon", description = "Reference field model "
        + "(default: ${DEFAULT-VALUE}).")
    String reference = "polyhedron";

    @Option(names = "--test", paramLabel = "polyhedron|mascon", description = "Field model under test (default: "
        + "${DEFAULT-VALUE}).")
    String test = "mascon";

    @Option(names = "--test-body", paramLabel = "FILE", description = "Body for the model under test (OBJ or body "
        + "description .json; default: the same body), e.g. another density assumption.")
    Path testBody;

    @Option(names = "--mascons", paramLabel = "N[,N...]", split = ",", description = "Target mascon count(s); one "
        + "comparison per count (default: 10000).")
    int[] mascons = {10000};

    @Option(names = "--mascon-scheme", paramLabel = "lattice|tetra", description = "Mascon generation scheme "
        + "(default: ${DEFAULT-VALUE}).")
    String scheme = MasconOptions.DEFAULT_SCHEME;

    @Option(names = "--match-inertia", negatable = true, description = "Adjust the mascon masses to the body's "
        + "quadrupole (inertia tensor up to its trace) too (default: on for the lattice, off for tetra).")
    Boolean matchInertia;

    @Option(names = "--match-full-inertia", description = "Match the full inertia tensor, trace included.")
    boolean matchFullInertia;

    @Option(names = "--altitudes", paramLabel = "M[,M...]", split = ",", description = "Shell altitudes above the "
        + "surface, m (default: 0.05, 0.25 and 1 times the equivalent radius).")
    double[] altitudes;

    @Option(names = "--radial-altitudes", description = "Measure --altitudes radially from the centre of mass beyond "
        + "the outermost surface crossing, instead of as the exact distance to the surface.")
    boolean radialAltitudes;

    @Option(names = "--radii", paramLabel = "M[,M...]", split = ",", description = "Shell radii from the centre of "
        + "mass, m (instead of --altitudes).")
    double[] radii;

    @Option(names = "--points", paramLabel = "N", description = "Points per shell (default: ${DEFAULT-VALUE}).")
    int points = 1000;

    @Option(names = "--csv", paramLabel = "FILE", description = "Write the table as CSV.")
    Path csv;

    @Option(names = "--json", paramLabel = "FILE", description = "Write the table as JSON.")
    Path json;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** One row of the result. */
    record Row(String testModel, int mascons, String shell, double value, int points, double[] stats,
               double potentialMax) {
    }

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (altitudes != null && radii != null) {
            throw new InputException("give either --altitudes or --radii, not both");
        }
        if (points < 1) {
            throw new InputException("--points must be at least 1, got " + points);
        }
        int nThreads = Math.max(1, threads);
        BodyModel body = model.load(null);
        BodyModel other = testBody == null ? body : ModelLoader.load(testBody, model.request(null));
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        if (other != body) {
            for (String w : other.warnings()) {
                err.println("cairn: warning: " + w);
            }
        }
        body.requireFitForGravity();
        MassProperties mp = body.massProperties();
        boolean byAltitude = radii == null;
        double[] shells = byAltitude
            ? (altitudes != null ? altitudes : new double[] {0.05 * mp.equivalentRadius(), 0.25 * mp.equivalentRadius(),
                mp.equivalentRadius()})
            : radii;
        for (double s : shells) {
            if (!(s >= 0) || !Double.isFinite(s)) {
                throw new InputException((byAltitude ? "--altitudes" : "--radii") + ": values must be finite and "
                    + "non-negative, got " + s);
            }
        }
        double[] com = mp.centerOfMass();
        SurfaceQuery surface = new SurfaceQuery(body.mesh());
        double[] dirs = fibonacciDirections(points);
        double[] surfR = new double[points];
        ParallelChunks.run(points, nThreads, () -> null, (c, from, to) -> {
            for (int i = from; i < to; i++) {
                surfR[i] = surface.farthestHit(com[0], com[1], com[2], dirs[3 * i], dirs[3 * i + 1], dirs[3 * i + 2]);
            }
        }, ProgressListener.NONE);
        FieldModel ref = MasconOptions.build(body, reference, mascons[0], scheme,
            MasconOptions.moments(scheme, matchInertia, matchFullInertia), nThreads, err);
        boolean testIsMascon = test.toLowerCase(Locale.ROOT).startsWith("mascon");
        int[] counts = testIsMascon ? mascons : new int[] {0};
        List<FieldModel> tests = new ArrayList<>();
        for (int n : counts) {
            tests.add(MasconOptions.build(other, test, n, scheme,
                MasconOptions.moments(scheme, matchInertia, matchFullInertia), nThreads, err));
        }
        List<Row> rows = new ArrayList<>();
        int evaluated = 0;
        for (double s : shells) {
            double[] xyz = shellPoints(s, byAltitude, radialAltitudes, com, mp.brillouinRadius(), dirs, surfR,
                surface);
            int n = xyz.length / 3;
            if (n == 0) {
                err.println("cairn: warning: shell " + s + " m lies wholly inside the body; skipped");
                continue;
            }
            evaluated += n;
            double[] a;
            try (ProgressBar bar = new ProgressBar("reference")) {
                a = BatchEvaluation.evaluate(ref, xyz, false, nThreads, bar);
            }
            for (int t = 0; t < tests.size(); t++) {
                double[] b;
                try (ProgressBar bar = new ProgressBar("test " + (t + 1) + "/" + tests.size())) {
                    b = BatchEvaluation.evaluate(tests.get(t), xyz, false, nThreads, bar);
                }
                double[] e = new double[n];
                double pmax = 0;
                for (int i = 0; i < n; i++) {
                    int o = i * FieldSample.SIZE;
                    double dx = b[o + FieldSample.AX] - a[o + FieldSample.AX];
                    double dy = b[o + FieldSample.AY] - a[o + FieldSample.AY];
                    double dz = b[o + FieldSample.AZ] - a[o + FieldSample.AZ];
                    e[i] = Math.sqrt(dx * dx + dy * dy + dz * dz) / FieldSample.accelerationNorm(a, o);
                    pmax = Math.max(pmax, Math.abs(b[o] - a[o]) / Math.abs(a[o]));
                }
                FieldModel tm = tests.get(t);
                int actual = tm instanceof dev.cairn.mascon.MasconField ? ((dev.cairn.mascon.MasconField) tm).count()
                    : 0;
                rows.add(new Row(tm.describe(), actual, byAltitude ? (radialAltitudes ? "radial_altitude" : "altitude")
                    : "radius", s, n,
                    stats(e), pmax));
            }
        }
        MasconOptions.warnTooClose(ref, evaluated, err);
        for (FieldModel t : tests) {
            MasconOptions.warnTooClose(t, evaluated, err);
        }
        printTable(out, body, ref, rows, byAltitude, radialAltitudes);
        if (csv != null) {
            AtomicFiles.writeString(csv, toCsv(body, ref, rows));
            err.println("cairn: wrote " + csv);
        }
        if (json != null) {
            AtomicFiles.writeString(json, toJson(body, ref, rows));
            err.println("cairn: wrote " + json);
        }
        err.flush();
        return 0;
    }

    /** Shell points outside the body along the given directions. */
    /**
     * Points of one shell, one per direction from the centre of mass: at radius {@code s}; at altitude {@code s}
     * radially (beyond the outermost surface crossing of the ray, {@code radial}); or at the exact height {@code s}
     * above the surface: the point of the ray beyond the outermost crossing whose exact distance to the surface is
     * {@code s} (bisection; the distance is 1-Lipschitz along the ray, at most s at the radial point and at least s
     * once the point is s beyond the Brillouin sphere of radius {@code rb}).
     */
    static double[] shellPoints(double s, boolean byAltitude, boolean radial, double[] com, double rb, double[] dirs,
                                double[] surfR, SurfaceQuery surface) {
        int n = dirs.length / 3;
        double[] xyz = new double[3 * n];
        double[] w = new double[4];
        int k = 0;
        for (int i = 0; i < n; i++) {
            double r;
            double dx = dirs[3 * i];
            double dy = dirs[3 * i + 1];
            double dz = dirs[3 * i + 2];
            if (byAltitude) {
                if (Double.isNaN(surfR[i])) {
                    continue; // the ray from the centre of mass misses the surface (centre of mass outside the body)
                }
                r = surfR[i] + s;
                if (!radial && s > 0) {
                    double lo = r;
                    double hi = Math.max(r, rb + s) + 1e-9 * (rb + s);
                    // Bisection bounded by a count: 200 halvings reach rounding for any bracket.
                    for (int it = 0; it < 200 && hi - lo > 1e-12 * (rb + s); it++) {
                        double mid = 0.5 * (lo + hi);
                        double d = surface.signedDistance(com[0] + mid * dx, com[1] + mid * dy, com[2] + mid * dz, w);
                        if (d < s) {
                            lo = mid;
                        } else {
                            hi = mid;
                        }
                    }
                    r = 0.5 * (lo + hi);
                }
            } else {
                r = s;
                if (!Double.isNaN(surfR[i]) && r <= surfR[i] && surface.inside(com[0] + r * dx, com[1] + r * dy,
                    com[2] + r * dz)) {
                    continue;
                }
            }
            xyz[3 * k] = com[0] + r * dx;
            xyz[3 * k + 1] = com[1] + r * dy;
            xyz[3 * k + 2] = com[2] + r * dz;
            k++;
        }
        return Arrays.copyOf(xyz, 3 * k);
    }

    /** {@code n} near-uniform unit vectors (Fibonacci lattice on the sphere). */
    static double[] fibonacciDirections(int n) {
        double[] d = new double[3 * n];
        double golden = Math.PI * (3 - Math.sqrt(5));
        for (int i = 0; i < n; i++) {
            double z = 1 - (2 * i + 1.0) / n;
            double s = Math.sqrt(Math.max(0, 1 - z * z));
            double phi = golden * i;
            d[3 * i] = s * Math.cos(phi);
            d[3 * i + 1] = s * Math.sin(phi);
            d[3 * i + 2] = z;
        }
        return d;
    }

    /** {max, rms, p50, p90, p99} of {@code e} (nearest-rank percentiles); sorts a copy. */
    static double[] stats(double[] e) {
        double[] s = e.clone();
        Arrays.sort(s);
        double sum = 0;
        for (double v : s) {
            sum += v * v;
        }
        return new double[] {s[s.length - 1], Math.sqrt(sum / s.length), rank(s, 0.5), rank(s, 0.9), rank(s, 0.99)};
    }

    private static double rank(double[] sorted, double p) {
        int k = (int) Math.ceil(p * sorted.length) - 1;
        return sorted[Math.max(0, Math.min(sorted.length - 1, k))];
    }

    private static void printTable(PrintWriter out, BodyModel body, FieldModel ref, List<Row> rows,
                                   boolean byAltitude, boolean radial) {
        out.println("Body: " + body.source() + " (" + body.name() + ")");
        out.println("Reference: " + ref.describe());
        out.println("Relative acceleration error |g_test - g_ref| / |g_ref| per shell"
            + (byAltitude ? radial ? " (altitude above the surface, radially from the centre of mass)"
                : " (altitude = exact distance to the surface)" : " (radius from the centre of mass)") + ":");
        out.printf(Locale.ROOT, "%-9s %13s %7s %10s %10s %10s %10s %10s %10s%n", "mascons",
            byAltitude ? "altitude_m" : "radius_m", "points", "max", "rms", "p50", "p90", "p99", "max dU/U");
        for (Row r : rows) {
            out.printf(Locale.ROOT, "%-9s %13.6g %7d %10.3e %10.3e %10.3e %10.3e %10.3e %10.3e%n",
                r.mascons > 0 ? String.valueOf(r.mascons) : "-", r.value, r.points, r.stats[0], r.stats[1],
                r.stats[2], r.stats[3], r.stats[4], r.potentialMax);
        }
        if (!rows.isEmpty()) {
            out.println("Test model(s): " + String.join("; ", rows.stream().map(Row::testModel).distinct().toList()));
        }
        out.println(CAUTION);
        out.flush();
    }

    private static String toCsv(BodyModel body, FieldModel ref, List<Row> rows) {
        StringBuilder sb = new StringBuilder();
        sb.append("# cairn compare: body ").append(body.source()).append("; reference ").append(ref.describe())
            .append('\n');
        sb.append("# relative acceleration error |g_test - g_ref|/|g_ref|; SI units; U > 0, acceleration = grad U\n");
        sb.append("# ").append(CAUTION).append('\n');
        sb.append(CSV_HEADER).append('\n');
        for (Row r : rows) {
            sb.append('"').append(r.testModel.replace("\"", "'")).append('"').append(',').append(r.mascons)
                .append(',').append(r.shell).append(',').append(r.value).append(',').append(r.points);
            for (double v : r.stats) {
                sb.append(',').append(v);
            }
            sb.append(',').append(r.potentialMax).append('\n');
        }
        return sb.toString();
    }

    private static String toJson(BodyModel body, FieldModel ref, List<Row> rows) throws Exception {
        Map<String, Object> j = new LinkedHashMap<>();
        j.put("body", body.source().toString());
        j.put("reference_model", ref.describe());
        j.put("error_measure", "relative acceleration error |g_test - g_ref|/|g_ref|");
        j.put("conventions", "SI units, model frame, potential U > 0, acceleration = grad U");
        j.put("caution", CAUTION);
        List<Map<String, Object>> list = new ArrayList<>();
        for (Row r : rows) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("test_model", r.testModel);
            m.put("mascon_count", r.mascons);
            m.put("shell", r.shell);
            m.put("shell_value_m", r.value);
            m.put("points", r.points);
            m.put("accel_rel_err_max", r.stats[0]);
            m.put("accel_rel_err_rms", r.stats[1]);
            m.put("accel_rel_err_p50", r.stats[2]);
            m.put("accel_rel_err_p90", r.stats[3]);
            m.put("accel_rel_err_p99", r.stats[4]);
            m.put("potential_rel_err_max", r.potentialMax);
            list.add(m);
        }
        j.put("rows", list);
        return new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(j) + "\n";
    }
}
