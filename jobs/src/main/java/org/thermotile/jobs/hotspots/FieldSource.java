package org.thermotile.jobs.hotspots;

import java.io.Serializable;
import java.nio.file.Path;
import org.thermotile.jobs.io.raster.GeoTiffReader;

/**
 * Where a Spark task reads the statistic: one float map, or the difference of two maps on the same
 * grid (a scenario's map minus the baseline's). Paths are kept as text so tasks can carry them.
 *
 * @param map       the map (or the minuend)
 * @param baseline  the map subtracted from {@code map}, or null
 */
record FieldSource(String map, String baseline) implements Serializable {

    /**
     * The values of columns {@code col0…col0+width−1}, rows {@code row0…row0+height−1}, row-major,
     * NaN where either map has no data.
     */
    float[] read(int col0, int row0, int width, int height) {
        float[] a;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(Path.of(map))) {
            a = r.readFloatWindow(col0, row0, width, height);
        }
        if (baseline == null) {
            return a;
        }
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(Path.of(baseline))) {
            float[] b = r.readFloatWindow(col0, row0, width, height);
            for (int i = 0; i < a.length; i++) {
                a[i] = a[i] - b[i];               // NaN − x and x − NaN are NaN
            }
        }
        return a;
    }
}
