package dev.cairn.mesh;

import java.util.Arrays;

/**
 * A triangulated surface held as structure-of-arrays: vertex coordinates in metres and facet vertex indices.
 *
 * <p>Vertex {@code i} is {@code (xyz[3i], xyz[3i+1], xyz[3i+2])} in the model frame, metres. Facet {@code f} joins
 * vertices {@code tri[3f], tri[3f+1], tri[3f+2]} (0-based), counter-clockwise seen from outside for an
 * outward-oriented closed surface, so that the right-hand normal {@code (P2-P1)×(P3-P1)} points outward.
 *
 * <p>Instances are immutable by contract: the accessors {@link #xyz()} and {@link #tri()} return the internal
 * arrays for speed, and callers must not modify them. Use {@link #flipped()} or {@link #transformed} to derive
 * new meshes.
 */
public final class TriangleMesh {
    private final double[] xyz;
    private final int[] tri;

    /**
     * @param xyz vertex coordinates, metres, length a multiple of 3 (taken, not copied)
     * @param tri facet vertex indices, length a multiple of 3, each in {@code [0, xyz.length/3)} (taken, not copied)
     */
    public TriangleMesh(double[] xyz, int[] tri) {
        if (xyz.length % 3 != 0 || tri.length % 3 != 0) {
            throw new IllegalArgumentException("array lengths must be multiples of 3");
        }
        int n = xyz.length / 3;
        for (int v : tri) {
            if (v < 0 || v >= n) {
                throw new IllegalArgumentException("facet vertex index " + v + " out of range [0," + n + ")");
            }
        }
        this.xyz = xyz;
        this.tri = tri;
    }

    public int vertexCount() {
        return xyz.length / 3;
    }

    public int facetCount() {
        return tri.length / 3;
    }

    /** Internal vertex array (metres), shared: do not modify. */
    public double[] xyz() {
        return xyz;
    }

    /** Internal facet index array, shared: do not modify. */
    public int[] tri() {
        return tri;
    }

    /** The same mesh with every facet's orientation reversed (outward becomes inward and vice versa). */
    public TriangleMesh flipped() {
        int[] t = tri.clone();
        for (int f = 0; f < t.length; f += 3) {
            int tmp = t[f + 1];
            t[f + 1] = t[f + 2];
            t[f + 2] = tmp;
        }
        return new TriangleMesh(xyz, t);
    }

    /**
     * The mesh under {@code x' = s·R·x + d}.
     *
     * @param rotation row-major 3×3 matrix (should be orthonormal for a rigid motion)
     * @param scale    uniform scale factor
     * @param shift    translation, metres
     */
    public TriangleMesh transformed(double[] rotation, double scale, double[] shift) {
        double[] out = new double[xyz.length];
        for (int i = 0; i < xyz.length; i += 3) {
            double x = xyz[i];
            double y = xyz[i + 1];
            double z = xyz[i + 2];
            for (int r = 0; r < 3; r++) {
                out[i + r] = scale * (rotation[3 * r] * x + rotation[3 * r + 1] * y + rotation[3 * r + 2] * z) + shift[r];
            }
        }
        return new TriangleMesh(out, tri);
    }

    /** The mesh with every coordinate multiplied by {@code factor} (e.g. 1000 for km to m). */
    public TriangleMesh scaled(double factor) {
        double[] out = xyz.clone();
        for (int i = 0; i < out.length; i++) {
            out[i] *= factor;
        }
        return new TriangleMesh(out, tri);
    }

    /** Facet centroids, metres, as a new array of length {@code 3·facetCount()}. */
    public double[] facetCentroids() {
        int nf = facetCount();
        double[] c = new double[3 * nf];
        for (int f = 0; f < nf; f++) {
            int a = 3 * tri[3 * f];
            int b = 3 * tri[3 * f + 1];
            int d = 3 * tri[3 * f + 2];
            for (int k = 0; k < 3; k++) {
                c[3 * f + k] = (xyz[a + k] + xyz[b + k] + xyz[d + k]) / 3.0;
            }
        }
        return c;
    }

    /**
     * Unit facet normals {@code (P2-P1)×(P3-P1)/|...|} (outward for an outward-oriented mesh), new array of length
     * {@code 3·facetCount()}. A zero-area facet gets a zero normal.
     */
    public double[] facetNormals() {
        int nf = facetCount();
        double[] n = new double[3 * nf];
        for (int f = 0; f < nf; f++) {
            double[] c = cross(f);
            double len = Math.sqrt(c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
            if (len > 0) {
                n[3 * f] = c[0] / len;
                n[3 * f + 1] = c[1] / len;
                n[3 * f + 2] = c[2] / len;
            }
        }
        return n;
    }

    /** Facet areas, square metres, new array of length {@code facetCount()}. */
    public double[] facetAreas() {
        int nf = facetCount();
        double[] a = new double[nf];
        for (int f = 0; f < nf; f++) {
            double[] c = cross(f);
            a[f] = 0.5 * Math.sqrt(c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
        }
        return a;
    }

    private double[] cross(int f) {
        int a = 3 * tri[3 * f];
        int b = 3 * tri[3 * f + 1];
        int d = 3 * tri[3 * f + 2];
        double ux = xyz[b] - xyz[a];
        double uy = xyz[b + 1] - xyz[a + 1];
        double uz = xyz[b + 2] - xyz[a + 2];
        double vx = xyz[d] - xyz[a];
        double vy = xyz[d + 1] - xyz[a + 1];
        double vz = xyz[d + 2] - xyz[a + 2];
        return new double[] {uy * vz - uz * vy, uz * vx - ux * vz, ux * vy - uy * vx};
    }

    /** Axis-aligned bounding box {@code [xmin, ymin, zmin, xmax, ymax, zmax]}, metres. */
    public double[] boundingBox() {
        double[] b = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY,
            Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY, Double.NEGATIVE_INFINITY};
        for (int i = 0; i < xyz.length; i += 3) {
            for (int k = 0; k < 3; k++) {
                b[k] = Math.min(b[k], xyz[i + k]);
                b[3 + k] = Math.max(b[3 + k], xyz[i + k]);
            }
        }
        return b;
    }

    @Override
    public String toString() {
        return "TriangleMesh[" + vertexCount() + " vertices, " + facetCount() + " facets, bbox "
            + Arrays.toString(boundingBox()) + "]";
    }
}
