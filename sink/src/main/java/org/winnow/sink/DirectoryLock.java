package org.winnow.sink;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.channels.OverlappingFileLockException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Clock;

/**
 * An exclusive lock on a scan directory, held by one process from before it reads the checkpoint until
 * it closes the sink. It is an operating-system lock on {@link ScanFiles#LOCK} inside the directory, so
 * it goes away with the process however that ends (a kill -9 included) and needs no stale-lock cleanup;
 * the file stays and says who held it last. A second scan into the same directory is refused in one
 * line naming the holder, instead of racing the first for the same files.
 */
public final class DirectoryLock implements AutoCloseable {
    private final FileChannel channel;
    private final FileLock lock;

    private DirectoryLock(FileChannel channel, FileLock lock) {
        this.channel = channel;
        this.lock = lock;
    }

    /**
     * Takes the lock on {@code dir}, which must exist.
     *
     * @param what what takes it, for the holder line (e.g. "winnow scan")
     * @throws DirectoryInUseException when another process (or another scan in this JVM) holds it
     */
    public static DirectoryLock acquire(Path dir, String what, Clock clock) throws IOException {
        Path file = dir.resolve(ScanFiles.LOCK);
        FileChannel ch;
        try {
            ch = FileChannel.open(file, StandardOpenOption.CREATE, StandardOpenOption.READ, StandardOpenOption.WRITE);
        } catch (IOException e) {
            throw new IOException(dir + ": cannot create the lock file " + ScanFiles.LOCK + " ("
                    + ScanFiles.describe(e) + "); is the directory writable?", e);
        }
        FileLock lock;
        try {
            lock = ch.tryLock();
        } catch (OverlappingFileLockException e) {
            lock = null;
        } catch (IOException e) {
            ch.close();
            throw e;
        }
        if (lock == null) {
            String holder = holder(ch);
            ch.close();
            throw new DirectoryInUseException(dir + ": in use by " + (holder.isEmpty() ? "another process" : holder)
                    + "; wait for it to end, or give another directory");
        }
        try {
            byte[] line = (what + ", process " + ProcessHandle.current().pid() + " on " + host() + ", since "
                    + clock.instant() + "\n").getBytes(StandardCharsets.UTF_8);
            ch.truncate(0);
            ch.write(ByteBuffer.wrap(line), 0);
        } catch (IOException e) {
            // The lock holds without the note; the note only helps the message of a refused second run.
        }
        return new DirectoryLock(ch, lock);
    }

    private static String holder(FileChannel ch) {
        try {
            ByteBuffer buf = ByteBuffer.allocate(300);
            ch.read(buf, 0);
            buf.flip();
            String s = StandardCharsets.UTF_8.decode(buf).toString();
            int nl = s.indexOf('\n');
            return (nl >= 0 ? s.substring(0, nl) : s).strip();
        } catch (IOException e) {
            return "";
        }
    }

    private static String host() {
        // No name lookup: on a host without working DNS it can take seconds.
        String h = System.getenv("HOSTNAME");
        return h == null || h.isBlank() ? "this host" : h;
    }

    /** True iff {@code dir} exists and no process holds its lock now; for readers that want a still directory. */
    public static boolean isFree(Path dir) {
        return holderIfHeld(dir) == null;
    }

    /**
     * Null when no process holds the lock of {@code dir} now, else who holds it as its note says ("another
     * process" without a note); for readers that want a still directory and a refusal that names the holder.
     */
    public static String holderIfHeld(Path dir) {
        Path file = dir.resolve(ScanFiles.LOCK);
        if (!Files.exists(file)) {
            return null;
        }
        try (FileChannel ch = FileChannel.open(file, StandardOpenOption.READ, StandardOpenOption.WRITE)) {
            FileLock l;
            try {
                l = ch.tryLock();
            } catch (OverlappingFileLockException e) {
                l = null;
            }
            if (l == null) {
                String holder = holder(ch);
                return holder.isEmpty() ? "another process" : holder;
            }
            l.release();
            return null;
        } catch (IOException e) {
            return null;
        }
    }

    /** Releases the lock; the file stays. */
    @Override
    public void close() throws IOException {
        try {
            lock.release();
        } finally {
            channel.close();
        }
    }

    /** The directory is locked by someone else; the message names the holder. */
    public static final class DirectoryInUseException extends IOException {
        private static final long serialVersionUID = 1L;

        DirectoryInUseException(String message) {
            super(message);
        }
    }
}
