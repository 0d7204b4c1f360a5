package dev.cairn.viewer;

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
 */
public record Legend(String title, String units, Quantity.Kind kind, double min, double max, boolean warnAbove,
                     List<Swatch> categories) {
    /** One labelled colour of a categorical legend. */
    public record Swatch(String label, int argb) {
    }

    /** The ramp this legend uses, or null for categories and plain surfaces. */
    public ColourRamp ramp() {
        return kind == Quantity.Kind.SEQUENTIAL ? ColourRamp.SEQUENTIAL
            : kind == Quantity.Kind.DIVERGING ? ColourRamp.DIVERGING : null;
    }

    /** "slope (deg)" or just the title. */
    /**
     * Tick values for the colour bar: the two ends (exact range) plus round numbers between them (steps of 1, 2, 2.5
     * or 5 times a power of ten, the nearest to a quarter of the range), leaving out round values closer to an end than 8 % of the
     * range so that labels do not overlap. Ascending.
     */
    public static double[] ticks(double min, double max) {
        if (!(max > min) || !Double.isFinite(min) || !Double.isFinite(max)) {
            return new double[] {min};
        }
        double raw = (max - min) / 4;
        double p = Math.pow(10, Math.floor(Math.log10(raw)));
        double step = p;
        for (double m : new double[] {1, 2, 2.5, 5, 10}) {
            if (Math.abs(Math.log(m * p / raw)) < Math.abs(Math.log(step / raw))) {
                step = m * p; // the round step nearest (in ratio) to a quarter of the range
            }
        }
        double gap = 0.08 * (max - min);
        java.util.List<Double> t = new java.util.ArrayList<>();
        t.add(min);
        // Ticks by an integer count, never by floating-point progress (a step below one ulp of min would never end).
        double k0 = Math.ceil(min / step);
        double k1 = Math.ceil(max / step) - 1;
        long n = k1 >= k0 && k1 - k0 < 50 ? (long) (k1 - k0) + 1 : 0;
        for (long i = 0; i < n; i++) {
            double v = (k0 + i) * step;
            if (v < max && v - min >= gap && max - v >= gap) {
                t.add(Math.abs(v) < 1e-12 * step ? 0.0 : v);
            }
        }
        t.add(max);
        return t.stream().mapToDouble(Double::doubleValue).toArray();
    }

    public String heading() {
        return units.isEmpty() ? title : title + " (" + units + ")";
    }
}
