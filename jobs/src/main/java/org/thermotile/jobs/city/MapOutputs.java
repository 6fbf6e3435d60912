package org.thermotile.jobs.city;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.function.Function;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.tile.TileSimulation;

/** Writes the statistic maps: one float32 GeoTIFF per statistic, on exactly the input's grid. */
final class MapOutputs {
    private MapOutputs() {}

    /** File name (without .tif) and the tile array for each map kind. */
    static Function<TileSimulation.Result, double[]> field(RunFile.MapKind kind) {
        return switch (kind.key()) {
            case "peak" -> r -> r.peakC;
            case "mean" -> r -> r.meanC;
            case "night_min" -> r -> r.nightMinC;
            case "peak_hour" -> r -> r.peakHour;
            case "degree_hours" -> r -> r.degreeHoursAbove;
            case "hours_above" -> r -> r.hoursAbove;
            default -> throw new IllegalArgumentException("no map for " + kind.key());
        };
    }

    static List<String> write(PreparedRun p, List<TileOutput> tiles, Path mapsDir) {
        RasterGrid grid = p.grid();
        List<String> written = new ArrayList<>();
        for (RunFile.MapKind kind : p.run().outputs().maps()) {
            float[] full = assemble(grid, tiles, field(kind));
            String name = kind.key() + ".tif";
            GeoTiffWriter.writeFloat(mapsDir.resolve(name), grid, full, CityJob.MAP_NODATA);
            written.add("maps/" + name);
        }
        if (p.spec().geometry() != null) {
            // Urban geometry: sky view factor (a fraction) and sun hours lost to cast shadows.
            for (String name : List.of("sky_view_factor", "shaded_hours")) {
                float[] full = assemble(grid, tiles, name.equals("sky_view_factor") ? r -> r.skyViewFactor : r -> r.shadedHours);
                GeoTiffWriter.writeFloat(mapsDir.resolve(name + ".tif"), grid, full, CityJob.MAP_NODATA);
                written.add("maps/" + name + ".tif");
            }
        }
        long[] hours = p.hourlyEpochSeconds();
        if (hours.length > 0) {
            // One stack per day: bands are that day's hours in order.
            java.time.ZoneOffset off = java.time.ZoneOffset.ofTotalSeconds(p.spec().forcing().utcOffsetSeconds);
            java.util.Map<java.time.LocalDate, List<Integer>> byDay = new java.util.TreeMap<>();
            for (int i = 0; i < hours.length; i++) {
                java.time.LocalDate d = java.time.LocalDateTime.ofEpochSecond(hours[i], 0, off).toLocalDate();
                byDay.computeIfAbsent(d, k -> new ArrayList<>()).add(i);
            }
            for (var e : byDay.entrySet()) {
                List<Integer> idx = e.getValue();
                float[][] bands = new float[idx.size()][];
                for (int b = 0; b < idx.size(); b++) {
                    int band = idx.get(b);
                    bands[b] = assemble(grid, tiles, r -> toDoubles(r.hourlyC[band]));
                }
                String name = "hourly_" + e.getKey() + ".tif";
                GeoTiffWriter.writeFloatStack(mapsDir.resolve(name), grid, bands, CityJob.MAP_NODATA);
                written.add("maps/" + name);
            }
        }
        return written;
    }

    /** The whole grid of one field from the tiles, NaN (no material) as the map's no-data value. */
    static double[] toDoubles(float[] a) {
        double[] d = new double[a.length];
        for (int i = 0; i < a.length; i++) {
            d[i] = a[i];
        }
        return d;
    }

    static float[] assemble(RasterGrid grid, List<TileOutput> tiles, Function<TileSimulation.Result, double[]> f) {
        float[] full = new float[grid.width() * grid.height()];
        for (TileOutput o : tiles) {
            TileSpec t = o.tile();
            double[] src = f.apply(o.result());
            for (int r = 0; r < t.height(); r++) {
                int dst = (t.row0() + r) * grid.width() + t.col0();
                for (int c = 0; c < t.width(); c++) {
                    double v = src[r * t.width() + c];
                    full[dst + c] = Double.isNaN(v) ? CityJob.MAP_NODATA : (float) v;
                }
            }
        }
        return full;
    }
}
