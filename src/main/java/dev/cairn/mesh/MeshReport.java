package dev.cairn.mesh;

import java.util.List;

/**
 * What {@link MeshInspector} found in a mesh. Counts are exact; the {@code example*} lists hold at most a few
 * indices (0-based) so that a message can point at the problem.
 *
 * @param vertices                number of vertices
 * @param facets                  number of facets
 * @param edges                   number of distinct undirected edges
 * @param boundaryEdges           edges used by exactly one facet (the surface is open there)
 * @param nonManifoldEdges        edges used by three or more facets
 * @param inconsistentEdges       edges used by two facets that traverse them in the same direction
 *                                (neighbouring facets disagree about orientation)
 * @param exampleBoundaryEdges    a few boundary edges as vertex pairs {@code [a, b]}
 * @param exampleNonManifoldEdges a few non-manifold edges as vertex pairs
 * @param exampleInconsistentEdges a few inconsistently oriented edges as vertex pairs
 * @param degenerateFacets        facets of (near) zero area: area below 1e-12 of the bounding-box diagonal squared
 * @param exampleDegenerateFacets a few of them
 * @param sliverFacets            non-degenerate facets of poor shape: quality {@code 4√3·A/Σ l²} below 1e-3
 * @param exampleSliverFacets     a few of them
 * @param duplicateVertices       vertices at the same position (to 1e-9 of the diagonal) as an earlier vertex
 * @param unusedVertices          vertices no facet refers to
 * @param components              connected components of the facet graph
 * @param eulerCharacteristic     {@code V_used − E + F}
 * @param genus                   {@code (2·components − χ)/2} for a closed orientable surface, else -1
 * @param signedVolume            signed enclosed volume, cubic metres (negative: facets face inward)
 * @param boundingBox             {@code [xmin, ymin, zmin, xmax, ymax, zmax]}, metres
 */
public record MeshReport(
    int vertices, int facets, int edges,
    int boundaryEdges, int nonManifoldEdges, int inconsistentEdges,
    List<int[]> exampleBoundaryEdges, List<int[]> exampleNonManifoldEdges, List<int[]> exampleInconsistentEdges,
    int degenerateFacets, List<Integer> exampleDegenerateFacets,
    int sliverFacets, List<Integer> exampleSliverFacets,
    int duplicateVertices, int unusedVertices,
    int components, int eulerCharacteristic, int genus,
    double signedVolume, double[] boundingBox) {

    /** True when every edge has exactly two facets that traverse it in opposite directions. */
    public boolean closed() {
        return boundaryEdges == 0 && nonManifoldEdges == 0;
    }

    /** True when the surface is closed, consistently oriented and has no degenerate facets. */
    public boolean fitForGravity() {
        return closed() && inconsistentEdges == 0 && degenerateFacets == 0;
    }

    /** True when the facets of a closed surface face inward (negative signed volume). */
    public boolean inwardOriented() {
        return closed() && inconsistentEdges == 0 && signedVolume < 0;
    }
}
