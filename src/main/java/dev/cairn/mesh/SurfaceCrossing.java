package dev.cairn.mesh;

import java.util.Arrays;

/**
 * Finds where one closed surface crosses another: an edge of surface B that pierces the interior of a facet of
 * surface A. Complements a vertex-side test (all vertices of B inside A): two surfaces can cross while every vertex
 * lies on the right side, when an edge of one passes through a facet of the other.
 *
 * <p>Method: A's facets are binned in a uniform grid of about one facet per cell (by bounding box); each edge of B
 * visits the cells its bounding box overlaps and is tested against those facets with the ray–triangle test of
 * {@link FacetGeometry#rayHit}, restricted to the segment (a hit on a facet's edge or vertex counts, so a crossing
 * exactly through an edge of A is not missed). Touching is not crossing: the segment's two ends must lie on opposite
 * sides of the facet's plane, each farther from it than {@code tolerance} times the segment's length, so surfaces
 * that share vertices, edges or facets, or lie on one another, are not reported. Expected cost
 * O(F_A + E_B) for meshes of similar resolution.
 */
public final class SurfaceCrossing {
    private SurfaceCrossing() {
    }

    /**
     * The first edge of {@code b} (in edge-table order) that pierces a facet of {@code a}.
     *
     * @param tolerance relative slack for touching contacts, e.g. 1e-9
     * @return {@code {edge vertex 0 of b, edge vertex 1 of b, facet of a}} (0-based), or null when none crosses
     */
    public static int[] firstCrossing(TriangleMesh a, TriangleMesh b, double tolerance) {
        double[] ax = a.xyz();
        int[] at = a.tri();
        int nf = a.facetCount();
        double[] bb = a.boundingBox();
        double[] size = {bb[3] - bb[0], bb[4] - bb[1], bb[5] - bb[2]};
        double vol = Math.max(size[0], 1e-300) * Math.max(size[1], 1e-300) * Math.max(size[2], 1e-300);
        double cell = Math.cbrt(vol / Math.max(1, nf));
        int[] n = new int[3];
        for (int k = 0; k < 3; k++) {
            n[k] = Math.max(1, Math.min(512, (int) Math.ceil(size[k] / cell)));
        }
        // Bin facets by bounding box (counting sort into a compressed list).
        int cells = n[0] * n[1] * n[2];
        int[] count = new int[cells + 1];
        int[] lo = new int[3];
        int[] hi = new int[3];
        for (int pass = 0; pass < 2; pass++) {
            int[] fill = pass == 1 ? Arrays.copyOf(count, cells + 1) : null;
            int[] list = pass == 1 ? new int[count[cells]] : null;
            for (int f = 0; f < nf; f++) {
                facetCells(ax, at, f, bb, size, n, lo, hi);
                for (int i = lo[0]; i <= hi[0]; i++) {
                    for (int j = lo[1]; j <= hi[1]; j++) {
                        for (int k = lo[2]; k <= hi[2]; k++) {
                            int c = (i * n[1] + j) * n[2] + k;
                            if (pass == 0) {
                                count[c + 1]++;
                            } else {
                                list[fill[c]++] = f;
                            }
                        }
                    }
                }
            }
            if (pass == 0) {
                for (int c = 0; c < cells; c++) {
                    count[c + 1] += count[c];
                }
            } else {
                return scan(a, b, bb, size, n, count, list, tolerance);
            }
        }
        throw new AssertionError("unreachable");
    }

    private static int[] scan(TriangleMesh a, TriangleMesh b, double[] bb, double[] size, int[] n, int[] start,
                              int[] list, double tolerance) {
        double[] ax = a.xyz();
        int[] at = a.tri();
        double[] bx = b.xyz();
        EdgeTable edges = EdgeTable.of(b);
        int[] lo = new int[3];
        int[] hi = new int[3];
        for (int e = 0; e < edges.edgeCount(); e++) {
            int p = 3 * edges.v0(e);
            int q = 3 * edges.v1(e);
            boolean outside = false;
            for (int k = 0; k < 3; k++) {
                double mn = Math.min(bx[p + k], bx[q + k]);
                double mx = Math.max(bx[p + k], bx[q + k]);
                if (mx < bb[k] || mn > bb[3 + k]) {
                    outside = true;
                    break;
                }
                lo[k] = clampCell(mn, bb[k], size[k], n[k]);
                hi[k] = clampCell(mx, bb[k], size[k], n[k]);
            }
            if (outside) {
                continue;
            }
            double dx = bx[q] - bx[p];
            double dy = bx[q + 1] - bx[p + 1];
            double dz = bx[q + 2] - bx[p + 2];
            for (int i = lo[0]; i <= hi[0]; i++) {
                for (int j = lo[1]; j <= hi[1]; j++) {
                    for (int k = lo[2]; k <= hi[2]; k++) {
                        int c = (i * n[1] + j) * n[2] + k;
                        for (int s = start[c]; s < start[c + 1]; s++) {
                            int f = list[s];
                            double t = FacetGeometry.rayHit(ax, at, f, bx[p], bx[p + 1], bx[p + 2], dx, dy, dz,
                                tolerance);
                            if (t > tolerance && t < 1 - tolerance && transversal(ax, at, f, bx, p, q, tolerance)) {
                                return new int[] {edges.v0(e), edges.v1(e), f};
                            }
                        }
                    }
                }
            }
        }
        return null;
    }

    /**
     * True when the segment's ends lie strictly on opposite sides of facet {@code f}'s plane, each farther from it
     * than {@code tolerance} times the segment length: a crossing, not a touch or an in-plane overlap.
     */
    private static boolean transversal(double[] ax, int[] at, int f, double[] bx, int p, int q, double tolerance) {
        int a = 3 * at[3 * f];
        int b = 3 * at[3 * f + 1];
        int c = 3 * at[3 * f + 2];
        double ux = ax[b] - ax[a];
        double uy = ax[b + 1] - ax[a + 1];
        double uz = ax[b + 2] - ax[a + 2];
        double vx = ax[c] - ax[a];
        double vy = ax[c + 1] - ax[a + 1];
        double vz = ax[c + 2] - ax[a + 2];
        double nx = uy * vz - uz * vy;
        double ny = uz * vx - ux * vz;
        double nz = ux * vy - uy * vx;
        double nl = Math.sqrt(nx * nx + ny * ny + nz * nz);
        double dp = (nx * (bx[p] - ax[a]) + ny * (bx[p + 1] - ax[a + 1]) + nz * (bx[p + 2] - ax[a + 2])) / nl;
        double dq = (nx * (bx[q] - ax[a]) + ny * (bx[q + 1] - ax[a + 1]) + nz * (bx[q + 2] - ax[a + 2])) / nl;
        double len = Math.sqrt((bx[q] - bx[p]) * (bx[q] - bx[p]) + (bx[q + 1] - bx[p + 1]) * (bx[q + 1] - bx[p + 1])
            + (bx[q + 2] - bx[p + 2]) * (bx[q + 2] - bx[p + 2]));
        double floor = tolerance * len;
        return dp * dq < 0 && Math.abs(dp) > floor && Math.abs(dq) > floor;
    }

    private static void facetCells(double[] xyz, int[] tri, int f, double[] bb, double[] size, int[] n, int[] lo,
                                   int[] hi) {
        for (int k = 0; k < 3; k++) {
            double mn = Double.POSITIVE_INFINITY;
            double mx = Double.NEGATIVE_INFINITY;
            for (int c = 0; c < 3; c++) {
                double v = xyz[3 * tri[3 * f + c] + k];
                mn = Math.min(mn, v);
                mx = Math.max(mx, v);
            }
            lo[k] = clampCell(mn, bb[k], size[k], n[k]);
            hi[k] = clampCell(mx, bb[k], size[k], n[k]);
        }
    }

    private static int clampCell(double v, double origin, double size, int n) {
        if (!(size > 0)) {
            return 0;
        }
        int c = (int) Math.floor((v - origin) / size * n);
        return Math.max(0, Math.min(n - 1, c));
    }
}
