package dev.cairn.viewer;

import dev.cairn.body.BodyModel;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import dev.cairn.mesh.TriangleMesh;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.function.IntToDoubleFunction;

/**
 * Test fixture: writes a mesh as an OBJ file and a survey directory for it in the survey command's format
 * (facets.csv columns looked up by name, summary.json with model_sha256 and facets), with values the test chooses.
 * The values are invented for the tests; they are not physics.
 */
final class SyntheticSurvey {
    static final String HEADER = "facet,cx_m,cy_m,cz_m,lat_deg,lon_deg,slope_deg,g_eff_m_s2,potential_eff_m2_s2,"
        + "dynamic_height_m,g_m_s2,g_normal_m_s2,g_tangential_m_s2,lift_off,escape_speed_m_s,hover_accel_m_s2,zone,"
        + "extra_col";

    private SyntheticSurvey() {
    }

    /** Writes {@code mesh} as an OBJ file (metres). */
    static Path writeObj(TriangleMesh mesh, Path file) throws IOException {
        return dev.cairn.TestShapes.writeObj(mesh, file);
    }

    /** Loads the OBJ as the commands do. */
    static BodyModel load(Path obj) {
        return ModelLoader.load(obj, ModelRequest.DEFAULTS);
    }

    /**
     * Writes {@code dir/facets.csv} and {@code dir/summary.json} for {@code obj}.
     *
     * @param slope slope per facet (deg); other continuous columns are simple functions of the facet centroid
     * @param zone  zone rank per facet (0 = none)
     */
    static void write(Path dir, Path obj, TriangleMesh mesh, IntToDoubleFunction slope, IntToDoubleFunction zone)
        throws IOException {
        Files.createDirectories(dir);
        double[] c = mesh.facetCentroids();
        int n = mesh.facetCount();
        StringBuilder sb = new StringBuilder(HEADER).append('\n');
        for (int f = 0; f < n; f++) {
            double x = c[3 * f];
            double y = c[3 * f + 1];
            double z = c[3 * f + 2];
            double r = Math.sqrt(x * x + y * y + z * z);
            sb.append(String.format(Locale.ROOT, "%d,%.6f,%.6f,%.6f,%.6f,%.6f,%.6f,%.6e,%.6e,%.6f,%.6e,%.6e,%.6e,%d,"
                    + "%.6f,%.6e,%d,%s%n",
                f, x, y, z, Math.toDegrees(Math.asin(z / r)), Math.toDegrees(Math.atan2(y, x)), slope.applyAsDouble(f),
                1e-4 + 1e-6 * z, 2.0 + 1e-3 * z, z - 10, 1e-4, 1e-4, 0.0, z > 0.9 * r ? 1 : 0, 0.2, 1e-4,
                (int) zone.applyAsDouble(f), "x"));
        }
        Files.writeString(dir.resolve("facets.csv"), sb.toString(), StandardCharsets.UTF_8);
        writeSummary(dir, SurveyData.sha256(obj), n);
    }

    static void writeSummary(Path dir, String sha, int facets) throws IOException {
        Files.writeString(dir.resolve("summary.json"), "{\n  \"model_sha256\": \"" + sha + "\",\n  \"facets\": "
            + facets + ",\n  \"zones\": []\n}\n", StandardCharsets.UTF_8);
    }
}
