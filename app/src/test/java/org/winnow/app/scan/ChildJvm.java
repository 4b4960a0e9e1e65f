package org.winnow.app.scan;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Starts {@code winnow} as a child JVM on this test's own class path, the way a user's shell runs the
 * jar, so a test can kill it for real ({@link Process#destroyForcibly()} is SIGKILL on Linux).
 */
final class ChildJvm {
    private ChildJvm() {}

    /** A process builder for {@code java [jvmOptions] org.winnow.app.cli.WinnowCli args}, output to {@code log}. */
    static ProcessBuilder winnow(Path log, List<String> jvmOptions, List<String> args) {
        return java(log, jvmOptions, "org.winnow.app.cli.WinnowCli", args);
    }

    /** A process builder for {@code java [jvmOptions] mainClass args} on this test's class path, output to {@code log}. */
    static ProcessBuilder java(Path log, List<String> jvmOptions, String mainClass, List<String> args) {
        List<String> cmd = new ArrayList<>();
        cmd.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        cmd.addAll(jvmOptions);
        cmd.add("-cp");
        // Surefire names the real test class path here; java.class.path may be its one-jar launcher.
        cmd.add(System.getProperty("surefire.test.class.path", System.getProperty("java.class.path")));
        cmd.add(mainClass);
        cmd.addAll(args);
        return new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(log.toFile());
    }

    /** Runs to the end and returns the exit code. */
    static int run(Path log, List<String> jvmOptions, List<String> args) throws IOException, InterruptedException {
        return winnow(log, jvmOptions, args).start().waitFor();
    }
}
