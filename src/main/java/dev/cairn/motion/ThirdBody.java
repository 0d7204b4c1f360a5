package dev.cairn.motion;

/**
 * A third body (e.g. the Sun) as a point mass on a circular orbit about the small body's centre of mass, in the
 * inertial frame: position {@code d (cos(nt) u + sin(nt) (k × u))}, mean motion {@code n = √((GM₃ + GM)/d³)}
 * (Kepler's third law). Its pull enters as the tidal (differential) acceleration
 * {@code GM₃ [(s − p)/|s − p|³ − s/|s|³]}, because the frame's origin falls toward the third body with the small
 * body (e.g. Murray, C.D. &amp; Dermott, S.F. (1999) Solar System Dynamics, §6.2; from memory).
 *
 * @param gm        GM₃ of the third body, m³/s², positive
 * @param distance  orbit radius d, m, positive
 * @param direction unit direction u of the third body at t = 0, inertial frame (normalised here)
 * @param pole      orbit pole k, inertial frame (normalised here; made perpendicular to u)
 */
public record ThirdBody(double gm, double distance, double[] direction, double[] pole) {
    public ThirdBody {
        if (!(gm > 0) || !Double.isFinite(gm) || !(distance > 0) || !Double.isFinite(distance)) {
            throw new IllegalArgumentException("third body: GM and distance must be positive and finite");
        }
        double[] u = unit(direction);
        double[] k = pole.clone();
        double dot = k[0] * u[0] + k[1] * u[1] + k[2] * u[2];
        for (int i = 0; i < 3; i++) {
            k[i] -= dot * u[i];
        }
        direction = u;
        pole = unit(k);
    }

    private static double[] unit(double[] v) {
        double n = Math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
        if (!(n > 0) || !Double.isFinite(n)) {
            throw new IllegalArgumentException("third body: direction and pole must be non-zero, non-parallel");
        }
        return new double[] {v[0] / n, v[1] / n, v[2] / n};
    }
}
