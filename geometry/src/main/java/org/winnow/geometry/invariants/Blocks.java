package org.winnow.geometry.invariants;

import java.util.ArrayList;
import java.util.List;
import org.winnow.geometry.Configuration;

/**
 * Block decomposition of a configuration matrix. With two or more blocks the variety is the product
 * of the block varieties, so chi and intersection numbers factorise and it is not a Calabi-Yau with
 * full holonomy. A zero row (possible outside Calabi-Yau work) is a block of its own; a zero column
 * (a constant polynomial, so an empty variety) belongs to no block.
 */
public final class Blocks {
    private final List<Block> blocks;

    private Blocks(List<Block> blocks) {
        this.blocks = List.copyOf(blocks);
    }

    /** Decomposes {@code c}; blocks are ordered by their smallest row index. */
    public static Blocks of(Configuration c) {
        int m = c.rows();
        int[] label = new int[m];
        int count = label(c, label, new int[m]);
        List<Block> list = new ArrayList<>(count);
        for (int b = 0; b < count; b++) {
            List<Integer> rows = new ArrayList<>();
            int dim = 0;
            for (int r = 0; r < m; r++) {
                if (label[r] == b) {
                    rows.add(r);
                    dim += c.n(r);
                }
            }
            List<Integer> cols = new ArrayList<>();
            for (int j = 0; j < c.cols(); j++) {
                int first = firstRow(c, j);
                if (first >= 0 && label[first] == b) {
                    cols.add(j);
                }
            }
            list.add(new Block(rows, cols, dim - cols.size()));
        }
        return new Blocks(list);
    }

    /** The blocks, ordered by their smallest row index. */
    public List<Block> list() {
        return blocks;
    }

    /** Number of blocks. */
    public int count() {
        return blocks.size();
    }

    /**
     * Labels every row with its block number (0, 1, ... in order of the smallest row) without
     * allocating; {@code label} and {@code scratch} need length {@code >= rows}. A zero column
     * joins nothing (it belongs to no block). Returns the number of blocks.
     */
    static int label(Configuration c, int[] label, int[] scratch) {
        int m = c.rows();
        int[] parent = scratch;
        for (int r = 0; r < m; r++) {
            parent[r] = r;
        }
        for (int j = 0; j < c.cols(); j++) {
            int first = -1;
            for (int r = 0; r < m; r++) {
                if (c.q(r, j) > 0) {
                    if (first < 0) {
                        first = find(parent, r);
                    } else {
                        int root = find(parent, r);
                        if (root != first) {
                            // Union towards the smaller index keeps roots = smallest row of a block.
                            if (root < first) {
                                parent[first] = root;
                                first = root;
                            } else {
                                parent[root] = first;
                            }
                        }
                    }
                }
            }
        }
        int count = 0;
        for (int r = 0; r < m; r++) {
            int root = find(parent, r);
            if (root == r) {
                label[r] = count++;
            } else {
                label[r] = label[root];
            }
        }
        return count;
    }

    private static int find(int[] parent, int r) {
        while (parent[r] != r) {
            parent[r] = parent[parent[r]];
            r = parent[r];
        }
        return r;
    }

    private static int firstRow(Configuration c, int j) {
        for (int r = 0; r < c.rows(); r++) {
            if (c.q(r, j) > 0) {
                return r;
            }
        }
        return -1;
    }
}
