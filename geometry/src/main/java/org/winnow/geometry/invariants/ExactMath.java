package org.winnow.geometry.invariants;

/** Exact integer helpers shared by the invariant formulas. */
final class ExactMath {
    private ExactMath() {}

    /**
     * {@code a / b}, asserting that the division is exact. The Chern-class formulas divide by 2, 3,
     * 8 and 24; a remainder means the input or the arithmetic is wrong, never a rounding matter.
     */
    static long divideExactly(long a, long b, String what) {
        if (a % b != 0) {
            throw new ArithmeticException(what + ": " + a + " is not divisible by " + b);
        }
        return a / b;
    }

    /** {@code base^exp} for small non-negative exponents, overflow-checked. */
    static long pow(long base, int exp) {
        long r = 1;
        for (int i = 0; i < exp; i++) {
            r = Math.multiplyExact(r, base);
        }
        return r;
    }

    /** {@code C(n, k)} for {@code 0 <= k}, exact, 0 when {@code k > n}. */
    static long binomial(int n, int k) {
        if (k < 0 || k > n) {
            return 0;
        }
        long r = 1;
        for (int i = 1; i <= k; i++) {
            // r * (n - k + i) is divisible by i at every step (it is C(n-k+i, i) * i).
            r = Math.multiplyExact(r, n - k + i) / i;
        }
        return r;
    }

    /** {@code k!} for small k. */
    static long factorial(int k) {
        long r = 1;
        for (int i = 2; i <= k; i++) {
            r = Math.multiplyExact(r, i);
        }
        return r;
    }
}
