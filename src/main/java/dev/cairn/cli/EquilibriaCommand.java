package dev.cairn.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.io.AtomicFiles;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.mascon.SurfaceQuery;
import dev.cairn.mass.MassProperties;
import dev.cairn.rotation.SpinState;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.EigenDecomposition;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.SingularValueDecomposition;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/**
 * {@code cairn equilibria}: equilibrium points of a uniformly rotating body in its body-fixed frame, where gravity and
 * the centrifugal acceleration balance: ∇V = g + ω² r⊥ = 0 with V = U + ½ω²|r⊥|² (shared references §8; Scheeres
 * 2012). Search: a grid of |∇V| over a cube about the centre of mass reaching 1.6 times the larger of the synchronous
 * radius (GM/ω²)^{1/3} and the Brillouin radius, its local minima, lowest 0.5 % and a
 * coarse multistart inside the Brillouin sphere as seeds, then Newton's method on ∇V with the Hessian
 * H = ∇∇U + ω²(1 − ω̂ω̂ᵀ) (pseudo-inverse by SVD, step limited and backtracked). Linearisation:
 * δr̈ + 2ω×δṙ = H δr, the 6×6 matrix [[0, 1], [H, −2[ω×]]]; eigenvalues by Commons Math.
 */
@Command(name = "equilibria", mixinStandardHelpOptions = true,
    header = "Equilibrium points of the rotating body (gravity and centrifugal force balance).",
    description = {"Equilibrium points of the effective potential V = U + w^2 r_perp^2/2 in the rotating body frame:",
        "position, distance from the centre of mass, altitude above the surface, V and the Jacobi constant J = -V,",
        "the eigenvalues of the linearised motion (6x6 with the Coriolis terms), stability and type, inside flag.",
        "Needs a spin (--spin-period or the sidecar). SI units, model frame, U > 0, acceleration = grad U.",
        "See docs/equilibria.md.",
        "Caution: results must be verified independently before operational use; mission rules and the",
        "responsible flight-dynamics authority decide."})
public final class EquilibriaCommand implements Callable<Integer> {
    /** Caution line of every output. */
    static final String CAUTION = "Caution: results must be verified independently before operational use; mission "
        + "rules and the responsible flight-dynamics authority decide.";

    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    SpinOptions spinOptions = new SpinOptions();

    @Option(names = "--grid", paramLabel = "N", description = "Search grid points per axis, 8 to 200 (default: "
        + "${DEFAULT-VALUE}).")
    int grid = 48;

    @Option(names = "--json", description = "Print the result as JSON on standard output instead of the table.")
    boolean json;

    @Option(names = "--out", paramLabel = "DIR", description = "Write DIR/equilibria.json and zero-velocity maps "
        + "(PNG of the effective potential in three planes through the centre of mass).")
    Path outDir;

    @Option(names = "--jacobi", paramLabel = "J", description = "Shade, on the maps, the region forbidden to a "
        + "particle with this Jacobi constant (m^2/s^2; where V < -J).")
    Double jacobi;

    @Option(names = "--map-size", paramLabel = "PIXELS", description = "Map resolution, 100 to 1200 (default: "
        + "${DEFAULT-VALUE}).")
    int mapSize = 300;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** One equilibrium point. */
    public record Point(double[] position, double distance, double altitude, double potential, double[] eigRe,
                        double[] eigIm, boolean stable, String type, boolean inside, double residual,
                        boolean nearDegenerate) {
        /** Jacobi constant J = |v|²/2 − V of the point at rest, m²/s². */
        public double jacobi() {
            return -potential;
        }
    }

    /** Result of a search. */
    public record Result(List<Point> points, double omega, double syncRadius, int seeds) {
    }

    @Override
    public Integer call() throws Exception {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (grid < 8 || grid > 200) {
            throw new InputException("--grid must be 8 to 200, got " + grid);
        }
        if (mapSize < 100 || mapSize > 1200) {
            throw new InputException("--map-size must be 100 to 1200, got " + mapSize);
        }
        if (jacobi != null && !Double.isFinite(jacobi)) {
            throw new InputException("--jacobi must be a finite number, got " + jacobi);
        }
        BodyModel body = model.load(spinOptions);
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        SpinState spin = body.spin();
        if (!(spin.omega() > 0)) {
            throw new InputException(body.source() + ": the body does not spin (no --spin-period and none in the "
                + "sidecar): a non-rotating body has no equilibrium points");
        }
        body.requireFitForGravity();
        MassProperties mp = body.massProperties();
        long grid3 = (long) grid * grid * grid;
        FieldModel field = body.fieldModel(grid3);
        long t0 = System.nanoTime();
        Result r = search(field, body.gm(), mp.centerOfMass(), mp.brillouinRadius(), spin, new SurfaceQuery(body.mesh()),
            grid, Math.max(1, threads));
        double seconds = (System.nanoTime() - t0) * 1e-9;
        Map<String, Object> j = toJson(body, field, spin, r);
        String text = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(j) + "\n";
        if (json) {
            out.print(text);
        } else {
            printTable(out, body, field, spin, r, seconds);
        }
        out.flush();
        if (outDir != null) {
            Path f = outDir.resolve("equilibria.json");
            AtomicFiles.writeString(f, text);
            err.println("cairn: wrote " + f);
            for (Path m : ZeroVelocityMaps.write(outDir, field, mp.centerOfMass(), mp.brillouinRadius(), spin, r,
                jacobi, mapSize, Math.max(1, threads))) {
                err.println("cairn: wrote " + m);
            }
        }
        err.flush();
        return 0;
    }

    /**
     * Finds the equilibrium points of {@code field} spinning as {@code spin} about the axis through {@code com}.
     *
     * @param surface for the altitude (signed distance, negative inside) and the inside flag
     */
    public static Result search(FieldModel field, double gm, double[] com, double brillouin, SpinState spin,
                                SurfaceQuery surface, int grid, int threads) {
        double w = spin.omega();
        double[] axis = spin.axis();
        double sync = Math.cbrt(gm / (w * w));
        double half = 1.6 * Math.max(sync, brillouin);
        int n = grid;
        double h = 2 * half / (n - 1);
        double[] pts = new double[3 * n * n * n];
        int q = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                for (int k = 0; k < n; k++) {
                    pts[q++] = com[0] - half + i * h;
                    pts[q++] = com[1] - half + j * h;
                    pts[q++] = com[2] - half + k * h;
                }
            }
        }
        double[] s = BatchEvaluation.evaluate(field, pts, false, threads, ProgressListener.NONE);
        double[] mag = new double[n * n * n];
        double[] a = new double[3];
        for (int p = 0; p < mag.length; p++) {
            effectiveGradient(s, p * FieldSample.SIZE, pts[3 * p], pts[3 * p + 1], pts[3 * p + 2], com, axis, w, a);
            // |∇V| relative to its two parts |g| + ω²|r⊥|: small near every root, whatever the field's strength there
            double gx = FieldSample.accelerationNorm(s, p * FieldSample.SIZE);
            double cx = a[0] - s[p * FieldSample.SIZE + FieldSample.AX];
            double cy = a[1] - s[p * FieldSample.SIZE + FieldSample.AY];
            double cz = a[2] - s[p * FieldSample.SIZE + FieldSample.AZ];
            mag[p] = Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2])
                / (gx + Math.sqrt(cx * cx + cy * cy + cz * cz) + Double.MIN_NORMAL);
        }
        List<double[]> seeds = new ArrayList<>();
        for (int i = 1; i < n - 1; i++) {
            for (int j = 1; j < n - 1; j++) {
                for (int k = 1; k < n - 1; k++) {
                    int p = (i * n + j) * n + k;
                    boolean min = true;
                    for (int di = -1; di <= 1 && min; di++) {
                        for (int dj = -1; dj <= 1 && min; dj++) {
                            for (int dk = -1; dk <= 1 && min; dk++) {
                                int o = ((i + di) * n + j + dj) * n + k + dk;
                                if (o != p && !(mag[o] > mag[p] || (mag[o] == mag[p] && o > p))) {
                                    min = false;
                                }
                            }
                        }
                    }
                    if (min) {
                        seeds.add(new double[] {pts[3 * p], pts[3 * p + 1], pts[3 * p + 2]});
                    }
                }
            }
        }
        // Also the lowest 0.5 % of the grid by |∇V| (at most 2000 points): a shallow valley of |∇V| can hold two
        // roots (e.g. an interior maximum of V next to a soft saddle) with a single grid minimum between them.
        int extra = Math.min(2000, Math.max(1, mag.length / 200));
        Integer[] byMag = new Integer[mag.length];
        for (int p = 0; p < mag.length; p++) {
            byMag[p] = p;
        }
        Arrays.sort(byMag, Comparator.comparingDouble((Integer p) -> mag[p]).thenComparingInt(p -> p));
        for (int k = 0; k < extra; k++) {
            int p = byMag[k];
            seeds.add(new double[] {pts[3 * p], pts[3 * p + 1], pts[3 * p + 2]});
        }
        // And a coarse multistart inside the Brillouin sphere (about 16 points per axis over the cube), where roots
        // can lie closer together than the grid resolves along soft directions of the Hessian.
        int stride = Math.max(1, n / 16);
        for (int i = 0; i < n; i += stride) {
            for (int j = 0; j < n; j += stride) {
                for (int k = 0; k < n; k += stride) {
                    int p = (i * n + j) * n + k;
                    double dx = pts[3 * p] - com[0];
                    double dy = pts[3 * p + 1] - com[1];
                    double dz = pts[3 * p + 2] - com[2];
                    if (dx * dx + dy * dy + dz * dz < brillouin * brillouin) {
                        seeds.add(new double[] {pts[3 * p], pts[3 * p + 1], pts[3 * p + 2]});
                    }
                }
            }
        }
        FieldEvaluator ev = field.newEvaluator();
        double scaleG = gm / (sync * sync);
        List<Point> found = new ArrayList<>();
        for (double[] seed : seeds) {
            double[] x = newton(ev, seed, com, axis, w, scaleG, sync);
            if (x == null) {
                continue;
            }
            Point np = describe(ev, x, com, axis, w, surface, scaleG);
            boolean dup = false;
            for (Point p : found) {
                double d = Math.sqrt(sq(p.position()[0] - x[0]) + sq(p.position()[1] - x[1])
                    + sq(p.position()[2] - x[2]));
                // the same point; or, on a near-degenerate ring, a neighbour where the search landed on the ring
                if (d < 1e-6 * sync || (p.nearDegenerate() && np.nearDegenerate() && d < 0.25 * sync)) {
                    dup = true;
                    break;
                }
            }
            if (!dup) {
                found.add(np);
            }
        }
        found.sort(Comparator.comparingDouble((Point p) -> p.distance()).thenComparingDouble(p -> Math.atan2(
            p.position()[1] - com[1], p.position()[0] - com[0])));
        return new Result(found, w, sync, seeds.size());
    }

    private static double sq(double v) {
        return v * v;
    }

    /** ∇V = g + ω² r⊥ from a field sample. */
    private static void effectiveGradient(double[] s, int o, double x, double y, double z, double[] c, double[] ax,
                                          double w, double[] out) {
        double px = x - c[0];
        double py = y - c[1];
        double pz = z - c[2];
        double d = px * ax[0] + py * ax[1] + pz * ax[2];
        out[0] = s[o + FieldSample.AX] + w * w * (px - d * ax[0]);
        out[1] = s[o + FieldSample.AY] + w * w * (py - d * ax[1]);
        out[2] = s[o + FieldSample.AZ] + w * w * (pz - d * ax[2]);
    }

    /** Hessian H = ∇∇U + ω²(1 − ω̂ω̂ᵀ) from a sample with the gradient tensor. */
    private static double[][] hessian(double[] s, double[] ax, double w) {
        double[][] hm = {
            {s[FieldSample.GXX], s[FieldSample.GXY], s[FieldSample.GXZ]},
            {s[FieldSample.GXY], s[FieldSample.GYY], s[FieldSample.GYZ]},
            {s[FieldSample.GXZ], s[FieldSample.GYZ], s[FieldSample.GZZ]}};
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 3; j++) {
                hm[i][j] += w * w * ((i == j ? 1 : 0) - ax[i] * ax[j]);
            }
        }
        return hm;
    }

    /** Newton's method on ∇V from {@code seed}; null when it does not converge in 60 steps. */
    private static double[] newton(FieldEvaluator ev, double[] seed, double[] c, double[] ax, double w, double scaleG,
                                   double sync) {
        double[] x = seed.clone();
        double[] s = new double[FieldSample.SIZE];
        double[] a = new double[3];
        ev.evaluate(x[0], x[1], x[2], true, s, 0);
        effectiveGradient(s, 0, x[0], x[1], x[2], c, ax, w, a);
        double norm = Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
        double maxStep = 0.2 * sync;
        for (int it = 0; it < 60; it++) {
            if (!Double.isFinite(norm)) {
                return null;
            }
            if (norm < 1e-11 * scaleG) {
                return x;
            }
            RealMatrix hm = new Array2DRowRealMatrix(hessian(s, ax, w));
            double[] step = new SingularValueDecomposition(hm).getSolver().solve(new ArrayRealVector(a)).toArray();
            double len = Math.sqrt(step[0] * step[0] + step[1] * step[1] + step[2] * step[2]);
            if (!Double.isFinite(len)) {
                return null;
            }
            double f = len > maxStep ? maxStep / len : 1;
            boolean improved = false;
            double[] y = new double[3];
            double[] sy = new double[FieldSample.SIZE];
            double[] ay = new double[3];
            for (int b = 0; b < 30; b++) {
                for (int i = 0; i < 3; i++) {
                    y[i] = x[i] - f * step[i];
                }
                ev.evaluate(y[0], y[1], y[2], true, sy, 0);
                effectiveGradient(sy, 0, y[0], y[1], y[2], c, ax, w, ay);
                double ny = Math.sqrt(ay[0] * ay[0] + ay[1] * ay[1] + ay[2] * ay[2]);
                if (ny < norm) {
                    System.arraycopy(y, 0, x, 0, 3);
                    System.arraycopy(sy, 0, s, 0, FieldSample.SIZE);
                    System.arraycopy(ay, 0, a, 0, 3);
                    norm = ny;
                    improved = true;
                    break;
                }
                f *= 0.5;
            }
            if (!improved) {
                // No decrease along the Newton direction: converged to rounding if the residual is small.
                return norm < 1e-8 * scaleG ? x : null;
            }
            if (f * len < 1e-13 * sync && norm < 1e-8 * scaleG) {
                return x;
            }
        }
        return norm < 1e-8 * scaleG ? x : null;
    }

    /** The point's potential, eigenvalues, stability and type. */
    private static Point describe(FieldEvaluator ev, double[] x, double[] c, double[] ax, double w,
                                  SurfaceQuery surface, double scaleG) {
        double[] s = new double[FieldSample.SIZE];
        ev.evaluate(x[0], x[1], x[2], true, s, 0);
        double[] a = new double[3];
        effectiveGradient(s, 0, x[0], x[1], x[2], c, ax, w, a);
        double px = x[0] - c[0];
        double py = x[1] - c[1];
        double pz = x[2] - c[2];
        double d = px * ax[0] + py * ax[1] + pz * ax[2];
        double perp2 = px * px + py * py + pz * pz - d * d;
        double v = s[FieldSample.U] + 0.5 * w * w * perp2;
        double[][] hm = hessian(s, ax, w);
        double[][] m = new double[6][6];
        double[] om = {w * ax[0], w * ax[1], w * ax[2]};
        double[][] cross = {{0, -om[2], om[1]}, {om[2], 0, -om[0]}, {-om[1], om[0], 0}};
        for (int i = 0; i < 3; i++) {
            m[i][3 + i] = 1;
            for (int j = 0; j < 3; j++) {
                m[3 + i][j] = hm[i][j];
                m[3 + i][3 + j] = -2 * cross[i][j];
            }
        }
        EigenDecomposition e = new EigenDecomposition(new Array2DRowRealMatrix(m));
        double[] re = e.getRealEigenvalues();
        double[] im = e.getImagEigenvalues();
        Integer[] order = {0, 1, 2, 3, 4, 5};
        Arrays.sort(order, Comparator.comparingDouble((Integer i) -> -Math.abs(im[i])).thenComparingDouble(i -> -re[i])
            .thenComparingDouble(i -> -im[i]));
        double[] r2 = new double[6];
        double[] i2 = new double[6];
        double big = 0;
        for (int k = 0; k < 6; k++) {
            r2[k] = re[order[k]];
            i2[k] = im[order[k]];
            big = Math.max(big, Math.hypot(r2[k], i2[k]));
        }
        double tol = 1e-7 * big;
        int imag = 0;
        int real = 0;
        int complex = 0;
        for (int k = 0; k < 6; k++) {
            boolean zeroRe = Math.abs(r2[k]) <= tol;
            boolean zeroIm = Math.abs(i2[k]) <= tol;
            if (zeroRe) {
                imag++;
            } else if (zeroIm) {
                real++;
            } else {
                complex++;
            }
        }
        boolean stable = real == 0 && complex == 0;
        String type = typeName(imag / 2, real / 2, complex / 4);
        double[] eh = new SingularValueDecomposition(new Array2DRowRealMatrix(hm)).getSingularValues();
        boolean degenerate = eh[2] < 1e-3 * eh[0];
        double[] scratch = new double[4];
        double alt = surface.signedDistance(x[0], x[1], x[2], scratch);
        boolean inside = surface.inside(x[0], x[1], x[2]);
        return new Point(x.clone(), Math.sqrt(px * px + py * py + pz * pz), alt, v, r2, i2, stable, type, inside,
            Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]) / scaleG, degenerate);
    }

    /**
     * Topological type by the eigenvalue pattern (Jiang et al. 2014 classification of equilibria of a rotating body):
     * pairs ±iβ (centre), ±α (saddle), quartets ±α±iβ (complex saddle).
     */
    static String typeName(int centres, int saddles, int quartets) {
        List<String> parts = new ArrayList<>();
        for (int i = 0; i < centres; i++) {
            parts.add("centre");
        }
        for (int i = 0; i < saddles; i++) {
            parts.add("saddle");
        }
        for (int i = 0; i < quartets; i++) {
            parts.add("complex saddle");
        }
        String pattern = String.join(" x ", parts);
        return (saddles == 0 && quartets == 0 ? "linearly stable: " : "unstable: ") + pattern;
    }

    private static void printTable(PrintWriter out, BodyModel body, FieldModel field, SpinState spin, Result r,
                                   double seconds) {
        out.println("Body: " + body.source() + " (" + body.name() + ")");
        out.println("Field: " + field.describe());
        double[] ax = spin.axis();
        out.printf(Locale.ROOT, "Spin: period %.6g s, rate %.6e rad/s, pole (%.4f, %.4f, %.4f); synchronous radius "
            + "(GM/w^2)^(1/3) = %.6g m%n", spin.periodSeconds(), r.omega(), ax[0], ax[1], ax[2], r.syncRadius());
        out.printf(Locale.ROOT, "Equilibrium points: %d (from %d grid seeds, %.2f s)%n", r.points().size(), r.seeds(),
            seconds);
        out.printf(Locale.ROOT, "%3s %12s %12s %12s %11s %11s %13s %7s %s%n", "#", "x_m", "y_m", "z_m", "radius_m",
            "altitude_m", "jacobi_m2_s2", "inside", "type");
        int k = 1;
        boolean ring = false;
        for (Point p : r.points()) {
            out.printf(Locale.ROOT, "%3d %12.3f %12.3f %12.3f %11.3f %11.3f %13.6e %7s %s%s%n", k++, p.position()[0],
                p.position()[1], p.position()[2], p.distance(), p.altitude(), p.jacobi(), p.inside() ? "yes" : "no",
                p.type(), p.nearDegenerate() ? " (near-degenerate)" : "");
            ring |= p.nearDegenerate() && !p.inside();
        }
        if (ring) {
            out.println("Note: near-degenerate points (a Hessian eigenvalue near zero): the body is close to "
                + "axisymmetric and its equilibria form a near-degenerate ring; the points listed are where the "
                + "search landed on it.");
        }
        out.println("Conventions: SI units, model frame, V = U + w^2 r_perp^2/2, J = |v|^2/2 - V (J = -V at rest).");
        out.println(CAUTION);
    }

    private static Map<String, Object> toJson(BodyModel body, FieldModel field, SpinState spin, Result r) {
        Map<String, Object> j = new LinkedHashMap<>();
        j.put("model", body.source().toString());
        j.put("field_model", field.describe());
        j.put("spin_period_s", spin.periodSeconds());
        j.put("spin_axis", spin.axis());
        j.put("spin_rate_rad_s", r.omega());
        j.put("synchronous_radius_m", r.syncRadius());
        j.put("conventions", "SI units, model (body-fixed) frame; potential U > 0, acceleration = grad U; effective "
            + "potential V = U + omega^2 r_perp^2/2; Jacobi constant J = |v|^2/2 - V; linearisation "
            + "d2r/dt2 + 2 omega x dr/dt = H dr");
        j.put("caution", CAUTION);
        List<Map<String, Object>> list = new ArrayList<>();
        for (Point p : r.points()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("position_m", p.position());
            m.put("distance_from_com_m", p.distance());
            m.put("altitude_m", p.altitude());
            m.put("effective_potential_m2_s2", p.potential());
            m.put("jacobi_m2_s2", p.jacobi());
            List<double[]> eig = new ArrayList<>();
            for (int k = 0; k < 6; k++) {
                eig.add(new double[] {p.eigRe()[k], p.eigIm()[k]});
            }
            m.put("eigenvalues", eig);
            m.put("stable", p.stable());
            m.put("type", p.type());
            m.put("inside", p.inside());
            m.put("near_degenerate", p.nearDegenerate());
            m.put("residual_relative", p.residual());
            list.add(m);
        }
        j.put("points", list);
        return j;
    }

    /**
     * Zero-velocity maps: the effective potential V in three planes through the centre of mass (the equatorial plane
     * and the two planes holding the pole), with contour lines V = −J at the equilibria's Jacobi constants, the body's
     * cross-section (from the field's inside/outside location), the equilibria near the plane marked and numbered, a
     * colour bar, axes in metres and the caution line; with a Jacobi constant J the region V &lt; −J, forbidden to a
     * particle of that J, is shaded.
     */
    static final class ZeroVelocityMaps {
        private static final int LEFT = 80;
        private static final int TOP = 104;
        private static final int RIGHT = 150;
        private static final int BOTTOM = 96;
        private static final int[] RAMP = {0x201A40, 0x2F5A8C, 0x35967A, 0xC9B85A, 0xF6F0D6};

        private ZeroVelocityMaps() {
        }

        static List<Path> write(Path dir, FieldModel field, double[] com, double brillouin, SpinState spin, Result r,
                                Double jacobi, int size, int threads) {
            double[] pole = spin.axis();
            double[] e1 = Math.abs(pole[0]) > 0.999 ? new double[] {0, 1, 0} : new double[] {1, 0, 0};
            double d = e1[0] * pole[0] + e1[1] * pole[1] + e1[2] * pole[2];
            for (int i = 0; i < 3; i++) {
                e1[i] -= d * pole[i];
            }
            double n1 = Math.sqrt(e1[0] * e1[0] + e1[1] * e1[1] + e1[2] * e1[2]);
            for (int i = 0; i < 3; i++) {
                e1[i] /= n1;
            }
            double[] e2 = {pole[1] * e1[2] - pole[2] * e1[1], pole[2] * e1[0] - pole[0] * e1[2],
                pole[0] * e1[1] - pole[1] * e1[0]};
            boolean zPole = pole[2] > 0.999;
            double extent = 1.25 * brillouin;
            for (Point p : r.points()) {
                extent = Math.max(extent, 1.15 * p.distance());
            }
            List<Path> files = new ArrayList<>();
            files.add(plane(dir.resolve("map-equatorial.png"), field, com, e1, e2, zPole ? "x" : "e1",
                zPole ? "y" : "e2", "equatorial plane", extent, spin, r, jacobi, size, threads));
            files.add(plane(dir.resolve("map-meridian-1.png"), field, com, e1, pole, zPole ? "x" : "e1",
                zPole ? "z" : "pole", "plane of the pole and " + (zPole ? "x" : "e1"), extent, spin, r, jacobi, size,
                threads));
            files.add(plane(dir.resolve("map-meridian-2.png"), field, com, e2, pole, zPole ? "y" : "e2",
                zPole ? "z" : "pole", "plane of the pole and " + (zPole ? "y" : "e2"), extent, spin, r, jacobi, size,
                threads));
            return files;
        }

        private static Path plane(Path file, FieldModel field, double[] c, double[] u, double[] v, String uName,
                                  String vName, String title, double extent, SpinState spin, Result r,
                                  Double jacobi, int n, int threads) {
            double w = spin.omega();
            double[] pole = spin.axis();
            double[] pts = new double[3 * n * n];
            double h = 2 * extent / n;
            for (int j = 0; j < n; j++) {
                for (int i = 0; i < n; i++) {
                    double a = -extent + (i + 0.5) * h;
                    double b = extent - (j + 0.5) * h;
                    int q = 3 * (j * n + i);
                    for (int k = 0; k < 3; k++) {
                        pts[q + k] = c[k] + a * u[k] + b * v[k];
                    }
                }
            }
            double[] s = BatchEvaluation.evaluate(field, pts, false, threads, ProgressListener.NONE);
            double[] pot = new double[n * n];
            boolean[] inside = new boolean[n * n];
            for (int p = 0; p < n * n; p++) {
                double px = pts[3 * p] - c[0];
                double py = pts[3 * p + 1] - c[1];
                double pz = pts[3 * p + 2] - c[2];
                double dd = px * pole[0] + py * pole[1] + pz * pole[2];
                pot[p] = s[p * FieldSample.SIZE + FieldSample.U] + 0.5 * w * w * (px * px + py * py + pz * pz - dd * dd);
                inside[p] = s[p * FieldSample.SIZE + FieldSample.LOCATION] == 1.0;
            }
            double[] sorted = pot.clone();
            Arrays.sort(sorted);
            double lo = sorted[(int) (0.01 * (sorted.length - 1))];
            double hi = sorted[(int) (0.99 * (sorted.length - 1))];
            if (!(hi > lo)) {
                hi = lo + 1e-30;
            }
            java.awt.image.BufferedImage img = new java.awt.image.BufferedImage(LEFT + n + RIGHT, TOP + n + BOTTOM,
                java.awt.image.BufferedImage.TYPE_INT_RGB);
            java.awt.Graphics2D g = img.createGraphics();
            g.setRenderingHint(java.awt.RenderingHints.KEY_TEXT_ANTIALIASING,
                java.awt.RenderingHints.VALUE_TEXT_ANTIALIAS_ON);
            g.setColor(java.awt.Color.WHITE);
            g.fillRect(0, 0, img.getWidth(), img.getHeight());
            g.setFont(new java.awt.Font(java.awt.Font.SANS_SERIF, java.awt.Font.PLAIN, 12));
            for (int j = 0; j < n; j++) {
                for (int i = 0; i < n; i++) {
                    int p = j * n + i;
                    int rgb = ramp((pot[p] - lo) / (hi - lo));
                    if (jacobi != null && pot[p] < -jacobi && ((i + j) % 6 < 3)) {
                        rgb = darker(rgb); // hatched: forbidden for this Jacobi constant (V < -J)
                    }
                    img.setRGB(LEFT + i, TOP + j, rgb);
                }
            }
            // contour lines V = -J of the equilibria (sign changes to the right or below), and the body outline
            double[] levels = new double[r.points().size()];
            for (int k = 0; k < levels.length; k++) {
                levels[k] = r.points().get(k).potential();
            }
            for (int j = 0; j < n; j++) {
                for (int i = 0; i < n; i++) {
                    int p = j * n + i;
                    for (double level : levels) {
                        if ((i + 1 < n && (pot[p] - level) * (pot[p + 1] - level) < 0)
                            || (j + 1 < n && (pot[p] - level) * (pot[p + n] - level) < 0)) {
                            img.setRGB(LEFT + i, TOP + j, 0x000000);
                        }
                    }
                    if ((i + 1 < n && inside[p] != inside[p + 1]) || (j + 1 < n && inside[p] != inside[p + n])) {
                        img.setRGB(LEFT + i, TOP + j, 0xFFFFFF);
                    }
                }
            }
            g.setColor(java.awt.Color.BLACK);
            g.drawRect(LEFT - 1, TOP - 1, n + 1, n + 1);
            // equilibria within 2 % of the extent from the plane
            double[] nrm = {u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]};
            int k = 1;
            for (Point p : r.points()) {
                double[] x = p.position();
                double dx = x[0] - c[0];
                double dy = x[1] - c[1];
                double dz = x[2] - c[2];
                double off = dx * nrm[0] + dy * nrm[1] + dz * nrm[2];
                if (Math.abs(off) <= 0.02 * extent) {
                    double a = dx * u[0] + dy * u[1] + dz * u[2];
                    double b = dx * v[0] + dy * v[1] + dz * v[2];
                    int px = LEFT + (int) Math.round((a + extent) / h);
                    int py = TOP + (int) Math.round((extent - b) / h);
                    g.setColor(p.stable() ? new java.awt.Color(0x1B7F3A) : new java.awt.Color(0xC0202A));
                    g.fillOval(px - 4, py - 4, 9, 9);
                    g.setColor(java.awt.Color.BLACK);
                    g.drawOval(px - 4, py - 4, 9, 9);
                    g.drawString(String.valueOf(k), px + 6, py - 5);
                }
                k++;
            }
            // axes in metres
            for (int t = 0; t <= 4; t++) {
                double val = -extent + t * extent / 2;
                int px = LEFT + (int) Math.round(t * n / 4.0);
                int py = TOP + (int) Math.round(t * n / 4.0);
                g.drawLine(px, TOP + n, px, TOP + n + 5);
                g.drawString(String.format(Locale.ROOT, "%.0f", val + 0.0), px - 18, TOP + n + 18);
                g.drawLine(LEFT - 5, py, LEFT, py);
                g.drawString(String.format(Locale.ROOT, "%.0f", -val + 0.0), 4, py + 4);
            }
            g.drawString(uName + " (m, from the centre of mass)", LEFT + n / 2 - 80, TOP + n + 36);
            g.drawString(vName + " (m)", 4, TOP - 8);
            wrap(g, "Effective potential V = U + w^2 r_perp^2 / 2 in the " + title + " through the centre of mass. "
                + "Black: V = -J at the equilibria's Jacobi constants (zero-velocity curves); white: body outline; "
                + "dots: equilibria (green linearly stable, red unstable), numbered as in equilibria.json"
                + (jacobi != null ? String.format(Locale.ROOT, "; hatched: forbidden (V < -J) for J = %.6g m^2/s^2",
                jacobi) : "") + ".", 4, 14, img.getWidth() - 8);
            // colour bar
            int bx = LEFT + n + 30;
            for (int y = 0; y < n; y++) {
                int rgb = ramp(1 - y / (double) (n - 1));
                g.setColor(new java.awt.Color(rgb));
                g.drawLine(bx, TOP + y, bx + 18, TOP + y);
            }
            g.setColor(java.awt.Color.BLACK);
            g.drawRect(bx, TOP, 18, n);
            for (int t = 0; t <= 4; t++) {
                double val = hi - t * (hi - lo) / 4;
                int y = TOP + (int) Math.round(t * (n - 1) / 4.0);
                g.drawString(String.format(Locale.ROOT, "%.4g", val), bx + 22, y + 4);
            }
            g.drawString("V (m^2/s^2)", bx - 4, TOP - 8);
            wrap(g, CAUTION, 4, TOP + n + 56, img.getWidth() - 8);
            g.dispose();
            AtomicFiles.write(file, os -> {
                if (!javax.imageio.ImageIO.write(img, "png", os)) {
                    throw new java.io.IOException("no PNG writer available");
                }
            });
            return file;
        }

        /** Draws {@code text} word-wrapped to {@code width} pixels from (x, y) down. */
        private static void wrap(java.awt.Graphics2D g, String text, int x, int y, int width) {
            java.awt.FontMetrics fm = g.getFontMetrics();
            StringBuilder line = new StringBuilder();
            int yy = y;
            for (String word : text.split(" ")) {
                String next = line.length() == 0 ? word : line + " " + word;
                if (fm.stringWidth(next) > width && line.length() > 0) {
                    g.drawString(line.toString(), x, yy);
                    yy += fm.getHeight();
                    line = new StringBuilder(word);
                } else {
                    line = new StringBuilder(next);
                }
            }
            if (line.length() > 0) {
                g.drawString(line.toString(), x, yy);
            }
        }

        private static int ramp(double t) {
            double x = Math.max(0, Math.min(1, t)) * (RAMP.length - 1);
            int i = Math.min(RAMP.length - 2, (int) x);
            double f = x - i;
            int a = RAMP[i];
            int b = RAMP[i + 1];
            int rr = (int) Math.round(((a >> 16) & 255) * (1 - f) + ((b >> 16) & 255) * f);
            int gg = (int) Math.round(((a >> 8) & 255) * (1 - f) + ((b >> 8) & 255) * f);
            int bb = (int) Math.round((a & 255) * (1 - f) + (b & 255) * f);
            return (rr << 16) | (gg << 8) | bb;
        }

        private static int darker(int rgb) {
            int rr = ((rgb >> 16) & 255) / 3;
            int gg = ((rgb >> 8) & 255) / 3;
            int bb = (rgb & 255) / 3;
            return (rr << 16) | (gg << 8) | bb;
        }
    }
}
