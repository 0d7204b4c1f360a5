package dev.cairn.regions;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.io.InputException;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * One good body description and one broken copy per failure mode; each must give its own clear one-line error
 * naming the file and the region (project rule: bad input is a one-line InputException; common practice, no source).
 */
class BodyDescriptionErrorsTest {
    @TempDir
    Path dir;

    @BeforeEach
    void shapes() throws Exception {
        TestFiles.obj(dir, "outer.obj", Shapes.icosphere(2, 1000));
        TestFiles.obj(dir, "core.obj", Shapes.icosphere(1, 300));
        TestFiles.obj(dir, "left.obj", TestFiles.shifted(Shapes.icosphere(1, 300), -150, 0, 0));
        TestFiles.obj(dir, "right.obj", TestFiles.shifted(Shapes.icosphere(1, 300), 150, 0, 0));
        TestFiles.obj(dir, "poking.obj", TestFiles.shifted(Shapes.icosphere(1, 300), 850, 0, 0));
    }

    private String fails(String json) throws Exception {
        Path p = TestFiles.json(dir, "body.json", json);
        InputException e = assertThrows(InputException.class, () -> ModelLoader.load(p, ModelRequest.DEFAULTS));
        String m = e.getMessage();
        assertFalse(m.contains("\n"), "one line: " + m);
        assertTrue(m.startsWith(p.toString()), "names the file: " + m);
        return m;
    }

    private static String region(String name, String shape, double density) {
        return "{\"name\": \"" + name + "\", \"shape\": \"" + shape + "\", \"density_kg_m3\": " + density + "}";
    }

    @Test
    void goodDescriptionLoads() throws Exception {
        Path p = TestFiles.json(dir, "body.json", "{\"regions\": [" + region("mantle", "outer.obj", 1500) + ", "
            + region("west", "left.obj", 2500).replace("left", "core") + "]}");
        assertTrue(ModelLoader.load(p, ModelRequest.DEFAULTS).gm() > 0);
    }

    @Test
    void missingShapeFile() throws Exception {
        String m = fails("{\"regions\": [" + region("mantle", "outer.obj", 1500) + ", "
            + region("core", "nowhere.obj", 2500) + "]}");
        assertTrue(m.contains("region 'core'") && m.contains("nowhere.obj") && m.contains("not found"), m);
    }

    @Test
    void overlappingRegions() throws Exception {
        String m = fails("{\"regions\": [" + region("mantle", "outer.obj", 1500) + ", "
            + region("west", "left.obj", 2500) + ", " + region("east", "right.obj", 2600) + "]}");
        assertTrue(m.contains("'west'") && m.contains("'east'") && m.contains("overlap"), m);
    }

    @Test
    void regionOutsideTheOuterShape() throws Exception {
        String m = fails("{\"regions\": [" + region("mantle", "outer.obj", 1500) + ", "
            + region("lump", "poking.obj", 2500) + "]}");
        assertTrue(m.contains("region 'lump' extends outside the outer shape 'mantle'"), m);
    }

    /**
     * A bar whose eight vertices all lie inside an L-shaped outer body but whose long edges cut across the notch of
     * the L: no vertex is on the wrong side, yet the surfaces cross (geometry: the segment from (1.8, 0.8) to
     * (0.8, 1.8) km passes (1.3, 1.3), outside the L).
     */
    @Test
    void regionWhoseEdgesPierceTheOuterShape() throws Exception {
        TestFiles.obj(dir, "ell.obj", TestShapes.lShape().scaled(1000));
        TestFiles.obj(dir, "bar.obj", TestShapes.bar(new double[] {1800, 800, 500},
            new double[] {800, 1800, 500}, 100));
        String m = fails("{\"regions\": [" + region("mantle", "ell.obj", 1500) + ", "
            + region("bar", "bar.obj", 2500) + "]}");
        assertTrue(m.contains("region 'bar' crosses the outer shape 'mantle'") && m.contains("pierces facet"), m);
    }

    @Test
    void negativeDensity() throws Exception {
        String m = fails("{\"regions\": [" + region("mantle", "outer.obj", 1500) + ", "
            + region("core", "core.obj", -200) + "]}");
        assertTrue(m.contains("region 'core'") && m.contains("density_kg_m3") && m.contains("-200"), m);
    }

    @Test
    void unknownKeyAndMissingRegionsList() throws Exception {
        String m = fails("{\"regions\": [" + region("mantle", "outer.obj", 1500).replace("shape", "shap") + "]}");
        assertTrue(m.contains("shap"), m);
        String n = fails("{\"density_kg_m3\": 1500}");
        assertTrue(n.contains("not a body description"), n);
    }
}
