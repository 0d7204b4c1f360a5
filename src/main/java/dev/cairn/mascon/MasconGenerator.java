package dev.cairn.mascon;

import dev.cairn.mass.MassProperties;
import dev.cairn.mass.MassPropertiesCalculator;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.util.Locale;

/**
 * Builds mascon sets from a shape model and a density model. Two schemes:
 *
 * <ul>
 * <li><b>Cubic lattice</b>: cubes of side {@code h} over the bounding box; each cube's mass is the integral of the
 *     density over it, by adaptive octree sub-division: a (sub-)cube whose centre lies farther from every density
 *     discontinuity than its half-diagonal is uniform and taken whole; otherwise it is split into 8, down to
 *     {@code levels} splits, where the centre value stands for the leaf. Inside/outside from the solid-angle
 *     winding number ({@link SurfaceQuery}) at cube centres, and inside a cut cube from the few nearby facets
 *     ({@link DensityModel#near}). The mascon sits at the cube's centre of mass; cubes with no mass are
 *     dropped. Spacing = h. The classic mascon model (Werner &amp; Scheeres 1997, Celest. Mech. Dyn. Astron.
 *     65:313–344, §5).</li>
 * <li><b>Tetrahedral</b>: each facet with the centre of mass O forms a signed tetrahedron (the decomposition of
 *     Dobrovolskis 1996, Icarus 124:698–704); the facet is split laterally into {@code m²} congruent
 *     sub-triangles and each sub-tetrahedron radially into {@code S} shells at {@code t_k = √(k/S)} of the way from
 *     O to the facet (equal steps in t², so shells thin toward the surface as the pieces' lateral size grows: this
 *     halves the measured field error against equal steps in t at the same count). A shell {@code [t0, t1]} of a tetrahedron of volume V over a triangle of centroid c (relative to
 *     O) has volume {@code V(t1³ − t0³)} and centroid {@code O + c·¾(t1⁴ − t0⁴)/(t1³ − t0³)} (cross-sections grow as
 *     t², their centroids move as t·c). One mascon per piece at its centroid: for constant density the total mass
 *     and the centre of mass equal the polyhedron's exactly (up to rounding); the inertia misses only each piece's
 *     own inertia about its centroid, a relative error of order (piece size / body size)². The mascon set of
 *     Chanut, Aljbaae &amp; Carruba (2015), MNRAS 450:3742–3749, generalised to several shells. Spacing = the
 *     piece's largest extent.</li>
 * </ul>
 * Units: metres, kg, model frame. Library code: never prints; long loops report to a {@link ProgressListener}.
 */
public final class MasconGenerator {
    /** Default octree depth for cubes cut by a density discontinuity (2^3 = 8 sub-divisions per edge). */
    public static final int DEFAULT_LEVELS = 3;
    /** Lattice cells per block edge sharing one local surface view. */
    private static final int BLOCK = 4;

    private MasconGenerator() {
    }

    /** The two generation schemes. */
    public enum Scheme {
        LATTICE, TETRA;

        /** Parses "lattice" or "tetra" (case-insensitive). */
        public static Scheme parse(String s) {
            switch (s.toLowerCase(Locale.ROOT)) {
                case "lattice":
                    return LATTICE;
                case "tetra":
                case "tetrahedral":
                    return TETRA;
                default:
                    throw new IllegalArgumentException("unknown mascon scheme '" + s + "' (use lattice or tetra)");
            }
        }
    }

    /** Generates about {@code target} mascons with the given scheme. */
    public static MasconSet generate(Scheme scheme, DensityModel density, int target, int threads,
                                     ProgressListener progress) {
        if (target < 1) {
            throw new IllegalArgumentException("mascon count must be at least 1, got " + target);
        }
        if (scheme == Scheme.LATTICE) {
            double volume = MassPropertiesCalculator.unitDensity(density.outerShape()).volume();
            return lattice(density, Math.cbrt(volume / target), DEFAULT_LEVELS, threads, progress);
        }
        int[] sm = tetraSplit(density.outerShape(), target);
        return tetrahedral(density, sm[0], sm[1], threads, progress);
    }

    /**
     * Cubic lattice of side {@code h}, centred on the outer shape's bounding box.
     *
     * @param h      cube side, m
     * @param levels octree depth for cubes cut by a density discontinuity (0 = centre value only)
     */
    public static MasconSet lattice(DensityModel density, double h, int levels, int threads,
                                    ProgressListener progress) {
        if (!(h > 0)) {
            throw new IllegalArgumentException("lattice spacing must be positive, got " + h);
        }
        double[] bb = density.outerShape().boundingBox();
        int[] nc = new int[3];
        double[] origin = new double[3];
        for (int k = 0; k < 3; k++) {
            double ext = bb[3 + k] - bb[k];
            nc[k] = Math.max(1, (int) Math.ceil(ext / h - 1e-9));
            origin[k] = 0.5 * (bb[k] + bb[3 + k]) - 0.5 * nc[k] * h;
        }
        long cellsL = (long) nc[0] * nc[1] * nc[2];
        if (cellsL > 200_000_000L) {
            throw new IllegalArgumentException("lattice of " + cellsL + " cells is too large");
        }
        int cells = (int) cellsL;
        double[] cm = new double[cells];
        double[] cxyz = new double[3 * cells];
        // Blocks of BLOCK^3 cells share one local view of the surface (a block the surface does not reach is
        // decided from its centre alone), so the cost follows the surface, not the volume.
        int[] nb = {(nc[0] + BLOCK - 1) / BLOCK, (nc[1] + BLOCK - 1) / BLOCK, (nc[2] + BLOCK - 1) / BLOCK};
        int blocks = nb[0] * nb[1] * nb[2];
        ParallelChunks.run(blocks, threads, () -> new double[6], (scratch, from, to) -> {
            for (int b = from; b < to; b++) {
                int bx = BLOCK * (b % nb[0]);
                int by = BLOCK * ((b / nb[0]) % nb[1]);
                int bz = BLOCK * (b / (nb[0] * nb[1]));
                int ex = Math.min(nc[0], bx + BLOCK);
                int ey = Math.min(nc[1], by + BLOCK);
                int ez = Math.min(nc[2], bz + BLOCK);
                double mx = origin[0] + 0.5 * (bx + ex) * h;
                double my = origin[1] + 0.5 * (by + ey) * h;
                double mz = origin[2] + 0.5 * (bz + ez) * h;
                double radius = 0.5 * h * Math.sqrt((double) (ex - bx) * (ex - bx) + (ey - by) * (ey - by)
                    + (ez - bz) * (ez - bz));
                DensityModel local = density.near(mx, my, mz, radius);
                for (int iz = bz; iz < ez; iz++) {
                    for (int iy = by; iy < ey; iy++) {
                        for (int ix = bx; ix < ex; ix++) {
                            int c = ix + nc[0] * (iy + nc[1] * iz);
                            double x = origin[0] + (ix + 0.5) * h;
                            double y = origin[1] + (iy + 0.5) * h;
                            double z = origin[2] + (iz + 0.5) * h;
                            scratch[2] = 0;
                            scratch[3] = 0;
                            scratch[4] = 0;
                            scratch[5] = 0;
                            integrate(local, x, y, z, 0.5 * h, levels, scratch);
                            cm[c] = scratch[2];
                            if (scratch[2] != 0) {
                                cxyz[3 * c] = scratch[3] / scratch[2];
                                cxyz[3 * c + 1] = scratch[4] / scratch[2];
                                cxyz[3 * c + 2] = scratch[5] / scratch[2];
                            }
                        }
                    }
                }
            }
        }, progress);
        int n = 0;
        for (double m : cm) {
            if (m != 0) { // exact zero: a cube with no mass in it carries no mascon
                n++;
            }
        }
        double[] xyz = new double[3 * n];
        double[] mass = new double[n];
        double[] sp = new double[n];
        int j = 0;
        for (int c = 0; c < cells; c++) {
            if (cm[c] != 0) {
                mass[j] = cm[c];
                System.arraycopy(cxyz, 3 * c, xyz, 3 * j, 3);
                sp[j] = h;
                j++;
            }
        }
        return new MasconSet(xyz, mass, sp, String.format(Locale.ROOT, "cubic lattice, cell %.6g m, %d x %d x %d",
            h, nc[0], nc[1], nc[2]));
    }

    /** Adds the mass and first moment of the cube (centre, half side) to acc[2..5]; acc[0..1] is query scratch. */
    private static void integrate(DensityModel density, double x, double y, double z, double half, int levels,
                                  double[] acc) {
        density.query(x, y, z, acc);
        double rho = acc[0];
        if (levels == 0 || acc[1] >= half * Math.sqrt(3)) {
            double m = rho * 8 * half * half * half;
            acc[2] += m;
            acc[3] += m * x;
            acc[4] += m * y;
            acc[5] += m * z;
            return;
        }
        double q = 0.5 * half;
        DensityModel local = density.near(x, y, z, half * Math.sqrt(3));
        for (int k = 0; k < 8; k++) {
            integrate(local, x + ((k & 1) == 0 ? -q : q), y + ((k & 2) == 0 ? -q : q), z + ((k & 4) == 0 ? -q : q),
                q, levels - 1, acc);
        }
    }

    /**
     * Shells {@code S} and lateral divisions {@code m} for about {@code target} tetrahedral mascons: pieces of the
     * outermost shell roughly as thick as they are wide ({@code 2S/m ≈ R/h}, R the mean facet distance from the centre
     * of mass, h the mean facet size), {@code F·m²·S ≈ target}; when the target is below {@code F·S} for that S,
     * {@code m = 1} and {@code S ≈ target/F}. At least one piece per facet.
     *
     * @return {@code {S, m}}
     */
    public static int[] tetraSplit(TriangleMesh mesh, int target) {
        MassProperties mp = MassPropertiesCalculator.unitDensity(mesh);
        double[] com = mp.centerOfMass();
        double[] cen = mesh.facetCentroids();
        int f = mesh.facetCount();
        double r = 0;
        for (int i = 0; i < f; i++) {
            double dx = cen[3 * i] - com[0];
            double dy = cen[3 * i + 1] - com[1];
            double dz = cen[3 * i + 2] - com[2];
            r += Math.sqrt(dx * dx + dy * dy + dz * dz);
        }
        r /= f;
        double hf = Math.sqrt(mp.surfaceArea() / f);
        // Outer shell thickness R·(1 − √(1 − 1/S)) ≈ R/(2S) against a lateral size h/m.
        double s = Math.cbrt((double) target * r * r / (4.0 * f * hf * hf));
        int shells = Math.max(1, (int) Math.round(s));
        if ((double) f * shells > target) {
            // Too few mascons wanted to balance the pieces: one piece per facet and shell, as many shells as fit.
            shells = Math.max(1, (int) Math.round((double) target / f));
        }
        int m = Math.max(1, (int) Math.round(Math.sqrt((double) target / ((double) f * shells))));
        return new int[] {shells, m};
    }

    /**
     * Tetrahedral mascons: {@code F·m²·S} pieces.
     *
     * @param shells radial shells S ≥ 1
     * @param m      lateral divisions per facet edge ≥ 1 (m² sub-triangles per facet)
     */
    public static MasconSet tetrahedral(DensityModel density, int shells, int m, int threads,
                                        ProgressListener progress) {
        if (shells < 1 || m < 1) {
            throw new IllegalArgumentException("shells and divisions must be at least 1");
        }
        TriangleMesh mesh = density.outerShape();
        double[] com = MassPropertiesCalculator.unitDensity(mesh).centerOfMass();
        double[] v = mesh.xyz();
        int[] tri = mesh.tri();
        int f = mesh.facetCount();
        int perFacet = m * m * shells;
        long total = (long) f * perFacet;
        if (total > 100_000_000L) {
            throw new IllegalArgumentException(total + " tetrahedral mascons is too many");
        }
        int n = (int) total;
        double[] xyz = new double[3 * n];
        double[] mass = new double[n];
        double[] sp = new double[n];
        double[] t = new double[shells + 1];
        for (int k = 0; k <= shells; k++) {
            t[k] = Math.sqrt((double) k / shells);
        }
        t[shells] = 1.0;
        // For a homogeneous body every piece takes the one density, even a signed piece whose centroid falls outside
        // a body that is not star-shaped about O: that is what keeps the mass and centre of mass exact.
        final double uniform = density.uniformDensity();
        ParallelChunks.run(f, threads, () -> new double[2], (q, from, to) -> {
            for (int fi = from; fi < to; fi++) {
                int a = 3 * tri[3 * fi];
                int b = 3 * tri[3 * fi + 1];
                int c = 3 * tri[3 * fi + 2];
                double ax = v[a] - com[0];
                double ay = v[a + 1] - com[1];
                double az = v[a + 2] - com[2];
                double ux = (v[b] - v[a]) / m;
                double uy = (v[b + 1] - v[a + 1]) / m;
                double uz = (v[b + 2] - v[a + 2]) / m;
                double wx = (v[c] - v[a]) / m;
                double wy = (v[c + 1] - v[a + 1]) / m;
                double wz = (v[c + 2] - v[a + 2]) / m;
                int out = fi * perFacet;
                for (int i = 0; i < m; i++) {
                    for (int j = 0; i + j < m; j++) {
                        for (int down = 0; down < 2; down++) {
                            if (down == 1 && i + j > m - 2) {
                                continue;
                            }
                            // Sub-triangle corners relative to O, same orientation as the facet.
                            double p1x;
                            double p1y;
                            double p1z;
                            double p2x;
                            double p2y;
                            double p2z;
                            double p3x;
                            double p3y;
                            double p3z;
                            if (down == 0) { // (i,j), (i+1,j), (i,j+1)
                                p1x = ax + i * ux + j * wx;
                                p1y = ay + i * uy + j * wy;
                                p1z = az + i * uz + j * wz;
                                p2x = p1x + ux;
                                p2y = p1y + uy;
                                p2z = p1z + uz;
                                p3x = p1x + wx;
                                p3y = p1y + wy;
                                p3z = p1z + wz;
                            } else { // (i+1,j), (i+1,j+1), (i,j+1)
                                p1x = ax + (i + 1) * ux + j * wx;
                                p1y = ay + (i + 1) * uy + j * wy;
                                p1z = az + (i + 1) * uz + j * wz;
                                p2x = p1x + wx;
                                p2y = p1y + wy;
                                p2z = p1z + wz;
                                p3x = p1x - ux + wx;
                                p3y = p1y - uy + wy;
                                p3z = p1z - uz + wz;
                            }
                            double vol = (p1x * (p2y * p3z - p2z * p3y) + p1y * (p2z * p3x - p2x * p3z)
                                + p1z * (p2x * p3y - p2y * p3x)) / 6.0;
                            double bx = (p1x + p2x + p3x) / 3;
                            double by = (p1y + p2y + p3y) / 3;
                            double bz = (p1z + p2z + p3z) / 3;
                            double lat = Math.max(dist(p1x, p1y, p1z, p2x, p2y, p2z),
                                Math.max(dist(p2x, p2y, p2z, p3x, p3y, p3z), dist(p3x, p3y, p3z, p1x, p1y, p1z)));
                            double rad = Math.max(Math.sqrt(p1x * p1x + p1y * p1y + p1z * p1z),
                                Math.max(Math.sqrt(p2x * p2x + p2y * p2y + p2z * p2z),
                                    Math.sqrt(p3x * p3x + p3y * p3y + p3z * p3z)));
                            for (int k = 1; k <= shells; k++) {
                                double t0 = t[k - 1];
                                double t1 = t[k];
                                double c3 = t1 * t1 * t1 - t0 * t0 * t0;
                                double s = 0.75 * (t1 * t1 * t1 * t1 - t0 * t0 * t0 * t0) / c3;
                                double x = com[0] + s * bx;
                                double y = com[1] + s * by;
                                double z = com[2] + s * bz;
                                double rho = uniform;
                                if (!(rho >= 0)) { // NaN: position-dependent density
                                    density.query(x, y, z, q);
                                    rho = q[0];
                                }
                                xyz[3 * out] = x;
                                xyz[3 * out + 1] = y;
                                xyz[3 * out + 2] = z;
                                mass[out] = rho * vol * c3;
                                sp[out] = Math.max(lat * t1, rad * (t1 - t0));
                                out++;
                            }
                        }
                    }
                }
            }
        }, progress);
        return new MasconSet(xyz, mass, sp, "tetrahedral, " + shells + " shell(s), " + (m * m)
            + " piece(s) per facet");
    }

    private static double dist(double ax, double ay, double az, double bx, double by, double bz) {
        double dx = ax - bx;
        double dy = ay - by;
        double dz = az - bz;
        return Math.sqrt(dx * dx + dy * dy + dz * dz);
    }
}
