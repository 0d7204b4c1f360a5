/**
 * Mass properties of constant-density polyhedra: volume, area, centre of mass, inertia tensor, principal moments and
 * axes, equivalent and Brillouin radii. SI units, model frame. Depends only on {@code mesh} (and EJML).
 */
package dev.cairn.mass;
