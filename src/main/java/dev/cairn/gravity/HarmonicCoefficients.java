package dev.cairn.gravity;

import dev.cairn.mesh.TriangleMesh;
import java.util.List;

/**
 * Fully normalised spherical-harmonic (Stokes) coefficients C̄_nm, S̄_nm of a body's exterior potential,
 * n ≤ {@link #degree()}, 0 ≤ m ≤ n, about an origin with a reference radius R, in the axes of the model frame:
 * <pre>
 *   U = (GM/r) Σ_n (R/r)^n Σ_m P̄_nm(sin φ) [C̄_nm cos mλ + S̄_nm sin mλ]
 *   P̄_nm = N_nm P_nm,  N_nm = √((2 − δ_m0)(2n + 1)(n − m)!/(n + m)!)
 * </pre>
 * with φ the latitude and λ the longitude (from +x, counter-clockwise about +z) of the point about the origin, P_nm
 * the associated Legendre functions without the Condon–Shortley phase (4π full normalisation: the mean of P̄_nm² cos²
 * over the sphere is 1; Kaula 1966, Heiskanen &amp; Moritz 1967, shared references §5).
 *
 * <p>Computation from constant-density polyhedra (superposed with density contrasts for region bodies): the mass
 * moments μ_n^m = Σ_i ρ_i ∫_{V_i} conj R_n^m(y − c) dV ({@link SolidHarmonics} normalisation; volume moments of
 * {@link BodyExpansion#volumeMoments}: cone formula over the facets, exact triangle rule) give, since
 * 1/|x − y| = Σ_n Σ_m w_m Re(conj R_n^m(y) I_n^m(x)) with w_0 = 1, w_m = 2 and
 * I_n^m = (n − m)! P_n^m(cos θ) e^{imλ}/r^{n+1},
 * <pre>
 *   U = G Σ_n Σ_m w_m (n − m)! P_nm (Re μ cos mλ − Im μ sin mλ)/r^{n+1}
 *   C_nm = w_m (n − m)! Re μ_n^m / (M R^n),  S_nm = −w_m (n − m)! Im μ_n^m / (M R^n),  C̄ = C/N_nm, S̄ = S/N_nm.
 * </pre>
 * Moments are taken in coordinates scaled by the largest vertex distance a from the origin, so (a/R)^n and the
 * factorials stay in range to degree {@link #MAX_DEGREE}. The series converges outside the sphere of radius
 * {@link #brillouinRadius()} about the origin and generically diverges inside it.
 */
public final class HarmonicCoefficients {
    /** Largest degree: the exact triangle rule ({@link TriangleQuadrature}) reaches degree 60. */
    public static final int MAX_DEGREE = 60;
    /**
     * Accepted reference and Brillouin radii, metres: a millimetre to the program's largest point coordinate
     * ({@link dev.cairn.io.Numbers#MAX_POINT_M}); GM/(G R³) and R^n stay in range for every degree there (common
     * practice, no source).
     */
    public static final double MIN_RADIUS_M = 1e-3;
    public static final double MAX_RADIUS_M = 1e15;
    /** Largest accepted GM, m³/s²: about 1e5 solar GMs, far above any body this program models (no source). */
    public static final double MAX_GM = 1e25;
    /**
     * Largest accepted |C̄nm|, |S̄nm| in a file: about √2 when the reference radius holds all mass, growing as
     * (R_B/R)^n for a smaller one; 1e30 leaves room for that and keeps the series finite (no source).
     */
    public static final double MAX_COEFFICIENT = 1e30;

    private final double gm;
    private final double referenceRadius;
    private final double brillouinRadius;
    private final double[] origin;
    private final int degree;
    private final double[][] c;
    private final double[][] s;
    private final double truncationBound;

    /** Meshes with at least this many facets take the clustered moments ({@link ClusteredMoments}). */
    public static final int CLUSTERED_MIN_FACETS = 4096;
    /** Per-group truncation target of the clustered moments on normalised coefficients. */
    public static final double CLUSTERED_EPSILON = 1e-16;

    /**
     * @param gm              GM, m^3/s^2 (positive)
     * @param referenceRadius R, m (positive)
     * @param brillouinRadius radius of the smallest sphere about the origin holding all mass, m (NaN: unknown)
     * @param origin          origin of the expansion in the model frame, m
     * @param c               C̄ as {@code c[n][m]}, m ≤ n (copied)
     * @param s               S̄ likewise (S̄_n0 = 0)
     */
    public HarmonicCoefficients(double gm, double referenceRadius, double brillouinRadius, double[] origin,
                                double[][] c, double[][] s) {
        this(gm, referenceRadius, brillouinRadius, origin, c, s, 0);
    }

    /**
     * As above, with {@code truncationBound}: an upper bound on the truncation error of every C̄, S̄ from the way
     * they were computed (0: exact up to round-off; {@link ClusteredMoments#bound()}).
     */
    public HarmonicCoefficients(double gm, double referenceRadius, double brillouinRadius, double[] origin,
                                double[][] c, double[][] s, double truncationBound) {
        if (!(truncationBound >= 0) || !Double.isFinite(truncationBound)) {
            throw new IllegalArgumentException("truncation bound must be finite and non-negative");
        }
        this.truncationBound = truncationBound;
        if (!(gm > 0) || !Double.isFinite(gm)) {
            throw new IllegalArgumentException("GM must be positive and finite, got " + gm);
        }
        if (!(referenceRadius > 0) || !Double.isFinite(referenceRadius)) {
            throw new IllegalArgumentException("reference radius must be positive and finite, got " + referenceRadius);
        }
        if (c.length != s.length || c.length == 0 || c.length - 1 > MAX_DEGREE) {
            throw new IllegalArgumentException("coefficient arrays must have 1 to " + (MAX_DEGREE + 1) + " degrees");
        }
        this.gm = gm;
        this.referenceRadius = referenceRadius;
        this.brillouinRadius = brillouinRadius;
        this.origin = origin.clone();
        this.degree = c.length - 1;
        this.c = new double[degree + 1][];
        this.s = new double[degree + 1][];
        for (int n = 0; n <= degree; n++) {
            if (c[n].length != n + 1 || s[n].length != n + 1) {
                throw new IllegalArgumentException("degree " + n + " must have " + (n + 1) + " orders");
            }
            this.c[n] = c[n].clone();
            this.s[n] = s[n].clone();
        }
    }

    /**
     * Coefficients of a body made of constant-density polyhedra (a plain body: one mesh; regions: the outer shape at
     * its density and each inner region at its density contrast) about {@code origin} with reference radius
     * {@code referenceRadius}, to degree {@code degree}.
     *
     * @param meshes    closed outward meshes, metres
     * @param densities density (or contrast) of each mesh, kg/m^3
     * @param threads   worker threads (results do not depend on it)
     */
    public static HarmonicCoefficients ofPolyhedra(List<TriangleMesh> meshes, double[] densities, double[] origin,
                                                   double referenceRadius, int degree, int threads) {
        return ofPolyhedra(meshes, densities, origin, referenceRadius, degree, threads, CLUSTERED_MIN_FACETS,
            CLUSTERED_EPSILON);
    }

    /** The baseline: the direct exact triangle rule over every facet, whatever the facet count (benchmarks). */
    public static HarmonicCoefficients ofPolyhedraDirect(List<TriangleMesh> meshes, double[] densities,
                                                         double[] origin, double referenceRadius, int degree,
                                                         int threads) {
        return ofPolyhedra(meshes, densities, origin, referenceRadius, degree, threads, Integer.MAX_VALUE, 1);
    }

    /**
     * As {@link #ofPolyhedra(List, double[], double[], double, int, int)}, with the facet count from which the
     * clustered moments are used ({@code Integer.MAX_VALUE}: never) and their per-group target (tests, benchmarks).
     */
    static HarmonicCoefficients ofPolyhedra(List<TriangleMesh> meshes, double[] densities, double[] origin,
                                            double referenceRadius, int degree, int threads, int clusteredMinFacets,
                                            double epsilon) {
        if (degree < 0 || degree > MAX_DEGREE) {
            throw new IllegalArgumentException("degree " + degree + " outside 0.." + MAX_DEGREE);
        }
        double a = 0;
        for (TriangleMesh mesh : meshes) {
            a = Math.max(a, maxDistance(mesh, origin));
        }
        int size = SolidHarmonics.size(degree);
        double[] re = new double[size];
        double[] im = new double[size];
        double boundMass = 0; // Σ |ρ_i| V_i · bound_i (scaled), divided by the total below
        for (int i = 0; i < meshes.size(); i++) {
            TriangleMesh mesh = meshes.get(i);
            double[] vr;
            double[] vi;
            if (mesh.facetCount() >= clusteredMinFacets) {
                ClusteredMoments cm = ClusteredMoments.compute(mesh, origin[0], origin[1], origin[2], a, degree,
                    a / referenceRadius, epsilon, threads);
                vr = cm.re();
                vi = cm.im();
                boundMass += Math.abs(densities[i] * vr[0]) * cm.bound();
            } else {
                double[][] v = BodyExpansion.volumeMoments(mesh, origin[0], origin[1], origin[2], a, degree,
                    threads);
                vr = v[0];
                vi = v[1];
            }
            for (int k = 0; k < size; k++) {
                re[k] += densities[i] * vr[k];
                im[k] += densities[i] * vi[k];
            }
        }
        // re, im: Σ ρ ∫ conj R((y − c)/a) dV / a³, so μ_n^m = a^{n+3} (re + i im) and M = a³ re_0^0.
        double massScaled = re[0];
        if (!(massScaled > 0)) {
            throw new IllegalArgumentException("the body has no positive mass about the origin");
        }
        double ratio = a / referenceRadius;
        double[] fact = factorials(2 * degree);
        double[][] c = new double[degree + 1][];
        double[][] s = new double[degree + 1][];
        double pow = 1; // (a/R)^n
        for (int n = 0; n <= degree; n++) {
            c[n] = new double[n + 1];
            s[n] = new double[n + 1];
            for (int m = 0; m <= n; m++) {
                int k = SolidHarmonics.index(n, m);
                // C̄ = w (n−m)! Re μ/(M R^n N) = (a/R)^n w (n−m)!/N · re/re_00,  (n−m)!/N = √((n−m)!(n+m)!/((2−δ)(2n+1)))
                double w = m == 0 ? 1 : 2;
                double f = pow * w * Math.sqrt(fact[n - m]) * Math.sqrt(fact[n + m]) / Math.sqrt(w * (2 * n + 1))
                    / massScaled;
                c[n][m] = f * re[k];
                s[n][m] = m == 0 ? 0 : -f * im[k];
            }
            pow *= ratio;
        }
        double gm = Constants.G * massScaled * a * a * a;
        return new HarmonicCoefficients(gm, referenceRadius, a, origin, c, s, boundMass / massScaled);
    }

    /** k! for k = 0..kmax (kmax ≤ 170) as doubles. */
    static double[] factorials(int kmax) {
        double[] f = new double[kmax + 1];
        f[0] = 1;
        for (int k = 1; k <= kmax; k++) {
            f[k] = f[k - 1] * k;
        }
        return f;
    }

    /** N_nm = √((2 − δ_m0)(2n + 1)(n − m)!/(n + m)!). */
    public static double normalisation(int n, int m) {
        double[] f = factorials(n + m);
        return Math.sqrt((m == 0 ? 1.0 : 2.0) * (2 * n + 1) * f[n - m] / f[n + m]);
    }

    /** Largest distance of a vertex of {@code mesh} from {@code origin}, m. */
    public static double maxDistance(TriangleMesh mesh, double[] origin) {
        double[] xyz = mesh.xyz();
        double r2 = 0;
        for (int i = 0; i < xyz.length; i += 3) {
            double dx = xyz[i] - origin[0];
            double dy = xyz[i + 1] - origin[1];
            double dz = xyz[i + 2] - origin[2];
            r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
        }
        return Math.sqrt(r2);
    }

    /** These coefficients truncated to degree {@code n} (≤ {@link #degree()}). */
    public HarmonicCoefficients truncated(int n) {
        if (n < 0 || n > degree) {
            throw new IllegalArgumentException("degree " + n + " outside 0.." + degree);
        }
        return new HarmonicCoefficients(gm, referenceRadius, brillouinRadius, origin,
            java.util.Arrays.copyOf(c, n + 1), java.util.Arrays.copyOf(s, n + 1), truncationBound);
    }

    /**
     * Upper bound on the truncation error of every C̄_nm, S̄_nm from the method (0 for the direct exact rule; for
     * large meshes the bound of {@link ClusteredMoments}); round-off comes on top (about 1e-16 times the square
     * root of the facet count).
     */
    public double truncationBound() {
        return truncationBound;
    }

    public double gm() {
        return gm;
    }

    public double referenceRadius() {
        return referenceRadius;
    }

    /** Radius of the sphere about the origin that holds all mass (the Brillouin sphere), m; NaN when unknown. */
    public double brillouinRadius() {
        return brillouinRadius;
    }

    /** Origin of the expansion, model frame, m. */
    public double[] origin() {
        return origin.clone();
    }

    public int degree() {
        return degree;
    }

    /** C̄_nm. */
    public double c(int n, int m) {
        return c[n][m];
    }

    /** S̄_nm. */
    public double s(int n, int m) {
        return s[n][m];
    }

    /** Unnormalised C_nm = N_nm C̄_nm. */
    public double cUnnormalised(int n, int m) {
        return normalisation(n, m) * c[n][m];
    }

    /** Unnormalised S_nm = N_nm S̄_nm. */
    public double sUnnormalised(int n, int m) {
        return normalisation(n, m) * s[n][m];
    }
}
