package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * Landing-zone search on synthetic bodies whose answer is known by construction.
 *
 * <p>"Rough" body: an icosphere (radius 50 m, 1280 facets, facet edges about 7.6 m) whose vertices are moved
 * radially by seeded random amounts of up to ±{@value #BUMP_M} m, so that neighbouring facets tilt by tens of degrees
 * and no disc of the zone radius is both gentle and smooth. With a cap left untouched (vertices within
 * {@value #CAP_DEG}° of the +z pole) the cap is a smooth sphere: slope ≈ 0 (shell theorem: gravity radial, any
 * mechanics text) and RMS normal spread over a disc of radius ρ on a sphere of radius R about ρ/(√2 R) rad
 * (geometry), 4.9° here, below the 10° limit. So exactly one zone must be found, inside the cap.
 */
class LandingZoneTest {
    private static final double RADIUS = 50.0;
    private static final double DENSITY = 2000.0;
    private static final double BUMP_M = 3.5;
    private static final double CAP_DEG = 40.0;
    private static final double ZONE_RADIUS_M = 6.0;

    static TriangleMesh roughSphere(boolean smoothCap, long seed) {
        TriangleMesh s = Shapes.icosphere(3, RADIUS);
        double[] xyz = s.xyz().clone();
        SplittableRandom rnd = new SplittableRandom(seed);
        double capZ = RADIUS * Math.cos(Math.toRadians(CAP_DEG));
        for (int i = 0; i < xyz.length; i += 3) {
            double bump = rnd.nextDouble(-BUMP_M, BUMP_M); // drawn for every vertex: same bumps with or without cap
            if (smoothCap && xyz[i + 2] >= capZ) {
                continue;
            }
            double k = (RADIUS + bump) / RADIUS;
            xyz[i] *= k;
            xyz[i + 1] *= k;
            xyz[i + 2] *= k;
        }
        return new TriangleMesh(xyz, s.tri());
    }

    private static SurveyResult survey(TriangleMesh mesh) {
        SurveyTarget t = SurveyTestBodies.target("rough", mesh, DENSITY, SpinState.NONE);
        return SurveyTestBodies.survey(t, SurveyParameters.defaults().withZoneRadius(ZONE_RADIUS_M)
            .withHoverAltitudes(new double[] {0}));
    }

    @Test
    void findsTheOneSmoothPatch() {
        TriangleMesh mesh = roughSphere(true, 11);
        SurveyResult r = survey(mesh);
        assertEquals(1, r.zones().size(), "exactly the smooth cap");
        LandingZone z = r.zones().get(0);
        assertEquals(1, z.rank());
        assertTrue(z.latDeg() > 90 - CAP_DEG, "zone centroid inside the cap, latitude " + z.latDeg());
        assertTrue(z.bestLatDeg() > 90 - CAP_DEG, "best aim point inside the cap, latitude " + z.bestLatDeg());
        assertEquals(1, r.zoneRank()[z.bestFacet()], "the best aim facet belongs to its zone");
        assertTrue(r.aimFacets()[z.bestFacet()]);
        double capZ = RADIUS * Math.cos(Math.toRadians(CAP_DEG));
        int[] zone = r.zoneRank();
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        int inZone = 0;
        for (int f = 0; f < r.facetCount(); f++) {
            if (zone[f] != 0) {
                inZone++;
                assertEquals(1, zone[f]);
                // footprint facets lie on the untouched cap or its rim: at least one vertex was kept
                boolean touchesCap = false;
                for (int k = 0; k < 3; k++) {
                    touchesCap |= xyz[3 * tri[3 * f + k] + 2] >= capZ;
                }
                assertTrue(touchesCap, "zone facet " + f + " off the cap");
                assertTrue(r.slopeDeg()[f] < r.parameters().maxSlopeDeg());
            }
        }
        assertEquals(z.facetCount(), inZone);
        assertTrue(z.maxSlopeDeg() < r.parameters().maxSlopeDeg());
        assertTrue(z.roughnessDeg() <= r.parameters().maxRoughnessDeg());
        assertTrue(z.score() > 0 && z.score() <= 1);
        // A sphere cap of 40° half-angle: area 2πR²(1 − cos40°) = 3676 m²; the footprint is most of it.
        double cap = 2 * Math.PI * RADIUS * RADIUS * (1 - Math.cos(Math.toRadians(CAP_DEG)));
        assertTrue(z.areaM2() > 0.5 * cap && z.areaM2() < 1.05 * cap, "footprint area " + z.areaM2());
        assertTrue(z.aimAreaM2() < z.areaM2());
        assertTrue(r.notes().isEmpty(), "radius above the facet circumradius: " + r.notes());
    }

    @Test
    void roughEverywhereFindsNone() {
        SurveyResult r = survey(roughSphere(false, 11));
        assertEquals(0, r.zones().size());
        for (int z : r.zoneRank()) {
            assertEquals(0, z);
        }
    }

    @Test
    void bodySteeperThanTheLimitEverywhereFindsNone() {
        // Resting unit-cube box of 12 facets: every centroid sits at (1/3, 2/3) of a face, all equivalent under the
        // cube's symmetries, so every facet has the same non-zero slope s0. Below s0 nothing is safe: no zone.
        // Above it, with a radius smaller than the facets, every facet is its own smooth disc: one zone, 12 facets.
        SurveyTarget t = SurveyTestBodies.target("cube", Shapes.unitCube(), DENSITY, SpinState.NONE);
        SurveyParameters p = SurveyParameters.defaults().withZoneRadius(0.01).withHoverAltitudes(new double[] {0});
        SurveyResult probe = SurveyTestBodies.survey(t, p);
        double s0 = probe.slopeDeg()[0];
        assertTrue(s0 > 1, "slope off the face centre " + s0);
        SurveyResult steep = SurveyTestBodies.survey(t, p.withMaxSlope(0.5 * s0));
        for (double s : steep.slopeDeg()) {
            assertTrue(s > steep.parameters().maxSlopeDeg());
        }
        assertEquals(0, steep.zones().size());
        SurveyResult gentle = SurveyTestBodies.survey(t, p.withMaxSlope(Math.min(89, 2 * s0)));
        assertEquals(1, gentle.zones().size());
        assertEquals(12, gentle.zones().get(0).facetCount());
        // A radius far below the facet size is reported: each disc is a single facet.
        assertEquals(1, gentle.notes().size(), gentle.notes().toString());
    }

    @Test
    void resultsDoNotDependOnTheThreadCount() {
        TriangleMesh mesh = roughSphere(true, 5);
        SurveyTarget t = SurveyTestBodies.target("rough", mesh, DENSITY, new SpinState(3 * 3600,
            new double[] {0.2, 0.1, 1}));
        SurveyParameters p = SurveyParameters.defaults().withZoneRadius(ZONE_RADIUS_M);
        SurveyResult one = SurveyTestBodies.survey(t, p.withThreads(1));
        SurveyResult two = SurveyTestBodies.survey(t, p.withThreads(3));
        assertTrue(java.util.Arrays.equals(one.slopeDeg(), two.slopeDeg()));
        assertTrue(java.util.Arrays.equals(one.dynamicHeight(), two.dynamicHeight()));
        assertTrue(java.util.Arrays.equals(one.roughnessDeg(), two.roughnessDeg()));
        assertTrue(java.util.Arrays.equals(one.zoneRank(), two.zoneRank()));
        assertEquals(one.zones().size(), two.zones().size());
        for (int i = 0; i < one.zones().size(); i++) {
            assertEquals(one.zones().get(i).score(), two.zones().get(i).score(), 0.0);
            assertEquals(one.zones().get(i).bestFacet(), two.zones().get(i).bestFacet());
        }
        assertEquals(one.hovering().size(), two.hovering().size());
        for (int i = 0; i < one.hovering().size(); i++) {
            assertEquals(one.hovering().get(i).hoverAccel(), two.hovering().get(i).hoverAccel(), 0.0);
        }
    }
}
