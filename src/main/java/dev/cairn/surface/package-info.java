/**
 * Surface survey of a spinning body: per-facet gravity, effective (gravity + centrifugal) acceleration, slope,
 * effective potential and dynamic height, lift-off, escape speed and hover acceleration; landing zones found by
 * adjacency-based region growing; hovering points; and the writers of the survey outputs (CSV, JSON, legacy VTK,
 * PNG maps drawn with plain Java2D). Entry point: {@link dev.cairn.surface.Survey}; result:
 * {@link dev.cairn.surface.SurveyResult}.
 *
 * <p>SI units, model (body-fixed) frame, U &gt; 0 and g = ∇U. Depends on {@code mesh}, {@code gravity},
 * {@code rotation}, {@code io} and {@code util}; never on {@code cli} or {@code viewer}; no JavaFX (AWT only for
 * off-screen PNG drawing); library code never prints.
 */
package dev.cairn.surface;
