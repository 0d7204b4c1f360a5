package dev.cairn.viewer;

import dev.cairn.util.ColourRamp;
import java.util.List;

/**
 * What the legend shows for a colouring: the quantity's name and units, the numeric range mapped onto the ramp,
 * and the categories (for lift-off and zones) or the warning swatch for values above a user-set limit.
 *
 * @param title      quantity label
 * @param units      units ("" for none)
 * @param kind       how values map to colour
 * @param min        value at the low end of the ramp (NaN for categories)
 * @param max        value at the high end of the ramp (NaN for categories)
 * @param warnAbove  true when values above {@code max} show {@link ColourRamp#WARNING}
 * @param categories swatches for categorical quantities (empty otherwise)
 * @param liftOff    true when lift-off facets show {@link ColourRamp#LIFT_OFF} (slope)
 */
public record Legend(String title, String units, Quantity.Kind kind, double min, double max, boolean warnAbove,
                     List<Swatch> categories, boolean liftOff) {
    /** One labelled colour of a categorical legend. */
    public record Swatch(String label, int argb) {
    }

    /** The ramp this legend uses, or null for categories and plain surfaces. */
    public ColourRamp ramp() {
        return kind == Quantity.Kind.SEQUENTIAL ? ColourRamp.SEQUENTIAL
            : kind == Quantity.Kind.DIVERGING ? ColourRamp.DIVERGING : null;
    }

    /** Tick values of the colour bar, as on the PNG maps (see {@link dev.cairn.surface.ColourScale#ticks}). */
    public static double[] ticks(double min, double max) {
        return dev.cairn.surface.ColourScale.ticks(min, max);
    }

    /** "slope (deg)" or just the title. */
    public String heading() {
        return units.isEmpty() ? title : title + " (" + units + ")";
    }
}
