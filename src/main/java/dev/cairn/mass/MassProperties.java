package dev.cairn.mass;

/**
 * Mass properties of a constant-density closed polyhedron, SI units, model frame.
 *
 * @param volume               enclosed volume, m^3
 * @param surfaceArea          total facet area, m^2
 * @param density              bulk density, kg/m^3
 * @param mass                 kg
 * @param centerOfMass         centre of mass {@code [x, y, z]}, m, model frame
 * @param inertia              inertia tensor about the centre of mass, model axes, kg·m^2, row-major 3×3
 *                             ({@code I = ∫ρ(|r|²·1 − r rᵀ) dV}, positive definite)
 * @param principalMoments     eigenvalues of {@code inertia}, ascending, kg·m^2
 * @param principalAxes        unit eigenvectors, row {@code k} (elements {@code 3k..3k+2}) belongs to moment k;
 *                             sign chosen so that the largest component is positive, third axis = first × second
 * @param equivalentRadius     radius of the sphere of equal volume, m
 * @param brillouinRadius      radius of the smallest sphere about the centre of mass that holds every vertex, m
 */
public record MassProperties(
    double volume, double surfaceArea, double density, double mass,
    double[] centerOfMass, double[] inertia, double[] principalMoments, double[] principalAxes,
    double equivalentRadius, double brillouinRadius) {

    /** {@code G·M}, m^3/s^2, with {@link dev.cairn.gravity.Constants#G}. */
    public double gm() {
        return dev.cairn.gravity.Constants.G * mass;
    }
}
