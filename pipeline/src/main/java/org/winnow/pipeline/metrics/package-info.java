/**
 * The Micrometer meters of a scan, one class per stage. Each class owns its meter names, descriptions
 * and tags as constants, so that the live status, the Prometheus endpoint and the tests all read the
 * same numbers. Meter names use dots; the Prometheus registry turns {@code winnow.scorer.verdicts} into
 * {@code winnow_scorer_verdicts_total}.
 */
package org.winnow.pipeline.metrics;
