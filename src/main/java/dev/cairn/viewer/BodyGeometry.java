package dev.cairn.viewer;

import dev.cairn.body.BodyModel;
import dev.cairn.mass.MassProperties;
import dev.cairn.mesh.TriangleMesh;
import java.util.HashMap;
import java.util.Map;

/**
 * The shape as the viewer draws it: vertices shifted so that the centre of mass is the origin (float precision stays
 * good for bodies far from the model origin), plus the directions the overlays need. Metres, model axes.
 *
 * @param mesh          the model's mesh (metres, outward, model frame)
 * @param centreOfMass  centre of mass, model frame, metres (constant density)
 * @param principalAxes unit principal axes, row k = axis of the k-th smallest moment (row-major 3×3)
 * @param spinAxis      unit spin pole, model frame
 * @param radius        largest vertex distance from the centre of mass, metres
 * @param name          display name of the body
 */
public record BodyGeometry(TriangleMesh mesh, double[] centreOfMass, double[] principalAxes, double[] spinAxis,
                           double radius, String name) {

    /** Geometry of a loaded model (mass properties at any density: the centre of mass does not depend on it). */
    public static BodyGeometry of(BodyModel body) {
        MassProperties mp = body.massProperties();
        return of(body.mesh(), mp.centerOfMass(), mp.principalAxes(), body.spin().axis(), body.name());
    }

    /** Geometry from parts; the radius is computed. */
    public static BodyGeometry of(TriangleMesh mesh, double[] com, double[] axes, double[] spin, String name) {
        double[] xyz = mesh.xyz();
        double r2 = 0;
        for (int i = 0; i < xyz.length; i += 3) {
            double dx = xyz[i] - com[0];
            double dy = xyz[i + 1] - com[1];
            double dz = xyz[i + 2] - com[2];
            r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
        }
        return new BodyGeometry(mesh, com.clone(), axes.clone(), spin.clone(), Math.sqrt(r2), name);
    }

    /** Vertices relative to the centre of mass as floats, {@code [x0, y0, z0, ...]} (scene frame). */
    public float[] scenePoints() {
        double[] xyz = mesh.xyz();
        float[] p = new float[xyz.length];
        for (int i = 0; i < xyz.length; i += 3) {
            p[i] = (float) (xyz[i] - centreOfMass[0]);
            p[i + 1] = (float) (xyz[i + 1] - centreOfMass[1]);
            p[i + 2] = (float) (xyz[i + 2] - centreOfMass[2]);
        }
        return p;
    }

    /** A model-frame point in scene coordinates (relative to the centre of mass). */
    public double[] toScene(double[] p) {
        return new double[] {p[0] - centreOfMass[0], p[1] - centreOfMass[1], p[2] - centreOfMass[2]};
    }

    /** Centroid of facet {@code f}, scene frame. */
    public double[] facetCentroidScene(int f) {
        int[] tri = mesh.tri();
        double[] xyz = mesh.xyz();
        double[] c = new double[3];
        for (int k = 0; k < 3; k++) {
            int v = 3 * tri[3 * f + k];
            for (int i = 0; i < 3; i++) {
                c[i] += xyz[v + i] / 3;
            }
        }
        return toScene(c);
    }

    /**
     * Latitude/longitude graticule drawn on the surface itself: the contour lines of planetocentric latitude and
     * longitude about the centre of mass (model z is the pole, longitude from +x towards +y) at every
     * {@code stepDeg} degrees, found facet by facet (marching triangles), lifted outward by {@code lift} (fraction of
     * the vertex radius) so they do not sink into the surface.
     *
     * @return segments {@code [x1, y1, z1, x2, y2, z2, ...]}, scene frame
     */
    public float[] graticule(double stepDeg, double lift) {
        float[] pts = scenePoints();
        int nv = pts.length / 3;
        double[] lat = new double[nv];
        double[] lon = new double[nv];
        for (int i = 0; i < nv; i++) {
            double x = pts[3 * i];
            double y = pts[3 * i + 1];
            double z = pts[3 * i + 2];
            lat[i] = Math.toDegrees(Math.atan2(z, Math.hypot(x, y)));
            lon[i] = Math.toDegrees(Math.atan2(y, x));
        }
        FloatList out = new FloatList();
        int[] tri = mesh.tri();
        double[] h = new double[3];
        int[] v = new int[3];
        for (int f = 0; f < tri.length / 3; f++) {
            for (int k = 0; k < 3; k++) {
                v[k] = tri[3 * f + k];
            }
            // latitude lines, poles excluded
            for (int k = 0; k < 3; k++) {
                h[k] = lat[v[k]];
            }
            contour(pts, v, h, stepDeg, -90 + stepDeg, 90 - stepDeg, lift, out);
            // longitude lines: unwrap across the ±180° seam; skip facets around a pole
            double mn = Math.min(lon[v[0]], Math.min(lon[v[1]], lon[v[2]]));
            double mx = Math.max(lon[v[0]], Math.max(lon[v[1]], lon[v[2]]));
            for (int k = 0; k < 3; k++) {
                h[k] = lon[v[k]];
                if (mx - mn > 180 && h[k] < 0) {
                    h[k] += 360;
                }
            }
            double mn2 = Math.min(h[0], Math.min(h[1], h[2]));
            double mx2 = Math.max(h[0], Math.max(h[1], h[2]));
            if (mx2 - mn2 < 90 && Math.abs(lat[v[0]]) < 89 && Math.abs(lat[v[1]]) < 89 && Math.abs(lat[v[2]]) < 89) {
                contour(pts, v, h, stepDeg, -180, 360 - stepDeg / 2, lift, out);
            }
        }
        return out.toArray();
    }

    /** Marching triangles: for each level c = k·step in [from, to], the segment where the linear h crosses c. */
    private static void contour(float[] pts, int[] v, double[] h, double step, double from, double to, double lift,
                                FloatList out) {
        double mn = Math.min(h[0], Math.min(h[1], h[2]));
        double mx = Math.max(h[0], Math.max(h[1], h[2]));
        for (double c = Math.ceil(Math.max(mn, from) / step) * step; c <= Math.min(mx, to); c += step) {
            int found = 0;
            double[] seg = new double[6];
            for (int e = 0; e < 3 && found < 2; e++) {
                int a = e;
                int b = (e + 1) % 3;
                double da = h[a] - c;
                double db = h[b] - c;
                // a crossing: one end strictly below, the other at or above (each crossing counted once)
                if ((da < 0) != (db < 0)) {
                    double t = da / (da - db);
                    for (int i = 0; i < 3; i++) {
                        double pa = pts[3 * v[a] + i];
                        double pb = pts[3 * v[b] + i];
                        seg[3 * found + i] = (pa + t * (pb - pa)) * (1 + lift);
                    }
                    found++;
                }
            }
            if (found == 2) {
                for (double s : seg) {
                    out.add((float) s);
                }
            }
        }
    }

    /**
     * Outline of a set of facets: the edges that belong to exactly one facet of the set, lifted outward by
     * {@code lift} (fraction of the vertex radius).
     *
     * @return segments {@code [x1, y1, z1, x2, y2, z2, ...]}, scene frame
     */
    public float[] outline(int[] facets, double lift) {
        int[] tri = mesh.tri();
        Map<Long, Integer> count = new HashMap<>();
        for (int f : facets) {
            for (int k = 0; k < 3; k++) {
                int a = tri[3 * f + k];
                int b = tri[3 * f + (k + 1) % 3];
                long key = ((long) Math.min(a, b) << 32) | Math.max(a, b);
                count.merge(key, 1, Integer::sum);
            }
        }
        FloatList out = new FloatList();
        double[] xyz = mesh.xyz();
        for (Map.Entry<Long, Integer> e : count.entrySet()) {
            if (e.getValue() != 1) {
                continue;
            }
            int a = (int) (e.getKey() >>> 32);
            int b = (int) (e.getKey() & 0xFFFFFFFFL);
            for (int v : new int[] {a, b}) {
                for (int i = 0; i < 3; i++) {
                    out.add((float) ((xyz[3 * v + i] - centreOfMass[i]) * (1 + lift)));
                }
            }
        }
        return out.toArray();
    }

    /**
     * A coarse stand-in for the mesh, shown while the user drags on large models: vertex clustering on a grid of
     * {@code cells} cells along the longest side of the bounding box (Rossignac, J. &amp; Borrel, P. 1993,
     * "Multi-resolution 3D approximations for rendering complex scenes", Modeling in Computer Graphics, 455–465):
     * vertices in one cell merge to their mean, facets that collapse are dropped, the rest keep their source facet
     * (for colour). Scene frame, metres.
     *
     * @param points      proxy vertices {@code [x, y, z, ...]}
     * @param tri         proxy facets (vertex indices)
     * @param sourceFacet for each proxy facet, the original facet it came from
     */
    public record Proxy(float[] points, int[] tri, int[] sourceFacet) {
        public int facetCount() {
            return sourceFacet.length;
        }
    }

    /** The clustered proxy (see {@link Proxy}). */
    public Proxy clustered(int cells) {
        float[] p = scenePoints();
        int nv = p.length / 3;
        float[] lo = {Float.MAX_VALUE, Float.MAX_VALUE, Float.MAX_VALUE};
        float[] hi = {-Float.MAX_VALUE, -Float.MAX_VALUE, -Float.MAX_VALUE};
        for (int i = 0; i < p.length; i += 3) {
            for (int k = 0; k < 3; k++) {
                lo[k] = Math.min(lo[k], p[i + k]);
                hi[k] = Math.max(hi[k], p[i + k]);
            }
        }
        double extent = Math.max(hi[0] - lo[0], Math.max(hi[1] - lo[1], hi[2] - lo[2]));
        double inv = cells / (extent > 0 ? extent : 1);
        // open-addressing hash from cell key to cluster index
        int cap = Integer.highestOneBit(Math.max(16, nv) * 2) * 2;
        long[] keys = new long[cap];
        int[] vals = new int[cap];
        java.util.Arrays.fill(vals, -1);
        int[] cluster = new int[nv];
        double[] sum = new double[3 * nv];
        int[] count = new int[nv];
        int nc = 0;
        for (int i = 0; i < nv; i++) {
            long ix = (long) ((p[3 * i] - lo[0]) * inv);
            long iy = (long) ((p[3 * i + 1] - lo[1]) * inv);
            long iz = (long) ((p[3 * i + 2] - lo[2]) * inv);
            long key = (ix << 42) | (iy << 21) | iz;
            int h = (int) ((key * 0x9E3779B97F4A7C15L) >>> 32) & (cap - 1);
            while (vals[h] >= 0 && keys[h] != key) {
                h = (h + 1) & (cap - 1);
            }
            if (vals[h] < 0) {
                keys[h] = key;
                vals[h] = nc++;
            }
            int c = vals[h];
            cluster[i] = c;
            sum[3 * c] += p[3 * i];
            sum[3 * c + 1] += p[3 * i + 1];
            sum[3 * c + 2] += p[3 * i + 2];
            count[c]++;
        }
        float[] pts = new float[3 * nc];
        for (int c = 0; c < nc; c++) {
            for (int k = 0; k < 3; k++) {
                pts[3 * c + k] = (float) (sum[3 * c + k] / count[c]);
            }
        }
        int[] tri = mesh.tri();
        int nf = tri.length / 3;
        int[] outTri = new int[tri.length];
        int[] src = new int[nf];
        int m = 0;
        for (int f = 0; f < nf; f++) {
            int a = cluster[tri[3 * f]];
            int b = cluster[tri[3 * f + 1]];
            int c = cluster[tri[3 * f + 2]];
            if (a == b || b == c || a == c) {
                continue; // collapsed
            }
            outTri[3 * m] = a;
            outTri[3 * m + 1] = b;
            outTri[3 * m + 2] = c;
            src[m++] = f;
        }
        return new Proxy(pts, java.util.Arrays.copyOf(outTri, 3 * m), java.util.Arrays.copyOf(src, m));
    }

    /** A growable float array (no boxing). */
    static final class FloatList {
        private float[] a = new float[1024];
        private int n;

        void add(float x) {
            if (n == a.length) {
                a = java.util.Arrays.copyOf(a, 2 * n);
            }
            a[n++] = x;
        }

        float[] toArray() {
            return java.util.Arrays.copyOf(a, n);
        }
    }
}
