package org.winnow.geometry.canonical;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Comparator;
import java.util.SplittableRandom;
import org.jgrapht.Graph;
import org.jgrapht.alg.isomorphism.VF2GraphIsomorphismInspector;
import org.jgrapht.graph.SimpleGraph;
import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

/**
 * Outside oracle: a configuration is a bipartite graph (row vertices coloured by n, column
 * vertices, an edge labelled q for every non-zero entry), and two matrices are permutations of
 * each other exactly when these coloured graphs are isomorphic. The isomorphism is decided by
 * JGraphT's VF2 inspector (org.jgrapht:jgrapht-core), independent of our search.
 */
class CanonicalFormIsomorphismTest {
    /** A vertex; colour is n for a row and 0 for a column. */
    private record Node(int id, int colour) {}

    /** An edge with a degree label; identity equality keeps parallel labels distinct. */
    private static final class Link {
        final int degree;

        Link(int degree) {
            this.degree = degree;
        }
    }

    @Test
    void sameCanonicalTextExactlyWhenTheGraphsAreIsomorphic() {
        SplittableRandom rnd = new SplittableRandom(1988L);
        int isomorphic = 0;
        int different = 0;
        for (int i = 0; i < 1500; i++) {
            Configuration a = RandomMatrices.matrix(rnd, 6, 8, 3, 3);
            Configuration b = switch (i % 3) {
                case 0 -> RandomMatrices.permuted(rnd, a);
                case 1 -> RandomMatrices.permuted(rnd, nearMiss(rnd, a));
                default -> RandomMatrices.permuted(rnd, swapDimensions(rnd, a));
            };
            boolean vf2 = isomorphic(a, b);
            assertEquals(vf2, a.canonicalText().equals(b.canonicalText()), a.toText() + " vs " + b.toText());
            if (vf2) {
                isomorphic++;
            } else {
                different++;
            }
        }
        assertTrue(isomorphic > 400 && different > 400, isomorphic + " isomorphic, " + different + " not");
    }

    /** Moves one unit of degree inside a row: row sums stay, the class usually changes. */
    private static Configuration nearMiss(SplittableRandom rnd, Configuration c) {
        int[][] q = c.degrees();
        int r = rnd.nextInt(c.rows());
        int from = rnd.nextInt(c.cols());
        int to = rnd.nextInt(c.cols());
        if (q[r][from] > 0) {
            q[r][from]--;
            q[r][to]++;
        } else {
            q[r][to]++;
        }
        return Configuration.of(c.dims(), q);
    }

    /** Exchanges the dimensions of two rows: same degrees, usually a different class. */
    private static Configuration swapDimensions(SplittableRandom rnd, Configuration c) {
        int[] n = c.dims();
        int a = rnd.nextInt(n.length);
        int b = rnd.nextInt(n.length);
        int t = n[a];
        n[a] = n[b];
        n[b] = t;
        if (a == b) {
            n[a] = n[a] == 1 ? 2 : n[a] - 1;
        }
        return Configuration.of(n, c.degrees());
    }

    private static boolean isomorphic(Configuration a, Configuration b) {
        Comparator<Node> byColour = Comparator.comparingInt(Node::colour);
        Comparator<Link> byDegree = Comparator.comparingInt(l -> l.degree);
        return new VF2GraphIsomorphismInspector<>(graph(a), graph(b), byColour, byDegree).isomorphismExists();
    }

    private static Graph<Node, Link> graph(Configuration c) {
        Graph<Node, Link> g = new SimpleGraph<>(null, null, false);
        Node[] rows = new Node[c.rows()];
        Node[] cols = new Node[c.cols()];
        for (int r = 0; r < c.rows(); r++) {
            rows[r] = new Node(r, c.n(r));
            g.addVertex(rows[r]);
        }
        for (int j = 0; j < c.cols(); j++) {
            cols[j] = new Node(c.rows() + j, 0);
            g.addVertex(cols[j]);
        }
        for (int r = 0; r < c.rows(); r++) {
            for (int j = 0; j < c.cols(); j++) {
                if (c.q(r, j) > 0) {
                    g.addEdge(rows[r], cols[j], new Link(c.q(r, j)));
                }
            }
        }
        return g;
    }
}
