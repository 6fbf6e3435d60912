package org.thermotile.model.geometry;

/**
 * Checks shared by the geometry routines: a heights raster is a {@code float[]} of
 * {@code cols × rows} values, row-major (index {@code row·cols + col}), north-up, heights above
 * ground [m]; a window is a rectangle of it whose results go, row-major, into an output array.
 * Every check runs once per call, before any per-cell loop.
 */
final class HeightRaster {
    private HeightRaster() {}

    /** Heights above this [m] are refused as absurd (no structure is 1 km tall; common practice). */
    static final double MAX_HEIGHT_M = 1000.0;

    /** Checks the raster's size and values; returns the largest height [m]. */
    static double checkHeights(String what, float[] heightsM, int cols, int rows) {
        if (cols <= 0 || rows <= 0) {
            throw new IllegalArgumentException(what + ": raster of " + cols + " × " + rows
                    + " cells; it needs at least one column and one row");
        }
        if (heightsM == null || heightsM.length != (long) cols * rows) {
            throw new IllegalArgumentException(what + ": " + (heightsM == null ? "no" : heightsM.length)
                    + " values for a raster of " + cols + " columns × " + rows + " rows (" + (long) cols * rows
                    + " expected)");
        }
        double max = 0;
        for (int i = 0; i < heightsM.length; i++) {
            float h = heightsM[i];
            if (!(h >= 0 && h <= MAX_HEIGHT_M)) {
                throw new IllegalArgumentException(what + " at row " + i / cols + ", column " + i % cols
                        + " is " + h + " m: heights above ground must be finite, ≥ 0 and ≤ "
                        + MAX_HEIGHT_M + " m. Fix: fill nodata holes (e.g. with 0 m, open ground) "
                        + "and check the raster's unit is metres");
            }
            if (h > max) {
                max = h;
            }
        }
        return max;
    }

    /** Checks that the window lies inside the raster and that {@code out} holds it exactly. */
    static void checkWindow(int cols, int rows, int col0, int row0, int wCols, int wRows, int outLength) {
        if (wCols <= 0 || wRows <= 0 || col0 < 0 || row0 < 0 || col0 + wCols > cols || row0 + wRows > rows) {
            throw new IllegalArgumentException("window of " + wCols + " × " + wRows + " cells at column "
                    + col0 + ", row " + row0 + " is not inside the " + cols + " × " + rows + " raster");
        }
        if (outLength != wCols * wRows) {
            throw new IllegalArgumentException("output holds " + outLength + " values, the window has "
                    + wCols * wRows);
        }
    }

    static void checkCell(double cellM) {
        if (!(cellM > 0 && cellM < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("cell size " + cellM + " m: must be finite and > 0");
        }
    }
}
