package dev.cairn.mascon;

import dev.cairn.gravity.Constants;
import dev.cairn.gravity.FieldEvaluator;
import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.FieldSample;
import java.util.concurrent.atomic.LongAdder;

/**
 * Gravity field of a set of point masses (mascons): Newton's law summed over the set,
 * <pre>
 *   U    =  Σ_i G m_i / |d_i|                         (U &gt; 0)
 *   ∇U   = −Σ_i G m_i d_i / |d_i|^3                   (toward the masses)
 *   ∇∇U  =  Σ_i G m_i (3 d_i d_iᵀ − |d_i|^2 1) / |d_i|^5,   ∇²U = 0 away from the mascons
 * </pre>
 * with {@code d_i = x − p_i} from mascon {@code i} to the field point (Newton's law of gravitation; the tensor is
 * its second derivative, e.g. Heiskanen &amp; Moritz 1967, Physical Geodesy, §1-2). The mascon model as a cheap
 * stand-in for the polyhedron is discussed by Werner &amp; Scheeres (1997), Celest. Mech. Dyn. Astron. 65:313–344,
 * and its error near the surface by Chanut, Aljbaae &amp; Carruba (2015), MNRAS 450:3742–3749.
 *
 * <p>Conventions: SI units, model frame, U &gt; 0, g = ∇U. The {@link FieldSample#LAPLACIAN} slot is 0 (a point-mass
 * set has no continuous density) and {@link FieldSample#LOCATION} is unknown (NaN): a mascon set knows no surface.
 *
 * <p>Near-mascon warning: a field point closer to some mascon than that mascon's local spacing is where a point
 * mass poorly represents its volume. Each evaluation that meets such a mascon increments a shared counter
 * ({@link #tooCloseCount()}); the counter is diagnostic only and never changes a result.
 *
 * <p>Hot loop on primitive arrays; positions stored relative to the mass-weighted centre to limit round-off.
 * Results do not depend on the thread count (each point is one fixed-order sum).
 */
public final class MasconField implements FieldModel {
    private final int n;
    private final double cx;
    private final double cy;
    private final double cz;
    private final double[] px;
    private final double[] py;
    private final double[] pz;
    private final double[] gmi;
    private final double[] spacing2;
    private final double gm;
    private final String scheme;
    private final LongAdder tooClose = new LongAdder();

    /** @param set the mascons (positions m, masses kg) */
    public MasconField(MasconSet set) {
        n = set.count();
        double[] xyz = set.xyz();
        double[] m = set.mass();
        double[] c = n > 0 ? set.centerOfMass() : new double[3];
        if (!(Double.isFinite(c[0]) && Double.isFinite(c[1]) && Double.isFinite(c[2]))) {
            c = new double[3];
        }
        cx = c[0];
        cy = c[1];
        cz = c[2];
        px = new double[n];
        py = new double[n];
        pz = new double[n];
        gmi = new double[n];
        spacing2 = new double[n];
        double[] s = set.spacing();
        for (int i = 0; i < n; i++) {
            px[i] = xyz[3 * i] - cx;
            py[i] = xyz[3 * i + 1] - cy;
            pz[i] = xyz[3 * i + 2] - cz;
            gmi[i] = Constants.G * m[i];
            spacing2[i] = s[i] * s[i];
        }
        gm = set.gm();
        scheme = set.scheme();
    }

    /** Number of mascons. */
    public int count() {
        return n;
    }

    @Override
    public double gm() {
        return gm;
    }

    @Override
    public String describe() {
        return "mascons, " + n + " point masses (" + scheme + ")";
    }

    /** Evaluations so far (all threads) that came closer to a mascon than its local spacing. */
    public long tooCloseCount() {
        return tooClose.sum();
    }

    /** Resets {@link #tooCloseCount()} to 0. */
    public void resetTooCloseCount() {
        tooClose.reset();
    }

    @Override
    public FieldEvaluator newEvaluator() {
        return (x, y, z, gradient, out, o) -> {
            final double qx = x - cx;
            final double qy = y - cy;
            final double qz = z - cz;
            double u = 0;
            double gx = 0;
            double gy = 0;
            double gz = 0;
            double txx = 0;
            double txy = 0;
            double txz = 0;
            double tyy = 0;
            double tyz = 0;
            double tzz = 0;
            boolean near = false;
            if (gradient) {
                for (int i = 0; i < n; i++) {
                    double dx = qx - px[i];
                    double dy = qy - py[i];
                    double dz = qz - pz[i];
                    double r2 = dx * dx + dy * dy + dz * dz;
                    near |= r2 < spacing2[i];
                    double inv = 1 / Math.sqrt(r2);
                    double ui = gmi[i] * inv;
                    double g3 = ui * inv * inv;
                    double g5 = 3 * g3 * inv * inv;
                    u += ui;
                    gx -= g3 * dx;
                    gy -= g3 * dy;
                    gz -= g3 * dz;
                    txx += g5 * dx * dx - g3;
                    txy += g5 * dx * dy;
                    txz += g5 * dx * dz;
                    tyy += g5 * dy * dy - g3;
                    tyz += g5 * dy * dz;
                    tzz += g5 * dz * dz - g3;
                }
            } else {
                for (int i = 0; i < n; i++) {
                    double dx = qx - px[i];
                    double dy = qy - py[i];
                    double dz = qz - pz[i];
                    double r2 = dx * dx + dy * dy + dz * dz;
                    near |= r2 < spacing2[i];
                    double inv = 1 / Math.sqrt(r2);
                    double ui = gmi[i] * inv;
                    double g3 = ui * inv * inv;
                    u += ui;
                    gx -= g3 * dx;
                    gy -= g3 * dy;
                    gz -= g3 * dz;
                }
            }
            if (near) {
                tooClose.increment();
            }
            out[o + FieldSample.U] = u;
            out[o + FieldSample.AX] = gx;
            out[o + FieldSample.AY] = gy;
            out[o + FieldSample.AZ] = gz;
            out[o + FieldSample.LAPLACIAN] = 0.0;
            if (gradient) {
                out[o + FieldSample.GXX] = txx;
                out[o + FieldSample.GXY] = txy;
                out[o + FieldSample.GXZ] = txz;
                out[o + FieldSample.GYY] = tyy;
                out[o + FieldSample.GYZ] = tyz;
                out[o + FieldSample.GZZ] = tzz;
            } else {
                for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                    out[o + k] = Double.NaN;
                }
            }
            out[o + FieldSample.LOCATION] = Double.NaN;
        };
    }
}
