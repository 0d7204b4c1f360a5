/**
 * Bodies of uneven density: the body description (JSON) of nested regions, each a closed OBJ with its own density;
 * its checks (regions nest, stay inside the outer shape, densities non-negative); its field as a superposition of
 * constant-density polyhedra; its density model for mascon generation (region densities, optional gradient with
 * depth); solving one region's density from a measured GM.
 *
 * <p>Conventions: SI units inside (lengths converted at load), model frame, U &gt; 0, g = ∇U. Depends on
 * {@code mesh}, {@code mass}, {@code gravity}, {@code mascon} and {@code io} (for loading and errors); never on
 * {@code cli} or {@code viewer}. Library code never prints.
 */
package dev.cairn.regions;
