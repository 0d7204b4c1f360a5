package dev.cairn.viewer;

import java.util.Set;

/**
 * What to render: body, survey (null only for {@link Quantity#NONE} without zone outlines), quantity, colour limits,
 * preset view, lighting, overlays and image size in pixels.
 */
public record RenderRequest(BodyGeometry geometry, SurveyData survey, Quantity quantity, ColourLimits limits,
                            ViewPreset view, Lighting lighting, Set<Overlay> overlays, int width, int height) {
}
