package org.winnow.bench;

import java.util.concurrent.TimeUnit;

/** Finds a python3 that can import numpy: the one on PATH first (it may be a pyenv one), then Debian's. */
final class PythonWithNumpy {
    private PythonWithNumpy() {}

    static String find() {
        for (String candidate : new String[] {"python3", "/usr/bin/python3"}) {
            try {
                Process p = new ProcessBuilder(candidate, "-c", "import numpy").redirectErrorStream(true)
                        .redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
                if (p.waitFor(60, TimeUnit.SECONDS) && p.exitValue() == 0) {
                    return candidate;
                }
                p.destroyForcibly();
            } catch (java.io.IOException e) {
                // not installed under this name; try the next
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return null;
            }
        }
        return null;
    }
}
