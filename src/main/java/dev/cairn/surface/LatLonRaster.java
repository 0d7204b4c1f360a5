package dev.cairn.surface;

import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;

/**
 * Which facet is seen in each cell of a latitude–longitude grid: for the direction of each cell centre (about the
 * spin pole, from the centre of mass) the ray from the centre of mass is intersected with the surface. Its distinct
 * crossings, counted from the outside in, are the map's <i>layers</i>: layer 1 is the outermost hit (what an observer
 * far out along that direction sees first for a body that is star-shaped about its centre of mass), layer k the k-th
 * from the outside. A star-shaped body with the centre of mass inside has one crossing per ray; a concave body, or one
 * whose centre of mass lies outside it (a C shape), has rays that cross several times, and the inner layers are hidden
 * on the outer map. {@link #facetLayers} gives, for each facet, the layer that shows it (from the ray through its
 * centroid), so the maps of layers 1..L together show every facet. Crossings closer than {@value #SAME_CROSSING}
 * (relative) are one crossing (a ray through a shared edge or vertex).
 *
 * <p>Candidate facets come from a 2° × 2° bucket index of each facet's padded latitude/longitude box, so the cost is
 * O(cells × facets per bucket), not O(cells × F). Ray–triangle test: Möller, T. &amp; Trumbore, B. (1997) Fast,
 * minimum storage ray-triangle intersection. J. Graphics Tools 2(1):21–28.
 */
public final class LatLonRaster {
    private static final double BIN_DEG = 2.0;
    /** Relative difference of ray parameters below which two hits are one crossing. */
    static final double SAME_CROSSING = 1e-9;
    /** Most crossings kept per ray (the maps have at most this many layers). */
    public static final int MAX_LAYERS = 8;
    /** Hits examined per ray before deduplication (bounded scratch). */
    private static final int MAX_HITS = 256;
    private final int width;
    private final int height;
    private final int layers;
    /** Facet of layer k (0-based) in cell c at {@code facetAt[k * width * height + c]}, -1 for none. */
    private final int[] facetAt;
    /** Distinct crossings of each cell's ray (may exceed {@link #MAX_LAYERS}). */
    private final int[] crossings;

    private LatLonRaster(int width, int height, int layers, int[] facetAt, int[] crossings) {
        this.width = width;
        this.height = height;
        this.layers = layers;
        this.facetAt = facetAt;
        this.crossings = crossings;
    }

    /** Layers in this raster: the most crossings of any cell's ray, at most {@link #MAX_LAYERS}; at least 1. */
    public int layers() {
        return layers;
    }

    /** Distinct surface crossings of the ray of cell {@code (i, j)}. */
    public int crossings(int i, int j) {
        return crossings[j * width + i];
    }

    /** Facet of layer {@code layer} (1 = outermost) in cell {@code (i, j)}, or -1 when the ray has fewer crossings. */
    public int facet(int i, int j, int layer) {
        return layer > layers ? -1 : facetAt[(layer - 1) * width * height + j * width + i];
    }

    /** Cells across (longitude −180..180 left to right). */
    public int width() {
        return width;
    }

    /** Cells down (latitude 90..−90 top to bottom). */
    public int height() {
        return height;
    }

    /** Facet seen in cell {@code (i, j)} (column, row) on the outer layer, or -1 when the ray misses the surface. */
    public int facet(int i, int j) {
        return facetAt[j * width + i];
    }

    /** Longitude of column centre {@code i}, degrees. */
    public double lonDeg(int i) {
        return -180 + (i + 0.5) * 360.0 / width;
    }

    /** Latitude of row centre {@code j}, degrees. */
    public double latDeg(int j) {
        return 90 - (j + 0.5) * 180.0 / height;
    }

    /** Builds the raster of {@code mesh} in {@code frame}, with every layer up to {@link #MAX_LAYERS}. */
    public static LatLonRaster build(TriangleMesh mesh, RotatingFrame frame, int width, int height, int threads) {
        return cast(mesh, frame, width, height, threads, Index.of(mesh, frame));
    }

    /**
     * The map layer of each facet: 1 + the number of distinct crossings, farther out than its centroid, of the ray
     * from the centre of mass through the centroid (0 for a facet whose centroid is the centre of mass itself). Not
     * capped: a value above {@link #MAX_LAYERS} means the facet is on no map.
     */
    public static int[] facetLayers(TriangleMesh mesh, RotatingFrame frame, int threads) {
        Index idx = Index.of(mesh, frame);
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        double[] cen = mesh.facetCentroids();
        double[] c = frame.centre();
        int nf = mesh.facetCount();
        int[] out = new int[nf];
        ParallelChunks.run(nf, threads, () -> new double[MAX_HITS], (ts, from, to) -> {
            for (int f = from; f < to; f++) {
                double dx = cen[3 * f] - c[0];
                double dy = cen[3 * f + 1] - c[1];
                double dz = cen[3 * f + 2] - c[2];
                double tc = Math.sqrt(dx * dx + dy * dy + dz * dz);
                if (!(tc > 0)) {
                    out[f] = 0;
                    continue;
                }
                dx /= tc;
                dy /= tc;
                dz /= tc;
                int bin = idx.bin(frame.latitudeDeg(cen[3 * f], cen[3 * f + 1], cen[3 * f + 2]),
                    frame.longitudeDeg(cen[3 * f], cen[3 * f + 1], cen[3 * f + 2]));
                int n = 0;
                for (int q = idx.start[bin]; q < idx.start[bin + 1] && n < MAX_HITS; q++) {
                    int g = idx.list[q];
                    if (g == f) {
                        continue;
                    }
                    double t = hit(xyz, tri, g, c, dx, dy, dz);
                    if (t > tc * (1 + SAME_CROSSING)) {
                        ts[n++] = t;
                    }
                }
                out[f] = 1 + distinct(ts, null, n);
            }
        }, ProgressListener.NONE);
        return out;
    }

    /**
     * Sorts {@code t[0..n)} decreasing (with {@code f} alongside when non-null), keeps one of each group of hits
     * closer than {@link #SAME_CROSSING} (relative), and returns the number of distinct crossings, now in
     * {@code t[0..count)}.
     */
    private static int distinct(double[] t, int[] f, int n) {
        for (int i = 1; i < n; i++) { // insertion sort: few hits per ray
            double v = t[i];
            int g = f == null ? 0 : f[i];
            int j = i - 1;
            while (j >= 0 && (t[j] < v || (t[j] == v && f != null && f[j] > g))) {
                t[j + 1] = t[j];
                if (f != null) {
                    f[j + 1] = f[j];
                }
                j--;
            }
            t[j + 1] = v;
            if (f != null) {
                f[j + 1] = g;
            }
        }
        int k = 0;
        for (int i = 0; i < n; i++) {
            if (k > 0 && t[k - 1] - t[i] <= SAME_CROSSING * t[k - 1]) {
                continue;
            }
            t[k] = t[i];
            if (f != null) {
                f[k] = f[i];
            }
            k++;
        }
        return k;
    }

    /** The bucket index: facets whose padded latitude/longitude box covers each 2° bin. */
    private static final class Index {
        final int[] start;
        final int[] list;
        final int nLon;
        final int nLat;

        private Index(int[] start, int[] list, int nLon, int nLat) {
            this.start = start;
            this.list = list;
            this.nLon = nLon;
            this.nLat = nLat;
        }

        int bin(double la, double lo) {
            int bj = Math.max(0, Math.min(nLat - 1, (int) Math.floor((90 - la) / BIN_DEG)));
            int bi = Math.max(0, Math.min(nLon - 1, (int) Math.floor((lo + 180) / BIN_DEG)));
            return bj * nLon + bi;
        }

        static Index of(TriangleMesh mesh, RotatingFrame frame) {
            int nf = mesh.facetCount();
            double[] xyz = mesh.xyz();
            int[] tri = mesh.tri();
            double[] c = frame.centre();
            double[] axis = frame.axis();
            int nLon = (int) Math.round(360 / BIN_DEG);
            int nLat = (int) Math.round(180 / BIN_DEG);
            // Bucket boxes per facet: lat0, lat1, lon0, lon1 (lon possibly unwrapped past 180).
            double[] box = new double[4 * nf];
            double[] lat = new double[3];
            double[] lon = new double[3];
            double[] dir = new double[9];
            for (int f = 0; f < nf; f++) {
                double ang = 0;
                for (int k = 0; k < 3; k++) {
                    int v = 3 * tri[3 * f + k];
                    lat[k] = frame.latitudeDeg(xyz[v], xyz[v + 1], xyz[v + 2]);
                    lon[k] = frame.longitudeDeg(xyz[v], xyz[v + 1], xyz[v + 2]);
                    double dx = xyz[v] - c[0];
                    double dy = xyz[v + 1] - c[1];
                    double dz = xyz[v + 2] - c[2];
                    double n = Math.sqrt(dx * dx + dy * dy + dz * dz);
                    dir[3 * k] = dx / n;
                    dir[3 * k + 1] = dy / n;
                    dir[3 * k + 2] = dz / n;
                }
                for (int a = 0; a < 3; a++) {
                    int b = (a + 1) % 3;
                    double dot = dir[3 * a] * dir[3 * b] + dir[3 * a + 1] * dir[3 * b + 1] + dir[3 * a + 2] * dir[3 * b + 2];
                    ang = Math.max(ang, Math.toDegrees(Math.acos(Math.max(-1, Math.min(1, dot)))));
                }
                double pad = 0.5 * ang + BIN_DEG;
                double la0 = Math.min(lat[0], Math.min(lat[1], lat[2])) - pad;
                double la1 = Math.max(lat[0], Math.max(lat[1], lat[2])) + pad;
                boolean north = hit(xyz, tri, f, c, axis[0], axis[1], axis[2]) > 0;
                boolean south = hit(xyz, tri, f, c, -axis[0], -axis[1], -axis[2]) > 0;
                double lo0;
                double lo1;
                if (north || south || la1 >= 89 || la0 <= -89 || ang > 90) {
                    lo0 = -180;
                    lo1 = 180;
                    if (north) {
                        la1 = 90;
                    }
                    if (south) {
                        la0 = -90;
                    }
                } else {
                    double mn = Math.min(lon[0], Math.min(lon[1], lon[2]));
                    double mx = Math.max(lon[0], Math.max(lon[1], lon[2]));
                    double cosLat = Math.cos(Math.toRadians(Math.max(Math.abs(la0), Math.abs(la1))));
                    double lp = pad / Math.max(cosLat, 1e-3);
                    if (mx - mn > 180) { // straddles the ±180° meridian: go from the largest to the smallest + 360
                        double lo = Double.POSITIVE_INFINITY;
                        double hi = Double.NEGATIVE_INFINITY;
                        for (int k = 0; k < 3; k++) {
                            double l = lon[k] < 0 ? lon[k] + 360 : lon[k];
                            lo = Math.min(lo, l);
                            hi = Math.max(hi, l);
                        }
                        mn = lo;
                        mx = hi;
                    }
                    lo0 = mn - lp;
                    lo1 = mx + lp;
                    if (lo1 - lo0 >= 360) {
                        lo0 = -180;
                        lo1 = 180;
                    }
                }
                box[4 * f] = Math.max(-90, la0);
                box[4 * f + 1] = Math.min(90, la1);
                box[4 * f + 2] = lo0;
                box[4 * f + 3] = lo1;
            }
            int[] count = new int[nLon * nLat + 1];
            for (int pass = 0; pass < 2; pass++) {
                int[] fill = pass == 1 ? new int[nLon * nLat] : null;
                int[] list = pass == 1 ? new int[count[nLon * nLat]] : null;
                for (int f = 0; f < nf; f++) {
                    int j0 = Math.max(0, (int) Math.floor((90 - box[4 * f + 1]) / BIN_DEG));
                    int j1 = Math.min(nLat - 1, (int) Math.floor((90 - box[4 * f]) / BIN_DEG));
                    int i0 = (int) Math.floor((box[4 * f + 2] + 180) / BIN_DEG);
                    int i1 = (int) Math.floor((box[4 * f + 3] + 180) / BIN_DEG);
                    if (i1 - i0 + 1 > nLon) {
                        i0 = 0;
                        i1 = nLon - 1;
                    }
                    for (int j = j0; j <= j1; j++) {
                        for (int ii = i0; ii <= i1; ii++) {
                            int i = Math.floorMod(ii, nLon);
                            int bin = j * nLon + i;
                            if (pass == 0) {
                                count[bin + 1]++;
                            } else {
                                list[count[bin] + fill[bin]++] = f;
                            }
                        }
                    }
                }
                if (pass == 0) {
                    for (int b = 0; b < nLon * nLat; b++) {
                        count[b + 1] += count[b];
                    }
                } else {
                    return new Index(count, list, nLon, nLat);
                }
            }
            throw new IllegalStateException("unreachable");
        }
    }

    private static LatLonRaster cast(TriangleMesh mesh, RotatingFrame frame, int width, int height, int threads,
                                     Index idx) {
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        double[] c = frame.centre();
        int cells = width * height;
        int[] out = new int[MAX_LAYERS * cells];
        java.util.Arrays.fill(out, -1);
        int[] cross = new int[cells];
        ParallelChunks.run(height, threads, RayScratch::new, (s, from, to) -> {
            double[] d = s.dir;
            for (int j = from; j < to; j++) {
                double la = 90 - (j + 0.5) * 180.0 / height;
                for (int i = 0; i < width; i++) {
                    double lo = -180 + (i + 0.5) * 360.0 / width;
                    frame.direction(la, lo, d, 0);
                    int bin = idx.bin(la, lo);
                    int n = 0;
                    for (int q = idx.start[bin]; q < idx.start[bin + 1] && n < MAX_HITS; q++) {
                        int f = idx.list[q];
                        double t = hit(xyz, tri, f, c, d[0], d[1], d[2]);
                        if (t > 0) {
                            s.t[n] = t;
                            s.f[n++] = f;
                        }
                    }
                    int k = distinct(s.t, s.f, n);
                    cross[j * width + i] = k;
                    for (int l = 0; l < Math.min(k, MAX_LAYERS); l++) {
                        out[l * cells + j * width + i] = s.f[l];
                    }
                }
            }
        }, ProgressListener.NONE);
        int layers = 1;
        for (int k : cross) {
            layers = Math.max(layers, Math.min(k, MAX_LAYERS));
        }
        return new LatLonRaster(width, height, layers, java.util.Arrays.copyOf(out, layers * cells), cross);
    }

    /** Per-thread scratch of one ray. */
    private static final class RayScratch {
        final double[] dir = new double[3];
        final double[] t = new double[MAX_HITS];
        final int[] f = new int[MAX_HITS];
    }

    /** Ray {@code c + t d} against facet {@code f}: the distance t &gt; 0 of the hit, or -1 (Möller–Trumbore). */
    static double hit(double[] xyz, int[] tri, int f, double[] c, double dx, double dy, double dz) {
        double t = FacetGeometry.rayHit(xyz, tri, f, c[0], c[1], c[2], dx, dy, dz, EDGE_TOLERANCE);
        return t > 0 ? t : -1;
    }

    /** Barycentric slack so that a ray through a shared edge or vertex hits at least one facet. */
    private static final double EDGE_TOLERANCE = 1e-12;
}
