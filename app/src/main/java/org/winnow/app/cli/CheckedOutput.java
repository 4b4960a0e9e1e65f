package org.winnow.app.cli;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.channels.Channels;
import java.nio.channels.FileChannel;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;

/**
 * Output that cannot fail silently. {@link PrintStream} and {@link PrintWriter} swallow write errors
 * and only remember them, so a command writing to a full disk or a closed pipe used to exit 0 with its
 * output cut; {@link #exitCode} looks at that memory after the command, and {@link #replace} writes a
 * named file through a temporary name so that a failed write never leaves a partial file under it.
 */
public final class CheckedOutput {
    /** The one line printed when standard output could not be written. */
    public static final String STDOUT_FAILED = "winnow: cannot write standard output (disk full, closed pipe or "
            + "device error); what was printed is incomplete";

    private CheckedOutput() {}

    /**
     * Flushes the command's output and standard output; when either failed at any point of a command
     * that ended with {@link Exit#OK}, prints {@link #STDOUT_FAILED} on {@code stderr} and returns
     * {@link Exit#STOPPED}. A command that failed has said why in its own line already, so its code stands
     * and nothing more is printed.
     */
    public static int exitCode(int code, PrintWriter out, PrintStream stdout, PrintStream stderr) {
        boolean failed = out.checkError() | stdout.checkError();
        if (!failed || code != Exit.OK) {
            return code;
        }
        stderr.println(STDOUT_FAILED);
        stderr.flush();
        return Exit.STOPPED;
    }

    /** True iff writing to {@code out} (and standard output under it) has failed so far; flushes both. */
    public static boolean failed(PrintWriter out) {
        return out.checkError() | System.out.checkError();
    }

    /** What writes a file's content. */
    @FunctionalInterface
    public interface Body {
        void write(Writer w) throws IOException;
    }

    /**
     * Writes {@code target} as UTF-8 through a hidden temporary file beside it, fsyncs, then renames it
     * into place: {@code target} is either its old self or the whole new content, never a part. The
     * temporary file is removed when anything fails.
     */
    public static void replace(Path target, Body body) throws IOException {
        Path abs = target.toAbsolutePath();
        Path dir = abs.getParent();
        if (dir != null) {
            Files.createDirectories(dir);
        }
        Path tmp = abs.resolveSibling("." + abs.getFileName() + ".tmp-" + ProcessHandle.current().pid());
        boolean done = false;
        try {
            try (FileChannel ch = FileChannel.open(tmp, StandardOpenOption.CREATE, StandardOpenOption.WRITE,
                    StandardOpenOption.TRUNCATE_EXISTING);
                    Writer w = new BufferedWriter(new OutputStreamWriter(Channels.newOutputStream(ch),
                            StandardCharsets.UTF_8), 1 << 16)) {
                body.write(w);
                w.flush();
                ch.force(true);
            }
            try {
                Files.move(tmp, abs, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING);
            }
            done = true;
        } finally {
            if (!done) {
                Files.deleteIfExists(tmp);
            }
        }
    }
}
