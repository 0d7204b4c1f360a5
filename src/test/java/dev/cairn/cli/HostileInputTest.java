package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.io.Messages;
import dev.cairn.io.OutputLock;
import dev.cairn.mesh.Shapes;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.Timeout;
import org.junit.jupiter.api.io.TempDir;

/**
 * One broken fixture per failure mode of issue 12's ten classes of hostile input, each asserting its specific
 * one-line message and exit code 2, or the correct result (project rule: bad input is one line naming file and
 * problem, exit 2, nothing written half-way; common practice, no source).
 */
class HostileInputTest {
    @TempDir
    Path dir;
    private Path cube;
    private Path pts;

    static final String CUBE = "v -500 -500 -500\nv 500 -500 -500\nv 500 500 -500\nv -500 500 -500\n"
        + "v -500 -500 500\nv 500 -500 500\nv 500 500 500\nv -500 500 500\n"
        + "f 1 3 2\nf 1 4 3\nf 5 6 7\nf 5 7 8\nf 1 2 6\nf 1 6 5\nf 2 3 7\nf 2 7 6\nf 3 4 8\nf 3 8 7\n"
        + "f 4 1 5\nf 4 5 8\n";

    @BeforeEach
    void files() {
        cube = TestShapes.write(dir.resolve("cube.obj"), CUBE);
        pts = TestShapes.write(dir.resolve("pts.csv"), "2000,0,0\n0,0,3000\n");
    }

    private Path obj(String name, String text) {
        return TestShapes.write(dir.resolve(name), text);
    }

    /** Runs and asserts exit 2 with one safe line containing every fragment. */
    private static String refused(String[] fragments, String... args) {
        CliRun r = CliRun.of(args);
        assertEquals(2, r.exit(), r.err());
        assertTrue(r.oneLineError(), "one line: " + r.err());
        String line = r.err().strip();
        assertTrue(line.length() <= Messages.MAX_LINE, "at most 300 characters: " + line.length());
        for (int i = 0; i < line.length(); i++) {
            assertFalse(Messages.isUnsafe(line.charAt(i)), "no control characters: " + line);
        }
        for (String f : fragments) {
            assertTrue(line.contains(f), "'" + f + "' in: " + line);
        }
        return line;
    }

    private static String[] has(String... f) {
        return f;
    }

    // ---- class 1: degenerate geometry

    @Test
    void degenerateGeometryIsRefusedWithItsOwnMessage() {
        Path flat = obj("flat.obj", "v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 3\nf 1 3 2\n");
        refused(has("flat.obj", "encloses no volume"), "inspect", flat.toString(), "--density", "2000");
        refused(has("flat.obj", "encloses no volume"), "field", flat.toString(), "--density", "2000", "--points",
            pts.toString());
        Path one = obj("one.obj", "v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 3\n");
        refused(has("one.obj", "encloses no volume", "1 facet"), "inspect", one.toString(), "--density", "2000");
        // Two vertex lines swapped: still closed and consistently oriented, but folded through itself.
        String[] l = CUBE.split("\n");
        String t = l[2];
        l[2] = l[6];
        l[6] = t;
        Path folded = obj("folded.obj", String.join("\n", l) + "\n");
        refused(has("folded.obj", "intersects itself"), "inspect", folded.toString(), "--density", "2000");
        Path huge = obj("huge.obj", CUBE.replace("500", "1e100"));
        refused(has("huge.obj", "beyond"), "inspect", huge.toString(), "--density", "2000");
        Path tiny = obj("tiny.obj", CUBE.replace("500", "1e-150"));
        refused(has("tiny.obj", "smallest size"), "inspect", tiny.toString(), "--density", "2000");
        refused(has("density", "outside"), "inspect", cube.toString(), "--gm", "1e308");
        TestShapes.write(dir.resolve("cube.json"), "{\"density_kg_m3\": 1e303}");
        refused(has("cube.json", "density"), "inspect", cube.toString());
    }

    @Test
    void scaledCubeHasScaledMassProperties() throws IOException {
        // A valid cube of half-side 1e5 m: volume (2e5)^3 m^3 (closed form of a cube).
        Path big = obj("big.obj", CUBE.replace("500", "100000"));
        CliRun r = CliRun.of("inspect", big.toString(), "--density", "1000", "--json");
        assertEquals(0, r.exit(), r.err());
        double v = new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.out()).get("volume_m3").asDouble();
        assertEquals(8e15, v, 8e15 * 1e-12);
    }

    // ---- class 2: file contents checked by type, range and required keys

    @Test
    void tableFilesWithWrongTypesAreRefused() throws IOException {
        String[] grid = {"--grid", "box", "--box", "-1500,1500,-1500,1500,-1500,1500", "--spacing", "500",
            "--chunk-nodes", "100", "--check-samples", "0", "--density", "2000"};
        Path s1 = dir.resolve("s1.npy");
        Path s2 = dir.resolve("s2.npy");
        for (int i = 1; i <= 2; i++) {
            assertEquals(0, CliRun.of(concat(new String[] {"table", cube.toString()}, concat(grid, "--out",
                (i == 1 ? s1 : s2).toString(), "--shard", i + "/2"))).exit());
        }
        Path side = dir.resolve("s1.npy.json");
        String good = Files.readString(side);
        String[][] damage = {
            {"\"index\" : 1", "\"index\" : \"1\"", "'shard.index' must be an integer"},
            {"\"index\" : 1", "\"index\" : 0", "'shard.index' must be an integer from 1"},
            {"\"columns\" :", "\"columnz\" :", "'columns' is missing"},
        };
        for (String[] d : damage) {
            assertTrue(good.contains(d[0]), d[0]);
            Files.writeString(side, good.replace(d[0], d[1]));
            refused(has("s1.npy.json", d[2]), "table-merge", s1.toString(), s2.toString(), "--out",
                dir.resolve("m.npy").toString());
            assertFalse(Files.exists(dir.resolve("m.npy")));
        }
        Files.writeString(side, "null");
        refused(has("s1.npy.json", "expected a JSON object"), "table-merge", s1.toString(), s2.toString(), "--out",
            dir.resolve("m.npy").toString());
        Files.writeString(side, good);
        // A resume state whose manifest has a string for a number.
        String[] stop = concat(new String[] {"table", cube.toString()}, concat(grid, "--out",
            dir.resolve("p.npy").toString()));
        assertEquals(3, CliRun.of(concat(stop, "--stop-after-chunks", "1")).exit());
        Path job = dir.resolve("p.npy.partial").resolve("job.json");
        Files.writeString(job, Files.readString(job).replace("\"chunk_nodes\" : 100", "\"chunk_nodes\" : \"100\""));
        refused(has("job.json", "'chunk_nodes' must be an integer"), concat(stop, "--resume"));
    }

    @Test
    void npyHeadersAreCheckedAgainstTheFileSize() throws IOException {
        Path t = dir.resolve("t.npy");
        assertEquals(0, CliRun.of("table", cube.toString(), "--density", "2000", "--grid", "box", "--box",
            "-1500,1500,-1500,1500,-1500,1500", "--spacing", "1000", "--check-samples", "0", "--out",
            t.toString()).exit());
        byte[] b = Files.readAllBytes(t);
        String h = new String(b, StandardCharsets.ISO_8859_1);
        for (String shape : new String[] {"0x2a, 4, 4, 8", "", "4, 4, 4, 9"}) {
            int i = h.indexOf("'shape': (") + 10;
            String forged = h.substring(0, i) + shape + h.substring(h.indexOf(')', i));
            Files.write(t, forged.getBytes(StandardCharsets.ISO_8859_1));
            // Forge the sidecar's checksum too: the header must still be checked against the file size.
            Path side = dir.resolve("t.npy.json");
            String meta = Files.readString(side).replaceAll("\"data_sha256\" : \"[0-9a-f]+\"",
                "\"data_sha256\" : \"" + dev.cairn.tables.TableFiles.sha256(t) + "\"");
            Files.writeString(side, meta);
            String m = assertThrowsInput(() -> dev.cairn.tables.TableFiles.read(t));
            assertTrue(m.contains("t.npy") && (m.contains("shape") || m.contains("header")), m);
        }
    }

    @Test
    void surveyZoneColumnIsValidated() throws IOException {
        Path lumpy = dev.cairn.TestShapes.writeObj(TestShapes.lumpySphere(2, 0.1, 7), dir.resolve("lumpy.obj"));
        Path out = dir.resolve("survey");
        assertEquals(0, CliRun.of("survey", lumpy.toString(), "--density", "2000", "--spin-period", "5h", "--out",
            out.toString()).exit());
        Path csv = out.resolve("facets.csv");
        List<String> lines = Files.readAllLines(csv);
        int zc = Arrays.asList(lines.get(0).split(",")).indexOf("zone");
        int nf = lines.size() - 1;
        for (String bad : new String[] {"Infinity", "2147483647", "1e9", "-1", "0.5"}) {
            String[] f = lines.get(1).split(",", -1);
            f[zc] = bad;
            List<String> copy = new java.util.ArrayList<>(lines);
            copy.set(1, String.join(",", f));
            Files.write(csv, copy);
            String m = assertThrowsInput(() -> dev.cairn.viewer.SurveyData.read(out, lumpy, nf));
            assertTrue(m.contains("facets.csv:2") && m.contains("zone"), m);
        }
    }

    // ---- class 3: damaged checkpoints and changed region files are never used

    @Test
    void resumeRecomputesDamagedChunksAndRefusesChangedRegions() throws IOException {
        String[] grid = {"table", cube.toString(), "--density", "2000", "--grid", "box", "--box",
            "-1500,1500,-1500,1500,-1500,1500", "--spacing", "500", "--chunk-nodes", "60", "--check-samples", "0"};
        Path ref = dir.resolve("ref.npy");
        assertEquals(0, CliRun.of(concat(grid, "--out", ref.toString())).exit());
        for (String how : new String[] {"flip", "zero", "copy"}) {
            Path p = dir.resolve(how + ".npy");
            assertEquals(3, CliRun.of(concat(grid, "--out", p.toString(), "--stop-after-chunks", "3")).exit());
            Path c0 = dir.resolve(how + ".npy.partial").resolve("chunk-00000000.f64");
            Path c1 = dir.resolve(how + ".npy.partial").resolve("chunk-00000001.f64");
            byte[] b = Files.readAllBytes(c0);
            if (how.equals("flip")) {
                b[100] ^= 4;
            } else if (how.equals("zero")) {
                Arrays.fill(b, (byte) 0);
            } else {
                b = Files.readAllBytes(c1);
            }
            Files.write(c0, b);
            CliRun r = CliRun.of(concat(grid, "--out", p.toString(), "--resume"));
            assertEquals(0, r.exit(), r.err());
            assertArrayEquals(Files.readAllBytes(ref), Files.readAllBytes(p), how + ": damaged chunk recomputed");
        }
        // A body description whose region OBJ changed is a different table.
        TestShapes.write(dir.resolve("outer.obj"), CUBE);
        Path core = TestShapes.write(dir.resolve("core.obj"), CUBE.replace("500", "100"));
        Path desc = TestShapes.write(dir.resolve("body.json"), "{\"regions\": [{\"name\": \"m\", \"shape\": "
            + "\"outer.obj\", \"density_kg_m3\": 1500}, {\"name\": \"c\", \"shape\": \"core.obj\", "
            + "\"density_kg_m3\": 3000}]}");
        String[] dgrid = {"table", desc.toString(), "--grid", "box", "--box", "-1500,1500,-1500,1500,-1500,1500",
            "--spacing", "500", "--chunk-nodes", "60", "--check-samples", "0", "--out", dir.resolve("d.npy").toString()};
        assertEquals(3, CliRun.of(concat(dgrid, "--stop-after-chunks", "1")).exit());
        // Same volume and centre of mass, other file: the core's vertex order changed.
        Files.writeString(core, Files.readString(core) + "# changed\n");
        refused(has("belongs to a different table"), concat(dgrid, "--resume"));
    }

    // ---- class 4: loops over user-controlled ranges end

    @Test
    @Timeout(120) // a hang guard, not a speed target: the run takes well under a second
    void surveysOfSymmetricBodiesFinish() {
        Path octa = obj("octa.obj", "v 1000 0 0\nv -1000 0 0\nv 0 1000 0\nv 0 -1000 0\nv 0 0 1000\nv 0 0 -1000\n"
            + "f 1 3 5\nf 3 2 5\nf 2 4 5\nf 4 1 5\nf 3 1 6\nf 2 3 6\nf 4 2 6\nf 1 4 6\n");
        CliRun r = CliRun.of("survey", octa.toString(), "--density", "2000", "--out", dir.resolve("so").toString());
        assertEquals(0, r.exit(), r.err());
        r = CliRun.of("survey", cube.toString(), "--density", "2000", "--out", dir.resolve("sc").toString());
        assertEquals(0, r.exit(), r.err());
        double[] t = dev.cairn.viewer.Legend.ticks(1.0, Math.nextUp(Math.nextUp(1.0)));
        assertTrue(t.length >= 2 && t.length < 60, Arrays.toString(t));
    }

    // ---- class 5: sizes checked before allocating

    @Test
    void hugeSizesAreRefusedBeforeAllocating() {
        refused(has("--check-samples", "10000000"), "table", cube.toString(), "--density", "2000", "--grid", "box",
            "--box", "-1500,1500,-1500,1500,-1500,1500", "--spacing", "500", "--check-samples", "2147483647",
            "--out", dir.resolve("x.npy").toString());
        refused(has("--mascons"), "field", cube.toString(), "--density", "2000", "--points", pts.toString(),
            "--model", "mascon", "--mascons", "100000000");
        refused(has("--points"), "bench", cube.toString(), "--points", "2147483647");
        refused(has("--points"), "bench", cube.toString(), "--points", "-1");
        OutOfMemoryError oom = new OutOfMemoryError("Java heap space");
        assertTrue(CairnMain.resourceCause(new IllegalStateException(oom)) == oom);
        assertTrue(CairnMain.resourceMessage(oom).startsWith("out of memory") && !CairnMain.resourceMessage(oom)
            .contains("\n"));
    }

    // ---- class 6: numbers validated at the edge

    @Test
    void numbersOutsideTheirRangeAreRefused() {
        Path far = TestShapes.write(dir.resolve("far.csv"), "1e155,0,0\n");
        refused(has("far.csv:1", "beyond"), "field", cube.toString(), "--density", "2000", "--points", far.toString());
        refused(has("--spin-period", "between"), "survey", cube.toString(), "--density", "2000", "--out",
            dir.resolve("sp").toString(), "--spin-period", "1e-300");
        assertFalse(Files.exists(dir.resolve("sp")));
        String[] t = {"table", cube.toString(), "--density", "2000", "--check-samples", "0", "--out",
            dir.resolve("n.npy").toString()};
        refused(has("beyond"), concat(t, "--grid", "box", "--box", "-1500,1500,-1500,1500,-1500,1500", "--spacing",
            "1e308"));
        refused(has("beyond"), concat(t, "--grid", "sphere", "--radii", "1000,2000", "--lat-step", "45",
            "--lon-step", "90", "--centre", "1e308,0,0"));
        refused(has("--centre", "not a decimal number"), concat(t, "--grid", "sphere", "--radii", "1000,2000",
            "--lat-step", "45", "--lon-step", "90", "--centre", "NaN,0,0"));
        assertFalse(Files.exists(dir.resolve("n.npy")));
        TestShapes.write(dir.resolve("outer.obj"), CUBE);
        Path desc = TestShapes.write(dir.resolve("grad.json"), "{\"regions\": [{\"name\": \"m\", \"shape\": "
            + "\"outer.obj\", \"density_kg_m3\": 1500, \"density_gradient_kg_m3_per_m\": 1e300}]}");
        refused(has("grad.json", "density gradient"), "inspect", desc.toString());
    }

    // ---- class 7: messages stay one short, safe line

    @Test
    void messagesAreShortEscapedSingleLines() {
        Path big = obj("bigtoken.obj", "v 1" + "0".repeat(1_000_000) + "x 0 0\n" + CUBE);
        refused(has("bigtoken.obj:1", "characters)", "is not a number"), "inspect", big.toString());
        Path ctl = obj("ctl.obj", "v 1\u0000 0 0\nv 2\u000b 0 0\nv 3\u202e 0 0\n");
        String m = refused(has("ctl.obj:1", "\\x00"), "inspect", ctl.toString());
        assertFalse(m.contains("\u0000"));
        TestShapes.write(dir.resolve("outer.obj"), CUBE);
        Path nl = TestShapes.write(dir.resolve("nl.json"), "{\"regions\": [{\"name\": \"m\", \"shape\": "
            + "\"outer.obj\", \"density_kg_m3\": 1500}, {\"name\": \"c\", \"shape\": \"a\\nb\\ncore.obj\", "
            + "\"density_kg_m3\": 3000}]}");
        refused(has("nl.json", "a\\nb\\ncore.obj"), "inspect", nl.toString());
    }

    // ---- class 8: strict parsing

    @Test
    void looseSyntaxIsRefused() throws IOException {
        for (String bad : new String[] {"v1 2 3", "V 1 2 3", "v 0x1p3 0 0", "v 1f 0 0", "v 2d 0 0", "f 1/a/b 2 3"}) {
            Path p = obj("loose.obj", CUBE + bad + "\n");
            refused(has("loose.obj:21"), "inspect", p.toString(), "--density", "2000");
        }
        Path bom = obj("bom.obj", "\uFEFF" + CUBE);
        CliRun r = CliRun.of("inspect", bom.toString(), "--density", "2000", "--json");
        assertEquals(0, r.exit(), r.err());
        assertEquals(8, new com.fasterxml.jackson.databind.ObjectMapper().readTree(r.out()).get("vertices").asInt());
        String[][] sidecars = {
            {"{\"density_kg_m3\": \"2000\"}", "density_kg_m3"},
            {"{\"density_kg_m3\": \"\"}", "density_kg_m3"},
            {"{\"density_kg_m3\": 2000, \"density_kg_m3\": 3000}", "Duplicate field"},
            {"{\"density_kg_m3\": 2000} {}", "Trailing token"},
            {"{\"density_kg_m3\": 2000, \"spin_period_s\": 1e400}", "spin period"},
        };
        for (String[] s : sidecars) {
            TestShapes.write(dir.resolve("cube.json"), s[0]);
            refused(has("cube.json", s[1]), "inspect", cube.toString());
        }
        Files.delete(dir.resolve("cube.json"));
        TestShapes.write(dir.resolve("outer.obj"), CUBE);
        TestShapes.write(dir.resolve("same.obj"), CUBE);
        Path desc = TestShapes.write(dir.resolve("same.json"), "{\"regions\": [{\"name\": \"m\", \"shape\": "
            + "\"outer.obj\", \"density_kg_m3\": 1500}, {\"name\": \"c\", \"shape\": \"same.obj\", "
            + "\"density_kg_m3\": 3000}]}");
        refused(has("same.json", "outer shape"), "inspect", desc.toString());
        refused(has("not a regular file"), "inspect", dir.toString());
        // Option values: digits of other scripts and Java's number extras are refused too.
        String[] t = {"table", cube.toString(), "--density", "2000", "--grid", "box", "--box",
            "-1500,1500,-1500,1500,-1500,1500", "--check-samples", "0", "--out", dir.resolve("o.npy").toString()};
        refused(has("--nodes", "is not an integer"), concat(t, "--nodes", "\u0661\u0662\u0663"));
        refused(has("--spacing", "not a decimal number"), concat(t, "--spacing", "0x1p9"));
        refused(has("--spin-period", "is not a period"), concat(t, "--spacing", "500", "--spin-period", "1fh"));
    }

    // ---- class 9: locks, atomic outputs, clean-up

    @Test
    void outputsAreLockedCleanedAndNeverHalfWritten() throws IOException {
        Path out = dir.resolve("t.npy");
        String[] t = {"table", cube.toString(), "--density", "2000", "--grid", "box", "--box",
            "-1500,1500,-1500,1500,-1500,1500", "--spacing", "500", "--check-samples", "20", "--out", out.toString()};
        try (OutputLock held = OutputLock.acquire(out)) {
            refused(has("another cairn run"), t);
        }
        Path stale = dir.resolve(".t.npy.12345.tmp");
        Files.writeString(stale, "left by a killed run");
        assertEquals(0, CliRun.of(t).exit());
        assertFalse(Files.exists(stale), "stale temporary removed");
        // The sidecar cannot be written (a folder has its name): the data file must not stay either.
        Path out2 = dir.resolve("u.npy");
        Files.createDirectories(dir.resolve("u.npy.json"));
        t[t.length - 1] = out2.toString();
        refused(has("u.npy.json"), t);
        assertFalse(Files.exists(out2), "failed run leaves no data file");
        // Stopped during its accuracy check (checkpoints gone, no report yet): --resume runs only the check.
        Path out3 = dir.resolve("w.npy");
        t[t.length - 1] = out3.toString();
        int cs = Arrays.asList(t).indexOf("--check-samples") + 1;
        t[cs] = "0";
        assertEquals(0, CliRun.of(t).exit());
        byte[] data = Files.readAllBytes(out3);
        t[cs] = "20";
        CliRun again = CliRun.of(concat(t, "--resume"));
        assertEquals(0, again.exit(), again.err());
        assertTrue(again.err().contains("running its accuracy check again"), again.err());
        assertTrue(dev.cairn.tables.TableFiles.readJson(dev.cairn.tables.TableFiles.sidecarPath(out3))
            .containsKey("accuracy"));
        assertArrayEquals(data, Files.readAllBytes(out3), "data untouched");
        // Shards of a body description merge with their accuracy report (the density comes from the regions).
        TestShapes.write(dir.resolve("outer.obj"), CUBE);
        TestShapes.write(dir.resolve("core.obj"), CUBE.replace("500", "100"));
        Path desc = TestShapes.write(dir.resolve("body.json"), "{\"regions\": [{\"name\": \"m\", \"shape\": "
            + "\"outer.obj\", \"density_kg_m3\": 1500}, {\"name\": \"c\", \"shape\": \"core.obj\", "
            + "\"density_kg_m3\": 3000}]}");
        String[] dt = {"table", desc.toString(), "--grid", "box", "--box", "-1500,1500,-1500,1500,-1500,1500",
            "--spacing", "500", "--check-samples", "0", "--out"};
        for (int i = 1; i <= 2; i++) {
            assertEquals(0, CliRun.of(concat(dt, dir.resolve("d" + i + ".npy").toString(), "--shard", i + "/2"))
                .exit());
        }
        CliRun merged = CliRun.of("table-merge", dir.resolve("d1.npy").toString(), dir.resolve("d2.npy").toString(),
            "--out", dir.resolve("dm.npy").toString(), "--check-samples", "20");
        assertEquals(0, merged.exit(), merged.err());
        assertTrue(merged.out().contains("Accuracy"), merged.out());
        // A survey directory is swapped in whole: no file of an earlier run survives.
        Path s = dir.resolve("sv");
        assertEquals(0, CliRun.of("survey", cube.toString(), "--density", "2000", "--out", s.toString()).exit());
        Files.writeString(s.resolve("old-view.png"), "x");
        assertEquals(0, CliRun.of("survey", cube.toString(), "--density", "2500", "--out", s.toString()).exit());
        assertFalse(Files.exists(s.resolve("old-view.png")));
        try (Stream<Path> l = Files.list(dir)) {
            assertTrue(l.noneMatch(p -> p.getFileName().toString().startsWith(".sv.")), "no temporary folder left");
        }
    }

    // ---- class 10: outputs that are inputs, special files, paths outside the description

    @Test
    void dangerousOutputsAndRegionPathsAreRefused() throws IOException {
        String[] t = {"table", cube.toString(), "--density", "2000", "--grid", "box", "--box",
            "-1500,1500,-1500,1500,-1500,1500", "--spacing", "500", "--check-samples", "0", "--out"};
        byte[] model = Files.readAllBytes(cube);
        refused(has("input of this run"), concat(t, cube.toString()));
        assertArrayEquals(model, Files.readAllBytes(cube), "model untouched");
        assertFalse(Files.exists(dir.resolve("cube.obj.partial")), "refused before any checkpoint is written");
        TestShapes.write(dir.resolve("cube.json"), "{\"density_kg_m3\": 2000}");
        String side = Files.readString(dir.resolve("cube.json"));
        refused(has("input of this run"), concat(t, dir.resolve("cube").toString()));
        assertEquals(side, Files.readString(dir.resolve("cube.json")), "sidecar untouched");
        if (Files.exists(Path.of("/dev/null"))) {
            refused(has("not a regular file"), concat(t, "/dev/null"));
        }
        Path sub = Files.createDirectories(dir.resolve("sub"));
        TestShapes.write(sub.resolve("outer.obj"), CUBE);
        for (String shape : new String[] {"../cube.obj", cube.toAbsolutePath().toString()}) {
            Path desc = TestShapes.write(sub.resolve("body.json"), "{\"regions\": [{\"name\": \"m\", \"shape\": "
                + "\"outer.obj\", \"density_kg_m3\": 1500}, {\"name\": \"c\", \"shape\": \""
                + shape.replace("\\", "\\\\") + "\", \"density_kg_m3\": 3000}]}");
            refused(has("body.json", "outside the description's folder"), "inspect", desc.toString());
        }
    }

    private static String assertThrowsInput(org.junit.jupiter.api.function.Executable e) {
        return org.junit.jupiter.api.Assertions.assertThrows(dev.cairn.io.InputException.class, e).getMessage();
    }

    private static String[] concat(String[] a, String... b) {
        String[] r = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, r, a.length, b.length);
        return r;
    }
}
