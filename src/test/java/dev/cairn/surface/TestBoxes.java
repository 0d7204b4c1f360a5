package dev.cairn.surface;

import dev.cairn.mesh.TriangleMesh;
import java.util.HashMap;
import java.util.Map;

/** Closed, outward-oriented test meshes built from quad grids. */
final class TestBoxes {
    private TestBoxes() {
    }

    /** Axis-aligned box with each face divided into n × n squares (two triangles each), vertices shared. */
    static TriangleMesh gridBox(double x0, double y0, double z0, double x1, double y1, double z1, int n) {
        Builder b = new Builder();
        double[] lo = {x0, y0, z0};
        double[] hi = {x1, y1, z1};
        for (int axis = 0; axis < 3; axis++) {
            int u = (axis + 1) % 3;
            int v = (axis + 2) % 3;
            for (int side = 0; side < 2; side++) {
                for (int i = 0; i < n; i++) {
                    for (int j = 0; j < n; j++) {
                        double[][] q = new double[4][3];
                        int[][] ij = {{i, j}, {i + 1, j}, {i + 1, j + 1}, {i, j + 1}};
                        for (int k = 0; k < 4; k++) {
                            q[k][axis] = side == 0 ? lo[axis] : hi[axis];
                            q[k][u] = lo[u] + (hi[u] - lo[u]) * ij[k][0] / n;
                            q[k][v] = lo[v] + (hi[v] - lo[v]) * ij[k][1] / n;
                        }
                        // u x v = +axis: counter-clockwise seen from +axis on the high side, reversed on the low side
                        b.quad(q, side == 0);
                    }
                }
            }
        }
        return b.mesh();
    }

    /**
     * An invented C-shaped body: a rectangular section (radii r1..r2, heights −hz..hz) swept about the z axis over
     * φ ∈ [−φ0, φ0] in {@code steps} steps, each side of the section divided into {@code m}, with flat end caps; then
     * every vertex moved by a seeded amount of up to {@code jitter} metres along each axis (so that no ray from the
     * centre of mass runs exactly through an edge by symmetry). Closed and outward. With φ0 = 135° the centre of mass
     * lies in the hole, outside the body.
     */
    static TriangleMesh cShape(double r1, double r2, double hz, double phi0Deg, int steps, int m, double jitter,
                               long seed) {
        Builder b = new Builder();
        double phi0 = Math.toRadians(phi0Deg);
        for (int k = 0; k < steps; k++) {
            double pa = -phi0 + 2 * phi0 * k / steps;
            double pb = -phi0 + 2 * phi0 * (k + 1) / steps;
            double pm = 0.5 * (pa + pb);
            for (int i = 0; i < m; i++) {
                // outer wall (outward +radial), inner wall (−radial), top (+z), bottom (−z)
                b.quadOut(new double[][] {c(pa, r2, hz, m, i), c(pb, r2, hz, m, i), c(pb, r2, hz, m, i + 1),
                    c(pa, r2, hz, m, i + 1)}, new double[] {Math.cos(pm), Math.sin(pm), 0});
                b.quadOut(new double[][] {c(pa, r1, hz, m, i), c(pb, r1, hz, m, i), c(pb, r1, hz, m, i + 1),
                    c(pa, r1, hz, m, i + 1)}, new double[] {-Math.cos(pm), -Math.sin(pm), 0});
                b.quadOut(new double[][] {t(pa, r1, r2, hz, m, i, m), t(pb, r1, r2, hz, m, i, m),
                    t(pb, r1, r2, hz, m, i + 1, m), t(pa, r1, r2, hz, m, i + 1, m)}, new double[] {0, 0, 1});
                b.quadOut(new double[][] {t(pa, r1, r2, hz, m, i, 0), t(pb, r1, r2, hz, m, i, 0),
                    t(pb, r1, r2, hz, m, i + 1, 0), t(pa, r1, r2, hz, m, i + 1, 0)}, new double[] {0, 0, -1});
            }
        }
        for (int end = -1; end <= 1; end += 2) {
            double p = end * phi0;
            double[] out = {-Math.sin(p) * end, Math.cos(p) * end, 0}; // end · (unit vector of increasing φ)
            for (int i = 0; i < m; i++) {
                for (int j = 0; j < m; j++) {
                    b.quadOut(new double[][] {t(p, r1, r2, hz, m, i, j), t(p, r1, r2, hz, m, i + 1, j),
                        t(p, r1, r2, hz, m, i + 1, j + 1), t(p, r1, r2, hz, m, i, j + 1)}, out);
                }
            }
        }
        TriangleMesh mesh = b.mesh();
        double[] xyz = mesh.xyz().clone();
        java.util.SplittableRandom rnd = new java.util.SplittableRandom(seed);
        for (int i = 0; i < xyz.length; i++) {
            xyz[i] += rnd.nextDouble(-jitter, jitter);
        }
        return new TriangleMesh(xyz, mesh.tri());
    }

    /** Point of a wall at radius r, height step j of m. */
    private static double[] c(double phi, double r, double hz, int m, int j) {
        return point(phi, r, -hz + 2 * hz * j / m);
    }

    /** Point of the section grid: radius step i, height step j (of m each). */
    private static double[] t(double phi, double r1, double r2, double hz, int m, int i, int j) {
        return point(phi, r1 + (r2 - r1) * i / m, -hz + 2 * hz * j / m);
    }

    private static double[] point(double phi, double r, double z) {
        return new double[] {r * Math.cos(phi), r * Math.sin(phi), z};
    }

    /** Two meshes side by side in one (facets of {@code a} first). */
    static TriangleMesh union(TriangleMesh a, TriangleMesh b) {
        double[] xyz = new double[a.xyz().length + b.xyz().length];
        System.arraycopy(a.xyz(), 0, xyz, 0, a.xyz().length);
        System.arraycopy(b.xyz(), 0, xyz, a.xyz().length, b.xyz().length);
        int[] tri = new int[a.tri().length + b.tri().length];
        System.arraycopy(a.tri(), 0, tri, 0, a.tri().length);
        int off = a.vertexCount();
        for (int i = 0; i < b.tri().length; i++) {
            tri[a.tri().length + i] = b.tri()[i] + off;
        }
        return new TriangleMesh(xyz, tri);
    }

    /** Collects triangles with vertices merged by exact coordinates. */
    static final class Builder {
        private final Map<String, Integer> index = new HashMap<>();
        private final java.util.List<double[]> pts = new java.util.ArrayList<>();
        private final java.util.List<int[]> tris = new java.util.ArrayList<>();

        int vertex(double[] p) {
            String key = p[0] + "," + p[1] + "," + p[2];
            return index.computeIfAbsent(key, k -> {
                pts.add(p.clone());
                return pts.size() - 1;
            });
        }

        void tri(double[] a, double[] b, double[] c) {
            tris.add(new int[] {vertex(a), vertex(b), vertex(c)});
        }

        /** Quad a-b-c-d as two triangles; {@code reverse} flips the orientation. */
        void quad(double[][] q, boolean reverse) {
            if (reverse) {
                tri(q[0], q[2], q[1]);
                tri(q[0], q[3], q[2]);
            } else {
                tri(q[0], q[1], q[2]);
                tri(q[0], q[2], q[3]);
            }
        }

        /** Quad as two triangles, oriented so that their normals point along {@code out}. */
        void quadOut(double[][] q, double[] out) {
            double[] e1 = {q[1][0] - q[0][0], q[1][1] - q[0][1], q[1][2] - q[0][2]};
            double[] e2 = {q[2][0] - q[0][0], q[2][1] - q[0][1], q[2][2] - q[0][2]};
            double nx = e1[1] * e2[2] - e1[2] * e2[1];
            double ny = e1[2] * e2[0] - e1[0] * e2[2];
            double nz = e1[0] * e2[1] - e1[1] * e2[0];
            quad(q, nx * out[0] + ny * out[1] + nz * out[2] < 0);
        }

        TriangleMesh mesh() {
            double[] xyz = new double[3 * pts.size()];
            for (int i = 0; i < pts.size(); i++) {
                System.arraycopy(pts.get(i), 0, xyz, 3 * i, 3);
            }
            int[] tri = new int[3 * tris.size()];
            for (int i = 0; i < tris.size(); i++) {
                System.arraycopy(tris.get(i), 0, tri, 3 * i, 3);
            }
            return new TriangleMesh(xyz, tri);
        }
    }
}
