package dev.cairn.gravity;

/**
 * Layout of one field evaluation in a {@code double[]}: the slots a {@link FieldEvaluator} writes.
 *
 * <p>Conventions (Werner &amp; Scheeres 1997): the potential {@code U} is positive ({@code U → GM/r} far away), the
 * acceleration is {@code g = ∇U} (it points toward the body), the gradient tensor is {@code ∇∇U} and its trace is the
 * Laplacian {@code ∇²U} (−4πGρ inside a constant-density body, 0 outside). SI units: m^2/s^2, m/s^2, 1/s^2.
 * All vectors are in the model (body-fixed) frame.
 */
public final class FieldSample {
    /** Potential U, m^2/s^2, positive. */
    public static final int U = 0;
    /** Acceleration x component, m/s^2 (∂U/∂x). */
    public static final int AX = 1;
    public static final int AY = 2;
    public static final int AZ = 3;
    /** Laplacian ∇²U, 1/s^2 (NaN when the model cannot tell). */
    public static final int LAPLACIAN = 4;
    /** Gradient tensor components ∂²U/∂x∂x ... ∂²U/∂z∂z, 1/s^2 (written only when requested, else NaN). */
    public static final int GXX = 5;
    public static final int GXY = 6;
    public static final int GXZ = 7;
    public static final int GYY = 8;
    public static final int GYZ = 9;
    public static final int GZZ = 10;
    /** {@link Location#code()} of the point. */
    public static final int LOCATION = 11;
    /** Number of slots. */
    public static final int SIZE = 12;

    private FieldSample() {
    }

    /** Acceleration magnitude from a sample array at offset {@code o}. */
    public static double accelerationNorm(double[] s, int o) {
        return Math.sqrt(s[o + AX] * s[o + AX] + s[o + AY] * s[o + AY] + s[o + AZ] * s[o + AZ]);
    }
}
