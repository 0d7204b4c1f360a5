/**
 * Acceleration tables for guidance simulators: grid definitions (Cartesian box, spherical shells, point lists),
 * parallel, checkpointed and shardable evaluation of a {@link dev.cairn.gravity.FieldModel} at the nodes, writers
 * and readers for CSV and NumPy {@code .npy} with a JSON metadata sidecar, and {@link dev.cairn.tables.TableField},
 * a field model that interpolates a table (tricubic Hermite, Lekien &amp; Marsden 2005) and refuses to extrapolate.
 *
 * <p>Conventions: SI units, model (body-fixed) frame, potential U &gt; 0 and acceleration g = ∇U. Depends on
 * {@code gravity}, {@code io}, {@code util} and {@code rotation}; must not depend on {@code cli} or {@code viewer}
 * (the Cairn version string is passed in), and never prints.
 */
package dev.cairn.tables;
