package dev.cairn.mesh;

import java.util.Arrays;
import java.util.HashMap;
import java.util.Map;

/**
 * Canonical closed, outward-oriented shapes generated in code (for tests, examples and benchmarks): boxes,
 * icospheres and ellipsoids. Units are whatever the caller's numbers are (normally metres).
 */
public final class Shapes {
    private Shapes() {
    }

    /** The box {@code [x0,x1]×[y0,y1]×[z0,z1]} as 12 triangles. */
    public static TriangleMesh box(double x0, double y0, double z0, double x1, double y1, double z1) {
        double[] xyz = {
            x0, y0, z0, x1, y0, z0, x1, y1, z0, x0, y1, z0,
            x0, y0, z1, x1, y0, z1, x1, y1, z1, x0, y1, z1};
        int[] tri = {
            0, 2, 1, 0, 3, 2, // z = z0, normal -z
            4, 5, 6, 4, 6, 7, // z = z1, normal +z
            0, 1, 5, 0, 5, 4, // y = y0, normal -y
            3, 7, 6, 3, 6, 2, // y = y1, normal +y
            0, 4, 7, 0, 7, 3, // x = x0, normal -x
            1, 2, 6, 1, 6, 5}; // x = x1, normal +x
        return new TriangleMesh(xyz, tri);
    }

    /** The cube {@code [0,1]^3}. */
    public static TriangleMesh unitCube() {
        return box(0, 0, 0, 1, 1, 1);
    }

    /**
     * An invented lumpy body for benchmarks: an icosphere of {@code level} (20·4^level facets) and radius
     * {@code radius} on the axes 1 : 0.8 : 0.6, each vertex moved radially by a smooth seeded relief (a sum of eight
     * random low-order waves, relative amplitude up to {@code amp}) so that neighbouring facets stay consistently
     * oriented; star-shaped, closed and outward.
     */
    public static TriangleMesh lumpyIcosphere(int level, double radius, double amp, long seed) {
        TriangleMesh s = icosphere(level, 1.0);
        double[] xyz = s.xyz().clone();
        java.util.SplittableRandom rnd = new java.util.SplittableRandom(seed);
        double[][] waves = new double[8][5];
        for (double[] w : waves) {
            double z = 2 * rnd.nextDouble() - 1;
            double ph = 2 * Math.PI * rnd.nextDouble();
            double sn = Math.sqrt(1 - z * z);
            w[0] = sn * Math.cos(ph);
            w[1] = sn * Math.sin(ph);
            w[2] = z;
            w[3] = 1 + 5 * rnd.nextDouble(); // spatial frequency
            w[4] = 2 * Math.PI * rnd.nextDouble(); // phase
        }
        for (int i = 0; i < xyz.length; i += 3) {
            double h = 0;
            for (double[] w : waves) {
                h += Math.sin(w[3] * (w[0] * xyz[i] + w[1] * xyz[i + 1] + w[2] * xyz[i + 2]) + w[4]);
            }
            double f = radius * (1 + amp * h / waves.length);
            xyz[i] *= f;
            xyz[i + 1] *= 0.8 * f;
            xyz[i + 2] *= 0.6 * f;
        }
        return new TriangleMesh(xyz, s.tri());
    }

    /**
     * An icosphere: the regular icosahedron with each facet split into 4, {@code level} times, vertices pushed onto
     * the sphere of radius {@code radius} about the origin. {@code 20·4^level} facets.
     */
    public static TriangleMesh icosphere(int level, double radius) {
        double t = (1 + Math.sqrt(5)) / 2;
        double[] v0 = {
            -1, t, 0, 1, t, 0, -1, -t, 0, 1, -t, 0,
            0, -1, t, 0, 1, t, 0, -1, -t, 0, 1, -t,
            t, 0, -1, t, 0, 1, -t, 0, -1, -t, 0, 1};
        int[] f0 = {
            0, 11, 5, 0, 5, 1, 0, 1, 7, 0, 7, 10, 0, 10, 11,
            1, 5, 9, 5, 11, 4, 11, 10, 2, 10, 7, 6, 7, 1, 8,
            3, 9, 4, 3, 4, 2, 3, 2, 6, 3, 6, 8, 3, 8, 9,
            4, 9, 5, 2, 4, 11, 6, 2, 10, 8, 6, 7, 9, 8, 1};
        int nvFinal = 10 * (1 << (2 * level)) + 2;
        double[] xyz = Arrays.copyOf(v0, 3 * nvFinal);
        int nv = 12;
        for (int i = 0; i < 12; i++) {
            normalise(xyz, i);
        }
        int[] tri = f0;
        for (int l = 0; l < level; l++) {
            Map<Long, Integer> mid = new HashMap<>();
            int[] next = new int[tri.length * 4];
            int q = 0;
            for (int f = 0; f < tri.length; f += 3) {
                int a = tri[f];
                int b = tri[f + 1];
                int c = tri[f + 2];
                int ab = midpoint(mid, xyz, a, b, nv);
                if (ab == nv) {
                    nv++;
                }
                int bc = midpoint(mid, xyz, b, c, nv);
                if (bc == nv) {
                    nv++;
                }
                int ca = midpoint(mid, xyz, c, a, nv);
                if (ca == nv) {
                    nv++;
                }
                int[] quad = {a, ab, ca, b, bc, ab, c, ca, bc, ab, bc, ca};
                System.arraycopy(quad, 0, next, q, 12);
                q += 12;
            }
            tri = next;
        }
        for (int i = 0; i < 3 * nv; i++) {
            xyz[i] *= radius;
        }
        return new TriangleMesh(xyz, tri);
    }

    /** An ellipsoid with semi-axes a, b, c along x, y, z: an icosphere of radius 1 scaled per axis. */
    public static TriangleMesh ellipsoid(int level, double a, double b, double c) {
        TriangleMesh s = icosphere(level, 1.0);
        double[] xyz = s.xyz().clone();
        for (int i = 0; i < xyz.length; i += 3) {
            xyz[i] *= a;
            xyz[i + 1] *= b;
            xyz[i + 2] *= c;
        }
        return new TriangleMesh(xyz, s.tri());
    }

    private static int midpoint(Map<Long, Integer> mid, double[] xyz, int a, int b, int next) {
        long key = ((long) Math.min(a, b) << 32) | Math.max(a, b);
        Integer m = mid.get(key);
        if (m != null) {
            return m;
        }
        for (int k = 0; k < 3; k++) {
            xyz[3 * next + k] = 0.5 * (xyz[3 * a + k] + xyz[3 * b + k]);
        }
        normalise(xyz, next);
        mid.put(key, next);
        return next;
    }

    private static void normalise(double[] xyz, int i) {
        double n = Math.sqrt(xyz[3 * i] * xyz[3 * i] + xyz[3 * i + 1] * xyz[3 * i + 1] + xyz[3 * i + 2] * xyz[3 * i + 2]);
        xyz[3 * i] /= n;
        xyz[3 * i + 1] /= n;
        xyz[3 * i + 2] /= n;
    }
}
