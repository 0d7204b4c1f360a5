/**
 * Spherical-harmonic coefficient files: writing the coefficients of {@link dev.cairn.gravity.HarmonicCoefficients}
 * as JSON or CSV (with their metadata) and reading the JSON back with every value checked.
 *
 * <p>Conventions: SI units, model frame, 4π full normalisation without the Condon–Shortley phase, U &gt; 0,
 * g = ∇U. Depends on {@code gravity} and {@code io}; never on {@code cli} or {@code viewer}. Library code never prints.
 */
package dev.cairn.harmonics;
