package dev.cairn.surface;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** A uniform spatial hash of points (cell size = query radius) for "is any stored point within d?" queries, O(1). */
final class PointGrid {
    private final double cell;
    private final Map<Long, List<double[]>> cells = new HashMap<>();

    PointGrid(double cell) {
        this.cell = cell;
    }

    private long key(long i, long j, long k) {
        return (i & 0x1FFFFF) | ((j & 0x1FFFFF) << 21) | ((k & 0x1FFFFF) << 42);
    }

    void add(double x, double y, double z) {
        long i = (long) Math.floor(x / cell);
        long j = (long) Math.floor(y / cell);
        long k = (long) Math.floor(z / cell);
        cells.computeIfAbsent(key(i, j, k), q -> new ArrayList<>()).add(new double[] {x, y, z});
    }

    /** True when a stored point lies within {@code d ≤ cell} of {@code (x, y, z)}. */
    boolean anyWithin(double x, double y, double z, double d) {
        long i0 = (long) Math.floor(x / cell);
        long j0 = (long) Math.floor(y / cell);
        long k0 = (long) Math.floor(z / cell);
        double d2 = d * d;
        for (long i = i0 - 1; i <= i0 + 1; i++) {
            for (long j = j0 - 1; j <= j0 + 1; j++) {
                for (long k = k0 - 1; k <= k0 + 1; k++) {
                    List<double[]> l = cells.get(key(i, j, k));
                    if (l == null) {
                        continue;
                    }
                    for (double[] p : l) {
                        double dx = p[0] - x;
                        double dy = p[1] - y;
                        double dz = p[2] - z;
                        if (dx * dx + dy * dy + dz * dz < d2) {
                            return true;
                        }
                    }
                }
            }
        }
        return false;
    }
}
