package dev.cairn.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.mesh.Shapes;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Tag;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Under a display (Xvfb + Mesa in CI): {@code deploy --views} writes {@code rest-points-3d.png} through the
 * {@code render} command with the model and spin options of the deploy run, and says so in one line.
 */
@Tag("display")
class DeployViewsDisplayTest {
    @TempDir
    Path dir;

    @Test
    void writesTheRestPointsView() throws Exception {
        Path obj = TestShapes.write(dir.resolve("ball.obj"), TestShapes.objText(Shapes.icosphere(2, 100), 1.0));
        Path out = dir.resolve("out");
        CliRun r = CliRun.of("deploy", obj.toString(), "--density", "2000", "--spin-period", "6h", "--release",
            "0,0,140", "--velocity", "0.003,0,-0.01", "--count", "4", "--position-sigma", "5", "--velocity-sigma",
            "0.002", "--rest-apex", "0.05", "--seed", "3", "--out", out.toString(), "--views", "--threads", "1");
        assertEquals(0, r.exit(), r.err());
        Path png = out.resolve("rest-points-3d.png");
        assertTrue(r.err().contains("cairn: wrote " + png), r.err());
        BufferedImage img = ImageIO.read(png.toFile());
        assertEquals(1600, img.getWidth());
        assertEquals(1200, img.getHeight());
        assertTrue(Files.size(png) > 10_000);
        // the marker colour (white) appears in the 3D part of the image, left of the legend and above the footer
        int white = 0;
        for (int y = 0; y < 1000; y++) {
            for (int x = 0; x < 1300; x++) {
                if ((img.getRGB(x, y) & 0xFFFFFF) == 0xFFFFFF) {
                    white++;
                }
            }
        }
        assertTrue(white > 0, "no marker pixels");
    }
}
