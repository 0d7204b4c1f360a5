/**
 * Motion near the body: propagation of a point mass (spacecraft, lander, sample canister) in the body's gravity field
 * in the rotating body frame or in the inertial frame aligned with the body at t = 0, with impact (exact crossing of
 * the shape model), escape and altitude events, the Jacobi integral tracked, and a seeded Monte Carlo of ballistic
 * deployments with bounces. See {@link dev.cairn.motion.Propagator}, {@link dev.cairn.motion.Deployment} and
 * docs/trajectories.md.
 *
 * <p>Depends on {@code gravity} (any {@code FieldModel}, normally the body's hierarchical field), {@code rotation}
 * ({@code RotatingFrame}, {@code SpinState}: spin conventions), {@code mesh} (the shape, {@code FacetGeometry}'s
 * ray–facet routine), {@code mascon.SurfaceQuery} (signed distance to the surface for altitudes and the inside test)
 * and {@code util} (parallel chunks, progress). Commons Math 3.6.1 for the integrator and root finder. Never
 * {@code cli}, {@code io} or the viewer; no printing.
 */
package dev.cairn.motion;
