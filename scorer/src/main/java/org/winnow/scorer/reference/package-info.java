/**
 * The exactly labelled reference data a model is trained on and votes with: labelled examples, the
 * reference TSV file (as {@code winnow label} writes it), the stratified split by h11 class, and the
 * reference set a frozen model carries.
 */
package org.winnow.scorer.reference;
