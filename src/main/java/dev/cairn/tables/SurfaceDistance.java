package dev.cairn.tables;

import dev.cairn.mesh.TriangleMesh;

/**
 * Unsigned distance from a point to a triangle mesh, by brute force over the facets (for reports, not hot loops).
 * Closest point on a triangle: Ericson, C. (2005) Real-Time Collision Detection, Morgan Kaufmann, §5.1.5.
 */
final class SurfaceDistance {
    private SurfaceDistance() {
    }

    /** Distance, m, from {@code (px, py, pz)} to the nearest facet of {@code mesh}. */
    static double distance(TriangleMesh mesh, double px, double py, double pz) {
        double[] v = mesh.xyz();
        int[] t = mesh.tri();
        double best = Double.POSITIVE_INFINITY;
        for (int f = 0; f < t.length; f += 3) {
            int a = 3 * t[f];
            int b = 3 * t[f + 1];
            int c = 3 * t[f + 2];
            best = Math.min(best, toTriangle(px, py, pz, v[a], v[a + 1], v[a + 2], v[b], v[b + 1], v[b + 2], v[c],
                v[c + 1], v[c + 2]));
        }
        return Math.sqrt(best);
    }

    /** Squared distance from p to triangle abc (Ericson 2005, ClosestPtPointTriangle). */
    static double toTriangle(double px, double py, double pz, double ax, double ay, double az, double bx, double by,
                             double bz, double cx, double cy, double cz) {
        double abx = bx - ax;
        double aby = by - ay;
        double abz = bz - az;
        double acx = cx - ax;
        double acy = cy - ay;
        double acz = cz - az;
        double apx = px - ax;
        double apy = py - ay;
        double apz = pz - az;
        double d1 = abx * apx + aby * apy + abz * apz;
        double d2 = acx * apx + acy * apy + acz * apz;
        double qx;
        double qy;
        double qz;
        if (d1 <= 0 && d2 <= 0) {
            return apx * apx + apy * apy + apz * apz;
        }
        double bpx = px - bx;
        double bpy = py - by;
        double bpz = pz - bz;
        double d3 = abx * bpx + aby * bpy + abz * bpz;
        double d4 = acx * bpx + acy * bpy + acz * bpz;
        if (d3 >= 0 && d4 <= d3) {
            return bpx * bpx + bpy * bpy + bpz * bpz;
        }
        double vc = d1 * d4 - d3 * d2;
        if (vc <= 0 && d1 >= 0 && d3 <= 0) {
            double w = d1 / (d1 - d3);
            qx = ax + w * abx;
            qy = ay + w * aby;
            qz = az + w * abz;
            return sq(px - qx, py - qy, pz - qz);
        }
        double cpx = px - cx;
        double cpy = py - cy;
        double cpz = pz - cz;
        double d5 = abx * cpx + aby * cpy + abz * cpz;
        double d6 = acx * cpx + acy * cpy + acz * cpz;
        if (d6 >= 0 && d5 <= d6) {
            return cpx * cpx + cpy * cpy + cpz * cpz;
        }
        double vb = d5 * d2 - d1 * d6;
        if (vb <= 0 && d2 >= 0 && d6 <= 0) {
            double w = d2 / (d2 - d6);
            return sq(px - (ax + w * acx), py - (ay + w * acy), pz - (az + w * acz));
        }
        double va = d3 * d6 - d5 * d4;
        if (va <= 0 && (d4 - d3) >= 0 && (d5 - d6) >= 0) {
            double w = (d4 - d3) / ((d4 - d3) + (d5 - d6));
            return sq(px - (bx + w * (cx - bx)), py - (by + w * (cy - by)), pz - (bz + w * (cz - bz)));
        }
        double denom = 1 / (va + vb + vc);
        double v = vb * denom;
        double w = vc * denom;
        return sq(px - (ax + abx * v + acx * w), py - (ay + aby * v + acy * w), pz - (az + abz * v + acz * w));
    }

    private static double sq(double x, double y, double z) {
        return x * x + y * y + z * z;
    }
}
