package dev.cairn.mesh;

import java.util.Arrays;

/**
 * Finds a pair of facets of a triangle mesh that cut through each other (a folded or self-intersecting surface,
 * on which the polyhedron field and the mass properties are meaningless).
 *
 * <p>Method: facets are binned by their bounding boxes into a uniform grid whose cell is about twice the mean facet
 * extent; only facets sharing a cell are compared, each pair once (in the cell holding the low corner of the two
 * boxes' overlap), so the expected cost is O(F) for a surface of facets of similar size. Two non-coplanar triangles
 * intersect exactly when an edge of one crosses the interior of the other (the end points of their common segment
 * lie on edges); a crossing is counted only when the edge's end points lie strictly on both sides of the other
 * facet's plane by more than {@link #RELATIVE_TOLERANCE} of the body size, and the crossing point lies in the
 * closed facet; edges through a shared vertex are skipped, so facets that merely share a vertex or an edge never count (segment–triangle test as in Möller &amp;
 * Trumbore 1997, J. Graphics Tools 2(1):21–28, here with signed plane distances). Coplanar overlaps are found for
 * the cases a closed surface can have: a facet given twice (in either orientation) and two facets folded flat onto
 * each other across their common edge. All arithmetic is on coordinates relative to the bounding-box centre and
 * divided by the body size, so the test is scale-free.
 */
public final class SelfIntersection {
    /** Distances below this fraction of the body size count as touching, not crossing. */
    public static final double RELATIVE_TOLERANCE = 1e-10;
    /** Upper bound of grid entries per facet before the cell is made coarser. */
    private static final int ENTRIES_PER_FACET = 48;

    private SelfIntersection() {
    }

    /** Returns two facet indices (0-based) that intersect, or null when the surface does not cut itself. */
    public static int[] find(TriangleMesh mesh) {
        int nf = mesh.facetCount();
        if (nf < 2) {
            return null;
        }
        int[] tri = mesh.tri();
        double[] bb = mesh.boundingBox();
        double size = Math.max(bb[3] - bb[0], Math.max(bb[4] - bb[1], bb[5] - bb[2]));
        if (!(size > 0) || !Double.isFinite(size)) {
            return null;
        }
        double[] p = new double[mesh.xyz().length];
        double[] src = mesh.xyz();
        for (int i = 0; i < p.length; i += 3) {
            p[i] = (src[i] - 0.5 * (bb[0] + bb[3])) / size;
            p[i + 1] = (src[i + 1] - 0.5 * (bb[1] + bb[4])) / size;
            p[i + 2] = (src[i + 2] - 0.5 * (bb[2] + bb[5])) / size;
        }
        double[] box = new double[6 * nf];
        double mean = 0;
        for (int f = 0; f < nf; f++) {
            for (int k = 0; k < 3; k++) {
                double lo = Double.POSITIVE_INFINITY;
                double hi = Double.NEGATIVE_INFINITY;
                for (int j = 0; j < 3; j++) {
                    double v = p[3 * tri[3 * f + j] + k];
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
                box[6 * f + k] = lo - RELATIVE_TOLERANCE;
                box[6 * f + 3 + k] = hi + RELATIVE_TOLERANCE;
                mean += (hi - lo) / (3.0 * nf);
            }
        }
        double cell = Math.max(2 * mean, 1.0 / 1024);
        long[] entries;
        while (true) {
            entries = bin(box, nf, cell, (long) ENTRIES_PER_FACET * nf + 1024);
            if (entries != null) {
                break;
            }
            cell *= 2;
        }
        Arrays.sort(entries);
        int n = entries.length;
        for (int s = 0; s < n; ) {
            long cellKey = entries[s] >>> 32;
            int e = s;
            while (e < n && entries[e] >>> 32 == cellKey) {
                e++;
            }
            for (int i = s; i < e; i++) {
                int f = (int) entries[i];
                for (int j = i + 1; j < e; j++) {
                    int g = (int) entries[j];
                    if (!firstCommonCell(box, f, g, cell, cellKey)) {
                        continue;
                    }
                    if (intersect(p, tri, f, g)) {
                        return new int[] {Math.min(f, g), Math.max(f, g)};
                    }
                }
            }
            s = e;
        }
        return null;
    }

    private static final int AXIS_BITS = 10;
    private static final int AXIS_CELLS = 1 << AXIS_BITS;

    private static int cellOf(double v, double cell) {
        int c = (int) Math.floor((v + 1.0) / cell);
        return Math.max(0, Math.min(AXIS_CELLS - 1, c));
    }

    /** Entries {@code cell << 32 | facet}, or null when there would be more than {@code limit}. */
    private static long[] bin(double[] box, int nf, double cell, long limit) {
        long total = 0;
        for (int f = 0; f < nf; f++) {
            long c = 1;
            for (int k = 0; k < 3; k++) {
                c *= cellOf(box[6 * f + 3 + k], cell) - cellOf(box[6 * f + k], cell) + 1;
            }
            total += c;
            if (total > limit) {
                return null;
            }
        }
        long[] out = new long[(int) total];
        int n = 0;
        for (int f = 0; f < nf; f++) {
            int x0 = cellOf(box[6 * f], cell);
            int x1 = cellOf(box[6 * f + 3], cell);
            int y0 = cellOf(box[6 * f + 1], cell);
            int y1 = cellOf(box[6 * f + 4], cell);
            int z0 = cellOf(box[6 * f + 2], cell);
            int z1 = cellOf(box[6 * f + 5], cell);
            for (int x = x0; x <= x1; x++) {
                for (int y = y0; y <= y1; y++) {
                    for (int z = z0; z <= z1; z++) {
                        long key = ((long) x << (2 * AXIS_BITS)) | ((long) y << AXIS_BITS) | z;
                        out[n++] = key << 32 | f;
                    }
                }
            }
        }
        return out;
    }

    /** True when {@code cellKey} is the cell of the low corner of the overlap of the two boxes (each pair once). */
    private static boolean firstCommonCell(double[] box, int f, int g, double cell, long cellKey) {
        long key = 0;
        for (int k = 0; k < 3; k++) {
            double lo = Math.max(box[6 * f + k], box[6 * g + k]);
            double hi = Math.min(box[6 * f + 3 + k], box[6 * g + 3 + k]);
            if (lo > hi) {
                return false;
            }
            key = key << AXIS_BITS | cellOf(lo, cell);
        }
        return key == cellKey;
    }

    /** Whether facets {@code f} and {@code g} intersect other than at shared vertices or a shared edge. */
    static boolean intersect(double[] p, int[] tri, int f, int g) {
        int a0 = tri[3 * f];
        int a1 = tri[3 * f + 1];
        int a2 = tri[3 * f + 2];
        int b0 = tri[3 * g];
        int b1 = tri[3 * g + 1];
        int b2 = tri[3 * g + 2];
        int shared = 0;
        int[] sa = {a0, a1, a2};
        for (int v : sa) {
            if (v == b0 || v == b1 || v == b2) {
                shared++;
            }
        }
        if (shared == 3) {
            return true; // the same facet twice
        }
        if (shared == 2) {
            // Folded flat: the vertex of g off the common edge lies in f's plane, on the same side of the edge as f.
            int off = b0 != a0 && b0 != a1 && b0 != a2 ? b0 : b1 != a0 && b1 != a1 && b1 != a2 ? b1 : b2;
            int third = a0 != b0 && a0 != b1 && a0 != b2 ? a0 : a1 != b0 && a1 != b1 && a1 != b2 ? a1 : a2;
            int u = third == a0 ? a1 : a0;
            int v = third == a2 ? a1 : a2;
            return foldedFlat(p, u, v, third, off);
        }
        return edgeCrosses(p, b0, b1, a0, a1, a2) || edgeCrosses(p, b1, b2, a0, a1, a2)
            || edgeCrosses(p, b2, b0, a0, a1, a2) || edgeCrosses(p, a0, a1, b0, b1, b2)
            || edgeCrosses(p, a1, a2, b0, b1, b2) || edgeCrosses(p, a2, a0, b0, b1, b2);
    }

    /** Whether segment {@code (s, t)} crosses the interior of triangle {@code (a, b, c)}, strictly. */
    private static boolean edgeCrosses(double[] p, int s, int t, int a, int b, int c) {
        if (s == a || s == b || s == c || t == a || t == b || t == c) {
            return false; // touching at a shared vertex is allowed; a real crossing shows on another edge
        }
        double ax = p[3 * a];
        double ay = p[3 * a + 1];
        double az = p[3 * a + 2];
        double ux = p[3 * b] - ax;
        double uy = p[3 * b + 1] - ay;
        double uz = p[3 * b + 2] - az;
        double vx = p[3 * c] - ax;
        double vy = p[3 * c + 1] - ay;
        double vz = p[3 * c + 2] - az;
        double nx = uy * vz - uz * vy;
        double ny = uz * vx - ux * vz;
        double nz = ux * vy - uy * vx;
        double nl = Math.sqrt(nx * nx + ny * ny + nz * nz);
        if (!(nl > 0)) {
            return false;
        }
        double ds = ((p[3 * s] - ax) * nx + (p[3 * s + 1] - ay) * ny + (p[3 * s + 2] - az) * nz) / nl;
        double dt = ((p[3 * t] - ax) * nx + (p[3 * t + 1] - ay) * ny + (p[3 * t + 2] - az) * nz) / nl;
        double tol = RELATIVE_TOLERANCE;
        if (!(ds > tol && dt < -tol || ds < -tol && dt > tol)) {
            return false;
        }
        double w = ds / (ds - dt);
        double qx = p[3 * s] + w * (p[3 * t] - p[3 * s]) - ax;
        double qy = p[3 * s + 1] + w * (p[3 * t + 1] - p[3 * s + 1]) - ay;
        double qz = p[3 * s + 2] + w * (p[3 * t + 2] - p[3 * s + 2]) - az;
        return insideClosed(ux, uy, uz, vx, vy, vz, nx, ny, nz, nl, qx, qy, qz);
    }

    /** Point {@code q} (relative to a) inside or on triangle (0, u, v) with normal n, by signed sub-areas. */
    private static boolean insideClosed(double ux, double uy, double uz, double vx, double vy, double vz, double nx,
                                        double ny, double nz, double nl, double qx, double qy, double qz) {
        // Signed areas (times |n|) of the sub-triangles: q on the inner side of each edge.
        double e0 = triple(ux, uy, uz, qx, qy, qz, nx, ny, nz);
        double wx = vx - ux;
        double wy = vy - uy;
        double wz = vz - uz;
        double e1 = triple(wx, wy, wz, qx - ux, qy - uy, qz - uz, nx, ny, nz);
        double e2 = triple(-vx, -vy, -vz, qx - vx, qy - vy, qz - vz, nx, ny, nz);
        // The closed triangle: an edge that pierces the plane strictly and meets the facet on its boundary still
        // cuts the surface (symmetric crossings often pass exactly through a facet edge).
        return e0 >= 0 && e1 >= 0 && e2 >= 0;
    }

    /**
     * Facets {@code (u, v, w)} and one with edge {@code (u, v)} and third vertex {@code q}: folded flat onto each
     * other when {@code q} lies in the first facet's plane on the same side of the edge as {@code w}.
     */
    private static boolean foldedFlat(double[] p, int u, int v, int w, int q) {
        double ox = p[3 * u];
        double oy = p[3 * u + 1];
        double oz = p[3 * u + 2];
        double ex = p[3 * v] - ox;
        double ey = p[3 * v + 1] - oy;
        double ez = p[3 * v + 2] - oz;
        double wx = p[3 * w] - ox;
        double wy = p[3 * w + 1] - oy;
        double wz = p[3 * w + 2] - oz;
        double qx = p[3 * q] - ox;
        double qy = p[3 * q + 1] - oy;
        double qz = p[3 * q + 2] - oz;
        double nx = ey * wz - ez * wy;
        double ny = ez * wx - ex * wz;
        double nz = ex * wy - ey * wx;
        double nl = Math.sqrt(nx * nx + ny * ny + nz * nz);
        if (!(nl > 0)) {
            return false;
        }
        double d = (qx * nx + qy * ny + qz * nz) / nl;
        if (Math.abs(d) > RELATIVE_TOLERANCE) {
            return false;
        }
        double sw = triple(ex, ey, ez, wx, wy, wz, nx, ny, nz);
        double sq = triple(ex, ey, ez, qx, qy, qz, nx, ny, nz);
        return sw * sq > 0 && Math.abs(sq) > RELATIVE_TOLERANCE * nl * len(ex, ey, ez);
    }

    /** {@code (a × b) · n}. */
    private static double triple(double ax, double ay, double az, double bx, double by, double bz, double nx,
                                 double ny, double nz) {
        return (ay * bz - az * by) * nx + (az * bx - ax * bz) * ny + (ax * by - ay * bx) * nz;
    }

    private static double len(double x, double y, double z) {
        return Math.sqrt(x * x + y * y + z * z);
    }
}
