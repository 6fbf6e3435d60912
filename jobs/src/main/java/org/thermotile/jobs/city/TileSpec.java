package org.thermotile.jobs.city;

import java.util.ArrayList;
import java.util.List;

/**
 * One tile of the grid: a window of cells, aligned with the output GeoTIFF tiles.
 *
 * @param index row-major tile index
 */
public record TileSpec(int index, int col0, int row0, int width, int height) implements java.io.Serializable {

    public int cells() {
        return width * height;
    }

    /** Tiles of {@code tileSize} covering a {@code width × height} grid, row-major; edge tiles are clipped. */
    public static List<TileSpec> plan(int width, int height, int tileSize) {
        if (tileSize < 1) {
            throw new IllegalArgumentException("tile size must be ≥ 1");
        }
        List<TileSpec> tiles = new ArrayList<>();
        int i = 0;
        for (int r = 0; r < height; r += tileSize) {
            for (int c = 0; c < width; c += tileSize) {
                tiles.add(new TileSpec(i++, c, r, Math.min(tileSize, width - c), Math.min(tileSize, height - r)));
            }
        }
        return tiles;
    }
}
