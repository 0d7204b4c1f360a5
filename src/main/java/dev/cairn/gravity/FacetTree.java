package dev.cairn.gravity;

import dev.cairn.mesh.TriangleMesh;

/**
 * A binary k-d tree over the facets of a mesh (Bentley, J.L. (1975) Multidimensional binary search trees used for
 * associative searching, Commun. ACM 18:509–517): each node holds a contiguous range of facets in {@link #order()},
 * split at the median facet centroid along the longest side of the centroids' bounding box, down to leaves of at
 * most {@code leafSize} facets. Built in O(F log F) with an explicit stack; nodes are numbered in depth-first
 * pre-order, so a node's left child is the next node and every child has a larger number than its parent.
 *
 * <p>Each node has a centre (the centre of its facets' vertex bounding box) and a radius: the largest distance
 * from the centre to a vertex of its facets, so every point of its facets lies within that sphere. Units follow the
 * mesh (metres).
 */
public final class FacetTree {
    private final int[] order;
    private final int[] start;
    private final int[] end;
    private final int[] right;
    private final double[] centre;
    private final double[] radius;
    private final int nodeCount;
    private final int maxDepth;

    /**
     * @param mesh     the mesh (read)
     * @param leafSize most facets in a leaf (≥ 1)
     */
    public FacetTree(TriangleMesh mesh, int leafSize) {
        int nf = mesh.facetCount();
        if (nf < 1 || leafSize < 1) {
            throw new IllegalArgumentException("a facet tree needs facets and a positive leaf size");
        }
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        double[] cen = new double[3 * nf];
        for (int f = 0; f < nf; f++) {
            for (int k = 0; k < 3; k++) {
                cen[3 * f + k] = (xyz[3 * tri[3 * f] + k] + xyz[3 * tri[3 * f + 1] + k] + xyz[3 * tri[3 * f + 2] + k]) / 3;
            }
        }
        order = new int[nf];
        for (int f = 0; f < nf; f++) {
            order[f] = f;
        }
        int cap = 2 * ((nf + leafSize - 1) / leafSize) * 2 + 2;
        int[] st = new int[cap];
        int[] en = new int[cap];
        int[] rt = new int[cap];
        int[] depth = new int[cap];
        int count = 0;
        // explicit stack of (start, end, depth, parent-right-slot)
        int[] stack = new int[4 * 128];
        int sp = 0;
        stack[sp++] = 0;
        stack[sp++] = nf;
        stack[sp++] = 0;
        stack[sp++] = -1;
        int deepest = 0;
        while (sp > 0) {
            int slot = stack[--sp];
            int d = stack[--sp];
            int e = stack[--sp];
            int s = stack[--sp];
            if (count == st.length) {
                st = java.util.Arrays.copyOf(st, 2 * count);
                en = java.util.Arrays.copyOf(en, 2 * count);
                rt = java.util.Arrays.copyOf(rt, 2 * count);
                depth = java.util.Arrays.copyOf(depth, 2 * count);
            }
            int node = count++;
            if (slot >= 0) {
                rt[slot] = node;
            }
            st[node] = s;
            en[node] = e;
            rt[node] = -1;
            depth[node] = d;
            deepest = Math.max(deepest, d);
            if (e - s <= leafSize) {
                continue;
            }
            double[] lo = {Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE};
            double[] hi = {-Double.MAX_VALUE, -Double.MAX_VALUE, -Double.MAX_VALUE};
            for (int i = s; i < e; i++) {
                int f = order[i];
                for (int k = 0; k < 3; k++) {
                    lo[k] = Math.min(lo[k], cen[3 * f + k]);
                    hi[k] = Math.max(hi[k], cen[3 * f + k]);
                }
            }
            int axis = 0;
            for (int k = 1; k < 3; k++) {
                if (hi[k] - lo[k] > hi[axis] - lo[axis]) {
                    axis = k;
                }
            }
            int mid = (s + e) >>> 1;
            select(order, cen, axis, s, e - 1, mid);
            if (sp + 8 > stack.length) {
                stack = java.util.Arrays.copyOf(stack, 2 * stack.length);
            }
            // push right first so the left child is numbered next (pre-order); the right child fills rt[node]
            stack[sp++] = mid;
            stack[sp++] = e;
            stack[sp++] = d + 1;
            stack[sp++] = node;
            stack[sp++] = s;
            stack[sp++] = mid;
            stack[sp++] = d + 1;
            stack[sp++] = -1;
        }
        nodeCount = count;
        maxDepth = deepest;
        start = java.util.Arrays.copyOf(st, count);
        end = java.util.Arrays.copyOf(en, count);
        right = java.util.Arrays.copyOf(rt, count);
        centre = new double[3 * count];
        radius = new double[count];
        for (int node = 0; node < count; node++) {
            double[] lo = {Double.MAX_VALUE, Double.MAX_VALUE, Double.MAX_VALUE};
            double[] hi = {-Double.MAX_VALUE, -Double.MAX_VALUE, -Double.MAX_VALUE};
            for (int i = start[node]; i < end[node]; i++) {
                int f = order[i];
                for (int v = 0; v < 3; v++) {
                    int q = 3 * tri[3 * f + v];
                    for (int k = 0; k < 3; k++) {
                        lo[k] = Math.min(lo[k], xyz[q + k]);
                        hi[k] = Math.max(hi[k], xyz[q + k]);
                    }
                }
            }
            double c0 = 0.5 * (lo[0] + hi[0]);
            double c1 = 0.5 * (lo[1] + hi[1]);
            double c2 = 0.5 * (lo[2] + hi[2]);
            double r2 = 0;
            for (int i = start[node]; i < end[node]; i++) {
                int f = order[i];
                for (int v = 0; v < 3; v++) {
                    int q = 3 * tri[3 * f + v];
                    double dx = xyz[q] - c0;
                    double dy = xyz[q + 1] - c1;
                    double dz = xyz[q + 2] - c2;
                    r2 = Math.max(r2, dx * dx + dy * dy + dz * dz);
                }
            }
            centre[3 * node] = c0;
            centre[3 * node + 1] = c1;
            centre[3 * node + 2] = c2;
            // a hair larger than the largest vertex distance, so rounding never puts a vertex outside
            radius[node] = Math.sqrt(r2) * (1 + 1e-12) + Double.MIN_NORMAL;
        }
    }

    /** Quickselect: reorders idx[lo..hi] so that position k holds the k-th smallest key (ties by index). */
    private static void select(int[] idx, double[] cen, int axis, int lo, int hi, int k) {
        while (hi > lo) {
            int m = (lo + hi) >>> 1;
            double pivot = cen[3 * idx[m] + axis];
            int pi = idx[m];
            int i = lo;
            int j = hi;
            while (i <= j) {
                while (less(idx[i], pi, cen, axis, pivot)) {
                    i++;
                }
                while (less(pi, idx[j], cen, axis, pivot)) {
                    j--;
                }
                if (i <= j) {
                    int t = idx[i];
                    idx[i] = idx[j];
                    idx[j] = t;
                    i++;
                    j--;
                }
            }
            if (k <= j) {
                hi = j;
            } else if (k >= i) {
                lo = i;
            } else {
                return;
            }
        }
    }

    /** Strict order by (key, facet index), so the tree is the same on every run. */
    private static boolean less(int a, int b, double[] cen, int axis, double unused) {
        double ka = cen[3 * a + axis];
        double kb = cen[3 * b + axis];
        return ka < kb || ka == kb && a < b; // exact comparison intended: a total order for reproducibility
    }

    /** Facet indices in tree order: node n holds {@code order()[start(n) .. end(n))}. Not a copy: do not modify. */
    int[] order() {
        return order;
    }

    public int nodeCount() {
        return nodeCount;
    }

    public int maxDepth() {
        return maxDepth;
    }

    public int start(int node) {
        return start[node];
    }

    public int end(int node) {
        return end[node];
    }

    public boolean isLeaf(int node) {
        return right[node] < 0;
    }

    /** Left child (the next node in pre-order); only for internal nodes. */
    public int left(int node) {
        return node + 1;
    }

    public int right(int node) {
        return right[node];
    }

    public double centreX(int node) {
        return centre[3 * node];
    }

    public double centreY(int node) {
        return centre[3 * node + 1];
    }

    public double centreZ(int node) {
        return centre[3 * node + 2];
    }

    public double radius(int node) {
        return radius[node];
    }
}
