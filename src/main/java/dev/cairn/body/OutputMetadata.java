package dev.cairn.body;

import dev.cairn.io.AtomicFiles;
import dev.cairn.io.Messages;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * What travels with an output file so that it can be traced back to its model and read correctly on its own: model
 * file and SHA-256, density, GM, spin period and pole, G, centre of mass, the field model, the sign conventions, the
 * Cairn version and the operational caution. One definition for every carrier: the JSON sidecar {@code DATA.json}
 * written beside a data file ({@link #writeSidecar}), and the field data of the survey's VTK file, which uses the same
 * key names ({@link #numbers()} and {@link #texts()}).
 *
 * <p>Units SI: kg/m³, m³/s², s, rad/s, m; model (body-fixed) frame. Values that do not apply are JSON {@code null}
 * (NaN in the VTK field data): density for a body that is not one uniform density, the spin period of a body that does
 * not spin.
 *
 * @param kind            what the data file is, e.g. "cairn survey per-facet table"
 * @param modelFile       the model file as given, or null for a body built in code
 * @param modelSha256     SHA-256 (hex) of the model file's bytes, or null
 * @param densityKgM3     bulk density, kg/m³, NaN when not one uniform density
 * @param gmM3S2          GM of the field model, m³/s²
 * @param spinPeriodS     sidereal spin period, s, infinite for a body that does not spin
 * @param spinAxis        unit spin pole, model frame
 * @param centerOfMassM   centre of mass, m, model frame (the spin axis passes through it)
 * @param fieldModel      description of the field model that produced the values
 * @param cairnVersion    version of the Cairn that wrote the file
 */
public record OutputMetadata(String kind, String modelFile, String modelSha256, double densityKgM3, double gmM3S2,
                             double spinPeriodS, double[] spinAxis, double[] centerOfMassM, String fieldModel,
                             String cairnVersion) {
    /** The sign conventions sentence carried by every output. */
    public static final String CONVENTIONS = "SI units, model (body-fixed) frame; U > 0, acceleration = grad U "
        + "(potential U -> GM/r far away, acceleration points toward the body)";
    /** The operational caution carried by every output. */
    public static final String CAUTION = "Results must be verified independently before operational use; mission "
        + "rules and the responsible flight-dynamics authority decide.";

    private static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    public OutputMetadata {
        spinAxis = spinAxis.clone();
        centerOfMassM = centerOfMassM.clone();
    }

    @Override
    public double[] spinAxis() {
        return spinAxis.clone();
    }

    @Override
    public double[] centerOfMassM() {
        return centerOfMassM.clone();
    }

    /** Spin rate ω = 2π / period, rad/s (0 for a body that does not spin). */
    public double spinRateRadS() {
        return Double.isInfinite(spinPeriodS) ? 0.0 : 2 * Math.PI / spinPeriodS;
    }

    /**
     * The numeric items, in file order: name (with unit) → values (1 or 3). NaN where an item does not apply.
     */
    public Map<String, double[]> numbers() {
        Map<String, double[]> m = new LinkedHashMap<>();
        m.put("density_kg_m3", new double[] {densityKgM3});
        m.put("gm_m3_s2", new double[] {gmM3S2});
        m.put("G_m3_kg_s2", new double[] {dev.cairn.gravity.Constants.G});
        m.put("spin_period_s", new double[] {Double.isInfinite(spinPeriodS) ? Double.NaN : spinPeriodS});
        m.put("spin_rate_rad_s", new double[] {spinRateRadS()});
        m.put("spin_axis", spinAxis.clone());
        m.put("center_of_mass_m", centerOfMassM.clone());
        return m;
    }

    /** The text items, in file order: name → text (never empty). */
    public Map<String, String> texts() {
        Map<String, String> m = new LinkedHashMap<>();
        m.put("kind", kind);
        m.put("model_file", modelFile == null ? "none (body built in code)" : modelFile);
        m.put("model_sha256", modelSha256 == null ? "none" : modelSha256);
        m.put("field_model", fieldModel);
        m.put("conventions", CONVENTIONS);
        m.put("cairn_version", cairnVersion == null || cairnVersion.isEmpty() ? "unknown" : cairnVersion);
        m.put("caution", CAUTION);
        return m;
    }

    /** The metadata as an ordered JSON object: the text and number items (single values unwrapped, NaN as null). */
    public Map<String, Object> toJson() {
        Map<String, Object> j = new LinkedHashMap<>();
        Map<String, String> t = texts();
        j.put("kind", t.get("kind"));
        j.put("model_file", modelFile);
        j.put("model_sha256", modelSha256);
        for (Map.Entry<String, double[]> e : numbers().entrySet()) {
            double[] v = e.getValue();
            if (v.length == 1) {
                j.put(e.getKey(), finite(v[0]));
            } else {
                List<Object> l = new ArrayList<>();
                for (double x : v) {
                    l.add(finite(x));
                }
                j.put(e.getKey(), l);
            }
        }
        j.put("field_model", t.get("field_model"));
        j.put("conventions", t.get("conventions"));
        j.put("cairn_version", t.get("cairn_version"));
        j.put("caution", t.get("caution"));
        return j;
    }

    private static Object finite(double v) {
        return Double.isFinite(v) ? v : null;
    }

    /** The sidecar path of a data file: {@code DATA.json} beside it (e.g. {@code facets.csv.json}). */
    public static Path sidecarPath(Path data) {
        return data.resolveSibling(data.getFileName() + ".json");
    }

    /**
     * Writes the sidecar of an already written data file atomically: this metadata, then {@code data_file},
     * {@code data_sha256} (of the data file's bytes as written) and the {@code extra} keys (in their order).
     *
     * @return the sidecar path
     */
    public Path writeSidecar(Path data, Map<String, Object> extra) {
        Map<String, Object> j = new LinkedHashMap<>();
        j.put("kind", kind);
        j.put("data_file", data.getFileName().toString());
        j.put("data_sha256", sha256(data));
        for (Map.Entry<String, Object> e : toJson().entrySet()) {
            j.putIfAbsent(e.getKey(), e.getValue());
        }
        for (Map.Entry<String, Object> e : extra.entrySet()) {
            j.putIfAbsent(e.getKey(), e.getValue());
        }
        Path side = sidecarPath(data);
        try {
            AtomicFiles.writeString(side, MAPPER.writeValueAsString(j) + "\n");
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
        return side;
    }

    /** SHA-256 (hex) of a file's bytes. */
    public static String sha256(Path file) {
        try (java.io.InputStream in = java.nio.file.Files.newInputStream(file)) {
            java.security.MessageDigest md = java.security.MessageDigest.getInstance("SHA-256");
            byte[] buf = new byte[1 << 16];
            int n;
            while ((n = in.read(buf)) > 0) {
                md.update(buf, 0, n);
            }
            return java.util.HexFormat.of().formatHex(md.digest());
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(Messages.line("cannot read " + file + ": " + e.getMessage()), e);
        } catch (java.security.NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }
}
