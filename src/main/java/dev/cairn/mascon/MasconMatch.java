package dev.cairn.mascon;

import dev.cairn.mass.MassProperties;
import java.util.Locale;

/**
 * Makes a mascon set match a body's low-degree mass moments exactly: total mass and centre of mass, and optionally
 * the quadrupole (the inertia tensor up to its trace) or the full inertia tensor (second moments about the centre of
 * mass), by a small adjustment of the masses with the positions fixed.
 *
 * <p>Method: relative corrections {@code m_i' = m_i (1 + δ_i)} of least weighted norm {@code Σ m_i δ_i²}
 * (= {@code Σ (Δm_i)²/m_i}) subject to the linear constraints {@code Σ m_i' φ_k(p_i) = T_k}, with
 * {@code φ = 1, x, y, z} (and {@code x² − z², y² − z², xy, xz, yz} for the quadrupole, {@code x², y², z², xy, xz,
 * yz} for the full inertia), coordinates relative to the reference
 * centre of mass and scaled by the equivalent radius. The Lagrange solution of this equality-constrained least
 * squares problem (e.g. Golub, G.H. &amp; Van Loan, C.F. (2013) Matrix Computations, 4th ed., §6.2) is
 * {@code δ_i = φ(p_i)ᵀλ}, {@code G λ = r}, with the Gram matrix {@code G = Σ m_i φ(p_i)φ(p_i)ᵀ} (4×4, 9×9 or 10×10) and
 * the moment residual {@code r = T − Σ m_i φ(p_i)}: the correction is a smooth polynomial in position, so it moves
 * no mass between neighbouring mascons (a set with negative masses is weighted by |m_i|, so that G stays positive
 * definite, and δ_i = sign(m_i)·φ(p_i)ᵀλ). Two refinement passes bring the residual to rounding. A set whose correction
 * would shrink some mascon by half or more ({@code 1 + δ_i ≤ ½}) is left unmatched for the second moments (mass and
 * centre of mass only) and, failing that too, unchanged: the result says which.
 *
 * <p>Why the quadrupole rather than the full tensor: the trace {@code Σ m r²} plays no part in the exterior field,
 * yet a lattice misses mostly the trace (each cube's own inertia, isotropic); matching it needs a correction growing
 * as r², which spoils the degree-3 and degree-4 moments (measured: far-field errors of lattice sets up to 45 times
 * those of the quadrupole match, docs/mascons.md §5.5).
 *
 * <p>The second moments {@code J = ∫ r rᵀ dm} about the centre of mass come from the inertia tensor:
 * {@code J = ½ tr(I)·1 − I}. Units: SI, model frame.
 */
public final class MasconMatch {
    /** Smallest allowed factor {@code 1 + δ_i} (common practice, no source: a correction, not a redistribution). */
    public static final double MIN_FACTOR = 0.5;
    private static final int PASSES = 3;
    /**
     * Default moments for a scheme: the quadrupole for the lattice (measured in docs/mascons.md §5.5: not worse near
     * the surface, 18 to 5000 times better at 50 radii), mass and centre of mass only for the tetrahedral set (already
     * exact; matching its quadrupole made the error 0.05 equivalent radii above the demo body's surface 14–21 % worse).
     */
    public static Moments defaultMoments(MasconGenerator.Scheme scheme) {
        return scheme == MasconGenerator.Scheme.LATTICE ? Moments.QUADRUPOLE : Moments.CENTRE;
    }

    private MasconMatch() {
    }

    /** Which moments to match. */
    public enum Moments {
        /** Total mass and centre of mass (4 constraints). */
        CENTRE,
        /**
         * Also the quadrupole: the inertia tensor up to its trace, i.e. the traceless second moments that set the
         * degree-2 exterior field (5 more constraints). The trace {@code Σ m r²} does not enter the exterior field
         * at any degree (MacCullagh: U₂ = G(A+B+C−3I)/(2r³) depends on the moments only through I − tr/3).
         */
        QUADRUPOLE,
        /** The full inertia tensor, trace included (6 more constraints). */
        INERTIA;

        int constraints() {
            return this == CENTRE ? 4 : this == QUADRUPOLE ? 9 : 10;
        }
    }

    /**
     * The outcome.
     *
     * @param set             the adjusted set (the input set when nothing was matched)
     * @param matchedCentre   mass and centre of mass matched
     * @param matchedInertia  second moments matched too (quadrupole or full inertia tensor)
     * @param maxChange       largest |δ_i|, the relative change of a single mascon's mass
     * @param note            one line for reports
     */
    public record Result(MasconSet set, boolean matchedCentre, boolean matchedInertia, double maxChange, String note) {
    }

    /**
     * Adjusts {@code set} to the reference moments.
     *
     * @param reference mass, centre of mass and inertia the set must have (polyhedron or combined regions)
     * @param inertia   also match the inertia tensor
     */
    public static Result match(MasconSet set, MassProperties reference, boolean inertia) {
        return match(set, reference, inertia ? Moments.QUADRUPOLE : Moments.CENTRE);
    }

    /** Adjusts {@code set} to the chosen reference moments (falling back to mass and centre of mass only). */
    public static Result match(MasconSet set, MassProperties reference, Moments moments) {
        if (moments != Moments.CENTRE) {
            double[] f = factors(set, reference, moments);
            if (f != null) {
                return result(set, f, moments, reference);
            }
        }
        double[] f = factors(set, reference, Moments.CENTRE);
        if (f != null) {
            return result(set, f, Moments.CENTRE, reference);
        }
        return new Result(set, false, false, 0, "masses not adjusted: the correction would change some mascon by "
            + "more than half its mass");
    }

    private static Result result(MasconSet set, double[] factor, Moments moments, MassProperties ref) {
        double[] m = set.mass();
        double[] out = new double[m.length];
        double max = 0;
        for (int i = 0; i < m.length; i++) {
            out[i] = m[i] * factor[i];
            max = Math.max(max, Math.abs(factor[i] - 1));
        }
        String what = moments == Moments.INERTIA ? "mass, centre of mass and inertia tensor"
            : moments == Moments.QUADRUPOLE ? "mass, centre of mass and quadrupole (inertia tensor up to its trace)"
            : "mass and centre of mass";
        MasconSet adjusted = new MasconSet(set.xyz(), out, set.spacing(), set.scheme() + "; masses adjusted to the "
            + "body's " + what);
        return new Result(adjusted, true, moments != Moments.CENTRE, max, String.format(Locale.ROOT,
            "masses adjusted to the body's %s (largest change of one mascon %.2e of its mass)", what, max));
    }

    /** Per-mascon factors 1 + δ_i, or null when some factor would fall to {@link #MIN_FACTOR} or below. */
    static double[] factors(MasconSet set, MassProperties ref, Moments moments) {
        int n = set.count();
        int k = moments.constraints();
        double[] xyz = set.xyz();
        double[] m = set.mass();
        double[] c = ref.centerOfMass();
        double len = ref.equivalentRadius();
        double mass = ref.mass();
        if (!(mass > 0) || !(len > 0) || n < k) {
            return null;
        }
        double[] target = new double[k];
        target[0] = 1;
        if (moments != Moments.CENTRE) {
            double[] in = ref.inertia();
            double half = 0.5 * (in[0] + in[4] + in[8]);
            double s = 1 / (mass * len * len);
            double jxx = (half - in[0]) * s;
            double jyy = (half - in[4]) * s;
            double jzz = (half - in[8]) * s;
            if (moments == Moments.INERTIA) {
                target[4] = jxx;
                target[5] = jyy;
                target[9] = jzz;
            } else {
                target[4] = jxx - jzz;
                target[5] = jyy - jzz;
            }
            target[6] = -in[1] * s;
            target[7] = -in[2] * s;
            target[8] = -in[5] * s;
        }
        double[] factor = new double[n];
        java.util.Arrays.fill(factor, 1.0);
        double[] phi = new double[k];
        for (int pass = 0; pass < PASSES; pass++) {
            double[] sum = new double[k];
            double[] comp = new double[k];
            double[] gram = new double[k * k];
            for (int i = 0; i < n; i++) {
                double mu = m[i] * factor[i] / mass;
                basis(xyz, i, c, len, moments, phi);
                for (int a = 0; a < k; a++) {
                    // Compensated (Kahan) sums: the residual must reach rounding.
                    double y = mu * phi[a] - comp[a];
                    double t = sum[a] + y;
                    comp[a] = (t - sum[a]) - y;
                    sum[a] = t;
                    double wa = Math.abs(m[i]) / mass * phi[a];
                    for (int b = a; b < k; b++) {
                        gram[a * k + b] += wa * phi[b];
                    }
                }
            }
            for (int a = 0; a < k; a++) {
                for (int b = 0; b < a; b++) {
                    gram[a * k + b] = gram[b * k + a];
                }
            }
            double[] r = new double[k];
            for (int a = 0; a < k; a++) {
                r[a] = target[a] - sum[a];
            }
            double[] lambda = solve(gram, r, k);
            if (lambda == null) {
                return null;
            }
            for (int i = 0; i < n; i++) {
                basis(xyz, i, c, len, moments, phi);
                double d = 0;
                for (int a = 0; a < k; a++) {
                    d += phi[a] * lambda[a];
                }
                factor[i] += m[i] < 0 ? -d : d;
                if (!(factor[i] > MIN_FACTOR)) {
                    return null;
                }
            }
        }
        return factor;
    }

    private static void basis(double[] xyz, int i, double[] c, double len, Moments moments, double[] phi) {
        double x = (xyz[3 * i] - c[0]) / len;
        double y = (xyz[3 * i + 1] - c[1]) / len;
        double z = (xyz[3 * i + 2] - c[2]) / len;
        phi[0] = 1;
        phi[1] = x;
        phi[2] = y;
        phi[3] = z;
        if (moments != Moments.CENTRE) {
            boolean full = moments == Moments.INERTIA;
            phi[4] = full ? x * x : x * x - z * z;
            phi[5] = full ? y * y : y * y - z * z;
            phi[6] = x * y;
            phi[7] = x * z;
            phi[8] = y * z;
            if (full) {
                phi[9] = z * z;
            }
        }
    }

    /** Gaussian elimination with partial pivoting on a copy; null when singular. */
    static double[] solve(double[] a0, double[] b0, int k) {
        double[] a = a0.clone();
        double[] b = b0.clone();
        for (int col = 0; col < k; col++) {
            int p = col;
            for (int r = col + 1; r < k; r++) {
                if (Math.abs(a[r * k + col]) > Math.abs(a[p * k + col])) {
                    p = r;
                }
            }
            if (!(Math.abs(a[p * k + col]) > 1e-300)) {
                return null;
            }
            if (p != col) {
                for (int j = 0; j < k; j++) {
                    double t = a[col * k + j];
                    a[col * k + j] = a[p * k + j];
                    a[p * k + j] = t;
                }
                double t = b[col];
                b[col] = b[p];
                b[p] = t;
            }
            for (int r = col + 1; r < k; r++) {
                double f = a[r * k + col] / a[col * k + col];
                for (int j = col; j < k; j++) {
                    a[r * k + j] -= f * a[col * k + j];
                }
                b[r] -= f * b[col];
            }
        }
        double[] x = new double[k];
        for (int r = k - 1; r >= 0; r--) {
            double s = b[r];
            for (int j = r + 1; j < k; j++) {
                s -= a[r * k + j] * x[j];
            }
            x[r] = s / a[r * k + r];
        }
        return x;
    }
}
