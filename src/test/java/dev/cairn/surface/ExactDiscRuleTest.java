package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * The landing disc rule is exact: a facet belongs to an aim point's disc when any point of it lies within the zone
 * radius R (point-to-triangle distance), whether or not it is connected to the aim facet inside the ball. Checked by
 * brute force over every (aim facet, facet) pair with the independent distance of {@link BruteGeometry}.
 */
class ExactDiscRuleTest {
    private static final double DENSITY = 3000.0;
    /** Slack on the brute-force distance comparison, m (round-off of two different algorithms; chosen, no source). */
    private static final double DIST_TOL = 1e-9;

    /**
     * An invented ellipsoid-like body of the size of the reported case: 950 × 640 × 520 m (semi-axes 475, 320, 260),
     * 5120 facets, vertices moved radially by seeded smooth undulations (up to about ±4 %) and small noise so that
     * slopes straddle the limit.
     */
    static TriangleMesh lumpyEllipsoid() {
        TriangleMesh e = Shapes.ellipsoid(4, 475, 320, 260);
        double[] xyz = e.xyz().clone();
        SplittableRandom rnd = new SplittableRandom(2027);
        double[][] waves = new double[6][4];
        for (double[] w : waves) {
            w[0] = rnd.nextDouble(-1, 1);
            w[1] = rnd.nextDouble(-1, 1);
            w[2] = rnd.nextDouble(-1, 1);
            w[3] = rnd.nextDouble(0, 2 * Math.PI);
        }
        for (int i = 0; i < xyz.length; i += 3) {
            double x = xyz[i] / 475;
            double y = xyz[i + 1] / 320;
            double z = xyz[i + 2] / 260;
            double k = 1;
            for (double[] w : waves) {
                k += 0.006 * Math.sin(4 * (w[0] * x + w[1] * y + w[2] * z) + w[3]);
            }
            k += rnd.nextDouble(-0.004, 0.004);
            xyz[i] *= k;
            xyz[i + 1] *= k;
            xyz[i + 2] *= k;
        }
        return new TriangleMesh(xyz, e.tri());
    }

    @Test
    void noAimPointHasUnsafeGroundWithinTheRadius() {
        TriangleMesh mesh = lumpyEllipsoid();
        // Spin 2.7 h about a tilted axis; R = 80 m; slope limit 20° (the reported case, on an invented body).
        SpinState spin = new SpinState(2.7 * 3600, new double[] {0.25, -0.15, 1});
        SurveyTarget t = SurveyTestBodies.target("lumpy ellipsoid", mesh, DENSITY, spin);
        double r = 80;
        SurveyResult res = SurveyTestBodies.survey(t, SurveyParameters.defaults().withMaxSlope(20).withZoneRadius(r)
            .withHoverAltitudes(new double[] {0}));
        boolean[] aim = res.aimFacets();
        double[] slope = res.slopeDeg();
        int nf = mesh.facetCount();
        int aims = 0;
        int unsafe = 0;
        int oldRuleMisses = 0;
        double[] discMax = res.discMaxSlopeDeg();
        for (int f = 0; f < nf; f++) {
            unsafe += slope[f] >= 20 ? 1 : 0;
            if (!res.aimFacets()[f] && !(slope[f] < 20)) {
                continue;
            }
            double[] p = BruteGeometry.centroid(mesh, f);
            double worst = 0;
            for (int g = 0; g < nf; g++) {
                double d = BruteGeometry.distanceBelow(mesh, g, p, r + 1);
                if (d <= r - DIST_TOL) {
                    worst = Math.max(worst, slope[g]);
                    if (aim[f]) {
                        assertTrue(slope[g] < 20, "aim facet " + f + " has facet " + g + " of slope " + slope[g]
                            + " deg at " + d + " m");
                    }
                    if (slope[g] >= 20 && BruteGeometry.vertexOrCentroidDistance(mesh, g, p) > r) {
                        oldRuleMisses++;
                    }
                }
            }
            // the disc's largest slope is the brute-force one (a facet exactly at R may go either way: tolerance)
            assertTrue(discMax[f] >= worst, "facet " + f + ": disc max slope " + discMax[f] + " < " + worst);
            aims += aim[f] ? 1 : 0;
        }
        assertTrue(aims > 100, "a meaningful number of aim facets: " + aims);
        assertTrue(unsafe > 100, "a meaningful number of unsafe facets: " + unsafe);
        // The case of the report exists on this body: unsafe facets within R of a safe facet's centroid whose
        // centroid and vertices all lie beyond R (the rule before this one missed them).
        assertTrue(oldRuleMisses > 0, "the body exercises the missed case: " + oldRuleMisses);
        System.out.println("ExactDiscRuleTest: " + aims + " aim facets, " + unsafe + " unsafe facets, "
            + oldRuleMisses + " (safe facet, unsafe facet) pairs the centroid-or-vertex rule missed");
    }

    /**
     * Completeness across a gap: a flat slab with a separate box hovering a few metres above it. The box's underside
     * is an overhang (lift-off: the effective acceleration points away from it), and a large triangle of it comes
     * within R of slab facets below while its edges and all its neighbours lie beyond R. Growth across shared edges
     * from the slab facet would never reach it; the disc must contain it, so those slab facets are not aim facets.
     */
    @Test
    void reachesGroundThatIsNotConnectedInsideTheBall() {
        TriangleMesh slab = TestBoxes.gridBox(-500, -500, -200, 500, 500, 0, 25);
        TriangleMesh box = Shapes.box(-100, -100, 10, 100, 100, 60);
        TriangleMesh mesh = TestBoxes.union(slab, box);
        SurveyTarget t = SurveyTestBodies.target("slab and box", mesh, DENSITY, SpinState.NONE);
        double r = 30;
        SurveyResult res = SurveyTestBodies.survey(t, SurveyParameters.defaults().withZoneRadius(r)
            .withHoverAltitudes(new double[] {0}));
        int nSlab = slab.facetCount();
        int nf = mesh.facetCount();
        double[] slope = res.slopeDeg();
        boolean[] lift = res.liftOff();
        int isolated = 0;
        int safeBelow = 0;
        for (int f = 0; f < nSlab; f++) {
            double[] p = BruteGeometry.centroid(mesh, f);
            if (p[2] < -1 || !(slope[f] < res.parameters().maxSlopeDeg())) {
                continue; // safe facets of the slab top only
            }
            for (int g = nSlab; g < nf; g++) {
                if (BruteGeometry.distanceBelow(mesh, g, p, r + 1) > r) {
                    continue;
                }
                // this box facet is within R of the slab facet's centroid
                assertFalse(res.aimFacets()[f], "slab facet " + f + " has box facet " + g + " within R");
                assertTrue(res.discMaxSlopeDeg()[f] >= slope[g], "facet " + g + " is in the disc of " + f);
                boolean alone = true;
                for (int h = nSlab; h < nf; h++) {
                    if (h != g && sharesEdge(mesh, g, h) && BruteGeometry.distanceBelow(mesh, h, p, r + 1) <= r) {
                        alone = false;
                    }
                }
                safeBelow++;
                if (alone && BruteGeometry.vertexOrCentroidDistance(mesh, g, p) > r) {
                    isolated++;
                    assertTrue(lift[g], "the box underside lifts off (overhang)");
                }
            }
        }
        assertTrue(isolated > 0, "the case exists: a facet within R whose edges and neighbours are all beyond R");
        // and the slab top away from the box is landable
        assertTrue(res.zones().size() >= 1);
        System.out.println("ExactDiscRuleTest: " + isolated + " (safe slab facet, isolated box facet) pairs reached, "
            + safeBelow + " (safe slab facet, box facet within R) pairs");
    }

    private static boolean sharesEdge(TriangleMesh m, int f, int g) {
        int[] tri = m.tri();
        int common = 0;
        for (int a = 0; a < 3; a++) {
            for (int b = 0; b < 3; b++) {
                common += tri[3 * f + a] == tri[3 * g + b] ? 1 : 0;
            }
        }
        return common == 2;
    }
}
