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

    /**
     * Writes {@code target} atomically with the bytes {@code writer} produces; parent directories are created.
     *
     * @throws InputException when {@code target} is an input of this run or exists and is not a regular file
     *                        ({@link RunInputs#requireWritable})
     */
    public static void write(Path target, StreamWriter writer) {
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        Path tmp = null;
        RunInputs.requireWritable(abs);
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
            throw new UncheckedIOException(Messages.line("cannot write " + target + ": " + e.getMessage()), e);
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

    /**
     * Removes temporary files that {@link #write} left beside {@code target} when a run was killed, provided they
     * are older than {@code minAgeMillis} (0 when the caller holds the output's lock, so no other writer runs).
     */
    public static void cleanStale(Path target, long minAgeMillis) {
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        String prefix = "." + abs.getFileName() + ".";
        if (dir == null || !Files.isDirectory(dir)) {
            return;
        }
        long now = System.currentTimeMillis();
        try (var s = Files.newDirectoryStream(dir, p -> {
            String n = p.getFileName().toString();
            return n.startsWith(prefix) && n.endsWith(".tmp");
        })) {
            for (Path p : s) {
                try {
                    if (Files.isRegularFile(p, java.nio.file.LinkOption.NOFOLLOW_LINKS)
                        && now - Files.getLastModifiedTime(p).toMillis() >= minAgeMillis) {
                        Files.deleteIfExists(p);
                    }
                } catch (IOException ignored) {
                    // best effort: a file that vanished or cannot be removed is left
                }
            }
        } catch (IOException ignored) {
            // best effort clean-up
        }
    }

    /** Writes a UTF-8 string atomically. */
    public static void writeString(Path target, String content) {
        write(target, out -> out.write(content.getBytes(StandardCharsets.UTF_8)));
    }
}
