package dev.cairn.viewer;

import dev.cairn.util.ColourRamp;

/**
 * User limits of the colour range. A null bound is automatic (the data's finite minimum or maximum). With a
 * user-set upper bound on a sequential quantity, values above it show {@link ColourRamp#WARNING} (e.g. slopes
 * steeper than the landing threshold); values below a user-set lower bound take the low end of the ramp. A signed
 * quantity (dynamic height) whose range spans zero uses the diverging ramp centred on zero over ±max(|min|, |max|),
 * values beyond clamping to the ends; when its range does not span zero it uses the sequential ramp.
 *
 * @param min lower bound in the quantity's units, or null
 * @param max upper bound in the quantity's units, or null
 */
public record ColourLimits(Double min, Double max) {
    /** Automatic limits. */
    public static final ColourLimits AUTO = new ColourLimits(null, null);
}
