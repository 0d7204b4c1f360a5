package dev.cairn.motion;

import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.TriangleMesh;

/**
 * First crossing of a straight segment with a triangle mesh, through a uniform grid of facet buckets walked cell by
 * cell along the segment (Amanatides, J. &amp; Woo, A. (1987) "A fast voxel traversal algorithm for ray tracing",
 * Eurographics '87, 3–10) and the ray–triangle test of Möller &amp; Trumbore (1997) ({@link FacetGeometry#rayHit}).
 *
 * <p>Every facet is filed in every cell its (slightly padded) bounding box overlaps, so a crossing point lies in a
 * cell that lists the facet, and the walk visits every cell the segment passes through: no crossing is missed
 * however long the segment is compared with the facets. The ray test accepts points up to {@link #EDGE_TOLERANCE}
 * (barycentric) outside a facet, so a segment through an edge or a vertex is caught by at least one facet.
 *
 * <p>Units metres, model frame. Immutable and thread-safe (a query allocates only a few three-element scratch arrays).
 */
public final class SegmentIndex {
    /** Barycentric slack of the ray–facet test (a crossing exactly on a shared edge is never lost to rounding). */
    public static final double EDGE_TOLERANCE = 1e-9;
    private final double[] xyz;
    private final int[] tri;
    private final double[] lo = new double[3];
    private final int[] n = new int[3];
    private final double cell;
    private final int[] start;
    private final int[] ids;

    /** @param mesh the shape (shared, not copied) */
    public SegmentIndex(TriangleMesh mesh) {
        this.xyz = mesh.xyz();
        this.tri = mesh.tri();
        int facets = mesh.facetCount();
        double[] hi = new double[3];
        for (int a = 0; a < 3; a++) {
            lo[a] = Double.POSITIVE_INFINITY;
            hi[a] = Double.NEGATIVE_INFINITY;
        }
        for (int i = 0; i < xyz.length; i++) {
            lo[i % 3] = Math.min(lo[i % 3], xyz[i]);
            hi[i % 3] = Math.max(hi[i % 3], xyz[i]);
        }
        double ext = Math.max(hi[0] - lo[0], Math.max(hi[1] - lo[1], hi[2] - lo[2]));
        double pad = 1e-7 * ext;
        double vol = 1;
        for (int a = 0; a < 3; a++) {
            lo[a] -= 2 * pad;
            hi[a] += 2 * pad;
            vol *= hi[a] - lo[a];
        }
        // About one facet per cell on a typical surface; at most 8 cells per facet in total (memory bound).
        double c = Math.max(Math.cbrt(vol / Math.max(1, facets)) * 0.7, ext / 256);
        c = Math.max(c, Math.cbrt(vol / (8.0 * facets + 64)));
        long total = 1;
        for (int a = 0; a < 3; a++) {
            n[a] = Math.max(1, (int) Math.ceil((hi[a] - lo[a]) / c));
            total *= n[a];
        }
        this.cell = c;
        int cells = (int) total;
        int[] count = new int[cells + 1];
        int[] r = new int[6];
        for (int f = 0; f < facets; f++) {
            range(f, pad, r);
            for (int k = r[4]; k <= r[5]; k++) {
                for (int j = r[2]; j <= r[3]; j++) {
                    for (int i = r[0]; i <= r[1]; i++) {
                        count[(k * n[1] + j) * n[0] + i + 1]++;
                    }
                }
            }
        }
        for (int q = 0; q < cells; q++) {
            count[q + 1] += count[q];
        }
        int[] fill = count.clone();
        int[] out = new int[count[cells]];
        for (int f = 0; f < facets; f++) {
            range(f, pad, r);
            for (int k = r[4]; k <= r[5]; k++) {
                for (int j = r[2]; j <= r[3]; j++) {
                    for (int i = r[0]; i <= r[1]; i++) {
                        out[fill[(k * n[1] + j) * n[0] + i]++] = f;
                    }
                }
            }
        }
        this.start = count;
        this.ids = out;
    }

    private void range(int f, double pad, int[] r) {
        for (int a = 0; a < 3; a++) {
            double mn = Double.POSITIVE_INFINITY;
            double mx = Double.NEGATIVE_INFINITY;
            for (int v = 0; v < 3; v++) {
                double q = xyz[3 * tri[3 * f + v] + a];
                mn = Math.min(mn, q);
                mx = Math.max(mx, q);
            }
            r[2 * a] = cellOf(a, mn - pad);
            r[2 * a + 1] = cellOf(a, mx + pad);
        }
    }

    private int cellOf(int a, double v) {
        int i = (int) Math.floor((v - lo[a]) / cell);
        return Math.max(0, Math.min(n[a] - 1, i));
    }

    /**
     * First crossing of the segment from {@code a} to {@code b} with the surface.
     *
     * @param facetOut receives the crossed facet in {@code facetOut[0]} (modified; −1 when none)
     * @return the segment parameter s in (0, 1] of the first crossing ({@code a + s (b − a)}), or NaN when none
     */
    public double firstHit(double ax, double ay, double az, double bx, double by, double bz, int[] facetOut) {
        facetOut[0] = -1;
        double[] p = {ax, ay, az};
        double[] d = {bx - ax, by - ay, bz - az};
        double tmin = 0;
        double tmax = 1;
        for (int a = 0; a < 3; a++) {
            double hiA = lo[a] + n[a] * cell;
            if (d[a] == 0) { // exact zero: the segment runs parallel to this pair of grid faces
                if (p[a] < lo[a] || p[a] > hiA) {
                    return Double.NaN;
                }
            } else {
                double t1 = (lo[a] - p[a]) / d[a];
                double t2 = (hiA - p[a]) / d[a];
                tmin = Math.max(tmin, Math.min(t1, t2));
                tmax = Math.min(tmax, Math.max(t1, t2));
            }
        }
        if (tmin > tmax) {
            return Double.NaN;
        }
        int[] ci = new int[3];
        int[] step = new int[3];
        double[] next = new double[3];
        double[] delta = new double[3];
        for (int a = 0; a < 3; a++) {
            ci[a] = cellOf(a, p[a] + tmin * d[a]);
            if (d[a] > 0) {
                step[a] = 1;
                next[a] = (lo[a] + (ci[a] + 1) * cell - p[a]) / d[a];
                delta[a] = cell / d[a];
            } else if (d[a] < 0) {
                step[a] = -1;
                next[a] = (lo[a] + ci[a] * cell - p[a]) / d[a];
                delta[a] = -cell / d[a];
            } else {
                next[a] = Double.POSITIVE_INFINITY;
                delta[a] = Double.POSITIVE_INFINITY;
            }
        }
        double best = Double.NaN;
        int bestF = -1;
        int guard = n[0] + n[1] + n[2] + 3;
        for (int it = 0; it < guard; it++) {
            int id = (ci[2] * n[1] + ci[1]) * n[0] + ci[0];
            for (int q = start[id]; q < start[id + 1]; q++) {
                int f = ids[q];
                double s = FacetGeometry.rayHit(xyz, tri, f, ax, ay, az, d[0], d[1], d[2], EDGE_TOLERANCE);
                if (s <= 1 && !(s >= best)) {
                    best = s;
                    bestF = f;
                }
            }
            int axis = next[0] <= next[1] ? (next[0] <= next[2] ? 0 : 2) : (next[1] <= next[2] ? 1 : 2);
            double exit = next[axis];
            if (best <= exit || exit > tmax) {
                break;
            }
            ci[axis] += step[axis];
            if (ci[axis] < 0 || ci[axis] >= n[axis]) {
                break;
            }
            next[axis] += delta[axis];
        }
        facetOut[0] = bestF;
        return best;
    }
}
