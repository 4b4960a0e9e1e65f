/**
 * {@code winnow scan} in one JVM: the input-file source, the run identity, the wiring of source,
 * scorer workers and sink, the live status line, and the Prometheus endpoint on a loopback HTTP server
 * that the watch dashboard shares.
 */
package org.winnow.app.scan;
