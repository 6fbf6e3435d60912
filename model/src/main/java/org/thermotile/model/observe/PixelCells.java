package org.thermotile.model.observe;

import java.util.Objects;
import org.thermotile.model.tile.TileSimulation;

/**
 * One observed pixel as the run's own cells under it: a window of the run grid (the bounding box
 * of the pixel's footprint, row-major), each cell's palette index as the city job maps it, each
 * cell's overlap area with the footprint (the weights of {@link PixelFootprints.Footprint}), and the
 * window's urban geometry with the run's halo (null when the run has no heights). Simulating the
 * window through {@link TileSimulation} gives each cell exactly the sky view factor and cast
 * shadows the city job gives it, and the pixel's value is the area-weighted mean of its cells.
 *
 * @param materialIndex per window cell a palette index, or {@link TileSimulation#NO_MATERIAL} (no
 *                      material, or a cell the footprint does not cover: it is not simulated)
 * @param areasM2       per window cell the area of its overlap with the footprint [m²], 0 outside
 * @param geometry      the window's heights with halo and the run's geometry settings, or null
 */
public record PixelCells(int[] materialIndex, double[] areasM2, TileSimulation.Geometry geometry)
        implements java.io.Serializable {
    public PixelCells {
        Objects.requireNonNull(materialIndex, "materialIndex");
        Objects.requireNonNull(areasM2, "areasM2");
        if (materialIndex.length != areasM2.length || materialIndex.length == 0) {
            throw new IllegalArgumentException("a pixel needs one area per window cell (" + materialIndex.length
                    + " cells, " + areasM2.length + " areas)");
        }
        if (geometry != null && geometry.tileCols() * geometry.tileRows() != materialIndex.length) {
            throw new IllegalArgumentException("geometry window interior of " + geometry.tileCols() + " × "
                    + geometry.tileRows() + " cells does not match the pixel's " + materialIndex.length + " cells");
        }
    }

    /** A pixel simulated as one flat cell of one material (no geometry, no mixing). */
    public static PixelCells flat(int material) {
        return new PixelCells(new int[] {material}, new double[] {1.0}, null);
    }

    /**
     * The palette index covering most of the pixel (summed overlap area; ties to the smaller
     * index), or {@link TileSimulation#NO_MATERIAL} when no covered cell has a material.
     */
    public int dominant(int paletteSize) {
        return dominant(materialIndex, areasM2, paletteSize);
    }

    /** {@link #dominant(int)} of any cells and areas. */
    public static int dominant(int[] materialIndex, double[] areasM2, int paletteSize) {
        double[] area = new double[paletteSize];
        for (int i = 0; i < materialIndex.length; i++) {
            int m = materialIndex[i];
            if (m >= 0 && m < paletteSize) {
                area[m] += areasM2[i];
            }
        }
        int best = TileSimulation.NO_MATERIAL;
        for (int m = 0; m < paletteSize; m++) {
            if (area[m] > 0 && (best < 0 || area[m] > area[best])) {
                best = m;
            }
        }
        return best;
    }
}
