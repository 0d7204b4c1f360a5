package dev.cairn.viewer;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.cairn.util.ColourRamp;
import org.junit.jupiter.api.Test;

/** Facet colours from values: limits, warning, missing values, lift-off and the diverging ramp. */
class FacetColouringTest {
    @Test
    void facetColouringMapsLimitsWarningAndMissingValues() {
        double[] slope = {0, 15, 30, 45, Double.NaN};
        java.util.Map<String, double[]> cols = java.util.Map.of("slope_deg", slope);
        SurveyData s = SurveyData.ofColumns(cols, slope.length);
        FacetColouring.Result r = FacetColouring.colour(s, 5, Quantity.SLOPE, new ColourLimits(0.0, 30.0));
        assertEquals(ColourRamp.SEQUENTIAL.argb(0), r.argb()[0]);
        assertEquals(ColourRamp.SEQUENTIAL.argb(0.5), r.argb()[1]);
        assertEquals(ColourRamp.SEQUENTIAL.argb(1), r.argb()[2]);
        assertEquals(ColourRamp.WARNING, r.argb()[3], "steeper than the limit");
        assertEquals(ColourRamp.NO_DATA, r.argb()[4]);
        assertTrue(r.legend().warnAbove());
        FacetColouring.Result auto = FacetColouring.colour(s, 5, Quantity.SLOPE, ColourLimits.AUTO);
        // the default slope range is 0..90 deg whatever the data (issue: landing range not squeezed)
        assertEquals(90, auto.legend().max());
        assertEquals(0, auto.legend().min());
        assertEquals(ColourRamp.SEQUENTIAL.argb(0.5), auto.argb()[3], "automatic range: 45 deg mid-ramp, no warning");
    }

    @Test
    void liftOffFacetsShowTheLiftOffColourOnTheSlopeScaleOnly() {
        // slope > 90 deg exactly where the inward normal component of a_eff is negative (definition of the slope
        // as the angle between the inward normal and a_eff)
        double[] slope = {10, 120, 60};
        double[] lift = {0, 1, 0};
        double[] g = {1e-4, 2e-4, 3e-4};
        SurveyData s = SurveyData.ofColumns(java.util.Map.of("slope_deg", slope, "lift_off", lift, "g_eff_m_s2", g), 3);
        for (ColourLimits lim : new ColourLimits[] {ColourLimits.AUTO, new ColourLimits(0.0, 30.0)}) {
            FacetColouring.Result r = FacetColouring.colour(s, 3, Quantity.SLOPE, lim);
            assertEquals(ColourRamp.LIFT_OFF, r.argb()[1], "lift-off facet, limits " + lim);
            assertTrue(r.legend().liftOff());
        }
        FacetColouring.Result ge = FacetColouring.colour(s, 3, Quantity.G_EFF, ColourLimits.AUTO);
        assertEquals(ColourRamp.SEQUENTIAL.argb(0.5), ge.argb()[1], "g-eff does not mark lift-off");
        FacetColouring.Result cat = FacetColouring.colour(s, 3, Quantity.LIFT_OFF, ColourLimits.AUTO);
        assertEquals(ColourRamp.LIFT_OFF, cat.argb()[1], "the lift-off quantity uses the same colour");
    }

    @Test
    void divergingQuantityIsCentredOnZero() {
        double[] h = {-5, 0, 20};
        SurveyData s = SurveyData.ofColumns(java.util.Map.of("dynamic_height_m", h), 3);
        FacetColouring.Result r = FacetColouring.colour(s, 3, Quantity.DYNAMIC_HEIGHT, ColourLimits.AUTO);
        assertEquals(-20, r.legend().min());
        assertEquals(20, r.legend().max());
        assertEquals(ColourRamp.DIVERGING.argb(0.5), r.argb()[1]);
        assertEquals(ColourRamp.DIVERGING.argb(1), r.argb()[2]);
        // one-signed data (e.g. heights above the lowest point) use the sequential ramp
        SurveyData p = SurveyData.ofColumns(java.util.Map.of("dynamic_height_m", new double[] {0, 5, 10}), 3);
        FacetColouring.Result q = FacetColouring.colour(p, 3, Quantity.DYNAMIC_HEIGHT, ColourLimits.AUTO);
        assertEquals(Quantity.Kind.SEQUENTIAL, q.legend().kind());
        assertEquals(ColourRamp.SEQUENTIAL.argb(0.5), q.argb()[1]);
    }
}
