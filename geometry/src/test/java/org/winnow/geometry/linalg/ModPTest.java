package org.winnow.geometry.linalg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.math.BigInteger;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

class ModPTest {
    @Test
    void thePrimeIsPrime() {
        // Oracle: BigInteger's probabilistic primality test (common practice, no source).
        assertEquals(true, BigInteger.valueOf(ModP.P).isProbablePrime(60));
    }

    @Test
    void arithmeticAgreesWithBigInteger() {
        SplittableRandom rng = new SplittableRandom(3);
        BigInteger p = BigInteger.valueOf(ModP.P);
        for (int i = 0; i < 10_000; i++) {
            long a = ModP.random(rng);
            long b = ModP.random(rng);
            long c = ModP.random(rng);
            BigInteger ba = BigInteger.valueOf(a);
            BigInteger bb = BigInteger.valueOf(b);
            BigInteger bc = BigInteger.valueOf(c);
            assertEquals(ba.multiply(bb).mod(p).longValue(), ModP.mul(a, b));
            assertEquals(bc.add(ba.multiply(bb)).mod(p).longValue(), ModP.mulAdd(c, a, b));
            assertEquals(bc.subtract(ba.multiply(bb)).mod(p).longValue(), ModP.mulSub(c, a, b));
            assertEquals(ba.add(bb).mod(p).longValue(), ModP.add(a, b));
            assertEquals(ba.subtract(bb).mod(p).longValue(), ModP.sub(a, b));
            if (a != 0) {
                assertEquals(ba.modInverse(p).longValue(), ModP.inv(a));
                assertEquals(1, ModP.mul(a, ModP.inv(a)));
            }
        }
        assertEquals(BigInteger.valueOf(7).modPow(BigInteger.valueOf(123456789), p).longValue(), ModP.pow(7, 123456789));
        assertEquals(ModP.P - 5, ModP.reduce(-5));
        assertThrows(ArithmeticException.class, () -> ModP.inv(0));
    }
}
