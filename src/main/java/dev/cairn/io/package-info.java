/**
 * Input and output at the program's edges: model sidecars (JSON), point lists (CSV), atomic file writing and
 * the {@link dev.cairn.io.InputException} that carries a one-line, file-and-line error for the user.
 *
 * <p>Units are converted here, at the edge: everything handed to the rest of Cairn is SI (metres, kilograms,
 * seconds). This package may depend on {@code mesh} (and on {@code regions}, which
 * reads body descriptions), never on {@code cli} or {@code viewer}.
 */
package dev.cairn.io;
