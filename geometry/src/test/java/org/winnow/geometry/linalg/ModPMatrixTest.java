package org.winnow.geometry.linalg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.SplittableRandom;
import org.apache.commons.math3.fraction.BigFraction;
import org.apache.commons.math3.fraction.BigFractionField;
import org.apache.commons.math3.linear.Array2DRowFieldMatrix;
import org.apache.commons.math3.linear.FieldMatrix;
import org.junit.jupiter.api.Test;

class ModPMatrixTest {
    /**
     * Oracle: the exact rational rank by fraction-exact Gaussian elimination (commons-math3
     * BigFraction). For small integer matrices the rank mod a large prime equals the rational rank
     * unless p divides a maximal minor, which does not happen for entries this small
     * (common practice, no source).
     */
    private static int rationalRank(long[][] m) {
        int rows = m.length;
        int cols = m[0].length;
        FieldMatrix<BigFraction> a = new Array2DRowFieldMatrix<>(BigFractionField.getInstance(), rows, cols);
        for (int i = 0; i < rows; i++) {
            for (int j = 0; j < cols; j++) {
                a.setEntry(i, j, new BigFraction(m[i][j]));
            }
        }
        int rank = 0;
        for (int c = 0; c < cols && rank < rows; c++) {
            int sel = -1;
            for (int i = rank; i < rows; i++) {
                if (!a.getEntry(i, c).equals(BigFraction.ZERO)) {
                    sel = i;
                    break;
                }
            }
            if (sel < 0) {
                continue;
            }
            BigFraction[] tmp = a.getRow(sel);
            a.setRow(sel, a.getRow(rank));
            a.setRow(rank, tmp);
            for (int i = rank + 1; i < rows; i++) {
                BigFraction f = a.getEntry(i, c).divide(a.getEntry(rank, c));
                for (int j = c; j < cols; j++) {
                    a.setEntry(i, j, a.getEntry(i, j).subtract(f.multiply(a.getEntry(rank, j))));
                }
            }
            rank++;
        }
        return rank;
    }

    /** A random small integer matrix of prescribed maximal rank: a product of two thin factors. */
    private static long[][] randomLowRank(SplittableRandom rng, int rows, int cols, int inner) {
        long[][] left = new long[rows][inner];
        long[][] right = new long[inner][cols];
        for (long[] row : left) {
            for (int j = 0; j < inner; j++) {
                row[j] = rng.nextInt(-3, 4);
            }
        }
        for (long[] row : right) {
            for (int j = 0; j < cols; j++) {
                row[j] = rng.nextInt(-3, 4);
            }
        }
        long[][] out = new long[rows][cols];
        for (int i = 0; i < rows; i++) {
            for (int j = 0; j < cols; j++) {
                long s = 0;
                for (int l = 0; l < inner; l++) {
                    s += left[i][l] * right[l][j];
                }
                out[i][j] = s;
            }
        }
        return out;
    }

    @Test
    void rankModPEqualsRationalRankOnSmallIntegerMatrices() {
        SplittableRandom rng = new SplittableRandom(11);
        int lowRankSeen = 0;
        for (int trial = 0; trial < 200; trial++) {
            int rows = rng.nextInt(1, 9);
            int cols = rng.nextInt(1, 9);
            long[][] m = randomLowRank(rng, rows, cols, rng.nextInt(1, 6));
            int expected = rationalRank(m);
            assertEquals(expected, ModPMatrix.of(m).rank(), "trial " + trial);
            if (expected < Math.min(rows, cols)) {
                lowRankSeen++;
            }
        }
        assertTrue(lowRankSeen > 20, "the sample must exercise rank-deficient matrices: " + lowRankSeen);
    }

    @Test
    void kernelHasComplementaryDimensionAndIsAnnihilated() {
        SplittableRandom rng = new SplittableRandom(12);
        for (int trial = 0; trial < 100; trial++) {
            int rows = rng.nextInt(1, 8);
            int cols = rng.nextInt(1, 8);
            long[][] m = randomLowRank(rng, rows, cols, rng.nextInt(1, 5));
            ModPMatrix a = ModPMatrix.of(m);
            ModPMatrix ker = a.kernelBasis();
            assertEquals(cols - rationalRank(m), ker.cols());
            assertEquals(ker.cols(), ker.rank(), "kernel basis must be independent");
            assertTrue(a.multiply(ker).isZero(), "A * ker(A) must vanish");
        }
    }

    @Test
    void imageBasisSpansTheColumnSpace() {
        SplittableRandom rng = new SplittableRandom(13);
        for (int trial = 0; trial < 100; trial++) {
            long[][] m = randomLowRank(rng, rng.nextInt(1, 8), rng.nextInt(1, 8), rng.nextInt(1, 5));
            ModPMatrix a = ModPMatrix.of(m);
            ModPMatrix im = a.imageBasis();
            assertEquals(rationalRank(m), im.cols());
            assertEquals(im.cols(), im.rank());
            assertEquals(im.cols(), ModPMatrix.rankOfStacked(im, a), "A's columns lie in the span of the basis");
        }
    }

    @Test
    void stackedRankMatchesRationalRankOfTheJoinedMatrix() {
        SplittableRandom rng = new SplittableRandom(14);
        for (int trial = 0; trial < 100; trial++) {
            int rows = rng.nextInt(1, 8);
            long[][] left = randomLowRank(rng, rows, rng.nextInt(1, 6), rng.nextInt(1, 4));
            long[][] right = randomLowRank(rng, rows, rng.nextInt(1, 6), rng.nextInt(1, 4));
            long[][] joined = new long[rows][left[0].length + right[0].length];
            for (int i = 0; i < rows; i++) {
                System.arraycopy(left[i], 0, joined[i], 0, left[i].length);
                System.arraycopy(right[i], 0, joined[i], left[i].length, right[i].length);
            }
            assertEquals(rationalRank(joined), ModPMatrix.rankOfStacked(ModPMatrix.of(left), ModPMatrix.of(right)));
        }
    }

    @Test
    void fullSizeResiduesDoNotOverflow() {
        // Entries near p make every product close to 2^62; a missing reduction would overflow.
        long big = ModP.P - 1;
        long[][] m = {{big, big - 1, big - 2}, {big - 3, big, 1}, {2, big - 5, big}};
        ModPMatrix a = ModPMatrix.of(m);
        ModPMatrix ker = a.kernelBasis();
        assertTrue(a.multiply(ker).isZero());
        assertEquals(3, a.rank() + ker.cols());
        // -1, -2, -3, ... reduce to the same residues as p-1, p-2, ...: a rational check of the same matrix.
        long[][] small = {{-1, -2, -3}, {-4, -1, 1}, {2, -6, -1}};
        assertEquals(rationalRank(small), a.rank());
    }

    @Test
    void emptyShapesAreHandled() {
        assertEquals(0, new ModPMatrix(0, 5).rank());
        assertEquals(5, new ModPMatrix(0, 5).kernelBasis().cols());
        assertEquals(0, new ModPMatrix(3, 0).imageBasis().cols());
        assertThrows(IllegalArgumentException.class, () -> new ModPMatrix(-1, 2));
    }
}
