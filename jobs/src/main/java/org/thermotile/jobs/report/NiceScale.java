package org.thermotile.jobs.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Round numbers for axis ticks and scale bars: steps of 1, 2 or 5 × 10ⁿ, after Heckbert's "nice
 * numbers for graph labels" (Heckbert 1990, Graphics Gems I, pp. 61–63).
 */
public final class NiceScale {
    private NiceScale() {}

    /**
     * The nice number nearest {@code x} (rounding) or the smallest nice number ≥ {@code x}
     * (not rounding), Heckbert (1990): 10ⁿ·{1, 2, 5, 10} with n = ⌊log₁₀ x⌋.
     *
     * @param x a positive, finite number
     */
    public static double nice(double x, boolean round) {
        double exp = Math.floor(Math.log10(x));
        double f = x / Math.pow(10, exp);
        double nf;
        if (round) {
            nf = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
        } else {
            nf = f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10;
        }
        return nf * Math.pow(10, exp);
    }

    /** The largest number 10ⁿ·{1, 2, 5} that is ≤ {@code x} (scale-bar lengths). */
    public static double niceFloor(double x) {
        double exp = Math.floor(Math.log10(x));
        double p = Math.pow(10, exp);
        double f = x / p;
        double nf = f >= 5 ? 5 : f >= 2 ? 2 : 1;
        return nf * p;
    }

    /**
     * About {@code count} tick values on a nice step covering [lo, hi] from outside (the first
     * tick ≤ lo, the last ≥ hi), Heckbert (1990) "loose labelling". lo = hi gives one tick.
     */
    public static double[] looseTicks(double lo, double hi, int count) {
        if (!(hi > lo)) {
            return new double[] {lo};
        }
        double step = step(lo, hi, count);
        double first = Math.floor(lo / step) * step;
        double last = Math.ceil(hi / step) * step;
        int n = (int) Math.round((last - first) / step) + 1;
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            t[i] = clean(first + i * step);
        }
        return t;
    }

    /** Nice tick values inside [lo, hi] (first ≥ lo, last ≤ hi), on the step of {@link #looseTicks}. */
    public static double[] innerTicks(double lo, double hi, int count) {
        if (!(hi > lo)) {
            return new double[] {lo};
        }
        double step = step(lo, hi, count);
        List<Double> t = new ArrayList<>();
        for (double v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) {
            t.add(clean(v));
        }
        return t.stream().mapToDouble(Double::doubleValue).toArray();
    }

    /** The tick step for about {@code count} ticks on [lo, hi]. */
    public static double step(double lo, double hi, int count) {
        double range = nice(hi - lo, false);
        return nice(range / Math.max(1, count - 1), true);
    }

    /** Removes floating-point dust (0.30000000000000004 → 0.3) and negative zero. */
    private static double clean(double v) {
        double r = Math.round(v * 1e9) / 1e9;
        return r == 0 ? 0 : r;
    }

    /** A tick label: as few decimals as the step needs (step 0.5 → one decimal). */
    public static String label(double v, double step) {
        int decimals = Math.max(0, (int) Math.ceil(-Math.log10(step) - 1e-9));
        return String.format(Locale.ROOT, "%." + decimals + "f", v);
    }
}
