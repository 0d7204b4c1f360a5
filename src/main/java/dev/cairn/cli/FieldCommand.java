package dev.cairn.cli;

import dev.cairn.gravity.BatchEvaluation;
import dev.cairn.gravity.FieldCheck;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.io.AtomicFiles;
import dev.cairn.body.BodyModel;
import dev.cairn.body.OutputMetadata;
import dev.cairn.io.PointsCsv;
import dev.cairn.util.ParallelChunks;
import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

/** {@code cairn field}: the field of a model at points read from CSV. */
@Command(name = "field", mixinStandardHelpOptions = true,
    header = "Evaluate the gravity field at points read from CSV.",
    description = {"Evaluate the gravity field at points given in a CSV file (x,y,z in metres, model frame).",
        "Output CSV: potential U > 0 (m^2/s^2), acceleration = grad U (m/s^2), Laplacian (1/s^2), location,",
        "and with --gradient the gravity-gradient tensor (1/s^2).",
        "MODEL may be a body description of density regions (.json). With --model mascon the Laplacian is 0 and the",
        "location 'unknown'; a mass-property report of the mascon set goes to stderr."})
public final class FieldCommand implements Callable<Integer> {
    @Mixin
    ModelOptions model = new ModelOptions();

    @Mixin
    MasconOptions fieldChoice = new MasconOptions();

    @Option(names = "--points", required = true, paramLabel = "FILE", description = "CSV of field points x,y,z in m.")
    Path points;

    @Option(names = "--gradient", description = "Also write the gravity-gradient tensor (6 unique components).")
    boolean gradient;

    @Option(names = "--distance", description = "Also write the exact signed distance to the surface "
        + "(distance_to_surface_m, negative inside).")
    boolean distance;

    @Option(names = "--out", paramLabel = "FILE", description = "Output CSV (default: standard output); its "
        + "metadata (model SHA-256, density, GM, spin, G, conventions, version) goes to FILE.json.")
    Path out;

    @Option(names = "--threads", paramLabel = "N", description = "Worker threads (default: all processors).")
    int threads = ParallelChunks.defaultThreads();

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    /** The output header, a contract other tools rely on. */
    public static final String HEADER = "x_m,y_m,z_m,potential_m2_s2,ax_m_s2,ay_m_s2,az_m_s2,laplacian_s2,location";
    /** Extra header columns with {@code --gradient}. */
    public static final String GRADIENT_HEADER = ",gxx_s2,gxy_s2,gxz_s2,gyy_s2,gyz_s2,gzz_s2";

    @Override
    public Integer call() throws IOException {
        BodyModel body = model.load(null);
        PrintWriter err = spec.commandLine().getErr();
        for (String w : body.warnings()) {
            err.println("cairn: warning: " + w);
        }
        double[] xyz = PointsCsv.read(points);
        FieldModel field = fieldChoice.build(body, xyz.length / 3, Math.max(1, threads), err);
        double[] res;
        try (ProgressBar bar = new ProgressBar("field")) {
            res = BatchEvaluation.evaluate(field, xyz, gradient, Math.max(1, threads), bar);
        }
        MasconOptions.warnTooClose(field, xyz.length / 3, err);
        if (field.exactModel() != field && !Double.isNaN(field.tolerance())) {
            err.println("cairn: " + FieldCheck.measure(field, xyz, FieldCheck.DEFAULT_SAMPLES, 1L,
                Math.max(1, threads)).line());
        }
        double[] dist = distance ? distances(body, xyz) : null;
        if (out == null) {
            PrintWriter o = spec.commandLine().getOut();
            StringBuilder sb = new StringBuilder();
            write(sb, xyz, res, dist);
            o.print(sb);
            o.flush();
        } else {
            // An old sidecar goes first: killed between the two writes, the CSV has no sidecar, never a wrong one.
            Path oldSide = OutputMetadata.sidecarPath(out);
            dev.cairn.io.RunInputs.requireWritable(oldSide.toAbsolutePath()); // never an input, e.g. a model sidecar
            dev.cairn.io.RunInputs.requireWritable(out.toAbsolutePath());
            if (java.nio.file.Files.isRegularFile(oldSide, java.nio.file.LinkOption.NOFOLLOW_LINKS)) {
                java.nio.file.Files.delete(oldSide);
            }
            AtomicFiles.write(out, os -> writeTo(os, xyz, res, dist));
            Path side = writeSidecar(body, field, xyz.length / 3, dist != null);
            err.println("cairn: wrote " + (xyz.length / 3) + " points to " + out + " (metadata in " + side + ")");
        }
        return 0;
    }

    /**
     * {@code FILE.json} beside {@code --out FILE}, atomically: the model's {@link OutputMetadata} (file, SHA-256,
     * density, GM of the field used, spin, G, conventions, version), the CSV's SHA-256, the points file and its
     * SHA-256, and the columns.
     */
    private Path writeSidecar(BodyModel body, FieldModel field, int n, boolean withDistance) {
        Path src = body.source();
        OutputMetadata meta = new OutputMetadata("cairn field values at points", src == null ? null : src.toString(),
            src == null ? null : OutputMetadata.sha256(src), body.density(), field.gm(),
            body.spin() == null ? Double.POSITIVE_INFINITY : body.spin().periodSeconds(),
            body.spin() == null ? new double[] {0, 0, 1} : body.spin().axis(), body.massProperties().centerOfMass(),
            field.describe(), VersionProvider.version());
        java.util.Map<String, Object> extra = new java.util.LinkedHashMap<>();
        extra.put("data_layout", "CSV, UTF-8; header line of column names first, then one row per point in the "
            + "order of the points file; location is inside, outside, surface or unknown");
        extra.put("rows", n);
        String header = HEADER + (gradient ? GRADIENT_HEADER : "") + (withDistance ? ","
            + dev.cairn.tables.TableLayout.DISTANCE : "");
        extra.put("columns", java.util.List.of(header.split(",")));
        extra.put("points_file", points.toString());
        extra.put("points_sha256", OutputMetadata.sha256(points));
        extra.put("spin_note", "the values are the gravity of the body (no centrifugal term); the spin state is given "
            + "to identify the model");
        return meta.writeSidecar(out, extra);
    }

    /** Exact signed distances of the points to the body's (outer) surface, m, negative inside. */
    private double[] distances(BodyModel body, double[] xyz) {
        dev.cairn.mascon.SurfaceQuery q = new dev.cairn.mascon.SurfaceQuery(body.mesh());
        int n = xyz.length / 3;
        double[] d = new double[n];
        ParallelChunks.run(n, Math.max(1, threads), () -> new double[4], (w, from, to) -> {
            for (int i = from; i < to; i++) {
                d[i] = q.signedDistance(xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2], w);
            }
        }, dev.cairn.util.ProgressListener.NONE);
        return d;
    }

    private void writeTo(OutputStream os, double[] xyz, double[] res, double[] dist) throws IOException {
        StringBuilder sb = new StringBuilder(1 << 16);
        write(sb, xyz, res, dist);
        os.write(sb.toString().getBytes(StandardCharsets.UTF_8));
    }

    private void write(StringBuilder sb, double[] xyz, double[] res, double[] dist) {
        sb.append(HEADER);
        if (gradient) {
            sb.append(GRADIENT_HEADER);
        }
        if (dist != null) {
            sb.append(",").append(dev.cairn.tables.TableLayout.DISTANCE);
        }
        sb.append('\n');
        int n = xyz.length / 3;
        for (int i = 0; i < n; i++) {
            int o = i * FieldSample.SIZE;
            sb.append(xyz[3 * i]).append(',').append(xyz[3 * i + 1]).append(',').append(xyz[3 * i + 2]);
            for (int k = FieldSample.U; k <= FieldSample.LAPLACIAN; k++) {
                sb.append(',').append(res[o + k]);
            }
            sb.append(',').append(Location.fromCode(res[o + FieldSample.LOCATION]).word());
            if (gradient) {
                for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                    sb.append(',').append(res[o + k]);
                }
            }
            if (dist != null) {
                sb.append(',').append(dist[i]);
            }
            sb.append('\n');
        }
    }
}
