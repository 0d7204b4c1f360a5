package dev.cairn.body;

/**
 * What the user asked for when loading a model; {@code null} fields fall back to the sidecar, then to defaults.
 *
 * @param lengthUnit  "m" or "km" (model coordinates), or null
 * @param density     kg/m^3, or null
 * @param gm          m^3/s^2, or null
 * @param mass        kg, or null
 * @param spinPeriod  seconds, or null
 * @param spinAxis    spin pole (model frame, any length), or null
 */
public record ModelRequest(String lengthUnit, Double density, Double gm, Double mass, Double spinPeriod,
                           double[] spinAxis) {
    /** Nothing requested: everything from the sidecar or defaults. */
    public static final ModelRequest DEFAULTS = new ModelRequest(null, null, null, null, null, null);
}
