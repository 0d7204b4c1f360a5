package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.cli.CairnMain;
import dev.cairn.mesh.Shapes;
import java.awt.image.BufferedImage;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code survey --views} adds the 3D views to the survey's outputs through the {@code render} command. Needs a
 * display server with OpenGL (Xvfb + Mesa in CI); a missing display makes the survey skip the views with a warning,
 * which this test turns into a loud failure because the PNG files are then absent.
 */
@Tag("display")
class SurveyViewsDisplayTest {
    /** Render size used by the survey's views (the render command's default). */
    private static final int EXPECTED_WIDTH = 1600;
    private static final int EXPECTED_HEIGHT = 1200;

    @Test
    void surveyWithViewsWritesTheRenderedPngs(@TempDir Path dir) throws Exception {
        Path obj = dev.cairn.TestShapes.writeObj(Shapes.ellipsoid(3, 900, 600, 500), dir.resolve("egg.obj"));
        Path out = dir.resolve("survey");
        StringWriter err = new StringWriter();
        int code = CairnMain.execute(new PrintWriter(new StringWriter()), new PrintWriter(err), "survey", obj.toString(),
            "--density", "2000", "--spin-period", "6h", "--out", out.toString(), "--views");
        assertEquals(0, code, err.toString());
        for (String name : new String[] {"view-sites-iso.png", "view-slope-iso.png", "view-slope-plusz.png",
            "view-zones-iso.png", "view-g-eff-iso.png"}) {
            Path png = out.resolve(name);
            assertTrue(Files.isRegularFile(png), name + " missing; stderr: " + err);
            BufferedImage img = ImageIO.read(png.toFile());
            assertEquals(EXPECTED_WIDTH, img.getWidth(), name);
            assertEquals(EXPECTED_HEIGHT, img.getHeight(), name);
        }
    }
}
