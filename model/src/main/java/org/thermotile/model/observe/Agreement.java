package org.thermotile.model.observe;

import java.io.Serializable;

/**
 * Streaming agreement between simulated s and observed o values: count, bias, RMSE, MAE and
 * Pearson's r, mergeable so partial accumulators (tiles, Spark partitions) combine exactly.
 *
 * <p>With d = s − o: {@code bias = Σd/n}, {@code RMSE = √(Σd²/n)}, {@code MAE = Σ|d|/n} [K];
 * {@code r = C_so / √(M_s M_o)} from co-moments updated by Welford's method and merged by the
 * pairwise formulas of Chan, Golub &amp; LeVeque (1983), "Algorithms for computing the sample
 * variance", Amer. Statistician 37(3), 242–247. Pairs with a NaN are skipped.
 */
public final class Agreement implements Serializable {
    private static final long serialVersionUID = 1L;

    private long n;
    private double sumD;
    private double sumD2;
    private double sumAbsD;
    private double meanS;
    private double meanO;
    private double m2S;
    private double m2O;
    private double cSO;

    /** Adds one pair (simulated, observed) [K or °C, both the same]. */
    public void add(double simulated, double observed) {
        if (Double.isNaN(simulated) || Double.isNaN(observed)) {
            return;
        }
        double d = simulated - observed;
        n++;
        sumD += d;
        sumD2 += d * d;
        sumAbsD += Math.abs(d);
        double ds = simulated - meanS;
        double dO = observed - meanO;
        meanS += ds / n;
        meanO += dO / n;
        m2S += ds * (simulated - meanS);
        m2O += dO * (observed - meanO);
        cSO += ds * (observed - meanO);
    }

    /** Merges {@code other} into this accumulator (Chan et al. 1983) and returns this. */
    public Agreement merge(Agreement other) {
        if (other.n == 0) {
            return this;
        }
        if (n == 0) {
            n = other.n; sumD = other.sumD; sumD2 = other.sumD2; sumAbsD = other.sumAbsD;
            meanS = other.meanS; meanO = other.meanO; m2S = other.m2S; m2O = other.m2O; cSO = other.cSO;
            return this;
        }
        long total = n + other.n;
        double ds = other.meanS - meanS;
        double dO = other.meanO - meanO;
        double f = (double) n * other.n / total;
        m2S += other.m2S + ds * ds * f;
        m2O += other.m2O + dO * dO * f;
        cSO += other.cSO + ds * dO * f;
        meanS += ds * other.n / total;
        meanO += dO * other.n / total;
        sumD += other.sumD;
        sumD2 += other.sumD2;
        sumAbsD += other.sumAbsD;
        n = total;
        return this;
    }

    /** Number of pairs. */
    public long count() { return n; }
    /** Mean of s − o; NaN when empty. */
    public double bias() { return n == 0 ? Double.NaN : sumD / n; }
    /** Root-mean-square of s − o; NaN when empty. */
    public double rmse() { return n == 0 ? Double.NaN : Math.sqrt(sumD2 / n); }
    /** Mean absolute s − o; NaN when empty. */
    public double mae() { return n == 0 ? Double.NaN : sumAbsD / n; }
    /** Sum of squared differences Σ(s − o)² (the calibration objective's term). */
    public double sumSquares() { return sumD2; }
    /** Pearson's r; NaN when fewer than two pairs or either side is constant. */
    public double pearson() {
        if (n < 2 || m2S <= 0 || m2O <= 0) {
            return Double.NaN;
        }
        return cSO / Math.sqrt(m2S * m2O);
    }
}
