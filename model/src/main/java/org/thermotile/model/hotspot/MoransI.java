package org.thermotile.model.hotspot;

import java.util.Locale;

/**
 * Global Moran's I on a raster with binary distance-band weights, its z-score, and the default
 * band distance of a hot-spot analysis found from it (incremental spatial autocorrelation).
 *
 * <p>With w_ij = 1 when j ≠ i lies within the band distance D of i (binary {@link DistanceBand}
 * without the cell itself), z_i = x_i − x̄ over the n valid cells:
 * <pre>
 *   I = (n / S₀) · Σ_i Σ_j w_ij z_i z_j / Σ_i z_i²,   S₀ = Σ_i Σ_j w_ij
 * </pre>
 * (Moran 1950, "Notes on continuous stochastic phenomena", Biometrika 37(1/2) 17–23). Its
 * expectation and variance under the normality assumption (Cliff & Ord 1981, "Spatial
 * Processes: Models and Applications", Pion, London, eqs. 1.35–1.36; written here from memory
 * and checked in the tests against permutations):
 * <pre>
 *   E[I] = −1/(n − 1),
 *   Var[I] = (n² S₁ − n S₂ + 3 S₀²) / (S₀² (n² − 1)) − E[I]²,
 *   S₁ = ½ Σ_i Σ_j (w_ij + w_ji)²,  S₂ = Σ_i (w_i· + w_·i)²,
 *   z = (I − E[I]) / √Var[I].
 * </pre>
 * For symmetric binary weights S₁ = 2 S₀ and S₂ = 4 Σ_i w_i·².
 *
 * <p>Cost: O(n × band size) per distance. No-data cells (NaN) are left out.
 */
public final class MoransI {
    private MoransI() {}

    /** I, its expectation, variance and z-score at one distance; S₀ = 0 gives NaN I and z. */
    public record Result(double distanceM, double i, double expected, double variance, double z) {
    }

    /**
     * Moran's I of a row-major raster with binary weights of band distance {@code distanceM}.
     *
     * @param values row-major values, NaN for no data
     */
    public static Result of(double[] values, int w, int h, double cellWidthM, double cellHeightM, double distanceM) {
        if (values.length != w * h) {
            throw new IllegalArgumentException(values.length + " values for a " + w + " × " + h + " raster");
        }
        DistanceBand band = DistanceBand.of(distanceM, cellWidthM, cellHeightM, DistanceBand.Weights.BINARY);
        Moments mo = Moments.of(values, "Moran's I needs at least 3 valid cells, the field has ");
        int n = mo.n();
        double mean = mo.mean(), m2 = mo.m2();
        double cross = 0, s0 = 0, sumRow2 = 0;
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                double xi = values[r * w + c];
                if (Double.isNaN(xi)) {
                    continue;
                }
                double zi = xi - mean;
                double rowSum = 0, rowCross = 0;
                for (int k = 0; k < band.size(); k++) {
                    int dc = band.dCol(k), dr = band.dRow(k);
                    if (dc == 0 && dr == 0) {
                        continue;
                    }
                    int cc = c + dc, rr = r + dr;
                    if (cc < 0 || cc >= w || rr < 0 || rr >= h) {
                        continue;
                    }
                    double xj = values[rr * w + cc];
                    if (Double.isNaN(xj)) {
                        continue;
                    }
                    rowSum += 1;
                    rowCross += xj - mean;
                }
                cross += zi * rowCross;
                s0 += rowSum;
                sumRow2 += rowSum * rowSum;
            }
        }
        return fromSums(distanceM, n, s0, sumRow2, cross, m2);
    }

    /**
     * Count, mean and sum of squared deviations of the values with data, in two passes (the order
     * of operations both Moran's I paths have always used).
     */
    record Moments(int n, double mean, double m2) {
        /** @throws IllegalArgumentException {@code tooFew + n} when fewer than 3 values have data */
        static Moments of(double[] values, String tooFew) {
            int n = 0;
            double sum = 0;
            for (double v : values) {
                if (!Double.isNaN(v)) {
                    n++;
                    sum += v;
                }
            }
            if (n < 3) {
                throw new IllegalArgumentException(tooFew + n);
            }
            double mean = sum / n;
            double m2 = 0;
            for (double v : values) {
                if (!Double.isNaN(v)) {
                    m2 += (v - mean) * (v - mean);
                }
            }
            return new Moments(n, mean, m2);
        }
    }

    /**
     * I, E[I], Var[I] and z from the sums of symmetric binary weights (any support: raster cells or
     * zone centroids): n valid units, S₀ = Σ_i w_i·, Σ_i w_i·², Σ_i z_i Σ_j w_ij z_j and Σ_i z_i².
     */
    static Result fromSums(double distanceM, int n, double s0, double sumRow2, double cross, double m2) {
        double e = -1.0 / (n - 1);
        if (s0 == 0 || m2 == 0) {
            return new Result(distanceM, Double.NaN, e, Double.NaN, Double.NaN);
        }
        double i = n / s0 * cross / m2;
        double s1 = 2 * s0, s2 = 4 * sumRow2;
        double nn = n;
        double var = (nn * nn * s1 - nn * s2 + 3 * s0 * s0) / (s0 * s0 * (nn * nn - 1)) - e * e;
        return new Result(distanceM, i, e, var, (i - e) / Math.sqrt(var));
    }

    /**
     * The default band distance: the distance of the largest Moran's I z-score over
     * D_k = k · cell, k = 1 … {@code steps} (incremental spatial autocorrelation; the peak is where
     * clustering is most pronounced, common practice). Ties go to the smaller distance. Bounded
     * below by one cell by construction.
     *
     * @param cellM analysis cell size [m] (square cells)
     * @param steps number of distances scanned (≥ 1)
     * @return the scan, one result per distance; {@link #peak} picks the distance
     */
    public static Result[] scan(double[] values, int w, int h, double cellM, int steps) {
        if (steps < 1) {
            throw new IllegalArgumentException(String.format(Locale.ROOT, "steps %d must be at least 1", steps));
        }
        Result[] out = new Result[steps];
        for (int k = 1; k <= steps; k++) {
            out[k - 1] = of(values, w, h, cellM, cellM, k * cellM);
        }
        return out;
    }

    /** The distance of the largest finite z in a scan, or the first distance when none is finite. */
    public static double peak(Result[] scan) {
        double best = Double.NEGATIVE_INFINITY, d = scan[0].distanceM();
        for (Result r : scan) {
            if (Double.isFinite(r.z()) && r.z() > best) {
                best = r.z();
                d = r.distanceM();
            }
        }
        return d;
    }
}
