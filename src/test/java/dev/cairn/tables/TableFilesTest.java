package dev.cairn.tables;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mesh.Shapes;
import dev.cairn.util.ProgressListener;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Table files: node values equal direct evaluation bit for bit; the .npy layout follows the NumPy format spec. */
class TableFilesTest {
    @TempDir
    Path dir;

    private static final double DENSITY = 2000;
    /**
     * The test computes |r⊥|² as |r|² − (r·ω̂)², the code from the perpendicular vector: equal up to rounding
     * (common practice, no source).
     */
    private static final double EFFECTIVE_ROUNDING = 1e-12;
    /** Absolute floor for the effective x acceleration where g_x and ω²r_x nearly cancel, m/s^2. */
    private static final double EFFECTIVE_FLOOR = 1e-18;
    private final PolyhedronField body = new PolyhedronField(Shapes.icosphere(2, 1000), DENSITY);

    private TableLayout layout(Grid g, boolean excludeInterior) {
        return new TableLayout(g, true, true, excludeInterior, 2 * Math.PI / 3600, new double[] {0, 0.6, 0.8},
            new double[] {1, 2, 3});
    }

    private Map<String, Object> info() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("file", "icosphere");
        m.put("gm_m3_s2", body.gm());
        return m;
    }

    private Table build(Grid g, String format, boolean exclude, int threads) {
        Path out = dir.resolve("t" + threads + exclude + "." + format);
        TableBuilder.build(new TableBuilder.Request(body, layout(g, exclude), out, format, 50, false, 0, 0, threads,
            info(), "test"), ProgressListener.NONE, () -> false, "2026-01-01T00:00:00Z");
        return TableFiles.read(out);
    }

    /** Every value column at every node is the exact field's value at that node (no rounding by the files). */
    @Test
    void nodeValuesEqualDirectEvaluationBitForBit() {
        Grid[] grids = {BoxGrid.ofSpacing(new double[] {-1500, 1500, -1200, 1200, -900, 900}, new double[] {600, 600, 600}),
            new SphereGrid(new double[] {1, 2, 3}, new double[] {500, 1500}, 45, 60),
            new PointGrid(new double[] {0, 0, 0, 2000, 0, 0, 999.9, 0.1, -0.2}, "p", null)};
        FieldEvaluator ev = body.newEvaluator();
        double[] s = new double[FieldSample.SIZE];
        double[] p = new double[3];
        double w2 = Math.pow(2 * Math.PI / 3600, 2);
        for (Grid g : grids) {
            for (String fmt : new String[] {TableFiles.NPY, TableFiles.CSV}) {
                Table t = build(g, fmt, false, 2);
                assertEquals(g, t.grid(), "grid read back");
                int interior = 0;
                for (int n = 0; n < g.nodeCount(); n++) {
                    g.node(n, p, 0);
                    ev.evaluate(p[0], p[1], p[2], true, s, 0);
                    assertEquals(p[0], t.value(n, 0), 0.0);
                    assertEquals(s[FieldSample.U], t.value(n, TableLayout.U), 0.0, g.kind() + " " + fmt + " U");
                    for (int k = 0; k < 3; k++) {
                        assertEquals(s[FieldSample.AX + k], t.value(n, TableLayout.AX + k), 0.0);
                    }
                    assertEquals(s[FieldSample.LOCATION], t.value(n, TableLayout.LOCATION), 0.0);
                    for (int k = 0; k < 6; k++) {
                        assertEquals(s[FieldSample.GXX + k], t.value(n, TableLayout.BASE_COLUMNS + k), 0.0);
                    }
                    // Effective potential of a uniformly rotating frame: U + ½ω²|r⊥|² and g + ω²r⊥, r⊥ ⟂ the axis
                    // (0, 0.6, 0.8) through (1, 2, 3) (centrifugal potential; e.g. Scheeres 2012, Orbital Motion in
                    // Strongly Perturbed Environments, ch. 2; from memory).
                    double rx = p[0] - 1;
                    double ry = p[1] - 2;
                    double rz = p[2] - 3;
                    double al = 0.6 * ry + 0.8 * rz;
                    double perp2 = rx * rx + ry * ry + rz * rz - al * al;
                    assertEquals(s[FieldSample.U] + 0.5 * w2 * perp2, t.value(n, TableLayout.BASE_COLUMNS + 6),
                        EFFECTIVE_ROUNDING * Math.abs(s[FieldSample.U]), "effective potential");
                    assertEquals(s[FieldSample.AX] + w2 * rx, t.value(n, TableLayout.BASE_COLUMNS + 7),
                        EFFECTIVE_ROUNDING * Math.abs(s[FieldSample.AX]) + EFFECTIVE_FLOOR, "effective ax");
                    if (t.value(n, TableLayout.LOCATION) == Location.INSIDE.code()) {
                        interior++;
                    }
                }
                if (!(g instanceof PointGrid)) {
                    assertTrue(interior > 0, "test grid must have interior nodes");
                }
            }
        }
    }

    @Test
    void resultsDoNotDependOnThreadCount() throws IOException {
        Grid g = BoxGrid.ofSpacing(new double[] {-1500, 1500, -1200, 1200, -900, 900}, new double[] {300, 300, 300});
        build(g, TableFiles.NPY, false, 1);
        build(g, TableFiles.NPY, false, 2);
        assertArrayEquals(Files.readAllBytes(dir.resolve("t1false.npy")), Files.readAllBytes(dir.resolve("t2false.npy")));
    }

    @Test
    void excludedInteriorNodesAreBlankButFlagged() {
        Grid g = BoxGrid.ofSpacing(new double[] {-1500, 1500, -1200, 1200, -900, 900}, new double[] {600, 600, 600});
        for (String fmt : new String[] {TableFiles.NPY, TableFiles.CSV}) {
            Table t = build(g, fmt, true, 1);
            int blank = 0;
            for (int n = 0; n < g.nodeCount(); n++) {
                boolean inside = t.value(n, TableLayout.LOCATION) == Location.INSIDE.code();
                for (int c = TableLayout.U; c < t.columnCount(); c++) {
                    if (c != TableLayout.LOCATION) {
                        assertEquals(inside, Double.isNaN(t.value(n, c)), fmt + " node " + n + " " + t.columns().get(c));
                    }
                }
                blank += inside ? 1 : 0;
            }
            assertTrue(blank > 0, "test grid must have interior nodes");
        }
    }

    /**
     * The .npy bytes follow the format documentation (numpy.lib.format, NEP 1): magic, version 1.0, little-endian
     * header length, Python-literal dict, space padding to a multiple of 64 ending in a newline, then C-order
     * little-endian float64 data. Read here with a small independent reader.
     */
    @Test
    void npyLayoutFollowsTheFormatSpecification() throws IOException {
        BoxGrid g = BoxGrid.ofCounts(new double[] {1000, 2000, 0, 100, 0, 100}, new int[] {3, 2, 2});
        Table t = build(g, TableFiles.NPY, false, 1);
        byte[] b = Files.readAllBytes(dir.resolve("t1false.npy"));
        assertEquals((byte) 0x93, b[0]);
        assertEquals("NUMPY", new String(b, 1, 5, StandardCharsets.US_ASCII));
        assertEquals(1, b[6]);
        assertEquals(0, b[7]);
        int hlen = (b[8] & 0xff) | (b[9] & 0xff) << 8;
        assertEquals(0, (10 + hlen) % 64, "data must start on a 64-byte boundary");
        String h = new String(b, 10, hlen, StandardCharsets.US_ASCII);
        assertTrue(h.endsWith("\n"));
        int cols = t.columnCount();
        assertEquals("{'descr': '<f8', 'fortran_order': False, 'shape': (3, 2, 2, " + cols + "), }", h.strip());
        assertEquals(10 + hlen + 8L * 12 * cols, b.length);
        ByteBuffer bb = ByteBuffer.wrap(b, 10 + hlen, b.length - 10 - hlen).order(ByteOrder.LITTLE_ENDIAN);
        // C order: node (i, j, k) row (i*2 + j)*2 + k; its x column is 1000 + 500 i.
        for (int i = 0; i < 3; i++) {
            for (int j = 0; j < 2; j++) {
                for (int k = 0; k < 2; k++) {
                    int row = (i * 2 + j) * 2 + k;
                    assertEquals(1000 + 500.0 * i, bb.getDouble(10 + hlen + 8 * (row * cols)), 0.0);
                    assertEquals(100.0 * j, bb.getDouble(10 + hlen + 8 * (row * cols + 1)), 0.0);
                    assertEquals(100.0 * k, bb.getDouble(10 + hlen + 8 * (row * cols + 2)), 0.0);
                    assertEquals(t.value(row, TableLayout.AX), bb.getDouble(10 + hlen + 8 * (row * cols + TableLayout.AX)),
                        0.0);
                }
            }
        }
    }

    /** Optional: numpy itself loads the file with the documented shape and values (skipped without numpy). */
    @Test
    void numpyLoadsTheTable() throws Exception {
        boolean numpy;
        try {
            Process p = new ProcessBuilder("python3", "-c", "import numpy").redirectErrorStream(true).start();
            numpy = p.waitFor(30, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException e) {
            numpy = false;
        }
        assumeTrue(numpy, "python3 with numpy not available");
        BoxGrid g = BoxGrid.ofCounts(new double[] {1000, 2000, 0, 100, 0, 100}, new int[] {3, 2, 2});
        Table t = build(g, TableFiles.NPY, false, 1);
        Path f = dir.resolve("t1false.npy");
        String script = "import numpy as np, sys\n"
            + "a = np.load(sys.argv[1])\n"
            + "print(a.dtype.str, a.shape, a.flags['C_CONTIGUOUS'], repr(float(a[2, 1, 0, 4])), repr(float(a[1, 0, 1, 3])))\n";
        Process p = new ProcessBuilder("python3", "-c", script, f.toString()).redirectErrorStream(true).start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8).strip();
        assertTrue(p.waitFor(60, TimeUnit.SECONDS));
        int cols = t.columnCount();
        int r1 = (2 * 2 + 1) * 2;
        int r2 = (1 * 2) * 2 + 1;
        String[] w = out.split(" ");
        assertEquals("<f8 (3, 2, 2, " + cols + ") True", String.join(" ", java.util.Arrays.copyOf(w, 6)));
        assertEquals(t.value(r1, 4), Double.parseDouble(w[6]), 0.0, "numpy reads the same double");
        assertEquals(t.value(r2, 3), Double.parseDouble(w[7]), 0.0, "numpy reads the same double");
    }

    @Test
    void sidecarCarriesTheDocumentedKeys() {
        Grid g = BoxGrid.ofCounts(new double[] {1000, 2000, 0, 100, 0, 100}, new int[] {3, 2, 2});
        Table t = build(g, TableFiles.CSV, false, 1);
        Map<String, Object> m = t.metadata();
        for (String k : List.of("caution", "conventions", "cairn_version", "created_utc", "model", "G_m3_kg_s2",
            "gm_m3_s2", "spin", "center_of_mass_m", "frame", "grid", "columns", "column_units", "shape", "data_format",
            "data_sha256", "job_fingerprint")) {
            assertTrue(m.containsKey(k), "sidecar key " + k);
        }
        assertEquals(Constants.G, ((Number) m.get("G_m3_kg_s2")).doubleValue(), 0.0);
        assertEquals(List.of(3, 2, 2, t.columnCount()), m.get("shape"));
        assertTrue(String.valueOf(m.get("caution")).contains("verified independently"));
    }
}
