package dev.cairn.motion;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.TestShapes;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.rotation.SpinState;
import dev.cairn.util.ProgressListener;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

/** Bounces with restitution, rest detection, Monte Carlo reproducibility and the dispersion ellipse. */
class DeploymentTest {
    private static Propagator propagator(TriangleMesh m, double density, SpinState spin) {
        double[] c = MassPropertiesCalculator.compute(m, 1.0).centerOfMass();
        return new Propagator(new PolyhedronField(m, density), m, new RotatingFrame(spin, c),
            MotionSettings.defaults(Frame.BODY));
    }

    /**
     * Restitution (common practice, no source; shared references §9): in a uniform field a vertical drop from h
     * rebounds with v_n' = e_n v_n to apex e_n² h, so the k-th apex is e_n^(2k) h and a lander with rest apex h_r
     * comes to rest at the first bounce k with e_n^(2k) h &lt; h_r. Near the middle of a large box face (200 m
     * across, drop 0.2 m) the field is uniform to about h/size = 1e-3, so the apex matches to 1 %.
     */
    @Test
    void verticalDropOnBoxFaceReboundsToEnSquaredH() {
        TriangleMesh box = Shapes.box(-100, -100, -50, 100, 100, 0);
        Propagator p = propagator(box, 2000, SpinState.NONE);
        double h = 0.2;
        double en = 0.6;
        double[] s0 = {0.3, 0.2, h, 0, 0, 0};
        Trajectory drop = p.propagate(s0, 1e5, 1e5);
        assertEquals(Trajectory.Outcome.IMPACT, drop.outcome());
        MotionEvent imp = drop.terminal();
        assertEquals(0.0, imp.state()[2], 1e-9);
        double[] b = imp.state();
        double[] v = Deployment.rebound(new double[] {b[3], b[4], b[5]}, imp.normal(), en, 0.8);
        Trajectory up = p.propagate(new double[] {b[0], b[1], b[2] + 1e-9, v[0], v[1], v[2]}, 2 * drop.endTime(),
            drop.endTime() / 400);
        double apex = 0;
        for (int r = 0; r < up.rowCount(); r++) {
            apex = Math.max(apex, up.rows()[r * Trajectory.COLUMNS + 3]);
        }
        double rel = Math.abs(apex / (en * en * h) - 1);
        TestShapes.achieved("bounce apex vs e_n^2 h, relative", rel);
        assertTrue(rel < 0.01, "apex " + apex + " vs " + en * en * h);
        assertEquals(Trajectory.Outcome.IMPACT, up.outcome(), "it comes down again");

        // Rest after the expected number of bounces: the first k with e_n^(2k) h < h_r (0.36^4 h = 3.36e-3 m,
        // 0.36^5 h = 1.21e-3 m: k = 5 for h_r = 3e-3 m, away from either boundary).
        double hr = 3e-3;
        int expected = 1;
        while (Math.pow(en, 2 * expected) * h >= hr) {
            expected++;
        }
        DeploymentSettings ds = new DeploymentSettings(new double[] {0.3, 0.2, h}, new double[] {0, 0, 0}, 1, 0, 0,
            en, 0.8, 7, 0, hr, 1e6, 100);
        Landing l = Deployment.sample(p, ds, 0);
        assertEquals(Landing.Outcome.REST, l.outcome());
        assertEquals(5, expected);
        assertEquals(expected, l.bounces());
        // Flat face: the slope is the tilt of the box's field 0.36 m off the face centre, of order 0.36/100 rad.
        assertEquals(0.0, l.slopeDeg(), Math.toDegrees(2 * 0.36 / 100), "flat face, nearly uniform field");
        // Time to rest: fall time t0 plus hops 2 e^k t0 (k = 1..expected−1): geometric series (uniform field).
        double t0 = drop.endTime();
        double tRest = t0;
        for (int k = 1; k < expected; k++) {
            tRest += 2 * Math.pow(en, k) * t0;
        }
        assertEquals(tRest, l.time(), 0.01 * tRest);
    }

    /** Results are the same for one and two threads, and for the same seed; another seed gives other results. */
    @Test
    void monteCarloReproducibleForSeedAndThreads() {
        TriangleMesh m = Shapes.icosphere(2, 100);
        SpinState spin = new SpinState(6 * 3600, new double[] {0, 0, 1});
        Propagator p = propagator(m, 2000, spin);
        DeploymentSettings s = new DeploymentSettings(new double[] {0, 0, 130}, new double[] {0.002, 0, -0.01}, 8,
            5, 0.003, 0.5, 0.7, 42, 1e-3, 0.05, 3e5, 200);
        List<Landing> one = Deployment.run(p, s, 1, ProgressListener.NONE);
        List<Landing> two = Deployment.run(p, s, 2, ProgressListener.NONE);
        List<Landing> again = Deployment.run(p, s, 2, ProgressListener.NONE);
        DeploymentSettings other = new DeploymentSettings(s.release(), s.velocity(), 8, 5, 0.003, 0.5, 0.7, 43, 1e-3,
            0.05, 3e5, 200);
        List<Landing> diff = Deployment.run(p, other, 2, ProgressListener.NONE);
        int rest = 0;
        for (int i = 0; i < 8; i++) {
            assertEquals(one.get(i).outcome(), two.get(i).outcome());
            assertArrayEquals(one.get(i).position(), two.get(i).position(), 0.0);
            assertEquals(one.get(i).time(), two.get(i).time(), 0.0);
            assertEquals(one.get(i).bounces(), two.get(i).bounces());
            assertArrayEquals(one.get(i).position(), again.get(i).position(), 0.0);
            assertNotEquals(one.get(i).start()[0], diff.get(i).start()[0]);
            rest += one.get(i).outcome() == Landing.Outcome.REST ? 1 : 0;
        }
        assertTrue(rest > 0, "some samples come to rest");
        DeploymentSummary a = DeploymentSummary.of(one, p.frame());
        DeploymentSummary b = DeploymentSummary.of(two, p.frame());
        String arrays = "meanRest=\\[D@\\w+";
        assertEquals(a.toString().replaceAll(arrays, ""), b.toString().replaceAll(arrays, ""));
        assertArrayEquals(a.meanRest(), b.meanRest(), 0.0);
    }

    /**
     * Dispersion ellipse against the definition (sample covariance, divisor N − 1): four points either side
     * of the mean direction at ±3 m east and ±1 m north: variances 6 and 2/3 m² (by hand below), major axis east
     * (azimuth 90°).
     */
    @Test
    void dispersionEllipseOfKnownScatter() {
        RotatingFrame f = new RotatingFrame(SpinState.NONE, new double[] {0, 0, 0});
        // Mean direction along +x (lat 0, lon 0): east = +y, north = +z.
        double[][] pts = {{100, 3, 0}, {100, -3, 0}, {100, 0, 1}, {100, 0, -1}};
        List<Landing> ls = new ArrayList<>();
        for (int i = 0; i < pts.length; i++) {
            ls.add(new Landing(i, Landing.Outcome.REST, new double[6], pts[i], 0, 0, 0, 10, 1, 0.1, 5, 2, 0, 1, 1));
        }
        DeploymentSummary s = DeploymentSummary.of(ls, f);
        // var(east) = (9 + 9)/3 = 6, var(north) = (1 + 1)/3 = 2/3, covariance 0.
        assertEquals(Math.sqrt(6), s.sigmaMajor(), 1e-12);
        assertEquals(Math.sqrt(2.0 / 3), s.sigmaMinor(), 1e-12);
        assertEquals(90, s.azimuthDeg(), 1e-9);
        assertEquals(0, s.meanLatDeg(), 1e-12);
        assertEquals(4, s.rest());
    }
}
