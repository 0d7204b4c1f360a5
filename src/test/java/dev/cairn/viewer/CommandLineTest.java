package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.cli.CairnMain;
import dev.cairn.io.InputException;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The view/render commands' input checks, which all happen before any window or toolkit is needed. */
class CommandLineTest {
    @TempDir
    Path tmp;

    private String[] run(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int rc = CairnMain.execute(new PrintWriter(out, true), new PrintWriter(err, true), args);
        return new String[] {Integer.toString(rc), err.toString()};
    }

    @Test
    void renderRefusesASurveyOfAnotherModelWithOneLine() throws Exception {
        TriangleMesh a = Shapes.icosphere(1, 100);
        TriangleMesh b = Shapes.icosphere(2, 100);
        Path objA = SyntheticSurvey.writeObj(a, tmp.resolve("a.obj"));
        Path objB = SyntheticSurvey.writeObj(b, tmp.resolve("b.obj"));
        SyntheticSurvey.write(tmp.resolve("sa"), objA, a, f -> 1, f -> 0);
        String[] r = run("render", objB.toString(), "--survey", tmp.resolve("sa").toString(), "--out",
            tmp.resolve("x.png").toString());
        assertEquals("2", r[0]);
        assertTrue(r[1].contains("another model") && r[1].strip().lines().count() == 1, r[1]);
    }

    @Test
    void renderRefusesBadSizeQuantityAndView() throws Exception {
        Path obj = SyntheticSurvey.writeObj(Shapes.icosphere(1, 100), tmp.resolve("a.obj"));
        String png = tmp.resolve("x.png").toString();
        String[] r = run("render", obj.toString(), "--size", "100x100", "--quantity", "none", "--out", png);
        assertEquals("2", r[0], r[1]);
        assertTrue(r[1].contains("--size"), r[1]);
        r = run("render", obj.toString(), "--quantity", "steepness", "--out", png);
        assertEquals("2", r[0]);
        assertTrue(r[1].contains("unknown quantity 'steepness'"), r[1]);
        r = run("render", obj.toString(), "--view", "up", "--quantity", "none", "--out", png);
        assertEquals("2", r[0]);
        assertTrue(r[1].contains("unknown view 'up'"), r[1]);
    }

    @Test
    void missing3dSupportIsALoudError() {
        InputException e = assertThrows(InputException.class, () -> FxRuntime.requireScene3D(false));
        assertTrue(e.getMessage().contains("SCENE3D") && e.getMessage().contains("blank image"), e.getMessage());
        FxRuntime.requireScene3D(true);
    }

    @Test
    void sizesParse() {
        assertEquals(1600, RenderCommand.parseSize("1600x1200")[0]);
        assertEquals(1200, RenderCommand.parseSize("1600X1200")[1]);
        assertThrows(InputException.class, () -> RenderCommand.parseSize("1600"));
    }
}
