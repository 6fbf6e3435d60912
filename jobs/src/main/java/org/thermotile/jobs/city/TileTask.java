package org.thermotile.jobs.city;

import java.nio.file.Path;
import org.thermotile.jobs.io.districts.Districts;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.model.tile.TileSimulation;

/** The work of one Spark task: read the tile's window of the land cover, map it, simulate it. */
public final class TileTask {
    private TileTask() {}

    public static TileOutput run(TileSpec tile, TileJobSpec spec) {
        long t0 = System.nanoTime();
        int[] codes;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(landCover(spec.landCover()))) {
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
        TileSimulation.Result res = TileSimulation.run(spec.palette(), idx, district, spec.districts().size(),
                spec.forcing(), spec.settings());
        return new TileOutput(tile, codes, idx, district, res, (System.nanoTime() - t0) / 1e9);
    }

    /**
     * The land cover as this executor sees it: the path itself (one machine, or a file system
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
