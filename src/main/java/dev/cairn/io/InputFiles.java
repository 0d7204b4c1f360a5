package dev.cairn.io;

import java.nio.file.Files;
import java.nio.file.Path;

/** Checks on input files before they are opened. */
public final class InputFiles {
    private InputFiles() {
    }

    /**
     * Refuses a missing path or one that is not a regular file (a directory, device or pipe) with a one-line
     * {@link InputException} naming the path; {@code what} says what the file is for ("points file").
     */
    public static void requireRegularFile(Path file, String what) {
        if (!Files.exists(file)) {
            throw new InputException(Messages.path(file) + ": no such file");
        }
        if (!Files.isRegularFile(file)) {
            throw new InputException(Messages.path(file) + ": not a regular file (a " + what + " must be a file, not a "
                + "directory, device or pipe)");
        }
    }
}
