package dev.cairn.surface;

import dev.cairn.mesh.TriangleMesh;

/**
 * Brute-force geometry for the survey tests, written independently of {@code FacetGeometry}: a different algorithm
 * for each query, O(F) per query.
 *
 * <p>Point-to-triangle distance: project the point on the facet's plane; if the projection is inside the triangle
 * (same-side test against the three edges) the distance is the distance to the plane, else the nearest point lies on
 * the boundary and the distance is the least of the three point-to-segment distances (clamped projection on each
 * edge). Both facts are textbook geometry (the triangle is convex), common practice, no source. Ray–triangle: the
 * ray's crossing with the facet's plane, t = ((a − o)·n)/(d·n), tested for being inside by the same-side test.
 */
final class BruteGeometry {
    private BruteGeometry() {
    }

    private static double[] v(TriangleMesh m, int f, int k) {
        double[] xyz = m.xyz();
        int i = 3 * m.tri()[3 * f + k];
        return new double[] {xyz[i], xyz[i + 1], xyz[i + 2]};
    }

    private static double[] sub(double[] a, double[] b) {
        return new double[] {a[0] - b[0], a[1] - b[1], a[2] - b[2]};
    }

    private static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }

    private static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }

    private static double segment(double[] p, double[] a, double[] b) {
        double[] ab = sub(b, a);
        double t = Math.max(0, Math.min(1, dot(sub(p, a), ab) / dot(ab, ab)));
        double[] q = {a[0] + t * ab[0], a[1] + t * ab[1], a[2] + t * ab[2]};
        return Math.sqrt(dot(sub(p, q), sub(p, q)));
    }

    private static boolean inside(double[] x, double[] a, double[] b, double[] c, double[] n) {
        return dot(cross(sub(b, a), sub(x, a)), n) >= 0 && dot(cross(sub(c, b), sub(x, b)), n) >= 0
            && dot(cross(sub(a, c), sub(x, c)), n) >= 0;
    }

    /** Distance from p to facet f, m. */
    static double distance(TriangleMesh m, int f, double[] p) {
        double[] a = v(m, f, 0);
        double[] b = v(m, f, 1);
        double[] c = v(m, f, 2);
        double[] n = cross(sub(b, a), sub(c, a));
        double ln = Math.sqrt(dot(n, n));
        n = new double[] {n[0] / ln, n[1] / ln, n[2] / ln};
        double h = dot(sub(p, a), n);
        double[] q = {p[0] - h * n[0], p[1] - h * n[1], p[2] - h * n[2]};
        if (inside(q, a, b, c, n)) {
            return Math.abs(h);
        }
        return Math.min(segment(p, a, b), Math.min(segment(p, b, c), segment(p, c, a)));
    }

    /**
     * Distance from p to facet f when it can be at most {@code limit}; otherwise a lower bound above {@code limit}
     * (distance to the facet's centroid minus the largest centroid-to-vertex distance: the triangle lies in that
     * sphere). Saves the full computation for far facets.
     */
    static double distanceBelow(TriangleMesh m, int f, double[] p, double limit) {
        double[] xyz = m.xyz();
        int[] tri = m.tri();
        double cx = 0;
        double cy = 0;
        double cz = 0;
        for (int k = 0; k < 3; k++) {
            int i = 3 * tri[3 * f + k];
            cx += xyz[i] / 3;
            cy += xyz[i + 1] / 3;
            cz += xyz[i + 2] / 3;
        }
        double rad = 0;
        for (int k = 0; k < 3; k++) {
            int i = 3 * tri[3 * f + k];
            rad = Math.max(rad, Math.sqrt((xyz[i] - cx) * (xyz[i] - cx) + (xyz[i + 1] - cy) * (xyz[i + 1] - cy)
                + (xyz[i + 2] - cz) * (xyz[i + 2] - cz)));
        }
        double lower = Math.sqrt((p[0] - cx) * (p[0] - cx) + (p[1] - cy) * (p[1] - cy) + (p[2] - cz) * (p[2] - cz))
            - rad;
        return lower > limit ? lower : distance(m, f, p);
    }

    /** Ray parameter t &gt; 0 where o + t d crosses facet f, or NaN. */
    static double ray(TriangleMesh m, int f, double[] o, double[] d) {
        double[] a = v(m, f, 0);
        double[] b = v(m, f, 1);
        double[] c = v(m, f, 2);
        double[] n = cross(sub(b, a), sub(c, a));
        double dn = dot(d, n);
        if (dn == 0) {
            return Double.NaN;
        }
        double t = dot(sub(a, o), n) / dn;
        if (!(t > 0)) {
            return Double.NaN;
        }
        double[] x = {o[0] + t * d[0], o[1] + t * d[1], o[2] + t * d[2]};
        return inside(x, a, b, c, n) ? t : Double.NaN;
    }

    /** Centroid of facet f. */
    static double[] centroid(TriangleMesh m, int f) {
        double[] a = v(m, f, 0);
        double[] b = v(m, f, 1);
        double[] c = v(m, f, 2);
        return new double[] {(a[0] + b[0] + c[0]) / 3, (a[1] + b[1] + c[1]) / 3, (a[2] + b[2] + c[2]) / 3};
    }

    /** Least distance from p to a vertex or the centroid of facet f (the rule before the exact one). */
    static double vertexOrCentroidDistance(TriangleMesh m, int f, double[] p) {
        double best = Math.sqrt(dot(sub(centroid(m, f), p), sub(centroid(m, f), p)));
        for (int k = 0; k < 3; k++) {
            double[] d = sub(v(m, f, k), p);
            best = Math.min(best, Math.sqrt(dot(d, d)));
        }
        return best;
    }
}
