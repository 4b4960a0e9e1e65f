/**
 * Line bundle cohomology: on the ambient product of projective spaces (Bott's formula per factor
 * and Kunneth), its explicit representatives, random defining polynomials over F_p, and the Koszul
 * spectral sequence that passes from the ambient space to the complete intersection.
 */
package org.winnow.geometry.cohomology;
