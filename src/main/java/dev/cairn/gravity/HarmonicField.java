package dev.cairn.gravity;

import java.util.Arrays;
import java.util.Locale;
import java.util.concurrent.atomic.LongAdder;

/**
 * The field of a spherical-harmonic expansion ({@link HarmonicCoefficients}): U, g = ∇U and the gradient tensor of
 * the truncated series, in the model frame (the coefficients' origin and axes).
 *
 * <p>Evaluation: the coefficients become an expansion in the complex solid harmonics of {@link SolidHarmonics},
 * U = Σ_n Σ_m w_m Re(K_n^m I_n^m(x − c)) with K_n^m = GM R^n N_nm (C̄_nm − i S̄_nm)/(w_m (n − m)!) (the inverse of the
 * conversion in {@link HarmonicCoefficients}), and are evaluated by the scaled irregular harmonics and their
 * derivative relations exactly as the exterior expansion of {@link BodyExpansion} (which this class uses with the
 * reference radius as scale and switch radius 0), so no power of r over- or underflows.
 *
 * <p>Validity: the series converges outside the Brillouin sphere (radius {@link HarmonicCoefficients#brillouinRadius()}
 * about the origin; the reference radius when that is unknown) and generically diverges inside it (shared
 * references §5). Points inside are still evaluated (the truncated sum is finite) but counted
 * ({@link #insideCount()}) and given location {@code unknown}; the Laplacian is 0 everywhere (each term of the
 * truncated series is harmonic) and the location {@code outside} outside the sphere. The counter is diagnostic
 * only and never changes a result.
 */
public final class HarmonicField implements FieldModel {
    private final HarmonicCoefficients coefficients;
    private final BodyExpansion expansion;
    private final double cx;
    private final double cy;
    private final double cz;
    private final double convergence2;
    private final int scratch;
    private final LongAdder inside = new LongAdder();

    public HarmonicField(HarmonicCoefficients coefficients) {
        this.coefficients = coefficients;
        int p = coefficients.degree();
        double r = coefficients.referenceRadius();
        double[] fact = HarmonicCoefficients.factorials(2 * p);
        int size = SolidHarmonics.size(p);
        double[] vRe = new double[size];
        double[] vIm = new double[size];
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                double w = m == 0 ? 1 : 2;
                // N_nm/(w (n−m)!) = √(w (2n+1)/((n−m)! (n+m)!))/w
                double f = Math.sqrt(w * (2 * n + 1)) / (Math.sqrt(fact[n - m]) * Math.sqrt(fact[n + m])) / w;
                int k = SolidHarmonics.index(n, m);
                vRe[k] = f * coefficients.c(n, m);
                vIm[k] = -f * coefficients.s(n, m);
            }
        }
        double[] o = coefficients.origin();
        cx = o[0];
        cy = o[1];
        cz = o[2];
        // G ρ' R³ = GM: the expansion's "density" carries GM/R³.
        double densityEquivalent = coefficients.gm() / (Constants.G * r * r * r);
        expansion = new BodyExpansion(densityEquivalent, o, r, p, vRe, vIm, 0);
        double rb = coefficients.brillouinRadius();
        double conv = Double.isFinite(rb) && rb > 0 ? rb : r;
        convergence2 = conv * conv;
        scratch = SolidHarmonics.size(p + 2);
    }

    /** The coefficients evaluated. */
    public HarmonicCoefficients coefficients() {
        return coefficients;
    }

    /** Radius of the sphere about the origin inside which the series is not trusted (Brillouin radius), m. */
    public double convergenceRadius() {
        return Math.sqrt(convergence2);
    }

    /** Number of evaluations so far at points inside the Brillouin sphere (where the series may diverge). */
    public long insideCount() {
        return inside.sum();
    }

    /** Resets {@link #insideCount()} to 0. */
    public void resetInsideCount() {
        inside.reset();
    }

    @Override
    public double gm() {
        return coefficients.gm();
    }

    @Override
    public String describe() {
        double[] o = coefficients.origin();
        return String.format(Locale.ROOT, "spherical harmonics to degree %d (reference radius %.6g m, origin "
            + "(%.6g, %.6g, %.6g) m, Brillouin radius %.6g m)", coefficients.degree(), coefficients.referenceRadius(),
            o[0], o[1], o[2], convergenceRadius());
    }

    @Override
    public FieldEvaluator newEvaluator() {
        double[] jr = new double[scratch];
        double[] ji = new double[scratch];
        return (x, y, z, gradient, out, off) -> {
            double dx = x - cx;
            double dy = y - cy;
            double dz = z - cz;
            double r2 = dx * dx + dy * dy + dz * dz;
            if (!(r2 > 0)) {
                Arrays.fill(out, off, off + FieldSample.SIZE, Double.NaN);
                inside.increment();
                return;
            }
            expansion.evaluate(x, y, z, gradient, out, off, jr, ji);
            if (r2 < convergence2) {
                inside.increment();
                out[off + FieldSample.LOCATION] = Location.UNKNOWN.code(); // Laplacian stays 0: each term is harmonic
            }
        };
    }
}
