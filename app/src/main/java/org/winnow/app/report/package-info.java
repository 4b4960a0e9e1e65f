/** {@code winnow report}: one self-contained HTML page that shows what a scan found. */
package org.winnow.app.report;
