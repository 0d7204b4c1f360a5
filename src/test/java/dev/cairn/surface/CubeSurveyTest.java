package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.gravity.Constants;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * A resting unit cube with Gρ = 1, triangulated so that one facet on each face has its centroid at the face centre
 * (the face's two mesh edges not touching the corners (0,0,0) and (1,1,1) are split at their midpoints; those six
 * edges form a cycle, so the surface stays closed).
 *
 * <p>Sources: at a face centre the closed-form prism field (Nagy 1966; Nagy, Papp &amp; Benedek 2000, J. Geodesy
 * 74:552–560; values in shared references §2, re-computed by quadrature) gives U = 1.792810243178775 and an inward
 * normal acceleration 2.596896578258365 with no tangential part (symmetry), so the slope is 0. Facets that a
 * symmetry of the cube maps onto each other must carry the same values.
 */
class CubeSurveyTest {
    private static final double RHO = 1.0 / Constants.G; // Gρ = 1
    /** Relative tolerance against the closed form (the polyhedron field is exact: round-off only). */
    private static final double REL_TOL = 1e-12;
    /** Absolute slope tolerance at face centres, degrees (round-off only). */
    private static final double SLOPE_TOL_DEG = 1e-9;
    /** Agreement of symmetric facets (round-off only). */
    private static final double SYM_REL_TOL = 1e-11;

    /** The 24-facet cube described in the class comment. */
    static TriangleMesh centredCube() {
        int[][] faces = {{0, 3, 2, 1}, {4, 5, 6, 7}, {0, 1, 5, 4}, {3, 7, 6, 2}, {0, 4, 7, 3}, {1, 2, 6, 5}};
        TriangleMesh box = Shapes.unitCube();
        double[] corner = box.xyz();
        List<double[]> verts = new ArrayList<>();
        Map<String, Integer> index = new HashMap<>();
        List<int[]> tris = new ArrayList<>();
        for (int[] face : faces) {
            int o = -1;
            for (int k = 0; k < 4; k++) {
                int v = face[k];
                double s = corner[3 * v] + corner[3 * v + 1] + corner[3 * v + 2];
                if (s == 0 || s == 3) { // exact: the corners (0,0,0) and (1,1,1)
                    o = k;
                }
            }
            double[] pO = at(corner, face[o]);
            double[] pA = at(corner, face[(o + 1) % 4]);
            double[] pK = at(corner, face[(o + 2) % 4]);
            double[] pB = at(corner, face[(o + 3) % 4]);
            double[] m1 = mid(pA, pK);
            double[] m2 = mid(pK, pB);
            int iO = id(pO, verts, index);
            int iA = id(pA, verts, index);
            int iK = id(pK, verts, index);
            int iB = id(pB, verts, index);
            int i1 = id(m1, verts, index);
            int i2 = id(m2, verts, index);
            tris.add(new int[] {iO, iA, i1});
            tris.add(new int[] {iO, i1, i2}); // centroid = face centre
            tris.add(new int[] {i1, iK, i2});
            tris.add(new int[] {iO, i2, iB});
        }
        double[] xyz = new double[3 * verts.size()];
        for (int i = 0; i < verts.size(); i++) {
            System.arraycopy(verts.get(i), 0, xyz, 3 * i, 3);
        }
        int[] tri = new int[3 * tris.size()];
        for (int i = 0; i < tris.size(); i++) {
            System.arraycopy(tris.get(i), 0, tri, 3 * i, 3);
        }
        return new TriangleMesh(xyz, tri);
    }

    private static double[] at(double[] xyz, int v) {
        return new double[] {xyz[3 * v], xyz[3 * v + 1], xyz[3 * v + 2]};
    }

    private static double[] mid(double[] a, double[] b) {
        return new double[] {(a[0] + b[0]) / 2, (a[1] + b[1]) / 2, (a[2] + b[2]) / 2};
    }

    private static int id(double[] p, List<double[]> verts, Map<String, Integer> index) {
        return index.computeIfAbsent(p[0] + "," + p[1] + "," + p[2], k -> {
            verts.add(p);
            return verts.size() - 1;
        });
    }

    private static SurveyResult survey() {
        SurveyTarget t = SurveyTestBodies.target("cube", centredCube(), RHO, SpinState.NONE);
        return SurveyTestBodies.survey(t, SurveyParameters.defaults().withZoneRadius(0.05)
            .withHoverAltitudes(new double[] {0}));
    }

    @Test
    void faceCentresAreLevelWithTheClosedFormField() {
        SurveyResult r = survey();
        assertEquals(24, r.facetCount());
        double[] c = r.centroids();
        int centres = 0;
        for (int f = 0; f < r.facetCount(); f++) {
            int halves = 0;
            for (int k = 0; k < 3; k++) {
                halves += Math.abs(c[3 * f + k] - 0.5) < 1e-15 ? 1 : 0;
            }
            if (halves != 2) {
                continue;
            }
            centres++;
            assertEquals(0.0, r.slopeDeg()[f], SLOPE_TOL_DEG, "slope at a face centre");
            assertEquals(1.792810243178775, r.potential()[f], REL_TOL * 1.8, "U at a face centre");
            assertEquals(2.596896578258365, r.gravityNormal()[f], REL_TOL * 2.6, "inward normal g at a face centre");
            assertEquals(0.0, r.gravityTangential()[f], 1e-12, "no tangential g at a face centre");
            assertEquals(r.potential()[f], r.potentialEff()[f], 0.0, "no spin: V = U");
        }
        assertEquals(6, centres);
    }

    @Test
    void symmetricFacetsAgree() {
        SurveyResult r = survey();
        // Facets equivalent under the cube's symmetries share area and distance of the centroid from the centre.
        Map<String, List<Integer>> classes = new HashMap<>();
        double[] c = r.centroids();
        double[] a = r.areas();
        for (int f = 0; f < r.facetCount(); f++) {
            double d = Math.hypot(Math.hypot(c[3 * f] - 0.5, c[3 * f + 1] - 0.5), c[3 * f + 2] - 0.5);
            String key = String.format(java.util.Locale.ROOT, "%.9f/%.9f", d, a[f]);
            classes.computeIfAbsent(key, k -> new ArrayList<>()).add(f);
        }
        assertEquals(3, classes.size(), "centre facets, corner pieces by (0,0,0)/(1,1,1), corner pieces by K");
        for (List<Integer> cls : classes.values()) {
            int f0 = cls.get(0);
            for (int f : cls) {
                assertEquals(r.slopeDeg()[f0], r.slopeDeg()[f], SYM_REL_TOL * 90, "slope");
                assertEquals(r.gravity()[f0], r.gravity()[f], SYM_REL_TOL * r.gravity()[f0], "|g|");
                assertEquals(r.potential()[f0], r.potential()[f], SYM_REL_TOL * r.potential()[f0], "U");
                assertEquals(r.escapeSpeed()[f0], r.escapeSpeed()[f], SYM_REL_TOL * r.escapeSpeed()[f0], "escape");
            }
        }
    }
}
