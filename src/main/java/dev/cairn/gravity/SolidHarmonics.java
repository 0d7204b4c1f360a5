package dev.cairn.gravity;

/**
 * Complex solid harmonics for multipole expansions of the Laplace kernel 1/|x − y|.
 *
 * <p>Normalisation (the one used in fast multipole codes, e.g. Epton, M.A. &amp; Dembart, B. (1995) "Multipole
 * translation theory for the three-dimensional Laplace and Helmholtz equations", SIAM J. Sci. Comput. 16:865–897;
 * recurrences derived here from the associated Legendre recurrences of Abramowitz &amp; Stegun 8.5, without the
 * Condon–Shortley phase), for m ≥ 0:
 * <pre>
 *   R_n^m(y) = |y|^n P_n^m(cos θ) e^{imφ} / (n+m)!          (regular)
 *   I_n^m(x) = (n−m)! P_n^m(cos θ) e^{imφ} / |x|^{n+1}      (irregular)
 *   1/|x − y| = Σ_n [ R_n^0(y) I_n^0(x) + 2 Re Σ_{m≥1} conj(R_n^m(y)) I_n^m(x) ],   |y| &lt; |x|
 * </pre>
 * with negative orders R_n^{−m} = (−1)^m conj(R_n^m), under which the addition theorem
 * R_n^m(a + b) = Σ_{k,l} R_k^l(a) R_{n−k}^{m−l}(b) holds (both checked numerically by {@code SolidHarmonicsTest}).
 * Recurrences: R_m^m = R_{m−1}^{m−1}(x+iy)/(2m), R_{m+1}^m = z R_m^m,
 * R_n^m = ((2n−1) z R_{n−1}^m − r² R_{n−2}^m)/(n²−m²); I_m^m = (2m−1)(x+iy) I_{m−1}^{m−1}/r²,
 * I_{m+1}^m = (2m+1) z I_m^m/r², I_n^m = ((2n−1) z I_{n−1}^m − ((n−1)²−m²) I_{n−2}^m)/r².
 * Derivatives: ∂_z I_n^m = −I_{n+1}^m, (∂_x + i∂_y) I_n^m = −I_{n+1}^{m+1}, (∂_x − i∂_y) I_n^m = I_{n+1}^{m−1}
 * (m ≥ 1), which {@link #derivative} turns into a map from expansion coefficients of degree n to n + 1.
 *
 * <p>Arrays hold orders m = 0..n of degrees n = 0..p at index {@link #index}(n, m) = n(n+1)/2 + m, real and
 * imaginary parts in separate arrays. An <i>expansion</i> {@code M} stands for
 * φ(x) = Σ_n [M_n^0 I_n^0(x) + 2 Re Σ_{m≥1} M_n^m I_n^m(x)].
 */
public final class SolidHarmonics {
    private SolidHarmonics() {
    }

    /** Array index of degree n, order m (0 ≤ m ≤ n). */
    public static int index(int n, int m) {
        return n * (n + 1) / 2 + m;
    }

    /** Number of (n, m ≥ 0) pairs up to degree p. */
    public static int size(int p) {
        return (p + 1) * (p + 2) / 2;
    }

    /** Regular harmonics R_n^m(x, y, z), m ≥ 0, n ≤ p, into {@code re}, {@code im} (modified). */
    public static void regular(double x, double y, double z, int p, double[] re, double[] im) {
        double r2 = x * x + y * y + z * z;
        re[0] = 1;
        im[0] = 0;
        for (int m = 1; m <= p; m++) {
            int k = index(m, m);
            int kp = index(m - 1, m - 1);
            double f = 1.0 / (2 * m);
            re[k] = (x * re[kp] - y * im[kp]) * f;
            im[k] = (x * im[kp] + y * re[kp]) * f;
        }
        for (int m = 0; m < p; m++) {
            int k = index(m + 1, m);
            int kd = index(m, m);
            re[k] = z * re[kd];
            im[k] = z * im[kd];
            for (int n = m + 2; n <= p; n++) {
                int kn = index(n, m);
                int k1 = index(n - 1, m);
                int k2 = index(n - 2, m);
                double inv = 1.0 / ((double) (n - m) * (n + m));
                re[kn] = ((2 * n - 1) * z * re[k1] - r2 * re[k2]) * inv;
                im[kn] = ((2 * n - 1) * z * im[k1] - r2 * im[k2]) * inv;
            }
        }
    }

    /**
     * Scaled irregular harmonics J_n^m = a^n |d| I_n^m(d), n ≤ p, for a separation d and a scale a, computed from
     * {@code xs = a d_x/|d|²}, {@code ys}, {@code zs} and {@code q2 = a²/|d|²} (so that no power of |d| over- or
     * underflows). J_0^0 = 1; an expansion of scaled moments M̃_n = M_n/a^n then gives φ = (1/|d|) Σ M̃ J.
     */
    public static void irregularScaled(double xs, double ys, double zs, double q2, int p, double[] re, double[] im) {
        re[0] = 1;
        im[0] = 0;
        for (int m = 1; m <= p; m++) {
            int k = index(m, m);
            int kp = index(m - 1, m - 1);
            double f = 2 * m - 1;
            re[k] = (xs * re[kp] - ys * im[kp]) * f;
            im[k] = (xs * im[kp] + ys * re[kp]) * f;
        }
        for (int m = 0; m < p; m++) {
            int k = index(m + 1, m);
            int kd = index(m, m);
            double f = (2 * m + 1) * zs;
            re[k] = f * re[kd];
            im[k] = f * im[kd];
            for (int n = m + 2; n <= p; n++) {
                int kn = index(n, m);
                int k1 = index(n - 1, m);
                int k2 = index(n - 2, m);
                double c1 = (2 * n - 1) * zs;
                double c2 = ((double) (n - 1) * (n - 1) - (double) m * m) * q2;
                re[kn] = c1 * re[k1] - c2 * re[k2];
                im[kn] = c1 * im[k1] - c2 * im[k2];
            }
        }
    }

    /**
     * Coefficients of ∂φ/∂x_axis (axis 0, 1, 2 = x, y, z) for an expansion {@code (re, im)} of degree ≤ p: an
     * expansion of degree ≤ p + 1 written to {@code outRe}, {@code outIm} (degree 0 set to zero). With scaled
     * harmonics (moments divided by a^n) the result is the derivative times a.
     */
    public static void derivative(int axis, double[] re, double[] im, int p, double[] outRe, double[] outIm) {
        outRe[0] = 0;
        outIm[0] = 0;
        for (int n = 0; n <= p; n++) {
            int b = index(n, 0);
            int o = index(n + 1, 0);
            for (int mp = 0; mp <= n + 1; mp++) {
                double r;
                double i;
                if (axis == 2) {
                    r = mp <= n ? -re[b + mp] : 0;
                    i = mp <= n ? -im[b + mp] : 0;
                } else if (mp == 0) {
                    boolean has = n >= 1;
                    r = !has ? 0 : axis == 0 ? re[b + 1] : -im[b + 1];
                    i = 0;
                } else {
                    double upR = mp + 1 <= n ? re[b + mp + 1] : 0;
                    double upI = mp + 1 <= n ? im[b + mp + 1] : 0;
                    double dnR = mp - 1 <= n ? re[b + mp - 1] : 0;
                    double dnI = mp - 1 <= n ? im[b + mp - 1] : 0;
                    if (axis == 0) {
                        r = 0.5 * (upR - dnR);
                        i = 0.5 * (upI - dnI);
                    } else { // i (down + up) / 2
                        r = -0.5 * (dnI + upI);
                        i = 0.5 * (dnR + upR);
                    }
                }
                outRe[o + mp] = r;
                outIm[o + mp] = i;
            }
        }
    }

    /**
     * Multipole-to-multipole translation (Greengard &amp; Rokhlin 1987; addition theorem above): adds to the
     * parent expansion {@code (pRe, pIm)} (scale {@code ap}, centre c') the shifted child moments {@code (cRe, cIm)}
     * (scale {@code ac}, centre c), both as moments M_n^m = ∫σ conj(R_n^m((y − centre)/scale)) dS, degree ≤ p.
     * {@code (tRe, tIm)} is scratch of {@link #size}(p) values, {@code rho} of p + 1; {@code (tx, ty, tz) = (c − c')/ap}.
     * The real and imaginary parts start at their own offsets (they may share one array).
     */
    public static void translateMultipole(double[] cRe, int cReOff, double[] cIm, int cImOff, double ac,
                                          double[] pRe, int pReOff, double[] pIm, int pImOff, double ap,
                                          double tx, double ty, double tz, int p, double[] tRe, double[] tIm,
                                          double[] rho) {
        regular(tx, ty, tz, p, tRe, tIm);
        double ratio = ac / ap;
        rho[0] = 1;
        for (int k = 1; k <= p; k++) {
            rho[k] = rho[k - 1] * ratio;
        }
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                double sr = 0;
                double si = 0;
                for (int k = 0; k <= n; k++) {
                    int j = n - k;
                    double rk = rho[k];
                    for (int l = -k; l <= k; l++) {
                        int ml = m - l;
                        if (ml > j || ml < -j) {
                            continue;
                        }
                        // conj(R_j^{ml}(t)); R_j^{-i} = (-1)^i conj(R_j^i)
                        double rr;
                        double ri;
                        if (ml >= 0) {
                            int q = index(j, ml);
                            rr = tRe[q];
                            ri = -tIm[q];
                        } else {
                            int q = index(j, -ml);
                            double s = ((-ml) & 1) == 0 ? 1 : -1;
                            rr = s * tRe[q];
                            ri = s * tIm[q];
                        }
                        // M_k^l; M_k^{-l} = (-1)^l conj(M_k^l)
                        double mr;
                        double mi;
                        if (l >= 0) {
                            int q = index(k, l);
                            mr = cRe[cReOff + q];
                            mi = cIm[cImOff + q];
                        } else {
                            int q = index(k, -l);
                            double s = ((-l) & 1) == 0 ? 1 : -1;
                            mr = s * cRe[cReOff + q];
                            mi = -s * cIm[cImOff + q];
                        }
                        sr += rk * (rr * mr - ri * mi);
                        si += rk * (rr * mi + ri * mr);
                    }
                }
                int q = index(n, m);
                pRe[pReOff + q] += sr;
                pIm[pImOff + q] += si;
            }
        }
    }
}
