package dev.cairn.harmonics;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.cairn.gravity.HarmonicCoefficients;
import dev.cairn.io.AtomicFiles;
import dev.cairn.io.InputException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Coefficient files. JSON keys: {@code format}, {@code model}, {@code model_sha256}, {@code gm_m3_s2},
 * {@code reference_radius_m}, {@code brillouin_radius_m}, {@code degree}, {@code origin}, {@code origin_m},
 * {@code frame}, {@code normalization}, {@code truncation_bound} (a rigorous upper bound on the absolute error
 * of every normalised coefficient from the method's series truncation, rounding excluded; 0 for the exact rule),
 * {@code conventions}, {@code caution}, and {@code c}, {@code s} as arrays
 * indexed {@code [n][m]}, m ≤ n. CSV: the same metadata as {@code #} lines, then {@code n,m,c,s} rows.
 */
public final class HarmonicsFile {
    /** Value of the {@code format} key. */
    public static final String FORMAT = "cairn spherical-harmonic coefficients, version 1";
    /** The normalisation sentence written with every file. */
    public static final String NORMALIZATION = "4pi full normalisation: Pbar_nm = sqrt((2 - delta_m0)(2n + 1)"
        + "(n - m)!/(n + m)!) P_nm, no Condon-Shortley phase; U = (GM/r) sum_n (R/r)^n sum_m Pbar_nm(sin lat) "
        + "(C_nm cos(m lon) + S_nm sin(m lon)); c and s hold the normalised Cbar_nm, Sbar_nm indexed [n][m], m <= n";
    /** Frame sentence. */
    public static final String FRAME = "model (body-fixed) frame axes, origin at origin_m; latitude from the x-y "
        + "plane, longitude from +x counter-clockwise about +z";
    /** Sign and unit conventions. */
    public static final String CONVENTIONS = "SI units; potential U > 0 (U -> GM/r far away), acceleration = grad U; "
        + "the series converges outside the Brillouin sphere (radius brillouin_radius_m about origin_m) and "
        + "generically diverges inside it";
    /** Caution carried by every file. */
    public static final String CAUTION = "Caution: results must be verified independently before operational use; "
        + "mission rules and the responsible flight-dynamics authority decide.";

    private HarmonicsFile() {
    }

    /** Descriptive metadata of a file: where the coefficients come from. */
    public record Source(String model, String sha256, String origin) {
    }

    /** The metadata keys (everything but {@code c}, {@code s}) in file order. */
    static Map<String, Object> metadata(HarmonicCoefficients h, Source src) {
        Map<String, Object> j = new LinkedHashMap<>();
        j.put("format", FORMAT);
        j.put("model", src.model());
        j.put("model_sha256", src.sha256());
        j.put("gm_m3_s2", h.gm());
        j.put("reference_radius_m", h.referenceRadius());
        j.put("brillouin_radius_m", h.brillouinRadius());
        j.put("degree", h.degree());
        j.put("origin", src.origin());
        j.put("origin_m", h.origin());
        j.put("frame", FRAME);
        j.put("normalization", NORMALIZATION);
        j.put("truncation_bound", h.truncationBound());
        j.put("conventions", CONVENTIONS);
        j.put("caution", CAUTION);
        return j;
    }

    /** The JSON text. */
    public static String json(HarmonicCoefficients h, Source src) {
        Map<String, Object> j = metadata(h, src);
        double[][] c = new double[h.degree() + 1][];
        double[][] s = new double[h.degree() + 1][];
        for (int n = 0; n <= h.degree(); n++) {
            c[n] = new double[n + 1];
            s[n] = new double[n + 1];
            for (int m = 0; m <= n; m++) {
                c[n][m] = h.c(n, m);
                s[n][m] = h.s(n, m);
            }
        }
        j.put("c", c);
        j.put("s", s);
        try {
            return new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(j) + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    /** The CSV text: metadata as {@code #} lines, then {@code n,m,c,s}. */
    public static String csv(HarmonicCoefficients h, Source src) {
        StringBuilder sb = new StringBuilder();
        for (Map.Entry<String, Object> e : metadata(h, src).entrySet()) {
            Object v = e.getValue();
            String text = v instanceof double[] d ? String.format(Locale.ROOT, "[%s, %s, %s]", d[0], d[1], d[2])
                : String.valueOf(v);
            sb.append("# ").append(e.getKey()).append(": ").append(text).append('\n');
        }
        sb.append("n,m,c,s\n");
        for (int n = 0; n <= h.degree(); n++) {
            for (int m = 0; m <= n; m++) {
                sb.append(n).append(',').append(m).append(',').append(h.c(n, m)).append(',').append(h.s(n, m))
                    .append('\n');
            }
        }
        return sb.toString();
    }

    /** Writes JSON or CSV (by the extension of {@code out}, {@code .csv} for CSV) atomically. */
    public static void write(Path out, HarmonicCoefficients h, Source src) {
        boolean csv = out.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".csv");
        AtomicFiles.writeString(out, csv ? csv(h, src) : json(h, src));
    }

    /**
     * Reads a JSON coefficient file, checking every value (finite, positive GM and radius, degree 0 to
     * {@link HarmonicCoefficients#MAX_DEGREE}, n + 1 orders per degree, S̄_n0 = 0).
     *
     * @throws InputException one line naming the file, the key and the problem
     */
    public static HarmonicCoefficients read(Path file) {
        JsonNode root;
        try {
            if (Files.size(file) > 64L << 20) {
                throw InputException.at(file.toString(), 0, "larger than 64 MB: not a coefficient file");
            }
            root = new ObjectMapper().readTree(file.toFile());
        } catch (JsonProcessingException e) {
            throw InputException.json(file, e, "bad coefficient file", "docs/harmonics.md");
        } catch (IOException e) {
            throw InputException.at(file.toString(), 0, "cannot read: " + e.getMessage(), e);
        }
        String f = file.toString();
        if (root == null || !root.isObject()) {
            throw InputException.at(f, 0, "not a JSON object of coefficients (docs/harmonics.md)");
        }
        double gm = number(root, "gm_m3_s2", f);
        if (!(gm > 0 && gm <= HarmonicCoefficients.MAX_GM)) {
            throw InputException.at(f, 0, "key 'gm_m3_s2': must be positive and at most " + HarmonicCoefficients.MAX_GM
                + " m^3/s^2, got " + gm);
        }
        double ref = radius(root, "reference_radius_m", f);
        double rb = Double.NaN;
        if (root.has("brillouin_radius_m") && !root.get("brillouin_radius_m").isNull()) {
            rb = radius(root, "brillouin_radius_m", f);
        }
        JsonNode o = root.get("origin_m");
        if (o == null || !o.isArray() || o.size() != 3) {
            throw InputException.at(f, 0, "key 'origin_m': must be an array of three numbers (m)");
        }
        double[] origin = new double[3];
        for (int i = 0; i < 3; i++) {
            if (!o.get(i).isNumber() || !Double.isFinite(o.get(i).asDouble())
                || Math.abs(o.get(i).asDouble()) > dev.cairn.io.Numbers.MAX_POINT_M) {
                throw InputException.at(f, 0, "key 'origin_m': element " + i + " is not a finite number within "
                    + dev.cairn.io.Numbers.MAX_POINT_M + " m");
            }
            origin[i] = o.get(i).asDouble();
        }
        JsonNode dn = root.get("degree");
        if (dn == null || !dn.canConvertToInt() || !dn.isIntegralNumber()) {
            throw InputException.at(f, 0, "key 'degree': missing or not an integer");
        }
        int degree = dn.asInt();
        if (degree < 0 || degree > HarmonicCoefficients.MAX_DEGREE) {
            throw InputException.at(f, 0, "key 'degree': " + degree + " outside 0.." + HarmonicCoefficients.MAX_DEGREE);
        }
        double[][] c = triangle(root, "c", degree, f);
        double[][] s = triangle(root, "s", degree, f);
        for (int n = 0; n <= degree; n++) {
            if (s[n][0] != 0) {
                throw InputException.at(f, 0, "key 's': s[" + n + "][0] must be 0, got " + s[n][0]);
            }
        }
        if (Math.abs(c[0][0] - 1) > 1e-9) {
            throw InputException.at(f, 0, "key 'c': c[0][0] must be 1 (GM carries the mass), got " + c[0][0]);
        }
        double bound = 0;
        if (root.has("truncation_bound") && !root.get("truncation_bound").isNull()) {
            bound = number(root, "truncation_bound", f);
            if (!(bound >= 0)) {
                throw InputException.at(f, 0, "key 'truncation_bound': must be 0 or more, got " + bound);
            }
        }
        return new HarmonicCoefficients(gm, ref, rb, origin, c, s, bound);
    }

    /** A radius key within [{@link HarmonicCoefficients#MIN_RADIUS_M}, {@link HarmonicCoefficients#MAX_RADIUS_M}]. */
    private static double radius(JsonNode root, String key, String f) {
        double r = number(root, key, f);
        if (!(r >= HarmonicCoefficients.MIN_RADIUS_M && r <= HarmonicCoefficients.MAX_RADIUS_M)) {
            throw InputException.at(f, 0, "key '" + key + "': must be between " + HarmonicCoefficients.MIN_RADIUS_M
                + " and " + HarmonicCoefficients.MAX_RADIUS_M + " m, got " + r);
        }
        return r;
    }

    private static double number(JsonNode root, String key, String f) {
        JsonNode v = root.get(key);
        if (v == null || !v.isNumber()) {
            throw InputException.at(f, 0, "key '" + key + "': missing or not a number");
        }
        double d = v.asDouble();
        if (!Double.isFinite(d)) {
            throw InputException.at(f, 0, "key '" + key + "': not finite");
        }
        return d;
    }

    private static double[][] triangle(JsonNode root, String key, int degree, String f) {
        JsonNode a = root.get(key);
        if (a == null || !a.isArray() || a.size() != degree + 1) {
            throw InputException.at(f, 0, "key '" + key + "': must be an array of degree + 1 = " + (degree + 1)
                + " rows");
        }
        List<double[]> rows = new ArrayList<>();
        for (int n = 0; n <= degree; n++) {
            JsonNode row = a.get(n);
            if (!row.isArray() || row.size() != n + 1) {
                throw InputException.at(f, 0, "key '" + key + "': row " + n + " must hold " + (n + 1) + " numbers");
            }
            double[] r = new double[n + 1];
            for (int m = 0; m <= n; m++) {
                JsonNode v = row.get(m);
                if (!v.isNumber() || !Double.isFinite(v.asDouble())
                    || Math.abs(v.asDouble()) > HarmonicCoefficients.MAX_COEFFICIENT) {
                    throw InputException.at(f, 0, "key '" + key + "': [" + n + "][" + m + "] is not a finite number "
                        + "of at most " + HarmonicCoefficients.MAX_COEFFICIENT + " in size");
                }
                r[m] = v.asDouble();
            }
            rows.add(r);
        }
        return rows.toArray(new double[0][]);
    }
}
