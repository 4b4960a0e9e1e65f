/**
 * {@code winnow watch}: reads the metric snapshots that every stage of a cluster run publishes, adds them up
 * per stage and per instance, reads the consumer lag of the scorers and the sink, and shows the result in
 * a terminal view and a self-contained web dashboard on 127.0.0.1.
 */
package org.winnow.app.watch;
