package org.thermotile.model.geometry;

/**
 * Cast shadows of buildings (opaque) and trees (partly transparent to beam sunlight) on every
 * cell of a window of a heights raster, for one sun position.
 *
 * <p><b>Test.</b> A cell of height h₀ lies in a cast shadow when, walking from it towards the sun
 * (azimuth A) over the cells the ray enters, some height rises above the sun's elevation line:
 * <pre>
 *   h(d) − h₀ &gt; d · tan e                                                          (1)
 * </pre>
 * with e the solar elevation and d the horizontal distance [m] at which the ray enters the cell
 * of height h (cells are flat-topped blocks, so the entry point is where a block's top is seen
 * highest; see {@link GridRay}). The same ray is replayed for every cell, one step per cell
 * crossed, so one hour of a 256 × 256 tile costs a few ray lengths per cell.
 *
 * <p><b>Beam factor.</b> 0 where a building (the heights raster) satisfies (1), τ (the canopy
 * transmissivity for beam sunlight) where only trees do, 1 otherwise. A cell whose own tree
 * height exceeds its height lies under a canopy (d = 0 in (1)). One canopy crossing is counted
 * whatever the number of crowns along the path (τ is not compounded).
 *
 * <p><b>Halo and what is approximated.</b> An obstacle of height H shades at most H / tan e
 * away, so a tile whose window carries a halo of {@link #haloCells(double, double, double)}
 * cells for its tallest height and the lowest elevation e_min at which shadows are computed has
 * exact edges for every sun at or above e_min. Each ray is searched only as far as that halo
 * distance (and stops early once d·tan e exceeds the tallest height above the cell). For a sun
 * lower than e_min, shadows longer than the halo would be cut off at it; callers should not ask
 * for them and treat such hours' beam otherwise ({@link GeometryFactors#beamFactors} counts it
 * as diffuse). The raster's outside counts as open ground (the ray stops at the edge).
 *
 * <p>One instance holds the scratch ray of the current sun direction: not thread-safe; use one
 * per task. No allocation after construction.
 */
public final class Shadows {
    private final double cellM;
    private final int haloCells;
    private final double maxDistanceM;
    private final int[] dCol;
    private final int[] dRow;
    private final double[] entryM;

    /**
     * The halo a tile needs for exact shadow edges: ⌈H / tan(e_min) / cell⌉ [cells].
     *
     * @param maxHeightM         tallest height H [m] (buildings and trees), ≥ 0
     * @param minSunElevationDeg lowest solar elevation e_min [°] whose shadows are computed, in (0, 90]
     * @param cellM              cell size [m], &gt; 0
     */
    public static int haloCells(double maxHeightM, double minSunElevationDeg, double cellM) {
        HeightRaster.checkCell(cellM);
        if (!(maxHeightM >= 0 && maxHeightM <= HeightRaster.MAX_HEIGHT_M)) {
            throw new IllegalArgumentException("tallest height " + maxHeightM + " m: must be 0…"
                    + HeightRaster.MAX_HEIGHT_M + " m");
        }
        if (!(minSunElevationDeg > 0 && minSunElevationDeg <= 90)) {
            throw new IllegalArgumentException("lowest sun elevation for shadows " + minSunElevationDeg
                    + "°: must be in (0, 90]° (e.g. 5)");
        }
        double lengthCells = maxHeightM / Math.tan(Math.toRadians(minSunElevationDeg)) / cellM;
        // tan 45° is 0.9999999999999999 in doubles: forgive rounding so whole lengths stay whole
        // (a cell entered exactly at the shadow's length is not shaded: (1) is strict).
        return (int) Math.ceil(lengthCells * (1 - 1e-12));
    }

    /**
     * @param cellM     cell size [m], &gt; 0
     * @param haloCells how far rays are searched [cells] (the tiles' halo), ≥ 0
     */
    public Shadows(double cellM, int haloCells) {
        HeightRaster.checkCell(cellM);
        if (haloCells < 0) {
            throw new IllegalArgumentException("shadow halo of " + haloCells + " cells: must be ≥ 0");
        }
        this.cellM = cellM;
        this.haloCells = haloCells;
        this.maxDistanceM = haloCells * cellM;
        int cap = GridRay.capacity(haloCells);
        dCol = new int[cap];
        dRow = new int[cap];
        entryM = new double[cap];
    }

    public int haloCells() {
        return haloCells;
    }

    /** How far rays are searched [m]: the halo × the cell size. */
    public double maxDistanceM() {
        return maxDistanceM;
    }

    /**
     * Beam factor (0 building shadow, τ tree shadow only, 1 sunlit) of every cell of a window,
     * written row-major to {@code out}, for a sun at ({@code sunElevationDeg},
     * {@code sunAzimuthDeg}); all 0 when the sun is at or below the horizon.
     *
     * @param heightsM              heights above ground [m] (buildings), {@code cols × rows} row-major
     * @param treeHeightsM          tree-canopy top heights above ground [m] on the same grid, or null
     * @param canopyTransmissivity  τ, the fraction of beam sunlight through a canopy, 0…1
     * @param sunElevationDeg       solar elevation e [°] (90 − zenith)
     * @param sunAzimuthDeg         solar azimuth A [°] clockwise from north
     * @param out                   {@code wCols × wRows} beam factors
     */
    public void beamFactors(float[] heightsM, float[] treeHeightsM, double canopyTransmissivity, int cols,
            int rows, int col0, int row0, int wCols, int wRows, double sunElevationDeg, double sunAzimuthDeg,
            double[] out) {
        double maxH = HeightRaster.checkHeights("heights", heightsM, cols, rows);
        if (treeHeightsM != null) {
            maxH = Math.max(maxH, HeightRaster.checkHeights("tree heights", treeHeightsM, cols, rows));
        }
        if (!(canopyTransmissivity >= 0 && canopyTransmissivity <= 1)) {
            throw new IllegalArgumentException("canopy transmissivity " + canopyTransmissivity
                    + ": must be 0…1");
        }
        if (!Double.isFinite(sunElevationDeg) || !Double.isFinite(sunAzimuthDeg)) {
            throw new IllegalArgumentException("sun position (" + sunElevationDeg + "°, " + sunAzimuthDeg
                    + "°) is not finite");
        }
        HeightRaster.checkWindow(cols, rows, col0, row0, wCols, wRows, out.length);
        if (sunElevationDeg <= 0) {
            java.util.Arrays.fill(out, 0.0);
            return;
        }
        double tanE = Math.tan(Math.toRadians(Math.min(sunElevationDeg, 90.0)));
        int n = GridRay.trace(sunAzimuthDeg, cellM, maxDistanceM, dCol, dRow, entryM);
        for (int wr = 0; wr < wRows; wr++) {
            for (int wc = 0; wc < wCols; wc++) {
                out[wr * wCols + wc] = cell(heightsM, treeHeightsM, canopyTransmissivity, cols, rows,
                        col0 + wc, row0 + wr, tanE, maxH, n);
            }
        }
    }

    /** Beam factors of every cell of the raster (the window is all of it); trees optional. */
    public double[] beamFactorsAll(float[] heightsM, float[] treeHeightsM, double canopyTransmissivity,
            int cols, int rows, double sunElevationDeg, double sunAzimuthDeg) {
        double[] out = new double[cols * rows];
        beamFactors(heightsM, treeHeightsM, canopyTransmissivity, cols, rows, 0, 0, cols, rows,
                sunElevationDeg, sunAzimuthDeg, out);
        return out;
    }

    private double cell(float[] h, float[] trees, double tau, int cols, int rows, int col, int row,
            double tanE, double maxH, int n) {
        final int i0 = row * cols + col;
        final double h0 = h[i0];
        final double reach = maxH - h0;
        boolean canopy = trees != null && trees[i0] > h0;
        for (int i = 0; i < n; i++) {
            double line = entryM[i] * tanE; // (1): the sun line's height above h₀ at the entry
            if (line >= reach) {
                break; // nothing further rises above the sun line
            }
            int c = col + dCol[i];
            int r = row + dRow[i];
            if (c < 0 || c >= cols || r < 0 || r >= rows) {
                break;
            }
            int j = r * cols + c;
            if (h[j] - h0 > line) {
                return 0.0;
            }
            if (trees != null && trees[j] - h0 > line) {
                canopy = true;
            }
        }
        return canopy ? tau : 1.0;
    }
}
