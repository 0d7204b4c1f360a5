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
