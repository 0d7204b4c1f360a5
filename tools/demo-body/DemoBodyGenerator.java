/*
 * Cairn demo-body generator: an INVENTED two-lobed small body for the demo and examples.
 *
 * Run from the repository root with the Java 17 source-file launcher (no dependencies):
 *     java tools/demo-body/DemoBodyGenerator.java shape-models
 * or from anywhere with tools/make-demo-body. It writes OUT_DIR/demo-bilobe.obj (km) and OUT_DIR/demo-bilobe.json
 * (the model sidecar, keys in docs/model-sidecar.md) and prints a short summary.
 *
 * Construction. The surface is star-shaped about a centre point: every vertex is r(v)·v for a unit direction v and a
 * radius function r > 0, evaluated on a geodesic sphere tessellation (icosahedron, frequency N, 20·N² facets). A
 * star-shaped radial surface over a closed, consistently oriented sphere mesh is closed, 2-manifold, genus 0 and keeps
 * the sphere's outward, counter-clockwise facet order, provided no facet folds over; the program checks that every
 * facet's outward normal has a positive dot product with its centroid direction and stops with exit code 1 otherwise.
 * Before r is applied, the directions are redistributed in polar angle about the long (x) axis so that facets come out
 * of similar size on the elongated body instead of being large at the lobe ends and small at the neck.
 *
 * r(v) = smooth maximum of the ray distances to two overlapping ellipsoids (the lobes; both contain the centre, so
 * their union is star-shaped), times broad random lumps and a few broad concavities; then three level patches (the
 * equipotential surface of an approximate effective potential, a softened mascon grid of the lumpy body plus the
 * centrifugal term, blended in, so that a landing-zone search has level ground), then bowl-shaped craters with raised
 * rims and small boulder bumps, both kept out of the level patches. Finally the vertices are shifted so that the
 * constant-density centre of mass is at the origin and rounded to 1 mm (km with 6 decimals).
 *
 * Reproducible byte for byte: fixed seed, java.util.SplittableRandom (specified algorithm), StrictMath (specified
 * results), sequential loops, Locale.ROOT formatting.
 *
 * Every shape parameter, the density and the spin below are invented; the body resembles no real object.
 */

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.Paths;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.SplittableRandom;

public final class DemoBodyGenerator {
    /** Seed of all random choices (lumps, craters, boulders). */
    static final long SEED = 20261202L;
    /** Geodesic frequency: 20·N² facets, 10·N²+2 vertices. */
    static final int FREQUENCY = 38;
    /** Output base name. */
    static final String BASE = "demo-bilobe";

    /** Invented bulk density, kg/m^3. */
    static final double DENSITY = 1950.0;
    /** Invented sidereal spin period, s (5.2 h). */
    static final double SPIN_PERIOD_S = 5.2 * 3600.0;
    /** Spin pole, model frame (the lobes lie in the x-y plane, so +z is close to the maximum-inertia axis). */
    static final double[] SPIN_AXIS = {0.0, 0.0, 1.0};
    /** Newtonian constant of gravitation, m^3 kg^-1 s^-2 (CODATA 2018); only used to shape the level patches. */
    static final double G = 6.67430e-11;

    /** Lobe ellipsoids (km): centre, semi-axes, rotation angle about z (rad). Both contain the origin. */
    static final double[][] LOBE_CENTRE = {{-0.575, 0.02, 0.0}, {0.585, -0.025, 0.015}};
    static final double[][] LOBE_AXES = {{0.725, 0.63, 0.55}, {0.645, 0.53, 0.475}};
    static final double[] LOBE_YAW = {0.0, 0.14};
    /** Exponent of the smooth maximum (r1^p + r2^p)^(1/p) that fills the crease into a saddle. */
    static final double SMOOTH_MAX_P = 7.0;
    /** Share of the facet-size equalisation (0: plain geodesic directions, 1: equal body area per polar band). */
    static final double EQUALISE = 0.9;
    /** Smallest allowed cosine between a facet's outward normal and its centroid direction (0 = fold-over). */
    static final double MIN_RADIAL_COSINE = 0.0;

    // ---- random features, filled by buildFeatures() ----
    static final List<double[]> LUMPS = new ArrayList<>();     // dx,dy,dz, amplitude (log-radius), width w
    static final List<double[]> PATCHES = new ArrayList<>();   // dx,dy,dz, potential, -, -, -, inner/outer angle
    static final List<double[]> CRATERS = new ArrayList<>();   // dx,dy,dz, angular radius, depth km, rim km
    static final List<double[]> BOULDERS = new ArrayList<>();  // dx,dy,dz, angular radius, height km

    public static void main(String[] args) throws IOException {
        if (args.length != 1) {
            System.err.println("usage: java tools/demo-body/DemoBodyGenerator.java OUT_DIR   (e.g. shape-models)");
            System.exit(2);
        }
        Path outDir = Paths.get(args[0]);
        Files.createDirectories(outDir);
        buildFeatures();

        // 1. geodesic sphere
        List<double[]> dirs = new ArrayList<>();
        int[] tri = geodesicSphere(FREQUENCY, dirs);
        int nv = dirs.size();
        int nf = tri.length / 3;

        // 2. facet-size equalisation in polar angle about x, then the radius function
        double[] warp = polarWarpTable();
        double[] xyz = new double[3 * nv];
        for (int i = 0; i < nv; i++) {
            double[] v = warpDirection(dirs.get(i), warp);
            double r = radius(v);
            xyz[3 * i] = r * v[0];
            xyz[3 * i + 1] = r * v[1];
            xyz[3 * i + 2] = r * v[2];
        }

        // 3. centre of mass (constant density) to the origin, round to 1 mm
        double[] com = centroid(xyz, tri);
        double[] star = {-com[0], -com[1], -com[2]};
        for (int i = 0; i < nv; i++) {
            for (int k = 0; k < 3; k++) {
                xyz[3 * i + k] = Double.parseDouble(fmt(xyz[3 * i + k] - com[k]));
            }
        }

        // 4. checks on the rounded coordinates actually written
        String problem = check(xyz, tri, star);
        if (problem != null) {
            System.err.println("DemoBodyGenerator: FAILED: " + problem);
            System.exit(1);
        }
        Stats s = stats(xyz, tri, star);

        // 5. write
        writeObj(outDir.resolve(BASE + ".obj"), xyz, tri, s);
        writeSidecar(outDir.resolve(BASE + ".json"));
        System.out.printf(Locale.ROOT, "wrote %s: %d vertices, %d facets, volume %.4f km^3, "
                + "box %.3f x %.3f x %.3f km%n", outDir.resolve(BASE + ".obj"), nv, nf, s.volume,
            s.max[0] - s.min[0], s.max[1] - s.min[1], s.max[2] - s.min[2]);
        System.out.printf(Locale.ROOT, "facet area max/min %.2f, (99th/1st percentile %.2f), min quality %.3f, "
            + "min normal-radial cosine %.3f, mean edge %.1f m%n", s.areaMax / s.areaMin, s.areaP99 / s.areaP01, s.minQuality,
            s.minRadialCos, 1000 * s.meanEdge);
        for (double[] p : PATCHES) {
            double[] d = {p[0], p[1], p[2]};
            double r = radius(d);
            System.out.printf(Locale.ROOT, "level patch centre (%.3f, %.3f, %.3f) km, level-ground radius about %.0f m%n",
                r * d[0] - com[0], r * d[1] - com[1], r * d[2] - com[2], 1000 * p[7] * lumpyRadius(d));
        }
        System.out.printf("%d lumps, %d level patches, %d craters, %d boulders%n", LUMPS.size(), PATCHES.size(),
            CRATERS.size(), BOULDERS.size());
        System.out.println("wrote " + outDir.resolve(BASE + ".json"));
    }

    // ------------------------------------------------------------------ features

    static void buildFeatures() {
        SplittableRandom rnd = new SplittableRandom(SEED);
        // broad random lumps: log-radius bumps exp((v·d - 1)/w)
        for (int k = 0; k < 28; k++) {
            double[] d = randomDirection(rnd);
            LUMPS.add(new double[] {d[0], d[1], d[2], uniform(rnd, -0.055, 0.055), uniform(rnd, 0.015, 0.07)});
        }
        // broad concavities (chosen, not random): lobe 1 -y flank, lobe 2 +y/+z shoulder, lobe 1 end underside
        addLump(-0.45, -0.85, -0.15, -0.13, 0.05);
        addLump(0.55, 0.55, 0.45, -0.12, 0.04);
        addLump(-0.85, 0.1, -0.5, -0.10, 0.03);
        buildMascons();

        // level patches: top of lobe 1, far end of lobe 2, +y flank of lobe 1 (inner radius km, outer/inner ratio)
        addPatch(new double[] {-0.50, 0.08, 0.62}, 0.19, 1.7);
        addPatch(new double[] {0.97, -0.12, 0.10}, 0.16, 1.7);
        addPatch(new double[] {-0.55, 0.80, -0.05}, 0.15, 1.7);

        // craters: a few chosen large ones, then random ones kept away from the patches
        addCrater(rnd, new double[] {0.55, -0.6, -0.45}, 0.29);
        addCrater(rnd, new double[] {-0.75, -0.15, -0.65}, 0.24);
        addCrater(rnd, new double[] {0.2, 0.3, 0.95}, 0.17);
        int tries = 0;
        while (CRATERS.size() < 12 && tries++ < 1000) {
            addCrater(rnd, randomDirection(rnd), uniform(rnd, 0.06, 0.15));
        }
        // boulders: small bumps, not inside the patches
        tries = 0;
        while (BOULDERS.size() < 70 && tries++ < 5000) {
            double[] d = randomDirection(rnd);
            double rad = uniform(rnd, 0.035, 0.065);
            double r0 = baseRadius(d);
            double ang = rad / r0;
            if (nearPatch(d, ang, 1.05)) {
                continue;
            }
            BOULDERS.add(new double[] {d[0], d[1], d[2], ang, rad * uniform(rnd, 0.3, 0.45)});
        }
    }

    static void addLump(double x, double y, double z, double amplitude, double width) {
        double[] d = unit(x, y, z);
        LUMPS.add(new double[] {d[0], d[1], d[2], amplitude, width});
    }

    /**
     * A level patch: the surface within {@code innerKm} of the lumpy surface point in direction d is replaced by the
     * equipotential surface of the approximate effective potential (see {@link #effectivePotential}) through that
     * point, blended back into the lumpy surface over an annulus out to {@code outerRatio} times the inner radius.
     */
    static void addPatch(double[] dir, double innerKm, double outerRatio) {
        double[] d = unit(dir[0], dir[1], dir[2]);
        double r0 = lumpyRadius(d);
        double inner = innerKm / r0;
        double u0 = effectivePotential(r0 * d[0], r0 * d[1], r0 * d[2]);
        PATCHES.add(new double[] {d[0], d[1], d[2], u0, 0, 0, 0, inner, inner * outerRatio});
    }

    static void addCrater(SplittableRandom rnd, double[] dir, double radiusKm) {
        double[] d = unit(dir[0], dir[1], dir[2]);
        double ang = radiusKm / baseRadius(d);
        if (nearPatch(d, ang, 1.15)) {
            return;
        }
        double depth = radiusKm * uniform(rnd, 0.28, 0.38);   // depth/diameter 0.14-0.19
        double rim = radiusKm * uniform(rnd, 0.06, 0.10);
        CRATERS.add(new double[] {d[0], d[1], d[2], ang, depth, rim});
    }

    static boolean nearPatch(double[] d, double ang, double factor) {
        for (double[] p : PATCHES) {
            double a = angle(d, p);
            if (a < factor * (p[8] + ang)) {
                return true;
            }
        }
        return false;
    }

    /** Mascon grid spacing (km) and softening length (km) of the approximate potential used for level patches. */
    static final double MASCON_STEP = 0.04;
    static final double MASCON_SOFTENING = 0.03;
    static double[] mascons;       // x, y, z (km), one cell per point, inside the lumpy surface
    static double masconGm;        // G·ρ·h^3 per cell, m^3/s^2
    static final double[] MASCON_COM = new double[3];

    /** Fills the cubic grid of equal point masses that approximates the lumpy body (no craters, boulders, patches). */
    static void buildMascons() {
        List<double[]> cells = new ArrayList<>();
        double h = MASCON_STEP;
        int nx = (int) StrictMath.ceil(1.6 / h);
        int ny = (int) StrictMath.ceil(1.0 / h);
        for (int i = -nx; i < nx; i++) {
            for (int j = -ny; j < ny; j++) {
                for (int k = -ny; k < ny; k++) {
                    double x = (i + 0.5) * h;
                    double y = (j + 0.5) * h;
                    double z = (k + 0.5) * h;
                    double r = StrictMath.sqrt(x * x + y * y + z * z);
                    if (r < lumpyRadius(new double[] {x / r, y / r, z / r})) {
                        cells.add(new double[] {x, y, z});
                    }
                }
            }
        }
        mascons = new double[3 * cells.size()];
        for (int c = 0; c < cells.size(); c++) {
            for (int k = 0; k < 3; k++) {
                mascons[3 * c + k] = cells.get(c)[k];
                MASCON_COM[k] += cells.get(c)[k] / cells.size();
            }
        }
        masconGm = G * DENSITY * StrictMath.pow(h * 1000.0, 3);
    }

    /**
     * Approximate effective potential (m^2/s^2, positive convention) at (x, y, z) km: softened mascon grid plus the
     * centrifugal term ω²/2·(distance from the spin axis through the grid's centre of mass)², spin about +z.
     */
    static double effectivePotential(double x, double y, double z) {
        double eps2 = sq(MASCON_SOFTENING);
        double u = 0;
        for (int c = 0; c < mascons.length; c += 3) {
            u += 1.0 / StrictMath.sqrt(sq(x - mascons[c]) + sq(y - mascons[c + 1]) + sq(z - mascons[c + 2]) + eps2);
        }
        double w = 2 * StrictMath.PI / SPIN_PERIOD_S;
        return masconGm * u / 1000.0
            + 0.5 * w * w * (sq(x - MASCON_COM[0]) + sq(y - MASCON_COM[1])) * 1e6;
    }

    /** Radius (km) along unit v where the effective potential equals u0, by bisection about the reference radius. */
    static double levelRadius(double[] v, double u0, double ref) {
        double lo = 0.75 * ref;
        double hi = 1.3 * ref;
        if (!(effectivePotential(lo * v[0], lo * v[1], lo * v[2]) > u0)
            || !(effectivePotential(hi * v[0], hi * v[1], hi * v[2]) < u0)) {
            throw new IllegalStateException("level patch: no equipotential crossing along " + Arrays.toString(v));
        }
        for (int it = 0; it < 40; it++) {
            double mid = 0.5 * (lo + hi);
            if (effectivePotential(mid * v[0], mid * v[1], mid * v[2]) > u0) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return 0.5 * (lo + hi);
    }

    // ------------------------------------------------------------------ radius function

    /** Ray distance (km) from the origin along unit v to the surface of lobe k (the origin is inside it). */
    static double lobeRadius(int k, double[] v) {
        double c = StrictMath.cos(LOBE_YAW[k]);
        double s = StrictMath.sin(LOBE_YAW[k]);
        double[] o = LOBE_CENTRE[k];
        double[] a = LOBE_AXES[k];
        // ellipsoid frame: rotate by -yaw about z
        double qx = c * -o[0] + s * -o[1];
        double qy = -s * -o[0] + c * -o[1];
        double qz = -o[2];
        double wx = c * v[0] + s * v[1];
        double wy = -s * v[0] + c * v[1];
        double wz = v[2];
        double aa = sq(wx / a[0]) + sq(wy / a[1]) + sq(wz / a[2]);
        double bb = qx * wx / sq(a[0]) + qy * wy / sq(a[1]) + qz * wz / sq(a[2]);
        double cc = sq(qx / a[0]) + sq(qy / a[1]) + sq(qz / a[2]) - 1.0;
        if (!(cc < 0)) {
            throw new IllegalStateException("lobe " + k + " does not contain the centre");
        }
        return (-bb + StrictMath.sqrt(bb * bb - aa * cc)) / aa;
    }

    /** The two lobes joined by a smooth maximum (a filled saddle at the neck). */
    static double baseRadius(double[] v) {
        double r1 = lobeRadius(0, v);
        double r2 = lobeRadius(1, v);
        double m = Math.max(r1, r2);
        return m * StrictMath.pow(StrictMath.pow(r1 / m, SMOOTH_MAX_P) + StrictMath.pow(r2 / m, SMOOTH_MAX_P),
            1.0 / SMOOTH_MAX_P);
    }

    static double lumpyRadius(double[] v) {
        double e = 0;
        for (double[] l : LUMPS) {
            e += l[3] * StrictMath.exp((v[0] * l[0] + v[1] * l[1] + v[2] * l[2] - 1.0) / l[4]);
        }
        return baseRadius(v) * StrictMath.exp(e);
    }

    /** The full radius function (km) of unit direction v. */
    static double radius(double[] v) {
        double r = lumpyRadius(v);
        for (double[] p : PATCHES) {
            double a = angle(v, p);
            if (a >= p[8]) {
                continue;
            }
            double wgt = a <= p[7] ? 1.0 : smooth((p[8] - a) / (p[8] - p[7]));
            r += wgt * (levelRadius(v, p[3], r) - r);
        }
        for (double[] c : CRATERS) {
            double s = angle(v, c) / c[3];
            double h = c[5] * StrictMath.exp(-sq((s - 1.0) / 0.32));
            if (s < 1.0) {
                h -= c[4] * (1.0 - s * s);
            }
            r += h;
        }
        for (double[] b : BOULDERS) {
            double s = angle(v, b) / b[3];
            if (s < 3.0) {
                r += b[4] * StrictMath.exp(-2.5 * s * s);
            }
        }
        if (!(r > 0)) {
            throw new IllegalStateException("radius function not positive");
        }
        return r;
    }

    // ------------------------------------------------------------------ facet-size equalisation

    static final int WARP_BANDS = 1440;

    /**
     * Table F[k] (k = 0..WARP_BANDS) of the mixed cumulative area fraction at polar angle θ = kπ/WARP_BANDS about +x:
     * (1-EQUALISE)·(sphere fraction) + EQUALISE·(body surface fraction), body = lumpy surface without small features.
     */
    static double[] polarWarpTable() {
        int nphi = 180;
        double dt = StrictMath.PI / WARP_BANDS;
        double dp = 2 * StrictMath.PI / nphi;
        double h = 1e-4;
        double[] body = new double[WARP_BANDS + 1];
        for (int k = 0; k < WARP_BANDS; k++) {
            double t = (k + 0.5) * dt;
            double band = 0;
            for (int j = 0; j < nphi; j++) {
                double p = (j + 0.5) * dp;
                double r = lumpyRadius(polar(t, p));
                double rt = (lumpyRadius(polar(t + h, p)) - lumpyRadius(polar(t - h, p))) / (2 * h);
                double rp = (lumpyRadius(polar(t, p + h)) - lumpyRadius(polar(t, p - h))) / (2 * h)
                    / StrictMath.sin(t);
                band += r * StrictMath.sqrt(r * r + rt * rt + rp * rp) * StrictMath.sin(t) * dt * dp;
            }
            body[k + 1] = body[k] + band;
        }
        double[] f = new double[WARP_BANDS + 1];
        for (int k = 0; k <= WARP_BANDS; k++) {
            double sphere = (1 - StrictMath.cos(k * dt)) / 2;
            f[k] = (1 - EQUALISE) * sphere + EQUALISE * body[k] / body[WARP_BANDS];
        }
        f[WARP_BANDS] = 1.0;
        return f;
    }

    /** Maps a unit direction: polar angle θ about +x goes to F^-1((1-cos θ)/2); the azimuth is kept. */
    static double[] warpDirection(double[] u, double[] f) {
        double rho = StrictMath.sqrt(u[1] * u[1] + u[2] * u[2]);
        if (rho == 0) { // exactly on the x axis: a fixed point of the map
            return u.clone();
        }
        double target = (1 - u[0]) / 2; // (1 - cos θ)/2
        int lo = 0;
        int hi = WARP_BANDS;
        while (hi - lo > 1) {
            int mid = (lo + hi) >>> 1;
            if (f[mid] <= target) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        double frac = (target - f[lo]) / (f[hi] - f[lo]);
        double g = (lo + frac) * StrictMath.PI / WARP_BANDS;
        double sg = StrictMath.sin(g);
        return new double[] {StrictMath.cos(g), sg * u[1] / rho, sg * u[2] / rho};
    }

    static double[] polar(double t, double p) {
        double s = StrictMath.sin(t);
        return new double[] {StrictMath.cos(t), s * StrictMath.cos(p), s * StrictMath.sin(p)};
    }

    // ------------------------------------------------------------------ geodesic sphere

    /**
     * Frequency-n geodesic subdivision of the icosahedron, projected to the unit sphere. Facets are counter-clockwise
     * seen from outside. Shared vertices are identified exactly by their integer barycentric weights on icosahedron
     * vertices, and their coordinates are computed from the same sorted weights, so they are bit-identical.
     */
    static int[] geodesicSphere(int n, List<double[]> out) {
        double phi = (1 + StrictMath.sqrt(5)) / 2;
        double[][] ico = new double[12][];
        int q = 0;
        for (int s1 = -1; s1 <= 1; s1 += 2) {
            for (int s2 = -1; s2 <= 1; s2 += 2) {
                ico[q++] = unit(0, s1, s2 * phi);
                ico[q++] = unit(s1, s2 * phi, 0);
                ico[q++] = unit(s2 * phi, 0, s1);
            }
        }
        double edge2 = 4.0 / (1 + phi * phi); // squared edge of the unit icosahedron
        List<int[]> faces = new ArrayList<>();
        for (int a = 0; a < 12; a++) {
            for (int b = a + 1; b < 12; b++) {
                for (int c = b + 1; c < 12; c++) {
                    if (near(dist2(ico[a], ico[b]), edge2) && near(dist2(ico[b], ico[c]), edge2)
                        && near(dist2(ico[a], ico[c]), edge2)) {
                        double[] nrm = cross(sub(ico[b], ico[a]), sub(ico[c], ico[a]));
                        double[] cen = {ico[a][0] + ico[b][0] + ico[c][0], ico[a][1] + ico[b][1] + ico[c][1],
                            ico[a][2] + ico[b][2] + ico[c][2]};
                        faces.add(dot(nrm, cen) > 0 ? new int[] {a, b, c} : new int[] {a, c, b});
                    }
                }
            }
        }
        if (faces.size() != 20) {
            throw new IllegalStateException("icosahedron has " + faces.size() + " faces");
        }
        Map<Long, Integer> index = new HashMap<>();
        int[] tri = new int[3 * 20 * n * n];
        int t = 0;
        for (int[] f : faces) {
            int[][] id = new int[n + 1][];
            for (int i = 0; i <= n; i++) {
                id[i] = new int[n + 1 - i];
                for (int j = 0; j <= n - i; j++) {
                    id[i][j] = vertex(ico, new int[] {f[0], f[1], f[2]}, new int[] {n - i - j, i, j}, n, index, out);
                }
            }
            for (int i = 0; i < n; i++) {
                for (int j = 0; j < n - i; j++) {
                    tri[t++] = id[i][j];
                    tri[t++] = id[i + 1][j];
                    tri[t++] = id[i][j + 1];
                    if (i + j < n - 1) {
                        tri[t++] = id[i + 1][j];
                        tri[t++] = id[i + 1][j + 1];
                        tri[t++] = id[i][j + 1];
                    }
                }
            }
        }
        if (out.size() != 10 * n * n + 2) {
            throw new IllegalStateException("geodesic sphere has " + out.size() + " vertices");
        }
        return tri;
    }

    static int vertex(double[][] ico, int[] corner, int[] weight, int n, Map<Long, Integer> index,
                      List<double[]> out) {
        // sort (corner, weight) pairs by corner id, drop zero weights
        int[][] pairs = new int[3][];
        for (int k = 0; k < 3; k++) {
            pairs[k] = new int[] {corner[k], weight[k]};
        }
        Arrays.sort(pairs, (x, y) -> Integer.compare(x[0], y[0]));
        long key = 0;
        double[] p = new double[3];
        for (int[] pr : pairs) {
            if (pr[1] == 0) {
                continue;
            }
            key = (key << 12) | ((long) pr[0] << 8) | pr[1];
            for (int k = 0; k < 3; k++) {
                p[k] += pr[1] * ico[pr[0]][k];
            }
        }
        Integer got = index.get(key);
        if (got != null) {
            return got;
        }
        double len = norm(p);
        out.add(new double[] {p[0] / len, p[1] / len, p[2] / len});
        index.put(key, out.size() - 1);
        return out.size() - 1;
    }

    // ------------------------------------------------------------------ checks and statistics

    /** Constant-density centroid of the closed surface (signed tetrahedra from the origin). */
    static double[] centroid(double[] xyz, int[] tri) {
        double v6 = 0;
        double[] c = new double[3];
        for (int f = 0; f < tri.length / 3; f++) {
            int a = 3 * tri[3 * f];
            int b = 3 * tri[3 * f + 1];
            int d = 3 * tri[3 * f + 2];
            double det = xyz[a] * (xyz[b + 1] * xyz[d + 2] - xyz[b + 2] * xyz[d + 1])
                - xyz[a + 1] * (xyz[b] * xyz[d + 2] - xyz[b + 2] * xyz[d])
                + xyz[a + 2] * (xyz[b] * xyz[d + 1] - xyz[b + 1] * xyz[d]);
            v6 += det;
            for (int k = 0; k < 3; k++) {
                c[k] += det * (xyz[a + k] + xyz[b + k] + xyz[d + k]) / 4.0;
            }
        }
        return new double[] {c[0] / v6, c[1] / v6, c[2] / v6};
    }

    /** Returns a description of the first problem, or null: closure, orientation, fold-over, degenerate facets. */
    static String check(double[] xyz, int[] tri, double[] star) {
        int nf = tri.length / 3;
        int nv = xyz.length / 3;
        // every directed edge once, and its reverse once
        Map<Long, Integer> directed = new HashMap<>();
        for (int f = 0; f < nf; f++) {
            for (int k = 0; k < 3; k++) {
                long key = (long) tri[3 * f + k] * nv + tri[3 * f + (k + 1) % 3];
                if (directed.put(key, f) != null) {
                    return "directed edge used twice (facet " + f + "): orientation or manifold error";
                }
            }
        }
        for (long key : directed.keySet()) {
            long rev = (key % nv) * nv + key / nv;
            if (!directed.containsKey(rev)) {
                return "open edge " + key / nv + "-" + key % nv;
            }
        }
        if (nv - directed.size() / 2 + nf != 2) {
            return "Euler characteristic is not 2";
        }
        for (int f = 0; f < nf; f++) {
            double[] nrm = facetNormal(xyz, tri, f);
            double[] c = facetCentroid(xyz, tri, f);
            double[] dir = {c[0] - star[0], c[1] - star[1], c[2] - star[2]};
            double cos = dot(nrm, dir) / (norm(nrm) * norm(dir));
            if (!(cos > MIN_RADIAL_COSINE)) {
                return "facet " + f + " folds over (normal-radial cosine " + cos + "): the radius function is not "
                    + "star-shaped at this resolution; soften the feature near " + Arrays.toString(c) + " km";
            }
        }
        return null;
    }

    static final class Stats {
        double volume;
        double[] min = {Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE};
        double[] max = {-Double.MAX_VALUE, -Double.MAX_VALUE, -Double.MAX_VALUE};
        double areaMin = Double.MAX_VALUE;
        double areaMax;
        double areaP01;
        double areaP99;
        double meanEdge;
        double minQuality = Double.MAX_VALUE;
        double minRadialCos = Double.MAX_VALUE;
    }

    static Stats stats(double[] xyz, int[] tri, double[] star) {
        Stats s = new Stats();
        int nf = tri.length / 3;
        double[] areas = new double[nf];
        double v6 = 0;
        double edgeSum = 0;
        for (int f = 0; f < nf; f++) {
            double[] nrm = facetNormal(xyz, tri, f);
            double area = norm(nrm) / 2;
            areas[f] = area;
            s.areaMin = Math.min(s.areaMin, area);
            s.areaMax = Math.max(s.areaMax, area);
            double l2 = 0;
            for (int k = 0; k < 3; k++) {
                int a = 3 * tri[3 * f + k];
                int b = 3 * tri[3 * f + (k + 1) % 3];
                double e2 = sq(xyz[a] - xyz[b]) + sq(xyz[a + 1] - xyz[b + 1]) + sq(xyz[a + 2] - xyz[b + 2]);
                l2 += e2;
                edgeSum += StrictMath.sqrt(e2);
            }
            s.minQuality = Math.min(s.minQuality, 4 * StrictMath.sqrt(3) * area / l2);
            double[] c = facetCentroid(xyz, tri, f);
            double[] dir = {c[0] - star[0], c[1] - star[1], c[2] - star[2]};
            s.minRadialCos = Math.min(s.minRadialCos, dot(nrm, dir) / (norm(nrm) * norm(dir)));
            int a = 3 * tri[3 * f];
            v6 += dot(new double[] {xyz[a], xyz[a + 1], xyz[a + 2]}, nrm);
        }
        for (int i = 0; i < xyz.length; i++) {
            s.min[i % 3] = Math.min(s.min[i % 3], xyz[i]);
            s.max[i % 3] = Math.max(s.max[i % 3], xyz[i]);
        }
        s.volume = v6 / 6;
        s.meanEdge = edgeSum / (3 * nf);
        Arrays.sort(areas);
        s.areaP01 = areas[nf / 100];
        s.areaP99 = areas[nf - 1 - nf / 100];
        return s;
    }

    // ------------------------------------------------------------------ output

    static void writeObj(Path file, double[] xyz, int[] tri, Stats s) throws IOException {
        StringBuilder sb = new StringBuilder(64 * (xyz.length / 3 + tri.length / 3));
        sb.append("# Cairn demo body \"demo-bilobe\": an INVENTED two-lobed small body (not a real object).\n");
        sb.append("# Generated by tools/demo-body/DemoBodyGenerator.java (seed ").append(SEED)
            .append(", geodesic frequency ").append(FREQUENCY).append("); regenerate with tools/make-demo-body.\n");
        sb.append("# Do not edit by hand. Length unit: km. Model frame: origin at the constant-density centre of mass,\n");
        sb.append("# lobes along x, spin pole near +z. Facets counter-clockwise seen from outside; closed, genus 0.\n");
        sb.append(String.format(Locale.ROOT, "# %d vertices, %d facets, volume %.4f km^3, bounding box %.3f x %.3f x "
                + "%.3f km.%n", xyz.length / 3, tri.length / 3, s.volume, s.max[0] - s.min[0], s.max[1] - s.min[1],
            s.max[2] - s.min[2]));
        sb.append(String.format(Locale.ROOT, "# Features: two lobes and a neck, %d lumps and concavities, %d level "
            + "patches, %d craters, %d boulders.%n", LUMPS.size(), PATCHES.size(), CRATERS.size(), BOULDERS.size()));
        sb.append("# Density and spin are in demo-bilobe.json beside this file (also invented).\n");
        sb.append("# For demonstration only: results computed from it must not be used for any operation.\n");
        for (int i = 0; i < xyz.length; i += 3) {
            sb.append("v ").append(fmt(xyz[i])).append(' ').append(fmt(xyz[i + 1])).append(' ')
                .append(fmt(xyz[i + 2])).append('\n');
        }
        for (int f = 0; f < tri.length; f += 3) {
            sb.append("f ").append(tri[f] + 1).append(' ').append(tri[f + 1] + 1).append(' ').append(tri[f + 2] + 1)
                .append('\n');
        }
        writeAtomically(file, sb.toString());
    }

    static void writeSidecar(Path file) throws IOException {
        String json = "{\n"
            + "  \"name\": \"Bilobe demo body (invented)\",\n"
            + "  \"description\": \"Invented two-lobed small body for the Cairn demo, generated by "
            + "tools/demo-body/DemoBodyGenerator.java (seed " + SEED + "). Not a real object.\",\n"
            + "  \"note\": \"All values here are invented for the demo (density, spin period 5.2 h, pole +z). "
            + "Not for operational use.\",\n"
            + "  \"length_unit\": \"km\",\n"
            + "  \"density_kg_m3\": " + fmtPlain(DENSITY) + ",\n"
            + "  \"spin_period_s\": " + fmtPlain(SPIN_PERIOD_S) + ",\n"
            + "  \"spin_axis\": [" + fmtPlain(SPIN_AXIS[0]) + ", " + fmtPlain(SPIN_AXIS[1]) + ", "
            + fmtPlain(SPIN_AXIS[2]) + "]\n"
            + "}\n";
        writeAtomically(file, json);
    }

    static void writeAtomically(Path file, String text) throws IOException {
        Path tmp = file.resolveSibling(file.getFileName() + ".tmp");
        try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8)) {
            w.write(text);
        }
        Files.move(tmp, file, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
    }

    /** km with 6 decimals (1 mm), about 7 significant digits; "-0.000000" written as "0.000000". */
    static String fmt(double x) {
        String s = String.format(Locale.ROOT, "%.6f", x);
        return s.equals("-0.000000") ? "0.000000" : s;
    }

    static String fmtPlain(double x) {
        return x == Math.rint(x) ? String.format(Locale.ROOT, "%.1f", x) : Double.toString(x);
    }

    // ------------------------------------------------------------------ small vector helpers

    static double[] facetNormal(double[] xyz, int[] tri, int f) {
        int a = 3 * tri[3 * f];
        int b = 3 * tri[3 * f + 1];
        int c = 3 * tri[3 * f + 2];
        double[] u = {xyz[b] - xyz[a], xyz[b + 1] - xyz[a + 1], xyz[b + 2] - xyz[a + 2]};
        double[] v = {xyz[c] - xyz[a], xyz[c + 1] - xyz[a + 1], xyz[c + 2] - xyz[a + 2]};
        return cross(u, v);
    }

    static double[] facetCentroid(double[] xyz, int[] tri, int f) {
        double[] c = new double[3];
        for (int k = 0; k < 3; k++) {
            int a = 3 * tri[3 * f + k];
            c[0] += xyz[a] / 3;
            c[1] += xyz[a + 1] / 3;
            c[2] += xyz[a + 2] / 3;
        }
        return c;
    }

    static double[] randomDirection(SplittableRandom rnd) {
        double z = 2 * rnd.nextDouble() - 1;
        double p = 2 * StrictMath.PI * rnd.nextDouble();
        double s = StrictMath.sqrt(1 - z * z);
        return new double[] {s * StrictMath.cos(p), s * StrictMath.sin(p), z};
    }

    static double uniform(SplittableRandom rnd, double lo, double hi) {
        return lo + (hi - lo) * rnd.nextDouble();
    }

    /** Angle (rad) between unit v and the unit vector in the first three slots of d; accurate for small angles. */
    static double angle(double[] v, double[] d) {
        double[] c = cross(v, d);
        return StrictMath.atan2(norm(c), v[0] * d[0] + v[1] * d[1] + v[2] * d[2]);
    }

    static double smooth(double t) {
        return t * t * (3 - 2 * t);
    }

    static double[] unit(double x, double y, double z) {
        double n = StrictMath.sqrt(x * x + y * y + z * z);
        return new double[] {x / n, y / n, z / n};
    }

    static double sq(double x) {
        return x * x;
    }

    static double norm(double[] a) {
        return StrictMath.sqrt(a[0] * a[0] + a[1] * a[1] + a[2] * a[2]);
    }

    static double dot(double[] a, double[] b) {
        return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
    }

    static double[] cross(double[] a, double[] b) {
        return new double[] {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]};
    }

    static double[] sub(double[] a, double[] b) {
        return new double[] {a[0] - b[0], a[1] - b[1], a[2] - b[2]};
    }

    static double dist2(double[] a, double[] b) {
        return sq(a[0] - b[0]) + sq(a[1] - b[1]) + sq(a[2] - b[2]);
    }

    static boolean near(double a, double b) {
        return Math.abs(a - b) < 1e-9;
    }

    private DemoBodyGenerator() {
    }
}
