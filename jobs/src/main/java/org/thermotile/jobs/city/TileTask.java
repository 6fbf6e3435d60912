package org.thermotile.jobs.city;

import java.nio.file.Path;
import org.thermotile.jobs.io.districts.Districts;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.storage.InputStaging;
import org.thermotile.model.materials.Material;
import org.thermotile.model.scenario.Adoption;
import org.thermotile.model.tile.TileSimulation;

/** The work of one Spark task: read the tile's window of the land cover, map it, simulate it. */
public final class TileTask {
    private TileTask() {}

    /**
     * The tile's heights with a halo of context (outside the raster: 0 m), split into buildings
     * and trees by the land cover (tree-canopy cells are trees). The land-cover window read for
     * it covers the tile too, so the tile's own codes are copied into {@code tileCodes} rather
     * than read again.
     */
    static TileSimulation.Geometry geometry(TileSpec tile, TileJobSpec spec, int[] tileCodes) {
        GeometryBlock g = spec.geometry();
        int halo = g.haloCells();
        int wc = tile.width() + 2 * halo;
        int wr = tile.height() + 2 * halo;
        float[] buildings = new float[wc * wr];
        float[] trees = new float[wc * wr];
        int c0 = Math.max(0, tile.col0() - halo);
        int r0 = Math.max(0, tile.row0() - halo);
        int c1 = Math.min(spec.grid().width(), tile.col0() + tile.width() + halo);
        int r1 = Math.min(spec.grid().height(), tile.row0() + tile.height() + halo);
        float[] h;
        int[] codes;
        h = spec.heightsWindow(spec.heightGrid() == null ? landCover(spec.heights()) : null, c0, r0, c1 - c0, r1 - r0);
        try (GeoTiffReader lc = GeoTiffReader.openSingleBand(landCover(spec.landCover()))) {
            codes = lc.readIntWindow(c0, r0, c1 - c0, r1 - r0);
        }
        int[] lut = spec.codeToPalette();
        int[] cellPalette = spec.cellPalette();
        Material[] palette = spec.palette();
        for (int r = r0; r < r1; r++) {
            for (int c = c0; c < c1; c++) {
                int src = (r - r0) * (c1 - c0) + (c - c0);
                int dst = (r - tile.row0() + halo) * wc + (c - tile.col0() + halo);
                float v = Float.isNaN(h[src]) ? 0f : h[src];
                int code = codes[src];
                if (r >= tile.row0() && r < tile.row0() + tile.height() && c >= tile.col0()
                        && c < tile.col0() + tile.width()) {
                    tileCodes[(r - tile.row0()) * tile.width() + (c - tile.col0())] = code;
                }
                int m = code >= 0 && code < lut.length ? lut[code] : -1;
                if (m >= 0 && cellPalette != null && cellPalette[r * spec.grid().width() + c] >= 0) {
                    m = cellPalette[r * spec.grid().width() + c];
                }
                if (m >= 0 && ScenarioPlanner.TREES.equals(palette[m].id())) {
                    trees[dst] = v;
                } else {
                    buildings[dst] = v;
                }
            }
        }
        return new TileSimulation.Geometry(buildings, trees, wc, wr, halo, spec.grid().pixelWidth(), g.searchRadiusM(),
                g.directions(), g.canopyTransmissivity(), g.minSunElevationDeg(), g.wallEmissivity());
    }

    /**
     * What the kernel gets for one window of the grid in the baseline: its land-cover codes, its
     * cells' palette indices (the class table, then per-cell replacements such as roofs from
     * footprints) and its urban geometry with the run's halo (null without heights). Any window
     * may be given, not only a planned tile: calibration simulates the cells under an image pixel
     * through exactly this path.
     *
     * @param codes         land-cover code per window cell, row-major
     * @param materialIndex palette index per window cell, or {@link TileSimulation#NO_MATERIAL}
     */
    public record Inputs(int[] codes, int[] materialIndex, TileSimulation.Geometry geometry) {}

    /** The baseline {@link Inputs} of {@code tile} (read from the run's rasters). */
    public static Inputs inputs(TileSpec tile, TileJobSpec spec) {
        int[] codes;
        TileSimulation.Geometry geom = null;
        if (spec.geometry() != null) {
            codes = new int[tile.cells()];
            geom = geometry(tile, spec, codes);
        } else {
            try (GeoTiffReader r = GeoTiffReader.openSingleBand(landCover(spec.landCover()))) {
                codes = r.readIntWindow(tile.col0(), tile.row0(), tile.width(), tile.height());
            }
        }
        int[] idx = new int[codes.length];
        int[] lut = spec.codeToPalette();
        for (int i = 0; i < codes.length; i++) {
            int c = codes[i];
            idx[i] = (c >= 0 && c < lut.length) ? lut[c] : TileSimulation.NO_MATERIAL;
        }
        spec.applyCellPalette(idx, tile.col0(), tile.row0(), tile.width());
        return new Inputs(codes, idx, geom);
    }

    /**
     * Runs one tile of one variant. For a scenario, each cell's baseline material is changed by
     * each change whose candidate test it passes and whose adoption cut its unit falls under.
     *
     * @param variant the variant (null or the baseline: no change)
     * @param units   per grid cell, its adoption unit (building or cell), null without scenarios
     * @param roofs   per grid cell, whether it is a roof
     */
    public static TileOutput run(TileSpec tile, TileJobSpec spec, ScenarioVariant variant, int[] units,
            java.util.BitSet roofs) {
        return runVariants(tile, spec, java.util.Collections.singletonList(variant), units, roofs).get(0);
    }

    /**
     * Runs every variant of one tile in one pass ({@link TileSimulation#runVariants}): the tile's
     * rasters read once, the first variant's cells all stepped, each other variant's only where
     * its materials differ from the first's. Each output is, bit for bit, that of
     * {@link #run} of its variant alone; {@link TileOutput#seconds} is the pass's time, split in
     * proportion to the cell-hours each variant stepped.
     *
     * @param variants the variants in order (null entries: the baseline)
     */
    public static java.util.List<TileOutput> runVariants(TileSpec tile, TileJobSpec spec,
            java.util.List<ScenarioVariant> variants, int[] units, java.util.BitSet roofs) {
        long t0 = System.nanoTime();
        Inputs in = inputs(tile, spec);
        int[] codes = in.codes();
        int[] base = in.materialIndex();
        TileSimulation.Geometry geom = in.geometry();
        int[] district = spec.districts().isEmpty() ? null : Districts.assign(spec.districts(), spec.grid(),
                tile.col0(), tile.row0(), tile.width(), tile.height());
        int nv = variants.size();
        Material[][] palettes = new Material[nv][];
        int[][] idx = new int[nv][];
        for (int v = 0; v < nv; v++) {
            ScenarioVariant variant = variants.get(v);
            boolean baseline = variant == null || variant.isBaseline();
            palettes[v] = baseline ? spec.palette() : variant.palette();
            idx[v] = baseline ? base : treated(tile, spec, variant, codes, base, district, units, roofs);
        }
        TileSimulation.Result[] res = TileSimulation.runVariants(palettes, idx, district, spec.districts().size(),
                spec.forcing(), spec.settings(), geom);
        double seconds = (System.nanoTime() - t0) / 1e9;
        long stepped = 0;
        for (TileSimulation.Result r : res) {
            stepped += r.steppedCellHours;
        }
        java.util.List<TileOutput> out = new java.util.ArrayList<>(nv);
        for (int v = 0; v < nv; v++) {
            ScenarioVariant variant = variants.get(v);
            double share = stepped == 0 ? 1.0 / nv : (double) res[v].steppedCellHours / stepped;
            out.add(new TileOutput(variant == null ? "baseline" : variant.name(), tile, codes, idx[v], district,
                    res[v], seconds * share));
        }
        return out;
    }

    /** A scenario's palette index per tile cell: the baseline's, changed where the scenario treats the cell. */
    private static int[] treated(TileSpec tile, TileJobSpec spec, ScenarioVariant variant, int[] codes, int[] base,
            int[] district, int[] units, java.util.BitSet roofs) {
        int[] idx = base.clone();
        int w = spec.grid().width();
        for (int i = 0; i < idx.length; i++) {
            int b = idx[i];
            if (b < 0) {
                continue;
            }
            int cell = (tile.row0() + i / tile.width()) * w + tile.col0() + i % tile.width();
            int d = district == null ? -1 : district[i];
            boolean roof = roofs.get(cell);
            int cur = b;
            for (ScenarioVariant.Change ch : variant.changes()) {
                if (ch.candidate(b, codes[i], d, roof)
                        && Adoption.treated(Adoption.key(ch.seed(), units[cell]), ch.threshold(), ch.all())) {
                    cur = ch.replacement()[cur];
                }
            }
            idx[i] = cur;
        }
        return idx;
    }

    /**
     * An input raster (land cover, heights) as this executor sees it: the path itself (one machine, or a file system
     * every host mounts), or for a Hadoop URI the copy Spark fetched for this executor
     * ({@code SparkContext.addFile} on the driver, see {@link CityJob}).
     */
    static Path landCover(String location) {
        if (InputStaging.isRemote(location)) {
            return Path.of(org.apache.spark.SparkFiles.get(InputStaging.fileName(location)));
        }
        return location.startsWith("file:") ? Path.of(java.net.URI.create(location)) : Path.of(location);
    }
}
