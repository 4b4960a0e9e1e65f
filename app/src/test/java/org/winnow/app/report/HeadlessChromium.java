package org.winnow.app.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.fail;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;

/**
 * Debian's headless Chromium, run as a separate process on a local file: each call gets a fresh
 * profile directory and every network-facing feature is switched off, so a page that tried to load
 * something from outside would simply not get it.
 */
final class HeadlessChromium {
    private static final long TIMEOUT_SECONDS = 120;

    private final Path executable;
    private final Path scratch;

    private HeadlessChromium(Path executable, Path scratch) {
        this.executable = executable;
        this.scratch = scratch;
    }

    /** The browser, if one is installed ({@code /usr/bin/chromium} or {@code chromium} on the PATH). */
    static Optional<HeadlessChromium> find(Path scratch) {
        List<Path> candidates = new ArrayList<>(List.of(Path.of("/usr/bin/chromium")));
        String path = System.getenv("PATH");
        if (path != null) {
            for (String d : path.split(java.io.File.pathSeparator)) {
                if (!d.isEmpty()) {
                    candidates.add(Path.of(d, "chromium"));
                }
            }
        }
        return candidates.stream().filter(Files::isExecutable).findFirst().map(p -> new HeadlessChromium(p, scratch));
    }

    /** The DOM after the page's scripts ran (and its load event fired). */
    String dumpDom(Path html) throws IOException, InterruptedException {
        return run(html, "--dump-dom");
    }

    /** Writes a PNG screenshot of the page's first {@code width x height} pixels. */
    void screenshot(Path html, Path png, int width, int height) throws IOException, InterruptedException {
        run(html, "--screenshot=" + png.toAbsolutePath(), "--window-size=" + width + "," + height,
                "--hide-scrollbars");
    }

    private String run(Path html, String... extra) throws IOException, InterruptedException {
        Path profile = Files.createTempDirectory(scratch, "chromium-profile");
        Path out = Files.createTempFile(scratch, "chromium", ".out");
        Path err = Files.createTempFile(scratch, "chromium", ".err");
        List<String> cmd = new ArrayList<>(List.of(executable.toString(), "--headless", "--no-sandbox", "--disable-gpu",
                "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update",
                "--disable-sync", "--user-data-dir=" + profile));
        cmd.addAll(List.of(extra));
        cmd.add(html.toAbsolutePath().toUri().toString());
        Process p = new ProcessBuilder(cmd).redirectOutput(out.toFile()).redirectError(err.toFile()).start();
        if (!p.waitFor(TIMEOUT_SECONDS, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            fail("chromium did not finish within " + TIMEOUT_SECONDS + " s on " + html);
        }
        assertEquals(0, p.exitValue(), () -> "chromium failed on " + html + ": " + tail(err));
        return Files.readString(out, StandardCharsets.UTF_8);
    }

    private static String tail(Path f) {
        try {
            String s = Files.readString(f, StandardCharsets.UTF_8);
            return s.length() > 2000 ? s.substring(s.length() - 2000) : s;
        } catch (IOException e) {
            return "(no stderr: " + e.getMessage() + ")";
        }
    }
}
