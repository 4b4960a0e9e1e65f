package org.winnow.sink;

import java.nio.file.Path;
import java.time.Instant;
import java.util.Map;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Verdict;

/**
 * The last committed point of a scan directory, written atomically as {@code checkpoint.json}.
 *
 * @param formatVersion  {@link ScanFiles#FORMAT_VERSION}
 * @param runId          the scan it belongs to; a rerun with other inputs is refused
 * @param nextSeq        every seq below this is accounted for in the files and counts
 * @param counts         records per reason code
 * @param survivors      the survivors series
 * @param rejects        the rejects series (empty when not written)
 * @param startedAt      when the first session of the scan started
 * @param elapsedSeconds wall time of all earlier sessions up to their last checkpoint
 * @param sessions       how many sessions have committed work to the scan, this one included
 * @param proofs         what the opt-in proof step did, per outcome code ({@link Proof#code()}); empty when off
 */
public record Checkpoint(int formatVersion, String runId, long nextSeq, Map<String, Long> counts, PartState survivors,
        PartState rejects, Instant startedAt, double elapsedSeconds, int sessions, Map<String, Long> proofs) {
    public Checkpoint {
        proofs = proofs == null ? Map.of() : proofs;
    }

    /**
     * Reads {@code checkpoint.json} and checks it: its own checksum, its format version and every field
     * ({@link #check}).
     *
     * @throws java.io.IOException with one line naming the file when anything is wrong
     */
    public static Checkpoint read(Path file) throws java.io.IOException {
        ScanFiles.requireRegularFile(file, "checkpoint");
        return parse(java.nio.file.Files.readAllBytes(file), file);
    }

    /** {@link #read} on bytes already read; {@code file} names them in messages. */
    static Checkpoint parse(byte[] bytes, Path file) throws ScanDamagedException {
        Checkpoint cp = ScanFiles.parseJson(bytes, file, Checkpoint.class, "checkpoint");
        if (cp.formatVersion() != ScanFiles.FORMAT_VERSION) {
            throw new ScanDamagedException(file + ": checkpoint format " + cp.formatVersion()
                    + ", this version reads " + ScanFiles.FORMAT_VERSION);
        }
        cp.check(file);
        return cp;
    }

    /**
     * Checks every field of a checkpoint read from {@code file}, and that they agree with each other:
     * the counts add up to {@code nextSeq}, the survivor lines to the kept count, the reject lines to
     * none or the rejected count, each series' parts to its lines. A hand-edited or damaged checkpoint
     * is refused here, before anything in the directory is touched.
     *
     * @throws ScanDamagedException naming the file and the first field that is wrong
     */
    public void check(Path file) throws ScanDamagedException {
        String at = file + ": ";
        require(runId != null && runId.matches("[0-9a-zA-Z_-]+"), at + "runId is missing or malformed: " + runId);
        require(nextSeq >= 0, at + "nextSeq must be at least 0, found " + nextSeq);
        require(counts != null, at + "counts is missing");
        requireProofCounts(proofs, at);
        long all = 0;
        long kept = 0;
        long rejected = 0;
        try {
            for (Map.Entry<String, Long> e : counts.entrySet()) {
                Reason reason;
                try {
                    reason = Reason.ofCode(e.getKey());
                } catch (IllegalArgumentException x) {
                    throw new ScanDamagedException(at + "counts names an unknown reason '" + e.getKey() + "'");
                }
                Long n = e.getValue();
                require(n != null && n >= 0, at + "counts." + e.getKey() + " must be at least 0, found " + n);
                all = Math.addExact(all, n);
                if (reason.verdict() == Verdict.KEEP) {
                    kept = Math.addExact(kept, n);
                } else {
                    rejected = Math.addExact(rejected, n);
                }
            }
        } catch (ArithmeticException e) {
            throw new ScanDamagedException(at + "counts overflow a 64-bit total");
        }
        require(all == nextSeq, at + "counts add up to " + all + " but nextSeq is " + nextSeq);
        checkSeries(at, "survivors", survivors, ScanFiles.SURVIVORS);
        checkSeries(at, "rejects", rejects, ScanFiles.REJECTS);
        require(survivors.totalLines() == kept,
                at + "survivors.totalLines is " + survivors.totalLines() + " but the kept counts add up to " + kept);
        require(rejects.totalLines() == 0 || rejects.totalLines() == rejected, at + "rejects.totalLines is "
                + rejects.totalLines() + " but the rejected counts add up to " + rejected);
        require(startedAt != null, at + "startedAt is missing");
        require(Double.isFinite(elapsedSeconds) && elapsedSeconds >= 0,
                at + "elapsedSeconds must be a finite number at least 0, found " + elapsedSeconds);
        require(sessions >= 1, at + "sessions must be at least 1, found " + sessions);
    }

    private static void checkSeries(String at, String field, PartState s, String prefix) throws ScanDamagedException {
        require(s != null, at + field + " is missing");
        require(s.sealed() >= 0, at + field + ".sealed must be at least 0, found " + s.sealed());
        require(s.parts() != null && s.parts().size() == s.sealed(), at + field + ".parts must list the "
                + s.sealed() + " sealed parts, found " + (s.parts() == null ? "none" : s.parts().size()));
        require(s.openBytes() >= 0 && s.openLines() >= 0 && s.totalLines() >= 0,
                at + field + ": openBytes, openLines and totalLines must be at least 0");
        require((s.openBytes() == 0) == (s.openLines() == 0),
                at + field + ": openBytes " + s.openBytes() + " and openLines " + s.openLines() + " disagree");
        require(s.openSha256() != null && (s.openBytes() == 0 ? s.openSha256().isEmpty() : isSha256(s.openSha256())),
                at + field + ".openSha256 is missing or malformed: " + s.openSha256());
        long lines = s.openLines();
        try {
            for (int i = 0; i < s.sealed(); i++) {
                SealedPart p = s.parts().get(i);
                String name = ScanFiles.committedName(prefix, i + 1);
                require(p != null && name.equals(p.name()), at + field + ".parts[" + i + "] must be " + name);
                require(p.bytes() > 0 && p.lines() > 0 && isSha256(p.sha256()),
                        at + field + ".parts[" + i + "] (" + name + ") needs positive bytes and lines and a SHA-256");
                lines = Math.addExact(lines, p.lines());
            }
        } catch (ArithmeticException e) {
            throw new ScanDamagedException(at + field + ": line counts overflow a 64-bit total");
        }
        require(lines == s.totalLines(), at + field + ".totalLines is " + s.totalLines()
                + " but the parts and the open part hold " + lines);
    }

    static boolean isSha256(String s) {
        return s != null && s.matches("[0-9a-f]{64}");
    }

    private static void require(boolean ok, String message) throws ScanDamagedException {
        if (!ok) {
            throw new ScanDamagedException(message);
        }
    }

    /** Every key a proof outcome's code, every count at least 0. */
    static void requireProofCounts(Map<String, Long> proofs, String at) throws ScanDamagedException {
        for (Map.Entry<String, Long> e : proofs.entrySet()) {
            boolean known = false;
            for (Proof p : Proof.values()) {
                known |= p != Proof.NOT_ATTEMPTED && p.code().equals(e.getKey());
            }
            if (!known) {
                throw new ScanDamagedException(at + "proofs names an unknown outcome '" + e.getKey() + "'");
            }
            if (e.getValue() == null || e.getValue() < 0) {
                throw new ScanDamagedException(at + "proofs." + e.getKey() + " must be at least 0, found " + e.getValue());
            }
        }
    }
}
