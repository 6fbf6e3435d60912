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
 */
public record TileJobSpec(String landCover, RasterGrid grid, Material[] palette, int[] codeToPalette,
        List<Geometry> districts, Forcing forcing, TileSimulation.Settings settings, String heights,
        GeometryBlock geometry)
        implements java.io.Serializable {
}
