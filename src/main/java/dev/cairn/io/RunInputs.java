package dev.cairn.io;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;

/**
 * The files a run has read (model, sidecar, region shapes, point lists, table shards): {@link AtomicFiles} refuses
 * to replace any of them, so {@code --out} can never destroy an input of the same run. The command line clears the
 * list before and after each run; library callers that never register anything are not affected.
 */
public final class RunInputs {
    private static final Set<Path> INPUTS = ConcurrentHashMap.newKeySet();

    private RunInputs() {
    }

    /** Records {@code file} as an input of the current run. */
    public static void register(Path file) {
        INPUTS.add(key(file));
    }

    /** Forgets every recorded input. */
    public static void clear() {
        INPUTS.clear();
    }

    /** True when {@code file} (after resolving links) is an input of the current run. */
    public static boolean isInput(Path file) {
        return !INPUTS.isEmpty() && INPUTS.contains(key(file));
    }

    /**
     * Refuses an output path that is an input of this run, or that exists and is not a regular file (a device, a
     * FIFO, a directory: replacing it with a regular file would be wrong, writing into it surprising).
     *
     * @throws InputException naming the path and the reason
     */
    public static void requireWritable(Path out) {
        if (isInput(out)) {
            throw new InputException(Messages.path(out) + ": refusing to overwrite an input of this run (choose "
                + "another output name)");
        }
        if (Files.exists(out, LinkOption.NOFOLLOW_LINKS) && !Files.isRegularFile(out)) {
            throw new InputException(Messages.path(out) + ": refusing to replace something that is not a regular "
                + "file (a directory, device or pipe); choose a regular file name");
        }
    }

    private static Path key(Path file) {
        Path abs = file.toAbsolutePath().normalize();
        try {
            return abs.toRealPath();
        } catch (IOException e) {
            return abs;
        }
    }
}
