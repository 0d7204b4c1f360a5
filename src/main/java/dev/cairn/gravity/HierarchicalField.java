package dev.cairn.gravity;

import dev.cairn.mesh.TriangleMesh;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;
import java.util.Locale;
import java.util.concurrent.atomic.LongAdder;

/**
 * Fast field of a constant-density polyhedron: a treecode with an exact near field (Barnes, J. &amp; Hut, P. (1986)
 * A hierarchical O(N log N) force-calculation algorithm, Nature 324:446–449; multipole expansions in solid
 * harmonics as in Greengard, L. &amp; Rokhlin, V. (1987) A fast algorithm for particle simulations, J. Comput. Phys.
 * 73:325–348).
 *
 * <p><b>The field as layer potentials.</b> By the divergence theorem the Werner–Scheeres field is a Laplace single
 * layer with facet-constant densities (shared references §10, checked there against the edge/facet sums):
 * <pre>
 *   g(x) = −Gρ Σ_f n_f S_f(x),   U(x) = (Gρ/2) Σ_f (n_f·(y_f − x)) S_f(x),   Σ_f ω_f(x) = ∇·Σ_f n_f S_f(x)
 * </pre>
 * with S_f(x) = ∫_f dS'/|x − x'| = Σ_{e∈f} (m_e·r_e) L_e − (n_f·r_f) ω_f, m_e the in-plane outward edge normal, and
 * L_e, ω_f the Werner–Scheeres edge logarithm and Van Oosterom–Strackee solid angle.
 *
 * <p><b>Tree.</b> A {@link FacetTree} over the facets; every node carries the multipole moments (degree ≤ p, scaled
 * by its radius a) of four densities on its facets: n_x, n_y, n_z and n·(y − c), plus the double-layer
 * coefficients (the divergence of the first three). Leaf moments are exact (a triangle rule of degree p), parents
 * get theirs by exact multipole translation.
 *
 * <p><b>Evaluation.</b> Per point, the tree is walked from the root: a node with a ≤ θ |x − c| contributes its
 * expansion; otherwise its children are visited, and a leaf that fails the test contributes its facets' exact S_f
 * (so the field stays exact and finite on and near the surface, and inside/outside classification is the same as
 * {@link PolyhedronField}'s). Points at {@link BodyExpansion#SWITCH_RADII} Brillouin radii or more use the whole
 * body's expansion.
 *
 * <p><b>Error control.</b> The caller states a relative tolerance τ for |g| and U. The opening ratio θ and degree p
 * are chosen from τ a priori ({@link #degreeFor}); then, per point, the truncation error of every accepted node is
 * estimated from its last two degrees (geometric tail: next term ≈ q × last, q = a/r, tail ≤ last·q/(1−q)), and the
 * point is recomputed with the exact direct sum when the estimate exceeds τ|g| or τU (e.g. near a point where g
 * vanishes). Commands also compare sampled points with the exact sum and report the measured error
 * ({@link #measureError}). Results do not depend on the thread count.
 *
 * <p>Conventions: U &gt; 0, g = ∇U, gradient tensor ∇∇U (symmetrised), Laplacian −Gρ Σω; SI units, model frame.
 */
public final class HierarchicalField implements FieldModel {
    /** Default relative tolerance on |g| and U. */
    public static final double DEFAULT_TOLERANCE = 1e-10;
    /** Smallest and largest accepted tolerances. */
    public static final double MIN_TOLERANCE = 1e-13;
    public static final double MAX_TOLERANCE = 1e-2;
    /** Per-facet near-field record: P1, P2, P3 (9), unit normal (3), twice the area, 1/e for the 3 edges. */
    private static final int NEAR = 16;
    private static final int MAX_DEGREE = 24;
    /** Degree of the double-layer (solid-angle) sum used only to tell inside from outside off the surface. */
    private static final int CLASSIFY_DEGREE = 4;
    /** Budget for the stored moments, bytes per facet; leaves get moments only when all nodes fit in it. */
    static final double MOMENT_BUDGET = 320;

    private final double density;
    private final double gRho;
    private final double tolerance;
    private final double theta2;
    private final double theta;
    /** (p + 1) ln θ: a node at ratio q needs degree d with (d + 1) ln q ≤ this. */
    private final double logThetaP1;
    private final int p;
    private final int size;
    private final int stride;
    private final FacetTree tree;
    /** Per facet (tree order): unit normal and twice the area. */
    private final double[] facetNormal;
    /** Per facet (tree order): its 3 vertices and 3 edges (edge k from vertex k to k+1) as indices local to its leaf. */
    private final int[] facetLocal;
    /** Per node: its leaf number, or −1 for an internal node. */
    private final int[] leafOf;
    /** Per leaf l: its distinct vertices are leafVertex[leafVertexStart[l] ..], edges leafEdge[leafEdgeStart[l] ..]. */
    private final int[] leafVertexStart;
    private final int[] leafEdgeStart;
    /** Leaf vertex coordinates (3 each), m. */
    private final double[] leafVertex;
    /** Leaf edges: local vertex indices (2 each) and 1/length. */
    private final int[] leafEdge;
    private final double[] leafEdgeInv;
    /**
     * Per leaf edge, 6 values: for an edge whose two facets are both in the leaf, the symmetric Werner–Scheeres dyad
     * E = n_A m_Aᵀ + n_B m_Bᵀ (xx, xy, xz, yy, yz, zz); for an edge with one facet in the leaf, that facet's unit normal
     * n and in-plane outward edge normal m (its term is n (m·r) L). {@link #leafEdgeShared} tells which.
     */
    private final double[] leafEdgeDyad;
    private final boolean[] leafEdgeShared;
    private final int maxLeafVertices;
    private final int maxLeafEdges;
    /** Per node: offset of its moments in {@link #moments}, or −1 (a leaf without moments is always evaluated exactly). */
    private final int[] momentOffset;
    private final double[] moments;
    private final PolyhedronField exact;
    private final BodyExpansion body;
    private final int facetCount;
    private final LongAdder fallbacks = new LongAdder();
    private final LongAdder evaluations = new LongAdder();

    /**
     * @param mesh      closed outward mesh, metres (check it with {@code MeshInspector.requireFitForGravity} first)
     * @param density   kg/m^3
     * @param tolerance relative tolerance on |g| and U, {@link #MIN_TOLERANCE} to {@link #MAX_TOLERANCE}
     * @param threads   worker threads for the set-up (results do not depend on it)
     */
    public HierarchicalField(TriangleMesh mesh, double density, double tolerance, int threads) {
        this(mesh, new PolyhedronField(mesh, density), tolerance, threads);
    }

    /** As above, reusing an exact field already built for {@code mesh} (the fallback and reference). */
    public HierarchicalField(TriangleMesh mesh, PolyhedronField exact, double tolerance, int threads) {
        this(mesh, exact, tolerance, openingRatioFor(tolerance), degreeFor(tolerance), leafSizeFor(mesh.facetCount()),
            threads);
    }

    /** With explicit opening ratio, degree and leaf size (for calibration and tests). */
    HierarchicalField(TriangleMesh mesh, PolyhedronField exact, double tolerance, double theta, int degree,
                      int leafSize, int threads) {
        if (!(tolerance >= MIN_TOLERANCE && tolerance <= MAX_TOLERANCE)) {
            throw new IllegalArgumentException("tolerance " + tolerance + " outside " + MIN_TOLERANCE + ".."
                + MAX_TOLERANCE);
        }
        this.exact = exact;
        this.density = exact.density();
        this.gRho = Constants.G * density;
        this.tolerance = tolerance;
        this.theta = theta;
        this.theta2 = theta * theta;
        this.p = degree;
        this.logThetaP1 = (degree + 1) * Math.log(theta);
        this.size = SolidHarmonics.size(p);
        this.stride = 8 * size;
        this.facetCount = mesh.facetCount();
        this.tree = new FacetTree(mesh, leafSize);
        double[] near = nearRecords(mesh, tree.order());
        this.facetNormal = new double[4 * facetCount];
        for (int i = 0; i < facetCount; i++) {
            System.arraycopy(near, NEAR * i + 9, facetNormal, 4 * i, 4);
        }
        // leaf-local vertices and edges, so that each distance and edge logarithm is computed once per leaf
        int nodeCount = tree.nodeCount();
        leafOf = new int[nodeCount];
        int leaves = 0;
        for (int n = 0; n < nodeCount; n++) {
            leafOf[n] = tree.isLeaf(n) ? leaves++ : -1;
        }
        leafVertexStart = new int[leaves + 1];
        leafEdgeStart = new int[leaves + 1];
        facetLocal = new int[6 * facetCount];
        int[] tri = mesh.tri();
        int[] order = tree.order();
        int[] stamp = new int[mesh.vertexCount()];
        int[] local = new int[mesh.vertexCount()];
        java.util.Arrays.fill(stamp, -1);
        int[] lvIdx = new int[3 * facetCount];
        int[] ledge = new int[6 * facetCount];
        int nvTot = 0;
        int neTot = 0;
        int maxV = 0;
        int maxE = 0;
        java.util.HashMap<Long, Integer> edgeIds = new java.util.HashMap<>();
        for (int n = 0; n < nodeCount; n++) {
            int l = leafOf[n];
            if (l < 0) {
                continue;
            }
            leafVertexStart[l] = nvTot;
            leafEdgeStart[l] = neTot;
            edgeIds.clear();
            int nv = 0;
            int ne = 0;
            for (int i = tree.start(n); i < tree.end(n); i++) {
                int f = order[i];
                int[] lv3 = new int[3];
                for (int k = 0; k < 3; k++) {
                    int v = tri[3 * f + k];
                    if (stamp[v] != l) {
                        stamp[v] = l;
                        local[v] = nv;
                        lvIdx[nvTot + nv] = v;
                        nv++;
                    }
                    lv3[k] = local[v];
                    facetLocal[6 * i + k] = local[v];
                }
                for (int k = 0; k < 3; k++) {
                    int a = lv3[k];
                    int b = lv3[(k + 1) % 3];
                    long key = (long) Math.min(a, b) << 32 | Math.max(a, b);
                    Integer id = edgeIds.get(key);
                    if (id == null) {
                        id = ne++;
                        edgeIds.put(key, id);
                        ledge[2 * (neTot + id)] = a;
                        ledge[2 * (neTot + id) + 1] = b;
                    }
                    facetLocal[6 * i + 3 + k] = id;
                }
            }
            nvTot += nv;
            neTot += ne;
            maxV = Math.max(maxV, nv);
            maxE = Math.max(maxE, ne);
        }
        leafVertexStart[leaves] = nvTot;
        leafEdgeStart[leaves] = neTot;
        maxLeafVertices = maxV;
        maxLeafEdges = maxE;
        double[] xyz = mesh.xyz();
        leafVertex = new double[3 * nvTot];
        for (int j = 0; j < nvTot; j++) {
            System.arraycopy(xyz, 3 * lvIdx[j], leafVertex, 3 * j, 3);
        }
        leafEdge = java.util.Arrays.copyOf(ledge, 2 * neTot);
        leafEdgeInv = new double[neTot];
        for (int l = 0; l < leaves; l++) {
            int v0 = leafVertexStart[l];
            for (int k = leafEdgeStart[l]; k < leafEdgeStart[l + 1]; k++) {
                int a = 3 * (v0 + leafEdge[2 * k]);
                int b = 3 * (v0 + leafEdge[2 * k + 1]);
                double dx = leafVertex[b] - leafVertex[a];
                double dy = leafVertex[b + 1] - leafVertex[a + 1];
                double dz = leafVertex[b + 2] - leafVertex[a + 2];
                leafEdgeInv[k] = 1 / Math.sqrt(dx * dx + dy * dy + dz * dz);
            }
        }
        leafEdgeDyad = new double[6 * neTot];
        leafEdgeShared = new boolean[neTot];
        int[] uses = new int[neTot];
        for (int n = 0; n < nodeCount; n++) {
            int l = leafOf[n];
            if (l < 0) {
                continue;
            }
            int v0 = leafVertexStart[l];
            int e0 = leafEdgeStart[l];
            for (int i = tree.start(n); i < tree.end(n); i++) {
                double fx = near[NEAR * i + 9];
                double fy = near[NEAR * i + 10];
                double fz = near[NEAR * i + 11];
                for (int k = 0; k < 3; k++) {
                    int a = 3 * (v0 + facetLocal[6 * i + k]);
                    int b = 3 * (v0 + facetLocal[6 * i + (k + 1) % 3]);
                    int e = e0 + facetLocal[6 * i + 3 + k];
                    double dx = leafVertex[b] - leafVertex[a];
                    double dy = leafVertex[b + 1] - leafVertex[a + 1];
                    double dz = leafVertex[b + 2] - leafVertex[a + 2];
                    double inv = leafEdgeInv[e];
                    double mx = (dy * fz - dz * fy) * inv;
                    double my = (dz * fx - dx * fz) * inv;
                    double mz = (dx * fy - dy * fx) * inv;
                    double[] d = leafEdgeDyad;
                    int o = 6 * e;
                    if (uses[e] == 0) {
                        d[o] = fx;
                        d[o + 1] = fy;
                        d[o + 2] = fz;
                        d[o + 3] = mx;
                        d[o + 4] = my;
                        d[o + 5] = mz;
                    } else {
                        // second facet: the sum of both n mᵀ is symmetric (Werner & Scheeres 1997)
                        double ax = d[o];
                        double ay = d[o + 1];
                        double az = d[o + 2];
                        double bx = d[o + 3];
                        double by = d[o + 4];
                        double bz = d[o + 5];
                        d[o] = ax * bx + fx * mx;
                        d[o + 1] = 0.5 * (ax * by + ay * bx + fx * my + fy * mx);
                        d[o + 2] = 0.5 * (ax * bz + az * bx + fx * mz + fz * mx);
                        d[o + 3] = ay * by + fy * my;
                        d[o + 4] = 0.5 * (ay * bz + az * by + fy * mz + fz * my);
                        d[o + 5] = az * bz + fz * mz;
                        leafEdgeShared[e] = true;
                    }
                    uses[e]++;
                }
            }
        }
        int nodes = tree.nodeCount();
        boolean leafMoments = nodes == 1 || 8.0 * stride * nodes / facetCount <= MOMENT_BUDGET;
        momentOffset = new int[nodes];
        int count = 0;
        for (int n = 0; n < nodes; n++) {
            momentOffset[n] = leafMoments || !tree.isLeaf(n) ? Math.multiplyExact(count++, stride) : -1;
        }
        this.moments = new double[Math.multiplyExact(count, stride)];
        double[] rootRaw = buildMoments(Math.max(1, threads), near);
        // the whole body's volume moments about the root's centre: ∫_V conj R dV = W_n/(n+3) (cone formula,
        // BodyExpansion), made dimensionless by a³
        double a = tree.radius(0);
        double[] vRe = new double[size];
        double[] vIm = new double[size];
        for (int n = 0; n <= p; n++) {
            for (int m = 0; m <= n; m++) {
                int k = SolidHarmonics.index(n, m);
                vRe[k] = rootRaw[6 * size + k] / ((n + 3) * a * a * a);
                vIm[k] = rootRaw[7 * size + k] / ((n + 3) * a * a * a);
            }
        }
        double rs = a / bodyRatioFor(tolerance, p);
        this.body = new BodyExpansion(density, new double[] {tree.centreX(0), tree.centreY(0), tree.centreZ(0)}, a, p,
            vRe, vIm, rs);
    }

    /**
     * Largest ratio a/r (a the radius of the sphere about the root's centre holding all mass) at which the whole
     * body's expansion of degree p is used: its truncation bound q^{p+1}/(1 − q) relative to GM/r (Greengard &amp;
     * Rokhlin 1987, one cluster) at most τ/30 (a factor 3 for the derivatives).
     */
    static double bodyRatioFor(double tolerance, int degree) {
        double q = 0.9;
        for (int i = 0; i < 180 && Math.pow(q, degree + 1) / (1 - q) > tolerance / 30; i++) {
            q -= 0.005;
        }
        return Math.max(q, 0.005);
    }

    /** Opening ratio θ (node radius over distance) for a tolerance: 0.5 down to 1e-7, 0.3 below. */
    static double openingRatioFor(double tolerance) {
        return tolerance >= 1e-7 ? 0.5 : 0.3;
    }

    /**
     * Expansion degree for a tolerance, from the a-priori error model err(θ, p) = e₁₀(θ)·k(θ)^{−(p−10)}, fitted to
     * the largest relative errors measured on lumpy bodies of 5k to 330k facets at points on, inside, near and
     * outside the surface (docs/fast-field.md): e₁₀ = 4e-9, k = 4 at θ = 0.3; e₁₀ = 1.3e-6, k = 2.4 at θ = 0.5.
     * The degree is the smallest with err ≤ τ/30 (a safety factor of 30: the largest errors measured on other
     * bodies were up to 3 times the fitted model); the per-point tail estimate then catches what the a-priori choice
     * misses.
     */
    static int degreeFor(double tolerance) {
        boolean wide = openingRatioFor(tolerance) > 0.4;
        double e10 = wide ? 1.3e-6 : 4e-9;
        double k = wide ? 2.4 : 4.0;
        int deg = 10 + (int) Math.ceil(Math.log(e10 * 30 / tolerance) / Math.log(k));
        return Math.max(3, Math.min(MAX_DEGREE, deg));
    }

    /**
     * Leaf size for F facets: the median splits halve the facets at every level, so leaves hold F/2^depth facets;
     * the depth is chosen so that they hold 24 to 48 (moments of the internal nodes then stay near 250–400 bytes per
     * facet at the default tolerance, and the near field near its measured optimum, docs/fast-field.md).
     */
    static int leafSizeFor(int facets) {
        int depth = 0;
        while (depth < 30 && facets / Math.pow(2, depth + 1) >= 24) {
            depth++;
        }
        return (int) Math.ceil(facets / Math.pow(2, depth));
    }

    private static double[] nearRecords(TriangleMesh mesh, int[] order) {
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        double[] rec = new double[NEAR * order.length];
        for (int i = 0; i < order.length; i++) {
            int f = order[i];
            int o = NEAR * i;
            for (int v = 0; v < 3; v++) {
                int q = 3 * tri[3 * f + v];
                rec[o + 3 * v] = xyz[q];
                rec[o + 3 * v + 1] = xyz[q + 1];
                rec[o + 3 * v + 2] = xyz[q + 2];
            }
            double ux = rec[o + 3] - rec[o];
            double uy = rec[o + 4] - rec[o + 1];
            double uz = rec[o + 5] - rec[o + 2];
            double vx = rec[o + 6] - rec[o];
            double vy = rec[o + 7] - rec[o + 1];
            double vz = rec[o + 8] - rec[o + 2];
            double nx = uy * vz - uz * vy;
            double ny = uz * vx - ux * vz;
            double nz = ux * vy - uy * vx;
            double len = Math.sqrt(nx * nx + ny * ny + nz * nz);
            rec[o + 9] = nx / len;
            rec[o + 10] = ny / len;
            rec[o + 11] = nz / len;
            rec[o + 12] = len;
            for (int k = 0; k < 3; k++) {
                int a = o + 3 * k;
                int b = o + 3 * ((k + 1) % 3);
                double dx = rec[b] - rec[a];
                double dy = rec[b + 1] - rec[a + 1];
                double dz = rec[b + 2] - rec[a + 2];
                rec[o + 13 + k] = 1 / Math.sqrt(dx * dx + dy * dy + dz * dz);
            }
        }
        return rec;
    }

    /**
     * Moments of every node that has them: those of a node with moments come from its children's moments by
     * translation when both children have moments, else directly from its facets by quadrature (exact to degree p).
     * Nodes are independent within one depth, so the work runs in parallel depth by depth, deepest first; each
     * node's sums are formed in a fixed order, so results do not depend on the thread count.
     */
    private double[] buildMoments(int threads, double[] near) {
        int nodes = tree.nodeCount();
        TriangleQuadrature rule = new TriangleQuadrature(p);
        int[] depth = new int[nodes];
        for (int n = 0; n < nodes; n++) {
            if (!tree.isLeaf(n)) {
                depth[tree.left(n)] = depth[n] + 1;
                depth[tree.right(n)] = depth[n] + 1;
            }
        }
        int maxDepth = 0;
        for (int d : depth) {
            maxDepth = Math.max(maxDepth, d);
        }
        int[] byDepth = new int[nodes];
        int[] first = new int[maxDepth + 2];
        for (int d : depth) {
            first[d + 1]++;
        }
        for (int d = 0; d <= maxDepth; d++) {
            first[d + 1] += first[d];
        }
        int[] fill = first.clone();
        for (int n = 0; n < nodes; n++) {
            byDepth[fill[depth[n]]++] = n;
        }
        for (int d = maxDepth; d >= 0; d--) {
            final int from0 = first[d];
            int count = first[d + 1] - first[d];
            ParallelChunks.run(count, threads, () -> new double[][] {new double[size], new double[size],
                new double[size], new double[size], new double[p + 1], new double[size], new double[size]},
                (s, from, to) -> {
                    for (int i = from; i < to; i++) {
                        int node = byDepth[from0 + i];
                        if (momentOffset[node] < 0) {
                            continue;
                        }
                        if (tree.isLeaf(node) || momentOffset[tree.left(node)] < 0
                            || momentOffset[tree.right(node)] < 0) {
                            for (int f = tree.start(node); f < tree.end(node); f++) {
                                facetMoments(node, f, near, rule, s[0], s[1], s[5], s[6]);
                            }
                        } else {
                            translateChild(node, tree.left(node), s);
                            translateChild(node, tree.right(node), s);
                        }
                    }
                }, ProgressListener.NONE);
        }
        double[] rootRaw = java.util.Arrays.copyOfRange(moments, momentOffset[0], momentOffset[0] + stride);
        // weights ×2 for m ≥ 1, so that a potential is Σ (re·Jre − im·Jim) over the stored coefficients
        for (int n = 0; n < nodes; n++) {
            int o = momentOffset[n];
            if (o < 0) {
                continue;
            }
            for (int d = 0; d < 8; d++) {
                for (int deg = 1; deg <= p; deg++) {
                    for (int m = 1; m <= deg; m++) {
                        moments[o + d * size + SolidHarmonics.index(deg, m)] *= 2;
                    }
                }
            }
        }
        // interleave for evaluation: coefficient k of density d at o + 8k + 2d (re) and + 1 (im), one stream
        double[] block = new double[stride];
        for (int n = 0; n < nodes; n++) {
            int o = momentOffset[n];
            if (o < 0) {
                continue;
            }
            System.arraycopy(moments, o, block, 0, stride);
            for (int d = 0; d < 4; d++) {
                for (int k = 0; k < size; k++) {
                    moments[o + 8 * k + 2 * d] = block[2 * d * size + k];
                    moments[o + 8 * k + 2 * d + 1] = block[(2 * d + 1) * size + k];
                }
            }
        }
        return rootRaw;
    }

    /** Adds the moments of {@code child} (raw, unweighted) translated to {@code node}'s centre and scale. */
    private void translateChild(int node, int child, double[][] s) {
        double ap = tree.radius(node);
        double ac = tree.radius(child);
        double tx = (tree.centreX(child) - tree.centreX(node)) / ap;
        double ty = (tree.centreY(child) - tree.centreY(node)) / ap;
        double tz = (tree.centreZ(child) - tree.centreZ(node)) / ap;
        int co = momentOffset[child];
        int po = momentOffset[node];
        SolidHarmonics.translateMultipole(moments, co + 6 * size, moments, co + 7 * size, ac, moments, po + 6 * size,
            moments, po + 7 * size, ap, tx, ty, tz, p, s[2], s[3], s[4]);
        // density n·(y − c_parent) = n·(y − c_child) + n·(c_child − c_parent): with N the child's normal-density
        // moments translated to the parent, add N to the parent's and (c_child − c_parent)·N to its W moments
        double[] cRe = s[0];
        double[] cIm = s[1];
        for (int d = 0; d < 3; d++) {
            java.util.Arrays.fill(cRe, 0);
            java.util.Arrays.fill(cIm, 0);
            SolidHarmonics.translateMultipole(moments, co + 2 * d * size, moments, co + (2 * d + 1) * size, ac, cRe,
                0, cIm, 0, ap, tx, ty, tz, p, s[2], s[3], s[4]);
            double t = (d == 0 ? tx : d == 1 ? ty : tz) * ap;
            for (int k = 0; k < size; k++) {
                moments[po + 2 * d * size + k] += cRe[k];
                moments[po + (2 * d + 1) * size + k] += cIm[k];
                moments[po + 6 * size + k] += t * cRe[k];
                moments[po + 7 * size + k] += t * cIm[k];
            }
        }
    }

    /** Adds the raw moments of facet {@code i} (tree order) about {@code node}'s centre, scaled by its radius. */
    private void facetMoments(int node, int i, double[] near, TriangleQuadrature rule, double[] tr, double[] ti,
                              double[] gr,
                              double[] gi) {
        double a = tree.radius(node);
        double cx = tree.centreX(node);
        double cy = tree.centreY(node);
        double cz = tree.centreZ(node);
        int ro = momentOffset[node];
        double[] raw = moments;
        int o = NEAR * i;
        double ax = (near[o] - cx) / a;
        double ay = (near[o + 1] - cy) / a;
        double az = (near[o + 2] - cz) / a;
        double bx = (near[o + 3] - cx) / a;
        double by = (near[o + 4] - cy) / a;
        double bz = (near[o + 5] - cz) / a;
        double qx = (near[o + 6] - cx) / a;
        double qy = (near[o + 7] - cy) / a;
        double qz = (near[o + 8] - cz) / a;
        double nx = near[o + 9];
        double ny = near[o + 10];
        double nz = near[o + 11];
        double area = 0.5 * near[o + 12];
        double h = nx * (near[o] - cx) + ny * (near[o + 1] - cy) + nz * (near[o + 2] - cz); // n·(y − c), m
        // the facet's geometric moments G = ∫ conj R dS once; the four densities are constants times G
        java.util.Arrays.fill(gr, 0);
        java.util.Arrays.fill(gi, 0);
        for (int q = 0; q < rule.size(); q++) {
            double l1 = rule.l1(q);
            double l2 = rule.l2(q);
            double l3 = rule.l3(q);
            SolidHarmonics.regular(l1 * ax + l2 * bx + l3 * qx, l1 * ay + l2 * by + l3 * qy,
                l1 * az + l2 * bz + l3 * qz, p, tr, ti);
            double w = rule.weight(q) * area;
            for (int k = 0; k < size; k++) {
                gr[k] += w * tr[k];
                gi[k] -= w * ti[k];
            }
        }
        for (int k = 0; k < size; k++) {
            double cr = gr[k];
            double ci = gi[k];
            raw[ro + k] += nx * cr;
            raw[ro + size + k] += nx * ci;
            raw[ro + 2 * size + k] += ny * cr;
            raw[ro + 3 * size + k] += ny * ci;
            raw[ro + 4 * size + k] += nz * cr;
            raw[ro + 5 * size + k] += nz * ci;
            raw[ro + 6 * size + k] += h * cr;
            raw[ro + 7 * size + k] += h * ci;
        }
    }

    public double density() {
        return density;
    }

    @Override
    public double tolerance() {
        return tolerance;
    }

    @Override
    public FieldModel exactModel() {
        return exact;
    }

    /** Expansion degree p. */
    public int degree() {
        return p;
    }

    /** Opening ratio θ. */
    public double openingRatio() {
        return theta;
    }

    /** The exact direct-sum field this model approximates (and falls back to). */
    public PolyhedronField exact() {
        return exact;
    }

    public FacetTree tree() {
        return tree;
    }

    /** Points evaluated so far, and how many of them fell back to the exact sum (statistics for reports). */
    public long evaluations() {
        return evaluations.sum();
    }

    public long fallbacks() {
        return fallbacks.sum();
    }

    /** Bytes held by this model per facet (tree, near-field records, moments; the exact fallback not included). */
    public double bytesPerFacet() {
        long b = 8L * facetNormal.length + 4L * facetLocal.length + 8L * leafVertex.length + 4L * leafEdge.length
            + 8L * leafEdgeInv.length + 8L * leafEdgeDyad.length + leafEdgeShared.length + 8L * moments.length + 4L * facetCount + tree.nodeCount() * (5L * 4 + 4 * 8);
        return (double) b / facetCount;
    }

    @Override
    public double gm() {
        return exact.gm();
    }

    @Override
    public String describe() {
        return String.format(Locale.ROOT, "constant-density polyhedron (hierarchical, tolerance %.1e; degree %d, "
            + "opening ratio %.2f), %d facets, %s kg/m^3", tolerance, p, theta, facetCount, density);
    }

    @Override
    public FieldEvaluator newEvaluator() {
        return new Evaluator();
    }

    /**
     * Largest relative errors of |g| and U against the exact sum on the given points: {maxRelG, maxRelU}.
     * Relative to |g| and U at each point.
     */
    public double[] measureError(double[] xyz, int threads) {
        double[] a = BatchEvaluation.evaluate(this, xyz, false, threads, ProgressListener.NONE);
        double[] b = BatchEvaluation.evaluate(exact, xyz, false, threads, ProgressListener.NONE);
        double eg = 0;
        double eu = 0;
        for (int i = 0; i < xyz.length / 3; i++) {
            int o = i * FieldSample.SIZE;
            double dx = a[o + FieldSample.AX] - b[o + FieldSample.AX];
            double dy = a[o + FieldSample.AY] - b[o + FieldSample.AY];
            double dz = a[o + FieldSample.AZ] - b[o + FieldSample.AZ];
            double gn = FieldSample.accelerationNorm(b, o);
            if (gn > 0) {
                eg = Math.max(eg, Math.sqrt(dx * dx + dy * dy + dz * dz) / gn);
            }
            eu = Math.max(eu, Math.abs(a[o + FieldSample.U] - b[o + FieldSample.U]) / b[o + FieldSample.U]);
        }
        return new double[] {eg, eu};
    }

    /**
     * The Werner–Scheeres edge logarithm L = ln((a+b+e)/(a+b−e)) for the edge from r_a to r_b (vectors from the field
     * point), 0 on the edge's line within it or at its ends (where the term's factor vanishes). Near the edge's
     * interior a+b−e is computed without cancellation as 2|r_a × d|²/((ab − r_a·r_b)(a+b+e)), as in
     * {@link PolyhedronField}.
     */
    static double edgeLog(double ax, double ay, double az, double bx, double by, double bz, double na, double nb,
                          double dot, double invLen) {
        double len = 1 / invLen;
        double sum = na + nb;
        if (dot < 0) {
            double ex = bx - ax;
            double ey = by - ay;
            double ez = bz - az;
            double cx = ay * ez - az * ey;
            double cy = az * ex - ax * ez;
            double cz = ax * ey - ay * ex;
            double c2 = cx * cx + cy * cy + cz * cz;
            if (!(c2 > 0)) {
                return 0; // on the edge: m·r = 0 there, the term's limit is 0
            }
            double sp = sum + len;
            return KernelMath.log(sp * sp * (na * nb - dot) / (2 * c2));
        }
        double den = sum - len;
        if (!(den > 0)) {
            return 0; // at a vertex of the edge
        }
        return KernelMath.log((sum + len) / den);
    }

    private final class Evaluator implements FieldEvaluator {
        private final int[] stack = new int[2 * tree.maxDepth() + 8];
        /** Accepted far nodes of the current point and the degree used for each (for the second, surface pass). */
        private final int[] farNodes = new int[tree.nodeCount()];
        private final int[] farDegree = new int[tree.nodeCount()];
        private final double[] jr = new double[Math.max(SolidHarmonics.size(p + 1),
            SolidHarmonics.size(p + 2))];
        private final double[] ji = new double[jr.length];
        /** Gradient tensor sums: row i = component of n (near) or of V (far), column j = derivative. */
        private final double[] tn = new double[9];
        /** Leaf scratch: vertex offsets from the point and their lengths; edge logarithms. */
        private final double[] rv = new double[4 * maxLeafVertices];
        /** Running sums for the current point: V (3), U sum, Σω, tail estimates of V and U. */
        private double vx;
        private double vy;
        private double vz;
        private double uSum;
        private double omega;
        /** Low-degree far part of Σω (for classification); {@link #omega} holds the exact near part. */
        private double omegaFar;
        private double errV;
        private double errU;
        private boolean onSurface;

        @Override
        public void evaluate(double x, double y, double z, boolean gradient, double[] out, int o) {
            evaluations.increment();
            if (body.covers(x, y, z)) {
                body.evaluate(x, y, z, gradient, out, o, jr, ji);
                return;
            }
            vx = 0;
            vy = 0;
            vz = 0;
            uSum = 0;
            omega = 0;
            omegaFar = 0;
            errV = 0;
            errU = 0;
            onSurface = false;
            java.util.Arrays.fill(tn, 0);
            int nFar = 0;
            int sp = 0;
            stack[sp++] = 0;
            while (sp > 0) {
                int node = stack[--sp];
                double a = tree.radius(node);
                double dx = x - tree.centreX(node);
                double dy = y - tree.centreY(node);
                double dz = z - tree.centreZ(node);
                double r2 = dx * dx + dy * dy + dz * dz;
                if (a * a <= theta2 * r2 && momentOffset[node] >= 0) {
                    farNodes[nFar] = node;
                    farDegree[nFar++] = far(node, a, dx, dy, dz, r2, gradient);

                } else if (tree.isLeaf(node)) {

                    nearLeaf(node, x, y, z, gradient);
                } else {
                    stack[sp++] = tree.right(node);
                    stack[sp++] = tree.left(node);
                }
            }
            double gx = -gRho * vx;
            double gy = -gRho * vy;
            double gz = -gRho * vz;
            double u = 0.5 * gRho * uSum;
            double gn = Math.sqrt(gx * gx + gy * gy + gz * gz);
            if (gRho * errV > tolerance * gn || 0.5 * gRho * errU > tolerance * u) {
                fallbacks.increment();
                exactSum(x, y, z, gradient, out, o);
                return;
            }
            double lap;
            Location loc;
            if (onSurface) {
                // the solid-angle sum at full degree: the Laplacian there is −Gρ × the interior solid angle
                for (int k = 0; k < nFar; k++) {
                    int node = farNodes[k];
                    double a = tree.radius(node);
                    double dx = x - tree.centreX(node);
                    double dy = y - tree.centreY(node);
                    double dz = z - tree.centreZ(node);
                    double r2 = dx * dx + dy * dy + dz * dz;
                    double s = a / r2;
                    int deg = farDegree[k];
                    SolidHarmonics.irregularScaled(s * dx, s * dy, s * dz, a * a / r2, deg + 1, jr, ji);
                    omega += divergence(momentOffset[node], deg) / (a * Math.sqrt(r2));
                }
                loc = Location.SURFACE;
                lap = -gRho * omega;
            } else {
                // off the surface the exact sum is 4π inside and 0 outside; the low-degree far part only decides
                loc = omega + omegaFar > 2 * Math.PI ? Location.INSIDE : Location.OUTSIDE;
                lap = loc == Location.INSIDE ? -4 * Math.PI * gRho : 0.0;
            }
            write(out, o, gx, gy, gz, u, lap, gradient, loc);
        }

        /**
         * The exact field as the sum of every facet's single-layer terms (the Werner–Scheeres field in the form of
         * shared references §10), for points where the expansions' tail estimate exceeds the tolerance.
         */
        private void exactSum(double x, double y, double z, boolean gradient, double[] out, int o) {
            vx = 0;
            vy = 0;
            vz = 0;
            uSum = 0;
            omega = 0;
            onSurface = false;
            java.util.Arrays.fill(tn, 0);
            for (int n = 0; n < tree.nodeCount(); n++) {
                if (tree.isLeaf(n)) {
                    nearLeaf(n, x, y, z, gradient);
                }
            }
            write(out, o, -gRho * vx, -gRho * vy, -gRho * vz, 0.5 * gRho * uSum, -gRho * omega, gradient,
                onSurface ? Location.SURFACE : omega > 2 * Math.PI ? Location.INSIDE : Location.OUTSIDE);
        }

        private void write(double[] out, int o, double gx, double gy, double gz, double u, double lap,
                           boolean gradient, Location loc) {
            out[o + FieldSample.U] = u;
            out[o + FieldSample.AX] = gx;
            out[o + FieldSample.AY] = gy;
            out[o + FieldSample.AZ] = gz;
            out[o + FieldSample.LAPLACIAN] = lap;
            if (gradient) {
                out[o + FieldSample.GXX] = gRho * tn[0];
                out[o + FieldSample.GXY] = 0.5 * gRho * (tn[1] + tn[3]);
                out[o + FieldSample.GXZ] = 0.5 * gRho * (tn[2] + tn[6]);
                out[o + FieldSample.GYY] = gRho * tn[4];
                out[o + FieldSample.GYZ] = 0.5 * gRho * (tn[5] + tn[7]);
                out[o + FieldSample.GZZ] = gRho * tn[8];
            } else {
                for (int k = FieldSample.GXX; k <= FieldSample.GZZ; k++) {
                    out[o + k] = Double.NaN;
                }
            }
            out[o + FieldSample.LOCATION] = loc.code();
        }

        /**
         * One accepted node: its expansion at separation d = x − c (|d|² = r2) to the degree its distance needs
         * (the smallest d with q^{d+1} ≤ θ^{p+1}, q = a/r, so every accepted node has the error of the worst one),
         * its tail estimate, its low-degree solid angle and, when asked, its gradient. Returns the degree used.
         */
        private int far(int node, double a, double dx, double dy, double dz, double r2, boolean gradient) {
            final double[] mom = moments;
            double invR = 1 / Math.sqrt(r2);
            double q = a * invR;
            int deg = Math.max(2, Math.min(p, (int) Math.ceil(logThetaP1 / Math.log(q)) - 1));
            double s = a / r2;
            // degree deg + 1 for derivatives (tensor); the classification sum needs CLASSIFY_DEGREE + 1
            int jdeg = gradient ? deg + 1 : Math.max(deg, Math.min(deg, CLASSIFY_DEGREE) + 1);
            SolidHarmonics.irregularScaled(s * dx, s * dy, s * dz, a * a / r2, jdeg, jr, ji);
            int mo = momentOffset[node];
            int last = SolidHarmonics.index(deg, 0);
            int lastPrev = SolidHarmonics.index(deg - 1, 0);
            int end = SolidHarmonics.size(deg);
            double d0 = 0;
            double d1 = 0;
            double d2 = 0;
            double d3 = 0;
            for (int k = 0; k < lastPrev; k++) {
                double re = jr[k];
                double im = ji[k];
                int c = mo + 8 * k;
                d0 += mom[c] * re - mom[c + 1] * im;
                d1 += mom[c + 2] * re - mom[c + 3] * im;
                d2 += mom[c + 4] * re - mom[c + 5] * im;
                d3 += mom[c + 6] * re - mom[c + 7] * im;
            }
            double k0 = 0;
            double k1 = 0;
            double k2 = 0;
            double k3 = 0;
            for (int k = lastPrev; k < last; k++) {
                double re = jr[k];
                double im = ji[k];
                int c = mo + 8 * k;
                k0 += mom[c] * re - mom[c + 1] * im;
                k1 += mom[c + 2] * re - mom[c + 3] * im;
                k2 += mom[c + 4] * re - mom[c + 5] * im;
                k3 += mom[c + 6] * re - mom[c + 7] * im;
            }
            double l0 = 0;
            double l1 = 0;
            double l2 = 0;
            double l3 = 0;
            for (int k = last; k < end; k++) {
                double re = jr[k];
                double im = ji[k];
                int c = mo + 8 * k;
                l0 += mom[c] * re - mom[c + 1] * im;
                l1 += mom[c + 2] * re - mom[c + 3] * im;
                l2 += mom[c + 4] * re - mom[c + 5] * im;
                l3 += mom[c + 6] * re - mom[c + 7] * im;
            }
            double nx = (d0 + k0 + l0) * invR;
            double ny = (d1 + k1 + l1) * invR;
            double nz = (d2 + k2 + l2) * invR;
            double w = (d3 + k3 + l3) * invR;
            vx += nx;
            vy += ny;
            vz += nz;
            uSum += w - (dx * nx + dy * ny + dz * nz);
            omegaFar += divergence(mo, Math.min(deg, CLASSIFY_DEGREE)) * invR / a;
            // tail estimate from the last two degrees: max(|t_d|, q|t_{d−1}|)·q/(1−q)
            double tail = q / (1 - q);
            double lv = Math.max(Math.sqrt(l0 * l0 + l1 * l1 + l2 * l2), q * Math.sqrt(k0 * k0 + k1 * k1 + k2 * k2))
                * invR;
            double lw = Math.max(Math.abs(l3), q * Math.abs(k3)) * invR;
            errV += lv * tail;
            errU += (lw + Math.sqrt(r2) * lv) * tail;
            if (gradient) {
                farGradient(mo, deg, invR / a);
            }
            return deg;
        }

        /**
         * Σ_i ∂_i φ_i of the normal-density expansions to degree {@code deg} (times a·r), from the scaled harmonics
         * J (degree deg + 1): the double layer Σω = ∇·Σ n_f S_f of the node.
         */
        private double divergence(int mo, int deg) {
            double sum = 0;
            for (int n = 0; n <= deg; n++) {
                int b = SolidHarmonics.index(n, 0);
                int t = SolidHarmonics.index(n + 1, 0);
                for (int m = 0; m <= n; m++) {
                    double w = m == 0 ? 1 : 0.5; // stored moments carry ×2 for m ≥ 1
                    int c = mo + 8 * (b + m);
                    double xr = w * moments[c];
                    double xi = w * moments[c + 1];
                    double yr = w * moments[c + 2];
                    double yi = w * moments[c + 3];
                    double zr = w * moments[c + 4];
                    double zi = w * moments[c + 5];
                    double upr = jr[t + m + 1];
                    double upi = ji[t + m + 1];
                    double cz = -(zr * jr[t + m] - zi * ji[t + m]);
                    if (m == 0) {
                        sum += -xr * upr - yr * upi + cz;
                    } else {
                        double dnr = jr[t + m - 1];
                        double dni = ji[t + m - 1];
                        double ar = 0.5 * (dnr - upr);
                        double ai = 0.5 * (dni - upi);
                        double br = -0.5 * (upi + dni);
                        double bi = 0.5 * (upr + dnr);
                        sum += 2 * ((xr * ar - xi * ai) + (yr * br - yi * bi) + cz);
                    }
                }
            }
            return sum;
        }

        /**
         * Exact terms of a leaf's facets at (x, y, z): vertex distances once, then each edge once (both facets' terms
         * together through the dyad E where both are in the leaf), then each facet's solid-angle term.
         */
        private void nearLeaf(int node, double x, double y, double z, boolean gradient) {
            int l = leafOf[node];
            int v0 = leafVertexStart[l];
            int nv = leafVertexStart[l + 1] - v0;
            final double[] rv = this.rv;
            for (int j = 0; j < nv; j++) {
                int q = 3 * (v0 + j);
                double rx = leafVertex[q] - x;
                double ry = leafVertex[q + 1] - y;
                double rz = leafVertex[q + 2] - z;
                rv[4 * j] = rx;
                rv[4 * j + 1] = ry;
                rv[4 * j + 2] = rz;
                rv[4 * j + 3] = Math.sqrt(rx * rx + ry * ry + rz * rz);
            }
            int e0 = leafEdgeStart[l];
            int e1 = leafEdgeStart[l + 1];
            for (int e = e0; e < e1; e++) {
                int a = 4 * leafEdge[2 * e];
                int b = 4 * leafEdge[2 * e + 1];
                double ax = rv[a];
                double ay = rv[a + 1];
                double az = rv[a + 2];
                double dot = ax * rv[b] + ay * rv[b + 1] + az * rv[b + 2];
                double le = edgeLog(ax, ay, az, rv[b], rv[b + 1], rv[b + 2], rv[a + 3], rv[b + 3], dot, leafEdgeInv[e]);
                if (le == 0) {
                    continue; // on the edge or at its ends: the term's limit is 0
                }
                int o = 6 * e;
                double[] d = leafEdgeDyad;
                if (leafEdgeShared[e]) {
                    double exx = d[o];
                    double exy = d[o + 1];
                    double exz = d[o + 2];
                    double eyy = d[o + 3];
                    double eyz = d[o + 4];
                    double ezz = d[o + 5];
                    double erx = exx * ax + exy * ay + exz * az;
                    double ery = exy * ax + eyy * ay + eyz * az;
                    double erz = exz * ax + eyz * ay + ezz * az;
                    vx += erx * le;
                    vy += ery * le;
                    vz += erz * le;
                    uSum += (ax * erx + ay * ery + az * erz) * le;
                    if (gradient) {
                        tn[0] += exx * le;
                        tn[1] += exy * le;
                        tn[2] += exz * le;
                        tn[3] += exy * le;
                        tn[4] += eyy * le;
                        tn[5] += eyz * le;
                        tn[6] += exz * le;
                        tn[7] += eyz * le;
                        tn[8] += ezz * le;
                    }
                } else {
                    double nx = d[o];
                    double ny = d[o + 1];
                    double nz = d[o + 2];
                    double mx = d[o + 3];
                    double my = d[o + 4];
                    double mz = d[o + 5];
                    double mrl = (mx * ax + my * ay + mz * az) * le;
                    vx += nx * mrl;
                    vy += ny * mrl;
                    vz += nz * mrl;
                    uSum += (nx * ax + ny * ay + nz * az) * mrl;
                    if (gradient) {
                        tn[0] += nx * mx * le;
                        tn[1] += nx * my * le;
                        tn[2] += nx * mz * le;
                        tn[3] += ny * mx * le;
                        tn[4] += ny * my * le;
                        tn[5] += ny * mz * le;
                        tn[6] += nz * mx * le;
                        tn[7] += nz * my * le;
                        tn[8] += nz * mz * le;
                    }
                }
            }
            for (int i = tree.start(node); i < tree.end(node); i++) {
                nearFacet(i, gradient);
            }
        }

        /** The solid-angle term −n_f h_f ω_f of facet {@code i} (tree order), from its leaf's vertex offsets. */
        private void nearFacet(int i, boolean gradient) {
            final double[] rv = this.rv;
            int q = 6 * i;
            int k1 = 4 * facetLocal[q];
            int k2 = 4 * facetLocal[q + 1];
            int k3 = 4 * facetLocal[q + 2];
            double r1x = rv[k1];
            double r1y = rv[k1 + 1];
            double r1z = rv[k1 + 2];
            double r2x = rv[k2];
            double r2y = rv[k2 + 1];
            double r2z = rv[k2 + 2];
            double r3x = rv[k3];
            double r3y = rv[k3 + 1];
            double r3z = rv[k3 + 2];
            double n1 = rv[k1 + 3];
            double n2 = rv[k2 + 3];
            double n3 = rv[k3 + 3];
            int fo = 4 * i;
            double fnx = facetNormal[fo];
            double fny = facetNormal[fo + 1];
            double fnz = facetNormal[fo + 2];
            double h = fnx * r1x + fny * r1y + fnz * r1z;
            double num = facetNormal[fo + 3] * h;
            double prod = n1 * n2 * n3;
            double den = prod + n1 * (r2x * r3x + r2y * r3y + r2z * r3z) + n2 * (r3x * r1x + r3y * r1y + r3z * r1z)
                + n3 * (r1x * r2x + r1y * r2y + r1z * r2z);
            if (!(prod > 0) || Math.abs(num) <= PolyhedronField.ON_FACET_TOLERANCE * prod
                && den <= PolyhedronField.ON_FACET_TOLERANCE * prod) {
                onSurface = true; // same rule as the direct sum: this facet's ω is dropped
                return;
            }
            double om = 2 * KernelMath.atan2(num, den);
            double ho = h * om;
            vx -= fnx * ho;
            vy -= fny * ho;
            vz -= fnz * ho;
            uSum -= h * ho;
            omega += om;
            if (gradient) {
                tn[0] -= fnx * fnx * om;
                tn[1] -= fnx * fny * om;
                tn[2] -= fnx * fnz * om;
                tn[3] -= fny * fnx * om;
                tn[4] -= fny * fny * om;
                tn[5] -= fny * fnz * om;
                tn[6] -= fnz * fnx * om;
                tn[7] -= fnz * fny * om;
                tn[8] -= fnz * fnz * om;
            }
        }

        /**
         * Adds −∂_j V_i of one far node to {@code tn} (row i, column j), from its stored weighted moments and the
         * scaled harmonics J (degree p + 1): the derivative relations of {@link SolidHarmonics#derivative} applied
         * term by term; {@code f = 1/(a r)}.
         */
        private void farGradient(int mo, int deg, double f) {
            for (int i = 0; i < 3; i++) {
                int re = mo + 2 * i;
                int im = re + 1;
                double sx = 0;
                double sy = 0;
                double sz = 0;
                for (int n = 0; n <= deg; n++) {
                    int b = SolidHarmonics.index(n, 0);
                    int t = SolidHarmonics.index(n + 1, 0);
                    for (int m = 0; m <= n; m++) {
                        // raw moment M_n^m (weights removed)
                        double w = m == 0 ? 1 : 0.5;
                        double mr = w * moments[re + 8 * (b + m)];
                        double mi = w * moments[im + 8 * (b + m)];
                        // z: ∂_z I_n^m = −I_{n+1}^m
                        double jzr = jr[t + m];
                        double jzi = ji[t + m];
                        double cz = -(mr * jzr - mi * jzi);
                        sz += m == 0 ? cz : 2 * cz;
                        // x, y: ∂_± I_n^m = ∓I_{n+1}^{m±1} (m ≥ 1); m = 0: ∂_x I = −Re I_{n+1}^1, ∂_y I = −Im I_{n+1}^1
                        double upr = jr[t + m + 1];
                        double upi = ji[t + m + 1];
                        if (m == 0) {
                            sx += -mr * upr;
                            sy += -mr * upi;
                        } else {
                            double dnr = jr[t + m - 1];
                            double dni = ji[t + m - 1];
                            // ∂_x I = (I^{m−1} − I^{m+1})/2, ∂_y I = i(I^{m+1} + I^{m−1})/2; term 2 Re(M ∂I)
                            double xr = 0.5 * (dnr - upr);
                            double xi = 0.5 * (dni - upi);
                            sx += 2 * (mr * xr - mi * xi);
                            double yr = -0.5 * (upi + dni);
                            double yi = 0.5 * (upr + dnr);
                            sy += 2 * (mr * yr - mi * yi);
                        }
                    }
                }
                // −∂_j V_i, so that the tensor is Gρ tn
                tn[3 * i] -= sx * f;
                tn[3 * i + 1] -= sy * f;
                tn[3 * i + 2] -= sz * f;
            }
        }
    }
}
