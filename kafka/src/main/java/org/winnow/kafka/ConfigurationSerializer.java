package org.winnow.kafka;

import com.esotericsoftware.kryo.Kryo;
import com.esotericsoftware.kryo.KryoException;
import com.esotericsoftware.kryo.Serializer;
import com.esotericsoftware.kryo.io.Input;
import com.esotericsoftware.kryo.io.Output;
import org.winnow.geometry.Configuration;

/**
 * Writes a configuration as its shape and entries in variable-length bytes: degrees and dimensions are
 * small, so a typical matrix takes one byte per entry. Reading goes through {@link Configuration#of}, so
 * the wire can never carry a configuration that its own constructor would refuse.
 */
public final class ConfigurationSerializer extends Serializer<Configuration> {
    public ConfigurationSerializer() {
        setImmutable(true);
    }

    @Override
    public void write(Kryo kryo, Output out, Configuration c) {
        out.writeVarInt(c.rows(), true);
        out.writeVarInt(c.cols(), true);
        for (int r = 0; r < c.rows(); r++) {
            out.writeVarInt(c.n(r), true);
            for (int j = 0; j < c.cols(); j++) {
                out.writeVarInt(c.q(r, j), true);
            }
        }
    }

    @Override
    public Configuration read(Kryo kryo, Input in, Class<? extends Configuration> type) {
        int rows = in.readVarInt(true);
        int cols = in.readVarInt(true);
        if (rows < 1 || rows > Configuration.MAX_ROWS || cols < 0 || cols > Configuration.MAX_COLS) {
            throw new KryoException("configuration shape out of range: " + rows + " x " + cols);
        }
        int[] n = new int[rows];
        int[][] q = new int[rows][cols];
        for (int r = 0; r < rows; r++) {
            n[r] = in.readVarInt(true);
            for (int j = 0; j < cols; j++) {
                q[r][j] = in.readVarInt(true);
            }
        }
        return Configuration.of(n, q);
    }
}
