package dev.cairn.surface;

import dev.cairn.util.ColourRamp;
import java.util.Locale;
import java.util.Set;

/**
 * How a per-facet survey quantity maps to colour, shared by the PNG maps ({@link SurveyMaps}) and the 3D views of the
 * viewer and renderer, so that the same facet has the same colour in both. A scale is identified by the
 * {@code facets.csv} column of its quantity; its default range, ramp and lift-off marking are decided here only.
 *
 * <p><b>Default range</b> (no user limit): slope {@code slope_deg} runs over [0°, 90°] and facets that lift off
 * (effective gravity pointing away from the surface, slope above 90°) show {@link ColourRamp#LIFT_OFF}, so the landing
 * range is not squeezed by the lift-off values; a signed quantity ({@link #SIGNED}) whose values span zero uses the
 * diverging ramp over ±max|v| centred on zero; every other quantity runs over its finite minimum to maximum on the
 * sequential ramp.
 *
 * <p><b>User limits</b>: a set lower or upper bound replaces the automatic one; with a set upper bound on the
 * sequential ramp, values above it show {@link ColourRamp#WARNING} (e.g. slopes steeper than the landing threshold).
 * Lift-off facets of the slope scale keep {@link ColourRamp#LIFT_OFF} under any limits. NaN shows
 * {@link ColourRamp#NO_DATA}.
 *
 * <p>Values are in the units of their column (SI, angles in degrees; U &gt; 0 convention, see docs/survey.md).
 */
public final class ColourScale {
    /** Column of the slope, whose scale marks lift-off and stops at 90°. */
    public static final String SLOPE = "slope_deg";
    /** Top of the slope scale: 90° (beyond it the facet lifts off). */
    public static final double SLOPE_TOP_DEG = 90;
    /** Columns holding signed values (diverging ramp when the values span zero). */
    public static final Set<String> SIGNED = Set.of("dynamic_height_m", "g_normal_m_s2", "g_eff_normal_m_s2");

    private final double lo;
    private final double hi;
    private final boolean diverging;
    private final boolean warnAbove;
    private final boolean marksLiftOff;
    private final double inv;

    private ColourScale(double lo, double hi, boolean diverging, boolean warnAbove, boolean marksLiftOff) {
        this.lo = lo;
        this.hi = hi;
        this.diverging = diverging;
        this.warnAbove = warnAbove;
        this.marksLiftOff = marksLiftOff;
        this.inv = 1.0 / (hi - lo);
    }

    /**
     * The scale of a column for its values.
     *
     * @param column  {@code facets.csv} column of the quantity
     * @param values  per-facet values (NaN allowed)
     * @param userMin user-set lower bound, or null for automatic
     * @param userMax user-set upper bound, or null for automatic
     */
    public static ColourScale of(String column, double[] values, Double userMin, Double userMax) {
        boolean slope = SLOPE.equals(column);
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double x : values) {
            if (Double.isFinite(x)) {
                lo = Math.min(lo, x);
                hi = Math.max(hi, x);
            }
        }
        if (lo > hi) { // no finite value at all
            lo = 0;
            hi = 1;
        }
        if (slope) {
            lo = 0;
            hi = SLOPE_TOP_DEG;
        }
        if (userMin != null) {
            lo = userMin;
        }
        if (userMax != null) {
            hi = userMax;
        }
        boolean diverging = SIGNED.contains(column) && lo < 0 && hi > 0;
        if (diverging) {
            double m = Math.max(Math.abs(lo), Math.abs(hi));
            lo = -m;
            hi = m;
        } else if (!(hi > lo)) {
            hi = lo + (lo == 0 ? 1 : Math.abs(lo) * 1e-6);
        }
        return new ColourScale(lo, hi, diverging, !diverging && userMax != null, slope);
    }

    /** Value at the low end of the ramp. */
    public double min() {
        return lo;
    }

    /** Value at the high end of the ramp. */
    public double max() {
        return hi;
    }

    /** True when the diverging ramp (centred on zero) is used. */
    public boolean diverging() {
        return diverging;
    }

    /** True when values above {@link #max()} show {@link ColourRamp#WARNING}. */
    public boolean warnAbove() {
        return warnAbove;
    }

    /** True when lift-off facets show {@link ColourRamp#LIFT_OFF} (the slope scale). */
    public boolean marksLiftOff() {
        return marksLiftOff;
    }

    /** The ramp in use. */
    public ColourRamp ramp() {
        return diverging ? ColourRamp.DIVERGING : ColourRamp.SEQUENTIAL;
    }

    /**
     * Colour of one facet ({@code 0xAARRGGBB}).
     *
     * @param v       the facet's value
     * @param liftOff whether the facet lifts off ({@code lift_off} = 1)
     */
    public int argb(double v, boolean liftOff) {
        if (marksLiftOff && liftOff) {
            return ColourRamp.LIFT_OFF;
        }
        if (warnAbove && v > hi) {
            return ColourRamp.WARNING;
        }
        return ramp().argb((v - lo) * inv); // NaN maps to NO_DATA
    }

    /** Colour of the ramp at value {@code v}, ignoring warning and lift-off (for colour bars). */
    public int rampArgb(double v) {
        return ramp().argb((v - lo) * inv);
    }

    /**
     * Tick values for a colour bar: the two ends (exact range) plus round numbers between them (steps of 1, 2, 2.5
     * or 5 times a power of ten, the nearest to a quarter of the range), leaving out round values closer to an end
     * than 8 % of the range so that labels do not overlap. Ascending. Used by the maps and the viewer's legend.
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

    /**
     * Tick label: four significant digits, trailing zeros dropped, an exponent only below 1e-3 or from 1e6 up; "–" for
     * NaN. The one tick format of the maps, the legend and the pick panel's ranges.
     */
    public static String format(double v) {
        if (Double.isNaN(v)) {
            return "–";
        }
        double a = Math.abs(v);
        if (a != 0 && (a < 1e-3 || a >= 1e6)) {
            return String.format(Locale.ROOT, "%.3e", v);
        }
        String s = String.format(Locale.ROOT, "%.4g", v);
        if (s.contains(".") && !s.contains("e")) {
            s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return s.equals("-0") ? "0" : s;
    }
}
