package dev.cairn.rotation;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The rotating-frame formulas against closed forms and their own definitions. */
class RotatingFrameTest {
    /** Absolute tolerance on angles computed from exact inputs, degrees (double-precision round-off only). */
    private static final double ANGLE_TOL_DEG = 1e-9;
    /** Relative tolerance of a central finite difference with step h = 1e-3 m on a quadratic (exact up to round-off). */
    private static final double FD_REL_TOL = 1e-6;
    private static final double TIGHT = 1e-12;

    @Test
    void slopeOnRotatingSphereMatchesCheckValue() {
        // [V] shared references §6: homogeneous sphere (shell theorem: g = -GM r/|r|^3 outside and on the surface),
        // spin about z with ω²R³/GM = 0.5, latitude 45°: slope = atan(1/3) = 18.434949°.
        double gm = 3.0e5;
        double r = 1200.0;
        double omega = Math.sqrt(0.5 * gm / (r * r * r));
        double[] com = {10, -20, 5};
        RotatingFrame frame = new RotatingFrame(new SpinState(2 * Math.PI / omega, new double[] {0, 0, 2}), com);
        double phi = Math.PI / 4;
        double lon = 0.7;
        double[] n = {Math.cos(phi) * Math.cos(lon), Math.cos(phi) * Math.sin(lon), Math.sin(phi)};
        double x = com[0] + r * n[0];
        double y = com[1] + r * n[1];
        double z = com[2] + r * n[2];
        double g0 = gm / (r * r);
        double[] g = {-g0 * n[0], -g0 * n[1], -g0 * n[2]};
        double[] out = new double[4];
        frame.effective(x, y, z, gm / r, g, 0, out, 0);
        double dot = -(n[0] * out[1] + n[1] * out[2] + n[2] * out[3]);
        double a = Math.sqrt(out[1] * out[1] + out[2] * out[2] + out[3] * out[3]);
        assertEquals(18.434949, Math.toDegrees(Math.acos(dot / a)), 1e-6);
        // V = GM/R + ½ω²R²cos²φ (definition)
        assertEquals(gm / r + 0.5 * omega * omega * r * r * 0.5, out[0], TIGHT * out[0]);
        assertEquals(45.0, frame.latitudeDeg(x, y, z), ANGLE_TOL_DEG);
        assertEquals(Math.toDegrees(lon), frame.longitudeDeg(x, y, z), ANGLE_TOL_DEG);
    }

    @Test
    void centrifugalAccelerationIsTheGradientOfItsPotential() {
        SplittableRandom rnd = new SplittableRandom(3);
        RotatingFrame frame = new RotatingFrame(new SpinState(3600 * 3.7, new double[] {0.3, -0.5, 0.8}),
            new double[] {120, -40, 33});
        double h = 1e-3;
        double[] a = new double[3];
        for (int k = 0; k < 20; k++) {
            double x = rnd.nextDouble(-2000, 2000);
            double y = rnd.nextDouble(-2000, 2000);
            double z = rnd.nextDouble(-2000, 2000);
            frame.centrifugalAcceleration(x, y, z, a, 0);
            double dx = (frame.centrifugalPotential(x + h, y, z) - frame.centrifugalPotential(x - h, y, z)) / (2 * h);
            double dy = (frame.centrifugalPotential(x, y + h, z) - frame.centrifugalPotential(x, y - h, z)) / (2 * h);
            double dz = (frame.centrifugalPotential(x, y, z + h) - frame.centrifugalPotential(x, y, z - h)) / (2 * h);
            double scale = Math.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
            assertEquals(dx, a[0], FD_REL_TOL * scale);
            assertEquals(dy, a[1], FD_REL_TOL * scale);
            assertEquals(dz, a[2], FD_REL_TOL * scale);
            // |ω × r|: frame speed equals ω times the distance from the axis (definition of the cross product)
            double[] v = new double[3];
            frame.frameVelocity(x, y, z, v, 0);
            assertEquals(frame.frameSpeed(x, y, z), Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]),
                TIGHT * (1 + frame.frameSpeed(x, y, z)));
        }
    }

    @Test
    void latitudeLongitudeRoundTripAboutATiltedPole() {
        RotatingFrame frame = new RotatingFrame(new SpinState(5000, new double[] {1, 1, 0.2}), new double[] {1, 2, 3});
        double[] d = new double[3];
        for (double lat = -85; lat <= 85; lat += 17) {
            for (double lon = -175; lon <= 180; lon += 25) {
                frame.direction(lat, lon, d, 0);
                double x = 1 + 50 * d[0];
                double y = 2 + 50 * d[1];
                double z = 3 + 50 * d[2];
                assertEquals(lat, frame.latitudeDeg(x, y, z), ANGLE_TOL_DEG);
                assertEquals(lon, frame.longitudeDeg(x, y, z), ANGLE_TOL_DEG);
            }
        }
        double[] ax = frame.axis();
        assertEquals(90.0, frame.latitudeDeg(1 + ax[0], 2 + ax[1], 3 + ax[2]), ANGLE_TOL_DEG);
    }

    @Test
    void defaultPoleUsesModelAnglesAndNoSpinHasNoCentrifugalTerm() {
        RotatingFrame frame = new RotatingFrame(SpinState.NONE, new double[] {0, 0, 0});
        assertEquals(0.0, frame.longitudeDeg(5, 0, 1), ANGLE_TOL_DEG);
        assertEquals(90.0, frame.longitudeDeg(0, 5, 1), ANGLE_TOL_DEG);
        assertEquals(45.0, frame.latitudeDeg(0, 5, 5), ANGLE_TOL_DEG);
        assertEquals(0.0, frame.centrifugalPotential(100, 200, 300), 0.0);
    }
}
