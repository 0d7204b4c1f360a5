package dev.cairn.surface;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.SpinState;
import org.junit.jupiter.api.Test;

/**
 * Surveys of refined icospheres against the homogeneous sphere.
 *
 * <p>Source of the analytic values: Newton's shell theorem (a homogeneous sphere attracts like a point mass GM at its
 * centre, g = GM/R² at the surface, U = GM/R) plus the centrifugal term of the rotating frame (V = U + ½ω²r⊥²;
 * shared references §6, framework of Scheeres 2012, from memory). At latitude φ on the sphere the effective
 * acceleration has inward radial part GM/R² − ω²R cos²φ and tangential part ω²R cosφ sinφ, so
 * slope(φ) = atan(ω²R cosφ sinφ / (GM/R² − ω²R cos²φ)), and loose material lifts off where ω²R cos²φ &gt; GM/R².
 * Inertial escape speed of the non-rotating sphere: √(2GM/R) (energy conservation, any mechanics text).
 *
 * <p>The icosphere is a polyhedron inscribed in the sphere: its facet normals and centroid gravity deviate from the
 * sphere's by an amount first-order in the facet size. The tolerances below are that discretisation error,
 * measured once (level 3: 0.60° in slope on the rotating sphere, 0.58° on the resting one) with a margin, and the
 * refinement test checks that the error falls as the mesh is refined.
 */
class RotatingSphereSurveyTest {
    private static final double RADIUS = 1000.0;
    private static final double DENSITY = 2000.0;
    /** Slope discretisation error allowed on a level-3 icosphere (1280 facets), degrees. */
    private static final double SLOPE_TOL_L3_DEG = 0.75;
    /** Error at level 3 must be at most this fraction of the error at level 2 (first order: about 1/2). */
    private static final double REFINEMENT_RATIO = 0.7;
    /** Relative error allowed on the escape speed, level 3 (volume and radius of the inscribed polyhedron). */
    private static final double ESCAPE_REL_TOL_L3 = 2e-3;
    /** Dynamic height allowed on the resting level-3 sphere, as a fraction of the radius. */
    private static final double HEIGHT_REL_TOL_L3 = 1e-3;
    /** Band in cos²φ around the analytic lift-off boundary where facets may go either way (facet size). */
    private static final double LIFT_OFF_BAND = 0.05;

    private static double[] maxSlopeError(int level, double q) {
        TriangleMesh mesh = Shapes.icosphere(level, RADIUS);
        SurveyTarget rest = SurveyTestBodies.target("sphere", mesh, DENSITY, SpinState.NONE);
        double gm = rest.field().gm();
        double r = rest.equivalentRadius();
        SurveyTarget t = SurveyTestBodies.target("sphere", mesh, DENSITY, SurveyTestBodies.spinForRatio(q, gm, r));
        SurveyResult res = SurveyTestBodies.survey(t, params());
        double w2 = t.spin().omega() * t.spin().omega();
        double[] slope = res.slopeDeg();
        double[] lat = res.latitudeDeg();
        double err = 0;
        double err45 = 0;
        for (int f = 0; f < res.facetCount(); f++) {
            double expected = Math.abs(analyticSlopeDeg(gm, r, w2, Math.toRadians(lat[f])));
            err = Math.max(err, Math.abs(slope[f] - expected));
            if (Math.abs(Math.abs(lat[f]) - 45) < 3) {
                err45 = Math.max(err45, Math.abs(slope[f] - expected));
            }
        }
        return new double[] {err, err45};
    }

    private static SurveyParameters params() {
        return SurveyParameters.defaults().withHoverAltitudes(new double[] {0});
    }

    /** Shell theorem + centrifugal term (see class comment), degrees; negative in the southern hemisphere. */
    static double analyticSlopeDeg(double gm, double r, double w2, double phi) {
        double c = Math.cos(phi);
        double s = Math.sin(phi);
        return Math.toDegrees(Math.atan2(w2 * r * c * s, gm / (r * r) - w2 * r * c * c));
    }

    @Test
    void analyticFormulaMatchesCheckValue() {
        // [V] shared references §6: ω²R³/GM = 0.5 at 45° gives atan(1/3) = 18.434949°.
        assertEquals(18.434949, analyticSlopeDeg(1, 1, 0.5, Math.PI / 4), 1e-6);
    }

    @Test
    void rotatingSphereSlopeMatchesAnalyticAndConverges() {
        double q = 0.5; // ω²R³/GM, the [V] check case
        double[] e2 = maxSlopeError(2, q);
        double[] e3 = maxSlopeError(3, q);
        assertTrue(e3[0] < SLOPE_TOL_L3_DEG, "level-3 slope error " + e3[0]);
        assertTrue(e3[1] < SLOPE_TOL_L3_DEG, "level-3 slope error near 45° (18.434949° expected) " + e3[1]);
        assertTrue(e3[0] < REFINEMENT_RATIO * e2[0], "error must fall with refinement: " + e2[0] + " -> " + e3[0]);
    }

    @Test
    void restingSphereIsLevelFlatAndHasPointMassEscapeSpeed() {
        TriangleMesh mesh = Shapes.icosphere(3, RADIUS);
        SurveyTarget t = SurveyTestBodies.target("sphere", mesh, DENSITY, SpinState.NONE);
        SurveyResult res = SurveyTestBodies.survey(t, params());
        double gm = t.field().gm();
        double r = t.equivalentRadius();
        double vEsc = Math.sqrt(2 * gm / r);
        for (int f = 0; f < res.facetCount(); f++) {
            assertTrue(res.slopeDeg()[f] < SLOPE_TOL_L3_DEG, "slope " + res.slopeDeg()[f]);
            assertEquals(0.0, res.dynamicHeight()[f], HEIGHT_REL_TOL_L3 * RADIUS, "dynamic height");
            assertEquals(vEsc, res.escapeSpeed()[f], ESCAPE_REL_TOL_L3 * vEsc, "escape speed");
            assertEquals(vEsc, res.escapeSpeedMin()[f], ESCAPE_REL_TOL_L3 * vEsc, "least escape speed, no spin");
            assertEquals(0, res.liftOff()[f] ? 1 : 0);
        }
    }

    @Test
    void spinningSphereEscapeSpeedsFollowTheEnergyBalance() {
        // Inertial energy balance ½|v n + ω×r|² = U with U = GM/R on the sphere (shell theorem) and the frame
        // velocity ω×r = ω(−y, x, 0) at the facet centroid: v = −b + √(b² + 2GM/R − ω²ρ²), b = n·(ω×r), ρ the
        // distance from the axis, n the facet's launch direction (its outward normal, within ~1° of radial here).
        // Least speed over directions (launch along ω×r): √(2GM/R) − ωρ. Only U carries discretisation error.
        TriangleMesh mesh = Shapes.icosphere(3, RADIUS);
        SurveyTarget rest = SurveyTestBodies.target("sphere", mesh, DENSITY, SpinState.NONE);
        double gm = rest.field().gm();
        double r = rest.equivalentRadius();
        SurveyTarget t = SurveyTestBodies.target("sphere", mesh, DENSITY, SurveyTestBodies.spinForRatio(0.5, gm, r));
        SurveyResult res = SurveyTestBodies.survey(t, params());
        double w = t.spin().omega();
        double[] xyz = res.centroids();
        double[] n = res.normals();
        for (int f = 0; f < res.facetCount(); f++) {
            double x = xyz[3 * f];
            double y = xyz[3 * f + 1];
            double rho = Math.hypot(x, y);
            double b = w * (-y * n[3 * f] + x * n[3 * f + 1]);
            double normal = -b + Math.sqrt(b * b + 2 * gm / r - w * w * rho * rho);
            double prograde = Math.sqrt(2 * gm / r) - w * rho;
            assertEquals(normal, res.escapeSpeed()[f], ESCAPE_REL_TOL_L3 * normal, "normal launch, facet " + f);
            assertEquals(prograde, res.escapeSpeedMin()[f], ESCAPE_REL_TOL_L3 * normal, "prograde, facet " + f);
        }
    }

    @Test
    void liftOffFlaggedWhereTheAnalyticSphereSaysSo() {
        double q = 1.5; // equator sheds: lift-off where cos²φ > 1/q
        TriangleMesh mesh = Shapes.icosphere(3, RADIUS);
        SurveyTarget rest = SurveyTestBodies.target("sphere", mesh, DENSITY, SpinState.NONE);
        SurveyTarget t = SurveyTestBodies.target("sphere", mesh, DENSITY,
            SurveyTestBodies.spinForRatio(q, rest.field().gm(), rest.equivalentRadius()));
        SurveyResult res = SurveyTestBodies.survey(t, params());
        int checked = 0;
        int lifted = 0;
        for (int f = 0; f < res.facetCount(); f++) {
            double c = Math.cos(Math.toRadians(res.latitudeDeg()[f]));
            double margin = c * c - 1 / q;
            if (Math.abs(margin) < LIFT_OFF_BAND) {
                continue;
            }
            checked++;
            boolean expected = margin > 0;
            assertEquals(expected, res.liftOff()[f], "facet " + f + " at latitude " + res.latitudeDeg()[f]);
            assertEquals(expected, res.slopeDeg()[f] > 90, "slope > 90° exactly where lift-off");
            assertEquals(expected, res.gravityEffNormal()[f] < 0, "inward effective normal component sign");
            lifted += expected ? 1 : 0;
        }
        assertTrue(checked > 0.8 * res.facetCount(), "most facets are away from the boundary: " + checked);
        assertTrue(lifted > 0 && lifted < checked, "both sides of the boundary are tested");
    }
}
