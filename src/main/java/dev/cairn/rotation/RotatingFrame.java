package dev.cairn.rotation;

/**
 * The body-fixed frame of a uniformly spinning body: centrifugal potential and acceleration, frame velocity, and
 * latitude/longitude about the spin pole.
 *
 * <p>The body spins at rate ω about the unit axis ω̂ through the centre of mass {@code c}. With
 * {@code r⊥ = (r − c) − ω̂ (ω̂·(r − c))}, the part of the position perpendicular to the axis, the rotating-frame
 * (effective) potential and acceleration of a particle at rest in the body frame are
 * <pre>
 *   V    = U + ½ ω² |ω̂ × (r − c)|² = U + ½ ω² |r⊥|²      (m²/s², V &gt; 0 like U)
 *   a_eff = ∇V = g + ω² r⊥                               (m/s², gravity plus centrifugal)
 * </pre>
 * Sign convention: U &gt; 0 and g = ∇U (Werner &amp; Scheeres 1997), so V increases toward the body and a_eff = ∇V.
 * Framework: Scheeres, D.J. (2012) <i>Orbital Motion in Strongly Perturbed Environments</i>, Springer, ch. on the
 * rotating-frame equations (Jacobi integral J = ½|v_rel|² − V), cited from memory. The Coriolis term −2ω×v_rel
 * acts only on moving particles and is not part of V.
 *
 * <p>Latitude and longitude are body-fixed and measured about the spin pole: latitude is the angle of {@code r − c}
 * above the equatorial plane; east longitude is measured in the right-handed sense about ω̂ from the projection of
 * the model +x axis onto the equatorial plane (from +y when the pole is along ±x). Both in degrees, longitude in
 * (−180, 180]. For the default pole +z these are the usual model-frame angles.
 *
 * <p>Immutable and thread-safe; methods take and fill primitive arrays (no allocation per call).
 */
public final class RotatingFrame {
    private final double omega;
    private final double ax;
    private final double ay;
    private final double az;
    private final double cx;
    private final double cy;
    private final double cz;
    /** Equatorial basis: e1 (longitude 0), e2 = ω̂ × e1 (longitude 90° east). */
    private final double e1x;
    private final double e1y;
    private final double e1z;
    private final double e2x;
    private final double e2y;
    private final double e2z;

    /**
     * @param spin   spin state (rate and unit pole, model frame)
     * @param centre centre of mass, metres, model frame (the spin axis passes through it)
     */
    public RotatingFrame(SpinState spin, double[] centre) {
        this.omega = spin.omega();
        double[] a = spin.axis();
        ax = a[0];
        ay = a[1];
        az = a[2];
        cx = centre[0];
        cy = centre[1];
        cz = centre[2];
        // Reference direction for longitude 0: model +x projected onto the equator, else +y.
        double rx = 1;
        double ry = 0;
        double rz = 0;
        if (Math.abs(ax) > 0.999) {
            rx = 0;
            ry = 1;
        }
        double d = rx * ax + ry * ay + rz * az;
        double ux = rx - d * ax;
        double uy = ry - d * ay;
        double uz = rz - d * az;
        double n = Math.sqrt(ux * ux + uy * uy + uz * uz);
        e1x = ux / n;
        e1y = uy / n;
        e1z = uz / n;
        e2x = ay * e1z - az * e1y;
        e2y = az * e1x - ax * e1z;
        e2z = ax * e1y - ay * e1x;
    }

    /** Spin rate ω, rad/s (0 for a body that does not spin). */
    public double omega() {
        return omega;
    }

    /** Unit spin pole, model frame (a copy). */
    public double[] axis() {
        return new double[] {ax, ay, az};
    }

    /** Centre of mass the axis passes through, metres (a copy). */
    public double[] centre() {
        return new double[] {cx, cy, cz};
    }

    /** Distance of {@code (x, y, z)} (m, model frame) from the spin axis, m. */
    public double axisDistance(double x, double y, double z) {
        double px = x - cx;
        double py = y - cy;
        double pz = z - cz;
        double s = px * ax + py * ay + pz * az;
        double qx = px - s * ax;
        double qy = py - s * ay;
        double qz = pz - s * az;
        return Math.sqrt(qx * qx + qy * qy + qz * qz);
    }

    /** Centrifugal potential ½ω²|ω̂×(r − c)|², m²/s² (≥ 0; adds to U in V). */
    public double centrifugalPotential(double x, double y, double z) {
        double d = axisDistance(x, y, z);
        return 0.5 * omega * omega * d * d;
    }

    /**
     * Centrifugal acceleration ω² r⊥ (m/s², pointing away from the axis) at {@code (x, y, z)}, written to
     * {@code out[o..o+2]} (modified).
     */
    public void centrifugalAcceleration(double x, double y, double z, double[] out, int o) {
        double px = x - cx;
        double py = y - cy;
        double pz = z - cz;
        double s = px * ax + py * ay + pz * az;
        double w2 = omega * omega;
        out[o] = w2 * (px - s * ax);
        out[o + 1] = w2 * (py - s * ay);
        out[o + 2] = w2 * (pz - s * az);
    }

    /**
     * Effective potential and acceleration from a gravity sample.
     *
     * @param u   gravitational potential U at the point, m²/s² (U &gt; 0)
     * @param g   gravity g = ∇U at the point, m/s², read from {@code g[go..go+2]}
     * @param out receives {@code V, a_eff,x, a_eff,y, a_eff,z} at {@code out[o..o+3]} (modified)
     */
    public void effective(double x, double y, double z, double u, double[] g, int go, double[] out, int o) {
        double px = x - cx;
        double py = y - cy;
        double pz = z - cz;
        double s = px * ax + py * ay + pz * az;
        double qx = px - s * ax;
        double qy = py - s * ay;
        double qz = pz - s * az;
        double w2 = omega * omega;
        out[o] = u + 0.5 * w2 * (qx * qx + qy * qy + qz * qz);
        out[o + 1] = g[go] + w2 * qx;
        out[o + 2] = g[go + 1] + w2 * qy;
        out[o + 3] = g[go + 2] + w2 * qz;
    }

    /** Speed of the body-fixed point {@code (x, y, z)} in the inertial frame, |ω × (r − c)| = ω|r⊥|, m/s. */
    public double frameSpeed(double x, double y, double z) {
        return omega * axisDistance(x, y, z);
    }

    /** Velocity ω × (r − c) of the body-fixed point in the inertial frame, m/s, into {@code out[o..o+2]}. */
    public void frameVelocity(double x, double y, double z, double[] out, int o) {
        double px = x - cx;
        double py = y - cy;
        double pz = z - cz;
        out[o] = omega * (ay * pz - az * py);
        out[o + 1] = omega * (az * px - ax * pz);
        out[o + 2] = omega * (ax * py - ay * px);
    }

    /** Latitude of {@code (x, y, z)} about the spin pole, degrees in [−90, 90] (0 at the centre itself). */
    public double latitudeDeg(double x, double y, double z) {
        double px = x - cx;
        double py = y - cy;
        double pz = z - cz;
        double s = px * ax + py * ay + pz * az;
        double e = Math.hypot(px * e1x + py * e1y + pz * e1z, px * e2x + py * e2y + pz * e2z);
        return Math.toDegrees(Math.atan2(s, e));
    }

    /** East longitude of {@code (x, y, z)} about the spin pole, degrees in (−180, 180] (0 on the axis). */
    public double longitudeDeg(double x, double y, double z) {
        double px = x - cx;
        double py = y - cy;
        double pz = z - cz;
        return Math.toDegrees(Math.atan2(px * e2x + py * e2y + pz * e2z, px * e1x + py * e1y + pz * e1z));
    }

    /**
     * Unit direction (model frame) of latitude/longitude (degrees) about the pole, into {@code out[o..o+2]}.
     * Inverse of {@link #latitudeDeg}/{@link #longitudeDeg} for directions.
     */
    public void direction(double latDeg, double lonDeg, double[] out, int o) {
        double la = Math.toRadians(latDeg);
        double lo = Math.toRadians(lonDeg);
        double c = Math.cos(la);
        double cl = c * Math.cos(lo);
        double sl = c * Math.sin(lo);
        double s = Math.sin(la);
        out[o] = cl * e1x + sl * e2x + s * ax;
        out[o + 1] = cl * e1y + sl * e2y + s * ay;
        out[o + 2] = cl * e1z + sl * e2z + s * az;
    }
}
