package org.thermotile.model.hotspot;

/**
 * The Getis–Ord Gi* statistic in its standardised (z-score) form on a raster window, with the
 * global mean and standard deviation given.
 *
 * <p>For cell i with the band weights w_ij of {@link DistanceBand} (j = i included):
 * <pre>
 *            Σ_j w_ij x_j − x̄ W_i
 *   Gi* = ──────────────────────────────────,   W_i = Σ_j w_ij,  S₁ᵢ = Σ_j w_ij²
 *          S √( (n S₁ᵢ − W_i²) / (n − 1) )
 * </pre>
 * with x̄ and S the mean and population standard deviation of all n valid cells of the field
 * ({@link GlobalMoments}). Getis & Ord (1992), "The analysis of spatial association by use of
 * distance statistics", Geographical Analysis 24(3) 189–206; standardised form of Ord & Getis
 * (1995), "Local spatial autocorrelation statistics: distributional issues and an application",
 * Geographical Analysis 27(4) 286–306 (the form written here from memory). Under the null
 * hypothesis of no spatial association Gi* is approximately standard normal when the band holds
 * enough cells (Ord & Getis 1995 discuss the approximation).
 *
 * <p>No-data cells (NaN) are left out of the neighbours (w_ij = 0) and get a NaN z-score. Two
 * degenerate cases get z = 0 (nothing stands out): a uniform field (S = 0) and a cell whose band
 * holds every valid cell of the field (n S₁ᵢ − W_i² ≤ 0).
 *
 * <p>Cost: O(cells × band size). The sums run over the band offsets in the band's fixed order for
 * every cell, so a cell's z-score is the same bits whatever window it was computed in.
 */
public final class GiStar {
    private GiStar() {}

    /**
     * Gi* z-scores of the core of a window.
     *
     * <p>The window is the core ({@code coreWidth} × {@code coreHeight} cells) with a halo of
     * exactly {@link DistanceBand#radiusCols()} columns and {@link DistanceBand#radiusRows()} rows
     * on every side; halo cells beyond the raster's edge hold NaN.
     *
     * @param window     row-major values of the window [unit of the field], NaN for no data;
     *                   length (coreWidth + 2·radiusCols) · (coreHeight + 2·radiusRows)
     * @param coreWidth  core columns (≥ 1)
     * @param coreHeight core rows (≥ 1)
     * @param band       the distance band and its weights
     * @param global     n, x̄ and S of the whole field (n ≥ 2)
     * @param z          out: row-major z-scores of the core, NaN where the core cell is no data
     */
    public static void zScores(double[] window, int coreWidth, int coreHeight, DistanceBand band,
            GlobalMoments global, double[] z) {
        zScores(window, coreWidth, coreHeight, band, global, z, null);
    }

    /**
     * As {@link #zScores(double[], int, int, DistanceBand, GlobalMoments, double[])}, and also the
     * band's weighted local mean x̄_i = Σ_j w_ij x_j / Σ_j w_ij over valid neighbours [unit of the
     * field] (the quantity Gi* tests against x̄; NaN where the core cell is no data).
     *
     * @param localMean out, or null
     */
    public static void zScores(double[] window, int coreWidth, int coreHeight, DistanceBand band,
            GlobalMoments global, double[] z, double[] localMean) {
        int rc = band.radiusCols(), rr = band.radiusRows();
        int winW = coreWidth + 2 * rc;
        int winH = coreHeight + 2 * rr;
        int cells = coreWidth * coreHeight;
        if (window.length != winW * winH) {
            throw new IllegalArgumentException("window has " + window.length + " values; core " + coreWidth + " × "
                    + coreHeight + " with halo " + rc + " × " + rr + " needs " + winW + " × " + winH);
        }
        if (z.length != cells) {
            throw new IllegalArgumentException("z has " + z.length + " values for a core of " + cells);
        }
        if (global.count() < 2) {
            throw new IllegalArgumentException("Gi* needs at least 2 valid cells, the field has " + global.count());
        }
        double[] x0 = new double[window.length];          // values with no data as 0
        double[] valid = new double[window.length];       // 1 valid, 0 no data
        for (int i = 0; i < window.length; i++) {
            double v = window[i];
            boolean ok = !Double.isNaN(v);
            x0[i] = ok ? v : 0.0;
            valid[i] = ok ? 1.0 : 0.0;
        }
        double[] sumWX = new double[cells];
        double[] sumW = new double[cells];
        double[] sumW2 = new double[cells];
        for (int k = 0; k < band.size(); k++) {
            double w = band.weight(k);
            double w2 = w * w;
            int shift = (rr + band.dRow(k)) * winW + rc + band.dCol(k);
            for (int r = 0; r < coreHeight; r++) {
                int src = r * winW + shift;
                int dst = r * coreWidth;
                for (int c = 0; c < coreWidth; c++) {
                    int j = src + c;
                    int i = dst + c;
                    sumWX[i] += w * x0[j];
                    sumW[i] += w * valid[j];
                    sumW2[i] += w2 * valid[j];
                }
            }
        }
        double n = global.count();
        double mean = global.mean();
        double s = global.sd();
        for (int r = 0; r < coreHeight; r++) {
            for (int c = 0; c < coreWidth; c++) {
                int i = r * coreWidth + c;
                double xi = window[(r + rr) * winW + c + rc];
                z[i] = Double.isNaN(xi) ? Double.NaN : zScore(sumWX[i], sumW[i], sumW2[i], n, mean, s);
                if (localMean != null) {
                    localMean[i] = Double.isNaN(xi) ? Double.NaN : sumWX[i] / sumW[i];
                }
            }
        }
    }

    /**
     * One standardised Gi* from its sums (Ord & Getis 1995):
     * (Σw x − x̄ W) / (S √((n S₁ − W²)/(n − 1))); 0 when S = 0 or n S₁ − W² ≤ 0.
     *
     * @param sumWX Σ_j w_ij x_j [unit of the field]
     * @param sumW  W_i = Σ_j w_ij [–]
     * @param sumW2 S₁ᵢ = Σ_j w_ij² [–]
     * @param n     number of valid cells of the field
     * @param mean  x̄ [unit of the field]
     * @param sd    S, population standard deviation [unit of the field]
     */
    public static double zScore(double sumWX, double sumW, double sumW2, double n, double mean, double sd) {
        double spread = n * sumW2 - sumW * sumW;
        if (!(sd > 0) || !(spread > 0)) {
            return 0.0;
        }
        return (sumWX - mean * sumW) / (sd * Math.sqrt(spread / (n - 1)));
    }
}
