package dev.cairn.mascon;

import dev.cairn.mesh.TriangleMesh;

/**
 * Density of a body as a function of position, for mascon generation: a constant-density shape, nested regions
 * of different densities, a density that varies with depth.
 *
 * <p>Implementations are immutable and thread-safe. Units: kg/m^3, metres, model frame.
 */
public interface DensityModel {
    /**
     * Density at a point and the distance from the point to the nearest surface where the density jumps (the outer
     * surface included). Mascon generators treat a cube of half-diagonal below that distance as uniform.
     *
     * @param out receives {@code out[0]} = density, kg/m^3 (0 outside the body), {@code out[1]} = distance to the
     *            nearest density discontinuity, m (modified)
     */
    void query(double x, double y, double z, double[] out);

    /** The outer shape (the body's surface), metres. */
    TriangleMesh outerShape();

    /** The density when it is one constant inside the outer shape, kg/m^3; NaN when it varies. */
    double uniformDensity();

    /**
     * A density model valid (and faster) for points within {@code radius} of {@code (x, y, z)}; the default is this
     * model itself. The returned model may keep scratch space: use it from one thread.
     */
    default DensityModel near(double x, double y, double z, double radius) {
        return this;
    }

    /** Constant density inside {@code mesh}, 0 outside. */
    static DensityModel uniform(TriangleMesh mesh, double density) {
        SurfaceQuery q = new SurfaceQuery(mesh);
        return new DensityModel() {
            @Override
            public DensityModel near(double x, double y, double z, double radius) {
                return local(q.near(x, y, z, radius));
            }

            private DensityModel local(SurfaceQuery.Local local) {
                return new DensityModel() {
                    @Override
                    public DensityModel near(double x, double y, double z, double radius) {
                        return local(local.near(x, y, z, radius));
                    }

                    @Override
                    public void query(double px, double py, double pz, double[] out) {
                        local.windingAndDistance(px, py, pz, out);
                        out[0] = out[0] > 0.5 ? density : 0.0;
                    }

                    @Override
                    public TriangleMesh outerShape() {
                        return mesh;
                    }

                    @Override
                    public double uniformDensity() {
                        return density;
                    }
                };
            }

            @Override
            public void query(double x, double y, double z, double[] out) {
                q.windingAndDistance(x, y, z, out);
                out[0] = out[0] > 0.5 ? density : 0.0;
            }

            @Override
            public TriangleMesh outerShape() {
                return mesh;
            }

            @Override
            public double uniformDensity() {
                return density;
            }
        };
    }
}
