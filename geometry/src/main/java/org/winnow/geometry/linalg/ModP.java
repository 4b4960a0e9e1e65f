package org.winnow.geometry.linalg;

import java.util.random.RandomGenerator;

/**
 * Arithmetic in F_p for the fixed prime {@code p = 2147483629}.
 *
 * <p>Residues are kept in {@code [0, p)} as {@code long}. A product of two residues is below 2^62,
 * so a {@code long} accumulator holding {@code a + b*c} with reduced operands cannot overflow; it
 * overflows after two unreduced multiply-adds, which is why every multiply-add here reduces at once.
 */
public final class ModP {
    /** The prime {@code 2^31 - 19}, so that a product of two residues fits in 62 bits. */
    public static final long P = 2147483629L;

    private ModP() {}

    /** The residue of any long in {@code [0, p)}. */
    public static long reduce(long a) {
        long r = a % P;
        return r < 0 ? r + P : r;
    }

    /** Sum of two residues. */
    public static long add(long a, long b) {
        long s = a + b;
        return s >= P ? s - P : s;
    }

    /** Difference of two residues. */
    public static long sub(long a, long b) {
        long s = a - b;
        return s < 0 ? s + P : s;
    }

    /** Negation of a residue. */
    public static long neg(long a) {
        return a == 0 ? 0 : P - a;
    }

    /** Product of two residues. */
    public static long mul(long a, long b) {
        return (a * b) % P;
    }

    /** {@code acc + a*b} for residues, reduced. */
    public static long mulAdd(long acc, long a, long b) {
        return (acc + a * b) % P;
    }

    /** {@code acc - a*b} for residues, reduced. */
    public static long mulSub(long acc, long a, long b) {
        long r = (acc - (a * b) % P);
        return r < 0 ? r + P : r;
    }

    /** {@code a^e} for a residue and {@code e >= 0}. */
    public static long pow(long a, long e) {
        long result = 1;
        long base = a;
        long k = e;
        while (k > 0) {
            if ((k & 1) != 0) {
                result = mul(result, base);
            }
            base = mul(base, base);
            k >>= 1;
        }
        return result;
    }

    /**
     * The inverse of a nonzero residue (extended Euclid).
     *
     * @throws ArithmeticException for zero
     */
    public static long inv(long a) {
        long x = reduce(a);
        if (x == 0) {
            throw new ArithmeticException("0 has no inverse mod " + P);
        }
        long r0 = P;
        long r1 = x;
        long s0 = 0;
        long s1 = 1;
        while (r1 != 0) {
            long quotient = r0 / r1;
            long t = r0 - quotient * r1;
            r0 = r1;
            r1 = t;
            t = s0 - quotient * s1;
            s0 = s1;
            s1 = t;
        }
        return reduce(s0);
    }

    /** The residue of a signed integer such as a sign or an exponent. */
    public static long of(long value) {
        return reduce(value);
    }

    /** A uniformly distributed residue in {@code [0, p)}. */
    public static long random(RandomGenerator rng) {
        return rng.nextLong(P);
    }
}
