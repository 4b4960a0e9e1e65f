/**
 * {@code winnow scan}, {@code winnow demo} and {@code winnow enumerate} in one JVM: the space options,
 * the wiring of source, scorer workers and sink ({@link org.winnow.app.scan.ScanJob}) and the live
 * status line.
 */
package org.winnow.app.scan;
