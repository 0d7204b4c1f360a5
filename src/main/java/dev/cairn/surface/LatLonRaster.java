package dev.cairn.surface;

import dev.cairn.mesh.FacetGeometry;
import dev.cairn.mesh.TriangleMesh;
import dev.cairn.rotation.RotatingFrame;
import dev.cairn.util.ParallelChunks;
import dev.cairn.util.ProgressListener;

/**
 * Which facet is seen in each cell of a latitude–longitude grid: for the direction of each cell centre (about the
 * spin pole, from the centre of mass) the ray from the centre of mass is intersected with the surface and the
 * outermost hit wins (what an observer far out along that direction sees first for a body that is star-shaped about
 * its centre of mass; for other bodies, the outermost layer). Candidate facets come from a 2° × 2° bucket index of
 * each facet's padded latitude/longitude box, so the cost is O(cells × facets per bucket), not O(cells × F).
 * Ray–triangle test: Möller, T. &amp; Trumbore, B. (1997) Fast, minimum storage ray-triangle intersection.
 * J. Graphics Tools 2(1):21–28.
 */
public final class LatLonRaster {
    private static final double BIN_DEG = 2.0;
    private final int width;
    private final int height;
    private final int[] facetAt;

    private LatLonRaster(int width, int height, int[] facetAt) {
        this.width = width;
        this.height = height;
        this.facetAt = facetAt;
    }

    /** Cells across (longitude −180..180 left to right). */
    public int width() {
        return width;
    }

    /** Cells down (latitude 90..−90 top to bottom). */
    public int height() {
        return height;
    }

    /** Facet seen in cell {@code (i, j)} (column, row), or -1 when the ray misses the surface. */
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

    /** Builds the raster of {@code mesh} in {@code frame}. */
    public static LatLonRaster build(TriangleMesh mesh, RotatingFrame frame, int width, int height, int threads) {
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
                return cast(mesh, frame, width, height, threads, count, list, nLon, nLat);
            }
        }
        throw new IllegalStateException("unreachable");
    }

    private static LatLonRaster cast(TriangleMesh mesh, RotatingFrame frame, int width, int height, int threads,
                                     int[] start, int[] list, int nLon, int nLat) {
        double[] xyz = mesh.xyz();
        int[] tri = mesh.tri();
        double[] c = frame.centre();
        int[] out = new int[width * height];
        ParallelChunks.run(height, threads, () -> new double[3], (d, from, to) -> {
            for (int j = from; j < to; j++) {
                double la = 90 - (j + 0.5) * 180.0 / height;
                int bj = Math.min(nLat - 1, (int) Math.floor((90 - la) / BIN_DEG));
                for (int i = 0; i < width; i++) {
                    double lo = -180 + (i + 0.5) * 360.0 / width;
                    int bi = Math.min(nLon - 1, (int) Math.floor((lo + 180) / BIN_DEG));
                    frame.direction(la, lo, d, 0);
                    int bin = bj * nLon + bi;
                    int best = -1;
                    double bestT = 0;
                    for (int q = start[bin]; q < start[bin + 1]; q++) {
                        int f = list[q];
                        double t = hit(xyz, tri, f, c, d[0], d[1], d[2]);
                        if (t > bestT) {
                            bestT = t;
                            best = f;
                        }
                    }
                    out[j * width + i] = best;
                }
            }
        }, ProgressListener.NONE);
        return new LatLonRaster(width, height, out);
    }

    /** Ray {@code c + t d} against facet {@code f}: the distance t &gt; 0 of the hit, or -1 (Möller–Trumbore). */
    static double hit(double[] xyz, int[] tri, int f, double[] c, double dx, double dy, double dz) {
        double t = FacetGeometry.rayHit(xyz, tri, f, c[0], c[1], c[2], dx, dy, dz, EDGE_TOLERANCE);
        return t > 0 ? t : -1;
    }

    /** Barycentric slack so that a ray through a shared edge or vertex hits at least one facet. */
    private static final double EDGE_TOLERANCE = 1e-12;
}
