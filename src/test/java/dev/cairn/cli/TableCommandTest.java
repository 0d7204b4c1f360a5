package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.tables.TableFiles;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code cairn table} and {@code cairn table-merge} end to end on a small icosphere. */
class TableCommandTest {
    @TempDir
    Path dir;
    private Path obj;
    private String lastErr;
    private String lastOut;

    @BeforeEach
    void writeModel() throws IOException {
        obj = dev.cairn.TestShapes.writeObj(Shapes.icosphere(2, 1000), dir.resolve("ball.obj"));
    }

    private int run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        List<String> a = new ArrayList<>(List.of("table", obj.toString(), "--density", "2000"));
        a.addAll(List.of(args));
        int code = CairnMain.execute(new PrintWriter(out), new PrintWriter(err), a.toArray(new String[0]));
        lastErr = err.toString();
        lastOut = out.toString();
        return code;
    }

    private void assertBadSpec(String expectedFragment, String... args) {
        int code = run(args);
        assertEquals(CairnMain.EXIT_BAD_INPUT, code, lastErr);
        String[] lines = lastErr.strip().split("\n");
        assertEquals(1, lines.length, "one-line error: " + lastErr);
        assertTrue(lines[0].startsWith("cairn: error: ") && lines[0].contains(expectedFragment), lastErr);
    }

    @Test
    void badGridSpecsGiveOneLineErrorsAndExitCode2() {
        String out = dir.resolve("bad.npy").toString();
        assertBadSpec("must be positive", "--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000", "--spacing",
            "0", "--out", out);
        assertBadSpec("must be positive", "--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000", "--spacing",
            "-100", "--out", out);
        assertBadSpec("must be less than", "--grid", "box", "--box", "2000,-2000,-2000,2000,-2000,2000", "--spacing",
            "500", "--out", out);
        assertBadSpec("more than the limit", "--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000",
            "--spacing", "400", "--max-nodes", "1000", "--out", out);
        assertBadSpec("radius must be positive", "--grid", "sphere", "--radii", "0,1500", "--lat-step", "30",
            "--lon-step", "30", "--out", out);
        assertBadSpec("radius must be positive", "--grid", "sphere", "--radii", "0:3000:1000", "--lat-step", "30",
            "--lon-step", "30", "--out", out);
        assertBadSpec("must divide 180", "--grid", "sphere", "--radii", "1500,2000", "--lat-step", "7",
            "--lon-step", "30", "--out", out);
        assertBadSpec("at least 2 nodes", "--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000", "--nodes",
            "1", "--out", out);
        assertBadSpec("unknown grid", "--grid", "cube", "--out", out);
        assertTrue(!Files.exists(dir.resolve("bad.npy")), "no output after an error");
        // The node limit yields to --force.
        assertEquals(0, run("--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000", "--spacing", "400",
            "--max-nodes", "1000", "--force", "--check-samples", "0", "--out", out), lastErr);
    }

    @Test
    void writesTableSidecarAndAccuracyReport() {
        Path out = dir.resolve("t.npy");
        assertEquals(0, run("--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000", "--spacing", "250",
            "--gradient", "--effective", "--spin-period", "4h", "--check-samples", "300", "--out", out.toString()),
            lastErr);
        assertTrue(lastOut.contains("Accuracy") && lastOut.contains("tricubic_hermite") && lastOut.contains("trilinear")
            && lastOut.contains("effective_acceleration") && lastOut.contains("Caution"), lastOut);
        Map<String, Object> meta = TableFiles.readJson(TableFiles.sidecarPath(out));
        assertEquals(TableFiles.sha256(obj), ((Map<?, ?>) meta.get("model")).get("sha256"));
        assertEquals(TableFiles.sha256(out), meta.get("data_sha256"));
        Map<?, ?> acc = (Map<?, ?>) meta.get("accuracy");
        List<?> reports = (List<?>) acc.get("reports");
        assertEquals(4, reports.size(), "tricubic and trilinear, gravity and effective acceleration");
        Map<?, ?> first = (Map<?, ?>) reports.get(0);
        assertEquals("tricubic_hermite", first.get("interpolation"));
        List<?> bands = (List<?>) first.get("outside_body_by_distance");
        assertEquals(4, bands.size(), "bands 0-1, 1-3, 3-10, > 10 cell sizes");
        Map<?, ?> near = (Map<?, ?>) bands.get(0);
        assertTrue(((Number) near.get("points")).intValue() > 0, "points next to the surface");
        assertTrue(((Number) near.get("bound")).doubleValue() >= ((Number) near.get("max")).doubleValue());
        assertEquals(4 * 3600.0, ((Number) ((Map<?, ?>) meta.get("spin")).get("period_s")).doubleValue(), 1e-9);
        Path sph = dir.resolve("s.csv");
        assertEquals(0, run("--grid", "sphere", "--radii", "1200:3000:600", "--lat-step", "30", "--lon-step", "45",
            "--check-samples", "100", "--distance", "--out", sph.toString()), lastErr);
        assertEquals("csv", TableFiles.readJson(TableFiles.sidecarPath(sph)).get("data_format"));
        // The distance column against a brute-force minimum over all facets (Ericson 2005 closest point), sign from
        // the winding number (inside: 1).
        dev.cairn.tables.Table t = TableFiles.read(sph);
        int col = t.column("distance_to_surface_m");
        assertTrue(col >= 0, "distance column present");
        dev.cairn.mascon.SurfaceQuery q = new dev.cairn.mascon.SurfaceQuery(Shapes.icosphere(2, 1000));
        double[] o = new double[2];
        for (int i = 0; i < t.grid().nodeCount(); i++) {
            q.windingAndDistance(t.value(i, 0), t.value(i, 1), t.value(i, 2), o);
            assertEquals(o[0] > 0.5 ? -o[1] : o[1], t.value(i, col), 1e-9, "node " + i);
        }
    }

    @Test
    void resumeAndShardsFromTheCommandLineGiveByteIdenticalFiles() throws IOException {
        String[] grid = {"--grid", "box", "--box", "-2000,2000,-2000,2000,-2000,2000", "--spacing", "400",
            "--chunk-nodes", "100", "--check-samples", "200"};
        Path single = dir.resolve("single.npy");
        assertEquals(0, run(concat(grid, "--out", single.toString())), lastErr);
        Path resumed = dir.resolve("resumed.npy");
        assertEquals(TableCommand.EXIT_INCOMPLETE, run(concat(grid, "--out", resumed.toString(),
            "--stop-after-chunks", "4")), lastErr);
        assertTrue(lastErr.contains("--resume"), lastErr);
        assertEquals(0, run(concat(grid, "--out", resumed.toString(), "--resume", "--threads", "1")), lastErr);
        assertTrue(lastErr.contains("4 chunk(s) reused"), lastErr);
        assertArrayEquals(Files.readAllBytes(single), Files.readAllBytes(resumed));
        List<String> merge = new ArrayList<>(List.of("table-merge"));
        for (int i = 1; i <= 2; i++) {
            Path s = dir.resolve("shard" + i + ".npy");
            assertEquals(0, run(concat(grid, "--out", s.toString(), "--shard", i + "/2")), lastErr);
            merge.add(s.toString());
        }
        Path merged = dir.resolve("merged.npy");
        merge.addAll(List.of("--out", merged.toString(), "--check-samples", "200"));
        StringWriter err = new StringWriter();
        assertEquals(0, CairnMain.execute(new PrintWriter(new StringWriter()), new PrintWriter(err),
            merge.toArray(new String[0])), err.toString());
        assertArrayEquals(Files.readAllBytes(single), Files.readAllBytes(merged));
        // The merge makes the same accuracy report as the single run (same table, same seeded points).
        Object singleAcc = TableFiles.readJson(TableFiles.sidecarPath(single)).get("accuracy");
        assertTrue(singleAcc instanceof Map<?, ?>, "single run has an accuracy report");
        assertEquals(singleAcc, TableFiles.readJson(TableFiles.sidecarPath(merged)).get("accuracy"));
        // table-merge --check-cell-points N reproduces a single run made with the same N (what table --slurm passes).
        Path single1 = dir.resolve("single1.npy");
        assertEquals(0, run(concat(grid, "--out", single1.toString(), "--check-cell-points", "1")), lastErr);
        Path merged1 = dir.resolve("merged1.npy");
        List<String> merge1 = new ArrayList<>(merge.subList(0, 3));
        merge1.addAll(List.of("--out", merged1.toString(), "--check-samples", "200", "--check-cell-points", "1"));
        assertEquals(0, CairnMain.execute(new PrintWriter(new StringWriter()), new PrintWriter(err),
            merge1.toArray(new String[0])), err.toString());
        Object single1Acc = TableFiles.readJson(TableFiles.sidecarPath(single1)).get("accuracy");
        assertEquals(single1Acc, TableFiles.readJson(TableFiles.sidecarPath(merged1)).get("accuracy"));
        assertTrue(!single1Acc.equals(singleAcc), "1 point per cell is another report than the default 4");
    }

    private static String[] concat(String[] a, String... b) {
        String[] r = java.util.Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, r, a.length, b.length);
        return r;
    }
}
