/**
 * JMH benchmarks of the hot paths. Build with {@code mvn -B -ntp -pl bench -am package -DskipTests}
 * and run {@code java -jar bench/target/benchmarks.jar}; figures go to {@code docs/benchmarks.md}.
 */
package org.winnow.bench;
