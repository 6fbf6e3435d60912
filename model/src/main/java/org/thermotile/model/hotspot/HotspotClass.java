package org.thermotile.model.hotspot;

import java.io.Serializable;
import java.util.List;

/**
 * Hot and cold spot classes: the sign of the Gi* z-score and the strictest of three confidence
 * levels at which the cell's p-value passes the Benjamini–Hochberg step, capped by the run's
 * chosen FDR level Q (a cell is significant only if it also passes at Q).
 *
 * <pre>
 *   code  meaning                      passes BH at
 *    3    hot spot, 99 % confidence    FDR 0.01
 *    2    hot spot, 95 % confidence    FDR 0.05
 *    1    hot spot, 90 % confidence    FDR 0.10
 *    0    not significant
 *   −1…−3 cold spot, 90 / 95 / 99 %    (as above, z &lt; 0)
 * </pre>
 * "Confidence" is 1 − FDR level. Q must lie in (0, 0.10]: a cell passing only above 0.10 would
 * have no class.
 */
public final class HotspotClass {
    private HotspotClass() {}

    public static final int HOT_99 = 3, HOT_95 = 2, HOT_90 = 1, NOT_SIGNIFICANT = 0,
            COLD_90 = -1, COLD_95 = -2, COLD_99 = -3;

    /** FDR levels of the three confidence classes: 0.10, 0.05, 0.01. */
    public static final double[] LEVELS = {0.10, 0.05, 0.01};

    /** Largest FDR level Q accepted. */
    public static final double MAX_FDR = 0.10;

    /** One line of the code table. */
    public record Code(int code, String label) {
    }

    /** The code table, hottest first. */
    public static final List<Code> TABLE = List.of(
            new Code(HOT_99, "hot spot, 99 % confidence"),
            new Code(HOT_95, "hot spot, 95 % confidence"),
            new Code(HOT_90, "hot spot, 90 % confidence"),
            new Code(NOT_SIGNIFICANT, "not significant"),
            new Code(COLD_90, "cold spot, 90 % confidence"),
            new Code(COLD_95, "cold spot, 95 % confidence"),
            new Code(COLD_99, "cold spot, 99 % confidence"));

    /** The label of a code ("hot spot, 95 % confidence"). */
    public static String label(int code) {
        for (Code c : TABLE) {
            if (c.code == code) {
                return c.label;
            }
        }
        throw new IllegalArgumentException("no hotspot class " + code);
    }

    /**
     * The p-value thresholds of the classes: a cell is in a class of magnitude 1, 2, 3 when its
     * p ≤ {@code p90}, {@code p95}, {@code p99}; {@link BenjaminiHochberg#NONE} when nothing
     * passes. Each already includes the cap at Q.
     */
    public record Thresholds(double fdr, double p90, double p95, double p99) implements Serializable {

        /**
         * The thresholds from the sorted p-values of every valid cell: p_L = min(t(L), t(Q))
         * with t the Benjamini–Hochberg threshold at level L ∈ {0.10, 0.05, 0.01}.
         *
         * @param fdr Q, 0 &lt; Q ≤ 0.10
         */
        public static Thresholds of(double[] sortedP, double fdr) {
            if (!(fdr > 0) || fdr > MAX_FDR) {
                throw new IllegalArgumentException("FDR level " + fdr + " must lie in (0, " + MAX_FDR + "]");
            }
            double tq = BenjaminiHochberg.threshold(sortedP, fdr);
            double[] t = new double[LEVELS.length];
            for (int i = 0; i < LEVELS.length; i++) {
                t[i] = Math.min(BenjaminiHochberg.threshold(sortedP, LEVELS[i]), tq);
            }
            return new Thresholds(fdr, t[0], t[1], t[2]);
        }
    }

    /**
     * The class code of a cell: sign(z) × (3 if p ≤ p99, 2 if p ≤ p95, 1 if p ≤ p90, else 0).
     *
     * @param z Gi* z-score, NaN for no data (then 0 is returned; callers mark no data themselves)
     * @param p its two-sided p-value
     */
    public static int code(double z, double p, Thresholds t) {
        if (Double.isNaN(z) || Double.isNaN(p) || z == 0) {
            return NOT_SIGNIFICANT;
        }
        int magnitude = p <= t.p99() ? 3 : p <= t.p95() ? 2 : p <= t.p90() ? 1 : 0;
        return z > 0 ? magnitude : -magnitude;
    }
}
