/**
 * The {@code winnow} command line, in families: {@code cli} (the entry point, exit codes, the shared
 * error path and the options and plumbing several families use), {@code scan} (scan, demo, enumerate),
 * {@code cluster} (produce, score, sink on Kafka), {@code watch}, {@code model} (train, evaluate,
 * export-weights), {@code hodge} (hodge, label, invariants) and {@code report}. Each command sits beside
 * the code it drives; this root package holds no classes.
 */
package org.winnow.app;
