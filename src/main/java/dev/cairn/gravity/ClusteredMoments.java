package dev.cairn.gravity;

import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.util.Arrays;

/**
 * Volume moments ∫_V conj(R_n^m((y − c)/a)) dV / a³ of a closed outward polyhedron to a high degree N, computed
 * through groups of nearby facets: the fast path behind {@link HarmonicCoefficients#ofPolyhedra} for large meshes.
 *
 * <p><b>Method.</b> The cone formula ({@link BodyExpansion#volumeMoments}) writes the moment of degree n as
 * (1/(n + 3)) Σ_f h_f ∫_f conj R_n^m(y) dA, h_f the (signed) distance of the facet's plane from the origin c. The
 * addition theorem of the regular solid harmonics (Epton &amp; Dembart 1995, see {@link SolidHarmonics}) splits
 * R_n^m(y) = Σ_{k,l} R_{n−k}^{m−l}(t) R_k^l(y − t) about any point t; it is a polynomial identity, exact for all
 * y and t. For a group of facets (consecutive in Morton order of their centroids) with centre t_g and radius
 * s_g (largest vertex distance from t_g), the surface moments A_k^l = Σ_{f∈g} h_f ∫_f conj R_k^l(y − t_g) dA are
 * computed exactly (triangle rule of degree k) for k ≤ q_g only, and shifted to c with the full degree N. Because
 * |y − t_g| ≤ s_g is small, the dropped terms k &gt; q_g fall off like s_g^k, so q_g ≪ N and the work per facet falls
 * from ~N^4/8 to ~q_g^4/8 operations.
 *
 * <p><b>Error bound.</b> With |P_n^m| ≤ √((n+m)!/(n−m)!) (Schmidt semi-normalised functions are at most 1 in
 * modulus, a consequence of the addition theorem of spherical harmonics; Heiskanen &amp; Moritz 1967 §1-17), the
 * dropped part of conj R_n^m(y) is at most Σ_{k&gt;q} Σ_l |t|^{n−k} s^k / √((j+i)!(j−i)!(k+l)!(k−l)!) with
 * j = n − k, i = m − l; Cauchy–Schwarz and Vandermonde's identity Σ_l C(n+m, k+l) C(n−m, k−l) = C(2n, 2k) bound
 * its effect on a fully normalised coefficient (see {@link HarmonicCoefficients}) by
 * <pre>
 *   |δC̄_nm| ≤ √2 (a/R)^n / ((n + 3) √(2n + 1)) Σ_g (H_g / V) Σ_{k=q_g+1}^{n} √((2k + 1) C(2n, 2k)) |t_g|^{n−k} s_g^k
 * </pre>
 * (lengths in units of a, H_g = Σ_{f∈g} |h_f| area_f, V = Σ_f h_f area_f / 3 the volume). Each group takes the
 * least q_g that keeps its own term, per unit H_g/V, below {@code epsilon} at every degree; the sum over groups is returned as {@link #bound()}. The
 * bound is derived here (no source beyond the identities cited) and is checked against the direct sum in tests.
 *
 * <p>Groups are summed in blocks in a fixed order, so the result does not depend on the thread count.
 */
public final class ClusteredMoments {
    /**
     * Facets per group at high degree. The group size balances the per-facet work (about q⁴/8, q growing with the
     * group radius) against the shift per group (about N²q²/4): {@link #groupSizeFor} uses smaller groups at lower N.
     */
    static final int GROUP = 32;
    /** Groups per block of the fixed-order parallel sum. */
    static final int BLOCK = 16;

    private final double[] re;
    private final double[] im;
    private final double bound;
    private final double meanGroupDegree;
    private final int groups;

    private ClusteredMoments(double[] re, double[] im, double bound, double meanGroupDegree, int groups) {
        this.re = re;
        this.im = im;
        this.bound = bound;
        this.meanGroupDegree = meanGroupDegree;
        this.groups = groups;
    }

    /** Real parts of the dimensionless volume moments at {@link SolidHarmonics#index}(n, m). */
    public double[] re() {
        return re.clone();
    }

    /** Imaginary parts likewise. */
    public double[] im() {
        return im.clone();
    }

    /**
     * Upper bound on the truncation error of every fully normalised coefficient C̄_nm, S̄_nm derived from these
     * moments with the reference radius given to {@link #compute} (dimensionless, relative to C̄_00 = 1).
     */
    public double bound() {
        return bound;
    }

    /** Mean truncation degree q_g over the groups (for reports and benchmarks). */
    public double meanGroupDegree() {
        return meanGroupDegree;
    }

    public int groups() {
        return groups;
    }

    /**
     * Moments of {@code mesh} about c = ({@code ox, oy, oz}) (metres) with length scale {@code a} (metres, at least
     * the largest vertex distance from c), degree ≤ {@code degree} (0 to {@link HarmonicCoefficients#MAX_DEGREE}).
     *
     * @param ratio   a/R, the length scale over the reference radius of the coefficients (weights the bound)
     * @param epsilon per-group truncation target on normalised coefficients (e.g. 1e-16); the total bound is at
     *                most epsilon·Σ_f |h_f| area_f / Σ_f h_f area_f (epsilon itself for a star-shaped body)
     */
    public static ClusteredMoments compute(TriangleMesh mesh, double ox, double oy, double oz, double a, int degree,
                                           double ratio, double epsilon, int threads) {
        return compute(mesh, ox, oy, oz, a, degree, ratio, epsilon, threads, groupSizeFor(degree));
    }

    /**
     * Facets per group for degree N: 8 up to N = 24, 16 up to N = 40, else {@link #GROUP} (chosen from timings of
     * group sizes 4 to 64 at N = 20 and 50 on an 81,920-facet body; the result's accuracy bound holds for any size).
     */
    static int groupSizeFor(int degree) {
        return degree <= 24 ? 8 : degree <= 40 ? 16 : GROUP;
    }

    /** As {@link #compute(TriangleMesh, double, double, double, double, int, double, double, int)} with groups of
     * {@code group} facets (1 to 4096). */
    static ClusteredMoments compute(TriangleMesh mesh, double ox, double oy, double oz, double a, int degree,
                                    double ratio, double epsilon, int threads, int group) {
        if (group < 1 || group > 4096) {
            throw new IllegalArgumentException("group size " + group + " outside 1..4096");
        }
        if (degree < 0 || degree > HarmonicCoefficients.MAX_DEGREE) {
            throw new IllegalArgumentException("moment degree " + degree + " outside 0.."
                + HarmonicCoefficients.MAX_DEGREE);
        }
        if (!(a > 0) || !Double.isFinite(a) || !(ratio > 0) || !Double.isFinite(ratio) || !(epsilon > 0)) {
            throw new IllegalArgumentException("bad moment scale, ratio or epsilon");
        }
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        int nf = mesh.facetCount();
        int[] order = mortonOrder(xyz, tri, nf);
        int nGroups = (nf + group - 1) / group;
        int nBlocks = (nGroups + BLOCK - 1) / BLOCK;
        int size = SolidHarmonics.size(degree);
        double[] partRe = new double[nBlocks * size];
        double[] partIm = new double[nBlocks * size];
        double[] partBound = new double[nBlocks * (degree + 1)];
        double[] partH = new double[nBlocks];
        double[] partV = new double[nBlocks];
        int[] groupDegree = new int[nGroups];
        TriangleQuadrature[] rules = new TriangleQuadrature[degree + 1];
        for (int q = 0; q <= degree; q++) {
            rules[q] = new TriangleQuadrature(q);
        }
        double[] tailWeight = new double[degree + 1]; // √2 ratio^n / ((n + 3) √(2n + 1))
        for (int n = 0; n <= degree; n++) {
            tailWeight[n] = Math.sqrt(2) * Math.pow(ratio, n) / ((n + 3) * Math.sqrt(2 * n + 1));
        }
        double[][] shiftCoef = new double[degree + 1][degree + 1]; // √((2k + 1) C(2n, 2k))
        for (int n = 0; n <= degree; n++) {
            for (int k = 0; k <= n; k++) {
                shiftCoef[n][k] = Math.sqrt((2 * k + 1) * binomial(2 * n, 2 * k));
            }
        }
        ParallelChunks.run(nBlocks, Math.max(1, threads), () -> new Worker(degree, rules),
            (w, from, to) -> {
                for (int b = from; b < to; b++) {
                    int g1 = Math.min(nGroups, (b + 1) * BLOCK);
                    for (int g = b * BLOCK; g < g1; g++) {
                        int f0 = g * group;
                        int f1 = Math.min(nf, f0 + group);
                        groupDegree[g] = w.group(xyz, tri, order, f0, f1, ox, oy, oz, a, epsilon, tailWeight,
                            shiftCoef, partRe, partIm, b * size, partBound, b * (degree + 1), partH, partV, b);
                    }
                }
            }, ProgressListener.NONE);
        double[] vRe = new double[size];
        double[] vIm = new double[size];
        double[] tail = new double[degree + 1];
        double h = 0;
        double v = 0;
        for (int b = 0; b < nBlocks; b++) {
            for (int k = 0; k < size; k++) {
                vRe[k] += partRe[b * size + k];
                vIm[k] += partIm[b * size + k];
            }
            for (int n = 0; n <= degree; n++) {
                tail[n] += partBound[b * (degree + 1) + n];
            }
            h += partH[b];
            v += partV[b];
        }
        for (int n = 0; n <= degree; n++) {
            for (int m = 0; m <= n; m++) {
                int k = SolidHarmonics.index(n, m);
                vRe[k] /= n + 3;
                vIm[k] /= n + 3;
            }
        }
        double bound = 0;
        for (int n = 0; n <= degree; n++) {
            bound = Math.max(bound, tailWeight[n] * tail[n] / (v / 3)); // V_00 = Σ h area / 3, the volume
        }
        long sumQ = 0;
        for (int q : groupDegree) {
            sumQ += q;
        }
        return new ClusteredMoments(vRe, vIm, bound, nGroups == 0 ? 0 : (double) sumQ / nGroups, nGroups);
    }

    /** C(n, k) as a double (n ≤ 2·60: exact below 2^53 and well within range). */
    static double binomial(int n, int k) {
        double c = 1;
        for (int i = 1; i <= k; i++) {
            c = c * (n - k + i) / i;
        }
        return c;
    }

    /**
     * Facet indices sorted by the Morton (Z-order) code of their centroids: consecutive runs are spatially compact,
     * except where the curve jumps (such groups only get a larger radius and hence a higher degree).
     */
    static int[] mortonOrder(double[] xyz, int[] tri, int nf) {
        double[] lo = {Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE};
        double[] hi = {-Double.MAX_VALUE, -Double.MAX_VALUE, -Double.MAX_VALUE};
        for (int i = 0; i < xyz.length; i += 3) {
            for (int d = 0; d < 3; d++) {
                lo[d] = Math.min(lo[d], xyz[i + d]);
                hi[d] = Math.max(hi[d], xyz[i + d]);
            }
        }
        int indexBits = Math.max(1, 32 - Integer.numberOfLeadingZeros(Math.max(1, nf - 1)));
        int axisBits = Math.min(20, (63 - indexBits) / 3);
        double cells = (1 << axisBits) - 1;
        double span = Math.max(hi[0] - lo[0], Math.max(hi[1] - lo[1], hi[2] - lo[2]));
        double scale = span > 0 ? cells / span : 0;
        long[] keys = new long[nf];
        for (int f = 0; f < nf; f++) {
            long code = 0;
            for (int d = 0; d < 3; d++) {
                double cen = (xyz[3 * tri[3 * f] + d] + xyz[3 * tri[3 * f + 1] + d] + xyz[3 * tri[3 * f + 2] + d]) / 3;
                long cell = Math.max(0, Math.min((long) cells, (long) ((cen - lo[d]) * scale)));
                code |= spread(cell, axisBits) << d;
            }
            keys[f] = (code << indexBits) | f;
        }
        Arrays.sort(keys);
        long mask = (1L << indexBits) - 1;
        int[] order = new int[nf];
        for (int i = 0; i < nf; i++) {
            order[i] = (int) (keys[i] & mask);
        }
        return order;
    }

    /** Bits of {@code v} (the low {@code bits}) spread to every third position. */
    private static long spread(long v, int bits) {
        long r = 0;
        for (int b = 0; b < bits; b++) {
            r |= ((v >>> b) & 1L) << (3 * b);
        }
        return r;
    }

    /** One thread's scratch space: harmonics of the rule points of one facet, per-lane accumulators, shift terms. */
    private static final class Worker {
        private final int degree;
        private final TriangleQuadrature[] rules;
        private final double[][] rl1;
        private final double[][] rl2;
        private final double[][] rl3;
        private final double[][] rw;
        private final double[] px;
        private final double[] py;
        private final double[] pz;
        private final double[] pr2;
        private final double[] hr;
        private final double[] hi;
        private final double[] accRe;
        private final double[] accIm;
        private final double[] aRe;
        private final double[] aIm;
        private final double[] tRe;
        private final double[] tIm;

        Worker(int degree, TriangleQuadrature[] rules) {
            this.degree = degree;
            this.rules = rules;
            int maxPts = rules[degree].size();
            int size = SolidHarmonics.size(degree);
            rl1 = new double[degree + 1][];
            rl2 = new double[degree + 1][];
            rl3 = new double[degree + 1][];
            rw = new double[degree + 1][];
            for (int q = 0; q <= degree; q++) {
                TriangleQuadrature r = rules[q];
                int n = r.size();
                rl1[q] = new double[n];
                rl2[q] = new double[n];
                rl3[q] = new double[n];
                rw[q] = new double[n];
                for (int i = 0; i < n; i++) {
                    rl1[q][i] = r.l1(i);
                    rl2[q][i] = r.l2(i);
                    rl3[q][i] = r.l3(i);
                    rw[q][i] = r.weight(i);
                }
            }
            px = new double[maxPts];
            py = new double[maxPts];
            pz = new double[maxPts];
            pr2 = new double[maxPts];
            hr = new double[size * maxPts];
            hi = new double[size * maxPts];
            accRe = new double[size * maxPts];
            accIm = new double[size * maxPts];
            aRe = new double[size];
            aIm = new double[size];
            tRe = new double[size];
            tIm = new double[size];
        }

        /** Adds group [f0, f1) of {@code order} to the block sums; returns the truncation degree used. */
        int group(double[] xyz, int[] tri, int[] order, int f0, int f1, double ox, double oy, double oz, double a,
                  double epsilon, double[] tailWeight, double[][] shiftCoef, double[] outRe, double[] outIm, int off,
                  double[] outTail, int tailOff, double[] outH, double[] outV, int block) {
            // centre: middle of the bounding box of the group's vertices (scaled coordinates about c)
            double lx = Double.MAX_VALUE;
            double ly = Double.MAX_VALUE;
            double lz = Double.MAX_VALUE;
            double ux = -Double.MAX_VALUE;
            double uy = -Double.MAX_VALUE;
            double uz = -Double.MAX_VALUE;
            for (int i = f0; i < f1; i++) {
                int f = order[i];
                for (int j = 0; j < 3; j++) {
                    int v = 3 * tri[3 * f + j];
                    double x = (xyz[v] - ox) / a;
                    double y = (xyz[v + 1] - oy) / a;
                    double z = (xyz[v + 2] - oz) / a;
                    lx = Math.min(lx, x);
                    ly = Math.min(ly, y);
                    lz = Math.min(lz, z);
                    ux = Math.max(ux, x);
                    uy = Math.max(uy, y);
                    uz = Math.max(uz, z);
                }
            }
            double tx = 0.5 * (lx + ux);
            double ty = 0.5 * (ly + uy);
            double tz = 0.5 * (lz + uz);
            double s2 = 0;
            double hSum = 0;
            double vSum = 0;
            for (int i = f0; i < f1; i++) {
                int f = order[i];
                for (int j = 0; j < 3; j++) {
                    int v = 3 * tri[3 * f + j];
                    double x = (xyz[v] - ox) / a - tx;
                    double y = (xyz[v + 1] - oy) / a - ty;
                    double z = (xyz[v + 2] - oz) / a - tz;
                    s2 = Math.max(s2, x * x + y * y + z * z);
                }
                double ha = hArea(xyz, tri, f, ox, oy, oz, a);
                hSum += Math.abs(ha);
                vSum += ha;
            }
            double s = Math.sqrt(s2);
            double t = Math.sqrt(tx * tx + ty * ty + tz * tz);
            // least q whose dropped tail stays below epsilon at every degree (q = degree: nothing dropped)
            int q = degree;
            for (int cand = 0; cand < degree; cand++) {
                if (3 * tailMax(cand, s, t, tailWeight, shiftCoef) <= epsilon) {
                    q = cand;
                    break;
                }
            }
            for (int n = q + 1; n <= degree; n++) {
                outTail[tailOff + n] += hSum * tail(n, q, s, t, shiftCoef);
            }
            outH[block] += hSum;
            outV[block] += vSum;
            surfaceMoments(xyz, tri, order, f0, f1, ox, oy, oz, a, tx, ty, tz, q);
            shift(tx, ty, tz, q, outRe, outIm, off);
            return q;
        }

        /** max over n of tailWeight[n]·tail(n, q): the group's own bound per unit H_g/V. */
        private double tailMax(int q, double s, double t, double[] tailWeight, double[][] shiftCoef) {
            double worst = 0;
            for (int n = q + 1; n <= degree; n++) {
                worst = Math.max(worst, tailWeight[n] * tail(n, q, s, t, shiftCoef));
            }
            return worst;
        }

        private static double tail(int n, int q, double s, double t, double[][] shiftCoef) {
            double sum = 0;
            for (int k = q + 1; k <= n; k++) {
                sum += shiftCoef[n][k] * Math.pow(t, n - k) * Math.pow(s, k);
            }
            return sum;
        }

        /** A_k^l = Σ_f h_f area_f Σ_p w_p conj R_k^l(y_p − t), k ≤ q, into (aRe, aIm). */
        private void surfaceMoments(double[] xyz, int[] tri, int[] order, int f0, int f1, double ox, double oy,
                                    double oz, double a, double tx, double ty, double tz, int q) {
            int np = rules[q].size();
            int size = SolidHarmonics.size(q);
            double[] l1 = rl1[q];
            double[] l2 = rl2[q];
            double[] l3 = rl3[q];
            double[] w = rw[q];
            Arrays.fill(accRe, 0, size * np, 0);
            Arrays.fill(accIm, 0, size * np, 0);
            for (int i = f0; i < f1; i++) {
                int f = order[i];
                int ia = 3 * tri[3 * f];
                int ib = 3 * tri[3 * f + 1];
                int ic = 3 * tri[3 * f + 2];
                double ha = hArea(xyz, tri, f, ox, oy, oz, a);
                double ax = (xyz[ia] - ox) / a - tx;
                double ay = (xyz[ia + 1] - oy) / a - ty;
                double az = (xyz[ia + 2] - oz) / a - tz;
                double bx = (xyz[ib] - ox) / a - tx;
                double by = (xyz[ib + 1] - oy) / a - ty;
                double bz = (xyz[ib + 2] - oz) / a - tz;
                double cx = (xyz[ic] - ox) / a - tx;
                double cy = (xyz[ic + 1] - oy) / a - ty;
                double cz = (xyz[ic + 2] - oz) / a - tz;
                for (int p = 0; p < np; p++) {
                    double x = l1[p] * ax + l2[p] * bx + l3[p] * cx;
                    double y = l1[p] * ay + l2[p] * by + l3[p] * cy;
                    double z = l1[p] * az + l2[p] * bz + l3[p] * cz;
                    px[p] = x;
                    py[p] = y;
                    pz[p] = z;
                    pr2[p] = x * x + y * y + z * z;
                    hr[p] = w[p] * ha;
                    hi[p] = 0;
                }
                regularBatch(np, q);
                for (int j = 0; j < size * np; j++) {
                    accRe[j] += hr[j];
                    accIm[j] -= hi[j]; // conj
                }
            }
            for (int k = 0; k < size; k++) {
                double sr = 0;
                double si = 0;
                int base = k * np;
                for (int p = 0; p < np; p++) {
                    sr += accRe[base + p];
                    si += accIm[base + p];
                }
                aRe[k] = sr;
                aIm[k] = si;
            }
        }

        /**
         * Regular harmonics (recurrences of {@link SolidHarmonics#regular}) of np points at once, degree ≤ q, layout
         * [k·np + p]; the seed hr[p] (degree 0) carries the point's weight, which the linear recurrences propagate.
         */
        private void regularBatch(int np, int q) {
            for (int m = 1; m <= q; m++) {
                int k = SolidHarmonics.index(m, m) * np;
                int kp = SolidHarmonics.index(m - 1, m - 1) * np;
                double f = 1.0 / (2 * m);
                for (int p = 0; p < np; p++) {
                    double r0 = hr[kp + p];
                    double i0 = hi[kp + p];
                    hr[k + p] = (px[p] * r0 - py[p] * i0) * f;
                    hi[k + p] = (px[p] * i0 + py[p] * r0) * f;
                }
            }
            for (int m = 0; m < q; m++) {
                int k = SolidHarmonics.index(m + 1, m) * np;
                int kd = SolidHarmonics.index(m, m) * np;
                for (int p = 0; p < np; p++) {
                    hr[k + p] = pz[p] * hr[kd + p];
                    hi[k + p] = pz[p] * hi[kd + p];
                }
                for (int n = m + 2; n <= q; n++) {
                    int kn = SolidHarmonics.index(n, m) * np;
                    int k1 = SolidHarmonics.index(n - 1, m) * np;
                    int k2 = SolidHarmonics.index(n - 2, m) * np;
                    double inv = 1.0 / ((double) (n - m) * (n + m));
                    double c1 = (2 * n - 1) * inv;
                    for (int p = 0; p < np; p++) {
                        hr[kn + p] = c1 * pz[p] * hr[k1 + p] - inv * pr2[p] * hr[k2 + p];
                        hi[kn + p] = c1 * pz[p] * hi[k1 + p] - inv * pr2[p] * hi[k2 + p];
                    }
                }
            }
        }

        /**
         * Adds the shift of the group moments A (degree ≤ q, about t) to the moments about the origin, degree ≤ N:
         * V_n^m += Σ_{k ≤ min(q, n)} Σ_l conj R_{n−k}^{m−l}(t) A_k^l, with R^{−m} = (−1)^m conj R^m and
         * A_k^{−l} = (−1)^l conj A_k^l (as in {@link SolidHarmonics#translateMultipole}).
         */
        private void shift(double tx, double ty, double tz, int q, double[] outRe, double[] outIm, int off) {
            int p = degree;
            SolidHarmonics.regular(tx, ty, tz, p, tRe, tIm);
            for (int n = 0; n <= p; n++) {
                for (int m = 0; m <= n; m++) {
                    double sr = 0;
                    double si = 0;
                    int kmax = Math.min(q, n);
                    for (int k = 0; k <= kmax; k++) {
                        int j = n - k;
                        int lLo = Math.max(-k, m - j);
                        int lHi = Math.min(k, m + j);
                        for (int l = lLo; l <= lHi; l++) {
                            int ml = m - l;
                            double rr;
                            double ri;
                            if (ml >= 0) {
                                int idx = SolidHarmonics.index(j, ml);
                                rr = tRe[idx];
                                ri = -tIm[idx];
                            } else {
                                int idx = SolidHarmonics.index(j, -ml);
                                double sg = ((-ml) & 1) == 0 ? 1 : -1;
                                rr = sg * tRe[idx];
                                ri = sg * tIm[idx];
                            }
                            double mr;
                            double mi;
                            if (l >= 0) {
                                int idx = SolidHarmonics.index(k, l);
                                mr = aRe[idx];
                                mi = aIm[idx];
                            } else {
                                int idx = SolidHarmonics.index(k, -l);
                                double sg = ((-l) & 1) == 0 ? 1 : -1;
                                mr = sg * aRe[idx];
                                mi = -sg * aIm[idx];
                            }
                            sr += rr * mr - ri * mi;
                            si += rr * mi + ri * mr;
                        }
                    }
                    int idx = SolidHarmonics.index(n, m);
                    outRe[off + idx] += sr;
                    outIm[off + idx] += si;
                }
            }
        }

        /** h_f·area_f in scaled units: (n·(v_a − c))/(2a³) with n the unnormalised normal of facet f. */
        private static double hArea(double[] xyz, int[] tri, int f, double ox, double oy, double oz, double a) {
            int ia = 3 * tri[3 * f];
            int ib = 3 * tri[3 * f + 1];
            int ic = 3 * tri[3 * f + 2];
            double ax = (xyz[ia] - ox) / a;
            double ay = (xyz[ia + 1] - oy) / a;
            double az = (xyz[ia + 2] - oz) / a;
            double ux = (xyz[ib] - ox) / a - ax;
            double uy = (xyz[ib + 1] - oy) / a - ay;
            double uz = (xyz[ib + 2] - oz) / a - az;
            double vx = (xyz[ic] - ox) / a - ax;
            double vy = (xyz[ic + 1] - oy) / a - ay;
            double vz = (xyz[ic + 2] - oz) / a - az;
            double nx = uy * vz - uz * vy;
            double ny = uz * vx - ux * vz;
            double nz = ux * vy - uy * vx;
            return 0.5 * (nx * ax + ny * ay + nz * az);
        }
    }
}
