package dev.cairn.gravity;

/**
 * Closed-form potential and attraction of a homogeneous right rectangular prism, written in the test code
 * independently of {@link PolyhedronField}: Nagy, D., Papp, G. &amp; Benedek, J. (2000) "The gravitational potential
 * and its derivatives for the prism", J. Geodesy 74:552–560 (corrections J. Geodesy 76:475, 2002); formula as
 * transcribed in shared references §2.
 *
 * <p>With X = ξ−x_p, Y = η−y_p, Z = ζ−z_p (prism corner minus field point) and r = |(X,Y,Z)|:
 * K = XY ln(Z+r) + YZ ln(X+r) + ZX ln(Y+r) − X²/2 atan(YZ/(Xr)) − Y²/2 atan(ZX/(Yr)) − Z²/2 atan(XY/(Zr)),
 * U = Gρ Σ (−1)^(i+j+k) K(X_i, Y_j, Z_k); g_x = −Gρ Σ (−1)^(i+j+k) [Y ln(Z+r) + Z ln(Y+r) − X atan(YZ/(Xr))],
 * g_y, g_z cyclically. Terms with a zero prefactor are 0 (their limit); {@code ln(w+r)} for w &lt; 0 is evaluated as
 * {@code ln((r²−w²)/(r−w))} to avoid cancellation. Plain atan, not atan2. U &gt; 0, g = ∇U.
 */
final class PrismClosedForm {
    private PrismClosedForm() {
    }

    /**
     * @param gRho G·ρ, SI
     * @param box  {@code [x1, y1, z1, x2, y2, z2]}, m
     * @return {@code [U, gx, gy, gz]}
     */
    static double[] field(double gRho, double[] box, double xp, double yp, double zp) {
        double u = 0;
        double gx = 0;
        double gy = 0;
        double gz = 0;
        for (int i = 0; i < 2; i++) {
            double x = box[3 * i] - xp;
            for (int j = 0; j < 2; j++) {
                double y = box[1 + 3 * j] - yp;
                for (int k = 0; k < 2; k++) {
                    double z = box[2 + 3 * k] - zp;
                    // 1-based (i+1, j+1, k+1): (−1)^(i+j+k+3) = +1 when i+j+k is odd (upper corner i=j=k=1: +).
                    double s = ((i + j + k) % 2 == 1) ? 1 : -1;
                    double r = Math.sqrt(x * x + y * y + z * z);
                    double lx = ln(x, r, y * y + z * z);
                    double ly = ln(y, r, z * z + x * x);
                    double lz = ln(z, r, x * x + y * y);
                    double ax = x == 0 ? 0 : Math.atan(y * z / (x * r));
                    double ay = y == 0 ? 0 : Math.atan(z * x / (y * r));
                    double az = z == 0 ? 0 : Math.atan(x * y / (z * r));
                    double kk = term(x * y, lz) + term(y * z, lx) + term(z * x, ly)
                        - 0.5 * x * x * ax - 0.5 * y * y * ay - 0.5 * z * z * az;
                    u += s * kk;
                    gx -= s * (term(y, lz) + term(z, ly) - x * ax);
                    gy -= s * (term(z, lx) + term(x, lz) - y * ay);
                    gz -= s * (term(x, ly) + term(y, lx) - z * az);
                }
            }
        }
        return new double[] {gRho * u, gRho * gx, gRho * gy, gRho * gz};
    }

    /** {@code ln(w + r)} with {@code others = r² − w²}, cancellation-free for w &lt; 0. */
    private static double ln(double w, double r, double others) {
        if (w >= 0) {
            return Math.log(w + r);
        }
        return Math.log(others / (r - w));
    }

    /** {@code a·l}, 0 when the prefactor {@code a} is 0 (the limit of the product). */
    private static double term(double a, double l) {
        return a == 0 ? 0 : a * l;
    }
}
