/**
 * {@code winnow produce}, {@code winnow score} and {@code winnow sink}: the stages of a cluster run, each
 * in a process of its own, wired to the run's Kafka topics. The stage logic is the one-JVM scan's own;
 * only the transport differs.
 */
package org.winnow.app.cluster;
