package org.winnow.kafka;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.KryoException;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import java.util.ArrayList;
import java.util.List;
import org.winnow.pipeline.BadInput;
import org.winnow.pipeline.SourceReport;

/** Writes a source report field by field; its list of bad lines is an immutable list Kryo cannot name. */
public final class SourceReportSerializer extends Serializer<SourceReport> {
    /** More listed bad lines than any report holds means the bytes are not a report. */
    private static final int MAX_LISTED = 1_000_000;

    public SourceReportSerializer() {
        setImmutable(true);
    }

    @Override
    public void write(Kryo kryo, Output out, SourceReport r) {
        out.writeVarLong(r.items(), true);
        out.writeVarLong(r.duplicates(), true);
        out.writeVarLong(r.candidates(), true);
        out.writeVarLong(r.skipped(), true);
        out.writeVarLong(r.badInputs(), true);
        out.writeBoolean(r.done());
        out.writeVarInt(r.badInputLines().size(), true);
        for (BadInput b : r.badInputLines()) {
            out.writeVarLong(b.line(), true);
            out.writeString(b.problem());
        }
    }

    @Override
    public SourceReport read(Kryo kryo, Input in, Class<? extends SourceReport> type) {
        long items = in.readVarLong(true);
        long duplicates = in.readVarLong(true);
        long candidates = in.readVarLong(true);
        long skipped = in.readVarLong(true);
        long badInputs = in.readVarLong(true);
        boolean done = in.readBoolean();
        int listed = in.readVarInt(true);
        if (listed < 0 || listed > MAX_LISTED) {
            throw new KryoException("source report lists " + listed + " bad lines");
        }
        List<BadInput> lines = new ArrayList<>(listed);
        for (int i = 0; i < listed; i++) {
            lines.add(new BadInput(in.readVarLong(true), in.readString()));
        }
        return new SourceReport(items, duplicates, candidates, skipped, badInputs, lines, done);
    }
}
