/**
 * JMH benchmarks of the similarity model: scoring (embed, neighbour search, vote, novelty), the
 * neighbour index against Smile's KD-tree, and training on a 1% labelled set. Build with
 * {@code mvn -pl bench -am package -DskipTests}, run with
 * {@code java -jar bench/target/benchmarks.jar 'org.winnow.bench.model.*' -f 1 -wi 3 -i 5 -prof gc}.
 */
package org.winnow.bench.model;
