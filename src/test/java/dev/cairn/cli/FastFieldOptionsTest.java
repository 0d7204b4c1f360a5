package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.TestShapes;
import dev.cairn.gravity.Constants;
import dev.cairn.mesh.TriangleMesh;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code --tolerance} and {@code --exact} through the command line: the survey's summary and the field command say
 * which field model produced them and how far it measured from the exact sum, the measured error stays within the
 * stated tolerance, and bad values are one-line errors with exit code 2. Common practice, no source: these are
 * interface checks; the accuracy itself is checked against outside references in the gravity tests.
 */
class FastFieldOptionsTest {
    private static final TriangleMesh BODY = TestShapes.lumpySphere(3, 0.25, 2).transformed(
        TestShapes.rotation(0, 0, 1, 0), 400.0, new double[] {0, 0, 0});

    @TempDir
    Path dir;

    private Path body() {
        return TestShapes.write(dir.resolve("lumpy.obj"), TestShapes.objText(BODY, 1));
    }

    @Test
    void surveySummaryReportsTheHierarchicalModelAndItsMeasuredError() throws Exception {
        Path obj = body();
        Path out = dir.resolve("s");
        CliRun r = CliRun.of("survey", obj.toString(), "--density", "2000", "--spin-period", "6h", "--tolerance",
            "1e-8", "--out", out.toString());
        assertEquals(0, r.exit(), r.err());
        JsonNode acc = new ObjectMapper().readTree(Files.readString(out.resolve("summary.json"))).get("field_accuracy");
        assertFalse(acc.get("exact").asBoolean());
        assertTrue(acc.get("model").asText().contains("hierarchical, tolerance 1.0e-08"), acc.toString());
        assertTrue(acc.get("check_samples").asInt() > 0);
        assertTrue(acc.get("max_relative_error_g").asDouble() <= 1e-8, acc.toString());
        assertTrue(acc.get("max_relative_error_u").asDouble() <= 1e-8, acc.toString());
        assertTrue(r.out().contains("Field check"), r.out());

        Path exact = dir.resolve("e");
        CliRun e = CliRun.of("survey", obj.toString(), "--density", "2000", "--spin-period", "6h", "--exact",
            "--out", exact.toString());
        assertEquals(0, e.exit(), e.err());
        JsonNode ea = new ObjectMapper().readTree(Files.readString(exact.resolve("summary.json"))).get("field_accuracy");
        assertTrue(ea.get("exact").asBoolean());
    }

    @Test
    void fieldCommandPrintsTheMeasuredErrorAndStaysWithinTolerance() {
        Path obj = body();
        StringBuilder sb = new StringBuilder("x,y,z\n");
        for (int i = 0; i < 40; i++) {
            double t = 0.3 * i;
            sb.append(900 * Math.cos(t)).append(',').append(700 * Math.sin(t)).append(',').append(50 * i - 1000)
                .append('\n');
        }
        Path pts = TestShapes.write(dir.resolve("p.csv"), sb.toString());
        CliRun fast = CliRun.of("field", obj.toString(), "--density", "2000", "--points", pts.toString(), "--tolerance",
            "1e-9");
        CliRun exact = CliRun.of("field", obj.toString(), "--density", "2000", "--points", pts.toString(), "--exact");
        assertEquals(0, fast.exit(), fast.err());
        assertEquals(0, exact.exit(), exact.err());
        assertTrue(fast.err().contains("measured against the exact sum"), fast.err());
        String[] a = fast.out().split("\n");
        String[] b = exact.out().split("\n");
        assertEquals(b.length, a.length);
        for (int i = 1; i < a.length; i++) {
            String[] fa = a[i].split(",");
            String[] fb = b[i].split(",");
            double u = Double.parseDouble(fb[3]);
            double gx = Double.parseDouble(fb[4]);
            double gy = Double.parseDouble(fb[5]);
            double gz = Double.parseDouble(fb[6]);
            double gn = Math.sqrt(gx * gx + gy * gy + gz * gz);
            double dg = Math.sqrt(Math.pow(Double.parseDouble(fa[4]) - gx, 2) + Math.pow(Double.parseDouble(fa[5]) - gy, 2)
                + Math.pow(Double.parseDouble(fa[6]) - gz, 2));
            assertTrue(Math.abs(Double.parseDouble(fa[3]) - u) <= 1e-9 * u, a[i]);
            assertTrue(dg <= 1e-9 * gn, a[i]);
            assertEquals(fb[8], fa[8], "location");
        }
        assertTrue(Constants.G > 0);
    }

    @Test
    void badToleranceValuesAreOneLineErrors() {
        Path obj = body();
        for (String[] bad : new String[][] {{"--tolerance", "0"}, {"--tolerance", "-1e-9"}, {"--tolerance", "NaN"},
            {"--tolerance", "1"}, {"--tolerance", "1e-20"}, {"--tolerance", "abc"}, {"--tolerance", "1e-9", "--exact"}}) {
            String[] args = new String[5 + bad.length];
            args[0] = "survey";
            args[1] = obj.toString();
            args[2] = "--density";
            args[3] = "2000";
            args[4] = "--out=" + dir.resolve("x");
            System.arraycopy(bad, 0, args, 5, bad.length);
            CliRun r = CliRun.of(args);
            assertEquals(2, r.exit(), String.join(" ", bad) + ": " + r.err());
            assertTrue(r.oneLineError(), r.err());
            assertFalse(Files.exists(dir.resolve("x")), "nothing written for " + String.join(" ", bad));
        }
    }
}
