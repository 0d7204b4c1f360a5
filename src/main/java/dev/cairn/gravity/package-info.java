/**
 * Gravity field models behind one small interface ({@link dev.cairn.gravity.FieldModel}): the exact
 * constant-density polyhedron (Werner &amp; Scheeres 1997), and the parallel batch evaluation shared by all models.
 *
 * <p>Sign convention everywhere: potential U &gt; 0, acceleration g = ∇U (toward the body). SI units, model frame.
 * Depends on {@code mesh} and {@code mass}; never on {@code cli} or {@code viewer}; library code never prints.
 */
package dev.cairn.gravity;
