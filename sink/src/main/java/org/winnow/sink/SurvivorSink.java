package org.winnow.sink;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.time.Duration;
import java.time.Instant;
import java.nio.file.LinkOption;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.function.Supplier;
import org.winnow.geometry.Checks;
import org.winnow.pipeline.Proof;
import org.winnow.pipeline.Reason;
import org.winnow.pipeline.Scored;
import org.winnow.pipeline.SourceReport;
import org.winnow.pipeline.Stage;
import org.winnow.pipeline.StageContext;
import org.winnow.pipeline.Verdict;
import org.winnow.pipeline.metrics.SinkMetrics;

/**
 * The sink stage of a one-process scan; see the package documentation for how a rerun continues.
 *
 * <p>{@link #open(Path, ScanInfo, SinkOptions, Clock, Supplier, CrashHook)} prepares the directory on
 * the calling thread and tells where to resume; the stage methods then run on the sink thread and
 * must see every seq from {@link #resumeFrom()} on, in order.
 */
public final class SurvivorSink implements Stage<Scored, Void> {
    private final Path dir;
    private final ScanInfo info;
    private final SinkOptions options;
    private final Clock clock;
    private final Supplier<SourceReport> source;
    private final CrashHook hook;
    private final Checkpoint start;
    private final Instant sessionStart;
    private final Map<Reason, Long> counts = new EnumMap<>(Reason.class);
    private final Map<String, Long> proofs = new java.util.TreeMap<>();
    private final PartSeries survivors;
    private final PartSeries rejects;
    private final DirectoryLock lock;
    private SinkMetrics metrics;
    private long nextSeq;
    private long sinceCheckpoint;
    private Instant lastCheckpoint;

    private SurvivorSink(Path dir, ScanInfo info, SinkOptions options, Clock clock, Supplier<SourceReport> source,
            CrashHook hook, Checkpoint start, DirectoryLock lock) throws IOException {
        this.dir = dir;
        this.lock = lock;
        this.info = info;
        this.options = options;
        this.clock = clock;
        this.source = source;
        this.hook = hook;
        this.start = start;
        this.sessionStart = clock.instant();
        this.lastCheckpoint = sessionStart;
        this.nextSeq = start.nextSeq();
        for (Reason r : Reason.values()) {
            counts.put(r, start.counts().getOrDefault(r.code(), 0L));
        }
        proofs.putAll(start.proofs());
        String format = "format " + ScanFiles.FORMAT_VERSION + ", run " + info.runId();
        this.survivors = new PartSeries(dir, ScanFiles.SURVIVORS, options.linesPerFile(),
                p -> "# winnow survivors, " + format + ", part " + p + "\n" + SurvivorLine.COLUMNS + "\n",
                start.survivors(), hook);
        try {
            this.rejects = new PartSeries(dir, ScanFiles.REJECTS, options.linesPerFile(),
                    p -> "# winnow rejects, " + format + ", part " + p + "\n" + RejectLine.COLUMNS + "\n",
                    start.rejects(), hook);
        } catch (IOException | RuntimeException e) {
            survivors.close();
            throw e;
        }
    }

    /**
     * Opens {@code dir} for the scan {@code info}: creates it when missing, continues it when it holds
     * a checkpoint of the same scan, and refuses a directory that holds anything else.
     *
     * @param source the source's counts so far, read at each checkpoint and at the end; null before the
     *               source has started
     */
    public static SurvivorSink open(Path dir, ScanInfo info, SinkOptions options, Clock clock,
            Supplier<SourceReport> source, CrashHook hook) throws IOException {
        Objects.requireNonNull(info, "info");
        if (Files.exists(dir) && !Files.isDirectory(dir)) {
            throw new IOException(dir + ": exists and is not a directory; give a new or empty directory");
        }
        try {
            Files.createDirectories(dir);
        } catch (IOException e) {
            throw new IOException(dir + ": cannot create the scan directory (" + ScanFiles.describe(e) + ")", e);
        }
        DirectoryLock lock = DirectoryLock.acquire(dir, "winnow scan " + info.runId(), clock);
        try {
            return open(dir, info, options, clock, source, hook, lock);
        } catch (IOException | RuntimeException e) {
            lock.close();
            throw e;
        }
    }

    private static SurvivorSink open(Path dir, ScanInfo info, SinkOptions options, Clock clock,
            Supplier<SourceReport> source, CrashHook hook, DirectoryLock lock) throws IOException {
        Path cp = dir.resolve(ScanFiles.CHECKPOINT);
        Path manifest = dir.resolve(ScanFiles.MANIFEST);
        if (Files.exists(manifest, LinkOption.NOFOLLOW_LINKS) && !Files.isRegularFile(manifest, LinkOption.NOFOLLOW_LINKS)) {
            throw new ScanDamagedException(manifest + ": not a regular file; the scan cannot rewrite it");
        }
        Checkpoint start;
        boolean fresh = !Files.exists(cp, LinkOption.NOFOLLOW_LINKS);
        if (!fresh) {
            start = Checkpoint.read(cp);
            if (!start.runId().equals(info.runId())) {
                throw new IOException(dir + ": holds scan " + start.runId() + ", not " + info.runId()
                        + " (other bounds, input, rules, model or file options); use a fresh directory");
            }
            if (!options.writeRejects() && start.rejects().totalLines() > 0) {
                throw new IOException(dir + ": the scan writes rejects; rerun it with the rejects file on");
            }
            start = new Checkpoint(start.formatVersion(), start.runId(), start.nextSeq(), start.counts(),
                    start.survivors(), start.rejects(), start.startedAt(), start.elapsedSeconds(), start.sessions() + 1,
                    start.proofs());
        } else {
            try (var entries = Files.list(dir)) {
                List<String> names = entries.map(p -> p.getFileName().toString())
                        .filter(n -> !n.equals(ScanFiles.LOCK)).sorted().toList();
                if (!names.isEmpty()) {
                    throw new IOException(dir + ": not empty and holds no checkpoint (found " + names.get(0)
                            + "); give an empty or new directory");
                }
            }
            start = new Checkpoint(ScanFiles.FORMAT_VERSION, info.runId(), 0, Map.of(), PartState.EMPTY, PartState.EMPTY,
                    clock.instant(), 0, 1, Map.of());
        }
        SurvivorSink sink = new SurvivorSink(dir, info, options, clock, source, hook, start, lock);
        if (fresh) {
            // Mark the directory as this scan's at once, so that even a run that fails before its first
            // checkpoint leaves a manifest saying it is incomplete, and a rerun recognises the directory.
            sink.writeCheckpoint();
            sink.writeManifest(false);
        }
        return sink;
    }

    /** The first seq this session must receive; everything below was committed before. */
    public long resumeFrom() {
        return start.nextSeq();
    }

    @Override
    public void open(StageContext<Void> ctx) {
        metrics = new SinkMetrics(ctx.registry());
    }

    @Override
    public void accept(Scored s) throws IOException {
        Checks.requireState(s.seq() == nextSeq, "sink expected seq %s but got %s", nextSeq, s.seq());
        if (s.verdict() == Verdict.KEEP) {
            survivors.append(SurvivorLine.format(s));
            metrics.survivorLine();
        } else if (options.writeRejects()) {
            rejects.append(RejectLine.format(s));
        }
        if (s.prediction().proof() != Proof.NOT_ATTEMPTED) {
            proofs.merge(s.prediction().proof().code(), 1L, Long::sum);
        }
        count(s.reason());
    }

    /**
     * Counts the rejection of the candidate at {@code seq} without its record, for a source that does not
     * carry rejected candidates whole (a cluster run with slim rejects). A sink that writes rejects needs
     * the record, so it refuses this rather than write a line without a candidate.
     */
    public void acceptRejected(long seq, Reason reason) throws IOException {
        Checks.requireState(!options.writeRejects(), "the sink writes rejects but got seq %s without its record", seq);
        Checks.requireArgument(reason.verdict() == Verdict.REJECT, "%s is not a reason to reject", reason.code());
        Checks.requireState(seq == nextSeq, "sink expected seq %s but got %s", nextSeq, seq);
        count(reason);
    }

    private void count(Reason reason) throws IOException {
        counts.merge(reason, 1L, Long::sum);
        metrics.record(reason);
        nextSeq++;
        sinceCheckpoint++;
        if (survivors.hasSealed() || rejects.hasSealed() || sinceCheckpoint >= options.checkpointRecords()
                || ((sinceCheckpoint & 255) == 0 && dueByTime())) {
            checkpoint();
        }
    }

    private boolean dueByTime() {
        return Duration.between(lastCheckpoint, clock.instant()).compareTo(options.checkpointEvery()) >= 0;
    }

    /**
     * Commits the end of the scan: seals the last parts, checkpoints, and writes the complete manifest.
     * The counts must reconcile with the source's, or this throws and the manifest stays incomplete.
     */
    @Override
    public void finish() throws IOException {
        SourceReport report = source.get();
        Checks.requireState(report.done(), "the sink finished before the source did");
        long scored = scored();
        Checks.requireState(scored == report.candidates(),
                "counts do not reconcile: %s candidates but %s scored", report.candidates(), scored);
        survivors.sealOpen();
        rejects.sealOpen();
        checkpoint();
        hook.before("manifest");
        writeManifest(true);
    }

    @Override
    public void close() throws IOException {
        try {
            survivors.close();
        } finally {
            try {
                rejects.close();
            } finally {
                lock.close();
            }
        }
    }

    private void checkpoint() throws IOException {
        survivors.sync();
        rejects.sync();
        Instant now = writeCheckpoint();
        metrics.checkpoint();
        int before = survivors.published().size() + rejects.published().size();
        survivors.publishSealed();
        rejects.publishSealed();
        for (int i = before; i < survivors.published().size() + rejects.published().size(); i++) {
            metrics.file();
        }
        sinceCheckpoint = 0;
        lastCheckpoint = now;
        hook.before("manifest");
        writeManifest(false);
    }

    /** Records the current state; the open parts must have been synced. Returns the time recorded. */
    private Instant writeCheckpoint() throws IOException {
        Map<String, Long> byCode = new LinkedHashMap<>();
        counts.forEach((r, n) -> {
            if (n > 0) {
                byCode.put(r.code(), n);
            }
        });
        Instant now = clock.instant();
        Checkpoint cp = new Checkpoint(ScanFiles.FORMAT_VERSION, info.runId(), nextSeq, byCode, survivors.state(),
                rejects.state(), start.startedAt(), elapsed(now), start.sessions(), new java.util.TreeMap<>(proofs));
        hook.before("checkpoint");
        ScanFiles.replaceAtomically(dir.resolve(ScanFiles.CHECKPOINT), ScanFiles.toSealedJson(cp));
        return now;
    }

    private double elapsed(Instant now) {
        return start.elapsedSeconds() + Duration.between(sessionStart, now).toNanos() / 1e9;
    }

    private long scored() {
        return counts.values().stream().mapToLong(Long::longValue).sum();
    }

    private List<SealedPart> sealedParts() {
        List<SealedPart> all = new ArrayList<>(survivors.publishedParts());
        all.addAll(rejects.publishedParts());
        return all;
    }

    private void writeManifest(boolean complete) throws IOException {
        SourceReport found = source.get();
        SourceReport report = found != null ? found : new SourceReport(0, 0, 0, 0, 0, List.of(), false);
        Map<String, Long> rejected = new LinkedHashMap<>();
        Map<String, Long> kept = new LinkedHashMap<>();
        for (Reason r : Reason.values()) {
            (r.verdict() == Verdict.KEEP ? kept : rejected).put(r.code(), counts.get(r));
        }
        long rejectedSum = rejected.values().stream().mapToLong(Long::longValue).sum();
        long keptSum = kept.values().stream().mapToLong(Long::longValue).sum();
        Instant now = clock.instant();
        double session = Duration.between(sessionStart, now).toNanos() / 1e9;
        long scoredThisSession = scored() - start.counts().values().stream().mapToLong(Long::longValue).sum();
        Manifest m = new Manifest(ScanFiles.FORMAT_VERSION, info.runId(), complete, info.source(), info.bounds(),
                info.rules(), info.modelChecksum(),
                new Manifest.Counts(report.items(), report.duplicates(), report.candidates(), report.badInputs(),
                        rejectedSum + keptSum, rejectedSum, keptSum, rejected, kept, survivors.totalLines()),
                report.badInputLines(),
                new Manifest.Timings(start.startedAt(), now, elapsed(now), start.sessions(),
                        session > 0 ? scoredThisSession / session : 0),
                survivors.published(), rejects.published(), sealedParts(), info.modelFile(), new java.util.TreeMap<>(proofs));
        ScanFiles.replaceAtomically(dir.resolve(ScanFiles.MANIFEST), ScanFiles.toSealedJson(m));
    }
}
