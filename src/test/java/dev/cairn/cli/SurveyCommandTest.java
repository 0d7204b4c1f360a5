package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.surface.FacetColumns;
import dev.cairn.surface.SurveyMaps;
import java.awt.image.BufferedImage;
import java.io.DataInputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.HexFormat;
import java.util.List;
import java.util.Locale;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn survey} end to end on a small icosphere written to a temporary folder: exit codes, one-line errors,
 * and every output file read back with plain parsers (CSV header and units, JSON keys, VTK legacy unstructured grid cell-data
 * counts as in the VTK file-format specification, PNG decoded by ImageIO with the documented size).
 */
class SurveyCommandTest {
    /** The contract prefix of the facets.csv header. */
    private static final String CONTRACT_HEADER = "facet,cx_m,cy_m,cz_m,lat_deg,lon_deg,slope_deg,g_eff_m_s2,"
        + "potential_eff_m2_s2,dynamic_height_m";
    private static final List<String> VIEWER_COLUMNS = List.of("g_m_s2", "g_normal_m_s2", "g_tangential_m_s2",
        "lift_off", "escape_speed_m_s", "hover_accel_m_s2", "zone");
    /** Area fractions must add up to 1 within round-off. */
    private static final double SUM_TOL = 1e-12;

    @TempDir
    static Path dir;
    static Path obj;
    static Path out;
    static int facets;
    static String stdout;

    static void writeObj(Path file, TriangleMesh m) throws Exception {
        dev.cairn.TestShapes.writeObj(m, file);
    }

    static int run(StringWriter o, StringWriter e, String... args) {
        return CairnMain.execute(new PrintWriter(o), new PrintWriter(e), args);
    }

    @BeforeAll
    static void surveyOnce() throws Exception {
        TriangleMesh m = Shapes.ellipsoid(2, 0.6, 0.45, 0.35); // km, see the sidecar
        facets = m.facetCount();
        obj = dir.resolve("blob.obj");
        writeObj(obj, m);
        Files.writeString(dir.resolve("blob.json"), "{\"length_unit\": \"km\", \"density_kg_m3\": 1900, "
            + "\"spin_period_s\": 21600, \"spin_axis\": [0, 0, 1]}");
        out = dir.resolve("out");
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = run(o, e, "survey", obj.toString(), "--out", out.toString(), "--spin-period", "3.5h",
            "--zone-radius", "40", "--threads", "2");
        assertEquals(0, code, e.toString());
        stdout = o.toString();
    }

    @Test
    void terminalReportNamesBodySpinRangesZonesAndCaution() {
        assertTrue(stdout.contains("Body"), stdout);
        assertTrue(stdout.contains("period 12600"), "spin from --spin-period overrides the sidecar: " + stdout);
        assertTrue(stdout.contains("Slope"));
        assertTrue(stdout.contains("Zones"));
        assertTrue(stdout.indexOf("Sites") >= 0 && stdout.indexOf("Sites") < stdout.indexOf("Zones"),
            "sites first: " + stdout);
        assertTrue(stdout.contains("Caution"));
    }

    @Test
    void facetsCsvHasTheContractHeaderAndOneRowPerFacet() throws Exception {
        List<String> lines = Files.readAllLines(out.resolve("facets.csv"), StandardCharsets.UTF_8);
        String header = lines.get(0);
        assertTrue(header.startsWith(CONTRACT_HEADER + ","), header);
        List<String> cols = List.of(header.split(","));
        for (String c : VIEWER_COLUMNS) {
            assertTrue(cols.contains(c), "column " + c);
        }
        assertEquals(FacetColumns.csvHeader(), header);
        assertEquals(facets + 1, lines.size());
        int slope = cols.indexOf("slope_deg");
        int lift = cols.indexOf("lift_off");
        int zone = cols.indexOf("zone");
        for (int f = 0; f < facets; f++) {
            String[] v = lines.get(f + 1).split(",", -1);
            assertEquals(cols.size(), v.length, "row " + f);
            assertEquals(f, Integer.parseInt(v[0]));
            double s = Double.parseDouble(v[slope]);
            int l = Integer.parseInt(v[lift]);
            assertTrue(l == 0 || l == 1);
            assertEquals(s > 90, l == 1, "lift-off exactly where slope > 90°");
            assertTrue(Integer.parseInt(v[zone]) >= 0);
            for (String x : v) {
                Double.parseDouble(x); // every field is a number (NaN allowed for not-computed disc values)
            }
        }
    }

    @Test
    void summaryJsonHasTheDocumentedKeys() throws Exception {
        JsonNode j = new ObjectMapper().readTree(out.resolve("summary.json").toFile());
        String sha = HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(obj)));
        assertEquals(sha, j.get("model_sha256").asText());
        assertEquals(facets, j.get("facets").asInt());
        JsonNode p = j.get("parameters");
        assertEquals(1900.0, p.get("density_kg_m3").asDouble(), 0.0);
        assertEquals(12600.0, p.get("spin_period_s").asDouble(), 0.0);
        assertEquals(15.0, p.get("max_slope_deg").asDouble(), 0.0);
        assertEquals(40.0, p.get("zone_radius_m").asDouble(), 0.0);
        for (String k : new String[] {"gm_m3_s2", "spin_axis", "reference_potential_eff_m2_s2",
            "dynamic_height_reference", "hover_altitudes_m"}) {
            assertNotNull(p.get(k), k);
        }
        JsonNode st = j.get("statistics");
        for (String q : new String[] {"slope_deg", "g_eff_m_s2", "dynamic_height_m", "escape_speed_m_s"}) {
            JsonNode s = st.get(q);
            assertTrue(s.get("min").asDouble() <= s.get("mean_area_weighted").asDouble());
            assertTrue(s.get("mean_area_weighted").asDouble() <= s.get("max").asDouble());
        }
        // Dynamic height is measured from the area-weighted mean level: its area-weighted mean is 0.
        double hm = st.get("dynamic_height_m").get("mean_area_weighted").asDouble();
        double hr = st.get("dynamic_height_m").get("max").asDouble() - st.get("dynamic_height_m").get("min").asDouble();
        assertEquals(0.0, hm, 1e-9 * hr);
        double sum = 0;
        for (JsonNode b : j.get("slope_bands")) {
            sum += b.get("area_fraction").asDouble();
        }
        assertEquals(1.0, sum, SUM_TOL);
        assertTrue(j.get("zones").isArray());
        assertEquals(j.get("site_count").asInt(), j.get("sites").size());
        assertEquals(40.0, p.get("site_radius_m").asDouble(), 0.0, "site radius defaults to the zone radius");
        for (JsonNode s : j.get("sites")) {
            for (String k : new String[] {"rank", "score", "aim_facet", "aim_point_m", "lat_deg", "lon_deg", "zone",
                "map_layer", "facet_count", "area_m2", "max_slope_deg", "mean_slope_deg", "roughness_deg",
                "dynamic_height_range_m", "mean_g_eff_m_s2", "mean_escape_speed_m_s", "safe_area_fraction"}) {
                assertNotNull(s.get(k), k);
            }
        }
        assertEquals(0.0, j.get("map_layers").get("hidden_on_outer_maps_area_fraction").asDouble(), 0.0,
            "an ellipsoid is star-shaped about its centre");
        assertTrue(Files.isRegularFile(out.resolve("zones.csv")));
        assertEquals(j.get("zone_count").asInt(), j.get("zones").size());
        for (JsonNode z : j.get("zones")) {
            for (String k : new String[] {"rank", "score", "centroid_m", "lat_deg", "lon_deg", "area_m2",
                "max_slope_deg", "mean_slope_deg", "mean_g_eff_m_s2", "mean_escape_speed_m_s", "facet_count"}) {
                assertNotNull(z.get(k), k);
            }
        }
        assertTrue(j.get("hovering").size() > 0);
        assertTrue(j.get("notes").isArray());
        assertTrue(j.get("statistics").get("below_max_slope_area_fraction").asDouble() >= 0);
        assertTrue(j.get("conventions").get("potential").asText().contains("U > 0"));
        assertTrue(j.get("caution").asText().toLowerCase(Locale.ROOT).contains("verified independently"));
    }

    /** One ASCII keyword line of a legacy VTK file (bytes up to the newline). */
    private static String line(DataInputStream in) throws Exception {
        StringBuilder sb = new StringBuilder();
        int c;
        while ((c = in.read()) != '\n') {
            if (c < 0) {
                return null;
            }
            sb.append((char) c);
        }
        return sb.toString();
    }

    @Test
    void vtkHasEveryQuantityAsCellData() throws Exception {
        // Legacy VTK file format (VTK User's Guide, "VTK File Formats"): ASCII keyword lines; with BINARY, data are
        // big-endian and each block is followed by a newline; UNSTRUCTURED_GRID with CELLS and CELL_TYPES (5 =
        // VTK_TRIANGLE, vtkCellType.h); FIELD arrays "name numComponents numTuples type".
        List<String> csv = Files.readAllLines(out.resolve("facets.csv"), StandardCharsets.UTF_8);
        try (DataInputStream in = new DataInputStream(new java.io.BufferedInputStream(
            Files.newInputStream(out.resolve("surface.vtk"))))) {
            assertEquals("# vtk DataFile Version 3.0", line(in));
            assertTrue(line(in).length() <= 256, "title line limit of the legacy format");
            assertEquals("BINARY", line(in));
            assertEquals("DATASET UNSTRUCTURED_GRID", line(in));
            String[] pts = line(in).split(" ");
            assertEquals("POINTS", pts[0]);
            assertEquals("double", pts[2]);
            int nv = Integer.parseInt(pts[1]);
            for (int i = 0; i < 3 * nv; i++) {
                assertTrue(Double.isFinite(in.readDouble()));
            }
            assertEquals("", line(in));
            assertEquals("CELLS " + facets + " " + 4 * facets, line(in));
            for (int f = 0; f < facets; f++) {
                assertEquals(3, in.readInt());
                for (int k = 0; k < 3; k++) {
                    int v = in.readInt();
                    assertTrue(v >= 0 && v < nv);
                }
            }
            assertEquals("", line(in));
            assertEquals("CELL_TYPES " + facets, line(in));
            for (int f = 0; f < facets; f++) {
                assertEquals(5, in.readInt(), "VTK_TRIANGLE");
            }
            assertEquals("", line(in));
            String[] fd = line(in).split(" ");
            assertEquals("FIELD", fd[0]);
            List<String> meta = new java.util.ArrayList<>();
            for (int i = 0; i < Integer.parseInt(fd[2]); i++) {
                String[] h = line(in).split(" ");
                meta.add(h[0]);
                int n = Integer.parseInt(h[1]) * Integer.parseInt(h[2]);
                if (h[3].equals("unsigned_char")) {
                    in.readNBytes(n);
                } else {
                    assertEquals("double", h[3]);
                    for (int k = 0; k < n; k++) {
                        in.readDouble();
                    }
                }
                assertEquals("", line(in));
            }
            assertTrue(meta.containsAll(List.of("model_sha256", "density_kg_m3", "gm_m3_s2", "G_m3_kg_s2",
                "spin_period_s", "spin_axis", "conventions", "cairn_version")), meta.toString());
            assertEquals("CELL_DATA " + facets, line(in));
            List<String> header = List.of(csv.get(0).split(","));
            assertEquals("SCALARS slope_deg double 1", line(in), "slope first: the active scalar");
            assertEquals("LOOKUP_TABLE default", line(in));
            int slopeCol = header.indexOf("slope_deg");
            for (int f = 0; f < facets; f++) {
                assertEquals(Double.parseDouble(csv.get(f + 1).split(",")[slopeCol]), in.readDouble(), 0.0);
            }
            assertEquals("", line(in));
            assertEquals("VECTORS gravity_m_s2 double", line(in));
            for (int i = 0; i < 3 * facets; i++) {
                assertTrue(Double.isFinite(in.readDouble()));
            }
            assertEquals("", line(in));
            String[] cf = line(in).split(" ");
            assertEquals("FIELD", cf[0]);
            int arrays = Integer.parseInt(cf[2]);
            int scalars = 0;
            int vectors = 0;
            for (int a = 0; a < arrays; a++) {
                String[] h = line(in).split(" ");
                assertEquals(facets, Integer.parseInt(h[2]), h[0] + ": one tuple per facet");
                if (h[1].equals("1")) {
                    int col = header.indexOf(h[0]);
                    assertTrue(col >= 0, h[0] + " is a facets.csv column");
                    for (int f = 0; f < facets; f++) {
                        double v = h[3].equals("int") ? in.readInt() : in.readDouble();
                        double expected = Double.parseDouble(csv.get(f + 1).split(",")[col]);
                        assertEquals(expected, v, 0.0, h[0] + " facet " + f + " agrees with facets.csv");
                    }
                    scalars++;
                } else {
                    assertEquals("3", h[1], l(h));
                    for (int i = 0; i < 3 * facets; i++) {
                        assertTrue(Double.isFinite(in.readDouble()));
                    }
                    vectors++;
                }
                assertEquals("", line(in));
            }
            assertEquals(null, line(in), "end of file");
            assertEquals(FacetColumns.ALL.size() - 1, scalars, "every column but slope_deg in the cell FIELD");
            assertEquals(2, vectors, "normal and accel_eff_m_s2");
        }
    }

    private static String l(String[] h) {
        return String.join(" ", h);
    }

    @Test
    void pngMapsDecodeWithTheDocumentedSize() throws Exception {
        for (String name : new String[] {SurveyMaps.SLOPE, SurveyMaps.G_EFF, SurveyMaps.DYNAMIC_HEIGHT}) {
            BufferedImage img = ImageIO.read(out.resolve(name).toFile());
            assertNotNull(img, name);
            assertEquals(SurveyMaps.MAP_WIDTH, img.getWidth());
            assertEquals(SurveyMaps.MAP_HEIGHT, img.getHeight());
        }
        BufferedImage h = ImageIO.read(out.resolve(SurveyMaps.HISTOGRAM).toFile());
        assertEquals(SurveyMaps.HIST_WIDTH, h.getWidth());
        assertEquals(SurveyMaps.HIST_HEIGHT, h.getHeight());
    }

    @Test
    void noTemporaryFilesAreLeftBehind() throws Exception {
        try (var s = Files.list(out)) {
            assertFalse(s.anyMatch(p -> p.getFileName().toString().endsWith(".tmp")));
        }
    }

    @Test
    void saysWhenItReplacesAnExistingOutputDirectory() throws Exception {
        Path again = dir.resolve("again");
        StringWriter e1 = new StringWriter();
        assertEquals(0, run(new StringWriter(), e1, "survey", obj.toString(), "--out", again.toString(), "--threads",
            "1"), e1.toString());
        assertFalse(e1.toString().contains("replaced"), e1.toString());
        StringWriter e2 = new StringWriter();
        assertEquals(0, run(new StringWriter(), e2, "survey", obj.toString(), "--out", again.toString(), "--threads",
            "1"), e2.toString());
        List<String> lines = e2.toString().lines().filter(l -> l.contains("replaced")).toList();
        assertEquals(List.of("cairn: replaced the existing output directory " + again), lines);
    }

    private static void badOption(String expectInMessage, String... extra) {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        String[] args = new String[3 + extra.length];
        args[0] = "survey";
        args[1] = obj.toString();
        args[2] = "--out=" + dir.resolve("bad");
        System.arraycopy(extra, 0, args, 3, extra.length);
        assertEquals(CairnMain.EXIT_BAD_INPUT, run(o, e, args), String.join(" ", extra));
        String err = e.toString().strip();
        assertTrue(err.startsWith("cairn: error: "), err);
        assertTrue(err.contains(expectInMessage), err);
        assertFalse(err.contains("\tat "), "no stack trace: " + err);
        assertFalse(Files.exists(dir.resolve("bad").resolve("facets.csv")));
    }

    @Test
    void badOptionsGiveExitCodeTwoAndOneLine() {
        badOption("--spin-period", "--spin-period", "0");
        badOption("--spin-period", "--spin-period", "fast");
        badOption("--max-slope", "--max-slope", "95");
        badOption("--max-slope", "--max-slope", "0");
        badOption("--zone-radius", "--zone-radius", "-5");
        badOption("--threads", "--threads", "0");
        badOption("--spin-axis", "--spin-axis", "0,0,0");
        badOption("--hover-altitudes", "--hover-altitudes", "10,-1");
        badOption("--site-radius", "--site-radius", "0");
        badOption("--site-radius", "--site-radius", "NaN");
    }

    @Test
    void missingModelAndMissingDensityAreInputErrors() throws Exception {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        assertEquals(2, run(o, e, "survey", dir.resolve("nope.obj").toString(), "--out", dir.resolve("x").toString()));
        assertTrue(e.toString().contains("no such file"), e.toString());
        Path bare = dir.resolve("bare.obj");
        writeObj(bare, Shapes.icosphere(1, 100));
        StringWriter e2 = new StringWriter();
        assertEquals(2, run(new StringWriter(), e2, "survey", bare.toString(), "--out", dir.resolve("y").toString()));
        assertTrue(e2.toString().contains("density"), e2.toString());
        assertEquals(1, e2.toString().strip().lines().count(), e2.toString());
        // A zero pole without any spin period is still a one-line input error (regression: was an internal error).
        StringWriter e3 = new StringWriter();
        assertEquals(2, run(new StringWriter(), e3, "survey", bare.toString(), "--density", "2000", "--spin-axis",
            "0,0,0", "--out", dir.resolve("z").toString()));
        assertTrue(e3.toString().contains("--spin-axis"), e3.toString());
    }
}
