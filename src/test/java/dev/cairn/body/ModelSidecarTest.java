package dev.cairn.body;

import dev.cairn.io.InputException;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.cairn.TestShapes;
import dev.cairn.gravity.Constants;
import dev.cairn.mesh.Shapes;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The model sidecar {@code NAME.json} (issue 2, item 6): its keys are read, command-line options override it, a
 * malformed sidecar gives a {@code file:line} error and an unknown key is refused. Common practice, no source.
 */
class ModelSidecarTest {
    /** Density derived from GM: ρ = GM/(G·V), a few flops of round-off. */
    private static final double REL_TOL = 1e-14;

    @TempDir
    Path dir;
    private Path obj;

    @BeforeEach
    void writeModel() {
        // a 2 x 1 x 1 box in model units (metres unless the sidecar or --units says km)
        obj = TestShapes.write(dir.resolve("rock.obj"), TestShapes.objText(Shapes.box(0, 0, 0, 2, 1, 1), 1));
    }

    private Path sidecar(String json) {
        return TestShapes.write(dir.resolve("rock.json"), json);
    }

    @Test
    void keysAreRead() {
        sidecar("{\n  \"name\": \"Rock\",\n  \"description\": \"invented test body\",\n  \"length_unit\": \"km\",\n"
            + "  \"density_kg_m3\": 1500,\n  \"spin_period_s\": 7200,\n  \"spin_axis\": [0, 0, 2]\n}\n");
        BodyModel b = ModelLoader.load(obj, ModelRequest.DEFAULTS);
        assertEquals("Rock", b.name());
        assertEquals("km", b.lengthUnit());
        assertEquals(2000.0, b.mesh().boundingBox()[3], 0.0, "km scaled to m");
        assertEquals(1500.0, b.density(), 0.0);
        assertEquals(1500.0 * 2e9, b.massProperties().mass(), 1500.0 * 2e9 * REL_TOL);
        assertEquals(7200.0, b.spin().periodSeconds(), 0.0);
        assertArrayEquals(new double[] {0, 0, 1}, b.spin().axis(), 1e-15, "pole normalised");
    }

    @Test
    void gmAndMassKeys() {
        sidecar("{\"gm_m3_s2\": 0.5}");
        BodyModel b = ModelLoader.load(obj, ModelRequest.DEFAULTS);
        assertEquals(0.5 / (Constants.G * 2), b.density(), 0.5 / (Constants.G * 2) * REL_TOL);
        sidecar("{\"mass_kg\": 5000}");
        assertEquals(2500.0, ModelLoader.load(obj, ModelRequest.DEFAULTS).density(), 2500 * REL_TOL);
        sidecar("{\"mass_kg\": 5000, \"density_kg_m3\": 2000}");
        InputException e = assertThrows(InputException.class, () -> ModelLoader.load(obj, ModelRequest.DEFAULTS));
        assertEquals(dir.resolve("rock.json") + ": give only one of density_kg_m3, gm_m3_s2 and mass_kg", e.getMessage());
    }

    @Test
    void commandLineOverridesTheSidecar() throws Exception {
        sidecar("{\"length_unit\": \"km\", \"density_kg_m3\": 1500, \"spin_period_s\": 7200}");
        BodyModel b = ModelLoader.load(obj, new ModelRequest("m", null, null, 4000.0, 3600.0, new double[] {1, 0, 0}));
        assertEquals("m", b.lengthUnit());
        assertEquals(2000.0, b.density(), 2000 * REL_TOL, "--mass 4000 over a 2 m^3 box beats the sidecar density");
        assertEquals(3600.0, b.spin().periodSeconds(), 0.0);
        assertArrayEquals(new double[] {1, 0, 0}, b.spin().axis(), 0.0);
        // and through the command line
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = dev.cairn.cli.CairnMain.execute(new PrintWriter(out), new PrintWriter(err), "inspect", obj.toString(),
            "--json", "--density", "2500");
        assertEquals(0, code, err.toString());
        JsonNode j = new ObjectMapper().readTree(out.toString());
        assertEquals(2500.0, j.get("density_kg_m3").asDouble(), 0.0);
        assertEquals(2e9, j.get("volume_m3").asDouble(), 2e9 * REL_TOL, "sidecar unit km still applies");
        assertEquals(7200.0, j.get("spin_period_s").asDouble(), 0.0);
    }

    @Test
    void malformedSidecarGivesFileAndLine() {
        Path s = sidecar("{\n  \"density_kg_m3\": 1500,\n  \"spin_period_s\": seven\n}\n");
        InputException e = assertThrows(InputException.class, () -> ModelLoader.load(obj, ModelRequest.DEFAULTS));
        assertTrue(e.getMessage().startsWith(s + ":3: bad model sidecar: "), e.getMessage());
        assertTrue(e.getMessage().indexOf('\n') < 0, "one line: " + e.getMessage());
    }

    @Test
    void unknownKeyIsRefused() {
        Path s = sidecar("{\n  \"density_kg_m3\": 1500,\n  \"densty\": 3\n}\n");
        InputException e = assertThrows(InputException.class, () -> ModelLoader.load(obj, ModelRequest.DEFAULTS));
        assertTrue(e.getMessage().startsWith(s + ":3: bad model sidecar: Unrecognized field \"densty\""),
            e.getMessage());
        assertTrue(e.getMessage().indexOf('\n') < 0, "one line: " + e.getMessage());
    }

    @Test
    void badValuesInTheSidecar() {
        Path s = sidecar("{\"length_unit\": \"miles\"}");
        InputException e = assertThrows(InputException.class, () -> ModelLoader.load(obj, ModelRequest.DEFAULTS));
        assertEquals(s + ": unknown length unit 'miles' (use m or km)", e.getMessage());
        sidecar("{\"density_kg_m3\": -5}");
        e = assertThrows(InputException.class, () -> ModelLoader.load(obj, ModelRequest.DEFAULTS));
        assertTrue(e.getMessage().contains("density must be a positive number"), e.getMessage());
    }

    @Test
    void noSidecarMeansDefaults() {
        BodyModel b = ModelLoader.load(obj, ModelRequest.DEFAULTS);
        assertNull(b.sidecar());
        assertEquals("m", b.lengthUnit());
        assertTrue(Double.isNaN(b.density()));
        assertTrue(Double.isInfinite(b.spin().periodSeconds()));
    }
}
