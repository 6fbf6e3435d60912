package org.thermotile.model.resample;

/**
 * Resampling arithmetic for putting a raster onto another grid, independent of file formats and
 * coordinate systems: the caller gives positions in the source raster's pixel coordinates
 * (column, row, with cell (c, r) covering [c, c+1) × [r, r+1), its centre at (c + ½, r + ½)).
 *
 * <p>Four rules, chosen by the nature of the input (see {@code jobs/ingest}):
 * <ul>
 *   <li>{@link #nearestIndex}: the cell holding the point (class rasters at similar or finer
 *       cell size);</li>
 *   <li>{@link #majority}: the most frequent class among sub-samples of a coarser target cell;</li>
 *   <li>{@link #bilinear}: bilinear interpolation between the four nearest cell centres
 *       (continuous fields at similar or finer cell size);</li>
 *   <li>{@link #max}: the largest of the sub-samples of a coarser target cell (heights, so that a
 *       building narrower than a target cell is not flattened).</li>
 * </ul>
 * Plain Java, allocation-free per call.
 */
public final class Resample {

    private Resample() { }

    /**
     * Index of the source cell holding pixel coordinate {@code p}: ⌊p⌋. A point on a cell edge
     * belongs to the cell on its right/below (half-open cells).
     *
     * @param p pixel coordinate (column or row, cell edges at integers)
     * @return ⌊p⌋ (may lie outside the raster; the caller checks)
     */
    public static long nearestIndex(double p) {
        return (long) Math.floor(p);
    }

    /**
     * The most frequent value of {@code values[0…n−1]}, values equal to {@code noData} left out.
     * Ties go to the smallest value (our rule, so the result does not depend on sample order).
     *
     * @return the majority value, or {@code noData} when every sample is no-data or {@code n = 0}
     */
    public static int majority(int[] values, int n, int noData) {
        int best = noData;
        int bestCount = 0;
        for (int i = 0; i < n; i++) {
            int v = values[i];
            if (v == noData) {
                continue;
            }
            // Count v only at its first occurrence: O(n²), n is a few dozen sub-samples at most.
            boolean seen = false;
            for (int j = 0; j < i; j++) {
                if (values[j] == v) {
                    seen = true;
                    break;
                }
            }
            if (seen) {
                continue;
            }
            int count = 0;
            for (int j = i; j < n; j++) {
                if (values[j] == v) {
                    count++;
                }
            }
            if (count > bestCount || (count == bestCount && v < best)) {
                best = v;
                bestCount = count;
            }
        }
        return best;
    }

    /**
     * Bilinear interpolation on the unit square (Press et al. 2007, Numerical Recipes 3rd ed.,
     * §3.6, eq. 3.6.5):
     * <pre>  f = (1−t)(1−u)·f00 + t(1−u)·f10 + t·u·f11 + (1−t)·u·f01</pre>
     * with {@code t, u ∈ [0, 1]} the fractional offsets along x (columns) and y (rows) from the
     * cell centre of {@code f00}. When any of the four values is NaN (no-data), the value of the
     * nearest of the four is returned instead (NaN if that one is NaN), so no-data never bleeds
     * into a fractional mix.
     *
     * @param f00 value at (0, 0); {@code f10} at (1, 0); {@code f01} at (0, 1); {@code f11} at (1, 1)
     */
    public static double bilinear(double f00, double f10, double f01, double f11, double t, double u) {
        if (Double.isNaN(f00) || Double.isNaN(f10) || Double.isNaN(f01) || Double.isNaN(f11)) {
            boolean right = t >= 0.5;
            boolean down = u >= 0.5;
            return down ? (right ? f11 : f01) : (right ? f10 : f00);
        }
        return (1 - t) * (1 - u) * f00 + t * (1 - u) * f10 + t * u * f11 + (1 - t) * u * f01;
    }

    /**
     * The largest of {@code values[0…n−1]}, NaN (no-data) samples left out.
     *
     * @return the maximum, or NaN when every sample is NaN or {@code n = 0}
     */
    public static float max(float[] values, int n) {
        float m = Float.NaN;
        for (int i = 0; i < n; i++) {
            float v = values[i];
            if (!Float.isNaN(v) && (Float.isNaN(m) || v > m)) {
                m = v;
            }
        }
        return m;
    }

    /**
     * Sub-sample positions per axis for a target cell {@code ratio} times the source cell's
     * size: ⌈ratio − 10⁻⁶⌉, at least 1 (so a ratio of exactly 2 gives 2 × 2 samples, one per
     * source cell of an aligned grid). Sample i of k lies at offset (i + ½)/k of the target cell.
     *
     * @param ratio target cell size / source cell size (same units)
     */
    public static int subSamples(double ratio) {
        if (!(ratio > 0) || Double.isInfinite(ratio)) {
            throw new IllegalArgumentException("cell-size ratio " + ratio + " must be positive and finite");
        }
        return Math.max(1, (int) Math.ceil(ratio - 1e-6));
    }
}
