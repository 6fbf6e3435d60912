package org.thermotile.model.hotspot;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * A fixed distance band on a raster: the offsets (Δcol, Δrow) of every cell whose centre lies
 * within the band distance D of a cell's centre, the cell itself included, each with its weight
 * w_ij (Getis & Ord 1992, section 2: the weights of a distance band d; Gi* includes j = i).
 *
 * <p>Distance between cell centres: d_ij = √((Δcol·a)² + (Δrow·b)²) [m], with a and b the cell
 * width and height [m]; a neighbour is in the band when d_ij ≤ D (a tolerance of 1e-9 of D keeps
 * a neighbour lying exactly on the band in, whatever the rounding of the square root).
 *
 * <p>Weights:
 * <ul>
 *   <li>{@link Weights#BINARY}: w_ij = 1 in the band, 0 outside (Getis & Ord 1992).</li>
 *   <li>{@link Weights#INVERSE_DISTANCE}: w_ij = d₀ / d_ij in the band with d₀ = min(a, b), and
 *       w_ii = 1 (our choice: the cell weighs as much as a neighbour one cell away; Gi* needs a
 *       finite self-weight, and 1/d has none). Weights are unitless, so the z-score does not
 *       depend on the length unit.</li>
 * </ul>
 *
 * <p>Offsets are ordered by Δrow then Δcol; that order fixes the summation order of
 * {@link GiStar}, so a cell's z-score does not depend on the tile it was computed in.
 */
public final class DistanceBand implements Serializable {
    private static final long serialVersionUID = 1L;

    /** How neighbours in the band are weighted. */
    public enum Weights {
        /** w = 1 inside the band. */
        BINARY("binary"),
        /** w = d₀/d inside the band, w_ii = 1. */
        INVERSE_DISTANCE("inverse_distance");

        private final String key;

        Weights(String key) {
            this.key = key;
        }

        /** The name users write ("binary", "inverse_distance"). */
        public String key() {
            return key;
        }

        /** The weights for a user's name, or null. */
        public static Weights ofKey(String key) {
            for (Weights w : values()) {
                if (w.key.equals(key)) {
                    return w;
                }
            }
            return null;
        }
    }

    /** Relative tolerance on the band edge (our choice). */
    static final double EDGE_TOLERANCE = 1e-9;

    private final double distanceM;
    private final double cellWidthM;
    private final double cellHeightM;
    private final Weights weights;
    private final int radiusCols;
    private final int radiusRows;
    private final int[] dCol;
    private final int[] dRow;
    private final double[] w;

    private DistanceBand(double distanceM, double cellWidthM, double cellHeightM, Weights weights) {
        this.distanceM = distanceM;
        this.cellWidthM = cellWidthM;
        this.cellHeightM = cellHeightM;
        this.weights = weights;
        double reach = distanceM * (1 + EDGE_TOLERANCE);
        this.radiusCols = (int) Math.floor(reach / cellWidthM);
        this.radiusRows = (int) Math.floor(reach / cellHeightM);
        double d0 = Math.min(cellWidthM, cellHeightM);
        List<int[]> offs = new ArrayList<>();
        List<Double> ws = new ArrayList<>();
        for (int dr = -radiusRows; dr <= radiusRows; dr++) {
            for (int dc = -radiusCols; dc <= radiusCols; dc++) {
                double d = Math.hypot(dc * cellWidthM, dr * cellHeightM);
                if (d <= reach) {
                    offs.add(new int[] {dc, dr});
                    ws.add(weight(weights, d, d0));
                }
            }
        }
        dCol = new int[offs.size()];
        dRow = new int[offs.size()];
        w = new double[offs.size()];
        for (int k = 0; k < dCol.length; k++) {
            dCol[k] = offs.get(k)[0];
            dRow[k] = offs.get(k)[1];
            w[k] = ws.get(k);
        }
    }

    /**
     * The band of distance {@code distanceM} on cells of {@code cellWidthM} × {@code cellHeightM}.
     *
     * @param distanceM   band distance D [m], at least the smaller cell side
     * @param cellWidthM  cell width a [m], &gt; 0
     * @param cellHeightM cell height b [m], &gt; 0 (give the absolute value of a north-up grid's)
     * @throws IllegalArgumentException if a size is not positive and finite, or D is smaller
     *                                  than one cell (the band would hold no neighbour)
     */
    public static DistanceBand of(double distanceM, double cellWidthM, double cellHeightM, Weights weights) {
        if (!(cellWidthM > 0) || !(cellHeightM > 0) || !Double.isFinite(cellWidthM) || !Double.isFinite(cellHeightM)) {
            throw new IllegalArgumentException("cell size " + cellWidthM + " × " + cellHeightM + " m must be positive");
        }
        if (!(distanceM > 0) || !Double.isFinite(distanceM)) {
            throw new IllegalArgumentException("band distance " + distanceM + " m must be a positive number of metres");
        }
        double minCell = Math.min(cellWidthM, cellHeightM);
        if (distanceM < minCell) {
            throw new IllegalArgumentException(String.format(Locale.ROOT,
                    "band distance %s m is smaller than one cell (%s m × %s m): the band would hold no neighbour",
                    num(distanceM), num(cellWidthM), num(cellHeightM)));
        }
        if (weights == null) {
            throw new IllegalArgumentException("weights must be given (binary or inverse_distance)");
        }
        return new DistanceBand(distanceM, cellWidthM, cellHeightM, weights);
    }

    /** w_ij for a neighbour at distance {@code d} [m]: 1 (binary), d₀/d (inverse distance), 1 at d = 0. */
    static double weight(Weights weights, double d, double d0) {
        if (weights == Weights.BINARY || d == 0) {
            return 1.0;
        }
        return d0 / d;
    }

    /** The band distance D [m]. */
    public double distanceM() {
        return distanceM;
    }

    /** The cell width a [m]. */
    public double cellWidthM() {
        return cellWidthM;
    }

    /** The cell height b [m]. */
    public double cellHeightM() {
        return cellHeightM;
    }

    /** The weighting. */
    public Weights weights() {
        return weights;
    }

    /** Halo width in columns: ⌊D / a⌋ [cells]. */
    public int radiusCols() {
        return radiusCols;
    }

    /** Halo height in rows: ⌊D / b⌋ [cells]. */
    public int radiusRows() {
        return radiusRows;
    }

    /** Number of cells in the band, the centre included. */
    public int size() {
        return w.length;
    }

    /** Column offset of band member {@code k}. */
    public int dCol(int k) {
        return dCol[k];
    }

    /** Row offset of band member {@code k}. */
    public int dRow(int k) {
        return dRow[k];
    }

    /** Weight of band member {@code k}. */
    public double weight(int k) {
        return w[k];
    }

    private static String num(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    @Override
    public String toString() {
        return String.format(Locale.ROOT, "%s m band (%s weights), %d cells, halo %d × %d cells",
                num(distanceM), weights.key(), size(), radiusCols, radiusRows);
    }
}
