package org.thermotile.jobs.observe;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.thermotile.jobs.city.TileJobSpec;
import org.thermotile.jobs.city.TileSpec;
import org.thermotile.jobs.city.TileTask;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.observe.PixelCells;
import org.thermotile.model.observe.PixelFootprints;
import org.thermotile.model.tile.TileSimulation;

/**
 * The calibration sample's pixels as the run's own cells: where each image pixel falls on the run
 * grid (its four corners transformed into the run CRS with Apache SIS and clipped against the cells,
 * {@link PixelFootprints}, as the comparison does), and for a sampled pixel the window of cells under
 * it, read through the city job's own path ({@link TileTask#inputs}: land cover, class table, roof
 * materials, heights with the run's halo) once per run tile and cut per pixel.
 */
final class CalibrationSample {
    private CalibrationSample() {}

    /** Every pixel's footprint on the run grid, row-major over the image. */
    static List<PixelFootprints.Footprint> footprints(Path image, RasterGrid grid) {
        RasterGrid ig;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(image)) {
            ig = r.grid();
        }
        PixelFootprints cells = new PixelFootprints(grid.originX(), grid.originY(), grid.pixelWidth(), grid.width(),
                grid.height());
        return Observe.footprints(image, ig, grid, cells);
    }

    /** The run's palette index of every grid cell (row-major), as the city job maps the baseline. */
    static int[] gridMaterials(TileJobSpec spec) {
        // Without the geometry block: only the land cover and the per-cell materials are read, not
        // the whole grid's heights with a halo.
        TileJobSpec flat = new TileJobSpec(spec.landCover(), spec.grid(), spec.palette(), spec.codeToPalette(),
                spec.districts(), spec.forcing(), spec.settings(), spec.heights(), null, spec.heightGrid(),
                spec.cellPalette());
        return TileTask.inputs(new TileSpec(0, 0, 0, spec.grid().width(), spec.grid().height()), flat).materialIndex();
    }

    /** Palette index covering most of {@code f} (see {@link PixelCells#dominant}). */
    static int dominant(PixelFootprints.Footprint f, int[] gridMaterials, int paletteSize) {
        int[] m = new int[f.cells().length];
        for (int i = 0; i < m.length; i++) {
            m[i] = gridMaterials[f.cells()[i]];
        }
        return PixelCells.dominant(m, f.areas(), paletteSize);
    }

    /**
     * The cells under each of {@code sampled}, in order: for a pixel, the bounding window of its
     * cells, each cell weighted by its overlap area; cells of the window the footprint does not
     * touch are not simulated (their heights still shade and bound the sky of the others).
     *
     * <p>The rasters are read once per run tile, not once per pixel: the pixels are grouped by the
     * tile of {@code tileSize} cells holding their window's first cell, the bounding window of each
     * group's windows is read once through {@link TileTask#inputs}, and each pixel's window (with
     * the halo of its geometry) is cut from it. Every cell's material and height depends on that cell
     * alone, so the cut equals reading the pixel's window by itself, value for value.
     */
    static List<PixelCells> cells(List<PixelFootprints.Footprint> sampled, TileJobSpec spec, int tileSize) {
        int cols = spec.grid().width();
        int tilesAcross = (cols + tileSize - 1) / tileSize;
        int[][] windows = new int[sampled.size()][];
        Map<Integer, List<Integer>> byTile = new TreeMap<>();
        for (int i = 0; i < windows.length; i++) {
            int[] w = window(sampled.get(i), cols);
            windows[i] = w;
            byTile.computeIfAbsent(w[1] / tileSize * tilesAcross + w[0] / tileSize, k -> new ArrayList<>()).add(i);
        }
        PixelCells[] out = new PixelCells[windows.length];
        for (List<Integer> group : byTile.values()) {
            int c0 = Integer.MAX_VALUE, r0 = Integer.MAX_VALUE, c1 = -1, r1 = -1;
            for (int i : group) {
                int[] w = windows[i];
                c0 = Math.min(c0, w[0]);
                r0 = Math.min(r0, w[1]);
                c1 = Math.max(c1, w[0] + w[2]);
                r1 = Math.max(r1, w[1] + w[3]);
            }
            TileTask.Inputs in = TileTask.inputs(new TileSpec(0, c0, r0, c1 - c0, r1 - r0), spec);
            for (int i : group) {
                out[i] = cut(sampled.get(i), windows[i], in, c0, r0, c1 - c0, cols);
            }
        }
        return List.of(out);
    }

    /** The bounding window {col0, row0, width, height} of a footprint's cells. */
    private static int[] window(PixelFootprints.Footprint f, int cols) {
        int c0 = Integer.MAX_VALUE, r0 = Integer.MAX_VALUE, c1 = -1, r1 = -1;
        for (int cell : f.cells()) {
            c0 = Math.min(c0, cell % cols);
            c1 = Math.max(c1, cell % cols);
            r0 = Math.min(r0, cell / cols);
            r1 = Math.max(r1, cell / cols);
        }
        return new int[] {c0, r0, c1 - c0 + 1, r1 - r0 + 1};
    }

    /**
     * The pixel's cells from the inputs {@code in} of a larger window ({@code inCol0}, {@code inRow0},
     * {@code inWidth} wide) holding the pixel's window {@code win}.
     */
    private static PixelCells cut(PixelFootprints.Footprint f, int[] win, TileTask.Inputs in, int inCol0, int inRow0,
            int inWidth, int cols) {
        int c0 = win[0], r0 = win[1], w = win[2], h = win[3];
        double[] areas = new double[w * h];
        for (int i = 0; i < f.cells().length; i++) {
            int cell = f.cells()[i];
            areas[(cell / cols - r0) * w + cell % cols - c0] += f.areas()[i];
        }
        int[] idx = new int[w * h];
        for (int r = 0; r < h; r++) {
            System.arraycopy(in.materialIndex(), (r0 - inRow0 + r) * inWidth + c0 - inCol0, idx, r * w, w);
        }
        for (int i = 0; i < idx.length; i++) {
            if (!(areas[i] > 0)) {
                idx[i] = TileSimulation.NO_MATERIAL;
            }
        }
        TileSimulation.Geometry g = in.geometry();
        TileSimulation.Geometry geometry = null;
        if (g != null) {
            // Window with halo: the pixel's window sits at (c0 − inCol0, r0 − inRow0) inside the
            // larger one, halo for halo (outside the raster both hold 0 m).
            int halo = g.haloCells();
            int wc = w + 2 * halo;
            int wr = h + 2 * halo;
            float[] buildings = new float[wc * wr];
            float[] trees = new float[wc * wr];
            for (int r = 0; r < wr; r++) {
                int src = (r0 - inRow0 + r) * g.windowCols() + c0 - inCol0;
                System.arraycopy(g.heightsM(), src, buildings, r * wc, wc);
                System.arraycopy(g.treeHeightsM(), src, trees, r * wc, wc);
            }
            geometry = new TileSimulation.Geometry(buildings, trees, wc, wr, halo, g.cellM(), g.searchRadiusM(),
                    g.directions(), g.canopyTransmissivity(), g.minSunElevationDeg(), g.wallEmissivity());
        }
        return new PixelCells(idx, areas, geometry);
    }
}
