package org.thermotile.model.hotspot;

import java.util.Arrays;

/**
 * The Benjamini–Hochberg step-up procedure for controlling the false discovery rate (FDR) at
 * level q (Benjamini & Hochberg 1995, "Controlling the false discovery rate: a practical and
 * powerful approach to multiple testing", J. R. Statist. Soc. B 57(1) 289–300, section 3):
 * with the m p-values sorted, p₍₁₎ ≤ … ≤ p₍ₘ₎, let k be the largest i with
 * <pre>  p₍ᵢ₎ ≤ (i / m) · q</pre>
 * and reject the hypotheses of p₍₁₎ … p₍ₖ₎, i.e. every p ≤ p₍ₖ₎; none when no i qualifies.
 * Rejecting at level q is the same as the BH-adjusted p-value being at most q.
 *
 * <p>The procedure's FDR guarantee holds for independent tests (Benjamini & Hochberg 1995) and
 * for tests with positive regression dependency (Benjamini & Yekutieli 2001, Ann. Statist.
 * 29(4)); neighbouring Gi* z-scores share cells, so on a map the level is a guide rather than an
 * exact rate.
 */
public final class BenjaminiHochberg {
    private BenjaminiHochberg() {}

    /** The threshold when nothing is rejected: no p-value (≥ 0) is at or below it. */
    public static final double NONE = -1.0;

    /** The valid (non-NaN) p-values of {@code p}, sorted ascending (a new array). */
    public static double[] sortedValid(double[] p) {
        int m = 0;
        for (double v : p) {
            if (!Double.isNaN(v)) {
                m++;
            }
        }
        double[] s = new double[m];
        int k = 0;
        for (double v : p) {
            if (!Double.isNaN(v)) {
                s[k++] = v;
            }
        }
        Arrays.sort(s);
        return s;
    }

    /**
     * The number k of hypotheses rejected at FDR level {@code q}.
     *
     * @param sortedP p-values in [0, 1], sorted ascending, m = length
     * @param q       FDR level, 0 &lt; q &lt; 1
     */
    public static int rejections(double[] sortedP, double q) {
        if (!(q > 0) || !(q < 1)) {
            throw new IllegalArgumentException("FDR level " + q + " must lie strictly between 0 and 1");
        }
        int m = sortedP.length;
        for (int i = m; i >= 1; i--) {
            if (sortedP[i - 1] <= (double) i / m * q) {
                return i;
            }
        }
        return 0;
    }

    /**
     * The rejection threshold p₍ₖ₎ at level {@code q}: a test is rejected when its p ≤ the
     * threshold; {@link #NONE} when nothing is rejected.
     */
    public static double threshold(double[] sortedP, double q) {
        int k = rejections(sortedP, q);
        return k == 0 ? NONE : sortedP[k - 1];
    }
}
