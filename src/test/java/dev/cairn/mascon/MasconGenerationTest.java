package dev.cairn.mascon;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ProgressListener;
import org.junit.jupiter.api.Test;

/**
 * Mass properties of generated mascon sets against the polyhedron's (Dobrovolskis 1996, Icarus 124:698–704; Tonon
 * 2005, J. Math. Stat. 1(1):8–11, via {@link MassPropertiesCalculator}) and against the published L-shape values of
 * shared references §4: three unit cubes, COM (5/6, 5/6, 1/2), I_c = [[7/6, 1/3, 0], [1/3, 7/6, 0], [0, 0, 11/6]].
 */
class MasconGenerationTest {
    /** Tetrahedral scheme: mass and centre of mass are exact in exact arithmetic; rounding only. */
    private static final double ROUNDING = 1e-13;
    /** Tetrahedral inertia, icosphere level 3, S = 1 and S = 4 shells (measured 6.4e-2 and 7.1e-3). */
    private static final double INERTIA_S1 = 0.07;
    private static final double INERTIA_S4 = 0.008;
    /** Tetrahedral inertia, L-shape, 3 shells, 4 pieces per facet (measured 5.5e-2). */
    private static final double L_SHAPE_INERTIA = 0.065;
    /** Lattice mass, icosphere level 3, cell 0.1 of the radius, octree depth 3 (measured 8.5e-5). */
    private static final double LATTICE_MASS_REL = 5e-4;
    /** Lattice inertia, same set (measured 3.9e-3: the cubes' own inertia, ~h^2/(6 R^2)·5/2, is missing). */
    private static final double LATTICE_INERTIA_REL = 6e-3;

    /** The L-shaped prism of three unit cubes: L polygon (0,0),(2,0),(2,1),(1,1),(1,2),(0,2) extruded over z ∈ [0,1]. */
    static TriangleMesh lShape() {
        double[] p = {0, 0, 2, 0, 2, 1, 1, 1, 1, 2, 0, 2};
        double[] xyz = new double[36];
        for (int i = 0; i < 6; i++) {
            xyz[3 * i] = p[2 * i];
            xyz[3 * i + 1] = p[2 * i + 1];
            xyz[3 * (i + 6)] = p[2 * i];
            xyz[3 * (i + 6) + 1] = p[2 * i + 1];
            xyz[3 * (i + 6) + 2] = 1;
        }
        int[] top = {0, 1, 2, 0, 2, 3, 0, 3, 4, 0, 4, 5};
        int[] tri = new int[12 * 3 + 12 * 3];
        int q = 0;
        for (int i = 0; i < top.length; i += 3) {
            tri[q++] = top[i] + 6; // top, counter-clockwise from +z
            tri[q++] = top[i + 1] + 6;
            tri[q++] = top[i + 2] + 6;
            tri[q++] = top[i]; // bottom, reversed
            tri[q++] = top[i + 2];
            tri[q++] = top[i + 1];
        }
        for (int i = 0; i < 6; i++) {
            int j = (i + 1) % 6;
            tri[q++] = i;
            tri[q++] = j;
            tri[q++] = j + 6;
            tri[q++] = i;
            tri[q++] = j + 6;
            tri[q++] = i + 6;
        }
        return new TriangleMesh(xyz, java.util.Arrays.copyOf(tri, q));
    }

    @Test
    void tetrahedralMassAndCentreAreExactOnTheLShape() {
        TriangleMesh l = lShape();
        MasconSet set = MasconGenerator.tetrahedral(DensityModel.uniform(l, 1.0), 3, 2, 2, ProgressListener.NONE);
        assertEquals(20 * 4 * 3, set.count(), "20 facets x 4 sub-triangles x 3 shells");
        assertEquals(3.0, set.totalMass(), 3 * ROUNDING, "mass of three unit cubes at density 1");
        double[] c = set.centerOfMass();
        assertEquals(5.0 / 6, c[0], ROUNDING);
        assertEquals(5.0 / 6, c[1], ROUNDING);
        assertEquals(0.5, c[2], ROUNDING);
        // Inertia about the COM, published values (references §4); the scheme misses each piece's own inertia.
        double[] ref = {7.0 / 6, 1.0 / 3, 0, 1.0 / 3, 7.0 / 6, 0, 0, 0, 11.0 / 6};
        double[] inertia = set.inertia();
        double d = 0;
        double n = 0;
        for (int k = 0; k < 9; k++) {
            d += (inertia[k] - ref[k]) * (inertia[k] - ref[k]);
            n += ref[k] * ref[k];
        }
        assertTrue(Math.sqrt(d / n) < L_SHAPE_INERTIA, "inertia of the coarse L-shape set: " + Math.sqrt(d / n));
    }

    @Test
    void tetrahedralSetMatchesThePolyhedronAndInertiaImprovesWithShells() {
        TriangleMesh s = Shapes.icosphere(3, 1.0).transformed(new double[] {1, 0, 0, 0, 1, 0, 0, 0, 1}, 1.0,
            new double[] {0.3, -0.2, 0.7});
        MassProperties mp = MassPropertiesCalculator.compute(s, 2000);
        DensityModel dm = DensityModel.uniform(s, 2000);
        MasconReport r1 = MasconReport.of(MasconGenerator.tetrahedral(dm, 1, 1, 2, ProgressListener.NONE), mp);
        MasconReport r4 = MasconReport.of(MasconGenerator.tetrahedral(dm, 4, 1, 2, ProgressListener.NONE), mp);
        for (MasconReport r : new MasconReport[] {r1, r4}) {
            assertEquals(0, r.massError(), ROUNDING, "total mass to rounding");
            assertEquals(0, r.centerOffset(), ROUNDING, "centre of mass to rounding");
            assertEquals(0, r.negative(), "a sphere is star-shaped about its centre: no negative pieces");
        }
        assertTrue(r1.inertiaError() < INERTIA_S1, "S=1 inertia " + r1.inertiaError());
        assertTrue(r4.inertiaError() < INERTIA_S4, "S=4 inertia " + r4.inertiaError());
    }

    @Test
    void latticeMassIsCloseToThePolyhedrons() {
        TriangleMesh s = Shapes.icosphere(3, 1.0);
        MassProperties mp = MassPropertiesCalculator.compute(s, 1000);
        MasconSet set = MasconGenerator.lattice(DensityModel.uniform(s, 1000), 0.1, 3, 2, ProgressListener.NONE);
        MasconReport r = MasconReport.of(set, mp);
        assertEquals(0, r.massError(), LATTICE_MASS_REL, "lattice mass");
        assertTrue(r.centerOffset() < 1e-12, "symmetric lattice about a symmetric body: centre of mass exact");
        assertTrue(r.inertiaError() < LATTICE_INERTIA_REL, "lattice inertia " + r.inertiaError());
    }
}
