package org.thermotile.jobs.city;

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
 */
public record TileJobSpec(String landCover, Material[] palette, int[] codeToPalette, Forcing forcing,
        TileSimulation.Settings settings) implements java.io.Serializable {
}
