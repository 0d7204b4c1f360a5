package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.TestShapes;
import dev.cairn.gravity.Constants;
import dev.cairn.mesh.Shapes;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn inspect} (issue 2, item 8): the JSON keys and their values for a generated box, against the handbook
 * box formulas (volume abc, area 2(ab+bc+ca), I_x = M(b²+c²)/12, Brillouin radius = half diagonal); {@code --gm} and
 * {@code --mass} set the density (ρ = GM/(G·V), ρ = M/V); {@code --units km} scales to metres.
 */
class InspectCommandTest {
    /** Exact formulas on an exact box, relative. */
    private static final double REL_TOL = 1e-13;
    private static final double A = 2;
    private static final double B = 1.5;
    private static final double C = 1;

    @TempDir
    Path dir;
    private Path box;

    @BeforeEach
    void writeBox() {
        box = TestShapes.write(dir.resolve("box.obj"), TestShapes.objText(Shapes.box(1, -2, 0.5, 1 + A, -2 + B, 0.5 + C), 1));
    }

    private JsonNode json(String... extra) throws Exception {
        String[] args = new String[3 + extra.length];
        args[0] = "inspect";
        args[1] = box.toString();
        args[2] = "--json";
        System.arraycopy(extra, 0, args, 3, extra.length);
        CliRun r = CliRun.of(args);
        assertEquals(0, r.exit(), r.err());
        return new ObjectMapper().readTree(r.out());
    }

    private static void rel(double expected, double actual, String what) {
        assertEquals(expected, actual, REL_TOL * Math.abs(expected), what);
    }

    @Test
    void jsonHasTheContractKeysWithHandbookValues() throws Exception {
        JsonNode j = json("--density", "2000");
        for (String key : new String[] {"facets", "vertices", "closed", "volume_m3", "surface_area_m2", "mass_kg",
            "density_kg_m3", "center_of_mass_m", "inertia_kg_m2", "principal_moments_kg_m2", "principal_axes",
            "brillouin_radius_m"}) {
            assertTrue(j.has(key), "key " + key);
        }
        assertEquals(12, j.get("facets").asInt());
        assertEquals(8, j.get("vertices").asInt());
        assertTrue(j.get("closed").isBoolean() && j.get("closed").asBoolean());
        double v = A * B * C;
        double m = 2000 * v;
        rel(v, j.get("volume_m3").asDouble(), "volume");
        rel(2 * (A * B + B * C + C * A), j.get("surface_area_m2").asDouble(), "area");
        rel(m, j.get("mass_kg").asDouble(), "mass");
        rel(2000, j.get("density_kg_m3").asDouble(), "density");
        JsonNode com = j.get("center_of_mass_m");
        assertEquals(3, com.size());
        rel(2, com.get(0).asDouble(), "com x");
        rel(-1.25, com.get(1).asDouble(), "com y");
        rel(1, com.get(2).asDouble(), "com z");
        JsonNode in = j.get("inertia_kg_m2");
        assertEquals(3, in.size());
        double[] diag = {m * (B * B + C * C) / 12, m * (A * A + C * C) / 12, m * (A * A + B * B) / 12};
        for (int i = 0; i < 3; i++) {
            assertEquals(3, in.get(i).size());
            for (int k = 0; k < 3; k++) {
                assertEquals(i == k ? diag[i] : 0, in.get(i).get(k).asDouble(), REL_TOL * diag[2], "I[" + i + "][" + k + "]");
            }
            rel(diag[i], j.get("principal_moments_kg_m2").get(i).asDouble(), "principal moment " + i);
            JsonNode ax = j.get("principal_axes").get(i);
            double n = Math.sqrt(sq(ax.get(0).asDouble()) + sq(ax.get(1).asDouble()) + sq(ax.get(2).asDouble()));
            assertEquals(1.0, n, 1e-15, "unit axis " + i);
            assertEquals(1.0, Math.abs(ax.get(i).asDouble()), 1e-15, "axis " + i + " along model axis " + i);
        }
        rel(Math.sqrt(A * A + B * B + C * C) / 2, j.get("brillouin_radius_m").asDouble(), "Brillouin radius");
    }

    @Test
    void gmAndMassSetTheDensity() throws Exception {
        double v = A * B * C;
        double gm = 0.25;
        rel(gm / (Constants.G * v), json("--gm", String.valueOf(gm)).get("density_kg_m3").asDouble(), "ρ from --gm");
        rel(gm, json("--gm", String.valueOf(gm)).get("mass_kg").asDouble() * Constants.G, "GM back");
        rel(9000.0 / v, json("--mass", "9000").get("density_kg_m3").asDouble(), "ρ from --mass");
        rel(9000.0, json("--mass", "9000").get("mass_kg").asDouble(), "mass");
    }

    @Test
    void kilometreUnits() throws Exception {
        JsonNode j = json("--units", "km", "--density", "1000");
        rel(A * B * C * 1e9, j.get("volume_m3").asDouble(), "volume in m^3");
        rel(Math.sqrt(A * A + B * B + C * C) / 2 * 1000, j.get("brillouin_radius_m").asDouble(), "R_B in m");
    }

    @Test
    void withoutDensityMassIsNull() throws Exception {
        JsonNode j = json();
        assertTrue(j.get("mass_kg").isNull());
        assertTrue(j.get("density_kg_m3").isNull());
        rel(A * B * C, j.get("volume_m3").asDouble(), "volume still known");
    }

    @Test
    void textReport() {
        CliRun r = CliRun.of("inspect", box.toString(), "--density", "2000");
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("fit for the polyhedron field"), r.out());
        assertTrue(r.out().contains("Volume       3.00000000 m^3"), r.out());
    }

    @Test
    void inwardModelIsFlippedWithAWarningOnStderr() throws Exception {
        Path inward = dev.cairn.mesh.ObjFixtures.path("cube-inward.obj");
        CliRun r = CliRun.of("inspect", inward.toString(), "--json", "--density", "1000");
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.err().startsWith("cairn: warning: " + inward + ": facets face inward"), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        rel(1.0, j.get("volume_m3").asDouble(), "volume after the flip");
        assertEquals(1, j.get("warnings").size());
    }

    private static double sq(double x) {
        return x * x;
    }
}
