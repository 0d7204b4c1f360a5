package dev.cairn.tables;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A list of points (e.g. along a planned trajectory), metres, model frame; shape {@code (n)}. Not a grid: a table
 * of points can be written and read but not interpolated.
 *
 * @param xyz    coordinates, {@code 3n} values, m
 * @param source where the points came from (file name), for the sidecar
 * @param sha256 SHA-256 of the source file (hex), or null
 */
public record PointGrid(double[] xyz, String source, String sha256) implements Grid {
    public PointGrid {
        xyz = xyz.clone();
    }

    @Override
    public int nodeCount() {
        return xyz.length / 3;
    }

    @Override
    public int[] shape() {
        return new int[] {nodeCount()};
    }

    @Override
    public void node(int i, double[] out, int off) {
        out[off] = xyz[3 * i];
        out[off + 1] = xyz[3 * i + 1];
        out[off + 2] = xyz[3 * i + 2];
    }

    @Override
    public String kind() {
        return "points";
    }

    @Override
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("kind", kind());
        m.put("count", nodeCount());
        m.put("source", source);
        m.put("source_sha256", sha256);
        m.put("node_formula", "node i is row i; its coordinates are the x_m,y_m,z_m columns");
        return m;
    }

    @Override
    public double[] xyz() {
        return xyz.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof PointGrid g && java.util.Arrays.equals(xyz, g.xyz);
    }

    @Override
    public int hashCode() {
        return java.util.Arrays.hashCode(xyz);
    }
}
