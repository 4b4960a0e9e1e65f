package org.winnow.pipeline;

import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;

/**
 * The dedup key of a candidate: its canonical text while that is short, otherwise a 128-bit hash of
 * it. Long texts are hashed so that keys stay small in memory and on the wire; 128 bits make an
 * accidental collision negligible even across billions of candidates.
 */
public final class CandidateKeys {
    /** Canonical texts up to this many characters are their own key. */
    public static final int MAX_PLAIN_LENGTH = 64;
    /** Prefix of a hashed key; never the start of a configuration text, so the two kinds never collide. */
    public static final String HASH_PREFIX = "#";

    private static final char[] HEX = "0123456789abcdef".toCharArray();

    private CandidateKeys() {}

    /** The key of the canonical text {@code canonicalText}. */
    public static String of(String canonicalText) {
        if (canonicalText.length() <= MAX_PLAIN_LENGTH) {
            return canonicalText;
        }
        byte[] digest = sha256(canonicalText.getBytes(StandardCharsets.UTF_8));
        char[] out = new char[HASH_PREFIX.length() + 32];
        HASH_PREFIX.getChars(0, HASH_PREFIX.length(), out, 0);
        for (int i = 0; i < 16; i++) {
            out[HASH_PREFIX.length() + 2 * i] = HEX[(digest[i] >> 4) & 0xf];
            out[HASH_PREFIX.length() + 2 * i + 1] = HEX[digest[i] & 0xf];
        }
        return new String(out);
    }

    private static byte[] sha256(byte[] bytes) {
        try {
            return MessageDigest.getInstance("SHA-256").digest(bytes);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }
}
