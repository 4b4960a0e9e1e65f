/**
 * {@code winnow hodge}, {@code winnow label} and {@code winnow invariants}: exact Hodge numbers and cheap
 * exact invariants of given configurations, as text or JSON, and labelling a file into the reference
 * format.
 */
package org.winnow.app.hodge;
