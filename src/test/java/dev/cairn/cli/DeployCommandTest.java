package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code cairn deploy} end to end on a small spinning icosphere: outputs read back, identical results for 1 and 2
 * threads and for a repeated seed, and one-line errors for bad input.
 */
class DeployCommandTest {
    @TempDir
    static Path dir;
    static Path obj;
    static CliRun run;
    static final int COUNT = 6;

    static CliRun deploy(String out, String threads, String seed) {
        return CliRun.of("deploy", obj.toString(), "--density", "2000", "--spin-period", "6h", "--release",
            "0,0,140", "--velocity", "0.003,0,-0.01", "--count", String.valueOf(COUNT), "--position-sigma", "5",
            "--velocity-sigma", "0.002", "--restitution", "0.4,0.7", "--rest-apex", "0.05", "--seed", seed,
            "--out", dir.resolve(out).toString(), "--threads", threads);
    }

    @BeforeAll
    static void once() {
        obj = TestShapes.write(dir.resolve("ball.obj"), TestShapes.objText(Shapes.icosphere(2, 100), 1.0));
        run = deploy("out1", "1", "5");
        assertEquals(0, run.exit(), run.err());
    }

    @Test
    void writesLandingsSummaryAndMap() throws Exception {
        Path out = dir.resolve("out1");
        List<String> csv = Files.readAllLines(out.resolve("landings.csv"));
        assertTrue(csv.get(0).startsWith("sample,outcome,x_m,y_m,z_m,facet,lat_deg,lon_deg,time_s,bounces,"
            + "first_impact_speed_m_s,first_incidence_deg,slope_deg"), csv.get(0));
        assertEquals(COUNT + 1, csv.size());
        JsonNode j = new ObjectMapper().readTree(out.resolve("summary.json").toFile());
        assertTrue(j.get("caution").asText().contains("flight-dynamics"));
        assertTrue(j.get("field").get("model").asText().contains("polyhedron"));
        assertTrue(j.get("field").has("tolerance"));
        assertTrue(j.get("integrator").has("relative_tolerance"));
        double sum = 0;
        for (String k : new String[] {"rest", "escaped", "timed_out", "bounce_limit", "start_inside"}) {
            sum += j.get("fractions").get(k).asDouble();
        }
        assertEquals(1.0, sum, 1e-12);
        assertTrue(j.get("counts").get("rest").asInt() > 0, "some samples come to rest");
        assertTrue(j.get("dispersion_ellipse").get("sigma_major_m").asDouble()
            >= j.get("dispersion_ellipse").get("sigma_minor_m").asDouble());
        assertEquals(5, j.get("settings").get("seed").asLong());
        assertTrue(ImageIO.read(out.resolve("map-landings.png").toFile()).getWidth() > 700);
        assertTrue(run.out().contains("Caution"));
    }

    @Test
    void identicalForThreadCountsAndSeed() throws Exception {
        CliRun two = deploy("out2", "2", "5");
        assertEquals(0, two.exit(), two.err());
        assertArrayEquals(Files.readAllBytes(dir.resolve("out1").resolve("landings.csv")),
            Files.readAllBytes(dir.resolve("out2").resolve("landings.csv")));
        CliRun other = deploy("out3", "2", "6");
        assertEquals(0, other.exit(), other.err());
        assertFalse(java.util.Arrays.equals(Files.readAllBytes(dir.resolve("out1").resolve("landings.csv")),
            Files.readAllBytes(dir.resolve("out3").resolve("landings.csv"))), "another seed, other samples");
    }

    private static void bad(String fragment, String... args) {
        String[] base = {"deploy", obj.toString(), "--density", "2000", "--out", dir.resolve("bad-out").toString()};
        String[] all = new String[base.length + args.length];
        System.arraycopy(base, 0, all, 0, base.length);
        System.arraycopy(args, 0, all, base.length, args.length);
        CliRun r = CliRun.of(all);
        assertEquals(2, r.exit(), r.err());
        assertTrue(r.oneLineError(), r.err());
        assertTrue(r.err().contains(fragment), r.err());
        assertFalse(Files.exists(dir.resolve("bad-out").resolve("summary.json")), "nothing written on bad input");
    }

    @Test
    void badInputGivesOneLineErrors() {
        String[] ok = {"--release", "0,0,140", "--velocity", "0,0,0"};
        bad("--count: must be between 1", ok[0], ok[1], ok[2], ok[3], "--count", "0");
        bad("--restitution: coefficients must be in [0, 1]", ok[0], ok[1], ok[2], ok[3], "--restitution", "1.5,0.5");
        bad("--restitution: expected 2", ok[0], ok[1], ok[2], ok[3], "--restitution", "0.5");
        bad("--release: 0.0,0.0,50.0 is inside the body", "--release", "0,0,50", "--velocity", "0,0,0");
        bad("--position-sigma: must be a finite number >= 0", ok[0], ok[1], ok[2], ok[3], "--position-sigma", "-1");
        bad("--time-limit: must be positive", ok[0], ok[1], ok[2], ok[3], "--time-limit", "-2h");
        // refused by the strict number parser of the command line (issue 12) before the range check
        bad("'--velocity': 'NaN' is not a decimal number", "--release", "0,0,140", "--velocity", "0,NaN,0");
        bad("--release: expected 3", "--release", "0,140", "--velocity", "0,0,0");
    }

    /**
     * The usage line shows --release, --velocity and --restitution as options given once with one comma-separated
     * value (picocli synopsis syntax: "[...]..." marks a repeatable option; common practice, no source).
     */
    @Test
    void usageShowsVectorOptionsOnce() {
        CliRun r = CliRun.of("deploy", "--help");
        assertEquals(0, r.exit(), r.err());
        String usage = r.out().substring(0, r.out().indexOf("Seeded Monte Carlo"));
        for (String o : new String[] {"--release=X,Y,Z", "--velocity=VX,VY,VZ", "--restitution=EN,ET"}) {
            assertTrue(usage.contains(o), usage);
            assertFalse(usage.contains(o + "]..."), usage);
            assertFalse(usage.contains(o + "["), usage);
        }
        assertFalse(usage.contains("[--release="), "required option shown once: " + usage);
    }
}
