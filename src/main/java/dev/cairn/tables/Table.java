package dev.cairn.tables;

import java.util.List;
import java.util.Map;

/**
 * A table read into memory.
 *
 * @param grid     the nodes
 * @param columns  column names (see {@link TableLayout})
 * @param values   row-major values, node {@code i} column {@code c} at {@code i·columns.size() + c} (not copied)
 * @param metadata the sidecar as read
 */
public record Table(Grid grid, List<String> columns, double[] values, Map<String, Object> metadata) {
    /** Number of columns. */
    public int columnCount() {
        return columns.size();
    }

    /** Index of a column, or -1. */
    public int column(String name) {
        return columns.indexOf(name);
    }

    /** Value of node {@code node}, column {@code col}. */
    public double value(int node, int col) {
        return values[node * columns.size() + col];
    }
}
