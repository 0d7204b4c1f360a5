package dev.cairn.mascon;

import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.TriangleMesh;

/**
 * Geometric queries against a closed, outward-oriented triangle mesh, one pass over the facets per query, no
 * allocation: the winding number (inside test), the distance to the surface and the farthest crossing of a ray.
 *
 * <p>Winding number {@code w = Σ_f ω_f / 4π} with the facet solid angle of Van Oosterom, A. &amp; Strackee, J. (1983)
 * "The solid angle of a plane triangle", IEEE Trans. Biomed. Eng. BME-30(2):125–126; {@code w ≈ 1} inside, 0
 * outside, ½ on the surface (the sum behind the Laplacian of Werner &amp; Scheeres 1997). Point-to-triangle distance by
 * the closest-point construction of Ericson, C. (2005) Real-Time Collision Detection, §5.1.5. Ray crossing by
 * Möller, T. &amp; Trumbore, B. (1997) "Fast, minimum storage ray-triangle intersection", J. Graphics Tools 2(1):21–28.
 *
 * <p>Near the surface, {@link #near} gives a {@link Local} view for points within a radius of a centre: the distance
 * from the few facets that can be nearest, and inside/outside from the sign of {@code (p − q)·n} against the nearest
 * facet's angle-weighted pseudo-normal (Bærentzen, J.A. &amp; Aanæs, H. (2005) "Signed distance computation using the
 * angle weighted pseudonormal", IEEE Trans. Vis. Comput. Graph. 11(3):243–253), exact for a closed 2-manifold.
 *
 * <p>Signed distances ({@link #signedDistance}) use a uniform grid of facet buckets (each facet filed in every cell its
 * bounding box overlaps), searched in rings of cells around the point until no unvisited cell can hold a nearer
 * point; the sign is that of the angle-weighted pseudo-normal test above. The grid is built on first use.
 *
 * <p>Units: metres, model frame. Immutable and thread-safe (no scratch state; the index is built once, safely).
 */
public final class SurfaceQuery {
    private final double[] xyz;
    private final int[] tri;
    private final int facets;
    /** Unit facet normals, 3 per facet. */
    private final double[] fn;
    /** Pseudo-normal of each facet's three edges (half-edges 3f+k), 9 per facet. */
    private final double[] en;
    /** Angle-weighted vertex pseudo-normals, 3 per vertex. */
    private final double[] vn;

    /** @param mesh closed, outward-oriented 2-manifold mesh, metres (shared, not copied) */
    public SurfaceQuery(TriangleMesh mesh) {
        this.xyz = mesh.xyz();
        this.tri = mesh.tri();
        this.facets = mesh.facetCount();
        this.fn = mesh.facetNormals();
        this.vn = new double[xyz.length];
        this.en = new double[9 * facets];
        EdgeTable edges = EdgeTable.of(mesh);
        for (int f = 0; f < facets; f++) {
            for (int k = 0; k < 3; k++) {
                int a = tri[3 * f + k];
                int b = tri[3 * f + (k + 1) % 3];
                int c = tri[3 * f + (k + 2) % 3];
                double ux = xyz[3 * b] - xyz[3 * a];
                double uy = xyz[3 * b + 1] - xyz[3 * a + 1];
                double uz = xyz[3 * b + 2] - xyz[3 * a + 2];
                double wx = xyz[3 * c] - xyz[3 * a];
                double wy = xyz[3 * c + 1] - xyz[3 * a + 1];
                double wz = xyz[3 * c + 2] - xyz[3 * a + 2];
                double cos = (ux * wx + uy * wy + uz * wz)
                    / Math.sqrt((ux * ux + uy * uy + uz * uz) * (wx * wx + wy * wy + wz * wz));
                double angle = Math.acos(Math.max(-1, Math.min(1, cos)));
                for (int d = 0; d < 3; d++) {
                    vn[3 * a + d] += angle * fn[3 * f + d];
                }
                int e = edges.edgeOfHalfEdge(3 * f + k);
                int other = edges.otherFacet(e, f);
                for (int d = 0; d < 3; d++) {
                    en[9 * f + 3 * k + d] = fn[3 * f + d] + (other >= 0 ? fn[3 * other + d] : 0);
                }
            }
        }
    }

    private volatile Index index;

    /**
     * Exact signed distance from the point to the surface, m: negative inside, positive outside, 0 on it. Closest
     * point over all facets (found through the bucket grid), sign from the pseudo-normal at the closest feature.
     *
     * @param scratch 4 values, modified (one per thread)
     */
    public double signedDistance(double x, double y, double z, double[] scratch) {
        Index ix = index;
        if (ix == null) {
            synchronized (this) {
                if (index == null) {
                    index = new Index();
                }
                ix = index;
            }
        }
        return ix.signedDistance(x, y, z, scratch);
    }

    /** Uniform grid of facet buckets (compressed rows: cell start offsets and facet ids). */
    private final class Index {
        private final double[] o = new double[3];
        private final int[] n = new int[3];
        private final double c;
        private final int[] start;
        private final int[] ids;

        Index() {
            double[] lo = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
            double[] hi = {Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
            for (int i = 0; i < xyz.length; i++) {
                lo[i % 3] = Math.min(lo[i % 3], xyz[i]);
                hi[i % 3] = Math.max(hi[i % 3], xyz[i]);
            }
            double ext = Math.max(hi[0] - lo[0], Math.max(hi[1] - lo[1], hi[2] - lo[2]));
            double pad = 1e-9 * ext + 1e-300;
            double vol = 1;
            for (int a = 0; a < 3; a++) {
                lo[a] -= pad;
                hi[a] += pad;
                vol *= hi[a] - lo[a];
            }
            // About two facets per cell on a typical surface, at most ~8 cells per facet overall.
            double cell = Math.max(Math.cbrt(vol / Math.max(1, facets)) * 0.7, ext / 256);
            long total = 1;
            for (int a = 0; a < 3; a++) {
                o[a] = lo[a];
                n[a] = Math.max(1, (int) Math.ceil((hi[a] - lo[a]) / cell));
                total *= n[a];
            }
            this.c = cell;
            int cells = (int) Math.min(total, Integer.MAX_VALUE - 8);
            int[] count = new int[cells + 1];
            int[] r = new int[6];
            for (int pass = 0; pass < 2; pass++) {
                int[] fill = pass == 1 ? count.clone() : null;
                int[] out = pass == 1 ? new int[count[cells]] : null;
                for (int f = 0; f < facets; f++) {
                    range(f, r);
                    for (int k = r[4]; k <= r[5]; k++) {
                        for (int j = r[2]; j <= r[3]; j++) {
                            for (int i = r[0]; i <= r[1]; i++) {
                                int cellId = (k * n[1] + j) * n[0] + i;
                                if (pass == 0) {
                                    count[cellId + 1]++;
                                } else {
                                    out[fill[cellId]++] = f;
                                }
                            }
                        }
                    }
                }
                if (pass == 0) {
                    for (int q = 0; q < cells; q++) {
                        count[q + 1] += count[q];
                    }
                } else {
                    this.start = count;
                    this.ids = out;
                    return;
                }
            }
            throw new IllegalStateException("unreachable");
        }

        private void range(int f, int[] r) {
            for (int a = 0; a < 3; a++) {
                double mn = Double.POSITIVE_INFINITY;
                double mx = Double.NEGATIVE_INFINITY;
                for (int v = 0; v < 3; v++) {
                    double q = xyz[3 * tri[3 * f + v] + a];
                    mn = Math.min(mn, q);
                    mx = Math.max(mx, q);
                }
                r[2 * a] = cellOf(a, mn);
                r[2 * a + 1] = cellOf(a, mx);
            }
        }

        private double outside(int a, double v) {
            double top = o[a] + n[a] * c;
            return v < o[a] ? o[a] - v : v > top ? v - top : 0;
        }

        private double faceBound(int a, double v, int ci, int r, double rest) {
            double lb = Double.POSITIVE_INFINITY;
            if (ci - r > 0) {
                double g = Math.max(0, v - (o[a] + (ci - r) * c));
                lb = Math.sqrt(g * g + rest);
            }
            if (ci + r + 1 < n[a]) {
                double g = Math.max(0, o[a] + (ci + r + 1) * c - v);
                lb = Math.min(lb, Math.sqrt(g * g + rest));
            }
            return lb;
        }

        private int cellOf(int a, double v) {
            int i = (int) Math.floor((v - o[a]) / c);
            return Math.max(0, Math.min(n[a] - 1, i));
        }

        double signedDistance(double x, double y, double z, double[] w) {
            int c0 = cellOf(0, x);
            int c1 = cellOf(1, y);
            int c2 = cellOf(2, z);
            double out0 = outside(0, x);
            double out1 = outside(1, y);
            double out2 = outside(2, z);
            double best = Double.POSITIVE_INFINITY;
            double sx = 0;
            double sy = 0;
            double sz = 0;
            int bestF = -1;
            int bestCode = 0;
            int maxR = Math.max(n[0], Math.max(n[1], n[2]));
            for (int r = 0; r <= maxR; r++) {
                int i0 = Math.max(0, c0 - r);
                int i1 = Math.min(n[0] - 1, c0 + r);
                int j0 = Math.max(0, c1 - r);
                int j1 = Math.min(n[1] - 1, c1 + r);
                int k0 = Math.max(0, c2 - r);
                int k1 = Math.min(n[2] - 1, c2 + r);
                for (int k = k0; k <= k1; k++) {
                    boolean kRing = Math.abs(k - c2) == r;
                    for (int j = j0; j <= j1; j++) {
                        boolean full = kRing || Math.abs(j - c1) == r;
                        // Inside the ring's shell only the two x-ends of a row belong to ring r.
                        int step = full || r == 0 ? 1 : 2 * r;
                        int from = full ? i0 : c0 - r;
                        for (int i = from; i <= (full ? i1 : c0 + r); i += step) {
                            if (i < 0 || i >= n[0]) {
                                continue;
                            }
                            int cellId = (k * n[1] + j) * n[0] + i;
                            for (int q = start[cellId]; q < start[cellId + 1]; q++) {
                                int f = ids[q];
                                double d2 = distanceSquared(f, x, y, z, w);
                                if (d2 < best) {
                                    best = d2;
                                    sx = w[0];
                                    sy = w[1];
                                    sz = w[2];
                                    bestF = f;
                                    bestCode = (int) w[3];
                                }
                            }
                        }
                    }
                }
                // Lower bound on the distance to any cell outside the visited block: beyond one of its faces in one
                // axis, and inside the grid (so at least the distance outside the grid) in the other two.
                double lb = Double.POSITIVE_INFINITY;
                lb = Math.min(lb, faceBound(0, x, c0, r, out1 * out1 + out2 * out2));
                lb = Math.min(lb, faceBound(1, y, c1, r, out0 * out0 + out2 * out2));
                lb = Math.min(lb, faceBound(2, z, c2, r, out0 * out0 + out1 * out1));
                if (lb == Double.POSITIVE_INFINITY || best <= lb * lb) {
                    break;
                }
            }
            double[] src = bestCode == 0 ? fn : bestCode <= 3 ? vn : en;
            int off = bestCode == 0 ? 3 * bestF : bestCode <= 3 ? 3 * tri[3 * bestF + bestCode - 1]
                : 9 * bestF + 3 * (bestCode - 4);
            double side = sx * src[off] + sy * src[off + 1] + sz * src[off + 2];
            double d = Math.sqrt(best);
            return side < 0 ? -d : side > 0 ? d : 0;
        }
    }

    /** Inside/outside and distance for points near a centre, from a few candidate facets. */
    public final class Local {
        private final int[] cand;
        private final double[] w = new double[4];
        /** Far mode (surface farther than the radius from the centre): centre, its distance and inside flag. */
        private final double cx;
        private final double cy;
        private final double cz;
        private final double dc;
        private final double status;
        private final boolean exact;

        private Local(int[] cand, double cx, double cy, double cz, double dc, double status, boolean exact) {
            this.exact = exact;
            this.cand = cand;
            this.cx = cx;
            this.cy = cy;
            this.cz = cz;
            this.dc = dc;
            this.status = status;
        }

        /**
         * A narrower view for points within {@code radius} of {@code (x, y, z)}, a neighbourhood inside this view's
         * own; built from this view's candidate facets only.
         */
        public Local near(double x, double y, double z, double radius) {
            if (cand == null) {
                return this;
            }
            double[] o = new double[2];
            windingAndDistance(x, y, z, o);
            double d = o[1];
            if (d > radius && !exact) {
                return new Local(null, x, y, z, d, o[0] > 0.5 ? 1.0 : 0.0, false);
            }
            double lim = (d + 2 * radius) * (d + 2 * radius) * (1 + 1e-12);
            int[] buf = new int[cand.length];
            int n = 0;
            for (int f : cand) {
                if (distanceSquared(f, x, y, z, null) <= lim) {
                    buf[n++] = f;
                }
            }
            return new Local(java.util.Arrays.copyOf(buf, n), x, y, z, d, Double.NaN, exact);
        }

        /**
         * For a point within the radius given to {@link #near}: {@code out[0]} = 1 inside, 0 outside (½ exactly on
         * the surface), {@code out[1]} = distance to the surface, m (modified). Not thread-safe (own scratch).
         */
        public void windingAndDistance(double x, double y, double z, double[] out) {
            if (cand == null) {
                // The surface does not reach into the neighbourhood: same side as the centre; the distance given is
                // the lower bound d_c − |p − c| (a conservative value for the callers' "farther than" tests).
                double dx = x - cx;
                double dy = y - cy;
                double dz = z - cz;
                out[0] = status;
                out[1] = Math.max(0, dc - Math.sqrt(dx * dx + dy * dy + dz * dz));
                return;
            }
            double best = Double.POSITIVE_INFINITY;
            double sx = 0;
            double sy = 0;
            double sz = 0;
            double nx = 0;
            double ny = 0;
            double nz = 0;
            for (int f : cand) {
                double d2 = distanceSquared(f, x, y, z, w);
                if (d2 < best) {
                    best = d2;
                    sx = w[0];
                    sy = w[1];
                    sz = w[2];
                    int code = (int) w[3];
                    double[] src = code == 0 ? fn : code <= 3 ? vn : en;
                    int o = code == 0 ? 3 * f : code <= 3 ? 3 * tri[3 * f + code - 1] : 9 * f + 3 * (code - 4);
                    nx = src[o];
                    ny = src[o + 1];
                    nz = src[o + 2];
                }
            }
            double side = sx * nx + sy * ny + sz * nz;
            out[0] = side < 0 ? 1.0 : side > 0 ? 0.0 : 0.5;
            out[1] = Math.sqrt(best);
        }
    }

    /**
     * A local view valid for points within {@code radius} of {@code (x, y, z)}: keeps the facets that can be nearest
     * to such a point (distance from the centre at most d + 2·radius, d the centre's distance to the surface); when
     * the surface lies farther than {@code radius} (d &gt; radius), every such point is on the centre's side and the
     * view reports that side and a lower bound of the distance.
     */
    public Local near(double x, double y, double z, double radius) {
        return near(x, y, z, radius, false);
    }

    /** As {@link #near(double, double, double, double)}; {@code exactDistance} keeps exact distances far away too. */
    public Local near(double x, double y, double z, double radius, boolean exactDistance) {
        double d = distance(x, y, z);
        if (d > radius && !exactDistance) {
            return new Local(null, x, y, z, d, winding(x, y, z) > 0.5 ? 1.0 : 0.0, false);
        }
        double lim = (d + 2 * radius) * (d + 2 * radius) * (1 + 1e-12);
        int[] buf = new int[16];
        int n = 0;
        for (int f = 0; f < facets; f++) {
            if (distanceSquared(f, x, y, z, null) <= lim) {
                if (n == buf.length) {
                    buf = java.util.Arrays.copyOf(buf, 2 * n);
                }
                buf[n++] = f;
            }
        }
        return new Local(java.util.Arrays.copyOf(buf, n), x, y, z, d, Double.NaN, exactDistance);
    }

    /** Winding number of the surface about {@code (x, y, z)}: ≈1 inside, ≈0 outside, ½ on the surface. */
    public double winding(double x, double y, double z) {
        double sum = 0;
        for (int f = 0; f < facets; f++) {
            sum += FacetGeometry.solidAngle(xyz, tri, f, x, y, z);
        }
        return sum / (4 * Math.PI);
    }

    /** True when the winding number about the point exceeds ½. */
    public boolean inside(double x, double y, double z) {
        return winding(x, y, z) > 0.5;
    }

    /**
     * Winding number and unsigned distance to the surface in one pass.
     *
     * @param out receives {@code out[0]} = winding number, {@code out[1]} = distance, m (modified)
     */
    public void windingAndDistance(double x, double y, double z, double[] out) {
        double sum = 0;
        double best = Double.POSITIVE_INFINITY;
        for (int f = 0; f < facets; f++) {
            sum += FacetGeometry.solidAngle(xyz, tri, f, x, y, z);
            double d2 = distanceSquared(f, x, y, z, null);
            if (d2 < best) {
                best = d2;
            }
        }
        out[0] = sum / (4 * Math.PI);
        out[1] = Math.sqrt(best);
    }

    /** Unsigned distance from the point to the surface, m. */
    public double distance(double x, double y, double z) {
        double best = Double.POSITIVE_INFINITY;
        for (int f = 0; f < facets; f++) {
            best = Math.min(best, distanceSquared(f, x, y, z, null));
        }
        return Math.sqrt(best);
    }

    /**
     * Largest ray parameter {@code t > 0} at which {@code o + t·d} crosses the surface, or NaN when the ray misses.
     * Beyond it the ray runs outside the body.
     */
    public double farthestHit(double ox, double oy, double oz, double dx, double dy, double dz) {
        double best = Double.NaN;
        for (int f = 0; f < facets; f++) {
            double t = FacetGeometry.rayHit(xyz, tri, f, ox, oy, oz, dx, dy, dz, 0);
            if (t > 0 && !(t <= best)) {
                best = t;
            }
        }
        return best;
    }

    /** Squared distance from the point to facet {@code f} ({@link FacetGeometry#distanceSquared}). */
    private double distanceSquared(int f, double px, double py, double pz, double[] fw) {
        return FacetGeometry.distanceSquared(xyz, tri, f, px, py, pz, fw);
    }
}
