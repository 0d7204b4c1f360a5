/**
 * The body's spin state ({@link dev.cairn.rotation.SpinState}) and the rotating (body-fixed) frame
 * ({@link dev.cairn.rotation.RotatingFrame}): effective potential {@code V = U + ½ω²|ω̂×(r−c)|²}, effective
 * acceleration (gravity + centrifugal), frame velocity, latitude/longitude about the pole. SI units.
 * Depends on nothing else in Cairn; no JavaFX, no printing.
 */
package dev.cairn.rotation;
