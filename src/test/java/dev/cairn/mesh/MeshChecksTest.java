package dev.cairn.mesh;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.body.BodyModel;
import dev.cairn.io.InputException;
import dev.cairn.body.ModelLoader;
import dev.cairn.body.ModelRequest;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/**
 * Mesh checks (issue 2, item 4): each broken fixture is refused for gravity with its specific message (what is wrong,
 * how many edges or facets, a few of them); an inward closed mesh is flipped with a warning; duplicate and unused
 * vertices are counted; the Euler characteristic V − E + F = 2 − 2g gives the genus (Euler–Poincaré formula;
 * a torus has genus 1).
 */
class MeshChecksTest {
    private static final ModelRequest DENSITY = new ModelRequest(null, 2000.0, null, null, null, null);

    private static InputException refusedForGravity(String fixture) {
        BodyModel body = ModelLoader.load(ObjFixtures.path(fixture), DENSITY);
        assertTrue(!body.report().fitForGravity());
        InputException e = assertThrows(InputException.class, body::fieldModel);
        assertTrue(e.getMessage().indexOf('\n') < 0, "one line");
        assertTrue(e.getMessage().startsWith(ObjFixtures.path(fixture).toString() + ": "), e.getMessage());
        return e;
    }

    @Test
    void openSurface() {
        InputException e = refusedForGravity("open-box.obj");
        // the top square's 4 sides each lose one facet; its diagonal 5-7 loses both (it is gone entirely)
        assertTrue(e.getMessage().contains(": surface is open: 4 edge(s) belong to one facet only (vertex pairs, 1-based: "),
            e.getMessage());
        assertTrue(e.getMessage().endsWith("); the polyhedron field needs a closed surface"), e.getMessage());
        assertEquals(4, ModelLoader.load(ObjFixtures.path("open-box.obj"), DENSITY).report().boundaryEdges());
    }

    @Test
    void inconsistentOrientation() {
        InputException e = refusedForGravity("inconsistent.obj");
        // facet 5 (1, 2, 6) reversed: its three edges now run the same way as their neighbours
        assertTrue(e.getMessage().contains(": facet orientation is inconsistent: at 3 edge(s) both neighbouring facets "
            + "run the same way (vertex pairs, 1-based: "), e.getMessage());
        for (String pair : new String[] {"1-2", "2-6", "1-6"}) {
            assertTrue(e.getMessage().contains(pair), pair + " in " + e.getMessage());
        }
    }

    @Test
    void nonManifoldEdge() {
        InputException e = refusedForGravity("non-manifold.obj");
        assertTrue(e.getMessage().contains(": surface is non-manifold: 1 edge(s) are shared by three or more facets "
            + "(vertex pairs, 1-based: 1-2)"), e.getMessage());
    }

    @Test
    void zeroAreaFacet() {
        InputException e = refusedForGravity("zero-area.obj");
        assertTrue(e.getMessage().endsWith(": 1 facet(s) have zero area (facets, 1-based: 14); remove or repair them"),
            e.getMessage());
    }

    @Test
    void inwardClosedMeshIsFlippedWithAWarning() {
        Path p = ObjFixtures.path("cube-inward.obj");
        BodyModel body = ModelLoader.load(p, DENSITY);
        assertEquals(1, body.warnings().size(), body.warnings().toString());
        assertTrue(body.warnings().get(0).startsWith(p + ": facets face inward (signed volume -1"),
            body.warnings().get(0));
        assertTrue(body.warnings().get(0).endsWith("all facets flipped to face outward"));
        assertEquals(1.0, body.report().signedVolume(), 1e-15);
        assertEquals(1.0, body.massProperties().volume(), 1e-15);
        // the flipped mesh gives the attracting (positive) potential of the unit cube at its centre
        double[] s = new double[dev.cairn.gravity.FieldSample.SIZE];
        body.fieldModel().newEvaluator().evaluate(0.5, 0.5, 0.5, false, s, 0);
        assertEquals(2.380077363979554 * dev.cairn.gravity.Constants.G * 2000.0, s[dev.cairn.gravity.FieldSample.U],
            1e-12 * s[dev.cairn.gravity.FieldSample.U], "shared references §2, unit cube centre");
    }

    @Test
    void duplicateAndUnusedVerticesAreCounted() {
        BodyModel body = ModelLoader.load(ObjFixtures.path("cube-duplicate-unused.obj"), DENSITY);
        MeshReport r = body.report();
        assertEquals(10, r.vertices());
        assertEquals(1, r.duplicateVertices());
        assertEquals(2, r.unusedVertices());
        assertTrue(r.fitForGravity(), "unused vertices do not stop the field");
        assertEquals(2, r.eulerCharacteristic(), "V_used - E + F for a sphere-like cube");
        assertEquals(0, r.genus());
    }

    @Test
    void torusHasGenusOne() {
        TriangleMesh torus = TestShapes.torus(24, 12, 3.0, 1.0);
        MeshReport r = MeshInspector.inspect(torus);
        assertTrue(r.fitForGravity());
        assertEquals(1, r.components());
        assertEquals(0, r.eulerCharacteristic(), "V - E + F = 2 - 2g");
        assertEquals(1, r.genus());
        assertTrue(r.signedVolume() > 0, "outward");
        // Pappus: volume of the smooth torus 2π²Rr² is approached from below by the inscribed mesh
        double smooth = 2 * Math.PI * Math.PI * 3.0;
        assertTrue(r.signedVolume() < smooth && r.signedVolume() > 0.9 * smooth, "volume " + r.signedVolume());
    }

    /** Joins two meshes into one (vertex indices of the second shifted). */
    private static TriangleMesh union(TriangleMesh a, TriangleMesh b) {
        double[] xyz = new double[a.xyz().length + b.xyz().length];
        System.arraycopy(a.xyz(), 0, xyz, 0, a.xyz().length);
        System.arraycopy(b.xyz(), 0, xyz, a.xyz().length, b.xyz().length);
        int[] tri = new int[a.tri().length + b.tri().length];
        System.arraycopy(a.tri(), 0, tri, 0, a.tri().length);
        for (int i = 0; i < b.tri().length; i++) {
            tri[a.tri().length + i] = b.tri()[i] + a.vertexCount();
        }
        return new TriangleMesh(xyz, tri);
    }

    private static double[] sample(BodyModel body, double x, double y, double z) {
        double[] s = new double[dev.cairn.gravity.FieldSample.SIZE];
        body.fieldModel().newEvaluator().evaluate(x, y, z, false, s, 0);
        return s;
    }

    /**
     * Regression: two disjoint closed components, one facing inward, have total signed volume 0 and were neither
     * flipped nor refused, so the inward cube attracted with negative mass. Now it is flipped with a warning.
     */
    @Test
    void inwardComponentOutsideTheOthersIsFlipped(@org.junit.jupiter.api.io.TempDir Path dir) {
        TriangleMesh pair = union(Shapes.box(0, 0, 0, 1, 1, 1), Shapes.box(3, 0, 0, 4, 1, 1).flipped());
        Path obj = TestShapes.write(dir.resolve("pair.obj"), TestShapes.objText(pair, 1));
        BodyModel body = ModelLoader.load(obj, DENSITY);
        assertEquals(1, body.warnings().size(), body.warnings().toString());
        assertTrue(body.warnings().get(0).startsWith(obj + ": 1 of 2 closed component(s) face inward and lie outside"
            + " the others (first facet, 1-based: 13)"), body.warnings().get(0));
        assertEquals(2.0, body.massProperties().volume(), 1e-14);
        // Both cubes attract: U at the second cube's centre exceeds the unit cube's own centre value (references §2).
        double[] s = sample(body, 3.5, 0.5, 0.5);
        assertTrue(s[dev.cairn.gravity.FieldSample.U] > 2.380077363979554 * dev.cairn.gravity.Constants.G * 2000.0);
        assertEquals(dev.cairn.gravity.Location.INSIDE,
            dev.cairn.gravity.Location.fromCode(s[dev.cairn.gravity.FieldSample.LOCATION]));
    }

    /** An inward component inside an outward one is a cavity: kept, no warning; also when the whole file is inside out. */
    @Test
    void inwardComponentInsideAnotherIsACavity(@org.junit.jupiter.api.io.TempDir Path dir) {
        TriangleMesh hollow = union(Shapes.box(0, 0, 0, 3, 3, 3), Shapes.box(1, 1, 1, 2, 2, 2).flipped());
        for (boolean insideOut : new boolean[] {false, true}) {
            Path obj = TestShapes.write(dir.resolve("hollow-" + insideOut + ".obj"),
                TestShapes.objText(insideOut ? hollow.flipped() : hollow, 1));
            BodyModel body = ModelLoader.load(obj, DENSITY);
            assertEquals(insideOut ? 1 : 0, body.warnings().size(), body.warnings().toString());
            assertEquals(26.0, body.massProperties().volume(), 1e-13, "27 - 1 m^3");
            // The cavity's centre is outside the material: Laplace's equation holds there (Σω = 4π − 4π = 0).
            double[] s = sample(body, 1.5, 1.5, 1.5);
            assertEquals(dev.cairn.gravity.Location.OUTSIDE,
                dev.cairn.gravity.Location.fromCode(s[dev.cairn.gravity.FieldSample.LOCATION]));
            double gRho = dev.cairn.gravity.Constants.G * 2000.0;
            assertEquals(0.0, s[dev.cairn.gravity.FieldSample.LAPLACIAN], 1e-13 * 4 * Math.PI * gRho);
            // By symmetry g = 0 at the common centre (shell-like cavity, Newton).
            assertEquals(0.0, dev.cairn.gravity.FieldSample.accelerationNorm(s, 0), 1e-13 * gRho * 3);
        }
    }

    @Test
    void twoSeparateBodiesAreTwoComponents() {
        TriangleMesh a = Shapes.box(0, 0, 0, 1, 1, 1);
        TriangleMesh b = Shapes.box(3, 0, 0, 4, 1, 1);
        double[] xyz = new double[48];
        System.arraycopy(a.xyz(), 0, xyz, 0, 24);
        System.arraycopy(b.xyz(), 0, xyz, 24, 24);
        int[] tri = new int[72];
        System.arraycopy(a.tri(), 0, tri, 0, 36);
        for (int i = 0; i < 36; i++) {
            tri[36 + i] = b.tri()[i] + 8;
        }
        MeshReport r = MeshInspector.inspect(new TriangleMesh(xyz, tri));
        assertEquals(2, r.components());
        assertEquals(4, r.eulerCharacteristic());
        assertEquals(0, r.genus());
    }
}
