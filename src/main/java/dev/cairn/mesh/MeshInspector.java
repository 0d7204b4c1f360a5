package dev.cairn.mesh;

import dev.cairn.io.InputException;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Collectors;

/**
 * Checks a triangle mesh for what the polyhedron field needs: a closed, consistently and outward oriented,
 * non-degenerate surface. Everything is found by hashing in O(F) expected time, so it works on million-facet
 * models.
 */
public final class MeshInspector {
    /** Facets with area below this fraction of the bounding-box diagonal squared count as degenerate. */
    public static final double DEGENERATE_AREA = 1e-12;
    /** Facets with quality {@code 4√3·A/(l1²+l2²+l3²)} below this are slivers (1 for an equilateral triangle). */
    public static final double SLIVER_QUALITY = 1e-3;
    /** Vertices closer than this fraction of the diagonal count as duplicates. */
    public static final double DUPLICATE_DISTANCE = 1e-9;
    private static final int EXAMPLES = 5;
    /**
     * Largest vertex coordinate accepted, metres (1e12 m, about 7 au): far beyond any small body, and small enough
     * that squares and fifth powers of body sizes stay finite in double precision (common practice, no source).
     */
    public static final double MAX_COORDINATE_M = 1e12;
    /** Smallest body size (largest bounding-box side) accepted, metres: 1 mm (common practice, no source). */
    public static final double MIN_SIZE_M = 1e-3;
    /** A closed surface enclosing less than this fraction of its bounding-box size cubed encloses no volume. */
    public static final double ZERO_VOLUME = 1e-12;

    private MeshInspector() {
    }

    /** Inspects {@code mesh}. */
    public static MeshReport inspect(TriangleMesh mesh) {
        return inspect(mesh, EdgeTable.of(mesh));
    }

    /** Inspects {@code mesh} whose edge table is already built. */
    public static MeshReport inspect(TriangleMesh mesh, EdgeTable edges) {
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        int nv = mesh.vertexCount();
        int nf = mesh.facetCount();
        double[] bbox = mesh.boundingBox();
        double diag = Math.sqrt(sq(bbox[3] - bbox[0]) + sq(bbox[4] - bbox[1]) + sq(bbox[5] - bbox[2]));

        int boundary = 0;
        int nonManifold = 0;
        int inconsistent = 0;
        List<int[]> exB = new ArrayList<>();
        List<int[]> exN = new ArrayList<>();
        List<int[]> exI = new ArrayList<>();
        for (int e = 0; e < edges.edgeCount(); e++) {
            int c = edges.facetCount(e);
            int[] pair = {edges.v0(e), edges.v1(e)};
            if (c == 1) {
                boundary++;
                addExample(exB, pair);
            } else if (c > 2) {
                nonManifold++;
                addExample(exN, pair);
            } else if (edges.facetForward(e) < 0 || edges.facetBackward(e) < 0) {
                inconsistent++;
                addExample(exI, pair);
            }
        }

        int degenerate = 0;
        int sliver = 0;
        List<Integer> exD = new ArrayList<>();
        List<Integer> exS = new ArrayList<>();
        double areaFloor = DEGENERATE_AREA * diag * diag;
        double volume6 = 0;
        double ox = 0.5 * (bbox[0] + bbox[3]);
        double oy = 0.5 * (bbox[1] + bbox[4]);
        double oz = 0.5 * (bbox[2] + bbox[5]);
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
            double cx = xyz[c] - ox;
            double cy = xyz[c + 1] - oy;
            double cz = xyz[c + 2] - oz;
            volume6 += ax * (by * cz - bz * cy) + ay * (bz * cx - bx * cz) + az * (bx * cy - by * cx);
            double ux = bx - ax;
            double uy = by - ay;
            double uz = bz - az;
            double vx = cx - ax;
            double vy = cy - ay;
            double vz = cz - az;
            double nx = uy * vz - uz * vy;
            double ny = uz * vx - ux * vz;
            double nz = ux * vy - uy * vx;
            double area = 0.5 * Math.sqrt(nx * nx + ny * ny + nz * nz);
            if (area <= areaFloor) {
                degenerate++;
                addExample(exD, f);
            } else {
                double l2 = ux * ux + uy * uy + uz * uz + vx * vx + vy * vy + vz * vz
                    + sq(cx - bx) + sq(cy - by) + sq(cz - bz);
                double quality = 4 * Math.sqrt(3) * area / l2;
                if (quality < SLIVER_QUALITY) {
                    sliver++;
                    addExample(exS, f);
                }
            }
        }

        boolean[] used = new boolean[nv];
        for (int v : tri) {
            used[v] = true;
        }
        int unused = 0;
        for (boolean u : used) {
            if (!u) {
                unused++;
            }
        }

        int duplicates = countDuplicates(xyz, nv, Math.max(diag * DUPLICATE_DISTANCE, Double.MIN_NORMAL));

        int components = countComponents(nf, edges);
        int chi = (nv - unused) - edges.edgeCount() + nf;
        boolean closedOrientable = boundary == 0 && nonManifold == 0 && inconsistent == 0;
        int genus = closedOrientable && (2 * components - chi) % 2 == 0 ? (2 * components - chi) / 2 : -1;

        return new MeshReport(nv, nf, edges.edgeCount(), boundary, nonManifold, inconsistent, exB, exN, exI,
            degenerate, exD, sliver, exS, duplicates, unused, components, chi, genus, volume6 / 6.0, bbox);
    }

    /**
     * Returns a mesh fit for the polyhedron field: the input itself, or the input with every facet flipped when it
     * is closed but inward-oriented (a warning is added to {@code warnings}).
     *
     * @throws InputException naming {@code name}, the problem, how many edges or facets are affected and a few of
     *                        them, when the surface is open, non-manifold, inconsistently oriented or has
     *                        zero-area facets
     */
    public static TriangleMesh requireFitForGravity(TriangleMesh mesh, MeshReport r, String name,
                                                    List<String> warnings) {
        if (r.boundaryEdges() > 0) {
            throw new InputException(name + ": surface is open: " + r.boundaryEdges()
                + " edge(s) belong to one facet only (vertex pairs, 1-based: " + pairs(r.exampleBoundaryEdges())
                + "); the polyhedron field needs a closed surface");
        }
        if (r.nonManifoldEdges() > 0) {
            throw new InputException(name + ": surface is non-manifold: " + r.nonManifoldEdges()
                + " edge(s) are shared by three or more facets (vertex pairs, 1-based: "
                + pairs(r.exampleNonManifoldEdges()) + "); the polyhedron field needs a closed 2-manifold");
        }
        if (r.inconsistentEdges() > 0) {
            throw new InputException(name + ": facet orientation is inconsistent: at " + r.inconsistentEdges()
                + " edge(s) both neighbouring facets run the same way (vertex pairs, 1-based: "
                + pairs(r.exampleInconsistentEdges()) + "); re-orient the facets consistently");
        }
        if (r.degenerateFacets() > 0) {
            throw new InputException(name + ": " + r.degenerateFacets() + " facet(s) have zero area (facets, 1-based: "
                + r.exampleDegenerateFacets().stream().map(i -> String.valueOf(i + 1)).collect(Collectors.joining(", "))
                + "); remove or repair them");
        }
        if (r.signedVolume() < 0) {
            warnings.add(name + ": facets face inward (signed volume " + r.signedVolume()
                + " m^3); all facets flipped to face outward");
            return mesh.flipped();
        }
        return mesh;
    }

    /**
     * Refuses a mesh whose numbers cannot carry a gravity model: coordinates beyond {@link #MAX_COORDINATE_M}, a body
     * smaller than {@link #MIN_SIZE_M}, or a surface that encloses no volume (a single facet, a doubled or folded-flat
     * surface). Called on every loaded model, before any mass property is computed.
     *
     * @throws InputException naming {@code name} and the problem
     */
    public static void requireMeasurable(TriangleMesh mesh, MeshReport r, String name) {
        double[] bb = r.boundingBox();
        double extent = 0;
        for (int k = 0; k < 3; k++) {
            double m = Math.max(Math.abs(bb[k]), Math.abs(bb[k + 3]));
            if (!(m <= MAX_COORDINATE_M)) {
                throw new InputException(name + ": coordinates reach " + String.format(java.util.Locale.ROOT,
                    "%.3g", m) + " m, beyond the " + MAX_COORDINATE_M + " m this program accepts (check the units)");
            }
            extent = Math.max(extent, bb[k + 3] - bb[k]);
        }
        if (!(extent >= MIN_SIZE_M)) {
            throw new InputException(name + ": the body is " + String.format(java.util.Locale.ROOT, "%.3g", extent)
                + " m across, below the smallest size accepted (" + MIN_SIZE_M + " m; check the units)");
        }
        double v = r.signedVolume();
        if (!(Math.abs(v) > ZERO_VOLUME * extent * extent * extent)) {
            String why = r.facets() < 4 ? "it has only " + r.facets() + " facet(s)"
                : !r.closed() ? "the surface is open (" + r.boundaryEdges() + " boundary edge(s))"
                : "its facets cancel (a doubled or folded-flat surface)";
            throw new InputException(name + ": the surface encloses no volume (" + String.format(java.util.Locale.ROOT,
                "%.3g", v) + " m^3): " + why);
        }
    }

    /**
     * Refuses a closed surface that cuts through itself ({@link SelfIntersection}): a folded or tangled surface has
     * no inside, so neither mass properties nor the polyhedron field mean anything on it.
     *
     * @throws InputException naming {@code name} and two crossing facets (1-based)
     */
    public static void requireNoSelfIntersection(TriangleMesh mesh, MeshReport r, String name) {
        if (!r.closed()) {
            return; // an open surface is refused for gravity with its own message
        }
        int[] pair = SelfIntersection.find(mesh);
        if (pair != null) {
            throw new InputException(name + ": the surface intersects itself: facets " + (pair[0] + 1) + " and "
                + (pair[1] + 1) + " (1-based) cross or overlap; the body must be a simple closed surface");
        }
    }

    private static String pairs(List<int[]> list) {
        return list.stream().map(p -> (p[0] + 1) + "-" + (p[1] + 1)).collect(Collectors.joining(", "));
    }

    private static <T> void addExample(List<T> list, T item) {
        if (list.size() < EXAMPLES) {
            list.add(item);
        }
    }

    private static double sq(double x) {
        return x * x;
    }

    private static int countDuplicates(double[] xyz, int nv, double cell) {
        LongIntHashMap seen = new LongIntHashMap(nv);
        int dup = 0;
        for (int i = 0; i < nv; i++) {
            long qx = Math.round(xyz[3 * i] / cell);
            long qy = Math.round(xyz[3 * i + 1] / cell);
            long qz = Math.round(xyz[3 * i + 2] / cell);
            long key = qx * 0x9E3779B97F4A7C15L ^ Long.rotateLeft(qy * 0xC2B2AE3D27D4EB4FL, 21)
                ^ Long.rotateLeft(qz * 0x165667B19E3779F9L, 42);
            int prev = seen.get(key);
            if (prev >= 0 && Math.round(xyz[3 * prev] / cell) == qx && Math.round(xyz[3 * prev + 1] / cell) == qy
                && Math.round(xyz[3 * prev + 2] / cell) == qz) {
                dup++;
            } else if (prev < 0) {
                seen.put(key, i);
            }
        }
        return dup;
    }

    /**
     * Orients a closed, consistently oriented mesh outward. First, when the total signed volume is negative (the usual
     * case: a single shell written inside out) every facet is flipped. Then any component that still faces inward is
     * flipped when it lies outside every outward component (winding number of the outward components at one of its
     * vertices below 1/2, from the facet solid angles of Van Oosterom &amp; Strackee 1983); an inward component inside
     * an outward one is a cavity and stays as it is. Each flip adds a warning to {@code warnings}.
     *
     * @return {@code mesh} itself when nothing was flipped, else a new mesh
     */
    public static TriangleMesh orientOutward(TriangleMesh mesh, EdgeTable edges, MeshReport r, String name,
                                             List<String> warnings) {
        if (!r.closed() || r.inconsistentEdges() > 0) {
            return mesh;
        }
        TriangleMesh work = mesh;
        if (r.signedVolume() < 0) {
            warnings.add(name + ": facets face inward (signed volume " + r.signedVolume()
                + " m^3); all facets flipped to face outward");
            work = mesh.flipped();
        }
        if (r.components() == 1) {
            return work;
        }
        int nf = work.facetCount();
        int[] root = componentRoots(nf, edges); // flipping every facet keeps the components
        double[] xyz = work.xyz();
        int[] tri = work.tri();
        double[] bb = r.boundingBox();
        double ox = 0.5 * (bb[0] + bb[3]);
        double oy = 0.5 * (bb[1] + bb[4]);
        double oz = 0.5 * (bb[2] + bb[5]);
        double[] vol6 = new double[nf]; // indexed by component root
        for (int f = 0; f < nf; f++) {
            vol6[root[f]] += FacetGeometry.signedVolume6(xyz, tri, f, ox, oy, oz);
        }
        boolean[] flip = new boolean[nf];
        int nFlip = 0;
        int firstFacet = -1;
        for (int f = 0; f < nf; f++) {
            if (root[f] != f || !(vol6[f] < 0)) {
                continue; // not a component root, or an outward component
            }
            int p = 3 * tri[3 * f];
            double omega = 0;
            for (int g = 0; g < nf; g++) {
                if (vol6[root[g]] > 0) {
                    omega += FacetGeometry.solidAngle(xyz, tri, g, xyz[p], xyz[p + 1], xyz[p + 2]);
                }
            }
            if (omega < 2 * Math.PI) {
                flip[f] = true;
                nFlip++;
                if (firstFacet < 0) {
                    firstFacet = f;
                }
            }
        }
        if (nFlip == 0) {
            return work;
        }
        int[] t = tri.clone();
        for (int f = 0; f < nf; f++) {
            if (flip[root[f]]) {
                int tmp = t[3 * f + 1];
                t[3 * f + 1] = t[3 * f + 2];
                t[3 * f + 2] = tmp;
            }
        }
        warnings.add(name + ": " + nFlip + " of " + r.components() + " closed component(s) face inward and lie outside"
            + " the others (first facet, 1-based: " + (firstFacet + 1) + "); their facets flipped to face outward");
        return new TriangleMesh(xyz, t);
    }

    /** Union-find root (a facet index) of each facet's connected component across manifold edges. */
    private static int[] componentRoots(int nf, EdgeTable edges) {
        int[] parent = new int[nf];
        for (int i = 0; i < nf; i++) {
            parent[i] = i;
        }
        for (int e = 0; e < edges.edgeCount(); e++) {
            int a = edges.facetForward(e);
            int b = edges.facetBackward(e);
            if (a >= 0 && b >= 0) {
                union(parent, a, b);
            }
        }
        int[] root = new int[nf];
        for (int i = 0; i < nf; i++) {
            root[i] = find(parent, i);
        }
        return root;
    }

    private static int countComponents(int nf, EdgeTable edges) {
        int[] parent = new int[nf];
        for (int i = 0; i < nf; i++) {
            parent[i] = i;
        }
        for (int e = 0; e < edges.edgeCount(); e++) {
            int a = edges.facetForward(e);
            int b = edges.facetBackward(e);
            if (a >= 0 && b >= 0) {
                union(parent, a, b);
            }
        }
        int comps = 0;
        for (int i = 0; i < nf; i++) {
            if (find(parent, i) == i) {
                comps++;
            }
        }
        return comps;
    }

    private static int find(int[] p, int i) {
        while (p[i] != i) {
            p[i] = p[p[i]];
            i = p[i];
        }
        return i;
    }

    private static void union(int[] p, int a, int b) {
        int ra = find(p, a);
        int rb = find(p, b);
        if (ra != rb) {
            p[Math.max(ra, rb)] = Math.min(ra, rb);
        }
    }
}
