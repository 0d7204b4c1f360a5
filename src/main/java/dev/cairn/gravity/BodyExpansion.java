package dev.cairn.gravity;

import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;

/**
 * The exterior multipole expansion of a whole constant-density polyhedron about its centre of mass, to a degree
 * where the truncation error is far below double-precision rounding beyond {@link #SWITCH_RADII} Brillouin radii.
 *
 * <p>Method: the exterior potential of any mass distribution inside the sphere of radius a about c is
 * U(x) = G Σ_n Σ_m μ_n^m I_n^m(x − c) with the mass moments μ_n^m = ρ ∫_V conj(R_n^m(y − c)) dV
 * ({@link SolidHarmonics}; Heiskanen &amp; Moritz (1967) Physical Geodesy, ch. 1–2; Greengard &amp; Rokhlin 1987). For
 * a polyhedron, the signed cones from c over its facets tile the volume, and since R_n^m is a homogeneous polynomial
 * of degree n, ∫_cone R dV = h_f/(n+3) ∫_f R dS with h_f the distance of facet f's plane from c (a standard
 * consequence of Euler's theorem on homogeneous functions and the divergence theorem). The facet integrals are
 * exact by a triangle rule of the expansion's degree ({@link TriangleQuadrature}).
 *
 * <p>Truncation: with all mass within a = R_B of c, the remainder of the potential is below
 * GM/(r − a)·(a/r)^{P+1} (Greengard, L. &amp; Rokhlin, V. (1987) J. Comput. Phys. 73:325, Theorem 3.2 for one
 * cluster); at r ≥ 8 a and P = 20 this is below 1.2e-19 of GM/r, and the derivatives add factors of order P. Far
 * points are evaluated with scaled harmonics (no power of r over- or underflows), so U stays positive and
 * relative accuracy holds out to r ~ 1e150 m. Conventions: U &gt; 0, g = ∇U, SI, model frame.
 */
public final class BodyExpansion {
    /** Degree of the expansion the exact field uses. */
    public static final int DEGREE = 20;
    /**
     * The exact field uses the expansion at and beyond this many Brillouin radii (about the centre of mass): there
     * its truncation is below 1e-19 of GM/r, while the direct sum's round-off already reaches ~1e-12 (measured on a
     * lumpy 5,120-facet body at 9 radii; it grows as r², docs/fast-field.md).
     */
    public static final double SWITCH_RADII = 8.0;

    private final double gRho;
    private final double cx;
    private final double cy;
    private final double cz;
    private final double scale;
    private final double switch2;
    private final int degree;
    /** Weighted coefficients (×2 for m ≥ 1): potential (degree P), gradient x, y, z (P+1), tensor xx..zz (P+2). */
    private final double[][] re = new double[10][];
    private final double[][] im = new double[10][];

    /**
     * @param mesh    closed outward mesh, metres
     * @param density kg/m^3
     * @param threads worker threads for the facet integrals (results do not depend on it)
     */
    public BodyExpansion(TriangleMesh mesh, double density, int threads) {
        this.gRho = Constants.G * density;
        this.degree = DEGREE;
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        int nv = mesh.vertexCount();
        int nf = mesh.facetCount();
        // Centre of mass from signed tetrahedra about the vertex centroid (Dobrovolskis 1996), for round-off.
        double ox = 0;
        double oy = 0;
        double oz = 0;
        for (int i = 0; i < nv; i++) {
            ox += xyz[3 * i];
            oy += xyz[3 * i + 1];
            oz += xyz[3 * i + 2];
        }
        ox /= nv;
        oy /= nv;
        oz /= nv;
        double v6 = 0;
        double mx = 0;
        double my = 0;
        double mz = 0;
        for (int f = 0; f < nf; f++) {
            int a = 3 * tri[3 * f];
            int b = 3 * tri[3 * f + 1];
            int c = 3 * tri[3 * f + 2];
            double ax = xyz[a] - ox;
            double ay = xyz[a + 1] - oy;
            double az = xyz[a + 2] - oz;
            double bx = xyz[b] - ox;
            double by = xyz[b + 1] - oy;
            double bz = xyz[b + 2] - oz;
            double qx = xyz[c] - ox;
            double qy = xyz[c + 1] - oy;
            double qz = xyz[c + 2] - oz;
            double t = ax * (by * qz - bz * qy) + ay * (bz * qx - bx * qz) + az * (bx * qy - by * qx);
            v6 += t;
            mx += t * (ax + bx + qx);
            my += t * (ay + by + qy);
            mz += t * (az + bz + qz);
        }
        cx = ox + mx / (4 * v6);
        cy = oy + my / (4 * v6);
        cz = oz + mz / (4 * v6);
        double rb = 0;
        for (int i = 0; i < nv; i++) {
            double dx = xyz[3 * i] - cx;
            double dy = xyz[3 * i + 1] - cy;
            double dz = xyz[3 * i + 2] - cz;
            rb = Math.max(rb, Math.sqrt(dx * dx + dy * dy + dz * dz));
        }
        scale = rb;
        double sw = SWITCH_RADII * rb;
        switch2 = sw * sw;
        int p = degree;
        int size = SolidHarmonics.size(p);
        TriangleQuadrature rule = new TriangleQuadrature(p);
        int block = 512;
        int blocks = (nf + block - 1) / block;
        double[] partRe = new double[blocks * size];
        double[] partIm = new double[blocks * size];
        final double fox = cx;
        final double foy = cy;
        final double foz = cz;
        final double fa = rb;
        ParallelChunks.run(blocks, threads, () -> new double[][] {new double[size], new double[size]},
            (s, from, to) -> {
                for (int bk = from; bk < to; bk++) {
                    int f1 = Math.min(nf, (bk + 1) * block);
                    for (int f = bk * block; f < f1; f++) {
                        addConeMoments(xyz, tri, f, fox, foy, foz, fa, rule, p, s[0], s[1], partRe, partIm,
                            bk * size);
                    }
                }
            }, ProgressListener.NONE);
        double[] vRe = new double[size];
        double[] vIm = new double[size];
        for (int bk = 0; bk < blocks; bk++) {
            for (int k = 0; k < size; k++) {
                vRe[k] += partRe[bk * size + k];
                vIm[k] += partIm[bk * size + k];
            }
        }
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                int k = SolidHarmonics.index(n, m);
                vRe[k] /= n + 3;
                vIm[k] /= n + 3;
            }
        }
        prepare(vRe, vIm);
    }

    /** Facets per block of {@link #volumeMoments}: blocks are summed in a fixed order, whatever the thread count. */
    static final int MOMENT_BLOCK = 512;

    /**
     * Dimensionless volume moments ∫_V conj(R_n^m((y − c)/a)) dV / a³ of the closed outward polyhedron {@code mesh}
     * about the origin c = ({@code ox, oy, oz}) with the length scale {@code a} (metres), degree ≤ {@code degree}
     * (0 to 60), by the cone formula of the constructor and the exact triangle rule of that degree. Parallel over
     * blocks of {@link #MOMENT_BLOCK} facets whose partial sums are added in block order, so the result does not
     * depend on {@code threads}. Returns {real parts, imaginary parts} at {@link SolidHarmonics#index}(n, m).
     */
    public static double[][] volumeMoments(TriangleMesh mesh, double ox, double oy, double oz, double a, int degree,
                                           int threads) {
        if (degree < 0 || degree > 60) {
            throw new IllegalArgumentException("moment degree " + degree + " outside 0..60");
        }
        if (!(a > 0) || !Double.isFinite(a)) {
            throw new IllegalArgumentException("moment scale must be positive and finite, got " + a);
        }
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        int nf = mesh.facetCount();
        int p = degree;
        int size = SolidHarmonics.size(p);
        TriangleQuadrature rule = new TriangleQuadrature(p);
        int blocks = (nf + MOMENT_BLOCK - 1) / MOMENT_BLOCK;
        double[] partRe = new double[blocks * size];
        double[] partIm = new double[blocks * size];
        ParallelChunks.run(blocks, Math.max(1, threads), () -> new double[][] {new double[size], new double[size]},
            (s, from, to) -> {
                for (int bk = from; bk < to; bk++) {
                    int f1 = Math.min(nf, (bk + 1) * MOMENT_BLOCK);
                    for (int f = bk * MOMENT_BLOCK; f < f1; f++) {
                        addConeMoments(xyz, tri, f, ox, oy, oz, a, rule, p, s[0], s[1], partRe, partIm, bk * size);
                    }
                }
            }, ProgressListener.NONE);
        double[] vRe = new double[size];
        double[] vIm = new double[size];
        for (int bk = 0; bk < blocks; bk++) {
            for (int k = 0; k < size; k++) {
                vRe[k] += partRe[bk * size + k];
                vIm[k] += partIm[bk * size + k];
            }
        }
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                int k = SolidHarmonics.index(n, m);
                vRe[k] /= n + 3;
                vIm[k] /= n + 3;
            }
        }
        return new double[][] {vRe, vIm};
    }

    /**
     * An expansion from volume moments already known: {@code (vRe, vIm)} = ∫_V conj(R_n^m((y − c)/a)) dV / a³
     * (dimensionless, degree ≤ {@code degree}), used at and beyond {@code switchRadius} from c.
     */
    BodyExpansion(double density, double[] centre, double a, int degree, double[] vRe, double[] vIm,
                  double switchRadius) {
        this.gRho = Constants.G * density;
        this.degree = degree;
        this.cx = centre[0];
        this.cy = centre[1];
        this.cz = centre[2];
        this.scale = a;
        this.switch2 = switchRadius * switchRadius;
        prepare(vRe.clone(), vIm.clone());
    }

    /** Potential, gradient and tensor coefficient sets from the volume moments. */
    private void prepare(double[] vRe, double[] vIm) {
        int p = degree;
        store(0, vRe, vIm, p);
        double[][] gRe = new double[3][SolidHarmonics.size(p + 1)];
        double[][] gIm = new double[3][SolidHarmonics.size(p + 1)];
        for (int axis = 0; axis < 3; axis++) {
            SolidHarmonics.derivative(axis, vRe, vIm, p, gRe[axis], gIm[axis]);
            store(1 + axis, gRe[axis], gIm[axis], p + 1);
        }
        int[][] pairs = {{0, 0}, {0, 1}, {0, 2}, {1, 1}, {1, 2}, {2, 2}};
        for (int t = 0; t < 6; t++) {
            double[] hr = new double[SolidHarmonics.size(p + 2)];
            double[] hi = new double[SolidHarmonics.size(p + 2)];
            SolidHarmonics.derivative(pairs[t][1], gRe[pairs[t][0]], gIm[pairs[t][0]], p + 1, hr, hi);
            store(4 + t, hr, hi, p + 2);
        }
    }

    private void store(int slot, double[] r, double[] i, int p) {
        int n = SolidHarmonics.size(p);
        re[slot] = new double[n];
        im[slot] = new double[n];
        for (int d = 0; d <= p; d++) {
            for (int m = 0; m <= d; m++) {
                int k = SolidHarmonics.index(d, m);
                double w = m == 0 ? 1 : 2;
                re[slot][k] = w * r[k];
                im[slot][k] = w * i[k];
            }
        }
    }

    /** Adds h_f ∫_f conj R((y − c)/a) dS/a² (scaled coordinates) of facet f to the block's partial sums. */
    private static void addConeMoments(double[] xyz, int[] tri, int f, double ox, double oy, double oz, double a,
                                       TriangleQuadrature rule, int p, double[] tr, double[] ti, double[] outRe,
                                       double[] outIm, int off) {
        int ia = 3 * tri[3 * f];
        int ib = 3 * tri[3 * f + 1];
        int ic = 3 * tri[3 * f + 2];
        double ax = (xyz[ia] - ox) / a;
        double ay = (xyz[ia + 1] - oy) / a;
        double az = (xyz[ia + 2] - oz) / a;
        double bx = (xyz[ib] - ox) / a;
        double by = (xyz[ib + 1] - oy) / a;
        double bz = (xyz[ib + 2] - oz) / a;
        double qx = (xyz[ic] - ox) / a;
        double qy = (xyz[ic + 1] - oy) / a;
        double qz = (xyz[ic + 2] - oz) / a;
        double ux = bx - ax;
        double uy = by - ay;
        double uz = bz - az;
        double vx = qx - ax;
        double vy = qy - ay;
        double vz = qz - az;
        double nx = uy * vz - uz * vy;
        double ny = uz * vx - ux * vz;
        double nz = ux * vy - uy * vx;
        // h·area = (n̂·a)(|n|/2) = (n·a)/2 with n the unnormalised normal (|n| = 2 area)
        double hArea = 0.5 * (nx * ax + ny * ay + nz * az);
        for (int q = 0; q < rule.size(); q++) {
            double l1 = rule.l1(q);
            double l2 = rule.l2(q);
            double l3 = rule.l3(q);
            SolidHarmonics.regular(l1 * ax + l2 * bx + l3 * qx, l1 * ay + l2 * by + l3 * qy,
                l1 * az + l2 * bz + l3 * qz, p, tr, ti);
            double w = rule.weight(q) * hArea;
            for (int k = 0; k < tr.length; k++) {
                outRe[off + k] += w * tr[k];
                outIm[off + k] -= w * ti[k];
            }
        }
    }

    /** Degree of the expansion. */
    public int degree() {
        return degree;
    }

    /** Centre of the expansion, metres. */
    public double[] centre() {
        return new double[] {cx, cy, cz};
    }

    /** Radius of the sphere about the centre that holds all mass (about the centre of mass: the Brillouin radius), m. */
    public double brillouinRadius() {
        return scale;
    }

    /** Whether (x, y, z) is at or beyond the switch radius (for the exact field {@link #SWITCH_RADII} Brillouin radii). */
    public boolean covers(double x, double y, double z) {
        double dx = x - cx;
        double dy = y - cy;
        double dz = z - cz;
        double r2 = dx * dx + dy * dy + dz * dz;
        return r2 >= switch2; // an overflowing r² (|x| > 1e154 m) is +∞ and covered
    }

    /** Squared switch radius, m². */
    public double switchRadius2() {
        return switch2;
    }

    /**
     * The field at a point that {@link #covers} accepts: writes U, g, Laplacian (0), the gradient tensor when
     * asked (else NaN) and location OUTSIDE into {@code out[o..]} ({@link FieldSample} layout).
     *
     * @param jr scratch of {@link SolidHarmonics#size}({@link #degree()} + 2) values (modified); {@code ji} likewise
     */
    public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o, double[] jr,
                         double[] ji) {
        double dx = (x - cx) / scale;
        double dy = (y - cy) / scale;
        double dz = (z - cz) / scale;
        double big = Math.max(Math.abs(dx), Math.max(Math.abs(dy), Math.abs(dz)));
        double ux = dx / big;
        double uy = dy / big;
        double uz = dz / big;
        double u2 = ux * ux + uy * uy + uz * uz;
        double invR = 1 / (big * Math.sqrt(u2)); // 1/r' without overflow of r'²
        double f = 1 / (big * u2); // d'/r'² = u/(big |u|²)
        double q2 = invR * invR;
        int p = gradient ? degree + 2 : degree + 1;
        SolidHarmonics.irregularScaled(ux * f, uy * f, uz * f, q2, p, jr, ji);
        double a = scale;
        out[o + FieldSample.U] = gRho * a * a * invR * dot(0, jr, ji);
        out[o + FieldSample.AX] = gRho * a * invR * dot(1, jr, ji);
        out[o + FieldSample.AY] = gRho * a * invR * dot(2, jr, ji);
        out[o + FieldSample.AZ] = gRho * a * invR * dot(3, jr, ji);
        out[o + FieldSample.LAPLACIAN] = 0;
        for (int t = 0; t < 6; t++) {
            out[o + FieldSample.GXX + t] = gradient ? gRho * invR * dot(4 + t, jr, ji) : Double.NaN;
        }
        out[o + FieldSample.LOCATION] = Location.OUTSIDE.code();
    }

    /** Σ Re(c J) from the highest degree down (small terms first). */
    private double dot(int slot, double[] jr, double[] ji) {
        double[] r = re[slot];
        double[] i = im[slot];
        double s = 0;
        for (int k = r.length - 1; k >= 0; k--) {
            s += r[k] * jr[k] - i[k] * ji[k];
        }
        return s;
    }
}
