package org.winnow.app.cli;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.util.Set;

/**
 * Whether standard input can be read as the user's input. When a process starts with descriptor 0
 * closed ({@code <&-}), the first file the JVM opens itself is given descriptor 0, and reading "standard
 * input" reads that file (a jar or the runtime's module image): a million error lines, then a crash. On
 * Linux the descriptor's target is visible under {@code /proc/self/fd}; elsewhere nothing is checked.
 */
public final class StandardInput {
    private StandardInput() {}

    /** Null when standard input looks usable, else why not, in a few words. */
    public static String problem() {
        Path fds = Path.of("/proc/self/fd");
        if (!Files.isDirectory(fds)) {
            return null;
        }
        Path zero = fds.resolve("0");
        if (!Files.exists(zero, LinkOption.NOFOLLOW_LINKS)) {
            return "standard input is closed; give a file, or pipe the configurations in";
        }
        String target;
        try {
            target = Files.readSymbolicLink(zero).toString();
        } catch (IOException | UnsupportedOperationException e) {
            return null;
        }
        if (opensItself(target, fds)) {
            return "standard input is closed (descriptor 0 is " + target + ", which this program opened itself); "
                    + "give a file, or pipe the configurations in";
        }
        return null;
    }

    /** True iff {@code target} is a file of the Java runtime or class path, or open on another descriptor too. */
    private static boolean opensItself(String target, Path fds) {
        if (!target.startsWith("/")) {
            return false; // pipe:[...], socket:[...], anon_inode: a real input
        }
        String javaHome = System.getProperty("java.home", "");
        if (!javaHome.isEmpty() && target.startsWith(javaHome)) {
            return true;
        }
        for (String entry : System.getProperty("java.class.path", "").split(java.io.File.pathSeparator)) {
            if (!entry.isEmpty() && Path.of(entry).toAbsolutePath().normalize().toString().equals(target)) {
                return true;
            }
        }
        if (target.endsWith(".jar") || target.endsWith("/lib/modules")) {
            return true;
        }
        Set<String> skip = Set.of("0", "1", "2");
        try (var entries = Files.list(fds)) {
            for (Path fd : (Iterable<Path>) entries::iterator) {
                if (skip.contains(fd.getFileName().toString())) {
                    continue;
                }
                try {
                    if (Files.readSymbolicLink(fd).toString().equals(target)) {
                        return true;
                    }
                } catch (IOException | UnsupportedOperationException e) {
                    // The descriptor closed while listing; it tells nothing.
                }
            }
        } catch (IOException e) {
            return false;
        }
        return false;
    }
}
