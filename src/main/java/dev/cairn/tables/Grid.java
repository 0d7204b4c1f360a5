package dev.cairn.tables;

import java.util.Map;

/**
 * The nodes of a table, model (body-fixed) frame, metres. Nodes are numbered {@code 0 .. nodeCount()-1} in C order
 * of {@link #shape()} (last index fastest).
 */
public sealed interface Grid permits BoxGrid, SphereGrid, PointGrid {
    /** Number of nodes. */
    int nodeCount();

    /** Shape of the node array (without the column axis), C order. */
    int[] shape();

    /** Writes the Cartesian coordinates of node {@code i} (metres, model frame) into {@code out[off..off+2]}. */
    void node(int i, double[] out, int off);

    /** Grid definition for the JSON sidecar (keys documented in docs/tables.md). */
    Map<String, Object> toJson();

    /** Short kind word: {@code box}, {@code sphere} or {@code points}. */
    String kind();
}
