package dev.cairn;

import dev.cairn.mesh.Shapes;
import dev.cairn.mesh.TriangleMesh;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;

/** Test-only solids and helpers: L-shape, torus, perturbed sphere, centroid re-triangulation, rotations, OBJ writing. */
public final class TestShapes {
    private TestShapes() {
    }

    /**
     * The L-shape of three unit cubes [0,1]x[0,1], [1,2]x[0,1], [0,1]x[1,2] (in x, y), z in [0,1]: the hexagon
     * (0,0),(2,0),(2,1),(1,1),(1,2),(0,2) extruded. Closed, outward, 20 facets.
     */
    public static TriangleMesh lShape() {
        double[] p = {0, 0, 2, 0, 2, 1, 1, 1, 1, 2, 0, 2};
        int n = 6;
        double[] xyz = new double[6 * n];
        for (int i = 0; i < n; i++) {
            xyz[3 * i] = p[2 * i];
            xyz[3 * i + 1] = p[2 * i + 1];
            xyz[3 * i + 2] = 0;
            xyz[3 * (n + i)] = p[2 * i];
            xyz[3 * (n + i) + 1] = p[2 * i + 1];
            xyz[3 * (n + i) + 2] = 1;
        }
        // Caps: fan from the reflex vertex 3 = (1,1); the polygon is counter-clockwise seen from +z.
        int[] fan = {3, 4, 5, 3, 5, 0, 3, 0, 1, 3, 1, 2};
        int[] tri = new int[3 * (8 + 2 * n)];
        int q = 0;
        for (int t = 0; t < 4; t++) {
            // bottom (normal -z): reversed
            tri[q++] = fan[3 * t];
            tri[q++] = fan[3 * t + 2];
            tri[q++] = fan[3 * t + 1];
            // top (normal +z)
            tri[q++] = n + fan[3 * t];
            tri[q++] = n + fan[3 * t + 1];
            tri[q++] = n + fan[3 * t + 2];
        }
        for (int i = 0; i < n; i++) {
            int j = (i + 1) % n;
            tri[q++] = i;
            tri[q++] = j;
            tri[q++] = n + j;
            tri[q++] = i;
            tri[q++] = n + j;
            tri[q++] = n + i;
        }
        return new TriangleMesh(xyz, tri);
    }

    /** Ring torus, major radius {@code big}, tube radius {@code small}, about the z axis; closed, outward, genus 1. */
    public static TriangleMesh torus(int nu, int nv, double big, double small) {
        double[] xyz = new double[3 * nu * nv];
        for (int i = 0; i < nu; i++) {
            double u = 2 * Math.PI * i / nu;
            for (int j = 0; j < nv; j++) {
                double v = 2 * Math.PI * j / nv;
                int k = 3 * (i * nv + j);
                xyz[k] = (big + small * Math.cos(v)) * Math.cos(u);
                xyz[k + 1] = (big + small * Math.cos(v)) * Math.sin(u);
                xyz[k + 2] = small * Math.sin(v);
            }
        }
        int[] tri = new int[6 * nu * nv];
        int q = 0;
        for (int i = 0; i < nu; i++) {
            for (int j = 0; j < nv; j++) {
                int a = i * nv + j;
                int b = ((i + 1) % nu) * nv + j;
                int c = ((i + 1) % nu) * nv + (j + 1) % nv;
                int d = i * nv + (j + 1) % nv;
                // (dp/du x dp/dv) points outward, so a→b→c→d is counter-clockwise seen from outside.
                tri[q++] = a;
                tri[q++] = b;
                tri[q++] = c;
                tri[q++] = a;
                tri[q++] = c;
                tri[q++] = d;
            }
        }
        return new TriangleMesh(xyz, tri);
    }

    /** Icosphere of radius 1 with each vertex moved radially by a seeded factor in [1-amp, 1+amp]: irregular, star-shaped. */
    public static TriangleMesh lumpySphere(int level, double amp, long seed) {
        TriangleMesh s = Shapes.icosphere(level, 1.0);
        double[] xyz = s.xyz().clone();
        Random rnd = new Random(seed);
        for (int i = 0; i < xyz.length; i += 3) {
            double f = 1 + amp * (2 * rnd.nextDouble() - 1);
            xyz[i] *= f;
            xyz[i + 1] *= f * 0.8;
            xyz[i + 2] *= f * 0.6;
        }
        return new TriangleMesh(xyz, s.tri());
    }

    /** Each facet split into three at its centroid: the same solid with coplanar extra edges. */
    public static TriangleMesh centroidSplit(TriangleMesh m) {
        int nv = m.vertexCount();
        int nf = m.facetCount();
        double[] c = m.facetCentroids();
        double[] xyz = new double[3 * (nv + nf)];
        System.arraycopy(m.xyz(), 0, xyz, 0, 3 * nv);
        System.arraycopy(c, 0, xyz, 3 * nv, 3 * nf);
        int[] t = m.tri();
        int[] tri = new int[9 * nf];
        for (int f = 0; f < nf; f++) {
            int a = t[3 * f];
            int b = t[3 * f + 1];
            int d = t[3 * f + 2];
            int g = nv + f;
            int[] s = {a, b, g, b, d, g, d, a, g};
            System.arraycopy(s, 0, tri, 9 * f, 9);
        }
        return new TriangleMesh(xyz, tri);
    }

    /** Row-major rotation by {@code angle} radians about the axis (ax, ay, az) (Rodrigues' formula). */
    public static double[] rotation(double ax, double ay, double az, double angle) {
        double n = Math.sqrt(ax * ax + ay * ay + az * az);
        double x = ax / n;
        double y = ay / n;
        double z = az / n;
        double c = Math.cos(angle);
        double s = Math.sin(angle);
        double t = 1 - c;
        return new double[] {
            t * x * x + c, t * x * y - s * z, t * x * z + s * y,
            t * x * y + s * z, t * y * y + c, t * y * z - s * x,
            t * x * z - s * y, t * y * z + s * x, t * z * z + c};
    }

    /** {@code R·v} for a row-major 3x3 {@code R}. */
    public static double[] apply(double[] r, double[] v) {
        return new double[] {
            r[0] * v[0] + r[1] * v[1] + r[2] * v[2],
            r[3] * v[0] + r[4] * v[1] + r[5] * v[2],
            r[6] * v[0] + r[7] * v[1] + r[8] * v[2]};
    }

    /** OBJ text of a mesh (1-based indices), coordinates divided by {@code unit}. */
    public static String objText(TriangleMesh m, double unit) {
        StringBuilder sb = new StringBuilder();
        double[] xyz = m.xyz();
        for (int i = 0; i < xyz.length; i += 3) {
            sb.append(String.format(Locale.ROOT, "v %.17g %.17g %.17g%n", xyz[i] / unit, xyz[i + 1] / unit,
                xyz[i + 2] / unit));
        }
        int[] t = m.tri();
        for (int f = 0; f < t.length; f += 3) {
            sb.append("f ").append(t[f] + 1).append(' ').append(t[f + 1] + 1).append(' ').append(t[f + 2] + 1)
                .append('\n');
        }
        return sb.toString();
    }

    /** Writes {@code text} to {@code file} (UTF-8) and returns the file. */
    public static Path write(Path file, String text) {
        try {
            Files.createDirectories(file.toAbsolutePath().getParent());
            Files.writeString(file, text, StandardCharsets.UTF_8);
            return file;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Prints one achieved validation figure (collected into docs/validation.md). */
    public static void achieved(String check, double value) {
        System.out.printf(Locale.ROOT, "[achieved] %s: %.3g%n", check, value);
    }

    /**
     * A closed, outward box of square cross-section {@code width} whose axis runs from {@code p} to {@code q}
     * (horizontal axis assumed: the cross-section spans the horizontal normal and z).
     */
    public static TriangleMesh bar(double[] p, double[] q, double width) {
        double ax = q[0] - p[0];
        double ay = q[1] - p[1];
        double len = Math.hypot(ax, ay);
        double[] w = {-ay / len * width, ax / len * width, 0};
        double[] h = {0, 0, width};
        TriangleMesh unit = dev.cairn.mesh.Shapes.unitCube();
        double[] u = unit.xyz();
        double[] xyz = new double[u.length];
        for (int i = 0; i < u.length; i += 3) {
            for (int k = 0; k < 3; k++) {
                xyz[i + k] = p[k] + u[i] * (q[k] - p[k]) + (u[i + 1] - 0.5) * w[k] + (u[i + 2] - 0.5) * h[k];
            }
        }
        TriangleMesh m = new TriangleMesh(xyz, unit.tri());
        return dev.cairn.mesh.MeshInspector.inspect(m).signedVolume() < 0 ? m.flipped() : m;
    }

    /**
     * Writes {@code mesh} as a plain OBJ file (metres, 1-based facet indices; Double.toString round-trips exactly)
     * and returns {@code file}.
     */
    public static java.nio.file.Path writeObj(TriangleMesh mesh, java.nio.file.Path file) throws java.io.IOException {
        StringBuilder sb = new StringBuilder();
        double[] v = mesh.xyz();
        for (int i = 0; i < v.length; i += 3) {
            sb.append("v ").append(v[i]).append(' ').append(v[i + 1]).append(' ').append(v[i + 2]).append('\n');
        }
        int[] t = mesh.tri();
        for (int i = 0; i < t.length; i += 3) {
            sb.append("f ").append(t[i] + 1).append(' ').append(t[i + 1] + 1).append(' ').append(t[i + 2] + 1)
                .append('\n');
        }
        java.nio.file.Files.writeString(file, sb.toString());
        return file;
    }
}
