package dev.cairn.mesh;

/**
 * Per-facet geometric primitives on the flat mesh arrays ({@code xyz} metres, {@code tri} vertex indices), shared by
 * the mesh checks, the mascon generator and the survey maps. Allocation-free.
 */
public final class FacetGeometry {
    private FacetGeometry() {
    }

    /**
     * Six times the signed volume of the tetrahedron (o, P1, P2, P3) of facet {@code f}: (P1−o)·((P2−o)×(P3−o)),
     * cubic metres. Summed over a closed surface it is six times the enclosed volume, positive for outward facets
     * (Tonon 2005, J. Math. Stat. 1(1):8–11).
     */
    public static double signedVolume6(double[] xyz, int[] tri, int f, double ox, double oy, double oz) {
        int a = 3 * tri[3 * f];
        int b = 3 * tri[3 * f + 1];
        int c = 3 * tri[3 * f + 2];
        double ax = xyz[a] - ox;
        double ay = xyz[a + 1] - oy;
        double az = xyz[a + 2] - oz;
        double bx = xyz[b] - ox;
        double by = xyz[b + 1] - oy;
        double bz = xyz[b + 2] - oz;
        double cx = xyz[c] - ox;
        double cy = xyz[c + 1] - oy;
        double cz = xyz[c + 2] - oz;
        return ax * (by * cz - bz * cy) + ay * (bz * cx - bx * cz) + az * (bx * cy - by * cx);
    }

    /**
     * Signed solid angle (steradians) that facet {@code f} subtends at {@code (px, py, pz)}: positive when the point
     * sees the facet's back (inside of an outward-oriented surface). Van Oosterom, A. &amp; Strackee, J. (1983) The
     * solid angle of a plane triangle, IEEE Trans. Biomed. Eng. BME-30(2):125–126. Summed over a closed outward
     * surface: 4π inside, 0 outside.
     */
    public static double solidAngle(double[] xyz, int[] tri, int f, double px, double py, double pz) {
        int a = 3 * tri[3 * f];
        int b = 3 * tri[3 * f + 1];
        int c = 3 * tri[3 * f + 2];
        double ax = xyz[a] - px;
        double ay = xyz[a + 1] - py;
        double az = xyz[a + 2] - pz;
        double bx = xyz[b] - px;
        double by = xyz[b + 1] - py;
        double bz = xyz[b + 2] - pz;
        double cx = xyz[c] - px;
        double cy = xyz[c + 1] - py;
        double cz = xyz[c + 2] - pz;
        double la = Math.sqrt(ax * ax + ay * ay + az * az);
        double lb = Math.sqrt(bx * bx + by * by + bz * bz);
        double lc = Math.sqrt(cx * cx + cy * cy + cz * cz);
        double num = ax * (by * cz - bz * cy) + ay * (bz * cx - bx * cz) + az * (bx * cy - by * cx);
        double den = la * lb * lc + la * (bx * cx + by * cy + bz * cz) + lb * (cx * ax + cy * ay + cz * az)
            + lc * (ax * bx + ay * by + az * bz);
        return 2 * Math.atan2(num, den);
    }

    /**
     * Ray {@code o + t·d} against facet {@code f} (Möller, T. &amp; Trumbore, B. (1997) Fast, minimum storage
     * ray-triangle intersection, J. Graphics Tools 2(1):21–28).
     *
     * @param edgeTolerance how far outside the triangle (in barycentric units) still counts as a hit; 0 for exact
     * @return the ray parameter {@code t > 0} of the crossing, or NaN when the ray misses or runs parallel to the
     *         facet's plane
     */
    public static double rayHit(double[] xyz, int[] tri, int f, double ox, double oy, double oz, double dx, double dy,
                                double dz, double edgeTolerance) {
        int a = 3 * tri[3 * f];
        int b = 3 * tri[3 * f + 1];
        int c = 3 * tri[3 * f + 2];
        double e1x = xyz[b] - xyz[a];
        double e1y = xyz[b + 1] - xyz[a + 1];
        double e1z = xyz[b + 2] - xyz[a + 2];
        double e2x = xyz[c] - xyz[a];
        double e2y = xyz[c + 1] - xyz[a + 1];
        double e2z = xyz[c + 2] - xyz[a + 2];
        double px = dy * e2z - dz * e2y;
        double py = dz * e2x - dx * e2z;
        double pz = dx * e2y - dy * e2x;
        double det = e1x * px + e1y * py + e1z * pz;
        if (det == 0) {
            return Double.NaN; // exact zero: ray parallel to the facet's plane, no single crossing
        }
        double inv = 1 / det;
        double tx = ox - xyz[a];
        double ty = oy - xyz[a + 1];
        double tz = oz - xyz[a + 2];
        double u = (tx * px + ty * py + tz * pz) * inv;
        if (u < -edgeTolerance || u > 1 + edgeTolerance) {
            return Double.NaN;
        }
        double qx = ty * e1z - tz * e1y;
        double qy = tz * e1x - tx * e1z;
        double qz = tx * e1y - ty * e1x;
        double v = (dx * qx + dy * qy + dz * qz) * inv;
        if (v < -edgeTolerance || u + v > 1 + edgeTolerance) {
            return Double.NaN;
        }
        double t = (e2x * qx + e2y * qy + e2z * qz) * inv;
        return t > 0 ? t : Double.NaN;
    }
}
