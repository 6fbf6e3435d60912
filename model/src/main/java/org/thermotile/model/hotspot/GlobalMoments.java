package org.thermotile.model.hotspot;

import java.io.Serializable;

/**
 * Count, mean, sum of squared deviations, minimum and maximum of the valid (non-NaN) cells of a
 * field: the global statistics Gi* needs. Values are added one by one with Welford's update
 * (Welford 1962, Technometrics 4(3) 419–420) and partial results are merged with the pairwise
 * formula of Chan, Golub & LeVeque (1979, "Updating formulae and a pairwise algorithm for
 * computing sample variances", Stanford CS report STAN-CS-79-773):
 * <pre>  n = n_a + n_b,  δ = x̄_b − x̄_a,  x̄ = x̄_a + δ·n_b/n,  M₂ = M₂_a + M₂_b + δ²·n_a·n_b/n</pre>
 * Merging the same parts in the same order gives the same bits, so a job merges fixed blocks in
 * block order.
 *
 * <p>The spread is the population standard deviation S = √(M₂/n), the S of Ord & Getis (1995)
 * (S² = Σx_j²/n − x̄²). A field whose valid values are all equal (min = max) has S = 0 exactly.
 */
public final class GlobalMoments implements Serializable {
    private static final long serialVersionUID = 1L;

    private long n;
    private double mean;
    private double m2;
    private double min = Double.POSITIVE_INFINITY;
    private double max = Double.NEGATIVE_INFINITY;

    /** Adds one value; NaN (no data) is skipped. */
    public void add(double x) {
        if (Double.isNaN(x)) {
            return;
        }
        n++;
        double d = x - mean;
        mean += d / n;
        m2 += d * (x - mean);
        if (x < min) {
            min = x;
        }
        if (x > max) {
            max = x;
        }
    }

    /** Adds every value of {@code values}; NaN skipped. */
    public void addAll(float[] values) {
        for (float v : values) {
            add(v);
        }
    }

    /** Merges {@code o} into this (Chan, Golub & LeVeque 1979). */
    public void merge(GlobalMoments o) {
        if (o.n == 0) {
            return;
        }
        if (n == 0) {
            n = o.n;
            mean = o.mean;
            m2 = o.m2;
            min = o.min;
            max = o.max;
            return;
        }
        long nn = n + o.n;
        double d = o.mean - mean;
        mean += d * o.n / nn;
        m2 += o.m2 + d * d * ((double) n * o.n / nn);
        n = nn;
        min = Math.min(min, o.min);
        max = Math.max(max, o.max);
    }

    /** Number of valid cells n. */
    public long count() {
        return n;
    }

    /** Mean x̄ [unit of the field]; NaN when n = 0. */
    public double mean() {
        return n == 0 ? Double.NaN : mean;
    }

    /** Population standard deviation S = √(M₂/n) [unit of the field]; 0 when every value is equal. */
    public double sd() {
        if (n == 0) {
            return Double.NaN;
        }
        if (min == max) {
            return 0.0;
        }
        return Math.sqrt(Math.max(0.0, m2) / n);
    }

    /** Smallest valid value. */
    public double min() {
        return min;
    }

    /** Largest valid value. */
    public double max() {
        return max;
    }
}
