package org.thermotile.model.geometry;

/**
 * The cells a horizontal ray crosses, leaving the centre of a raster cell in a given azimuth,
 * with the distance at which it enters each: the grid traversal of Amanatides &amp; Woo (1987),
 * "A fast voxel traversal algorithm for ray tracing", Eurographics '87, 3–10 (from memory).
 *
 * <p>The traversal depends only on the azimuth and the cell size, not on where the ray starts
 * (every ray starts at a cell centre), so it is traced once per direction and then replayed
 * for every cell of a window as offsets ({@code dCol}, {@code dRow}) from the start cell: the
 * per-cell loops of {@link SkyViewFactor} and {@link Shadows} only add offsets and compare.
 *
 * <p>Conventions: rasters are north-up, row 0 at the north edge and columns growing eastward;
 * azimuth in degrees clockwise from north (0 north, 90 east), as the solar azimuth of the
 * forcing. Each cell is a flat-topped column (a building block): along the ray, the highest
 * elevation angle its top subtends is at the point where the ray enters it, so the entry
 * distance, not the distance to the cell centre, is what matters. A ray that passes exactly
 * through a cell corner steps diagonally and does not count the two cells it only touches at
 * that point (a measure-zero contact; this keeps the traversal symmetric).
 */
final class GridRay {
    private GridRay() {}

    /** Relative tolerance below which two crossing distances count as a corner crossing. */
    private static final double CORNER_TOLERANCE = 1e-9;

    /** A capacity enough for every cell entered within {@code maxDistanceCells} of the start. */
    static int capacity(double maxDistanceCells) {
        // A ray of length L enters at most ⌊L|sin a| + ½⌋ + ⌊L|cos a| + ½⌋ ≤ √2 L + 1 cells.
        return (int) Math.ceil(1.5 * maxDistanceCells) + 2;
    }

    /**
     * Traces the ray of {@code azimuthDeg} from the centre of cell (0, 0) up to the last cell it
     * enters at a distance ≤ {@code maxDistanceM}, writing the offsets and entry distances [m].
     *
     * @param azimuthDeg   direction [°] clockwise from north, any finite value
     * @param cellM        cell size [m], &gt; 0
     * @param maxDistanceM how far to trace [m], ≥ 0
     * @return the number of cells written; the offsets never exceed ⌈maxDistanceM/cellM⌉
     * @throws IllegalStateException if the arrays are shorter than {@link #capacity}
     */
    static int trace(double azimuthDeg, double cellM, double maxDistanceM, int[] dCol, int[] dRow,
            double[] entryM) {
        double a = Math.toRadians(azimuthDeg);
        double ux = Math.sin(a);   // columns per cell of distance (east)
        double vy = -Math.cos(a);  // rows per cell of distance (south, row 0 being north)
        // sin(π) = 1.2e-16, not 0: an axis-aligned ray must stay on its row or column.
        if (Math.abs(ux) < 1e-12) {
            ux = 0;
        }
        if (Math.abs(vy) < 1e-12) {
            vy = 0;
        }
        int stepC = ux > 0 ? 1 : -1;
        int stepR = vy > 0 ? 1 : -1;
        double deltaC = ux == 0 ? Double.POSITIVE_INFINITY : 1.0 / Math.abs(ux);
        double deltaR = vy == 0 ? Double.POSITIVE_INFINITY : 1.0 / Math.abs(vy);
        double nextC = 0.5 * deltaC; // distance [cells] at which the ray crosses the next column line
        double nextR = 0.5 * deltaR;
        double limit = maxDistanceM / cellM;
        int c = 0;
        int r = 0;
        int n = 0;
        while (true) {
            double t;
            double diff = nextC - nextR; // +∞ or −∞ for an axis-aligned ray, never a corner
            if (Math.abs(diff) <= CORNER_TOLERANCE * Math.min(nextC, nextR)) {
                t = Math.min(nextC, nextR);
                c += stepC;
                r += stepR;
                nextC += deltaC;
                nextR += deltaR;
            } else if (diff < 0) {
                t = nextC;
                c += stepC;
                nextC += deltaC;
            } else {
                t = nextR;
                r += stepR;
                nextR += deltaR;
            }
            if (t > limit) {
                return n;
            }
            if (n == dCol.length) {
                throw new IllegalStateException("ray buffer of " + n + " cells too short for "
                        + maxDistanceM + " m at " + cellM + " m cells");
            }
            dCol[n] = c;
            dRow[n] = r;
            entryM[n] = t * cellM;
            n++;
        }
    }
}
