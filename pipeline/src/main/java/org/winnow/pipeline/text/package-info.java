/**
 * Reading user text safely: {@link org.winnow.pipeline.text.BoundedLineReader} is the one line reader of
 * every text file a command takes from its user, so that a file without line breaks (a device, a binary)
 * is refused with one line instead of filling the heap.
 */
package org.winnow.pipeline.text;
