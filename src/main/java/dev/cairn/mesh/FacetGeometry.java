package dev.cairn.mesh;

/**
 * Per-facet geometric primitives on the flat mesh arrays ({@code xyz} metres, {@code tri} vertex indices), shared by
 * the mesh checks, the mascon generator, surface queries and the survey. Allocation-free.
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

    /**
     * Squared distance from {@code (px, py, pz)} to facet {@code f} (its closest point, interior, edge or vertex), by
     * the closest-point construction of Ericson, C. (2005) Real-Time Collision Detection, Morgan Kaufmann, §5.1.5.
     *
     * @param fw when non-null, receives {@code p − q} (q the closest point) in {@code fw[0..2]} and the feature of q
     *           in {@code fw[3]}: 0 face interior, 1/2/3 vertex 1/2/3 of the facet, 4 edge 1–2, 5 edge 2–3, 6 edge 3–1
     * @return |p − q|², m²
     */
    public static double distanceSquared(double[] xyz, int[] tri, int f, double px, double py, double pz,
                                         double[] fw) {
        int ia = 3 * tri[3 * f];
        int ib = 3 * tri[3 * f + 1];
        int ic = 3 * tri[3 * f + 2];
        double ax = xyz[ia];
        double ay = xyz[ia + 1];
        double az = xyz[ia + 2];
        double abx = xyz[ib] - ax;
        double aby = xyz[ib + 1] - ay;
        double abz = xyz[ib + 2] - az;
        double acx = xyz[ic] - ax;
        double acy = xyz[ic + 1] - ay;
        double acz = xyz[ic + 2] - az;
        double apx = px - ax;
        double apy = py - ay;
        double apz = pz - az;
        double d1 = abx * apx + aby * apy + abz * apz;
        double d2 = acx * apx + acy * apy + acz * apz;
        double qx;
        double qy;
        double qz;
        if (d1 <= 0 && d2 <= 0) {
            return feature(fw, apx, apy, apz, 1);
        }
        double bpx = px - xyz[ib];
        double bpy = py - xyz[ib + 1];
        double bpz = pz - xyz[ib + 2];
        double d3 = abx * bpx + aby * bpy + abz * bpz;
        double d4 = acx * bpx + acy * bpy + acz * bpz;
        if (d3 >= 0 && d4 <= d3) {
            return feature(fw, bpx, bpy, bpz, 2);
        }
        double vc = d1 * d4 - d3 * d2;
        if (vc <= 0 && d1 >= 0 && d3 <= 0) {
            double v = d1 / (d1 - d3);
            qx = apx - v * abx;
            qy = apy - v * aby;
            qz = apz - v * abz;
            return feature(fw, qx, qy, qz, 4); // edge AB
        }
        double cpx = px - xyz[ic];
        double cpy = py - xyz[ic + 1];
        double cpz = pz - xyz[ic + 2];
        double d5 = abx * cpx + aby * cpy + abz * cpz;
        double d6 = acx * cpx + acy * cpy + acz * cpz;
        if (d6 >= 0 && d5 <= d6) {
            return feature(fw, cpx, cpy, cpz, 3);
        }
        double vb = d5 * d2 - d1 * d6;
        if (vb <= 0 && d2 >= 0 && d6 <= 0) {
            double w = d2 / (d2 - d6);
            qx = apx - w * acx;
            qy = apy - w * acy;
            qz = apz - w * acz;
            return feature(fw, qx, qy, qz, 6); // edge CA
        }
        double va = d3 * d6 - d5 * d4;
        if (va <= 0 && (d4 - d3) >= 0 && (d5 - d6) >= 0) {
            double w = (d4 - d3) / ((d4 - d3) + (d5 - d6));
            double bcx = xyz[ic] - xyz[ib];
            double bcy = xyz[ic + 1] - xyz[ib + 1];
            double bcz = xyz[ic + 2] - xyz[ib + 2];
            qx = bpx - w * bcx;
            qy = bpy - w * bcy;
            qz = bpz - w * bcz;
            return feature(fw, qx, qy, qz, 5); // edge BC
        }
        double denom = 1 / (va + vb + vc);
        double v = vb * denom;
        double w = vc * denom;
        qx = apx - abx * v - acx * w;
        qy = apy - aby * v - acy * w;
        qz = apz - abz * v - acz * w;
        return feature(fw, qx, qy, qz, 0); // face interior
    }

    /** Stores p − q and the feature code in {@code w} (when non-null); returns |p − q|². */
    private static double feature(double[] w, double x, double y, double z, int code) {
        if (w != null) {
            w[0] = x;
            w[1] = y;
            w[2] = z;
            w[3] = code;
        }
        return x * x + y * y + z * z;
    }
}
