package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn trajectory} end to end on a small spinning icosphere: files read back with plain parsers (CSV header,
 * JSON keys, legacy VTK PolyData counts as in the VTK file-format specification, PNG through ImageIO), identical
 * results for 1 and 2 threads, and one-line errors for bad input.
 */
class TrajectoryCommandTest {
    @TempDir
    static Path dir;
    static Path obj;
    static Path states;
    static CliRun run;

    @BeforeAll
    static void once() throws Exception {
        obj = TestShapes.write(dir.resolve("ball.obj"), TestShapes.objText(Shapes.icosphere(2, 100), 1.0));
        // Row 1: an orbit at 300 m (body frame, retrograde-corrected speed); row 2: released above the pole, falls.
        states = TestShapes.write(dir.resolve("states.csv"), "x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s\n"
            + "300,0,0,0,0.02,0\n# a comment\n\n0,0,180,0.01,0,0\n");
        run = CliRun.of("trajectory", obj.toString(), "--density", "2000", "--spin-period", "6h", "--states",
            states.toString(), "--duration", "3h", "--step", "5min", "--frame", "body", "--altitudes", "50",
            "--out", dir.resolve("out1").toString(), "--threads", "1");
        assertEquals(0, run.exit(), run.err());
    }

    @Test
    void writesCsvJsonPngAndVtk() throws Exception {
        Path out = dir.resolve("out1");
        List<String> csv = Files.readAllLines(out.resolve("trajectory-0001.csv"));
        assertEquals("t_s,x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s,jacobi_m2_s2", csv.get(0));
        assertEquals("0.0", csv.get(1).split(",")[0]);
        assertEquals(8, csv.get(1).split(",").length);
        JsonNode j = new ObjectMapper().readTree(out.resolve("events.json").toFile());
        assertTrue(j.get("caution").asText().contains("flight-dynamics"));
        assertTrue(j.get("field").get("model").asText().contains("polyhedron"));
        assertTrue(j.get("field").has("tolerance"));
        assertEquals("body", j.get("integrator").get("frame").asText());
        JsonNode t2 = j.get("trajectories").get(1);
        assertEquals(5, t2.get("states_line").asInt(), "line numbers count comments and blank lines");
        assertEquals("impact", t2.get("outcome").asText());
        JsonNode last = t2.get("events").get(t2.get("events").size() - 1);
        assertEquals("impact", last.get("kind").asText());
        assertTrue(last.get("facet").asInt() >= 0);
        assertTrue(last.get("incidence_deg").asDouble() >= 0 && last.get("incidence_deg").asDouble() <= 90);
        // The fall from 180 m crosses the 50 m altitude threshold downward before the impact.
        assertEquals("altitude", t2.get("events").get(0).get("kind").asText());
        assertEquals("down", t2.get("events").get(0).get("direction").asText());
        int rows0 = csv.size() - 1;
        int rows1 = Files.readAllLines(out.resolve("trajectory-0002.csv")).size() - 1;
        List<String> vtk = Files.readAllLines(out.resolve("trajectories.vtk"));
        assertEquals("# vtk DataFile Version 3.0", vtk.get(0));
        assertEquals("DATASET UNSTRUCTURED_GRID", vtk.get(3));
        assertEquals("POINTS " + (rows0 + rows1) + " double", vtk.get(4));
        int segs = rows0 - 1 + rows1 - 1;
        assertTrue(vtk.contains("CELLS " + segs + " " + 3 * segs), "one 2-point line cell per step");
        assertTrue(vtk.contains("CELL_TYPES " + segs));
        assertTrue(vtk.contains("CELL_DATA " + segs));
        BufferedImage img = ImageIO.read(out.resolve("paths.png").toFile());
        assertEquals(3 * TrajectoryCommand.PANEL + 40, img.getWidth());
        assertTrue(run.out().contains("Caution"));
        assertTrue(run.out().contains("field evaluations per trajectory"));
    }

    /**
     * {@code --model harmonics}: the orbit at 3 Brillouin radii follows the polyhedron's path closely (the series
     * converges geometrically outside the Brillouin sphere, shared references §5: here the first dropped degree, 8,
     * changes the acceleration by about 1e-8 relative, moving the quarter orbit by well under a millimetre), while
     * the fall onto the body enters the sphere and is flagged in one warning line.
     */
    @Test
    void harmonicModelFollowsThePolyhedronOutsideAndWarnsInside() throws Exception {
        CliRun h = CliRun.of("trajectory", obj.toString(), "--density", "2000", "--spin-period", "6h", "--states",
            states.toString(), "--duration", "3h", "--step", "5min", "--frame", "body", "--model", "harmonics",
            "--degree", "8", "--out", dir.resolve("out-h").toString(), "--threads", "1");
        assertEquals(0, h.exit(), h.err());
        assertEquals(1, h.err().lines().filter(l -> l.contains("inside the Brillouin sphere")).count(), h.err());
        List<String> poly = Files.readAllLines(dir.resolve("out1").resolve("trajectory-0001.csv"));
        List<String> harm = Files.readAllLines(dir.resolve("out-h").resolve("trajectory-0001.csv"));
        assertEquals(poly.size(), harm.size());
        String[] a = poly.get(poly.size() - 1).split(",");
        String[] b = harm.get(harm.size() - 1).split(",");
        double d2 = 0;
        for (int k = 1; k <= 3; k++) {
            double d = Double.parseDouble(a[k]) - Double.parseDouble(b[k]);
            d2 += d * d;
        }
        System.out.printf("[achieved] trajectory, harmonic degree 8 vs polyhedron, 3 h orbit at 3 R_B: end "
            + "position difference %.2e m%n", Math.sqrt(d2));
        assertTrue(Math.sqrt(d2) < 1e-3, "end positions differ by " + Math.sqrt(d2) + " m");
        JsonNode j = new ObjectMapper().readTree(dir.resolve("out-h").resolve("events.json").toFile());
        assertTrue(j.get("field").get("model").asText().contains("spherical harmonics"), j.get("field").toString());
        CliRun both = CliRun.of("trajectory", obj.toString(), "--density", "2000", "--states", states.toString(),
            "--duration", "1h", "--model", "harmonics", "--degree", "4", "--table", obj.toString(), "--out",
            dir.resolve("out-bad").toString());
        assertEquals(2, both.exit(), both.err());
        assertTrue(both.oneLineError(), both.err());
    }

    /**
     * trajectories.vtk opens unaided in VTK 9 (Debian python3-vtk9) and meshio 5 (python3-meshio, which reads no
     * polylines): line cells, one per output step, with the trajectory number and time.
     */
    @Test
    void vtkFileOpensInVtkAndMeshio() throws Exception {
        dev.cairn.PythonTools.requireModules("numpy", "vtk", "meshio");
        String code = """
            import json, sys, vtk, meshio
            r = vtk.vtkUnstructuredGridReader(); r.SetFileName(sys.argv[1]); r.Update(); o = r.GetOutput()
            m = meshio.read(sys.argv[1])
            print(json.dumps({"vtk_cells": o.GetNumberOfCells(), "vtk_type": o.GetCellType(0),
                "vtk_points": o.GetNumberOfPoints(),
                "meshio": [[b.type, int(b.data.shape[0])] for b in m.cells],
                "point_data": sorted(m.point_data), "cell_data": sorted(m.cell_data)}))
            """;
        Path out = dir.resolve("out1");
        int rows0 = Files.readAllLines(out.resolve("trajectory-0001.csv")).size() - 1;
        int rows1 = Files.readAllLines(out.resolve("trajectory-0002.csv")).size() - 1;
        dev.cairn.PythonTools.Run r = dev.cairn.PythonTools.script(code, out.resolve("trajectories.vtk").toString());
        assertEquals(0, r.exit(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        int segs = rows0 - 1 + rows1 - 1;
        assertEquals(segs, j.get("vtk_cells").asInt());
        assertEquals(3, j.get("vtk_type").asInt(), "VTK_LINE");
        assertEquals(rows0 + rows1, j.get("vtk_points").asInt());
        assertEquals("[[\"line\"," + segs + "]]", j.get("meshio").toString());
        assertEquals("[\"t_s\"]", j.get("point_data").toString());
        assertEquals("[\"trajectory\"]", j.get("cell_data").toString());
    }

    @Test
    void identicalForOneAndTwoThreadsAndInertialFrameAddsColumns() throws Exception {
        CliRun two = CliRun.of("trajectory", obj.toString(), "--density", "2000", "--spin-period", "6h", "--states",
            states.toString(), "--duration", "3h", "--step", "5min", "--altitudes", "50", "--out",
            dir.resolve("out2").toString(), "--threads", "2");
        assertEquals(0, two.exit(), two.err());
        for (String f : new String[] {"trajectory-0001.csv", "trajectory-0002.csv", "trajectories.vtk"}) {
            assertArrayEquals(Files.readAllBytes(dir.resolve("out1").resolve(f)),
                Files.readAllBytes(dir.resolve("out2").resolve(f)), f);
        }
        CliRun in = CliRun.of("trajectory", obj.toString(), "--density", "2000", "--states", states.toString(),
            "--duration", "600", "--frame", "inertial", "--out", dir.resolve("out3").toString());
        assertEquals(0, in.exit(), in.err());
        String header = Files.readAllLines(dir.resolve("out3").resolve("trajectory-0001.csv")).get(0);
        assertEquals("t_s,x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s,jacobi_m2_s2,xi_m,yi_m,zi_m,vxi_m_s,vyi_m_s,vzi_m_s", header);
    }

    private static void bad(String fragment, String statesText, String... extra) {
        Path s = TestShapes.write(dir.resolve("bad-" + Math.abs(fragment.hashCode()) + ".csv"), statesText);
        String[] base = {"trajectory", obj.toString(), "--density", "2000", "--states", s.toString(), "--out",
            dir.resolve("bad-out").toString()};
        boolean hasDuration = false;
        for (String x : extra) {
            hasDuration |= x.equals("--duration");
        }
        String[] args = new String[base.length + extra.length + (hasDuration ? 0 : 2)];
        System.arraycopy(base, 0, args, 0, base.length);
        System.arraycopy(extra, 0, args, base.length, extra.length);
        if (!hasDuration) {
            args[args.length - 2] = "--duration";
            args[args.length - 1] = "1h";
        }
        CliRun r = CliRun.of(args);
        assertEquals(2, r.exit(), r.err());
        assertTrue(r.oneLineError(), r.err());
        assertTrue(r.err().contains(fragment), r.err());
        assertFalse(Files.exists(dir.resolve("bad-out").resolve("events.json")), "nothing written on bad input");
    }

    @Test
    void badInputGivesOneLineErrors() {
        String ok = "300,0,0,0,0.02,0\n";
        bad("--duration: must be positive", ok, "--duration", "-5");
        bad("--duration: must be positive", ok, "--duration", "0");
        bad("unknown unit suffix 'y'", ok, "--duration", "5y");
        bad("--step: unknown unit suffix", ok, "--step", "3weeks");
        bad("--frame: unknown frame 'galactic'", ok, "--frame", "galactic");
        bad(":1: initial position is inside the body", "10,0,0,0,0,0\n");
        bad(":2: value 3 is not finite", "300,0,0,0,0.02,0\n300,0,NaN,0,0,0\n");
        bad(":1: expected 6 values", "300,0,0,0,0.02\n");
        bad(":1: value 2 'abc' is not a number", "300,abc,0,0,0,0\n");
        bad("no initial states", "x_m,y_m,z_m,vx_m_s,vy_m_s,vz_m_s\n");
        bad("--srp: expected 3", ok, "--srp", "1e-9,0");
        bad("--threads: must be between 1", ok, "--threads", "0");
    }
}
