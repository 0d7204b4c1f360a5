package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mesh.ObjFixtures;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn field} and the command line's contract (issue 2, item 8): the output header, numbers that round-trip
 * bit for bit to direct evaluation, the {@code --gradient} columns, {@code --out}; exit code 2 with one line on
 * stderr and no stack trace for each bad input; {@code --help} and {@code --version} exit 0. Common practice, no
 * source: the expected values are the library's own, the checks are about the interface.
 */
class FieldCommandTest {
    private static final double DENSITY = 2000;
    private static final TriangleMesh BOX = Shapes.box(1, -2, 0.5, 3, -0.5, 1.5);
    private static final double[][] POINTS = {{2, -1.25, 1}, {4.5, 0.25, -3}, {1, -1.25, 1}, {1.0e-3, 7.25, 2.125}};

    @TempDir
    Path dir;
    private Path box;
    private Path points;

    @BeforeEach
    void files() {
        box = TestShapes.write(dir.resolve("box.obj"), TestShapes.objText(BOX, 1));
        StringBuilder sb = new StringBuilder("x,y,z\n# a comment\n\n");
        for (double[] p : POINTS) {
            sb.append(p[0]).append(',').append(p[1]).append(", ").append(p[2]).append('\n');
        }
        points = TestShapes.write(dir.resolve("points.csv"), sb.toString());
    }

    private static void checkRows(String csv, boolean gradient) {
        String[] lines = csv.split("\n");
        String header = "x_m,y_m,z_m,potential_m2_s2,ax_m_s2,ay_m_s2,az_m_s2,laplacian_s2,location";
        if (gradient) {
            header += ",gxx_s2,gxy_s2,gxz_s2,gyy_s2,gyz_s2,gzz_s2";
        }
        assertEquals(header, lines[0]);
        assertEquals(POINTS.length + 1, lines.length);
        FieldEvaluator ev = new PolyhedronField(BOX, DENSITY).newEvaluator();
        double[] s = new double[FieldSample.SIZE];
        for (int i = 0; i < POINTS.length; i++) {
            String[] f = lines[i + 1].split(",");
            assertEquals(gradient ? 15 : 9, f.length, lines[i + 1]);
            ev.evaluate(POINTS[i][0], POINTS[i][1], POINTS[i][2], gradient, s, 0);
            for (int k = 0; k < 3; k++) {
                assertEquals(POINTS[i][k], Double.parseDouble(f[k]), 0.0, "coordinate round-trip");
            }
            for (int k = FieldSample.U; k <= FieldSample.LAPLACIAN; k++) {
                assertEquals(Double.doubleToLongBits(s[k]), Double.doubleToLongBits(Double.parseDouble(f[3 + k])),
                    "bit-exact slot " + k + " row " + i);
            }
            assertEquals(Location.fromCode(s[FieldSample.LOCATION]).word(), f[8]);
            if (gradient) {
                for (int k = 0; k < 6; k++) {
                    assertEquals(Double.doubleToLongBits(s[FieldSample.GXX + k]),
                        Double.doubleToLongBits(Double.parseDouble(f[9 + k])), "bit-exact tensor " + k + " row " + i);
                }
            }
        }
        assertEquals("inside", lines[1].split(",")[8]);
        assertEquals("outside", lines[2].split(",")[8]);
        assertEquals("surface", lines[3].split(",")[8]);
    }

    @Test
    void outputRoundTripsBitForBit() {
        CliRun r = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString());
        assertEquals(0, r.exit(), r.err());
        checkRows(r.out(), false);
    }

    @Test
    void gradientColumnsAndOutFile() throws Exception {
        Path out = dir.resolve("sub/field.csv");
        CliRun r = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(), "--gradient",
            "--out", out.toString(), "--threads", "2");
        assertEquals(0, r.exit(), r.err());
        assertEquals("", r.out());
        checkRows(Files.readString(out), true);
    }

    /**
     * {@code --out FILE} writes the sidecar FILE.json: SHA-256 of the CSV and of the model and points files (FIPS
     * 180-4 via MessageDigest), density, GM = G rho V of the 2 x 1.5 x 1 m box (volume by hand), G (CODATA 2018),
     * conventions and version.
     */
    @Test
    void outFileHasAMetadataSidecar() throws Exception {
        Path out = dir.resolve("field.csv");
        CliRun r = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(),
            "--out", out.toString(), "--threads", "2");
        assertEquals(0, r.exit(), r.err());
        com.fasterxml.jackson.databind.JsonNode j = new com.fasterxml.jackson.databind.ObjectMapper()
            .readTree(dir.resolve("field.csv.json").toFile());
        java.util.function.Function<Path, String> sha = p -> {
            try {
                return java.util.HexFormat.of().formatHex(java.security.MessageDigest.getInstance("SHA-256")
                    .digest(Files.readAllBytes(p)));
            } catch (Exception e) {
                throw new IllegalStateException(e);
            }
        };
        assertEquals("field.csv", j.get("data_file").asText());
        assertEquals(sha.apply(out), j.get("data_sha256").asText());
        assertEquals(sha.apply(box), j.get("model_sha256").asText());
        assertEquals(sha.apply(points), j.get("points_sha256").asText());
        assertEquals(DENSITY, j.get("density_kg_m3").asDouble(), 0.0);
        assertEquals(6.67430e-11, j.get("G_m3_kg_s2").asDouble(), 0.0);
        double gm = 6.67430e-11 * DENSITY * 2 * 1.5 * 1;
        assertEquals(gm, j.get("gm_m3_s2").asDouble(), 1e-12 * gm);
        assertTrue(j.get("conventions").asText().contains("U > 0, acceleration = grad U"));
        assertEquals(POINTS.length, j.get("rows").asInt());
        assertEquals(FieldCommand.HEADER, String.join(",", toList(j.get("columns"))));
        assertFalse(j.get("cairn_version").asText().isBlank());
    }

    private static java.util.List<String> toList(com.fasterxml.jackson.databind.JsonNode a) {
        java.util.List<String> l = new java.util.ArrayList<>();
        a.forEach(n -> l.add(n.asText()));
        return l;
    }

    /**
     * {@code --distance}: the signed distance to the box, by the elementary formula (outside: length of the excess
     * over the faces; inside: minus the distance to the nearest face; common practice, no source).
     */
    @Test
    void distanceColumnIsTheSignedDistanceToTheBox() {
        CliRun r = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(),
            "--distance");
        assertEquals(0, r.exit(), r.err());
        String[] lines = r.out().split("\n");
        assertTrue(lines[0].endsWith(",location,distance_to_surface_m"), lines[0]);
        double[] lo = {1, -2, 0.5};
        double[] hi = {3, -0.5, 1.5};
        for (int i = 0; i < POINTS.length; i++) {
            String[] f = lines[i + 1].split(",");
            assertEquals(10, f.length);
            double out = 0;
            double in = Double.POSITIVE_INFINITY;
            for (int a = 0; a < 3; a++) {
                double e = Math.max(lo[a] - POINTS[i][a], POINTS[i][a] - hi[a]);
                out += Math.max(0, e) * Math.max(0, e);
                in = Math.min(in, -e);
            }
            double expected = out > 0 ? Math.sqrt(out) : -in;
            assertEquals(expected, Double.parseDouble(f[9]), 1e-12, lines[i + 1]);
        }
    }

    private static void badInput(String expectedInMessage, String... args) {
        CliRun r = CliRun.of(args);
        assertEquals(2, r.exit(), "exit code for bad input; stderr: " + r.err());
        assertTrue(r.oneLineError(), "one line, no stack trace: [" + r.err() + "]");
        assertTrue(r.err().startsWith("cairn: error: "), r.err());
        assertTrue(r.err().contains(expectedInMessage), r.err());
        assertFalse(r.out().contains("x_m,"), "no partial output");
    }

    @Test
    void missingModelFile() {
        Path missing = dir.resolve("nope.obj");
        badInput(missing + ": no such file", "field", missing.toString(), "--density", "2000", "--points",
            points.toString());
        badInput(missing + ": no such file", "inspect", missing.toString());
    }

    @Test
    void malformedPointsRowNamesTheRow() {
        Path bad = TestShapes.write(dir.resolve("bad.csv"), "x,y,z\n1,2,3\n\n4,five,6\n");
        badInput(bad + ":4: row 4: 'five' is not a finite number", "field", box.toString(), "--density", "2000",
            "--points", bad.toString());
        // regression: a malformed first row used to be skipped silently as if it were a header
        Path badFirst = TestShapes.write(dir.resolve("badfirst.csv"), "# points\nabc,1,2\n1,2,3\n");
        badInput(badFirst + ":2: row 2: 'abc' is not a finite number", "field", box.toString(), "--density", "2000",
            "--points", badFirst.toString());
        Path shortRow = TestShapes.write(dir.resolve("short.csv"), "1,2,3\n4,5\n");
        badInput(shortRow + ":2: row 2 has 2 field(s), expected x,y,z", "field", box.toString(), "--density", "2000",
            "--points", shortRow.toString());
        badInput(dir.resolve("none.csv") + ": no such file", "field", box.toString(), "--density", "2000",
            "--points", dir.resolve("none.csv").toString());
    }

    @Test
    void openSurfaceIsRefusedByField() {
        Path open = ObjFixtures.path("open-box.obj");
        badInput(open + ": surface is open: 4 edge(s)", "field", open.toString(), "--density", "2000", "--points",
            points.toString());
        // inspect still reports on it
        CliRun r = CliRun.of("inspect", open.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("OPEN (4 boundary"), r.out());
    }

    @Test
    void badUnitsAndConflictingMassOptions() {
        badInput("--units: unknown length unit 'bogus' (use m or km)", "inspect", box.toString(), "--units", "bogus");
        badInput("mutually exclusive", "inspect", box.toString(), "--density", "2000", "--gm", "5");
        badInput("mutually exclusive", "field", box.toString(), "--mass", "2000", "--density", "5", "--points",
            points.toString());
        badInput("must be a positive number", "inspect", box.toString(), "--density", "-3");
        badInput("no density known", "field", box.toString(), "--points", points.toString());
        badInput("Missing required option: '--points=FILE' (see 'cairn field --help')", "field", box.toString(),
            "--density", "2000");
        badInput("Unknown options: '--densty'", "inspect", box.toString(), "--densty", "2000");
    }

    @Test
    void helpAndVersion() {
        CliRun h = CliRun.of("--help");
        assertEquals(0, h.exit());
        assertTrue(h.out().contains("inspect") && h.out().contains("field"), h.out());
        assertTrue(h.out().contains("U > 0") && h.out().contains("verified independently"), h.out());
        CliRun fh = CliRun.of("field", "--help");
        assertEquals(0, fh.exit());
        assertTrue(fh.out().contains("--gradient"), fh.out());
        CliRun v = CliRun.of("--version");
        assertEquals(0, v.exit());
        assertTrue(v.out().startsWith("cairn "), v.out());
    }
}
