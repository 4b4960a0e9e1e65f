package org.winnow.kafka;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.Objects;
import org.apache.kafka.common.header.Header;
import org.apache.kafka.common.header.Headers;

/**
 * Stamps each record with the run it belongs to and, for scored records, the model that scored it, and
 * checks those stamps on the way in. Topic names already separate runs; the stamps catch a stage that
 * writes to a topic by another route (a copied topic, a hand-set name) before its records are counted.
 *
 * <p>The model stamp is the first 8 bytes of the model's SHA-256 rather than all 32: it only has to tell
 * apart the few models that could meet in one run, and it is paid on every record.
 */
public final class WireHeaders {
    public static final String RUN = "wr";
    public static final String MODEL = "wm";
    /** Bytes of the model checksum carried on each scored record. */
    public static final int MODEL_STAMP_BYTES = 8;

    private final String runId;
    private final byte[] run;
    private final byte[] model;

    private WireHeaders(String runId, byte[] model) {
        this.runId = runId;
        this.run = runId.getBytes(StandardCharsets.UTF_8);
        this.model = model;
    }

    /** Stamps for records of {@code run} that carry no model (candidates, plan, metrics). */
    public static WireHeaders forRun(RunTopics run) {
        return new WireHeaders(run.runId(), null);
    }

    /** Stamps for records of {@code run} scored by the model whose SHA-256 is {@code modelChecksumHex}. */
    public static WireHeaders forRunAndModel(RunTopics run, String modelChecksumHex) {
        return new WireHeaders(run.runId(), modelStamp(modelChecksumHex));
    }

    /** Adds this run's (and model's) stamps to {@code headers}. */
    public Headers stamp(Headers headers) {
        headers.add(RUN, run);
        if (model != null) {
            headers.add(MODEL, model);
        }
        return headers;
    }

    /**
     * Refuses a record that is not stamped with this run (and, when this carries a model, this model).
     *
     * @param where names the record for the message, e.g. {@code topic-partition@offset}
     */
    public void check(Headers headers, String where) {
        Header r = headers.lastHeader(RUN);
        if (r == null) {
            throw new ClusterRefusedException("record " + where + " carries no run stamp: it was not written by"
                    + " a winnow stage of run " + runId);
        }
        if (!Arrays.equals(r.value(), run)) {
            throw new ClusterRefusedException("record " + where + " belongs to run '"
                    + new String(r.value(), StandardCharsets.UTF_8) + "', not to run '" + runId + "'");
        }
        if (model != null) {
            Header m = headers.lastHeader(MODEL);
            if (m == null || !Arrays.equals(m.value(), model)) {
                throw new ClusterRefusedException("record " + where + " was scored with model "
                        + (m == null ? "(none)" : hex(m.value()) + "...") + ", not with this run's model "
                        + hex(model) + "...");
            }
        }
    }

    /** The run id these stamps name. */
    public String runId() {
        return runId;
    }

    static byte[] modelStamp(String checksumHex) {
        Objects.requireNonNull(checksumHex, "model checksum");
        String hex = checksumHex.trim().toLowerCase(java.util.Locale.ROOT);
        if (hex.length() < 2 * MODEL_STAMP_BYTES || !hex.chars().allMatch(c -> Character.digit(c, 16) >= 0)) {
            throw new IllegalArgumentException("model checksum must be hexadecimal, at least "
                    + 2 * MODEL_STAMP_BYTES + " digits: '" + checksumHex + "'");
        }
        byte[] stamp = new byte[MODEL_STAMP_BYTES];
        for (int i = 0; i < MODEL_STAMP_BYTES; i++) {
            stamp[i] = (byte) Integer.parseInt(hex.substring(2 * i, 2 * i + 2), 16);
        }
        return stamp;
    }

    private static String hex(byte[] bytes) {
        StringBuilder sb = new StringBuilder();
        for (byte b : bytes) {
            sb.append(String.format("%02x", b));
        }
        return sb.toString();
    }
}
