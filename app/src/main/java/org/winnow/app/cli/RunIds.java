package org.winnow.app.cli;

import java.io.IOException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.HexFormat;
import java.util.List;

/**
 * The identity of a scan: a hash of everything that decides its output (the source and, for a file,
 * its bytes; the keep rules; the model; the file options). Two runs with the same identity produce the
 * same files, which is what lets a rerun continue in the same directory, and what lets the sink refuse
 * a directory that holds a different scan.
 */
public final class RunIds {
    private RunIds() {}

    /** A 16-hex-digit run id over {@code parts} and, when given, the bytes of {@code file}. */
    public static String of(List<String> parts, Path file) throws IOException {
        MessageDigest md = sha256();
        for (String p : parts) {
            md.update(p.getBytes(StandardCharsets.UTF_8));
            md.update((byte) 0);
        }
        if (file != null) {
            byte[] buf = new byte[1 << 16];
            try (InputStream in = Files.newInputStream(file)) {
                for (int n = in.read(buf); n >= 0; n = in.read(buf)) {
                    md.update(buf, 0, n);
                }
            }
        }
        return HexFormat.of().formatHex(md.digest(), 0, 8);
    }

    private static MessageDigest sha256() {
        try {
            return MessageDigest.getInstance("SHA-256");
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
