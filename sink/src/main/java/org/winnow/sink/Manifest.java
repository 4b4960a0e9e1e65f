package org.winnow.sink;

import java.time.Instant;
import java.util.List;
import java.util.Map;
import org.winnow.pipeline.BadInput;

/**
 * {@code manifest.json}: what a scan was and what it found. Rewritten at every checkpoint with
 * {@code complete = false}, and once more with {@code complete = true} when the scan has finished.
 *
 * @param formatVersion {@link ScanFiles#FORMAT_VERSION}
 * @param runId         the scan's identity
 * @param complete      true iff every candidate of the source has been scored and committed
 * @param source        the bounds or the input file, in one line
 * @param bounds        the bounds as given, or null for an input file
 * @param rules         the keep rules, one a line
 * @param modelChecksum the frozen model's checksum
 * @param counts        the counts, which reconcile (see {@link Counts})
 * @param badInputLines the first unusable input lines, with line numbers
 * @param timings       wall-clock facts
 * @param survivorFiles committed survivor files, in order
 * @param rejectFiles   committed reject files, in order (empty unless asked for)
 * @param sealedParts   length, lines and SHA-256 of every file in {@code survivorFiles} and
 *                      {@code rejectFiles}, survivors first; what a reader checks the files against
 * @param modelFile     the model file the scan read (absolute path), or null; its checksum must still be
 *                      {@code modelChecksum} for a reader to use it
 * @param proofs        what the opt-in proof step did, per outcome code ({@code settled}, {@code unsettled},
 *                      {@code out-of-time}); empty when it is off. Counted from the records the sink
 *                      receives, so in a cluster run with slim rejects only the kept candidates' proofs
 *                      (the scorers' metrics count them all)
 */
public record Manifest(int formatVersion, String runId, boolean complete, String source, Object bounds,
        List<String> rules, String modelChecksum, Counts counts, List<BadInput> badInputLines, Timings timings,
        List<String> survivorFiles, List<String> rejectFiles, List<SealedPart> sealedParts, String modelFile,
        Map<String, Long> proofs) {
    public Manifest {
        proofs = proofs == null ? Map.of() : proofs;
    }

    /**
     * Counts. They reconcile: {@code enumerated = duplicates + candidates}, {@code scored = rejected + kept},
     * {@code rejected} and {@code kept} are the sums of their maps, {@code survivorLines = kept}, and when
     * complete {@code scored = candidates}. Bad input lines are not part of {@code enumerated}.
     *
     * @param enumerated        usable items the source produced (this session counts the whole source)
     * @param duplicates        items whose key was seen before
     * @param candidates        distinct candidates, each given a seq
     * @param badInput          unusable input lines
     * @param scored            candidates with a committed verdict
     * @param rejected          of them rejected
     * @param kept              of them kept
     * @param rejectedByReason  rejections per reason code, every reject reason listed
     * @param keptByReason      keeps per reason code, every keep reason listed
     * @param survivorLines     lines in the survivor files
     */
    public record Counts(long enumerated, long duplicates, long candidates, long badInput, long scored, long rejected,
            long kept, Map<String, Long> rejectedByReason, Map<String, Long> keptByReason, long survivorLines) {}

    /**
     * @param startedAt           start of the first session
     * @param updatedAt           when this manifest was written
     * @param elapsedSeconds      wall time of all sessions so far
     * @param sessions            sessions that worked on the scan
     * @param candidatesPerSecond scored candidates per second of this session
     */
    public record Timings(Instant startedAt, Instant updatedAt, double elapsedSeconds, int sessions,
            double candidatesPerSecond) {}

    /**
     * Reads a manifest and checks its structure ({@link #check}).
     *
     * @throws java.io.IOException with a one-line message naming the file when it cannot be read, is not
     *     a manifest of this format, or a field is missing or out of range
     */
    public static Manifest read(java.nio.file.Path file) throws java.io.IOException {
        ScanFiles.requireRegularFile(file, "manifest");
        return parse(java.nio.file.Files.readAllBytes(file), file);
    }

    /** {@link #read} on bytes already read; {@code file} names them in messages. */
    static Manifest parse(byte[] bytes, java.nio.file.Path file) throws ScanDamagedException {
        Manifest m = ScanFiles.parseJson(bytes, file, Manifest.class, "manifest");
        m.check(file);
        return m;
    }

    /**
     * Checks the fields a reader relies on: present, in range, and the counts reconciling as documented
     * in {@link Counts}; every listed file has its record in {@code sealedParts}.
     */
    public void check(java.nio.file.Path file) throws ScanDamagedException {
        String at = file + ": ";
        require(formatVersion == ScanFiles.FORMAT_VERSION,
                at + "manifest format " + formatVersion + ", this version reads " + ScanFiles.FORMAT_VERSION);
        require(runId != null && !runId.isBlank(), at + "runId is missing");
        require(source != null, at + "source is missing");
        require(rules != null && modelChecksum != null, at + "rules or modelChecksum is missing");
        require(counts != null, at + "counts is missing");
        Checkpoint.requireProofCounts(proofs, at);
        require(counts.rejectedByReason() != null && counts.keptByReason() != null,
                at + "counts.rejectedByReason or counts.keptByReason is missing");
        require(counts.enumerated() >= 0 && counts.duplicates() >= 0 && counts.candidates() >= 0
                && counts.badInput() >= 0 && counts.scored() >= 0 && counts.rejected() >= 0 && counts.kept() >= 0
                && counts.survivorLines() >= 0, at + "a count is negative");
        require(counts.scored() == counts.rejected() + counts.kept(), at + "counts.scored " + counts.scored()
                + " is not rejected + kept = " + (counts.rejected() + counts.kept()));
        require(counts.survivorLines() == counts.kept(), at + "counts.survivorLines " + counts.survivorLines()
                + " differs from counts.kept " + counts.kept());
        require(!complete || counts.scored() == counts.candidates(), at + "complete, but counts.scored "
                + counts.scored() + " differs from counts.candidates " + counts.candidates());
        require(timings != null, at + "timings is missing");
        require(survivorFiles != null && rejectFiles != null && sealedParts != null,
                at + "survivorFiles, rejectFiles or sealedParts is missing");
        require(sealedParts.size() == survivorFiles.size() + rejectFiles.size(), at + "sealedParts has "
                + sealedParts.size() + " records for " + (survivorFiles.size() + rejectFiles.size()) + " files");
        long lines = 0;
        for (int i = 0; i < sealedParts.size(); i++) {
            SealedPart p = sealedParts.get(i);
            String name = i < survivorFiles.size() ? survivorFiles.get(i) : rejectFiles.get(i - survivorFiles.size());
            require(p != null && name != null && name.equals(p.name()) && p.bytes() > 0 && p.lines() > 0
                    && Checkpoint.isSha256(p.sha256()), at + "sealedParts[" + i + "] is not a valid record of " + name);
            require(!name.contains("/") && !name.contains("\\") && !name.startsWith("."),
                    at + "a listed file name is not a plain name in the directory: " + name);
            if (i < survivorFiles.size()) {
                lines += p.lines();
            }
        }
        require(!complete || lines == counts.survivorLines(), at + "complete, but its survivor files hold "
                + lines + " lines and counts.survivorLines is " + counts.survivorLines());
    }

    private static void require(boolean ok, String message) throws ScanDamagedException {
        if (!ok) {
            throw new ScanDamagedException(message);
        }
    }
}
