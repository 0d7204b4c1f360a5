package dev.cairn.rotation;

/**
 * Uniform rotation of a body about a fixed axis through its centre of mass.
 *
 * @param periodSeconds sidereal spin period, s; {@code Double.POSITIVE_INFINITY} for a non-spinning body
 * @param axis          unit spin-pole direction in the model (body-fixed) frame, right-handed sense of rotation
 */
public record SpinState(double periodSeconds, double[] axis) {
    /** A body that does not spin (pole +z). */
    public static final SpinState NONE = new SpinState(Double.POSITIVE_INFINITY, new double[] {0, 0, 1});

    public SpinState {
        if (!(periodSeconds > 0)) {
            throw new IllegalArgumentException("spin period must be positive, got " + periodSeconds);
        }
        double n = Math.sqrt(axis[0] * axis[0] + axis[1] * axis[1] + axis[2] * axis[2]);
        if (!(n > 0) || !Double.isFinite(n)) {
            throw new IllegalArgumentException("spin axis must be a non-zero vector");
        }
        axis = new double[] {axis[0] / n, axis[1] / n, axis[2] / n};
    }

    /** Spin rate ω = 2π/P, rad/s (0 for a non-spinning body). */
    public double omega() {
        return Double.isInfinite(periodSeconds) ? 0.0 : 2 * Math.PI / periodSeconds;
    }

    /** Unit spin axis (a copy). */
    @Override
    public double[] axis() {
        return axis.clone();
    }
}
