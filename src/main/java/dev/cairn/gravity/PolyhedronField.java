package dev.cairn.gravity;

import dev.cairn.mesh.EdgeTable;
import dev.cairn.mesh.TriangleMesh;

/**
 * Exact gravity field of a constant-density closed polyhedron.
 *
 * <p>Method: Werner, R.A. &amp; Scheeres, D.J. (1997) "Exterior gravitation of a polyhedron derived and compared with
 * harmonic and mascon gravitation representations", Celest. Mech. Dyn. Astron. 65:313–344 (eqs. for U, ∇U, ∇∇U
 * and ∇²U), with the facet solid angle of Van Oosterom, A. &amp; Strackee, J. (1983) "The solid angle of a plane
 * triangle", IEEE Trans. Biomed. Eng. BME-30(2):125–126:
 * <pre>
 *   U    =  (Gρ/2) Σ_e r_e·E_e·r_e L_e − (Gρ/2) Σ_f r_f·F_f·r_f ω_f
 *   ∇U   = −Gρ Σ_e E_e·r_e L_e + Gρ Σ_f F_f·r_f ω_f
 *   ∇∇U  =  Gρ Σ_e E_e L_e − Gρ Σ_f F_f ω_f,      ∇²U = −Gρ Σ_f ω_f
 * </pre>
 * with {@code r} from the field point to a vertex of the edge or facet, {@code F_f = n_f n_fᵀ},
 * {@code E_e = n_A n_ABᵀ + n_B n_BAᵀ}, {@code L_e = ln((a+b+e)/(a+b−e))} and
 * {@code ω_f = 2 atan2(r1·(r2×r3), R1R2R3 + R1 r2·r3 + R2 r3·r1 + R3 r1·r2)}.
 *
 * <p>Conventions: U &gt; 0, g = ∇U (toward the body); SI units; model frame. The field is exact and finite outside,
 * inside and on the surface:
 * <ul>
 * <li>On an edge or a vertex {@code a+b−e = 0} and {@code L_e} diverges, but {@code E_e·r_e = 0} there: the term is
 *     dropped, which is its limit. Close to an edge {@code a+b−e} is computed without cancellation as
 *     {@code 2|r_a×d|²/((ab − r_a·r_b)(a+b+e))}, {@code d} the edge vector.</li>
 * <li>Exactly on a facet its own ω is ±2π by the sign of a rounded zero; a point within
 *     {@link #ON_FACET_TOLERANCE} (relative) of a facet's plane and inside it is classified {@link Location#SURFACE}
 *     and that facet's ω set to 0 (its {@code F_f·r_f} vanishes there anyway), so Σω = 2π on a facet interior.</li>
 * <li>{@code atan2} and {@code log} come from {@link KernelMath}: table-plus-series versions accurate to the last
 *     few bits and about twice as fast as {@link Math}'s on Java 17.</li>
 * <li>Coordinates are stored relative to the vertex centroid and field points shifted likewise, which limits
 *     round-off far away.</li>
 * </ul>
 * The gradient tensor diverges (logarithmically) at edges and vertices, as it physically does.
 *
 * <p>Precomputed state: per facet 3 vertex indices, the unit normal and twice the area (F_f = n_f n_fᵀ is applied
 * as n_f (n_f·r)); per edge 2 vertex indices,
 * its length and the 6 unique components of the symmetric E_e; per vertex its 3 coordinates. Per field point,
 * each vertex's offset and distance and each edge's log term are computed once.
 */
public final class PolyhedronField implements FieldModel {
    /** Relative distance from a facet's plane (|r1·(r2×r3)| / (R1R2R3)) below which a point is on that facet. */
    public static final double ON_FACET_TOLERANCE = 1e-10;

    private final int vertexCount;
    private final int facetCount;
    private final int edgeCount;
    private final double density;
    private final double volume;
    private final double ox;
    private final double oy;
    private final double oz;
    /** Vertex coordinates relative to (ox, oy, oz), m. */
    private final double[] pv;
    /** Facet vertex indices. */
    private final int[] fv;
    /**
     * Facet unit normals n_f (x, y, z) and twice the facet area (4 doubles per facet). F_f = n_f n_fᵀ is never
     * stored: F_f·r = n_f (n_f·r), and r1·(r2×r3) = 2A (n_f·r1) for any vertex r1 of the facet.
     */
    private final double[] fn;
    /** Edge vertex indices. */
    private final int[] ev;
    /** E_e unique components xx, xy, xz, yy, yz, zz. */
    private final double[] edy;
    /** Edge lengths, m. */
    private final double[] elen;
    /**
     * Squared distance from the vertex centroid beyond which every edge is more than 256 edge lengths away, so every
     * log argument x = 2e/(a+b−e) is below 1/255 and ln(1 + x) is summed as a series (far-field accuracy).
     */
    private final double farDistance2;
    /** The whole body's exterior expansion, built on the first far point ({@link BodyExpansion#SWITCH_RADII}). */
    private volatile BodyExpansion expansion;
    private final TriangleMesh mesh;
    /** Centre of mass relative to (ox, oy, oz), m, and the squared radius about it where the expansion takes over. */
    private final double comX;
    private final double comY;
    private final double comZ;
    private final double farSwitch2;

    /**
     * @param mesh    closed, consistently outward-oriented mesh without zero-area facets, metres (check it with
     *                {@link dev.cairn.mesh.MeshInspector#requireFitForGravity} first)
     * @param density kg/m^3
     * @throws IllegalArgumentException if an edge does not have exactly two oppositely oriented facets
     */
    public PolyhedronField(TriangleMesh mesh, double density) {
        this(mesh, EdgeTable.of(mesh), density);
    }

    /** As {@link #PolyhedronField(TriangleMesh, double)} with an edge table already built for {@code mesh}. */
    public PolyhedronField(TriangleMesh mesh, EdgeTable edges, double density) {
        this.mesh = mesh;
        this.density = density;
        this.vertexCount = mesh.vertexCount();
        this.facetCount = mesh.facetCount();
        this.edgeCount = edges.edgeCount();
        double[] xyz = mesh.xyz();
        double sx = 0;
        double sy = 0;
        double sz = 0;
        for (int i = 0; i < xyz.length; i += 3) {
            sx += xyz[i];
            sy += xyz[i + 1];
            sz += xyz[i + 2];
        }
        ox = sx / vertexCount;
        oy = sy / vertexCount;
        oz = sz / vertexCount;
        pv = new double[xyz.length];
        for (int i = 0; i < xyz.length; i += 3) {
            pv[i] = xyz[i] - ox;
            pv[i + 1] = xyz[i + 1] - oy;
            pv[i + 2] = xyz[i + 2] - oz;
        }
        fv = mesh.tri().clone();
        double[] normals = new double[3 * facetCount];
        fn = new double[4 * facetCount];
        double vol6 = 0;
        double mx = 0;
        double my = 0;
        double mz = 0;
        for (int f = 0; f < facetCount; f++) {
            int a = 3 * fv[3 * f];
            int b = 3 * fv[3 * f + 1];
            int c = 3 * fv[3 * f + 2];
            double ux = pv[b] - pv[a];
            double uy = pv[b + 1] - pv[a + 1];
            double uz = pv[b + 2] - pv[a + 2];
            double vx = pv[c] - pv[a];
            double vy = pv[c + 1] - pv[a + 1];
            double vz = pv[c + 2] - pv[a + 2];
            double nx = uy * vz - uz * vy;
            double ny = uz * vx - ux * vz;
            double nz = ux * vy - uy * vx;
            double t6 = pv[a] * nx + pv[a + 1] * ny + pv[a + 2] * nz;
            vol6 += t6;
            mx += t6 * (pv[a] + pv[b] + pv[c]);
            my += t6 * (pv[a + 1] + pv[b + 1] + pv[c + 1]);
            mz += t6 * (pv[a + 2] + pv[b + 2] + pv[c + 2]);
            double len = Math.sqrt(nx * nx + ny * ny + nz * nz);
            if (!(len > 0)) {
                throw new IllegalArgumentException("facet " + f + " has zero area");
            }
            nx /= len;
            ny /= len;
            nz /= len;
            normals[3 * f] = nx;
            normals[3 * f + 1] = ny;
            normals[3 * f + 2] = nz;
            fn[4 * f] = nx;
            fn[4 * f + 1] = ny;
            fn[4 * f + 2] = nz;
            fn[4 * f + 3] = len;
        }
        volume = vol6 / 6.0;
        ev = new int[2 * edgeCount];
        edy = new double[6 * edgeCount];
        elen = new double[edgeCount];
        for (int e = 0; e < edgeCount; e++) {
            int fa = edges.facetForward(e);
            int fb = edges.facetBackward(e);
            if (edges.facetCount(e) != 2 || fa < 0 || fb < 0) {
                throw new IllegalArgumentException("edge " + edges.v0(e) + "-" + edges.v1(e)
                    + " is not shared by exactly two oppositely oriented facets");
            }
            int i = edges.v0(e);
            int j = edges.v1(e);
            ev[2 * e] = i;
            ev[2 * e + 1] = j;
            double dx = pv[3 * j] - pv[3 * i];
            double dy = pv[3 * j + 1] - pv[3 * i + 1];
            double dz = pv[3 * j + 2] - pv[3 * i + 2];
            elen[e] = Math.sqrt(dx * dx + dy * dy + dz * dz);
            // Facet A runs i→j: edge normal n_ij^A = unit(d × n_A). Facet B runs j→i: n_ji^B = unit(−d × n_B).
            double[] sym = new double[6];
            addEdgeDyad(sym, normals, fa, dx, dy, dz);
            addEdgeDyad(sym, normals, fb, -dx, -dy, -dz);
            System.arraycopy(sym, 0, edy, 6 * e, 6);
        }
        double rmax = 0;
        for (int i = 0; i < pv.length; i += 3) {
            rmax = Math.max(rmax, Math.sqrt(pv[i] * pv[i] + pv[i + 1] * pv[i + 1] + pv[i + 2] * pv[i + 2]));
        }
        double emax = 0;
        for (double l : elen) {
            emax = Math.max(emax, l);
        }
        farDistance2 = (rmax + 256 * emax) * (rmax + 256 * emax);
        // centre of mass by signed tetrahedra (Dobrovolskis 1996) and the Brillouin radius about it
        comX = mx / (4 * vol6);
        comY = my / (4 * vol6);
        comZ = mz / (4 * vol6);
        double rb = 0;
        for (int i = 0; i < pv.length; i += 3) {
            double dx = pv[i] - comX;
            double dy = pv[i + 1] - comY;
            double dz = pv[i + 2] - comZ;
            rb = Math.max(rb, Math.sqrt(dx * dx + dy * dy + dz * dz));
        }
        double sw = BodyExpansion.SWITCH_RADII * rb;
        farSwitch2 = sw * sw;
    }

    private static void addEdgeDyad(double[] sym, double[] normals, int f, double dx, double dy, double dz) {
        double nx = normals[3 * f];
        double ny = normals[3 * f + 1];
        double nz = normals[3 * f + 2];
        double mx = dy * nz - dz * ny;
        double my = dz * nx - dx * nz;
        double mz = dx * ny - dy * nx;
        double ml = Math.sqrt(mx * mx + my * my + mz * mz);
        mx /= ml;
        my /= ml;
        mz /= ml;
        // E = n mᵀ is symmetric only in sum over both facets; store the symmetric part (n mᵀ + m nᵀ)/2.
        sym[0] += nx * mx;
        sym[1] += 0.5 * (nx * my + ny * mx);
        sym[2] += 0.5 * (nx * mz + nz * mx);
        sym[3] += ny * my;
        sym[4] += 0.5 * (ny * mz + nz * my);
        sym[5] += nz * mz;
    }

    /** Density, kg/m^3. */
    public double density() {
        return density;
    }

    /** Enclosed volume, m^3. */
    public double volume() {
        return volume;
    }

    public int facetCount() {
        return facetCount;
    }

    public int vertexCount() {
        return vertexCount;
    }

    public int edgeCount() {
        return edgeCount;
    }

    /** Bytes of precomputed state per facet (vertex, facet and edge arrays), for the benchmark report. */
    public double bytesPerFacet() {
        long bytes = 8L * pv.length + 4L * fv.length + 8L * fn.length + 4L * ev.length + 8L * edy.length
            + 8L * elen.length;
        return (double) bytes / facetCount;
    }

    @Override
    public double gm() {
        return Constants.G * density * volume;
    }

    @Override
    public String describe() {
        return "constant-density polyhedron, " + facetCount + " facets, " + density + " kg/m^3";
    }

    @Override
    public FieldEvaluator newEvaluator() {
        return new Evaluator();
    }

    /**
     * The whole body's exterior expansion (exact to rounding at and beyond {@link BodyExpansion#SWITCH_RADII}
     * Brillouin radii), built once on first use.
     */
    public BodyExpansion expansion() {
        BodyExpansion e = expansion;
        if (e == null) {
            synchronized (this) {
                e = expansion;
                if (e == null) {
                    e = new BodyExpansion(mesh, density, dev.cairn.util.ParallelChunks.defaultThreads());
                    expansion = e;
                }
            }
        }
        return e;
    }


    /** Per-thread scratch: vertex offsets and distances for the current field point. */
    private final class Evaluator implements FieldEvaluator {
        /** Per vertex: offset x, y, z from the field point and its length, interleaved for locality. */
        private final double[] r = new double[4 * vertexCount];
        private double[] jr;
        private double[] ji;

        @Override
        public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o) {
            final double px = x - ox;
            final double py = y - oy;
            final double pz = z - oz;
            double qx = px - comX;
            double qy = py - comY;
            double qz = pz - comZ;
            if (qx * qx + qy * qy + qz * qz >= farSwitch2) { // also for an overflowing (infinite) distance
                if (jr == null) {
                    jr = new double[SolidHarmonics.size(BodyExpansion.DEGREE + 2)];
                    ji = new double[jr.length];
                }
                expansion().evaluate(x, y, z, gradient, out, o, jr, ji);
                return;
            }
            final boolean far = px * px + py * py + pz * pz > farDistance2; // same for every edge: no misprediction
            final double[] r = this.r;
            final double[] pv = PolyhedronField.this.pv;
            for (int i = 0, k = 0, q = 0; i < vertexCount; i++, k += 3, q += 4) {
                double rx = pv[k] - px;
                double ry = pv[k + 1] - py;
                double rz = pv[k + 2] - pz;
                r[q] = rx;
                r[q + 1] = ry;
                r[q + 2] = rz;
                r[q + 3] = Math.sqrt(rx * rx + ry * ry + rz * rz);
            }
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
            final int[] ev = PolyhedronField.this.ev;
            final double[] edy = PolyhedronField.this.edy;
            final double[] elen = PolyhedronField.this.elen;
            for (int e = 0; e < edgeCount; e++) {
                int ki = 4 * ev[2 * e];
                int kj = 4 * ev[2 * e + 1];
                double rix = r[ki];
                double riy = r[ki + 1];
                double riz = r[ki + 2];
                double a = r[ki + 3];
                double rjx = r[kj];
                double rjy = r[kj + 1];
                double rjz = r[kj + 2];
                double b = r[kj + 3];
                double len = elen[e];
                double s = a + b;
                double dot = rix * rjx + riy * rjy + riz * rjz;
                double le;
                if (dot < 0) {
                    // Near the edge's interior a+b-e cancels; use a+b-e = 2|r_i × d|^2 / ((ab - r_i·r_j)(a+b+e)),
                    // so L = ln((a+b+e)^2 (ab - r_i·r_j) / (2|r_i × d|^2)).
                    double dx = rjx - rix;
                    double dy = rjy - riy;
                    double dz = rjz - riz;
                    double cx = riy * dz - riz * dy;
                    double cy = riz * dx - rix * dz;
                    double cz = rix * dy - riy * dx;
                    double c2 = cx * cx + cy * cy + cz * cz;
                    if (!(c2 > 0)) {
                        continue; // on the edge: E_e·r_e = 0 there, the term's limit is 0
                    }
                    double sp = s + len;
                    le = KernelMath.log(sp * sp * (a * b - dot) / (2 * c2));
                } else {
                    double den = s - len;
                    if (!(den > 0)) {
                        continue; // at a vertex of the edge: the term's limit is 0
                    }
                    // Far away x = 2e/(a+b−e) is tiny and ln of the rounded ratio (1 + x) would lose digits.
                    le = far ? KernelMath.log1pSmall(2 * len / den) : KernelMath.log((s + len) / den);
                }
                int q = 6 * e;
                double exx = edy[q];
                double exy = edy[q + 1];
                double exz = edy[q + 2];
                double eyy = edy[q + 3];
                double eyz = edy[q + 4];
                double ezz = edy[q + 5];
                double erx = exx * rix + exy * riy + exz * riz;
                double ery = exy * rix + eyy * riy + eyz * riz;
                double erz = exz * rix + eyz * riy + ezz * riz;
                u += (rix * erx + riy * ery + riz * erz) * le;
                gx -= erx * le;
                gy -= ery * le;
                gz -= erz * le;
                if (gradient) {
                    txx += exx * le;
                    txy += exy * le;
                    txz += exz * le;
                    tyy += eyy * le;
                    tyz += eyz * le;
                    tzz += ezz * le;
                }
            }
            double omegaSum = 0;
            boolean onSurface = false;
            final int[] fv = PolyhedronField.this.fv;
            final double[] fn = PolyhedronField.this.fn;
            for (int f = 0; f < facetCount; f++) {
                int i1 = fv[3 * f];
                int i2 = fv[3 * f + 1];
                int i3 = fv[3 * f + 2];
                int k1 = 4 * i1;
                int k2 = 4 * i2;
                int k3 = 4 * i3;
                double r1x = r[k1];
                double r1y = r[k1 + 1];
                double r1z = r[k1 + 2];
                double r2x = r[k2];
                double r2y = r[k2 + 1];
                double r2z = r[k2 + 2];
                double r3x = r[k3];
                double r3y = r[k3 + 1];
                double r3z = r[k3 + 2];
                double n1 = r[k1 + 3];
                double n2 = r[k2 + 3];
                double n3 = r[k3 + 3];
                // r1·(r2×r3) = r1·((P2−P1)×(P3−P1)) = 2A (n·r1): exact facet geometry, and far away no cancellation
                // (the plain triple product of the long vectors r_i loses ~D² digits at distance D body sizes).
                int q = 4 * f;
                double nx = fn[q];
                double ny = fn[q + 1];
                double nz = fn[q + 2];
                double h = nx * r1x + ny * r1y + nz * r1z; // signed distance of the facet's plane
                double num = fn[q + 3] * h;
                double prod = n1 * n2 * n3;
                double den = prod + n1 * (r2x * r3x + r2y * r3y + r2z * r3z)
                    + n2 * (r3x * r1x + r3y * r1y + r3z * r1z) + n3 * (r1x * r2x + r1y * r2y + r1z * r2z);
                double omega;
                if (!(prod > 0) || Math.abs(num) <= ON_FACET_TOLERANCE * prod && den <= ON_FACET_TOLERANCE * prod) {
                    onSurface = true; // on a vertex of the facet (prod = 0), or in its plane and within it
                    continue;
                }
                omega = 2 * KernelMath.atan2(num, den);
                double ho = h * omega;
                u -= h * ho; // r1·F·r1 ω = (n·r1)² ω
                gx += nx * ho; // F·r1 ω = n (n·r1) ω
                gy += ny * ho;
                gz += nz * ho;
                omegaSum += omega;
                if (gradient) {
                    double nxo = nx * omega;
                    double nyo = ny * omega;
                    txx -= nx * nxo;
                    txy -= ny * nxo;
                    txz -= nz * nxo;
                    tyy -= ny * nyo;
                    tyz -= nz * nyo;
                    tzz -= nz * nz * omega;
                }
            }
            double gr = Constants.G * density;
            out[o + FieldSample.U] = 0.5 * gr * u;
            out[o + FieldSample.AX] = gr * gx;
            out[o + FieldSample.AY] = gr * gy;
            out[o + FieldSample.AZ] = gr * gz;
            out[o + FieldSample.LAPLACIAN] = -gr * omegaSum;
            if (gradient) {
                out[o + FieldSample.GXX] = gr * txx;
                out[o + FieldSample.GXY] = gr * txy;
                out[o + FieldSample.GXZ] = gr * txz;
                out[o + FieldSample.GYY] = gr * tyy;
                out[o + FieldSample.GYZ] = gr * tyz;
                out[o + FieldSample.GZZ] = gr * tzz;
            } else {
                for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                    out[o + k] = Double.NaN;
                }
            }
            Location loc = onSurface ? Location.SURFACE : omegaSum > 2 * Math.PI ? Location.INSIDE : Location.OUTSIDE;
            out[o + FieldSample.LOCATION] = loc.code();
        }
    }
}
