package org.thermotile.jobs.city;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeMap;
import org.thermotile.jobs.catalogue.OutputDescriptions;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.raster.CloudOptimized;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.tile.TileSimulation;

/**
 * Writes the statistic maps: one float32 GeoTIFF per statistic, on exactly the input's grid.
 *
 * <p>The driver never holds a whole grid: the GeoTIFF writer asks for its blocks in row-major
 * order ({@link GeoTiffWriter#writeFloatBlocks}), and the blocks are cut from the tile results
 * of the one or few tile rows they overlap, fetched from the executors a tile row at a time
 * ({@link TileSource}) and dropped once the writer has moved below them. Driver memory is
 * therefore about grid width × max(tile size, 256) × bands × 4 bytes per map being written.
 */
final class MapOutputs {
    private MapOutputs() {}

    /**
     * Which values of a tile a map takes, as float32 with no-data (no material) as
     * {@link CityJob#MAP_NODATA}: a statistic map one band, an hourly stack one band per hour.
     * Serialisable: it runs on the executors, so only the map's values cross the network.
     *
     * @param statistic   a {@link RunFile.MapKind} key, or null for an hourly stack
     * @param hourlyBands indices into {@link TileSimulation.Result#hourlyC} (hourly stacks)
     */
    record Layer(String statistic, int[] hourlyBands) implements java.io.Serializable {
        int bands() {
            return statistic != null ? 1 : hourlyBands.length;
        }

        /** The tile's values: [band][row-major cell of the tile]. */
        float[][] of(TileSimulation.Result r) {
            if (statistic != null) {
                return new float[][] {toMapValues(field(statistic, r))};
            }
            float[][] out = new float[hourlyBands.length][];
            for (int b = 0; b < out.length; b++) {
                out[b] = toMapValues(r.hourlyC[hourlyBands[b]]);
            }
            return out;
        }
    }

    /** Tile values fetched a tile row at a time. */
    @FunctionalInterface
    interface TileSource {
        /** For each tile of tile row {@code tileRow}, left to right, {@code layer.of(result)}. */
        List<float[][]> tileRow(Layer layer, int tileRow);
    }

    /** The tile array of a statistic. */
    static double[] field(String key, TileSimulation.Result r) {
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        if (kind != null) {
            return kind.values(r);
        }
        return switch (key) {
            case "sky_view_factor" -> r.skyViewFactor;
            case "shaded_hours" -> r.shadedHours;
            default -> throw new IllegalArgumentException("no map for " + key);
        };
    }

    /** Writes every map the run asks for; returns their paths relative to the output folder. */
    static List<String> write(PreparedRun p, TileSource tiles, Path mapsDir) {
        RasterGrid grid = p.grid();
        int tileSize = p.run().tiling().tileSize();
        List<String> written = new ArrayList<>();
        for (RunFile.MapKind kind : p.run().outputs().maps()) {
            String name = kind.key() + ".tif";
            Layer layer = new Layer(kind.key(), null);
            // Overviews average temperatures and counts; the clock hour of the peak takes the nearest cell.
            GeoTiffWriter.writeFloatBlocks(mapsDir.resolve(name), grid, List.of(band(kind.key())), CityJob.MAP_NODATA,
                    new Strips(grid, tileSize, layer, tiles), kind.nearestOverviews()
                            ? CloudOptimized.Resampling.NEAREST : CloudOptimized.Resampling.AVERAGE);
            written.add("maps/" + name);
        }
        if (p.spec().geometry() != null) {
            // Urban geometry: sky view factor (a fraction) and sun hours lost to cast shadows.
            for (String name : List.of("sky_view_factor", "shaded_hours")) {
                GeoTiffWriter.writeFloatBlocks(mapsDir.resolve(name + ".tif"), grid, List.of(band(name)),
                        CityJob.MAP_NODATA, new Strips(grid, tileSize, new Layer(name, null), tiles),
                        CloudOptimized.Resampling.AVERAGE);
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
                if (p.run().outputs().hourlyDays().contains(d)) {   // not the hours kept only for observations
                    byDay.computeIfAbsent(d, k -> new ArrayList<>()).add(i);
                }
            }
            for (var e : byDay.entrySet()) {
                Layer layer = new Layer(null, e.getValue().stream().mapToInt(Integer::intValue).toArray());
                String name = "hourly_" + e.getKey() + ".tif";
                List<GeoTiffWriter.Band> bands = new ArrayList<>();
                for (int i : layer.hourlyBands()) {
                    String t = java.time.OffsetDateTime.ofInstant(java.time.Instant.ofEpochSecond(hours[i]), off)
                            .toString();
                    bands.add(OutputDescriptions.hourly(t));
                }
                GeoTiffWriter.writeFloatBlocks(mapsDir.resolve(name), grid, bands, CityJob.MAP_NODATA,
                        new Strips(grid, tileSize, layer, tiles), CloudOptimized.Resampling.AVERAGE);
                written.add("maps/" + name);
            }
        }
        return written;
    }

    /** Description and unit of a statistic map's band: {@link OutputDescriptions#statistic}. */
    static GeoTiffWriter.Band band(String key) {
        return OutputDescriptions.statistic(key);
    }

    /** A tile's values as float32, NaN (no material) as the map's no-data value. */
    static float[] toMapValues(double[] a) {
        float[] f = new float[a.length];
        for (int i = 0; i < a.length; i++) {
            double v = a[i];
            f[i] = Double.isNaN(v) ? CityJob.MAP_NODATA : (float) v;
        }
        return f;
    }

    /** As {@link #toMapValues(double[])} for float values. */
    static float[] toMapValues(float[] a) {
        float[] f = new float[a.length];
        for (int i = 0; i < a.length; i++) {
            float v = a[i];
            f[i] = Float.isNaN(v) ? CityJob.MAP_NODATA : v;
        }
        return f;
    }

    /**
     * Cuts the writer's blocks from the tile rows they overlap. Blocks come in row-major order,
     * so tile rows above the current block are dropped; a block asked for again after that (not
     * expected) is served by fetching its tile rows again.
     */
    static final class Strips implements GeoTiffWriter.FloatBlockSource {
        private final RasterGrid grid;
        private final int tileSize;
        private final Layer layer;
        private final TileSource source;
        private final TreeMap<Integer, List<float[][]>> loaded = new TreeMap<>();

        Strips(RasterGrid grid, int tileSize, Layer layer, TileSource source) {
            this.grid = grid;
            this.tileSize = tileSize;
            this.layer = layer;
            this.source = source;
        }

        @Override
        public void fill(int band, int col0, int row0, int width, int height, float[] out) {
            int first = row0 / tileSize;
            int last = (row0 + height - 1) / tileSize;
            loaded.headMap(first).clear();
            for (int tr = first; tr <= last; tr++) {
                if (!loaded.containsKey(tr)) {
                    loaded.put(tr, source.tileRow(layer, tr));
                }
            }
            for (int r = 0; r < height; r++) {
                int row = row0 + r;
                int tr = row / tileSize;
                List<float[][]> tiles = loaded.get(tr);
                int rowInTile = row - tr * tileSize;
                for (int c = col0; c < col0 + width; ) {
                    int tc = c / tileSize;
                    int tileWidth = Math.min(tileSize, grid.width() - tc * tileSize);
                    int n = Math.min(col0 + width - c, (tc + 1) * tileSize - c);
                    System.arraycopy(tiles.get(tc)[band], rowInTile * tileWidth + (c - tc * tileSize),
                            out, r * width + (c - col0), n);
                    c += n;
                }
            }
        }
    }
}
