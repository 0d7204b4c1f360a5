package dev.cairn.mesh;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.io.InputException;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import dev.cairn.mass.MassPropertiesCalculator;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/**
 * The OBJ reader against the Wavefront OBJ format (the "Object Files (.obj)" appendix of the Advanced Visualizer
 * manual, Wavefront Technologies [M]): index forms i, i/t, i//n, i/t/n, negative (relative) indices, polygons
 * fan-triangulated, comments, blank lines, CRLF, scientific notation, ignored statements; and one broken fixture per
 * failure mode, each asserting its message (file, line, problem). Geometry is checked against exact volumes.
 */
class ObjReaderTest {
    /** Volumes and coordinates of small exact solids, relative (a few flops of round-off). */
    private static final double EXACT_TOL = 1e-14;

    private static ObjReader.Result read(String fixture) {
        return ObjReader.read(ObjFixtures.path(fixture), 1.0);
    }

    private static double volume(TriangleMesh m) {
        return MassPropertiesCalculator.unitDensity(m).volume();
    }

    @Test
    void everyIndexFormNegativeIndicesCommentsAndIgnoredStatements() {
        ObjReader.Result r = read("cube-index-forms.obj");
        TriangleMesh m = r.mesh();
        assertEquals(8, m.vertexCount());
        assertEquals(12, m.facetCount(), "6 quads fan-triangulated into 12 triangles");
        assertEquals(0, r.warnings().size(), "planar quads draw no warning: " + r.warnings());
        MeshReport rep = MeshInspector.inspect(m);
        assertTrue(rep.fitForGravity(), "closed and consistently oriented");
        assertEquals(1.0, rep.signedVolume(), EXACT_TOL, "outward unit cube");
        // scientific notation: 1.0e0, 1E+0, 100e-2, 10.0E-1 all read as 1
        double[] bb = m.boundingBox();
        assertEquals(1.0, bb[3], 0.0);
        assertEquals(1.0, bb[4], 0.0);
        assertEquals(1.0, bb[5], 0.0);
    }

    @Test
    void crlfLineEnds() {
        ObjReader.Result r = read("cube-crlf.obj");
        assertEquals(8, r.mesh().vertexCount());
        assertEquals(12, r.mesh().facetCount());
        assertEquals(1.0, volume(r.mesh()), EXACT_TOL);
    }

    @Test
    void planarNGonsAreFanTriangulated() {
        ObjReader.Result r = read("hexagonal-prism.obj");
        assertEquals(20, r.mesh().facetCount(), "2 hexagons (4 triangles each) + 6 quads (2 each)");
        assertEquals(0, r.warnings().size());
        // regular hexagon of circumradius 1: area 3√3/2; height 2
        assertEquals(3 * Math.sqrt(3), volume(r.mesh()), 1e-12);
        assertTrue(MeshInspector.inspect(r.mesh()).fitForGravity());
    }

    @Test
    void nonPlanarPolygonsDrawOneWarning() {
        Path p = ObjFixtures.path("cube-non-planar.obj");
        ObjReader.Result r = ObjReader.read(p, 1.0);
        assertEquals(12, r.mesh().facetCount());
        assertEquals(1, r.warnings().size());
        String w = r.warnings().get(0);
        assertTrue(w.startsWith(p + ":11: 1 polygon(s) are not planar"), w);
    }

    @Test
    void kilometreUnitsScaleToMetres() {
        ObjReader.Result r = ObjReader.read(ObjFixtures.path("cube-crlf.obj"), 1000.0);
        assertEquals(1e9, volume(r.mesh()), 1e9 * EXACT_TOL);
        var body = ModelLoader.load(ObjFixtures.path("cube-crlf.obj"),
            new ModelRequest("km", 1000.0, null, null, null, null));
        assertEquals(1000.0, body.mesh().boundingBox()[3], 0.0);
        assertEquals(1e12, body.massProperties().mass(), 1e12 * EXACT_TOL);
        assertEquals("km", body.lengthUnit());
    }

    private static void fails(String fixture, String expectedAfterFile) {
        Path p = ObjFixtures.path(fixture);
        InputException e = assertThrows(InputException.class, () -> ObjReader.read(p, 1.0));
        assertEquals(p + expectedAfterFile, e.getMessage());
        assertTrue(e.getMessage().indexOf('\n') < 0, "one line");
    }

    @Test
    void missingFile() {
        Path p = Path.of("no", "such", "model.obj");
        InputException e = assertThrows(InputException.class, () -> ObjReader.read(p, 1.0));
        assertEquals(p + ": no such file", e.getMessage());
    }

    @Test
    void nonNumericCoordinate() {
        fails("bad-coordinate.obj", ":4: coordinate 'zero' is not a number");
    }

    @Test
    void indexOutOfRange() {
        fails("index-out-of-range.obj", ":6: facet vertex index 9 out of range (4 vertices defined so far)");
    }

    @Test
    void indexZero() {
        fails("index-zero.obj", ":4: facet vertex index 0 is invalid (OBJ indices start at 1)");
    }

    @Test
    void facetWithFewerThanThreeVertices() {
        fails("short-facet.obj", ":5: facet has 2 vertices, at least 3 are needed");
    }

    @Test
    void emptyModel() {
        fails("empty.obj", ": empty model: no vertices ('v' lines) found");
        fails("no-facets.obj", ": empty model: no facets ('f' lines) found");
    }
}
