package dev.cairn.tables;

import dev.cairn.io.InputException;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A Cartesian box of nodes {@code (x0 + i·dx, y0 + j·dy, z0 + k·dz)}, {@code i < nx, j < ny, k < nz}, metres, model
 * frame; node index {@code (i·ny + j)·nz + k} (x slowest, z fastest: C order of shape {@code (nx, ny, nz)}).
 *
 * @param origin  {@code (x0, y0, z0)}, m
 * @param spacing {@code (dx, dy, dz)}, m, positive
 * @param counts  {@code (nx, ny, nz)}, each at least 2
 */
public record BoxGrid(double[] origin, double[] spacing, int[] counts) implements Grid {
    /** Relative slack when deciding whether a span is a whole number of spacings (common practice, no source). */
    public static final double WHOLE_STEPS_SLACK = 1e-9;

    public BoxGrid {
        origin = origin.clone();
        spacing = spacing.clone();
        counts = counts.clone();
        long n = 1;
        for (int a = 0; a < 3; a++) {
            if (!(spacing[a] > 0) || !Double.isFinite(spacing[a]) || !Double.isFinite(origin[a])) {
                throw new InputException("box grid: spacing along " + "xyz".charAt(a) + " must be a positive number, got "
                    + spacing[a]);
            }
            if (counts[a] < 2) {
                throw new InputException("box grid: need at least 2 nodes along " + "xyz".charAt(a) + ", got " + counts[a]);
            }
            n *= counts[a];
        }
        if (n > Integer.MAX_VALUE) {
            throw new InputException("box grid: " + n + " nodes is more than one table can hold (" + Integer.MAX_VALUE + ")");
        }
    }

    /**
     * Box from bounds and spacing per axis. Nodes start at the lower bound; when a span is not a whole number of
     * spacings the upper bound is moved up to the next whole step (the table then covers the requested box).
     *
     * @param bounds  {@code xmin,xmax,ymin,ymax,zmin,zmax}, m
     * @param spacing three spacings, m
     */
    public static BoxGrid ofSpacing(double[] bounds, double[] spacing) {
        checkBounds(bounds);
        int[] counts = new int[3];
        for (int a = 0; a < 3; a++) {
            if (!(spacing[a] > 0) || !Double.isFinite(spacing[a])) {
                throw new InputException("--spacing: spacing along " + "xyz".charAt(a) + " must be positive, got "
                    + spacing[a]);
            }
            double steps = (bounds[2 * a + 1] - bounds[2 * a]) / spacing[a];
            double whole = Math.rint(steps);
            long s = Math.abs(steps - whole) <= WHOLE_STEPS_SLACK * Math.max(1, whole) ? (long) whole
                : (long) Math.ceil(steps);
            if (s + 1 > Integer.MAX_VALUE) {
                throw new InputException("--spacing: " + spacing[a] + " m gives too many nodes along " + "xyz".charAt(a));
            }
            counts[a] = (int) Math.max(1, s) + 1;
        }
        return new BoxGrid(new double[] {bounds[0], bounds[2], bounds[4]}, spacing, counts);
    }

    /** Box from bounds and node counts per axis (at least 2 each); nodes on both bounds. */
    public static BoxGrid ofCounts(double[] bounds, int[] counts) {
        checkBounds(bounds);
        double[] sp = new double[3];
        for (int a = 0; a < 3; a++) {
            if (counts[a] < 2) {
                throw new InputException("--nodes: need at least 2 nodes along " + "xyz".charAt(a) + ", got " + counts[a]);
            }
            sp[a] = (bounds[2 * a + 1] - bounds[2 * a]) / (counts[a] - 1);
        }
        return new BoxGrid(new double[] {bounds[0], bounds[2], bounds[4]}, sp, counts);
    }

    private static void checkBounds(double[] b) {
        if (b.length != 6) {
            throw new InputException("--box: expected xmin,xmax,ymin,ymax,zmin,zmax (6 numbers), got " + b.length);
        }
        for (int a = 0; a < 3; a++) {
            if (!Double.isFinite(b[2 * a]) || !Double.isFinite(b[2 * a + 1])) {
                throw new InputException("--box: bounds must be finite numbers");
            }
            if (!(b[2 * a] < b[2 * a + 1])) {
                throw new InputException("--box: " + "xyz".charAt(a) + "min " + b[2 * a] + " must be less than "
                    + "xyz".charAt(a) + "max " + b[2 * a + 1]);
            }
        }
    }

    /** Coordinate of node index {@code i} along axis {@code a}, m (the one formula used everywhere). */
    public double coordinate(int a, int i) {
        return origin[a] + i * spacing[a];
    }

    @Override
    public int nodeCount() {
        return counts[0] * counts[1] * counts[2];
    }

    @Override
    public int[] shape() {
        return counts.clone();
    }

    @Override
    public void node(int n, double[] out, int off) {
        int k = n % counts[2];
        int ij = n / counts[2];
        int j = ij % counts[1];
        int i = ij / counts[1];
        out[off] = coordinate(0, i);
        out[off + 1] = coordinate(1, j);
        out[off + 2] = coordinate(2, k);
    }

    @Override
    public String kind() {
        return "box";
    }

    @Override
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("kind", kind());
        m.put("origin_m", List.of(origin[0], origin[1], origin[2]));
        m.put("spacing_m", List.of(spacing[0], spacing[1], spacing[2]));
        m.put("nodes", List.of(counts[0], counts[1], counts[2]));
        m.put("upper_m", List.of(coordinate(0, counts[0] - 1), coordinate(1, counts[1] - 1),
            coordinate(2, counts[2] - 1)));
        m.put("node_formula", "x = origin + index * spacing; node (i,j,k) is row (i*ny + j)*nz + k");
        return m;
    }

    @Override
    public double[] origin() {
        return origin.clone();
    }

    @Override
    public double[] spacing() {
        return spacing.clone();
    }

    @Override
    public int[] counts() {
        return counts.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof BoxGrid g && java.util.Arrays.equals(origin, g.origin)
            && java.util.Arrays.equals(spacing, g.spacing) && java.util.Arrays.equals(counts, g.counts);
    }

    @Override
    public int hashCode() {
        return java.util.Arrays.hashCode(origin) * 31 + java.util.Arrays.hashCode(counts);
    }
}
