/**
 * Triangle meshes as flat arrays (structure of arrays), the streaming OBJ reader, the edge table, mesh checks
 * (closedness, orientation, degenerate facets, duplicates, genus) and canonical test shapes.
 *
 * <p>Coordinates are metres in the model frame. Depends on nothing else in Cairn but
 * {@link dev.cairn.io.InputException}; must never import JavaFX.
 */
package dev.cairn.mesh;
