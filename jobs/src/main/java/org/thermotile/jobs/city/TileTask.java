package org.thermotile.jobs.city;

import java.nio.file.Path;
import org.thermotile.jobs.io.districts.Districts;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.model.materials.Material;
import org.thermotile.model.scenario.Adoption;
import org.thermotile.model.tile.TileSimulation;

/** The work of one Spark task: read the tile's window of the land cover, map it, simulate it. */
public final class TileTask {
    private TileTask() {}

    public static TileOutput run(TileSpec tile, TileJobSpec spec) {
        return run(tile, spec, null, null, null);
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
        long t0 = System.nanoTime();
        int[] codes;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(Path.of(spec.landCover()))) {
            codes = r.readIntWindow(tile.col0(), tile.row0(), tile.width(), tile.height());
        }
        int[] idx = new int[codes.length];
        int[] lut = spec.codeToPalette();
        for (int i = 0; i < codes.length; i++) {
            int c = codes[i];
            idx[i] = (c >= 0 && c < lut.length) ? lut[c] : TileSimulation.NO_MATERIAL;
        }
        int[] district = spec.districts().isEmpty() ? null : Districts.assign(spec.districts(), spec.grid(),
                tile.col0(), tile.row0(), tile.width(), tile.height());
        Material[] palette = spec.palette();
        if (variant != null && !variant.isBaseline()) {
            palette = variant.palette();
            int w = spec.grid().width();
            for (int i = 0; i < idx.length; i++) {
                int base = idx[i];
                if (base < 0) {
                    continue;
                }
                int cell = (tile.row0() + i / tile.width()) * w + tile.col0() + i % tile.width();
                int d = district == null ? -1 : district[i];
                boolean roof = roofs.get(cell);
                int cur = base;
                for (ScenarioVariant.Change ch : variant.changes()) {
                    if (ch.candidate(base, codes[i], d, roof)
                            && Adoption.treated(Adoption.key(ch.seed(), units[cell]), ch.threshold(), ch.all())) {
                        cur = ch.replacement()[cur];
                    }
                }
                idx[i] = cur;
            }
        }
        TileSimulation.Result res = TileSimulation.run(palette, idx, district, spec.districts().size(),
                spec.forcing(), spec.settings());
        return new TileOutput(variant == null ? "baseline" : variant.name(), tile, codes, idx, district, res,
                (System.nanoTime() - t0) / 1e9);
    }
}
