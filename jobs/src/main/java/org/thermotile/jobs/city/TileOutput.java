package org.thermotile.jobs.city;

import org.thermotile.model.tile.TileSimulation;

/**
 * What one tile task returns: its window, the land-cover code and palette index of each cell,
 * its district index (null without districts), and the simulated statistics. Small: O(cells of
 * the tile).
 */
public record TileOutput(String variant, TileSpec tile, int[] codes, int[] paletteIndex, int[] districtIndex,
        TileSimulation.Result result, double seconds) implements java.io.Serializable {
}
