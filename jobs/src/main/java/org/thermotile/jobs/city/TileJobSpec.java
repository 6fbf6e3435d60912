package org.thermotile.jobs.city;

import java.util.List;
import org.locationtech.jts.geom.Geometry;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.materials.Material;
import org.thermotile.model.tile.TileSimulation;

/**
 * Everything a tile task needs, broadcast once to every executor: where the land cover is, the
 * palette of materials and the code-to-palette table, the forcing and the settings.
 *
 * @param landCover     land-cover GeoTIFF location (a string: paths do not serialise)
 * @param codeToPalette per land-cover code 0…65535, the palette index, or
 *                      {@link TileSimulation#NO_MATERIAL} (nodata)
 * @param districts     district polygons in the grid's CRS (empty without districts)
 * @param heights       heights raster location, or null
 * @param geometry      urban geometry settings (null without heights)
 * @param heightGrid    the whole grid's heights [m] (row-major, NaN = none) when building footprints were
 *                      rasterised (over the heights raster, if any), else null: then {@code heights} is read.
 *                      Broadcast with the spec: 4 bytes per cell on the driver and each executor.
 * @param cellPalette   per cell (row-major), a palette index replacing the land cover's material (roof
 *                      materials from footprints), or −1; null when there are none
 */
public record TileJobSpec(String landCover, RasterGrid grid, Material[] palette, int[] codeToPalette,
        List<Geometry> districts, Forcing forcing, TileSimulation.Settings settings, String heights,
        GeometryBlock geometry, float[] heightGrid, int[] cellPalette)
        implements java.io.Serializable {

    /** True when the run has heights (a raster, footprints or both). */
    public boolean hasHeights() {
        return heights != null || heightGrid != null;
    }

    /**
     * Heights [m] of a window (row-major, NaN = no structure): from the rasterised grid when there is
     * one, else read from the heights raster at {@code localHeights}.
     */
    float[] heightsWindow(java.nio.file.Path localHeights, int col0, int row0, int w, int h) {
        if (heightGrid == null) {
            try (org.thermotile.jobs.io.raster.GeoTiffReader r =
                    org.thermotile.jobs.io.raster.GeoTiffReader.openSingleBand(localHeights)) {
                return r.readFloatWindow(col0, row0, w, h);
            }
        }
        float[] out = new float[w * h];
        int gw = grid.width();
        for (int r = 0; r < h; r++) {
            System.arraycopy(heightGrid, (row0 + r) * gw + col0, out, r * w, w);
        }
        return out;
    }

    /** The land-cover palette indices {@code idx} of a window with the per-cell replacements applied. */
    void applyCellPalette(int[] idx, int col0, int row0, int w) {
        if (cellPalette == null) {
            return;
        }
        int gw = grid.width();
        for (int i = 0; i < idx.length; i++) {
            int m = cellPalette[(row0 + i / w) * gw + col0 + i % w];
            if (m >= 0 && idx[i] >= 0) {
                idx[i] = m;
            }
        }
    }
}
