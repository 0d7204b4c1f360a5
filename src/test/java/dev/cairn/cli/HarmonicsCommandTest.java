package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.TestShapes;
import dev.cairn.gravity.Constants;
import dev.cairn.mesh.Shapes;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code cairn harmonics} and the harmonic field choice of {@code field}: outputs, region bodies, bad input. */
class HarmonicsCommandTest {
    /** Agreement of exact computations up to rounding (common practice, no source). */
    private static final double EXACT = 1e-12;

    @TempDir
    Path dir;

    private Path box() throws Exception {
        return TestShapes.writeObj(Shapes.box(0.2, -0.4, 0.1, 2.2, 0.8, 0.8), dir.resolve("box.obj"));
    }

    /** Bad input gives one line on stderr and exit code 2, and writes nothing (RULES: bad input). */
    @Test
    void badInputIsOneLineWithExitTwo() throws Exception {
        Path box = box();
        Path out = dir.resolve("never.json");
        List<String[]> cases = List.of(
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "-1", "--out", out.toString()},
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "100000"},
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "61"},
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "4", "--reference-radius", "0"},
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "4", "--reference-radius",
                "-3"},
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "4", "--reference-radius",
                "NaN"},
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "4", "--reference-radius",
                "1e-150"}, // GM/(G R^3) would overflow: refused (found by the fuzz campaign)
            new String[] {"harmonics", box.toString(), "--density", "2000", "--degree", "4", "--origin", "middle"},
            new String[] {"harmonics", box.toString(), "--density", "2000"});
        for (String[] args : cases) {
            CliRun r = CliRun.of(args);
            assertEquals(2, r.exit(), String.join(" ", args) + ": " + r.err());
            assertTrue(r.oneLineError(), String.join(" ", args) + ": " + r.err());
        }
        assertFalse(Files.exists(out));
        Path points = dir.resolve("p.csv");
        Files.writeString(points, "x,y,z\n5,0,0\n");
        Path badCoeff = dir.resolve("bad.json");
        Files.writeString(badCoeff, "{\"gm_m3_s2\": 1, \"reference_radius_m\": -1, \"origin_m\": [0,0,0], "
            + "\"degree\": 0, \"c\": [[1]], \"s\": [[0]]}");
        for (String[] args : List.of(
            new String[] {"field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
                "harmonics", "--degree", "-2"},
            new String[] {"field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
                "harmonics"},
            new String[] {"field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
                "harmonics", "--coefficients", badCoeff.toString()})) {
            CliRun r = CliRun.of(args);
            assertEquals(2, r.exit(), String.join(" ", args) + ": " + r.err());
            assertTrue(r.oneLineError(), r.err());
        }
        Path tinyRef = dir.resolve("tiny.json");
        Files.writeString(tinyRef, "{\"gm_m3_s2\": 1, \"reference_radius_m\": 1e-150, \"origin_m\": [0,0,0], "
            + "\"degree\": 0, \"c\": [[1]], \"s\": [[0]]}");
        CliRun tiny = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(),
            "--model", "harmonics", "--coefficients", tinyRef.toString());
        assertEquals(2, tiny.exit(), tiny.err());
        assertTrue(tiny.oneLineError() && tiny.err().contains("reference_radius_m"), tiny.err());
        CliRun r = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
            "harmonics", "--coefficients", badCoeff.toString());
        assertTrue(r.err().contains("bad.json") && r.err().contains("reference_radius_m"), r.err());
    }

    /**
     * JSON and CSV outputs carry the required keys; the file read back by {@code field --coefficients} gives the same
     * field as {@code --model harmonics --degree N}, and points inside the Brillouin sphere are counted in one warning
     * line (shared references §5: the series diverges there).
     */
    @Test
    void outputsRoundTripThroughTheFieldCommand() throws Exception {
        Path box = box();
        Path json = dir.resolve("h.json");
        Path csv = dir.resolve("h.csv");
        CliRun a = CliRun.of("harmonics", box.toString(), "--density", "2000", "--degree", "8", "--out",
            json.toString());
        assertEquals(0, a.exit(), a.err());
        assertTrue(a.out().contains("J2 = -C20") && a.out().contains("Brillouin radius") && a.out().contains("Caution"),
            a.out());
        JsonNode j = new ObjectMapper().readTree(json.toFile());
        for (String key : List.of("gm_m3_s2", "reference_radius_m", "degree", "origin_m", "normalization", "c", "s",
            "model_sha256", "conventions", "caution")) {
            assertTrue(j.has(key), key);
        }
        assertEquals(8, j.get("degree").asInt());
        assertEquals(9, j.get("c").size());
        assertEquals(5, j.get("c").get(4).size());
        assertEquals(64, j.get("model_sha256").asText().length());
        assertTrue(j.get("normalization").asText().contains("no Condon-Shortley phase"));
        // default origin: the centre of mass of the box (handbook: its centre)
        assertEquals(1.2, j.get("origin_m").get(0).asDouble(), 1e-12);
        assertEquals(0.2, j.get("origin_m").get(1).asDouble(), 1e-12);
        assertEquals(0.45, j.get("origin_m").get(2).asDouble(), 1e-12);
        assertEquals(Constants.G * 2000 * 2 * 1.2 * 0.7, j.get("gm_m3_s2").asDouble(), EXACT * 1e-7);
        CliRun b = CliRun.of("harmonics", box.toString(), "--density", "2000", "--degree", "8", "--out",
            csv.toString());
        assertEquals(0, b.exit(), b.err());
        String text = Files.readString(csv);
        assertTrue(text.contains("# gm_m3_s2: ") && text.contains("\nn,m,c,s\n") && text.contains("\n8,8,"), text);
        assertEquals(45, text.lines().filter(l -> l.matches("[0-9]+,[0-9]+,.*")).count());

        Path points = dir.resolve("p.csv");
        Files.writeString(points, "x,y,z\n5,0.5,-1\n-3,2,4\n1.3,0.3,0.5\n");
        CliRun f1 = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
            "harmonics", "--degree", "8", "--gradient");
        CliRun f2 = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
            "harmonics", "--coefficients", json.toString(), "--gradient");
        assertEquals(0, f1.exit(), f1.err());
        assertEquals(0, f2.exit(), f2.err());
        assertEquals(f1.out(), f2.out());
        assertTrue(f1.err().contains("1 of 3 point(s) lie inside the Brillouin sphere"), f1.err());
        assertEquals(1, f1.err().lines().filter(l -> l.contains("Brillouin")).count());
    }

    /**
     * {@code table --model harmonics}: a point-grid table of the series holds, node for node, the values
     * {@code field --model harmonics} writes for the same points (same model, so bit-identical up to the decimal
     * text), names the model in its sidecar, and counts the node inside the Brillouin sphere in one warning line
     * (shared references §5: the series diverges there).
     */
    @Test
    void tableOfTheHarmonicModelMatchesTheFieldCommand() throws Exception {
        Path box = box();
        Path points = dir.resolve("p.csv");
        Files.writeString(points, "x,y,z\n5,0.5,-1\n-3,2,4\n1.3,0.3,0.5\n");
        Path table = dir.resolve("t.csv");
        CliRun t = CliRun.of("table", box.toString(), "--density", "2000", "--grid", "points", "--points",
            points.toString(), "--model", "harmonics", "--degree", "8", "--out", table.toString());
        assertEquals(0, t.exit(), t.err());
        assertTrue(t.err().contains("1 of 3 point(s) lie inside the Brillouin sphere"), t.err());
        CliRun f = CliRun.of("field", box.toString(), "--density", "2000", "--points", points.toString(), "--model",
            "harmonics", "--degree", "8");
        assertEquals(0, f.exit(), f.err());
        List<String> tableRows = Files.readAllLines(table).stream().filter(l -> l.matches("-?[0-9].*")).toList();
        List<String> fieldRows = f.out().lines().filter(l -> l.matches("-?[0-9].*")).toList();
        assertEquals(3, tableRows.size());
        assertEquals(3, fieldRows.size());
        for (int i = 0; i < 3; i++) {
            String[] a = tableRows.get(i).split(",");
            String[] b = fieldRows.get(i).split(",");
            for (int c = 0; c < 7; c++) { // x, y, z, U, ax, ay, az
                assertEquals(Double.parseDouble(b[c]), Double.parseDouble(a[c]), 0.0, "row " + i + " column " + c);
            }
        }
        JsonNode side = new ObjectMapper().readTree(dir.resolve("t.csv.json").toFile());
        assertTrue(side.get("model").get("field").asText().contains("spherical harmonics to degree 8"),
            side.toString());
    }

    /**
     * Region body (outer box and a denser inner box offset along x) by superposition: degree 2 against the closed
     * forms C20 = (A+B−2C)/(2MR²), C22 = (B−A)/(4MR²) (shared references §3, "any body") with the composite inertia
     * from the handbook box inertia and the parallel-axis theorem (references §4); products of inertia vanish by
     * symmetry, so the model axes are principal.
     */
    @Test
    void regionBodyDegreeTwoMatchesCompositeInertia() throws Exception {
        TestShapes.writeObj(Shapes.box(-2, -1, -0.8, 2, 1, 0.8), dir.resolve("outer.obj"));
        TestShapes.writeObj(Shapes.box(0.5, -0.5, -0.4, 1.5, 0.5, 0.4), dir.resolve("inner.obj"));
        Path desc = dir.resolve("body.json");
        Files.writeString(desc, "{\"regions\": [{\"name\": \"mantle\", \"shape\": \"outer.obj\", \"density_kg_m3\": "
            + "1000}, {\"name\": \"core\", \"shape\": \"inner.obj\", \"density_kg_m3\": 3000}]}");
        Path json = dir.resolve("r.json");
        CliRun r = CliRun.of("harmonics", desc.toString(), "--degree", "4", "--reference-radius", "2", "--out",
            json.toString());
        assertEquals(0, r.exit(), r.err());
        JsonNode j = new ObjectMapper().readTree(json.toFile());
        // the whole outer box at 1000 kg/m^3 (sides 4, 2, 1.6) plus the inner box (sides 1, 1, 0.8, centre x = 1)
        // at the contrast 3000 - 1000: the same mass distribution as mantle and core
        double m1 = 1000 * 4 * 2 * 1.6;
        double m2 = 2000 * 1 * 1 * 0.8;
        double mass = m1 + m2;
        double xc = m2 * 1.0 / mass;
        double[] i1 = {m1 * (4 + 2.56) / 12, m1 * (16 + 2.56) / 12, m1 * (16 + 4) / 12};
        double[] i2 = {m2 * (1 + 0.64) / 12, m2 * (1 + 0.64) / 12, m2 * (1 + 1) / 12};
        double ixx = i1[0] + i2[0];
        double iyy = i1[1] + m1 * xc * xc + i2[1] + m2 * (1 - xc) * (1 - xc);
        double izz = i1[2] + m1 * xc * xc + i2[2] + m2 * (1 - xc) * (1 - xc);
        double c20 = (ixx + iyy - 2 * izz) / (2 * mass * 4);
        double c22 = (iyy - ixx) / (4 * mass * 4);
        assertEquals(xc, j.get("origin_m").get(0).asDouble(), 1e-12);
        assertEquals(Constants.G * mass, j.get("gm_m3_s2").asDouble(), EXACT * Constants.G * mass);
        assertEquals(c20 / Math.sqrt(5), j.get("c").get(2).get(0).asDouble(), EXACT * Math.abs(c20));
        assertEquals(c22 * Math.sqrt(12.0 / 5), j.get("c").get(2).get(2).asDouble(), EXACT * Math.abs(c22));
        assertEquals(0, j.get("c").get(1).get(0).asDouble(), EXACT);
        assertEquals(0, j.get("c").get(1).get(1).asDouble(), EXACT);
        assertTrue(Math.abs(j.get("c").get(3).get(0).asDouble()) < EXACT, "z-symmetric: C30 = 0");
        assertTrue(Math.abs(j.get("c").get(3).get(1).asDouble()) > 1e-4, "the offset core makes C31 non-zero");
        TestShapes.achieved("harmonics region body C20 vs composite inertia, relative error",
            Math.abs(j.get("c").get(2).get(0).asDouble() * Math.sqrt(5) / c20 - 1));
    }
}
