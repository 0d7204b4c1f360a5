package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.mesh.Shapes;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Collectors;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Smoke tests of {@code cairn compare} and {@code cairn field --model mascon}, reading the outputs back. Physical
 * checks: the mascon error falls with altitude (references §7: 1.9e-2 on the surface to 1.9e-6 at 0.1 side above it,
 * unit cube k = 16), and far away the mascon field equals the polyhedron's (both tend to GM/r).
 */
class CompareCommandTest {
    /**
     * Far-field agreement at 5 to 7 semi-major axes. Tetrahedral mascons keep mass and centre of mass exact, so the
     * first difference is the quadrupole: (inertia error, a few %, see MasconGenerationTest) × (R/r)^2 (≤ 0.04) ×
     * the body's degree-2 term (|C20| ≈ 0.1 for 1000 × 700 × 500 m, references §3): ≈ 1e-4 to 1e-3.
     */
    private static final double FAR_REL = 1e-3;

    @TempDir
    Path dir;
    Path obj;
    final StringWriter out = new StringWriter();
    final StringWriter err = new StringWriter();

    @BeforeEach
    void body() throws Exception {
        obj = dev.cairn.TestShapes.writeObj(Shapes.ellipsoid(2, 1000, 700, 500), dir.resolve("lump.obj"));
    }

    private int run(String... args) {
        return CairnMain.execute(new PrintWriter(out, true), new PrintWriter(err, true), args);
    }

    @Test
    void compareWritesTableCsvAndJson() throws Exception {
        Path csv = dir.resolve("cmp.csv");
        Path json = dir.resolve("cmp.json");
        int code = run("compare", obj.toString(), "--density", "2000", "--mascons", "300,3000", "--altitudes",
            "50,1500", "--points", "80", "--threads", "2", "--csv", csv.toString(), "--json", json.toString());
        assertEquals(0, code, err.toString());
        assertTrue(out.toString().contains("altitude_m"), out.toString());
        List<String> lines = Files.readAllLines(csv).stream().filter(l -> !l.startsWith("#"))
            .collect(Collectors.toList());
        assertEquals(CompareCommand.CSV_HEADER, lines.get(0));
        assertEquals(4, lines.size() - 1, "2 counts x 2 altitudes");
        double[][] e = new double[4][];
        for (int i = 1; i < lines.size(); i++) {
            String[] f = lines.get(i).replaceAll("\"[^\"]*\"", "name").split(",");
            e[i - 1] = new double[] {Double.parseDouble(f[3]), Double.parseDouble(f[5]), Double.parseDouble(f[6])};
            assertTrue(e[i - 1][1] > 0 && e[i - 1][1] < 1, "max relative error in (0,1): " + lines.get(i));
            assertTrue(e[i - 1][2] <= e[i - 1][1], "rms <= max");
        }
        // Rows: altitude 50 (300, 3000 mascons), altitude 1500 (300, 3000). The error falls with altitude.
        assertTrue(e[2][1] < e[0][1] && e[3][1] < e[1][1], "error smaller far from the surface");
        JsonNode j = new ObjectMapper().readTree(json.toFile());
        assertEquals(4, j.get("rows").size());
        assertEquals(e[3][1], j.get("rows").get(3).get("accel_rel_err_max").asDouble(), 0.0);
        assertTrue(j.get("caution").asText().contains("verify independently"));
    }

    @Test
    void fieldWithMasconsMatchesThePolyhedronFarAway() throws Exception {
        Path pts = dir.resolve("pts.csv");
        Files.writeString(pts, "x,y,z\n5000,0,0\n0,-4000,3000\n-2000,2000,-6000\n");
        Path a = dir.resolve("poly.csv");
        Path b = dir.resolve("masc.csv");
        assertEquals(0, run("field", obj.toString(), "--density", "2000", "--points", pts.toString(), "--out",
            a.toString()), err.toString());
        assertEquals(0, run("field", obj.toString(), "--density", "2000", "--points", pts.toString(), "--model",
            "mascon", "--mascons", "2000", "--mascon-scheme", "tetra", "--out", b.toString()), err.toString());
        assertTrue(err.toString().contains("mascons:"), "mass-property report on stderr: " + err);
        List<String> pa = Files.readAllLines(a);
        List<String> pb = Files.readAllLines(b);
        assertEquals(FieldCommand.HEADER, pb.get(0));
        for (int i = 1; i < 4; i++) {
            String[] fa = pa.get(i).split(",");
            String[] fb = pb.get(i).split(",");
            double ua = Double.parseDouble(fa[3]);
            double ub = Double.parseDouble(fb[3]);
            assertEquals(ua, ub, FAR_REL * ua, "potential far away");
            double ga = Math.hypot(Double.parseDouble(fa[4]), Math.hypot(Double.parseDouble(fa[5]),
                Double.parseDouble(fa[6])));
            for (int k = 4; k <= 6; k++) {
                assertEquals(Double.parseDouble(fa[k]), Double.parseDouble(fb[k]), FAR_REL * ga, "acceleration");
            }
        }
    }

    /**
     * Altitude shells: every point lies at the exact distance s from the surface, measured here by brute force over
     * all facets (closest point on a triangle, Ericson 2005 §5.1.5, via {@code SurfaceQuery.windingAndDistance}, sign
     * from the winding number); the radial variant lies s beyond the ray's outermost crossing, so its true height is
     * at most s (the crossing point is on the surface).
     */
    @Test
    void altitudeShellsLieAtTheExactHeightAboveTheSurface() {
        dev.cairn.mesh.TriangleMesh mesh = dev.cairn.TestShapes.lumpySphere(3, 0.3, 4).transformed(
            dev.cairn.TestShapes.rotation(1, 1, 0, 0.3), 800.0, new double[] {10, 0, -5});
        dev.cairn.mass.MassProperties mp = dev.cairn.mass.MassPropertiesCalculator.compute(mesh, 2000);
        dev.cairn.mascon.SurfaceQuery q = new dev.cairn.mascon.SurfaceQuery(mesh);
        double[] com = mp.centerOfMass();
        double[] dirs = CompareCommand.fibonacciDirections(300);
        double[] surfR = new double[300];
        for (int i = 0; i < 300; i++) {
            surfR[i] = q.farthestHit(com[0], com[1], com[2], dirs[3 * i], dirs[3 * i + 1], dirs[3 * i + 2]);
        }
        double[] o = new double[2];
        double largestRadialGap = 0;
        for (double s : new double[] {5, 40, 400}) {
            double[] t = CompareCommand.shellPoints(s, true, false, com, mp.brillouinRadius(), dirs, surfR, q);
            double[] r = CompareCommand.shellPoints(s, true, true, com, mp.brillouinRadius(), dirs, surfR, q);
            assertEquals(300, t.length / 3);
            for (int i = 0; i < t.length / 3; i++) {
                q.windingAndDistance(t[3 * i], t[3 * i + 1], t[3 * i + 2], o);
                assertTrue(o[0] < 0.5, "outside");
                assertEquals(s, o[1], 1e-9 * 1000, "exact height above the surface");
                q.windingAndDistance(r[3 * i], r[3 * i + 1], r[3 * i + 2], o);
                assertTrue(o[1] <= s * (1 + 1e-12), "true height never above the radial altitude");
                largestRadialGap = Math.max(largestRadialGap, s - o[1]);
            }
        }
        assertTrue(largestRadialGap > 1, "on a lumpy body the radial altitude differs from the true height");
    }

    @Test
    void badOptionsAreOneLineErrors() {
        assertEquals(2, run("compare", obj.toString(), "--density", "2000", "--altitudes", "-5"));
        assertTrue(err.toString().contains("--altitudes"), err.toString());
        assertEquals(2, run("compare", obj.toString(), "--density", "2000", "--mascon-scheme", "hexagonal",
            "--points", "10"));
        assertTrue(err.toString().contains("unknown mascon scheme"), err.toString());
    }
}
