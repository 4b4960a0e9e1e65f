/**
 * JMH benchmarks of the hot paths. Build with {@code mvn -B -ntp -pl bench -am package -DskipTests}
 * and run {@code java -jar bench/target/benchmarks.jar}; figures go to {@code docs/benchmarks.md}.
 * Also the side-by-side comparison with the numpy reference scorer (driven by
 * {@code bench/compare.sh}): a seeded candidate file, a bench model, the scorer's throughput on a
 * given number of threads, the forward pass's multiply-add count and the machine's FMA rate.
 */
package org.winnow.bench;
