package dev.cairn.mesh;

import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;

import dev.cairn.TestShapes;
import org.junit.jupiter.api.Test;

/**
 * {@link SelfIntersection} against surfaces whose answer is known by construction (common practice, no source):
 * simple closed surfaces of genus 0 and 1 do not cut themselves; two boxes that interpenetrate do; boxes that only
 * touch at a vertex, or lie apart, do not; a facet given twice and a surface folded flat are found.
 */
class SelfIntersectionTest {
    private static TriangleMesh union(TriangleMesh a, TriangleMesh b) {
        double[] v = new double[a.xyz().length + b.xyz().length];
        System.arraycopy(a.xyz(), 0, v, 0, a.xyz().length);
        System.arraycopy(b.xyz(), 0, v, a.xyz().length, b.xyz().length);
        int[] t = new int[a.tri().length + b.tri().length];
        System.arraycopy(a.tri(), 0, t, 0, a.tri().length);
        for (int i = 0; i < b.tri().length; i++) {
            t[a.tri().length + i] = b.tri()[i] + a.vertexCount();
        }
        return new TriangleMesh(v, t);
    }

    @Test
    void simpleClosedSurfacesDoNotCutThemselves() {
        assertNull(SelfIntersection.find(Shapes.icosphere(4, 1000)));
        assertNull(SelfIntersection.find(TestShapes.torus(48, 24, 1000, 300)));
        assertNull(SelfIntersection.find(TestShapes.lShape()));
        assertNull(SelfIntersection.find(TestShapes.lumpySphere(3, 0.2, 11)));
        // Far apart and touching at one corner only: no crossing.
        assertNull(SelfIntersection.find(union(Shapes.box(0, 0, 0, 1, 1, 1), Shapes.box(3, 0, 0, 4, 1, 1))));
        assertNull(SelfIntersection.find(union(Shapes.box(0, 0, 0, 1, 1, 1), Shapes.box(1, 1, 1, 2, 2, 2))));
    }

    @Test
    void crossingsAreFound() {
        // Interpenetrating boxes (edges of one pierce facets of the other).
        assertNotNull(SelfIntersection.find(union(Shapes.box(0, 0, 0, 2, 2, 2), Shapes.box(1, 1, 1, 3, 3, 3))));
        // A small box whose corner pokes through one face of a big one.
        assertNotNull(SelfIntersection.find(union(Shapes.box(0, 0, 0, 10, 10, 10),
            Shapes.box(9.5, 4, 4, 10.5, 5, 5))));
        // A facet given twice (the zero-volume pair of opposite facets).
        assertNotNull(SelfIntersection.find(new TriangleMesh(new double[] {0, 0, 0, 1, 0, 0, 0, 1, 0},
            new int[] {0, 1, 2, 0, 2, 1})));
        // Folded flat: two facets over one another across their shared edge (0-1).
        assertNotNull(SelfIntersection.find(new TriangleMesh(new double[] {0, 0, 0, 2, 0, 0, 1, 1, 0, 1, 0.5, 0},
            new int[] {0, 1, 2, 1, 0, 3})));
        // An icosphere with one vertex pushed through the opposite side.
        TriangleMesh s = Shapes.icosphere(2, 1000);
        double[] v = s.xyz().clone();
        v[0] = -1.8 * v[0];
        v[1] = -1.8 * v[1];
        v[2] = -1.8 * v[2];
        assertNotNull(SelfIntersection.find(new TriangleMesh(v, s.tri())));
    }
}
