package org.winnow.app.scan;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.winnow.app.cli.Exit;
import org.winnow.sink.Manifest;
import org.winnow.sink.ScanCheck;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code winnow verify DIR}: rechecks a scan directory against what the scan recorded, reading every
 * committed part. Changes nothing; a scan that is running is refused.
 */
@Command(name = "verify", mixinStandardHelpOptions = true,
        description = {"Recheck a scan directory against the lengths and SHA-256 digests its scan recorded.",
            "Reads every committed survivors and rejects part, compares the manifest with the checkpoint, and "
                    + "looks for files named like parts that neither records. Prints one line: what was checked, or "
                    + "the first file that differs (exit 2). Changes nothing."})
public final class VerifyCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "DIR", description = "The --out directory of a scan.")
    Path dir;

    @Override
    public Integer call() {
        PrintWriter err = spec.commandLine().getErr();
        ScanCheck.Result r;
        try {
            r = ScanCheck.full(dir);
        } catch (IOException e) {
            return Exit.badInput(err, "verify", e.getMessage());
        }
        Manifest m = r.manifest();
        PrintWriter out = spec.commandLine().getOut();
        out.printf(Locale.ROOT, "verify %s: ok, scan %s %s: %d parts, %d bytes, %d lines match their records; "
                + "%d scored, %d kept%n", dir, m.runId(), m.complete() ? "complete" : "incomplete (rerun to continue)",
                r.parts(), r.bytes(), r.lines(), m.counts().scored(), m.counts().kept());
        out.flush();
        return Exit.OK;
    }
}
