package org.thermotile.model.geometry;

/**
 * Sky view factor of each cell of a heights raster by the horizon-angle method: the fraction of
 * the radiation leaving a horizontal surface that reaches the sky (equivalently, by reciprocity,
 * the fraction of an isotropic sky's irradiance that reaches it).
 *
 * <p><b>Method.</b> For a horizontal surface under an isotropic sky, the sky above a horizon of
 * elevation β in an azimuth sector dφ contributes
 * <pre>
 *   dΨ = (1/π) ∫₀^{π/2−β} cos θ sin θ dθ dφ = cos²β dφ / (2π)
 * </pre>
 * (θ zenith angle, cos θ the Lambert weight), so over the full circle
 * <pre>
 *   Ψ_sky = (1/2π) ∫₀^{2π} cos²β(φ) dφ ≈ (1/N) Σ_k cos²β_k = 1 − (1/N) Σ_k sin²β_k        (1)
 * </pre>
 * the flat-surface case of Dozier &amp; Frew (1990), "Rapid calculation of terrain parameters for
 * radiation modeling from digital elevation data", IEEE Trans. Geosci. Remote Sens. 28(5),
 * 963–969 (from memory); with cos²β = 1/(1 + tan²β) no trigonometry is needed per cell. The N
 * azimuths are φ_k = 360°·k/N (k = 0…N−1; north first), the trapezoid rule for a periodic
 * integrand, whose error falls fast with N: for the infinite street canyon of H/W = 2 (horizon
 * tan β = 4|sin φ|) it is 0.009 at N = 16 and 0.0002 at N = 32 (hence the default 32).
 *
 * <p><b>Horizon.</b> For each direction, tan β_k = max(0, max over the cells the ray enters of
 * (h − h₀)/d), where h₀ is the cell's own height (so a roof sees the sky above its own height),
 * h the height of a cell the ray enters and d the horizontal distance [m] at which it enters it
 * (a cell is a flat-topped block; see {@link GridRay}). β ≥ 0: a horizontal surface never sees
 * below its own plane, so lower neighbours do not raise Ψ above 1. Flat open ground gives
 * exactly 1.
 *
 * <p><b>Domain and what is approximated.</b> The horizon is searched within the search radius R;
 * an obstacle beyond it is missed, which overestimates Ψ by at most
 * ΔH²/(ΔH² + R²) (ΔH the tallest height above the cell beyond R), and in practice far less. The
 * raster's outside counts as open ground (heights 0): a ray stops at the raster's edge. For exact
 * tile edges, give the tile's window a halo of {@link #haloCells()} cells on every side (cells
 * outside the city padded with 0 m). Cells are square; the surface is horizontal (walls and
 * slopes are not receiving surfaces here).
 *
 * <p>Cost: per cell and direction at most ⌈1.5 R/cell⌉ + 2 steps, fewer where the search stops
 * early (once no height in the raster could rise above the horizon found so far). No allocation
 * after construction; an instance is immutable and may be shared between threads.
 */
public final class SkyViewFactor {
    /** Default number of azimuth directions. */
    public static final int DEFAULT_DIRECTIONS = 32;
    /** Fewest directions accepted. */
    public static final int MIN_DIRECTIONS = 4;

    private final double cellM;
    private final double searchRadiusM;
    private final int directions;
    private final int[][] dCol;
    private final int[][] dRow;
    private final double[][] entryM;
    private final int[] steps;

    /** With {@link #DEFAULT_DIRECTIONS} directions. */
    public SkyViewFactor(double cellM, double searchRadiusM) {
        this(cellM, searchRadiusM, DEFAULT_DIRECTIONS);
    }

    /**
     * @param cellM         cell size [m], &gt; 0
     * @param searchRadiusM horizon search radius R [m], ≥ one cell
     * @param directions    number of azimuth directions N, ≥ {@link #MIN_DIRECTIONS}
     */
    public SkyViewFactor(double cellM, double searchRadiusM, int directions) {
        HeightRaster.checkCell(cellM);
        if (!(searchRadiusM >= cellM && searchRadiusM < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("sky view search radius " + searchRadiusM
                    + " m: must be finite and at least one cell (" + cellM + " m)");
        }
        if (directions < MIN_DIRECTIONS) {
            throw new IllegalArgumentException("sky view directions " + directions + ": need at least "
                    + MIN_DIRECTIONS + " (default " + DEFAULT_DIRECTIONS + ")");
        }
        this.cellM = cellM;
        this.searchRadiusM = searchRadiusM;
        this.directions = directions;
        int cap = GridRay.capacity(searchRadiusM / cellM);
        dCol = new int[directions][cap];
        dRow = new int[directions][cap];
        entryM = new double[directions][cap];
        steps = new int[directions];
        for (int k = 0; k < directions; k++) {
            steps[k] = GridRay.trace(360.0 * k / directions, cellM, searchRadiusM, dCol[k], dRow[k], entryM[k]);
        }
    }

    public int directions() {
        return directions;
    }

    public double searchRadiusM() {
        return searchRadiusM;
    }

    public double cellM() {
        return cellM;
    }

    /** The halo [cells] a tile's window needs on every side for exact edges: ⌈R / cell⌉. */
    public int haloCells() {
        return (int) Math.ceil(searchRadiusM / cellM);
    }

    /**
     * The isotropic-sky weight of one direction, cos²β = 1/(1 + tan²β) [–] (eq. 1's summand).
     *
     * @param tanHorizon tan β of the horizon, ≥ 0
     */
    public static double directionWeight(double tanHorizon) {
        return 1.0 / (1.0 + tanHorizon * tanHorizon);
    }

    /**
     * Sky view factor Ψ_sky [–] (eq. 1) of every cell of a window of the raster, written
     * row-major to {@code out}; the rest of the raster is the window's surroundings (its halo).
     *
     * @param heightsM heights above ground [m], {@code cols × rows} row-major, finite, 0…1000 m
     * @param col0     first column of the window
     * @param row0     first row of the window
     * @param out      {@code wCols × wRows} values in [0, 1]
     * @throws IllegalArgumentException for a bad raster (naming the row and column), or a window
     *         outside it
     */
    public void window(float[] heightsM, int cols, int rows, int col0, int row0, int wCols, int wRows,
            double[] out) {
        double maxH = HeightRaster.checkHeights("heights", heightsM, cols, rows);
        HeightRaster.checkWindow(cols, rows, col0, row0, wCols, wRows, out.length);
        for (int wr = 0; wr < wRows; wr++) {
            for (int wc = 0; wc < wCols; wc++) {
                out[wr * wCols + wc] = cell(heightsM, cols, rows, col0 + wc, row0 + wr, maxH);
            }
        }
    }

    /** Sky view factor Ψ_sky [–] (eq. 1) of every cell of the raster (the window is all of it). */
    public double[] all(float[] heightsM, int cols, int rows) {
        double[] out = new double[cols * rows];
        window(heightsM, cols, rows, 0, 0, cols, rows, out);
        return out;
    }

    /** Sky view factor Ψ_sky [–] (eq. 1) of one cell. */
    public double at(float[] heightsM, int cols, int rows, int col, int row) {
        double maxH = HeightRaster.checkHeights("heights", heightsM, cols, rows);
        HeightRaster.checkWindow(cols, rows, col, row, 1, 1, 1);
        return cell(heightsM, cols, rows, col, row, maxH);
    }

    /** tan β of the horizon of one cell in direction {@code k} (azimuth 360°·k/N). */
    public double tanHorizon(float[] heightsM, int cols, int rows, int col, int row, int k) {
        double maxH = HeightRaster.checkHeights("heights", heightsM, cols, rows);
        HeightRaster.checkWindow(cols, rows, col, row, 1, 1, 1);
        return tanHorizon(heightsM, cols, rows, col, row, k, maxH);
    }

    private double cell(float[] h, int cols, int rows, int col, int row, double maxH) {
        double sum = 0;
        for (int k = 0; k < directions; k++) {
            double t = tanHorizon(h, cols, rows, col, row, k, maxH);
            sum += 1.0 / (1.0 + t * t);
        }
        return sum / directions;
    }

    private double tanHorizon(float[] h, int cols, int rows, int col, int row, int k, double maxH) {
        final int[] dc = dCol[k];
        final int[] dr = dRow[k];
        final double[] e = entryM[k];
        final int n = steps[k];
        final double h0 = h[row * cols + col];
        final double reach = maxH - h0; // no cell rises more than this above the start
        double best = 0;
        for (int i = 0; i < n; i++) {
            double d = e[i];
            if (reach <= best * d) {
                break; // nothing further can rise above the horizon found so far
            }
            int c = col + dc[i];
            int r = row + dr[i];
            if (c < 0 || c >= cols || r < 0 || r >= rows) {
                break; // the traversal is monotone: once outside, it stays outside
            }
            double dh = h[r * cols + c] - h0;
            if (dh > best * d) {
                best = dh / d;
            }
        }
        return best;
    }
}
