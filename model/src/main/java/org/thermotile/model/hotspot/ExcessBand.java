package org.thermotile.model.hotspot;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * thermotile's coding of hot and cold areas: a signed excess band from the local mean's excess
 * over the city's reference (its area-weighted median) and the cell's FDR q-value.
 *
 * <p>With Δ = local mean − reference [K] (the Gi* band's weighted mean, Σ w x / Σ w), the minimum
 * excess Δ₀ &gt; 0 and the FDR level Q, a cell is distinct when q ≤ Q, sign(z) = sign(Δ) and
 * |Δ| ≥ Δ₀. Its band is the largest of Δ₀, 2Δ₀, 4Δ₀ that |Δ| reaches, signed; the code written
 * to the band raster is that lower edge in tenths of a kelvin (Δ₀ = 1 K: +10, +20, +40 warmer,
 * −10, −20, −40 cooler), 0 not distinct. The labels read "warmer by ≥ 2 K", "cooler by ≥ 1 K",
 * "not distinct" (our coding).
 */
public final class ExcessBand {
    private ExcessBand() {}

    /** Code of a cell that is not distinct. */
    public static final int NOT_DISTINCT = 0;

    /** Band multipliers of Δ₀ (our choice: doublings). */
    public static final int[] STEPS = {1, 2, 4};

    /** Largest minimum excess accepted [K] (our choice; codes stay within int16). */
    public static final double MAX_MIN_EXCESS_K = 50;

    /** One band: its code and label. */
    public record Band(int code, String label) {
    }

    /** The bands for minimum excess {@code minExcessK}, warmest first, "not distinct" in the middle. */
    public static List<Band> table(double minExcessK) {
        check(minExcessK);
        List<Band> out = new ArrayList<>();
        for (int s = STEPS.length - 1; s >= 0; s--) {
            out.add(new Band(code(STEPS[s] * minExcessK), "warmer by >= " + kelvin(STEPS[s] * minExcessK)));
        }
        out.add(new Band(NOT_DISTINCT, "not distinct"));
        for (int s = 0; s < STEPS.length; s++) {
            out.add(new Band(-code(STEPS[s] * minExcessK), "cooler by >= " + kelvin(STEPS[s] * minExcessK)));
        }
        return out;
    }

    /** The label of a code in the table of {@code minExcessK}. */
    public static String label(int code, double minExcessK) {
        for (Band b : table(minExcessK)) {
            if (b.code() == code) {
                return b.label();
            }
        }
        throw new IllegalArgumentException("no excess band " + code + " for a minimum excess of " + minExcessK + " K");
    }

    /**
     * The band code of a cell.
     *
     * @param excessK    Δ [K], NaN for no data (then 0)
     * @param z          Gi* z-score
     * @param q          its q-value
     * @param fdr        Q
     * @param minExcessK Δ₀ [K]
     */
    public static int code(double excessK, double z, double q, double fdr, double minExcessK) {
        if (Double.isNaN(excessK) || Double.isNaN(z) || Double.isNaN(q) || !(q <= fdr)) {
            return NOT_DISTINCT;
        }
        double a = Math.abs(excessK);
        if (a < minExcessK || Math.signum(z) != Math.signum(excessK)) {
            return NOT_DISTINCT;
        }
        int c = 0;
        for (int s : STEPS) {
            if (a >= s * minExcessK) {
                c = code(s * minExcessK);
            }
        }
        return excessK > 0 ? c : -c;
    }

    /** Checks Δ₀: in (0, {@value #MAX_MIN_EXCESS_K}] K. */
    public static void check(double minExcessK) {
        if (!(minExcessK > 0) || minExcessK > MAX_MIN_EXCESS_K) {
            throw new IllegalArgumentException("minimum excess " + minExcessK + " K must lie in (0, " + MAX_MIN_EXCESS_K
                    + "] K");
        }
    }

    private static int code(double edgeK) {
        return (int) Math.round(edgeK * 10);
    }

    private static String kelvin(double k) {
        return k == Math.rint(k) ? String.format(Locale.ROOT, "%d K", (long) k) : String.format(Locale.ROOT, "%.1f K", k);
    }
}
