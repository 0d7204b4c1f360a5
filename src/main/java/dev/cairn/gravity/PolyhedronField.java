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
 * <li>The edge factor is evaluated as {@code L_e = 2 atanh(t)}, {@code t = e/(a+b)}: for {@code t ≤ 1/8} (the edge
 *     more than a few edge lengths away, nearly every edge) by its Taylor series, one division and no cancellation
 *     however far the point ({@link KernelMath#twoAtanhSmall}); closer, by {@link #edgeLogNear}: near the edge's
 *     interior {@code a+b−e} is computed without cancellation as {@code 2|r_a×d|²/((ab − r_a·r_b)(a+b+e))}, {@code d}
 *     the edge vector; on an edge or a vertex {@code a+b−e = 0} and {@code L_e} diverges, but {@code E_e·r_e = 0}
 *     there: the term is dropped, which is its limit.</li>
 * <li>Exactly on a facet its own ω is ±2π by the sign of a rounded zero; a point within
 *     {@link #ON_FACET_TOLERANCE} (relative) of a facet's plane and inside it is classified {@link Location#SURFACE}
 *     and that facet's ω set to 0 (its {@code F_f·r_f} vanishes there anyway), so Σω = 2π on a facet interior.</li>
 * <li>{@code ω_f} comes from {@link KernelMath#atan2Fast} (one division, no table, 2 ulp).</li>
 * <li>Coordinates are stored relative to the vertex centroid and field points shifted likewise, which limits
 *     round-off far away.</li>
 * </ul>
 * The gradient tensor diverges (logarithmically) at edges and vertices, as it physically does. Accuracy: within
 * 1e-12 relative (measured 4e-14 in U and g) of the same sums written straight from the paper with {@link Math#log}
 * and {@link Math#atan2} ({@code dev.cairn.bench.ReferenceKernel}, {@code ReferenceKernelAgreementTest}), and the
 * published checks of the test suite.
 *
 * <p>Speed: evaluators run one of two paths that give the same bits for every point.
 * <ul>
 * <li>The <b>vector path</b> ({@link VectorKernel}, when the module {@code jdk.incubator.vector} is present, as the
 *     launcher and the test setup arrange): {@link FieldEvaluator#evaluateBatch} evaluates 8 field points (the lanes of
 *     a 512-bit vector; 4 on 256-bit machines) per pass over the vertex, edge and facet arrays, facet and edge data
 *     broadcast to all lanes. Measured 12–22 times the straightforward baseline's facet-evaluations per second on
 *     one thread ({@code cairn bench}, docs/benchmarks.md).</li>
 * <li>The <b>scalar path</b>, one point per pass, when the module is absent (or {@code -Dcairn.kernel.scalar=true}),
 *     and for single-point {@link FieldEvaluator#evaluate} calls: about 2.3 times the baseline.</li>
 * </ul>
 * Both paths perform the same IEEE operations in the same order per point (fma where written), with a point's edges
 * within a few edge lengths added after all other edges; so results do not depend on the path, the thread count, or
 * which points share a pass ({@code KernelPathsBitIdentityTest}).
 *
 * <p>Precomputed state: per facet 3 vertex indices, the unit normal and twice the area (F_f = n_f n_fᵀ is applied
 * as n_f (n_f·r)); per edge 2 vertex indices, its length and the 6 unique components of the symmetric E_e; per vertex
 * its 3 coordinates (152 bytes per facet). Scratch per evaluator: per vertex its offset and distance (scalar path) or
 * its distance from each lane's point (vector path), and one int per edge.
 */
public final class PolyhedronField implements FieldModel {
    /** Relative distance from a facet's plane (|r1·(r2×r3)| / (R1R2R3)) below which a point is on that facet. */
    public static final double ON_FACET_TOLERANCE = 1e-10;

    final int vertexCount;
    final int facetCount;
    final int edgeCount;
    final double density;
    private final double volume;
    final double ox;
    final double oy;
    final double oz;
    /** Vertex coordinates relative to (ox, oy, oz), m. */
    final double[] pv;
    /** Facet vertex indices. */
    final int[] fv;
    /**
     * Facet unit normals n_f (x, y, z) and twice the facet area (4 doubles per facet). F_f = n_f n_fᵀ is never
     * stored: F_f·r = n_f (n_f·r), and r1·(r2×r3) = 2A (n_f·r1) for any vertex r1 of the facet.
     */
    final double[] fn;
    /** Edge vertex indices. */
    final int[] ev;
    /** E_e unique components xx, xy, xz, yy, yz, zz. */
    final double[] edy;
    /** Edge lengths, m. */
    final double[] elen;
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

    /**
     * Whether evaluators use the vector path ({@link VectorKernel}): the module {@code jdk.incubator.vector} is present
     * (the launcher and the test setup add it), the preferred vector holds 4 or more doubles, and the system property
     * {@code cairn.kernel.scalar} is not {@code true}. Results are the same bits either way.
     */
    public static final boolean VECTOR_PATH = detectVectorPath();

    private static boolean detectVectorPath() {
        if (Boolean.getBoolean("cairn.kernel.scalar")
            || ModuleLayer.boot().findModule("jdk.incubator.vector").isEmpty()) {
            return false;
        }
        try {
            return VectorKernel.usable();
        } catch (LinkageError e) {
            return false; // module present but not readable: keep the scalar path
        }
    }

    /**
     * A new evaluator: the vector path when {@link #VECTOR_PATH}, else the scalar one. Its
     * {@link FieldEvaluator#evaluateBatch} evaluates {@code VectorKernel.LANES} points per pass on the vector path.
     */
    @Override
    public FieldEvaluator newEvaluator() {
        return newEvaluator(VECTOR_PATH);
    }

    /** An evaluator on the vector path ({@code vector}, only if {@link #VECTOR_PATH}) or the scalar path. */
    FieldEvaluator newEvaluator(boolean vector) {
        if (vector && !VECTOR_PATH) {
            throw new IllegalStateException("the vector path needs --add-modules jdk.incubator.vector");
        }
        Evaluator scalar = new Evaluator();
        return new FarSwitch(vector ? VectorKernel.newEvaluator(this, scalar) : scalar);
    }

    /**
     * The whole body's exterior expansion (exact to rounding at and beyond {@link BodyExpansion#SWITCH_RADII}
     * Brillouin radii, where the direct sum's round-off has grown to ~1e-12 and more), built once on first use.
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

    /** Whether a point is at or beyond the switch radius about the centre of mass (an overflowing distance too). */
    private boolean farPoint(double x, double y, double z) {
        double qx = x - ox - comX;
        double qy = y - oy - comY;
        double qz = z - oz - comZ;
        return qx * qx + qy * qy + qz * qz >= farSwitch2;
    }

    /**
     * Sends points at and beyond the switch radius to the exterior expansion and the others to the direct sum;
     * a batch is split into runs of near points, so each point's result is the same whichever points share the call.
     */
    private final class FarSwitch implements FieldEvaluator {
        private final FieldEvaluator direct;
        private double[] jr;
        private double[] ji;

        FarSwitch(FieldEvaluator direct) {
            this.direct = direct;
        }

        private void far(double x, double y, double z, boolean gradient, double[] out, int o) {
            if (jr == null) {
                jr = new double[SolidHarmonics.size(BodyExpansion.DEGREE + 2)];
                ji = new double[jr.length];
            }
            expansion().evaluate(x, y, z, gradient, out, o, jr, ji);
        }

        @Override
        public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o) {
            if (farPoint(x, y, z)) {
                far(x, y, z, gradient, out, o);
            } else {
                direct.evaluate(x, y, z, gradient, out, o);
            }
        }

        @Override
        public void evaluateBatch(double[] xyz, int from, int to, boolean gradient, double[] out) {
            int run = from;
            for (int i = from; i < to; i++) {
                if (farPoint(xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2])) {
                    if (run < i) {
                        direct.evaluateBatch(xyz, run, i, gradient, out);
                    }
                    far(xyz[3 * i], xyz[3 * i + 1], xyz[3 * i + 2], gradient, out, i * FieldSample.SIZE);
                    run = i + 1;
                }
            }
            if (run < to) {
                direct.evaluateBatch(xyz, run, to, gradient, out);
            }
        }
    }

    /**
     * {@code L_e} for one edge and one field point when {@code t = e/(a+b)} exceeds {@link KernelMath#ATANH_LIMIT}
     * (the point is within a few edge lengths of the edge), shared by the scalar and the vector path: near the edge's
     * interior ({@code r_i·r_j < 0}) {@code a+b−e} cancels and is computed as {@code 2|r_i×d|²/((ab − r_i·r_j)(a+b+e))};
     * on the edge or at one of its vertices the result is 0 (there {@code E_e·r_e = 0} and 0 is the term's limit).
     */
    static double edgeLogNear(double rix, double riy, double riz, double rjx, double rjy, double rjz, double a,
                              double b, double s, double len) {
        double dot = rix * rjx + riy * rjy + riz * rjz;
        if (dot < 0) {
            // L = ln((a+b+e)^2 (ab - r_i·r_j) / (2|r_i × d|^2))
            double dx = rjx - rix;
            double dy = rjy - riy;
            double dz = rjz - riz;
            double cx = riy * dz - riz * dy;
            double cy = riz * dx - rix * dz;
            double cz = rix * dy - riy * dx;
            double c2 = cx * cx + cy * cy + cz * cz;
            if (!(c2 > 0)) {
                return 0; // on the edge
            }
            double sp = s + len;
            return KernelMath.log(sp * sp * (a * b - dot) / (2 * c2));
        }
        double den = s - len;
        if (!(den > 0)) {
            return 0; // at a vertex of the edge
        }
        return KernelMath.log((s + len) / den);
    }

    /**
     * Adds the terms of those edges among {@code edges[0..count)} (in that order) that lie within a few edge lengths
     * of the point {@code (px, py, pz)} (relative to the vertex centroid), {@code e/(a+b) > }
     * {@link KernelMath#ATANH_LIMIT}: {@code L_e} by {@link #edgeLogNear}, then the same operations as the main edge
     * loop. Shared by the scalar path (one point) and the vector path (one lane at a time), so both give the same bits.
     *
     * @param dist vertex distances from the point, at {@code dist[stride·v + lane]} (read)
     * @param acc  the running sums u, gx, gy, gz, −, txx .. tzz at {@code acc[k·accStride + lane]} (modified)
     */
    void addNearEdges(int[] edges, int count, double px, double py, double pz, double[] dist, int stride, int lane,
                      double[] acc, int accStride, boolean gradient) {
        int l = accStride == 1 ? 0 : lane;
        for (int k = 0; k < count; k++) {
            int e = edges[k];
            int i = ev[2 * e];
            int j = ev[2 * e + 1];
            double a = dist[stride * i + lane];
            double b = dist[stride * j + lane];
            double s = a + b;
            double len = elen[e];
            if (!(len / s > KernelMath.ATANH_LIMIT)) {
                continue; // far from this point (another lane's point is near): the main loop has its term
            }
            double rix = pv[3 * i] - px;
            double riy = pv[3 * i + 1] - py;
            double riz = pv[3 * i + 2] - pz;
            double le = edgeLogNear(rix, riy, riz, pv[3 * j] - px, pv[3 * j + 1] - py, pv[3 * j + 2] - pz, a, b, s, len);
            int q = 6 * e;
            double exx = edy[q];
            double exy = edy[q + 1];
            double exz = edy[q + 2];
            double eyy = edy[q + 3];
            double eyz = edy[q + 4];
            double ezz = edy[q + 5];
            double erx = Math.fma(exz, riz, Math.fma(exy, riy, exx * rix));
            double ery = Math.fma(eyz, riz, Math.fma(eyy, riy, exy * rix));
            double erz = Math.fma(ezz, riz, Math.fma(eyz, riy, exz * rix));
            double rer = Math.fma(riz, erz, Math.fma(riy, ery, rix * erx));
            acc[l] = Math.fma(rer, le, acc[l]);
            acc[accStride + l] = Math.fma(-erx, le, acc[accStride + l]);
            acc[2 * accStride + l] = Math.fma(-ery, le, acc[2 * accStride + l]);
            acc[3 * accStride + l] = Math.fma(-erz, le, acc[3 * accStride + l]);
            if (gradient) {
                acc[5 * accStride + l] = Math.fma(exx, le, acc[5 * accStride + l]);
                acc[6 * accStride + l] = Math.fma(exy, le, acc[6 * accStride + l]);
                acc[7 * accStride + l] = Math.fma(exz, le, acc[7 * accStride + l]);
                acc[8 * accStride + l] = Math.fma(eyy, le, acc[8 * accStride + l]);
                acc[9 * accStride + l] = Math.fma(eyz, le, acc[9 * accStride + l]);
                acc[10 * accStride + l] = Math.fma(ezz, le, acc[10 * accStride + l]);
            }
        }
    }

    /**
     * Whether the facet term is skipped for a point (its ω taken as 0 and the point marked {@link Location#SURFACE}):
     * on a vertex of the facet ({@code prod = R1R2R3 = 0}), or within {@link #ON_FACET_TOLERANCE} of its plane and
     * inside it.
     */
    static boolean onFacet(double num, double den, double prod) {
        return !(prod > 0) || Math.abs(num) <= ON_FACET_TOLERANCE * prod && den <= ON_FACET_TOLERANCE * prod;
    }

    /**
     * Scalar evaluator: one field point per pass. This is the reference arithmetic of the kernel; the vector path
     * ({@link VectorKernel}) repeats it operation for operation in each lane. Per-thread scratch: vertex offsets and
     * distances for the current point.
     */
    private final class Evaluator implements FieldEvaluator {
        /** Per vertex: offset x, y, z from the field point and its length, interleaved for locality. */
        private final double[] r = new double[4 * vertexCount];
        /** Edges within a few edge lengths of the current point, in edge order. */
        private final int[] nearEdges = new int[edgeCount];
        /** The sums u, gx, gy, gz, (unused), txx, txy, txz, tyy, tyz, tzz while near edges are added. */
        private final double[] acc = new double[11];

        @Override
        public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o) {
            final double px = x - ox;
            final double py = y - oy;
            final double pz = z - oz;
            final double[] r = this.r;
            final double[] pv = PolyhedronField.this.pv;
            for (int i = 0, k = 0, q = 0; i < vertexCount; i++, k += 3, q += 4) {
                double rx = pv[k] - px;
                double ry = pv[k + 1] - py;
                double rz = pv[k + 2] - pz;
                r[q] = rx;
                r[q + 1] = ry;
                r[q + 2] = rz;
                r[q + 3] = Math.sqrt(Math.fma(rz, rz, Math.fma(ry, ry, rx * rx)));
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
            int nearCount = 0;
            for (int e = 0; e < edgeCount; e++) {
                int ki = 4 * ev[2 * e];
                int kj = 4 * ev[2 * e + 1];
                double rix = r[ki];
                double riy = r[ki + 1];
                double riz = r[ki + 2];
                double a = r[ki + 3];
                double b = r[kj + 3];
                double len = elen[e];
                double s = a + b;
                double t = len / s;
                if (t > KernelMath.ATANH_LIMIT) {
                    nearEdges[nearCount++] = e; // within a few edge lengths: added after this loop
                    continue;
                }
                double le = KernelMath.twoAtanhSmall(t);
                int q = 6 * e;
                double exx = edy[q];
                double exy = edy[q + 1];
                double exz = edy[q + 2];
                double eyy = edy[q + 3];
                double eyz = edy[q + 4];
                double ezz = edy[q + 5];
                double erx = Math.fma(exz, riz, Math.fma(exy, riy, exx * rix));
                double ery = Math.fma(eyz, riz, Math.fma(eyy, riy, exy * rix));
                double erz = Math.fma(ezz, riz, Math.fma(eyz, riy, exz * rix));
                double rer = Math.fma(riz, erz, Math.fma(riy, ery, rix * erx));
                u = Math.fma(rer, le, u);
                gx = Math.fma(-erx, le, gx);
                gy = Math.fma(-ery, le, gy);
                gz = Math.fma(-erz, le, gz);
                if (gradient) {
                    txx = Math.fma(exx, le, txx);
                    txy = Math.fma(exy, le, txy);
                    txz = Math.fma(exz, le, txz);
                    tyy = Math.fma(eyy, le, tyy);
                    tyz = Math.fma(eyz, le, tyz);
                    tzz = Math.fma(ezz, le, tzz);
                }
            }
            if (nearCount > 0) {
                double[] acc = this.acc;
                acc[0] = u;
                acc[1] = gx;
                acc[2] = gy;
                acc[3] = gz;
                acc[5] = txx;
                acc[6] = txy;
                acc[7] = txz;
                acc[8] = tyy;
                acc[9] = tyz;
                acc[10] = tzz;
                addNearEdges(nearEdges, nearCount, px, py, pz, r, 4, 3, acc, 1, gradient);
                u = acc[0];
                gx = acc[1];
                gy = acc[2];
                gz = acc[3];
                txx = acc[5];
                txy = acc[6];
                txz = acc[7];
                tyy = acc[8];
                tyz = acc[9];
                tzz = acc[10];
            }
            double omegaSum = 0;
            boolean onSurface = false;
            final int[] fv = PolyhedronField.this.fv;
            final double[] fn = PolyhedronField.this.fn;
            for (int f = 0; f < facetCount; f++) {
                int k1 = 4 * fv[3 * f];
                int k2 = 4 * fv[3 * f + 1];
                int k3 = 4 * fv[3 * f + 2];
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
                double h = Math.fma(nz, r1z, Math.fma(ny, r1y, nx * r1x)); // signed distance of the facet's plane
                double num = fn[q + 3] * h;
                double prod = n1 * n2 * n3;
                double d23 = Math.fma(r2z, r3z, Math.fma(r2y, r3y, r2x * r3x));
                double d31 = Math.fma(r3z, r1z, Math.fma(r3y, r1y, r3x * r1x));
                double d12 = Math.fma(r1z, r2z, Math.fma(r1y, r2y, r1x * r2x));
                double den = Math.fma(n3, d12, Math.fma(n2, d31, Math.fma(n1, d23, prod)));
                double omega;
                if (onFacet(num, den, prod)) {
                    onSurface = true; // its omega is taken as 0: the updates below then change nothing
                    omega = 0;
                } else {
                    omega = 2 * KernelMath.atan2Fast(num, den);
                }
                double ho = h * omega;
                u = Math.fma(-h, ho, u); // r1·F·r1 ω = (n·r1)² ω
                gx = Math.fma(nx, ho, gx); // F·r1 ω = n (n·r1) ω
                gy = Math.fma(ny, ho, gy);
                gz = Math.fma(nz, ho, gz);
                omegaSum += omega;
                if (gradient) {
                    double nxo = nx * omega;
                    double nyo = ny * omega;
                    double nzo = nz * omega;
                    txx = Math.fma(-nx, nxo, txx);
                    txy = Math.fma(-ny, nxo, txy);
                    txz = Math.fma(-nz, nxo, txz);
                    tyy = Math.fma(-ny, nyo, tyy);
                    tyz = Math.fma(-nz, nyo, tyz);
                    tzz = Math.fma(-nz, nzo, tzz);
                }
            }
            writeSample(u, gx, gy, gz, omegaSum, onSurface, gradient, txx, txy, txz, tyy, tyz, tzz, out, o);
        }
    }

    /** Scales the sums by Gρ and writes one {@link FieldSample}; shared by the scalar and the vector path. */
    void writeSample(double u, double gx, double gy, double gz, double omegaSum, boolean onSurface, boolean gradient,
                     double txx, double txy, double txz, double tyy, double tyz, double tzz, double[] out, int o) {
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
