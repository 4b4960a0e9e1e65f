package org.winnow.sink;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Pattern;

/**
 * Rechecks a scan directory against what its scan recorded, reading every committed part: each part's
 * length and SHA-256, the manifest against the checkpoint, and no part-named file that neither records.
 * Changes nothing. A scan that passes holds exactly the bytes its sink wrote.
 */
public final class ScanCheck {
    private static final Pattern PART_NAME = Pattern.compile("(survivors|rejects)-\\d{5,}\\.tsv");

    /**
     * What a check found.
     *
     * @param manifest the manifest, checked
     * @param parts    parts read and matched
     * @param bytes    their total length
     * @param lines    their data lines
     */
    public record Result(Manifest manifest, int parts, long bytes, long lines) {}

    private ScanCheck() {}

    /**
     * Checks the parts the manifest lists against its records; what {@code winnow report} needs before it
     * trusts the files. Safe on a running scan: the manifest is replaced atomically after the parts it
     * lists are under their final names, and a sealed part never changes.
     *
     * @throws ScanDamagedException naming the first file that differs
     */
    public static Result listed(Path dir, Manifest manifest) throws IOException {
        long bytes = 0;
        long lines = 0;
        for (SealedPart p : manifest.sealedParts()) {
            PartCheck.verify(dir.resolve(p.name()), p, "the manifest");
            bytes += p.bytes();
            lines += p.lines();
        }
        return new Result(manifest, manifest.sealedParts().size(), bytes, lines);
    }

    /**
     * The full check of a scan directory: manifest and checkpoint readable, well-formed and of one scan,
     * the manifest's records those of the checkpoint, every recorded part present with its length and
     * digest, and no unrecorded file under a part's name. Refuses a directory a scan holds now.
     *
     * @throws ScanDamagedException naming the first file that differs
     * @throws DirectoryLock.DirectoryInUseException when a scan is writing the directory
     */
    public static Result full(Path dir) throws IOException {
        if (!Files.isDirectory(dir)) {
            throw new ScanDamagedException(dir + ": " + (Files.exists(dir) ? "not a directory" : "no such directory"));
        }
        String holder = DirectoryLock.holderIfHeld(dir);
        if (holder != null) {
            throw new ScanDamagedException(dir + ": in use by " + holder + "; check it when that scan has stopped");
        }
        Path manifestFile = dir.resolve(ScanFiles.MANIFEST);
        Path checkpointFile = dir.resolve(ScanFiles.CHECKPOINT);
        if (!Files.exists(manifestFile) && !Files.exists(checkpointFile)) {
            throw new ScanDamagedException(dir + ": holds neither " + ScanFiles.MANIFEST + " nor "
                    + ScanFiles.CHECKPOINT + "; is it the --out of a scan?");
        }
        Manifest m = Manifest.read(manifestFile);
        Checkpoint cp = Checkpoint.read(checkpointFile);
        if (!cp.runId().equals(m.runId())) {
            throw new ScanDamagedException(manifestFile + ": run " + m.runId() + ", but the checkpoint is of run "
                    + cp.runId());
        }
        List<SealedPart> recorded = new ArrayList<>(cp.survivors().parts());
        recorded.addAll(cp.rejects().parts());
        List<SealedPart> listed = new ArrayList<>();
        int nSurvivors = m.survivorFiles().size();
        listed.addAll(m.sealedParts().subList(0, nSurvivors));
        if (!cp.survivors().parts().subList(0, Math.min(nSurvivors, cp.survivors().parts().size()))
                .equals(listed) || nSurvivors > cp.survivors().parts().size()) {
            throw new ScanDamagedException(manifestFile + ": its survivor files or their records differ from "
                    + "the checkpoint's");
        }
        List<SealedPart> listedRejects = m.sealedParts().subList(nSurvivors, m.sealedParts().size());
        if (listedRejects.size() > cp.rejects().parts().size()
                || !cp.rejects().parts().subList(0, listedRejects.size()).equals(listedRejects)) {
            throw new ScanDamagedException(manifestFile + ": its reject files or their records differ from the "
                    + "checkpoint's");
        }
        if (m.complete()) {
            if (listed.size() != cp.survivors().parts().size() || listedRejects.size() != cp.rejects().parts().size()
                    || cp.survivors().openLines() != 0 || cp.rejects().openLines() != 0) {
                throw new ScanDamagedException(manifestFile + ": complete, but the checkpoint records other parts "
                        + "or an open part");
            }
            if (m.counts().scored() != cp.nextSeq()) {
                throw new ScanDamagedException(manifestFile + ": complete with " + m.counts().scored()
                        + " scored, but the checkpoint accounts for " + cp.nextSeq());
            }
            for (var e : cp.counts().entrySet()) {
                Long inManifest = m.counts().keptByReason().containsKey(e.getKey())
                        ? m.counts().keptByReason().get(e.getKey()) : m.counts().rejectedByReason().get(e.getKey());
                if (!e.getValue().equals(inManifest)) {
                    throw new ScanDamagedException(manifestFile + ": counts " + e.getKey() + " = " + inManifest
                            + ", but the checkpoint records " + e.getValue());
                }
            }
        }
        Set<String> names = new HashSet<>();
        long bytes = 0;
        long lines = 0;
        for (SealedPart p : recorded) {
            Path f = dir.resolve(p.name());
            if (!Files.exists(f) && Files.exists(dir.resolve(ScanFiles.partialName(
                    p.name().startsWith(ScanFiles.SURVIVORS) ? ScanFiles.SURVIVORS : ScanFiles.REJECTS,
                    partNumber(p.name()))))) {
                throw new ScanDamagedException(f + ": sealed but not yet under its final name; rerun the scan to "
                        + "finish the interrupted step");
            }
            PartCheck.verify(f, p, "the checkpoint");
            names.add(p.name());
            bytes += p.bytes();
            lines += p.lines();
        }
        try (var entries = Files.list(dir)) {
            for (Path f : (Iterable<Path>) entries::iterator) {
                String name = f.getFileName().toString();
                if (PART_NAME.matcher(name).matches() && !names.contains(name)) {
                    throw new ScanDamagedException(f + ": named like a part, but the checkpoint records no such part");
                }
            }
        }
        return new Result(m, recorded.size(), bytes, lines);
    }

    private static int partNumber(String name) {
        String digits = name.substring(name.indexOf('-') + 1, name.indexOf('.'));
        return Integer.parseInt(digits);
    }
}
