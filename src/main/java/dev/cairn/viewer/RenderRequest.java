package dev.cairn.viewer;

import java.util.Set;

/**
 * What to render: body, survey (null only for {@link Quantity#NONE} without zone outlines), quantity, colour limits,
 * preset view, lighting, overlays, image size in pixels, and marker points ({@code x, y, z} triples in metres in the
 * model frame, e.g. rest points of a deployment; empty for none).
 */
public record RenderRequest(BodyGeometry geometry, SurveyData survey, Quantity quantity, ColourLimits limits,
                            ViewPreset view, Lighting lighting, Set<Overlay> overlays, int width, int height,
                            double[] markers) {
    /** Without marker points. */
    public RenderRequest(BodyGeometry geometry, SurveyData survey, Quantity quantity, ColourLimits limits,
                         ViewPreset view, Lighting lighting, Set<Overlay> overlays, int width, int height) {
        this(geometry, survey, quantity, limits, view, lighting, overlays, width, height, new double[0]);
    }
}
