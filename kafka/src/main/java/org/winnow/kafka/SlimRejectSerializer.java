package org.winnow.kafka;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.KryoException;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import org.winnow.pipeline.Reason;

/**
 * Writes a {@link SlimReject} as three variable-length numbers (shard, seq, reason ordinal): a few bytes,
 * where Kryo's record default would spend four on the shard and a null marker on the reason. Reading goes
 * through the record's constructor, so a kept reason or a negative seq is refused on the way in.
 */
final class SlimRejectSerializer extends Serializer<SlimReject> {
    SlimRejectSerializer() {
        setImmutable(true);
    }

    @Override
    public void write(Kryo kryo, Output out, SlimReject r) {
        out.writeVarInt(r.shard(), true);
        out.writeVarLong(r.seq(), true);
        out.writeVarInt(r.reason().ordinal(), true);
    }

    @Override
    public SlimReject read(Kryo kryo, Input in, Class<? extends SlimReject> type) {
        int shard = in.readVarInt(true);
        long seq = in.readVarLong(true);
        int ordinal = in.readVarInt(true);
        Reason[] reasons = Reason.values();
        if (ordinal < 0 || ordinal >= reasons.length) {
            throw new KryoException("reason ordinal " + ordinal + " out of range 0.." + (reasons.length - 1));
        }
        return new SlimReject(shard, seq, reasons[ordinal]);
    }
}
