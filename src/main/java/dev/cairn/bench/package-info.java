/**
 * Benchmark-only code: {@link dev.cairn.bench.ReferenceKernel}, a straightforward scalar implementation of the
 * Werner–Scheeres polyhedron formulas kept as the speed baseline, and {@link dev.cairn.bench.KernelBench}, which times
 * it side by side with the product kernel ({@link dev.cairn.gravity.PolyhedronField}) on the same body in the same run.
 *
 * <p>Nothing in the product uses this package: no command evaluates a field with {@code ReferenceKernel}; only
 * {@code cairn bench} reaches it. Depends on {@code gravity}, {@code mesh} and {@code util}; library code, it never
 * prints except through the writer {@code KernelBench} is handed.
 */
package dev.cairn.bench;
