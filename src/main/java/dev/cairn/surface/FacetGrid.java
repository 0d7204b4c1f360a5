package dev.cairn.surface;

import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.TriangleMesh;
import java.util.Arrays;

/**
 * A uniform grid over the facets' axis-aligned bounding boxes, for "every facet with a point within r of p" queries:
 * the candidates are the facets listed in the cells that the ball's box overlaps, and each is then tested by its exact
 * point-to-triangle distance ({@link FacetGeometry#distanceSquared}). Complete by construction (a facet with a point
 * within r of p has its box overlapping the ball's box, so it is listed in one of those cells), whatever the
 * connectivity of the surface inside the ball.
 *
 * <p>Cells are stored sparsely (sorted cell keys, compressed lists). The cell size is at least the query radius and
 * grows (doubling) until the number of (cell, facet) entries is at most {@value #ENTRIES_PER_FACET} per facet plus
 * {@value #SPARE_ENTRIES}, so memory stays O(F) even for facets much larger than the radius. Immutable after
 * construction, thread-safe for queries with caller-owned scratch.
 */
final class FacetGrid {
    private static final int ENTRIES_PER_FACET = 16;
    private static final long SPARE_ENTRIES = 1 << 20;
    /** At most this many cells along an axis (keys then fit in a long). */
    private static final long MAX_CELLS_PER_AXIS = 1 << 10;

    private final double[] xyz;
    private final int[] tri;
    private final double h;
    private final double ox;
    private final double oy;
    private final double oz;
    private final long nx;
    private final long ny;
    private final long nz;
    /** Sorted distinct cell keys. */
    private final long[] keys;
    /** Facets of cell {@code keys[i]} are {@code list[start[i] .. start[i+1])}. */
    private final int[] start;
    private final int[] list;

    /** Builds the grid of {@code mesh} for query radii up to about {@code radius} (metres, &gt; 0). */
    FacetGrid(TriangleMesh mesh, double radius) {
        xyz = mesh.xyz();
        tri = mesh.tri();
        int nf = mesh.facetCount();
        double[] lo = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
        double[] hi = {Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (int i = 0; i < xyz.length; i++) {
            lo[i % 3] = Math.min(lo[i % 3], xyz[i]);
            hi[i % 3] = Math.max(hi[i % 3], xyz[i]);
        }
        double extent = Math.max(hi[0] - lo[0], Math.max(hi[1] - lo[1], hi[2] - lo[2]));
        double cell = Math.max(radius, extent / (MAX_CELLS_PER_AXIS - 2));
        if (!(cell > 0)) {
            cell = 1; // a degenerate (single-point) mesh
        }
        long limit = (long) ENTRIES_PER_FACET * nf + SPARE_ENTRIES;
        while (entries(nf, cell, lo) > limit) {
            cell *= 2;
        }
        h = cell;
        ox = lo[0];
        oy = lo[1];
        oz = lo[2];
        nx = (long) Math.floor((hi[0] - lo[0]) / h) + 1;
        ny = (long) Math.floor((hi[1] - lo[1]) / h) + 1;
        nz = (long) Math.floor((hi[2] - lo[2]) / h) + 1;
        int n = (int) entries(nf, h, lo);
        long[] pairs = new long[n];
        int k = 0;
        int[] r = new int[6];
        for (int f = 0; f < nf; f++) {
            range(f, r);
            for (int i = r[0]; i <= r[1]; i++) {
                for (int j = r[2]; j <= r[3]; j++) {
                    for (int l = r[4]; l <= r[5]; l++) {
                        pairs[k++] = key(i, j, l) << 31 | f;
                    }
                }
            }
        }
        Arrays.sort(pairs);
        int distinct = 0;
        for (int i = 0; i < n; i++) {
            if (i == 0 || (pairs[i] >>> 31) != (pairs[i - 1] >>> 31)) {
                distinct++;
            }
        }
        keys = new long[distinct];
        start = new int[distinct + 1];
        list = new int[n];
        int c = -1;
        for (int i = 0; i < n; i++) {
            long key = pairs[i] >>> 31;
            if (c < 0 || key != keys[c]) {
                keys[++c] = key;
                start[c] = i;
            }
            list[i] = (int) (pairs[i] & 0x7FFFFFFFL);
        }
        start[distinct] = n;
    }

    private long entries(int nf, double cell, double[] lo) {
        long total = 0;
        for (int f = 0; f < nf; f++) {
            long cells = 1;
            for (int d = 0; d < 3; d++) {
                double mn = Double.POSITIVE_INFINITY;
                double mx = Double.NEGATIVE_INFINITY;
                for (int v = 0; v < 3; v++) {
                    double x = xyz[3 * tri[3 * f + v] + d];
                    mn = Math.min(mn, x);
                    mx = Math.max(mx, x);
                }
                cells *= (long) Math.floor((mx - lo[d]) / cell) - (long) Math.floor((mn - lo[d]) / cell) + 1;
            }
            total += cells;
            if (total > Integer.MAX_VALUE - 8) {
                return Long.MAX_VALUE;
            }
        }
        return total;
    }

    /** Cell index ranges (i0, i1, j0, j1, k0, k1) of facet {@code f}'s bounding box. */
    private void range(int f, int[] r) {
        for (int d = 0; d < 3; d++) {
            double o = d == 0 ? ox : d == 1 ? oy : oz;
            double mn = Double.POSITIVE_INFINITY;
            double mx = Double.NEGATIVE_INFINITY;
            for (int v = 0; v < 3; v++) {
                double x = xyz[3 * tri[3 * f + v] + d];
                mn = Math.min(mn, x);
                mx = Math.max(mx, x);
            }
            r[2 * d] = (int) Math.floor((mn - o) / h);
            r[2 * d + 1] = (int) Math.floor((mx - o) / h);
        }
    }

    private long key(long i, long j, long k) {
        return (i * ny + j) * nz + k;
    }

    /**
     * Collects, without repeats, every facet with a point within {@code r} of {@code (px, py, pz)} (exact
     * point-to-triangle distance, closed ball) into {@code out[0..n)}, in increasing facet order; returns n.
     *
     * @param stamp scratch, one int per facet, owned by the caller's thread; entries equal to {@code gen} are skipped
     * @param gen   a value not yet used in {@code stamp} (the caller increments it per query)
     */
    int within(double px, double py, double pz, double r, int[] stamp, int gen, int[] out) {
        double r2 = r * r;
        long i0 = Math.max(0, (long) Math.floor((px - r - ox) / h));
        long i1 = Math.min(nx - 1, (long) Math.floor((px + r - ox) / h));
        long j0 = Math.max(0, (long) Math.floor((py - r - oy) / h));
        long j1 = Math.min(ny - 1, (long) Math.floor((py + r - oy) / h));
        long k0 = Math.max(0, (long) Math.floor((pz - r - oz) / h));
        long k1 = Math.min(nz - 1, (long) Math.floor((pz + r - oz) / h));
        int n = 0;
        for (long i = i0; i <= i1; i++) {
            for (long j = j0; j <= j1; j++) {
                for (long k = k0; k <= k1; k++) {
                    int c = Arrays.binarySearch(keys, key(i, j, k));
                    if (c < 0) {
                        continue;
                    }
                    for (int q = start[c]; q < start[c + 1]; q++) {
                        int f = list[q];
                        if (stamp[f] == gen) {
                            continue;
                        }
                        stamp[f] = gen; // decided once per query
                        if (FacetGeometry.distanceSquared(xyz, tri, f, px, py, pz, null) <= r2) {
                            out[n++] = f;
                        }
                    }
                }
            }
        }
        Arrays.sort(out, 0, n);
        return n;
    }
}
