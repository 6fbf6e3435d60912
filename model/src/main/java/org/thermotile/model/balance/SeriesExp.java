package org.thermotile.model.balance;

/**
 * e^x for the kernel's Magnus exponent (|x| ≤ 6), as plain arithmetic the JIT can compile to
 * vector instructions (a call to {@link Math#exp} in a loop keeps the loop scalar).
 *
 * <p>Range reduction by a power of two: e^x = (e^(x/16))^16, e^(x/16) by its Taylor series to
 * degree 13 (|x/16| ≤ 0.375, truncation below 2e-17 relative), then four squarings. The relative
 * error, measured against {@link Math#exp} over the range in {@code SeriesExpTest}, stays within
 * 4e-15 (the squarings multiply the series' rounding by 16); outside |x| ≤ 6 the error grows and
 * the method is not to be used.
 */
final class SeriesExp {
    private SeriesExp() {}

    /** Largest |x| the stated error holds for. */
    static final double MAX_ABS_X = 6.0;

    // 1/k! for k = 2 … 13.
    private static final double I2 = 1.0 / 2;
    private static final double I3 = 1.0 / 6;
    private static final double I4 = 1.0 / 24;
    private static final double I5 = 1.0 / 120;
    private static final double I6 = 1.0 / 720;
    private static final double I7 = 1.0 / 5040;
    private static final double I8 = 1.0 / 40320;
    private static final double I9 = 1.0 / 362880;
    private static final double I10 = 1.0 / 3628800;
    private static final double I11 = 1.0 / 39916800;
    private static final double I12 = 1.0 / 479001600;
    private static final double I13 = 1.0 / 6227020800.0;

    /** e^x for |x| ≤ {@link #MAX_ABS_X}. */
    static double exp(double x) {
        double y = x * 0.0625;
        double p = I13;
        p = p * y + I12;
        p = p * y + I11;
        p = p * y + I10;
        p = p * y + I9;
        p = p * y + I8;
        p = p * y + I7;
        p = p * y + I6;
        p = p * y + I5;
        p = p * y + I4;
        p = p * y + I3;
        p = p * y + I2;
        p = p * y + 1.0;
        p = p * y + 1.0;
        p *= p;
        p *= p;
        p *= p;
        p *= p;
        return p;
    }
}
