/**
 * In-memory hand-over between the threads of a one-process scan: bounded channels that block the
 * sender when full (backpressure), and the sequence window that bounds how far ahead of the sink the
 * source may run.
 */
package org.winnow.pipeline.channel;
