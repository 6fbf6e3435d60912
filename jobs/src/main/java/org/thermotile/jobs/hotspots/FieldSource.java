package org.thermotile.jobs.hotspots;

import java.io.Serializable;
import java.nio.file.Path;
import org.thermotile.jobs.storage.InputStaging;
import org.thermotile.jobs.storage.OutputStore;
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
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(open(map))) {
            a = r.readFloatWindow(col0, row0, width, height);
        }
        if (baseline == null) {
            return a;
        }
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(open(baseline))) {
            float[] b = r.readFloatWindow(col0, row0, width, height);
            for (int i = 0; i < a.length; i++) {
                a[i] = a[i] - b[i];               // NaN − x and x − NaN are NaN
            }
        }
        return a;
    }

    /**
     * This source as tasks read it: for a run folder staged for a Hadoop file system, the maps are
     * copied there first and read from there ({@link OutputStore}); otherwise unchanged.
     */
    FieldSource forTasks() {
        OutputStore.push(Path.of(map));
        if (baseline != null) {
            OutputStore.push(Path.of(baseline));
        }
        return new FieldSource(OutputStore.executorLocation(Path.of(map)),
                baseline == null ? null : OutputStore.executorLocation(Path.of(baseline)));
    }

    /** A local file for a location: the path, or this JVM's copy of a Hadoop URI. */
    private static Path open(String location) {
        return InputStaging.isRemote(location) ? InputStaging.local(location, "map") : Path.of(location);
    }
}
