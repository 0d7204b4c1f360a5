package dev.cairn.viewer;

import java.util.ArrayList;
import java.util.List;

/** Maps a surveyed quantity to one sRGB colour per facet ({@code 0xAARRGGBB}) and describes it as a {@link Legend}. */
public final class FacetColouring {
    private FacetColouring() {
    }

    /** Colours and legend for one quantity. */
    public record Result(int[] argb, Legend legend) {
    }

    /**
     * @param survey   survey of the model (may be null only for {@link Quantity#NONE})
     * @param facets   number of facets
     * @param quantity quantity to show
     * @param limits   colour range limits (see {@link ColourLimits})
     */
    public static Result colour(SurveyData survey, int facets, Quantity quantity, ColourLimits limits) {
        int[] out = new int[facets];
        switch (quantity.kind()) {
            case NONE: {
                java.util.Arrays.fill(out, ColourRamp.PLAIN);
                return new Result(out, new Legend(quantity.label(), "", quantity.kind(), Double.NaN, Double.NaN,
                    false, List.of()));
            }
            case CATEGORY:
                return categories(survey.column(quantity.column()), quantity, out);
            default:
                return continuous(survey.column(quantity.column()), quantity, limits, out);
        }
    }

    private static Result continuous(double[] v, Quantity q, ColourLimits limits, int[] out) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (double x : v) {
            if (Double.isFinite(x)) {
                lo = Math.min(lo, x);
                hi = Math.max(hi, x);
            }
        }
        if (lo > hi) { // no finite value at all
            lo = 0;
            hi = 1;
        }
        if (limits.min() != null) {
            lo = limits.min();
        }
        if (limits.max() != null) {
            hi = limits.max();
        }
        // a signed quantity uses the diverging ramp only when its range spans zero; one-signed data reads better
        // on the sequential ramp
        boolean diverging = q.kind() == Quantity.Kind.DIVERGING && lo < 0 && hi > 0;
        if (diverging) {
            double m = Math.max(Math.abs(lo), Math.abs(hi));
            if (!(m > 0)) {
                m = 1;
            }
            lo = -m;
            hi = m;
        } else if (!(hi > lo)) {
            hi = lo + (lo == 0 ? 1 : Math.abs(lo) * 1e-6);
        }
        boolean warn = !diverging && limits.max() != null;
        ColourRamp ramp = diverging ? ColourRamp.DIVERGING : ColourRamp.SEQUENTIAL;
        double inv = 1.0 / (hi - lo);
        for (int f = 0; f < out.length; f++) {
            double x = v[f];
            if (warn && x > hi) {
                out[f] = ColourRamp.WARNING;
            } else {
                out[f] = ramp.argb((x - lo) * inv); // NaN maps to NO_DATA
            }
        }
        return new Result(out, new Legend(q.label(), q.units(),
            diverging ? Quantity.Kind.DIVERGING : Quantity.Kind.SEQUENTIAL, lo, hi, warn, List.of()));
    }

    private static Result categories(double[] v, Quantity q, int[] out) {
        List<Legend.Swatch> sw = new ArrayList<>();
        if (q == Quantity.LIFT_OFF) {
            for (int f = 0; f < out.length; f++) {
                out[f] = Double.isNaN(v[f]) ? ColourRamp.NO_DATA : v[f] > 0.5 ? ColourRamp.WARNING : ColourRamp.NEUTRAL;
            }
            sw.add(new Legend.Swatch("stays down", ColourRamp.NEUTRAL));
            sw.add(new Legend.Swatch("lifts off", ColourRamp.WARNING));
        } else {
            int maxRank = 0;
            for (int f = 0; f < out.length; f++) {
                int r = Double.isNaN(v[f]) ? 0 : (int) Math.round(v[f]);
                out[f] = r > 0 ? ColourRamp.category(r) : ColourRamp.NEUTRAL;
                maxRank = Math.max(maxRank, r);
            }
            String what = q == Quantity.SITES ? "site" : "zone";
            sw.add(new Legend.Swatch("no " + what, ColourRamp.NEUTRAL));
            for (int r = 1; r <= Math.min(maxRank, 8); r++) {
                sw.add(new Legend.Swatch(what + " " + r, ColourRamp.category(r)));
            }
            if (maxRank > 8) {
                sw.add(new Legend.Swatch("(colours repeat after 8)", ColourRamp.NEUTRAL));
            }
        }
        return new Result(out, new Legend(q.label(), q.units(), q.kind(), Double.NaN, Double.NaN, false, sw));
    }
}
