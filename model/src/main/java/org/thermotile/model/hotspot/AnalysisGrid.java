package org.thermotile.model.hotspot;

import java.util.Locale;

/**
 * Aggregation of a simulation raster to a coarser analysis grid whose cell is a whole multiple f
 * of the simulation cell: analysis cell (C, R) holds simulation columns f·C … f·C + f − 1 and rows
 * f·R … f·R + f − 1 (the grids share their origin; the last column and row of analysis cells may
 * be partial when the raster's size is not a multiple of f).
 *
 * <p>Each analysis cell gets the area-weighted mean of its valid simulation cells,
 * <pre>  x̄_K = Σ_{i∈K} a_i x_i / Σ_{i∈K} a_i,   A_K = Σ_{i∈K, valid} a_i  [m²]</pre>
 * with a_i the simulation cell area, and its coverage A_K / (f² a) — the share of a full analysis
 * cell that holds data (partial edge cells and no-data cells lower it). No-data cells (NaN) are
 * left out of both sums; an analysis cell with no valid cell is NaN with coverage 0. Because
 * x̄_K A_K = Σ a_i x_i, the area-weighted total of the field is preserved by construction.
 *
 * <p>Sums run in double in row-major order of the simulation cells, so the result is
 * deterministic.
 *
 * @param factor      f, simulation cells per analysis cell edge (≥ 1)
 * @param width       analysis columns ⌈W / f⌉
 * @param height      analysis rows ⌈H / f⌉
 * @param mean        row-major area-weighted means [unit of the field], NaN with no data
 * @param validAreaM2 row-major A_K [m²]
 * @param coverage    row-major A_K / (f² a) [–]
 */
public record AnalysisGrid(int factor, int width, int height, double[] mean, double[] validAreaM2,
        double[] coverage) {

    /**
     * The factor f = cellSizeM / simCellM, checked to be a whole number ≥ 1.
     *
     * @throws IllegalArgumentException when the analysis cell is smaller than the simulation cell
     *                                  or not a whole multiple of it (relative tolerance 1e-9)
     */
    public static int factor(double cellSizeM, double simCellM) {
        if (!(simCellM > 0) || !(cellSizeM > 0) || !Double.isFinite(cellSizeM)) {
            throw new IllegalArgumentException("cell sizes must be positive: analysis " + cellSizeM + " m, simulation "
                    + simCellM + " m");
        }
        double f = cellSizeM / simCellM;
        long k = Math.round(f);
        if (k < 1 || f < 1 - 1e-9) {
            throw new IllegalArgumentException(String.format(Locale.ROOT,
                    "analysis cell %s m is smaller than the simulation cell %s m", cellSizeM, simCellM));
        }
        if (Math.abs(f - k) > 1e-9 * f) {
            throw new IllegalArgumentException(String.format(Locale.ROOT,
                    "analysis cell %s m is not a whole multiple of the simulation cell %s m (%.4g cells)",
                    cellSizeM, simCellM, f));
        }
        return (int) k;
    }

    /**
     * Aggregates a row-major raster of {@code w} × {@code h} square simulation cells of area
     * {@code simCellAreaM2} by the factor {@code f}.
     *
     * @param values row-major values [unit of the field], NaN for no data
     */
    public static AnalysisGrid aggregate(float[] values, int w, int h, double simCellAreaM2, int f) {
        if (values.length != w * h) {
            throw new IllegalArgumentException(values.length + " values for a " + w + " × " + h + " raster");
        }
        if (f < 1) {
            throw new IllegalArgumentException("factor " + f + " must be at least 1");
        }
        int aw = (w + f - 1) / f, ah = (h + f - 1) / f;
        double[] sum = new double[aw * ah];
        double[] area = new double[aw * ah];
        for (int r = 0; r < h; r++) {
            int ar = r / f;
            for (int c = 0; c < w; c++) {
                float v = values[r * w + c];
                if (Float.isNaN(v)) {
                    continue;
                }
                int k = ar * aw + c / f;
                sum[k] += simCellAreaM2 * v;
                area[k] += simCellAreaM2;
            }
        }
        double full = simCellAreaM2 * f * (double) f;
        double[] mean = new double[aw * ah];
        double[] cov = new double[aw * ah];
        for (int k = 0; k < mean.length; k++) {
            mean[k] = area[k] > 0 ? sum[k] / area[k] : Double.NaN;
            cov[k] = area[k] / full;
        }
        return new AnalysisGrid(f, aw, ah, mean, area, cov);
    }

    /**
     * Default minimum coverage of an analysis unit (analysis cell or zone): 0.5, half its area
     * holding valid simulation cells (our choice: a unit mostly outside the data, at the grid's
     * edge or over no-data, is described by too few cells to stand for its area).
     */
    public static final double DEFAULT_MIN_COVERAGE = 0.5;

    /** Relative tolerance on the coverage test, so a unit exactly at the minimum is kept (our choice). */
    static final double COVERAGE_TOLERANCE = 1e-9;

    /** True when a unit of coverage {@code coverage} is kept at minimum coverage {@code min}. */
    public static boolean covered(double coverage, double min) {
        return coverage > 0 && coverage >= min * (1 - COVERAGE_TOLERANCE);
    }

    /**
     * This grid with the cells below minimum coverage {@code min} (in [0, 1]) left out: their mean
     * becomes NaN (no data for Gi*, the global moments and the median), their valid area and
     * coverage are kept as computed, so the share of data each cell had stays visible. A new grid.
     */
    public AnalysisGrid withMinCoverage(double min) {
        if (!(min >= 0) || min > 1) {
            throw new IllegalArgumentException("minimum coverage " + min + " must lie in [0, 1]");
        }
        double[] m = mean.clone();
        for (int k = 0; k < m.length; k++) {
            if (!covered(coverage[k], min)) {
                m[k] = Double.NaN;
            }
        }
        return new AnalysisGrid(factor, width, height, m, validAreaM2, coverage);
    }

    /** Number of cells with some data but coverage below {@code min}: those {@link #withMinCoverage} leaves out. */
    public int belowCoverage(double min) {
        int n = 0;
        for (int k = 0; k < mean.length; k++) {
            if (!Double.isNaN(mean[k]) && !covered(coverage[k], min)) {
                n++;
            }
        }
        return n;
    }

    /**
     * Area-weighted means over zones (blocks, parcels, districts): x̄_z = Σ_{i∈z} a x_i / Σ_{i∈z} a
     * over the valid cells whose zone is z (−1: none).
     *
     * @param zoneOfCell row-major zone index per simulation cell, −1 for none
     * @param zones      number of zones
     * @return {means, valid areas [m²]}, each of length {@code zones}; a zone with no valid cell
     *         has mean NaN
     */
    public static double[][] zoneMeans(float[] values, int[] zoneOfCell, int zones, double cellAreaM2) {
        if (zoneOfCell.length != values.length) {
            throw new IllegalArgumentException(zoneOfCell.length + " zone indices for " + values.length + " values");
        }
        double[] sum = new double[zones], area = new double[zones];
        for (int i = 0; i < values.length; i++) {
            int z = zoneOfCell[i];
            if (z < 0 || Float.isNaN(values[i])) {
                continue;
            }
            sum[z] += cellAreaM2 * values[i];
            area[z] += cellAreaM2;
        }
        double[] mean = new double[zones];
        for (int z = 0; z < zones; z++) {
            mean[z] = area[z] > 0 ? sum[z] / area[z] : Double.NaN;
        }
        return new double[][] {mean, area};
    }

    /**
     * The area-weighted median of the analysis cells' means: the smallest mean x̄ such that the
     * cells with a mean ≤ x̄ hold at least half of the valid area (the lower weighted median,
     * common practice). NaN when no cell has data.
     */
    public double weightedMedian() {
        int n = 0;
        for (double v : mean) {
            if (!Double.isNaN(v)) {
                n++;
            }
        }
        if (n == 0) {
            return Double.NaN;
        }
        double[] m = new double[n], a = new double[n];
        int k = 0;
        double total = 0;
        for (int i = 0; i < mean.length; i++) {
            if (!Double.isNaN(mean[i])) {
                m[k] = mean[i];
                a[k] = validAreaM2[i];
                total += a[k];
                k++;
            }
        }
        Integer[] idx = new Integer[n];
        for (int i = 0; i < n; i++) {
            idx[i] = i;
        }
        java.util.Arrays.sort(idx, (x, y) -> {
            int c = Double.compare(m[x], m[y]);
            return c != 0 ? c : Integer.compare(x, y);
        });
        double acc = 0;
        for (int i : idx) {
            acc += a[i];
            if (acc >= total / 2) {
                return m[i];
            }
        }
        return m[idx[n - 1]];
    }
}
