package dev.cairn.tables;

import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import dev.cairn.gravity.Location;
import dev.cairn.mesh.TriangleMesh;
import java.io.IOException;
import java.nio.file.Path;

/** Closed-form field models for the table tests, and a small OBJ writer. */
final class TestFields {
    private TestFields() {
    }

    /**
     * Point mass {@code gm} at {@code (cx, cy, cz)}: U = GM/r, g = −GM r/r³, ∇∇U = GM (3 r rᵀ − r² 1)/r⁵ (Newton;
     * any mechanics text, e.g. Montenbruck &amp; Gill 2000, Satellite Orbits, §3.1).
     */
    static FieldModel pointMass(double gm, double cx, double cy, double cz) {
        return new FieldModel() {
            @Override
            public FieldEvaluator newEvaluator() {
                return (x, y, z, gradient, out, o) -> {
                    double dx = x - cx;
                    double dy = y - cy;
                    double dz = z - cz;
                    double r2 = dx * dx + dy * dy + dz * dz;
                    double r = Math.sqrt(r2);
                    double r3 = r2 * r;
                    out[o + FieldSample.U] = gm / r;
                    out[o + FieldSample.AX] = -gm * dx / r3;
                    out[o + FieldSample.AY] = -gm * dy / r3;
                    out[o + FieldSample.AZ] = -gm * dz / r3;
                    out[o + FieldSample.LAPLACIAN] = 0;
                    double k = gm / (r3 * r2);
                    out[o + FieldSample.GXX] = gradient ? k * (3 * dx * dx - r2) : Double.NaN;
                    out[o + FieldSample.GXY] = gradient ? k * 3 * dx * dy : Double.NaN;
                    out[o + FieldSample.GXZ] = gradient ? k * 3 * dx * dz : Double.NaN;
                    out[o + FieldSample.GYY] = gradient ? k * (3 * dy * dy - r2) : Double.NaN;
                    out[o + FieldSample.GYZ] = gradient ? k * 3 * dy * dz : Double.NaN;
                    out[o + FieldSample.GZZ] = gradient ? k * (3 * dz * dz - r2) : Double.NaN;
                    out[o + FieldSample.LOCATION] = Location.OUTSIDE.code();
                };
            }

            @Override
            public double gm() {
                return gm;
            }

            @Override
            public String describe() {
                return "point mass";
            }
        };
    }

    /**
     * Interior field of a homogeneous triaxial ellipsoid (semi-axes a, b, c on x, y, z; Gρ = {@code grho}),
     * Chandrasekhar, S. (1969) Ellipsoidal Figures of Equilibrium, ch. 3: U = πGρabc [I(0) − A_x x² − A_y y² −
     * A_z z²], g = −2πGρabc (A_x x, A_y y, A_z z), with abc·A_x = (2/3)·abc·R_D(b², c², a²) and
     * I(0) = 2 R_F(a², b², c²) (Carlson, B.C. (1995) Numer. Algorithms 10:13–26). A uniform-gradient field: U is
     * quadratic. Used everywhere as that quadratic (the test points stay inside).
     */
    static final class EllipsoidInterior implements FieldModel {
        final double k0;
        final double kx;
        final double ky;
        final double kz;

        EllipsoidInterior(double a, double b, double c, double grho) {
            double f = Math.PI * grho * a * b * c;
            k0 = f * 2 * rf(a * a, b * b, c * c);
            kx = f * (2.0 / 3.0) * rd(b * b, c * c, a * a);
            ky = f * (2.0 / 3.0) * rd(c * c, a * a, b * b);
            kz = f * (2.0 / 3.0) * rd(a * a, b * b, c * c);
        }

        @Override
        public FieldEvaluator newEvaluator() {
            return (x, y, z, gradient, out, o) -> {
                out[o + FieldSample.U] = k0 - kx * x * x - ky * y * y - kz * z * z;
                out[o + FieldSample.AX] = -2 * kx * x;
                out[o + FieldSample.AY] = -2 * ky * y;
                out[o + FieldSample.AZ] = -2 * kz * z;
                out[o + FieldSample.LAPLACIAN] = -2 * (kx + ky + kz);
                out[o + FieldSample.GXX] = gradient ? -2 * kx : Double.NaN;
                out[o + FieldSample.GXY] = gradient ? 0 : Double.NaN;
                out[o + FieldSample.GXZ] = gradient ? 0 : Double.NaN;
                out[o + FieldSample.GYY] = gradient ? -2 * ky : Double.NaN;
                out[o + FieldSample.GYZ] = gradient ? 0 : Double.NaN;
                out[o + FieldSample.GZZ] = gradient ? -2 * kz : Double.NaN;
                out[o + FieldSample.LOCATION] = Location.INSIDE.code();
            };
        }

        @Override
        public double gm() {
            return Double.NaN;
        }

        @Override
        public String describe() {
            return "homogeneous ellipsoid interior";
        }
    }

    /** Carlson's R_F by duplication (Carlson 1995, algorithm 1), relative accuracy ~1e-15. */
    static double rf(double x, double y, double z) {
        for (int i = 0; i < 60; i++) {
            double sx = Math.sqrt(x);
            double sy = Math.sqrt(y);
            double sz = Math.sqrt(z);
            double l = sx * sy + sx * sz + sy * sz;
            x = 0.25 * (x + l);
            y = 0.25 * (y + l);
            z = 0.25 * (z + l);
        }
        return 1 / Math.sqrt((x + y + z) / 3);
    }

    /** Carlson's R_D by duplication (Carlson 1995, algorithm 4). */
    static double rd(double x, double y, double z) {
        double sum = 0;
        double fac = 1;
        for (int i = 0; i < 60; i++) {
            double sx = Math.sqrt(x);
            double sy = Math.sqrt(y);
            double sz = Math.sqrt(z);
            double l = sx * sy + sx * sz + sy * sz;
            sum += fac / (sz * (z + l));
            fac *= 0.25;
            x = 0.25 * (x + l);
            y = 0.25 * (y + l);
            z = 0.25 * (z + l);
        }
        double m = (x + y + 3 * z) / 5;
        return 3 * sum + fac / (m * Math.sqrt(m));
    }

    /** Writes a mesh as OBJ (coordinates in metres). */
    static Path writeObj(TriangleMesh mesh, Path file) throws IOException {
        return dev.cairn.TestShapes.writeObj(mesh, file);
    }
}
