package org.thermotile.jobs.observe;

import java.nio.file.Path;
import java.util.List;
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
 * it read through the city job's own path ({@link TileTask#inputs}: land cover, class table, roof
 * materials, heights with the run's halo).
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
     * The cells under {@code f}: the bounding window of its cells through {@link TileTask#inputs},
     * each cell weighted by its overlap area; cells of the window the footprint does not touch are
     * not simulated (their heights still shade and bound the sky of the others).
     */
    static PixelCells cells(PixelFootprints.Footprint f, TileJobSpec spec) {
        int cols = spec.grid().width();
        int c0 = Integer.MAX_VALUE, r0 = Integer.MAX_VALUE, c1 = -1, r1 = -1;
        for (int cell : f.cells()) {
            c0 = Math.min(c0, cell % cols);
            c1 = Math.max(c1, cell % cols);
            r0 = Math.min(r0, cell / cols);
            r1 = Math.max(r1, cell / cols);
        }
        int w = c1 - c0 + 1;
        int h = r1 - r0 + 1;
        TileTask.Inputs in = TileTask.inputs(new TileSpec(0, c0, r0, w, h), spec);
        double[] areas = new double[w * h];
        for (int i = 0; i < f.cells().length; i++) {
            int cell = f.cells()[i];
            areas[(cell / cols - r0) * w + cell % cols - c0] += f.areas()[i];
        }
        int[] idx = in.materialIndex().clone();
        for (int i = 0; i < idx.length; i++) {
            if (!(areas[i] > 0)) {
                idx[i] = TileSimulation.NO_MATERIAL;
            }
        }
        return new PixelCells(idx, areas, in.geometry());
    }
}
