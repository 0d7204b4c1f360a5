package dev.cairn.motion;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.rotation.SpinState;
import org.junit.jupiter.api.Test;

/**
 * The propagator against outside sources: Kepler's third law, conservation of energy and of the Jacobi integral,
 * the closed form of radial free fall (shared references §6, §9), and the impact test on thin features.
 */
class PropagatorTest {
    private static final double[] ORIGIN = {0, 0, 0};

    /** Density that gives the polyhedron GM = gm. */
    private static double densityFor(TriangleMesh m, double gm) {
        return gm / (Constants.G * MassPropertiesCalculator.compute(m, 1.0).volume());
    }

    private static Propagator propagator(TriangleMesh m, double gm, SpinState spin, Frame frame) {
        PolyhedronField f = new PolyhedronField(m, densityFor(m, gm));
        double[] c = MassPropertiesCalculator.compute(m, 1.0).centerOfMass();
        return new Propagator(f, m, new RotatingFrame(spin, c), MotionSettings.defaults(frame));
    }

    private static double dist(double[] a, double[] b) {
        return Math.sqrt((a[0] - b[0]) * (a[0] - b[0]) + (a[1] - b[1]) * (a[1] - b[1]) + (a[2] - b[2]) * (a[2] - b[2]));
    }

    /**
     * Kepler's third law (Newton's form, any mechanics text; shared references §9): a circular orbit of radius r and
     * an elliptical orbit of semi-major axis a = r about a refined icosphere both return to their start after
     * T = 2π√(a³/GM). The icosphere's field differs from GM/r² by its degree-6 and higher harmonics (icosahedral
     * symmetry), measured below as δ along the orbit; over one revolution the position error is bounded by a few δ·a
     * plus the integration error (1e-12 local tolerance).
     */
    @Test
    void keplerPeriodDependsOnlyOnSemiMajorAxis() {
        TriangleMesh m = Shapes.icosphere(4, 1.0);
        double gm = 1.0;
        Propagator p = propagator(m, gm, SpinState.NONE, Frame.INERTIAL);
        double a = 2.5;
        double period = 2 * Math.PI * Math.sqrt(a * a * a / gm);
        // Inclined plane (not a symmetry plane of the icosphere).
        double[] u = unit(new double[] {1, 0.3, 0.2});
        double[] w = unit(cross(new double[] {0.1, -0.4, 1}, u));
        double[] v = cross(w, u);
        double delta = fieldDeviation(p.field(), u, v, a * 0.7, a * 1.3);
        for (double e : new double[] {0.0, 0.3}) {
            double rp = a * (1 - e);
            double vp = Math.sqrt(gm * (2 / rp - 1 / a)); // vis-viva (shared references §9)
            double[] s0 = {rp * u[0], rp * u[1], rp * u[2], vp * v[0], vp * v[1], vp * v[2]};
            Trajectory t = p.propagate(s0, period, period / 4);
            assertEquals(Trajectory.Outcome.DURATION, t.outcome());
            int last = (t.rowCount() - 1) * Trajectory.COLUMNS;
            double[] end = java.util.Arrays.copyOfRange(t.rows(), last + 8, last + 11);
            double err = dist(end, s0) / a;
            TestShapes.achieved("Kepler period, e = " + e + ", return error / a", err);
            TestShapes.achieved("Kepler period, field deviation from GM/r^2", delta);
            assertTrue(err < 20 * delta + 1e-9, "return error " + err + " vs field deviation " + delta);
        }
        // The same law must fail for a wrong period: 1 % longer leaves the circle by about 2π·1 %.
        double[] s0 = {a * u[0], a * u[1], a * u[2], Math.sqrt(gm / a) * v[0], Math.sqrt(gm / a) * v[1],
            Math.sqrt(gm / a) * v[2]};
        Trajectory t = p.propagate(s0, 1.01 * period, period);
        double[] end = t.finalState();
        assertTrue(dist(end, s0) / a > 0.05);
    }

    /** Largest relative deviation of |g| from GM/r² over a shell band along the orbit's plane. */
    private static double fieldDeviation(FieldModel f, double[] u, double[] v, double r0, double r1) {
        var ev = f.newEvaluator();
        double[] s = new double[FieldSample.SIZE];
        double worst = 0;
        for (int i = 0; i <= 20; i++) {
            double r = r0 + (r1 - r0) * i / 20;
            for (int k = 0; k < 72; k++) {
                double ph = 2 * Math.PI * k / 72;
                double x = r * (Math.cos(ph) * u[0] + Math.sin(ph) * v[0]);
                double y = r * (Math.cos(ph) * u[1] + Math.sin(ph) * v[1]);
                double z = r * (Math.cos(ph) * u[2] + Math.sin(ph) * v[2]);
                ev.evaluate(x, y, z, false, s, 0);
                double ref = f.gm() / (r * r);
                double gx = s[1] + ref * x / r;
                double gy = s[2] + ref * y / r;
                double gz = s[3] + ref * z / r;
                worst = Math.max(worst, Math.sqrt(gx * gx + gy * gy + gz * gz) / ref);
            }
        }
        return worst;
    }

    /**
     * Energy ½v² − U (non-rotating body, inertial = body frame) and the Jacobi integral ½|v_rel|² − U − ½ω²|r⊥|²
     * (rotating body) are constants of the motion (Scheeres 2012, from memory; shared references §6, §9): conserved
     * to 1e-10 relative over 100 orbits at the default tolerance, about a small (80-facet) body.
     */
    @Test
    void energyAndJacobiConservedOver100Orbits() {
        TriangleMesh m = Shapes.icosphere(1, 1.0);
        double r = 3.0;
        double period = 2 * Math.PI * Math.sqrt(r * r * r);
        double vc = Math.sqrt(1.0 / r);
        double[] s0 = {r, 0.1, 0.2, 0, vc * 0.98, vc * 0.2};
        Trajectory e = propagator(m, 1.0, SpinState.NONE, Frame.BODY).propagate(s0, 100 * period, period);
        assertEquals(Trajectory.Outcome.DURATION, e.outcome());
        TestShapes.achieved("energy drift over 100 orbits, relative", e.maxJacobiDriftRelative());
        assertTrue(e.maxJacobiDriftRelative() <= 1e-10, "energy drift " + e.maxJacobiDriftRelative());
        // Rotating body (spin period 2.5 orbital periods, tilted pole): body-frame equations.
        SpinState spin = new SpinState(2.5 * period, new double[] {0.2, 0.1, 1});
        Trajectory j = propagator(m, 1.0, spin, Frame.BODY).propagate(s0, 100 * period, period);
        assertEquals(Trajectory.Outcome.DURATION, j.outcome());
        TestShapes.achieved("Jacobi drift over 100 orbits (body frame), relative", j.maxJacobiDriftRelative());
        assertTrue(j.maxJacobiDriftRelative() <= 1e-10, "Jacobi drift " + j.maxJacobiDriftRelative());
        // The same motion integrated in the inertial frame: Jacobi (evaluated in the body frame) conserved too, and
        // the two frames agree on the body-frame path.
        Trajectory ji = propagator(m, 1.0, spin, Frame.INERTIAL).propagate(inertialOf(s0, spin), 100 * period, period);
        TestShapes.achieved("Jacobi drift over 100 orbits (inertial frame), relative", ji.maxJacobiDriftRelative());
        assertTrue(ji.maxJacobiDriftRelative() <= 1e-10, "Jacobi drift " + ji.maxJacobiDriftRelative());
        double[] a = j.finalState();
        double[] b = ji.finalState();
        assertTrue(dist(a, b) < 1e-6 * r, "frames disagree by " + dist(a, b));
    }

    /** Inertial state at t = 0 of a body-frame state (v_i = v_rel + ω × r; centre of mass at the origin here). */
    private static double[] inertialOf(double[] s, SpinState spin) {
        double w = spin.omega();
        double[] k = spin.axis();
        double[] c = cross(k, new double[] {s[0], s[1], s[2]});
        return new double[] {s[0], s[1], s[2], s[3] + w * c[0], s[4] + w * c[1], s[5] + w * c[2]};
    }

    /**
     * Radial free fall from rest at r0 onto a sphere of radius R (energy conservation integrated; shared references
     * §9): t = √(r0³/(2GM)) (√(x(1−x)) + arccos √x), x = R/r0, impact speed √(2GM(1/R − 1/r0)). Check value GM = 1,
     * R = 1, r0 = 2: t = 1 + π/2, speed 1. On a refined icosphere R is the radius where the fall line meets the
     * facets, and gravity differs from GM/r² along the line by at most δ (measured): the fall time and speed then
     * differ from the closed form by at most about δ (a gravity scaled by 1 + δ scales both by (1 + δ)^(∓½)).
     */
    @Test
    void radialFreeFallMatchesClosedForm() {
        assertEquals(1 + Math.PI / 2, fallTime(1, 1, 2), 1e-15);
        assertEquals(1.0, Math.sqrt(2 * (1 / 1.0 - 1 / 2.0)), 1e-15);
        TriangleMesh m = Shapes.icosphere(4, 1.0);
        Propagator p = propagator(m, 1.0, SpinState.NONE, Frame.BODY);
        double[] dir = unit(new double[] {0.3, -0.5, 0.8});
        double hitR = Double.NaN;
        for (int f = 0; f < m.facetCount(); f++) {
            double t = FacetGeometry.rayHit(m.xyz(), m.tri(), f, 0, 0, 0, dir[0], dir[1], dir[2], 0);
            if (t > 0) {
                hitR = t;
            }
        }
        double r0 = 2.0;
        double delta = 0;
        var ev = p.field().newEvaluator();
        double[] s = new double[FieldSample.SIZE];
        for (int i = 0; i <= 200; i++) {
            double r = hitR + (r0 - hitR) * i / 200.0;
            ev.evaluate(r * dir[0], r * dir[1], r * dir[2], false, s, 0);
            double g = Math.sqrt(s[1] * s[1] + s[2] * s[2] + s[3] * s[3]);
            delta = Math.max(delta, Math.abs(g * r * r / p.field().gm() - 1));
        }
        Trajectory t = p.propagate(new double[] {r0 * dir[0], r0 * dir[1], r0 * dir[2], 0, 0, 0}, 10, 0.5);
        assertEquals(Trajectory.Outcome.IMPACT, t.outcome());
        MotionEvent imp = t.terminal();
        double gm = p.field().gm();
        double tRef = fallTime(gm, hitR, r0);
        double vRef = Math.sqrt(2 * gm * (1 / hitR - 1 / r0));
        double et = Math.abs(imp.t() / tRef - 1);
        double ev2 = Math.abs(imp.speed() / vRef - 1);
        TestShapes.achieved("free fall time, relative error", et);
        TestShapes.achieved("free fall speed, relative error", ev2);
        TestShapes.achieved("free fall, field deviation from GM/r^2", delta);
        assertTrue(et <= delta + 1e-9, "fall time error " + et + " vs " + delta);
        assertTrue(ev2 <= delta + 1e-9, "speed error " + ev2 + " vs " + delta);
        assertEquals(0, imp.incidenceDeg(), 3.0, "radial fall meets the facet nearly head-on"); // facet tilt < 3°
        // The impact point lies on the fall line, up to the sideways drift the non-radial part of the field causes.
        assertEquals(hitR, Math.sqrt(imp.state()[0] * imp.state()[0] + imp.state()[1] * imp.state()[1]
            + imp.state()[2] * imp.state()[2]), delta * (r0 - hitR));
    }

    private static double fallTime(double gm, double rr, double r0) {
        double x = rr / r0;
        return Math.sqrt(r0 * r0 * r0 / (2 * gm)) * (Math.sqrt(x * (1 - x)) + Math.acos(Math.sqrt(x)));
    }

    /**
     * Impact detection never misses a thin feature (common practice, no source): a nearly straight path (weak field)
     * that clips an edge of a box by 1e-5 of its size is an impact, one that passes 1e-5 outside is not; a fast path
     * through a 1 cm plate, with integrator steps far longer than the plate's facets, hits it at the time the straight
     * line does.
     */
    @Test
    void impactNeverMissesThinFeatures() {
        TriangleMesh box = Shapes.box(-1, -1, -1, 1, 1, 1);
        double gm = 1e-12;
        Propagator p = propagator(box, gm, SpinState.NONE, Frame.BODY);
        for (double off : new double[] {-1e-5, 1e-5}) {
            // Line x + y = 2 − off·√2 in the plane z = 0.3, grazing the vertical edge at (1, 1).
            double c = 2 + off * Math.sqrt(2);
            double[] s0 = {c / 2 + 3, c / 2 - 3, 0.3, -1, 1, 0};
            Trajectory t = p.propagate(s0, 6, 6);
            if (off < 0) {
                assertEquals(Trajectory.Outcome.IMPACT, t.outcome(), "clipping the edge by 1e-5");
                assertEquals(3 - 1e-5 / Math.sqrt(2), t.terminal().t(), 1e-4);
            } else {
                assertEquals(Trajectory.Outcome.DURATION, t.outcome(), "passing 1e-5 outside the edge");
            }
        }
        TriangleMesh plate = Shapes.box(-5, -5, -0.005, 5, 5, 0.005);
        Propagator q = propagator(plate, 1e-12, SpinState.NONE, Frame.BODY);
        q = q.with(q.settings().withEscapeRadius(1e4)); // start beyond the default escape radius (10 body radii)
        double[] s0 = {0.3, 0.2, 500, 0.01, 0.02, -100};
        Trajectory t = q.propagate(s0, 10, 10);
        assertEquals(Trajectory.Outcome.IMPACT, t.outcome());
        // At most 5 steps over 500 m: the mean step is 100 m or more, far longer than the plate's 14 m facets.
        assertTrue(t.steps() <= 5, "steps " + t.steps());
        assertEquals((500 - 0.005) / 100, t.terminal().t(), 1e-9);
        assertEquals(0.3 + 0.01 * t.terminal().t(), t.terminal().state()[0], 1e-9);
        assertEquals(0.005, t.terminal().state()[2], 1e-9);
        assertNotNull(t.terminal().normal());
        assertEquals(1.0, t.terminal().normal()[2], 1e-12);
    }

    private static double[] unit(double[] v) {
        double n = Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
        return new double[] {v[0] / n, v[1] / n, v[2] / n};
    }

    private static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }
}
