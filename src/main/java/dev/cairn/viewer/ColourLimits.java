package dev.cairn.viewer;

/**
 * User limits of the colour range. A null bound is automatic (the data's finite minimum or maximum). With a
 * user-set upper bound on a sequential quantity, values above it show {@link ColourRamp#WARNING} (e.g. slopes
 * steeper than the landing threshold); values below a user-set lower bound take the low end of the ramp. For a
 * diverging quantity the ramp is centred on zero and spans ±max(|min|, |max|); values beyond clamp to the ends.
 *
 * @param min lower bound in the quantity's units, or null
 * @param max upper bound in the quantity's units, or null
 */
public record ColourLimits(Double min, Double max) {
    /** Automatic limits. */
    public static final ColourLimits AUTO = new ColourLimits(null, null);
}
