package org.thermotile.model.hotspot;

import java.util.Arrays;

/**
 * Hot and cold areas of an analysis grid: significance from Gi* and the FDR, effect size from the
 * cell's excess over the city's reference, coded by {@link ExcessBand}.
 *
 * <p>For analysis cell K with area-weighted mean x̄_K ({@link AnalysisGrid}): the Gi* z-score on
 * the band ({@link GiStar}, the global mean and S of the reference field's analysis cells), the
 * two-sided normal p = 2 Φ(−|z|), its q-value under {@link FalseDiscovery} over all valid cells,
 * and the excess Δ_K = x̄_K − x̃ over the reference's area-weighted median x̃ (the median, not the
 * mean, so a few very hot roofs do not move the reference; our choice). The band code then
 * needs both q ≤ Q and |Δ_K| ≥ Δ₀ with sign(z) = sign(Δ_K).
 *
 * <p>The excess is that of the cell itself, not of the band's local mean, so an area's outline
 * follows the cells that are warmer, while Gi* tests that the neighbourhood is warmer too.
 */
public final class HotAreas {
    private HotAreas() {}

    /** Per analysis cell, row-major: z, p, q, excess [K] and band code ({@code noData} without data). */
    public record Result(double[] z, double[] p, double[] q, double[] excessK, int[] codes, double referenceK) {
    }

    /**
     * Analyses {@code means} (w × h analysis cells).
     *
     * @param means     area-weighted means of the field analysed [K or the field's unit], NaN no data
     * @param global    n, x̄ and S of the reference field's analysis cells
     * @param reference x̃, the reference's area-weighted median
     * @param normalCdf Φ, the standard normal distribution function (given by the caller's library)
     * @param noData    the code written where there is no data
     */
    public static Result analyse(double[] means, int w, int h, DistanceBand band, GlobalMoments global, double reference,
            FalseDiscovery method, double fdr, double minExcessK, java.util.function.DoubleUnaryOperator normalCdf,
            int noData) {
        int rc = band.radiusCols(), rr = band.radiusRows();
        int ww = w + 2 * rc, wh = h + 2 * rr;
        double[] win = new double[ww * wh];
        Arrays.fill(win, Double.NaN);
        for (int r = 0; r < h; r++) {
            System.arraycopy(means, r * w, win, (r + rr) * ww + rc, w);
        }
        double[] z = new double[w * h];
        GiStar.zScores(win, w, h, band, global, z);
        double[] p = new double[w * h];
        for (int i = 0; i < p.length; i++) {
            p[i] = Double.isNaN(z[i]) ? Double.NaN : Math.min(1.0, 2.0 * normalCdf.applyAsDouble(-Math.abs(z[i])));
        }
        double[] q = method.qValues(p);
        double[] ex = new double[w * h];
        int[] codes = new int[w * h];
        for (int i = 0; i < codes.length; i++) {
            if (Double.isNaN(means[i])) {
                ex[i] = Double.NaN;
                codes[i] = noData;
                continue;
            }
            ex[i] = means[i] - reference;
            codes[i] = ExcessBand.code(ex[i], z[i], q[i], fdr, minExcessK);
        }
        return new Result(z, p, q, ex, codes, reference);
    }

    /**
     * The codes with every cluster ({@link Clusters}: 4-connected cells whose codes share a sign)
     * smaller than {@code minCells} set to {@link ExcessBand#NOT_DISTINCT}; a new array.
     */
    public static int[] dropSmall(int[] codes, int w, int h, int noData, int minCells) {
        int[] sign = new int[codes.length];
        for (int i = 0; i < codes.length; i++) {
            sign[i] = codes[i] == noData ? noData : Integer.signum(codes[i]);
        }
        Clusters c = Clusters.label(sign, w, h, noData);
        int[] out = codes.clone();
        for (int k = 0; k < c.count(); k++) {
            if (c.size(k) < minCells) {
                for (int i : c.cells(k)) {
                    out[i] = ExcessBand.NOT_DISTINCT;
                }
            }
        }
        return out;
    }
}
