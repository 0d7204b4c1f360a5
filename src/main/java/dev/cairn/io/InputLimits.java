package dev.cairn.io;

/**
 * Accepted ranges and unit names of the physical inputs every reader shares (model files, sidecars, body
 * descriptions, options). Values are SI.
 */
public final class InputLimits {
    /** Densities outside this range (kg/m^3) draw a warning (Carry 2012, Planet. Space Sci. 73:98–118, widened). */
    public static final double DENSITY_WARN_LOW = 100;
    public static final double DENSITY_WARN_HIGH = 8000;
    /**
     * Densities outside this range (kg/m^3) are refused: a millionth of air's density to beyond any ordinary
     * matter (white-dwarf matter is about 1e9), far outside any body this program models (those draw a warning
     * outside 100-8000), and small enough that G·M and the inertia stay finite for every accepted body size
     * (common practice, no source).
     */
    public static final double DENSITY_MIN = 1e-6;
    public static final double DENSITY_MAX = 1e12;

    private InputLimits() {
    }

    /** Metres per model unit for "m" or "km"; anything else is refused naming {@code where}. */
    public static double metresPer(String unit, String where) {
        if ("m".equals(unit)) {
            return 1.0;
        }
        if ("km".equals(unit)) {
            return 1000.0;
        }
        throw new InputException(where + ": unknown length unit '" + unit + "' (use m or km)");
    }

    /** Refuses a density outside [{@link #DENSITY_MIN}, {@link #DENSITY_MAX}] kg/m^3; {@code prefix} starts the message. */
    public static void requireDensityInRange(double rho, String prefix) {
        if (!(rho >= DENSITY_MIN && rho <= DENSITY_MAX)) {
            throw new InputException(prefix + String.format(java.util.Locale.ROOT, "%.4g", rho) + " kg/m^3, outside "
                + "the " + DENSITY_MIN + " to " + DENSITY_MAX + " kg/m^3 this program accepts");
        }
    }
}
