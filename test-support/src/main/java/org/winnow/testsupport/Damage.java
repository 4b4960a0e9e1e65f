package org.winnow.testsupport;

import java.io.ByteArrayOutputStream;
import java.util.random.RandomGenerator;

/**
 * Seeded small damage to a well-formed file, as the fuzz tests of the readers apply it: one to
 * {@code maxEdits} edits, each at a random place one of: delete a unit, insert a token, flip a bit, cut
 * the rest off, or replace a run of up to {@code maxSpan} units by a token. The random draws come in a
 * fixed order, so a seed names one damaged input for good (the fuzz figures in the docs rest on it).
 */
public final class Damage {
    private Damage() {}

    /** Damaged bytes: bit flips among all 8 bits, so that bytes that are not UTF-8 occur. */
    public static byte[] bytes(byte[] seed, RandomGenerator rnd, byte[][] tokens, int maxEdits, int maxSpan) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        byte[] b = seed;
        int edits = 1 + rnd.nextInt(maxEdits);
        for (int e = 0; e < edits && b.length > 0; e++) {
            int at = rnd.nextInt(b.length);
            out.reset();
            switch (rnd.nextInt(5)) {
                case 0 -> {
                    out.write(b, 0, at);
                    out.write(b, at + 1, b.length - at - 1);
                }
                case 1 -> {
                    out.write(b, 0, at);
                    out.writeBytes(tokens[rnd.nextInt(tokens.length)]);
                    out.write(b, at, b.length - at);
                }
                case 2 -> {
                    byte[] c = b.clone();
                    c[at] ^= (byte) (1 << rnd.nextInt(8));
                    out.writeBytes(c);
                }
                case 3 -> out.write(b, 0, at);
                default -> {
                    int end = Math.min(b.length, at + 1 + rnd.nextInt(maxSpan));
                    out.write(b, 0, at);
                    out.writeBytes(tokens[rnd.nextInt(tokens.length)]);
                    out.write(b, end, b.length - end);
                }
            }
            b = out.toByteArray();
        }
        return b;
    }

    /** Damaged text: bit flips among the low 7 bits of a character, so the text stays ASCII where it was. */
    public static String text(String seed, RandomGenerator rnd, String[] tokens, int maxEdits, int maxSpan) {
        StringBuilder sb = new StringBuilder(seed);
        int edits = 1 + rnd.nextInt(maxEdits);
        for (int e = 0; e < edits && sb.length() > 0; e++) {
            int at = rnd.nextInt(sb.length());
            switch (rnd.nextInt(5)) {
                case 0 -> sb.deleteCharAt(at);
                case 1 -> sb.insert(at, tokens[rnd.nextInt(tokens.length)]);
                case 2 -> sb.setCharAt(at, (char) (sb.charAt(at) ^ (1 << rnd.nextInt(7))));
                case 3 -> sb.setLength(at);
                default -> {
                    int end = Math.min(sb.length(), at + 1 + rnd.nextInt(maxSpan));
                    sb.replace(at, end, tokens[rnd.nextInt(tokens.length)]);
                }
            }
        }
        return sb.toString();
    }
}
