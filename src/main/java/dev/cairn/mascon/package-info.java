/**
 * Mascon (point-mass) gravity models: the {@link dev.cairn.mascon.MasconField} field model over a
 * {@link dev.cairn.mascon.MasconSet}, the generators that fill a shape with mascons (cubic lattice with
 * solid-angle inside test and octree sub-sampling of cut cubes; facet tetrahedra split into shells), the
 * {@link dev.cairn.mascon.DensityModel} they sample, and the report of a set's mass properties against the
 * polyhedron's.
 *
 * <p>Conventions: SI units, model frame, U &gt; 0, g = ∇U. Depends on {@code mesh}, {@code mass}, {@code gravity}
 * and {@code util}; never on {@code io}, {@code regions}, {@code cli} or {@code viewer}. Library code never prints.
 */
package dev.cairn.mascon;
