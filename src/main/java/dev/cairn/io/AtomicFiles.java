package dev.cairn.io;

import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;

/**
 * Writes files all-or-nothing: content goes to a temporary file in the target's directory, which is then
 * renamed over the target. A reader never sees a half-written output, and a failed run leaves no partial file.
 */
public final class AtomicFiles {
    private AtomicFiles() {
    }

    /** Something that writes the whole content to a stream. */
    @FunctionalInterface
    public interface StreamWriter {
        void write(OutputStream out) throws IOException;
    }

    /** Writes {@code target} atomically with the bytes {@code writer} produces; parent directories are created. */
    public static void write(Path target, StreamWriter writer) {
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        Path tmp = null;
        try {
            Files.createDirectories(dir);
            tmp = Files.createTempFile(dir, "." + abs.getFileName() + ".", ".tmp");
            try {
                // createTempFile makes the file owner-only; outputs are ordinary files (rw-r--r--).
                Files.setPosixFilePermissions(tmp, java.nio.file.attribute.PosixFilePermissions.fromString("rw-r--r--"));
            } catch (UnsupportedOperationException ignored) {
                // not a POSIX file system: keep the default permissions
            }
            try (OutputStream out = new java.io.BufferedOutputStream(Files.newOutputStream(tmp), 1 << 16)) {
                writer.write(out);
            }
            try {
                Files.move(tmp, abs, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING);
            }
            tmp = null;
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + target + ": " + e.getMessage(), e);
        } finally {
            if (tmp != null) {
                try {
                    Files.deleteIfExists(tmp);
                } catch (IOException ignored) {
                    // best effort clean-up of our own temporary file
                }
            }
        }
    }

    /** Writes a UTF-8 string atomically. */
    public static void writeString(Path target, String content) {
        write(target, out -> out.write(content.getBytes(StandardCharsets.UTF_8)));
    }
}
