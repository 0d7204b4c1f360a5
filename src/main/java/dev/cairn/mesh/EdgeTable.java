package dev.cairn.mesh;

import java.util.Arrays;

/**
 * The undirected edges of a triangle mesh and the facets on each side, found by hashing (no all-pairs search).
 *
 * <p>For edge {@code e}: vertices {@link #v0(int)} and {@link #v1(int)} (with {@code v0 < v1}), the number of facets
 * that use it, and for a manifold edge the facet that traverses it {@code v0→v1} ({@link #facetForward(int)}) and
 * the facet that traverses it {@code v1→v0} ({@link #facetBackward(int)}). On a closed, consistently oriented
 * surface every edge has exactly one of each.
 */
public final class EdgeTable {
    private final int[] v0;
    private final int[] v1;
    private final int[] count;
    private final int[] forward;
    private final int[] backward;
    /** For each half-edge {@code 3f+k} (from corner k to corner k+1 of facet f), its undirected edge index. */
    private final int[] halfEdgeToEdge;

    private EdgeTable(int[] v0, int[] v1, int[] count, int[] forward, int[] backward, int[] halfEdgeToEdge) {
        this.v0 = v0;
        this.v1 = v1;
        this.count = count;
        this.forward = forward;
        this.backward = backward;
        this.halfEdgeToEdge = halfEdgeToEdge;
    }

    /** Builds the table in O(F) expected time. */
    public static EdgeTable of(TriangleMesh mesh) {
        int[] tri = mesh.tri();
        int nh = tri.length;
        int nv = mesh.vertexCount();
        LongIntHashMap map = new LongIntHashMap(nh);
        int[] ev0 = new int[nh];
        int[] ev1 = new int[nh];
        int[] cnt = new int[nh];
        int[] fwd = new int[nh];
        int[] bwd = new int[nh];
        Arrays.fill(fwd, -1);
        Arrays.fill(bwd, -1);
        int[] h2e = new int[nh];
        int ne = 0;
        for (int h = 0; h < nh; h++) {
            int f = h / 3;
            int a = tri[h];
            int b = tri[3 * f + (h % 3 + 1) % 3];
            int lo = Math.min(a, b);
            int hi = Math.max(a, b);
            long key = (long) lo * nv + hi;
            int e = map.get(key);
            if (e < 0) {
                e = ne++;
                map.put(key, e);
                ev0[e] = lo;
                ev1[e] = hi;
            }
            cnt[e]++;
            if (a == lo) {
                if (fwd[e] < 0) {
                    fwd[e] = f;
                }
            } else if (bwd[e] < 0) {
                bwd[e] = f;
            }
            h2e[h] = e;
        }
        return new EdgeTable(Arrays.copyOf(ev0, ne), Arrays.copyOf(ev1, ne), Arrays.copyOf(cnt, ne),
            Arrays.copyOf(fwd, ne), Arrays.copyOf(bwd, ne), h2e);
    }

    public int edgeCount() {
        return v0.length;
    }

    /** Smaller vertex index of edge {@code e}. */
    public int v0(int e) {
        return v0[e];
    }

    /** Larger vertex index of edge {@code e}. */
    public int v1(int e) {
        return v1[e];
    }

    /** How many facets use edge {@code e} (2 on a closed manifold surface). */
    public int facetCount(int e) {
        return count[e];
    }

    /** A facet that traverses edge {@code e} from {@code v0} to {@code v1}, or -1. */
    public int facetForward(int e) {
        return forward[e];
    }

    /** A facet that traverses edge {@code e} from {@code v1} to {@code v0}, or -1. */
    public int facetBackward(int e) {
        return backward[e];
    }

    /** Undirected edge of half-edge {@code 3f+k}: the edge from corner k to corner (k+1)%3 of facet f. */
    public int edgeOfHalfEdge(int halfEdge) {
        return halfEdgeToEdge[halfEdge];
    }

    /** The facet across edge {@code e} from facet {@code f}, or -1 if there is none (boundary or non-manifold). */
    public int otherFacet(int e, int f) {
        if (count[e] != 2) {
            return -1;
        }
        if (forward[e] == f) {
            return backward[e];
        }
        if (backward[e] == f) {
            return forward[e];
        }
        return -1;
    }
}
