package org.thermotile.jobs.ingest;

import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The grid footprints are rasterised onto: north-up square cells. Today the run's grid is the land
 * cover's own ({@link #of(RasterGrid)}); any other projected grid given by these five facts works
 * the same way.
 *
 * @param originX   easting of the top-left corner of the top-left cell [m]
 * @param originY   northing of the top-left corner of the top-left cell [m]
 * @param cellSizeM cell edge [m], &gt; 0 (rows run southward)
 * @param cols      columns, ≥ 1
 * @param rows      rows, ≥ 1
 * @param crsWkt    the grid's CRS as WKT (easting, northing in metres)
 */
public record FootprintGrid(double originX, double originY, double cellSizeM, int cols, int rows, String crsWkt) {
    public FootprintGrid {
        if (!(cellSizeM > 0) || cols < 1 || rows < 1) {
            throw new IllegalArgumentException("grid of " + cols + " × " + rows + " cells of " + cellSizeM + " m");
        }
    }

    /** The grid of a raster (square cells assumed: the run check refuses others). */
    public static FootprintGrid of(RasterGrid g) {
        return new FootprintGrid(g.originX(), g.originY(), g.pixelWidth(), g.width(), g.height(), g.crsWkt());
    }

    /** Easting of the centre of column {@code c} [m]. */
    public double centreX(int c) {
        return originX + (c + 0.5) * cellSizeM;
    }

    /** Northing of the centre of row {@code r} [m]. */
    public double centreY(int r) {
        return originY - (r + 0.5) * cellSizeM;
    }
}
