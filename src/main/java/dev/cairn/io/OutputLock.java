package dev.cairn.io;

import java.io.IOException;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.channels.OverlappingFileLockException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;

/**
 * An exclusive lock on an output and its checkpoint state, held for a whole run: a second run on the same output
 * (in this or another process) is refused at once with a message instead of mixing its chunks into the first one's.
 * The lock is an operating-system lock on the hidden file {@code .NAME.lock} beside the output; it is released when
 * the run ends or its process dies. The lock file itself stays (removing it would let two runs lock different
 * files of the same name).
 */
public final class OutputLock implements AutoCloseable {
    private final FileChannel channel;
    private final FileLock lock;

    private OutputLock(FileChannel channel, FileLock lock) {
        this.channel = channel;
        this.lock = lock;
    }

    /** The lock file of {@code out}. */
    public static Path lockFile(Path out) {
        Path abs = out.toAbsolutePath();
        return abs.resolveSibling("." + abs.getFileName() + ".lock");
    }

    /**
     * Takes the lock of {@code out} or refuses.
     *
     * @throws InputException when another run holds it, or it cannot be created
     */
    public static OutputLock acquire(Path out) {
        Path f = lockFile(out);
        FileChannel ch = null;
        try {
            java.nio.file.Files.createDirectories(f.getParent());
            ch = FileChannel.open(f, StandardOpenOption.CREATE, StandardOpenOption.WRITE);
            FileLock l;
            try {
                l = ch.tryLock();
            } catch (OverlappingFileLockException e) {
                l = null;
            }
            if (l == null) {
                ch.close();
                throw new InputException(Messages.path(out) + ": another cairn run is writing this output (lock "
                    + f.getFileName() + " is held); wait for it to finish or choose another output");
            }
            return new OutputLock(ch, l);
        } catch (IOException e) {
            try {
                if (ch != null) {
                    ch.close();
                }
            } catch (IOException ignored) {
                // closing a channel we could not use
            }
            throw new InputException(Messages.path(out) + ": cannot lock the output: " + e.getMessage(), e);
        }
    }

    @Override
    public void close() {
        try {
            lock.release();
            channel.close();
        } catch (IOException ignored) {
            // the lock goes with the channel in any case
        }
    }
}
