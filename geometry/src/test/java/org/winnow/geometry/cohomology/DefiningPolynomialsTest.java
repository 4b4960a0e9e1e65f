package org.winnow.geometry.cohomology;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import org.junit.jupiter.api.Test;
import org.winnow.geometry.Configuration;

class DefiningPolynomialsTest {
    @Test
    void everyMonomialGetsACoefficientDeterministically() {
        Configuration c = Configuration.parse("2:3,0/2:0,3/1:1,1");
        DefiningPolynomials a = DefiningPolynomials.random(c, 42);
        DefiningPolynomials b = DefiningPolynomials.random(c, 42);
        DefiningPolynomials other = DefiningPolynomials.random(c, 43);
        assertEquals(2, a.size());
        // C(2+3,2) * 1 * C(1+1,1) = 10 * 2 = 20 monomials per column.
        assertEquals(20, a.polynomial(0).terms());
        assertEquals(20, a.polynomial(1).terms());
        boolean differs = false;
        for (int j = 0; j < a.size(); j++) {
            for (int t = 0; t < a.polynomial(j).terms(); t++) {
                assertEquals(a.polynomial(j).coefficient(t), b.polynomial(j).coefficient(t));
                differs |= a.polynomial(j).coefficient(t) != other.polynomial(j).coefficient(t);
            }
        }
        assertEquals(true, differs);
    }

    @Test
    void derivativeLowersTheDegree() {
        Configuration c = Configuration.parse("4:5");
        Polynomial f = DefiningPolynomials.random(c, 1).polynomial(0);
        Polynomial df = f.derivative(0, 2);
        assertEquals(4, df.degrees()[0]);
        // Each monomial with x2^e contributes e * c; the number of monomials with e >= 1 is C(8,4) = 70.
        assertEquals(70, df.terms());
        assertNotEquals(0, df.coefficient(0));
    }
}
