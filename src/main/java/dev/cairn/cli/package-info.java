/**
 * The {@code cairn} command line (picocli): one class per subcommand, shared option mixins, the progress bar and the
 * error handling that maps {@link dev.cairn.io.InputException} to exit code 2 with one line on stderr.
 * Only this package and {@code viewer} talk to the user. No JavaFX here.
 */
package dev.cairn.cli;
