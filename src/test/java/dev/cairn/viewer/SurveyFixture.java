package dev.cairn.viewer;

import com.fasterxml.jackson.databind.JsonNode;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.rotation.SpinState;
import dev.cairn.surface.LatLonRaster;
import java.awt.image.BufferedImage;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Test fixture: a real survey, run once per test JVM by the {@code survey} command on an invented lumpy ellipsoid
 * (1000 × 800 × 600 m, 1280 facets, density 2000 kg/m³) spinning fast enough (2.5 h about +z) that its long ends lift
 * off, with maps {@value #MAP_GRID} pixels wide; plus the lat/lon raster the maps were drawn from (rebuilt from the
 * mesh, the spin and the centre of mass the survey reports), so a test knows which facet each map pixel shows.
 */
final class SurveyFixture {
    static final int MAP_GRID = 360;

    record Fixture(Path obj, Path dir, TriangleMesh mesh, SurveyData data, LatLonRaster raster, BodyGeometry geometry,
                   double[] centreOfMass) {
        BufferedImage map(String name) throws java.io.IOException {
            return javax.imageio.ImageIO.read(dir.resolve(name).toFile());
        }
    }

    private static Fixture cached;

    private SurveyFixture() {
    }

    static synchronized Fixture get() throws Exception {
        if (cached != null) {
            return cached;
        }
        Path tmp = Files.createTempDirectory("cairn-viewer-fixture");
        TriangleMesh mesh = dev.cairn.TestShapes.lumpySphere(3, 0.05, 11).scaled(1000);
        Path obj = SyntheticSurvey.writeObj(mesh, tmp.resolve("lumpy.obj"));
        Path dir = tmp.resolve("survey");
        StringWriter err = new StringWriter();
        int rc = dev.cairn.cli.CairnMain.execute(new PrintWriter(new StringWriter()), new PrintWriter(err, true),
            "survey", obj.toString(), "--density", "2000", "--spin-period", "2.5h", "--map-size",
            String.valueOf(MAP_GRID), "--threads", "2", "--out", dir.toString());
        if (rc != 0) {
            throw new IllegalStateException("survey failed: " + err);
        }
        SurveyData data = SurveyData.read(dir, obj, mesh.facetCount());
        JsonNode p = dev.cairn.io.StrictJson.MAPPER.readTree(Files.readString(dir.resolve("summary.json")))
            .get("parameters");
        double[] com = new double[3];
        double[] axis = new double[3];
        for (int k = 0; k < 3; k++) {
            com[k] = p.get("center_of_mass_m").get(k).asDouble();
            axis[k] = p.get("spin_axis").get(k).asDouble();
        }
        SpinState spin = new SpinState(p.get("spin_period_s").asDouble(), axis);
        LatLonRaster raster = LatLonRaster.build(mesh, new RotatingFrame(spin, com), MAP_GRID, MAP_GRID / 2, 1);
        BodyGeometry g = BodyGeometry.of(mesh, com, new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1}, axis, "lumpy");
        cached = new Fixture(obj, dir, mesh, data, raster, g, com);
        return cached;
    }
}
