package dev.cairn.viewer;

import dev.cairn.surface.ColourScale;
import dev.cairn.util.ColourRamp;
import java.util.ArrayList;
import java.util.List;

/**
 * Maps a surveyed quantity to one sRGB colour per facet ({@code 0xAARRGGBB}) and describes it as a {@link Legend}.
 * Continuous quantities go through {@link ColourScale}, the same scale the survey's PNG maps use, so a facet has the
 * same colour on the map and in the 3D view; lift-off is {@link ColourRamp#LIFT_OFF} in both.
 */
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
                    false, List.of(), false));
            }
            case CATEGORY:
                return categories(survey.column(quantity.column()), quantity, out);
            default:
                return continuous(survey.column(quantity.column()), quantity, limits, out,
                    survey.hasColumn("lift_off") ? survey.column("lift_off") : null);
        }
    }

    private static Result continuous(double[] v, Quantity q, ColourLimits limits, int[] out, double[] lift) {
        ColourScale scale = ColourScale.of(q.column(), v, limits.min(), limits.max());
        for (int f = 0; f < out.length; f++) {
            out[f] = scale.argb(v[f], lift != null && lift[f] > 0.5);
        }
        boolean marks = scale.marksLiftOff() && lift != null;
        return new Result(out, new Legend(q.label(), q.units(),
            scale.diverging() ? Quantity.Kind.DIVERGING : Quantity.Kind.SEQUENTIAL, scale.min(), scale.max(),
            scale.warnAbove(), List.of(), marks));
    }

    private static Result categories(double[] v, Quantity q, int[] out) {
        List<Legend.Swatch> sw = new ArrayList<>();
        if (q == Quantity.LIFT_OFF) {
            for (int f = 0; f < out.length; f++) {
                out[f] = Double.isNaN(v[f]) ? ColourRamp.NO_DATA : v[f] > 0.5 ? ColourRamp.LIFT_OFF : ColourRamp.NEUTRAL;
            }
            sw.add(new Legend.Swatch("stays down", ColourRamp.NEUTRAL));
            sw.add(new Legend.Swatch("lifts off", ColourRamp.LIFT_OFF));
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
        return new Result(out, new Legend(q.label(), q.units(), q.kind(), Double.NaN, Double.NaN, false, sw, false));
    }
}
