package org.winnow.geometry.invariants;

import java.util.List;

/**
 * One connected component of the row-column incidence graph ({@code q[r][j] > 0} is an edge).
 *
 * @param rows 0-based row indices, ascending
 * @param columns 0-based column indices, ascending
 * @param dimension {@code sum_{r in rows} n_r - |columns|}: negative means the generic complete
 *     intersection is empty, 0 means finitely many points
 */
public record Block(List<Integer> rows, List<Integer> columns, int dimension) {
    public Block {
        rows = List.copyOf(rows);
        columns = List.copyOf(columns);
    }
}
