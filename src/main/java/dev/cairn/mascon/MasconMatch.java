package dev.cairn.mascon;

import dev.cairn.mass.MassProperties;
import java.util.Locale;

/**
 * Makes a mascon set match a body's low-degree mass moments exactly: total mass and centre of mass, and optionally
 * the full inertia tensor (second moments about the centre of mass), by a small adjustment of the masses with the
 * positions fixed.
 *
 * <p>Method: relative corrections {@code m_i' = m_i (1 + δ_i)} of least weighted norm {@code Σ m_i δ_i²}
 * (= {@code Σ (Δm_i)²/m_i}) subject to the linear constraints {@code Σ m_i' φ_k(p_i) = T_k}, with
 * {@code φ = 1, x, y, z} (and {@code x², y², z², xy, xz, yz} for the inertia), coordinates relative to the reference
 * centre of mass and scaled by the equivalent radius. The Lagrange solution of this equality-constrained least
 * squares problem (e.g. Golub, G.H. &amp; Van Loan, C.F. (2013) Matrix Computations, 4th ed., §6.2) is
 * {@code δ_i = φ(p_i)ᵀλ}, {@code G λ = r}, with the Gram matrix {@code G = Σ m_i φ(p_i)φ(p_i)ᵀ} (4×4 or 10×10) and
 * the moment residual {@code r = T − Σ m_i φ(p_i)}: the correction is a smooth polynomial in position, so it moves
 * no mass between neighbouring mascons. Two refinement passes bring the residual to rounding. A set whose correction
 * would shrink some mascon by half or more ({@code 1 + δ_i ≤ ½}) is left unmatched for the inertia (mass and centre
 * of mass only) and, failing that too, unchanged: the result says which.
 *
 * <p>The second moments {@code J = ∫ r rᵀ dm} about the centre of mass come from the inertia tensor:
 * {@code J = ½ tr(I)·1 − I}. Units: SI, model frame.
 */
public final class MasconMatch {
    /** Smallest allowed factor {@code 1 + δ_i} (common practice, no source: a correction, not a redistribution). */
    public static final double MIN_FACTOR = 0.5;
    private static final int PASSES = 3;
    /**
     * Smallest set for which the inertia is matched by default: measured in docs/mascons.md §5.3, matching the
     * inertia made the error 0.05 equivalent radii above the surface worse for sets of about 2000 mascons (box:
     * 4.6e-2 against 3.7e-2 with mass and centre of mass only) and no worse from about 20 000.
     */
    public static final int AUTO_INERTIA_MIN = 10_000;
    /** {@link #AUTO_INERTIA_MIN} for option help. */
    public static final String AUTO_INERTIA_MIN_TEXT = "10000";

    private MasconMatch() {
    }

    /** Whether the inertia is matched by default for a set of {@code count} mascons. */
    public static boolean autoInertia(int count) {
        return count >= AUTO_INERTIA_MIN;
    }

    /**
     * The outcome.
     *
     * @param set             the adjusted set (the input set when nothing was matched)
     * @param matchedCentre   mass and centre of mass matched
     * @param matchedInertia  inertia tensor matched too
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
        if (inertia) {
            double[] f = factors(set, reference, true);
            if (f != null) {
                return result(set, f, true, reference);
            }
        }
        double[] f = factors(set, reference, false);
        if (f != null) {
            return result(set, f, false, reference);
        }
        return new Result(set, false, false, 0, "masses not adjusted: the correction would change some mascon by "
            + "more than half its mass");
    }

    private static Result result(MasconSet set, double[] factor, boolean inertia, MassProperties ref) {
        double[] m = set.mass();
        double[] out = new double[m.length];
        double max = 0;
        for (int i = 0; i < m.length; i++) {
            out[i] = m[i] * factor[i];
            max = Math.max(max, Math.abs(factor[i] - 1));
        }
        String what = inertia ? "mass, centre of mass and inertia tensor" : "mass and centre of mass";
        MasconSet adjusted = new MasconSet(set.xyz(), out, set.spacing(), set.scheme() + "; masses adjusted to the "
            + "body's " + what);
        return new Result(adjusted, true, inertia, max, String.format(Locale.ROOT,
            "masses adjusted to the body's %s (largest change of one mascon %.2e of its mass)", what, max));
    }

    /** Per-mascon factors 1 + δ_i, or null when some factor would fall to {@link #MIN_FACTOR} or below. */
    static double[] factors(MasconSet set, MassProperties ref, boolean inertia) {
        int n = set.count();
        int k = inertia ? 10 : 4;
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
        if (inertia) {
            double[] in = ref.inertia();
            double half = 0.5 * (in[0] + in[4] + in[8]);
            double s = 1 / (mass * len * len);
            target[4] = (half - in[0]) * s;
            target[5] = (half - in[4]) * s;
            target[6] = (half - in[8]) * s;
            target[7] = -in[1] * s;
            target[8] = -in[2] * s;
            target[9] = -in[5] * s;
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
                basis(xyz, i, c, len, inertia, phi);
                for (int a = 0; a < k; a++) {
                    // Compensated (Kahan) sums: the residual must reach rounding.
                    double y = mu * phi[a] - comp[a];
                    double t = sum[a] + y;
                    comp[a] = (t - sum[a]) - y;
                    sum[a] = t;
                    double wa = m[i] / mass * phi[a];
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
                basis(xyz, i, c, len, inertia, phi);
                double d = 0;
                for (int a = 0; a < k; a++) {
                    d += phi[a] * lambda[a];
                }
                factor[i] += d;
                if (!(factor[i] > MIN_FACTOR)) {
                    return null;
                }
            }
        }
        return factor;
    }

    private static void basis(double[] xyz, int i, double[] c, double len, boolean inertia, double[] phi) {
        double x = (xyz[3 * i] - c[0]) / len;
        double y = (xyz[3 * i + 1] - c[1]) / len;
        double z = (xyz[3 * i + 2] - c[2]) / len;
        phi[0] = 1;
        phi[1] = x;
        phi[2] = y;
        phi[3] = z;
        if (inertia) {
            phi[4] = x * x;
            phi[5] = y * y;
            phi[6] = z * z;
            phi[7] = x * y;
            phi[8] = x * z;
            phi[9] = y * z;
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
