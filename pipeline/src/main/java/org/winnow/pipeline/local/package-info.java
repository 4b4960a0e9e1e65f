/**
 * Runs a scan in one process: the source on its own thread, N scorer workers and the sink, joined by
 * bounded channels, with the sink fed in seq order.
 */
package org.winnow.pipeline.local;
