package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;
import com.fasterxml.jackson.databind.JsonNode;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.testing.Gdal;
import org.thermotile.model.balance.SingleSurface;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.tile.TileSimulation;

/** The city job end to end on a small invented city, on one shared embedded Spark session. */
class CityJobTest {
    static SparkSession spark;
    @TempDir
    static Path dir;
    static Path out256;
    static PreparedRun prepared;

    @BeforeAll
    static void runOnce() throws Exception {
        spark = SparkSessions.get(null, 2);
        Path rf = CityFixture.write(dir.resolve("in256"), 256, "  hourly_days: [2026-07-15]");
        Files.writeString(rf, Files.readString(rf) + "hotspots: {statistics: [peak, mean], cell_size_m: 10, distance_m: 30}\n");
        prepared = RunPreparer.prepare(RunFileReader.read(rf));
        out256 = dir.resolve("out256");
        CityJob.run(spark, prepared, new CityJob.Options(out256, null, false, true, 0), quietConsole());
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    static PrintStream quietConsole() {
        return new PrintStream(new ByteArrayOutputStream());
    }

    @Test
    void writesMapsTablesAndManifestAndNothingElse() {
        for (String f : List.of("maps/peak.tif", "maps/mean.tif", "maps/night_min.tif", "maps/peak_hour.tif",
                "maps/degree_hours.tif", "maps/hourly_2026-07-15.tif", "tables/cells", "tables/material_hours",
                "tables/cell_hours", "tables/district_hours", "manifest.json", "hotspots/peak/excess_band.tif",
                "hotspots/mean/hotspots.geojson")) {
            assertTrue(Files.exists(out256.resolve(f)), f);
        }
        assertFalse(Files.exists(dir.resolve(".out256.partial")), "temporary folder removed");
    }

    /** DuckDB (an independent Parquet reader) sees the same rows and aggregates as Spark. */
    @Test
    void duckDbReadsEveryTableWithSparksAggregates() throws Exception {
        Class.forName("org.duckdb.DuckDBDriver");
        try (Connection c = DriverManager.getConnection("jdbc:duckdb:"); Statement st = c.createStatement()) {
            for (String t : List.of("cells", "material_hours", "cell_hours")) {
                String glob = out256.resolve("tables/" + t).toString() + "/*/*.parquet";
                Row spk = spark.read().parquet(out256.resolve("tables/" + t).toString())
                        .selectExpr("count(*)", t.equals("cells") ? "avg(peak_c)" : t.equals("cell_hours")
                                ? "avg(surface_c)" : "avg(mean_c)").first();
                try (ResultSet rs = st.executeQuery("select count(*), avg(" + (t.equals("cells") ? "peak_c"
                        : t.equals("cell_hours") ? "surface_c" : "mean_c") + ") from read_parquet('" + glob + "')")) {
                    rs.next();
                    assertEquals(spk.getLong(0), rs.getLong(1), t + " rows");
                    assertEquals(spk.getDouble(1), rs.getDouble(2), 1e-9, t + " mean");
                }
            }
            long expectCells = prepared.activeCells();
            try (ResultSet rs = st.executeQuery("select count(*) from read_parquet('"
                    + out256.resolve("tables/cells") + "/*/*.parquet')")) {
                rs.next();
                assertEquals(expectCells, rs.getLong(1));
            }
        }
    }

    /** Every map cell equals the Parquet summary's value for the same cell (float32 rounding). */
    @Test
    void mapsAgreeWithTheParquetSummary() {
        Map<Long, Row> byCell = new TreeMap<>();
        for (Row r : spark.read().parquet(out256.resolve("tables/cells").toString()).collectAsList()) {
            byCell.put((long) r.<Integer>getAs("row") * CityFixture.W + r.<Integer>getAs("col"), r);
        }
        try (GeoTiffReader peak = GeoTiffReader.openSingleBand(out256.resolve("maps/peak.tif"))) {
            assertEquals(CityFixture.grid().originX(), peak.grid().originX());
            assertEquals(CityFixture.grid().pixelHeight(), peak.grid().pixelHeight());
            assertEquals(32632, peak.grid().epsg());
            assertEquals(CityJob.MAP_NODATA, peak.noDataValue().getAsDouble(), 0);
            float[] v = peak.readFloatWindow(0, 0, CityFixture.W, CityFixture.H);
            int nodata = 0;
            for (int i = 0; i < v.length; i++) {
                Row r = byCell.get((long) i);
                if (r == null) {
                    assertTrue(Float.isNaN(v[i]), "nodata cells read back as NaN (SIS maps the declared nodata)");
                    nodata++;
                } else {
                    assertEquals((float) r.<Double>getAs("peak_c").floatValue(), v[i], 0f, "cell " + i);
                }
            }
            assertEquals(6 * 9, nodata, "the nodata corner");
        }
    }

    /** A cell of the city job equals the single-surface run of the same material and weather (1e-9 K). */
    @Test
    void aCityCellEqualsTheSingleSurfaceRun() {
        TileJobSpec spec = prepared.spec();
        TileSimulation.Settings s = spec.settings();
        int[] codes = CityFixture.codes();
        int cell = 0;
        while (codes[cell] != 2) {
            cell++; // the first dark-roof cell
        }
        int col = cell % CityFixture.W, row = cell / CityFixture.W;
        int idx = spec.codeToPalette()[2];
        SingleSurface.Result point = SingleSurface.run(spec.palette()[idx], spec.forcing(), s.substepMinutes(),
                s.convection(), s.deepGroundK(), s.firstSampleHour(), s.thresholdK());
        Row r = spark.read().parquet(out256.resolve("tables/cells").toString())
                .where("col = " + col + " and row = " + row).first();
        assertEquals(point.statistics.peakK(0) - Physical.ZERO_CELSIUS_K, r.<Double>getAs("peak_c"), 1e-9);
        assertEquals(point.statistics.meanK(0) - Physical.ZERO_CELSIUS_K, r.<Double>getAs("mean_c"), 1e-9);
        assertEquals(point.statistics.nightMinK(0) - Physical.ZERO_CELSIUS_K, r.<Double>getAs("night_min_c"), 1e-9);
        assertEquals("roof_membrane_dark", r.<String>getAs("material"));
    }

    /** Tile sizes 64 and 256 give byte-identical maps and tables (no seams). */
    @Test
    void tileSize64And256GiveIdenticalMapsAndTables() throws Exception {
        Path rf = CityFixture.write(dir.resolve("in64"), 64, "  hourly_days: [2026-07-15]");
        Path out64 = dir.resolve("out64");
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(rf)),
                new CityJob.Options(out64, null, false, true, 0), quietConsole());
        for (String m : List.of("peak", "mean", "night_min", "peak_hour", "degree_hours", "hourly_2026-07-15")) {
            assertArrayEquals(Files.readAllBytes(out256.resolve("maps/" + m + ".tif")),
                    Files.readAllBytes(out64.resolve("maps/" + m + ".tif")), m);
        }
        // Rows are the same set; their order follows the tiles.
        assertEquals(0, spark.read().parquet(out256.resolve("tables/cells").toString())
                .exceptAll(spark.read().parquet(out64.resolve("tables/cells").toString())).count());
        assertEquals(0, spark.read().parquet(out64.resolve("tables/cells").toString())
                .exceptAll(spark.read().parquet(out256.resolve("tables/cells").toString())).count());
    }

    /**
     * The per-district hourly mean and 10/90 % quantiles agree with DuckDB's exact aggregates of
     * the per-cell hourly rows (quantiles within the 0.5 K histogram bin).
     */
    @Test
    void districtHoursAgreeWithExactAggregatesOfTheHourlyCells() throws Exception {
        Class.forName("org.duckdb.DuckDBDriver");
        String cells = out256.resolve("tables/cells") + "/*/*.parquet";
        String hours = out256.resolve("tables/cell_hours") + "/*/*.parquet";
        String dist = out256.resolve("tables/district_hours") + "/*/*.parquet";
        String q = "with h as (select c.district, ch.time, ch.surface_c from read_parquet('" + hours + "') ch"
                + " join read_parquet('" + cells + "') c using (col, row) where c.district is not null),"
                + " e as (select district, time, avg(surface_c) m, quantile_cont(surface_c, 0.1) p10,"
                + " quantile_cont(surface_c, 0.9) p90, count(*) n from h group by district, time)"
                + " select count(*), max(abs(e.m - d.mean_c)), max(abs(e.p10 - d.p10_c)), max(abs(e.p90 - d.p90_c)),"
                + " sum(abs(e.n - d.cells)) from e join read_parquet('" + dist + "') d using (district, time)";
        try (Connection c = DriverManager.getConnection("jdbc:duckdb:"); Statement st = c.createStatement();
                ResultSet rs = st.executeQuery(q)) {
            rs.next();
            assertEquals(2 * 24, rs.getLong(1), "two districts × 24 hours of the chosen day");
            assertTrue(rs.getDouble(2) < 1e-4, "mean within float rounding: " + rs.getDouble(2));
            assertTrue(rs.getDouble(3) <= 0.5, "p10 within a bin: " + rs.getDouble(3));
            assertTrue(rs.getDouble(4) <= 0.5, "p90 within a bin: " + rs.getDouble(4));
            assertEquals(0, rs.getLong(5), "cell counts");
        }
    }

    /**
     * GDAL reads every map with the input's EPSG code, geotransform and nodata value, and its
     * statistics equal those of the same cells in the Parquet summary (DuckDB).
     */
    @Test
    void gdalReadsTheMapsWithTheInputGridAndTheSummarysStatistics() throws Exception {
        Gdal.require("gdalinfo");
        Class.forName("org.duckdb.DuckDBDriver");
        String cells = out256.resolve("tables/cells") + "/*/*.parquet";
        Map<String, String> column = Map.of("peak", "peak_c", "mean", "mean_c", "night_min", "night_min_c",
                "peak_hour", "peak_hour_h", "degree_hours", "degree_hours_k_h");
        try (Connection c = DriverManager.getConnection("jdbc:duckdb:"); Statement st = c.createStatement()) {
            for (var e : column.entrySet()) {
                JsonNode info = Gdal.info(out256.resolve("maps/" + e.getKey() + ".tif"));
                assertTrue(info.path("coordinateSystem").path("wkt").asText().contains("ID[\"EPSG\",32632]"), e.getKey());
                JsonNode gt = info.path("geoTransform");
                assertEquals(CityFixture.X0, gt.get(0).asDouble(), 0);
                assertEquals(CityFixture.CELL, gt.get(1).asDouble(), 0);
                assertEquals(0, gt.get(2).asDouble(), 0);
                assertEquals(CityFixture.Y0, gt.get(3).asDouble(), 0);
                assertEquals(-CityFixture.CELL, gt.get(5).asDouble(), 0);
                JsonNode band = info.path("bands").get(0);
                assertEquals(CityJob.MAP_NODATA, band.path("noDataValue").asDouble(), 0, e.getKey());
                // Statistics of the float32 values of the same cells.
                try (ResultSet rs = st.executeQuery("select min(v), max(v), avg(v) from (select cast("
                        + e.getValue() + " as float) v from read_parquet('" + cells + "'))")) {
                    rs.next();
                    assertEquals(rs.getDouble(1), band.path("minimum").asDouble(), 1e-3, e.getKey() + " min");
                    assertEquals(rs.getDouble(2), band.path("maximum").asDouble(), 1e-3, e.getKey() + " max");
                    assertEquals(rs.getDouble(3), band.path("mean").asDouble(), 1e-3, e.getKey() + " mean");
                }
            }
        }
    }

    /** An existing output folder is refused without --replace, and left as it was. */
    @Test
    void existingOutputIsRefusedUnlessReplace() throws Exception {
        Path existing = dir.resolve("existing");
        Files.createDirectories(existing);
        Files.writeString(existing.resolve("keep.txt"), "mine");
        var e = assertThrows(RuntimeException.class, () -> CityJob.run(spark, prepared,
                new CityJob.Options(existing, null, false, true, 0), quietConsole()));
        assertTrue(e.getMessage().contains("--replace"), e.getMessage());
        assertEquals("mine", Files.readString(existing.resolve("keep.txt")));
    }

    static List<String> tree(Path root) throws Exception {
        try (Stream<Path> s = Files.walk(root)) {
            return s.filter(Files::isRegularFile).map(p -> root.relativize(p).toString()).sorted().toList();
        }
    }

    /**
     * Every map of the run passes GDAL's COG validator ({@code validate_cloud_optimized_geotiff.py}
     * from Debian's python3-gdal) without warnings, and gdalinfo shows each band's description and
     * unit, and on the hourly stack each band's ISO time with its offset.
     */
    @Test
    void everyMapIsAValidCogWithDescribedBands() throws Exception {
        Gdal.require("gdalinfo");
        String validator = "/usr/lib/python3/dist-packages/osgeo_utils/samples/validate_cloud_optimized_geotiff.py";
        org.thermotile.jobs.testing.ExternalTool.requireFile("apt-get install python3-gdal", Path.of(validator));
        List<Path> maps;
        try (Stream<Path> s = Files.walk(out256)) {
            maps = s.filter(p -> p.toString().endsWith(".tif")).sorted().toList();
        }
        assertTrue(maps.size() >= 7, maps.toString());
        for (Path m : maps) {
            String v = Gdal.run(List.of("/usr/bin/python3", validator, m.toString()));
            assertTrue(v.contains("is a valid cloud optimized GeoTIFF") && !v.toLowerCase(java.util.Locale.ROOT)
                    .contains("warning"), m + ": " + v);
        }
        JsonNode peak = Gdal.info(out256.resolve("maps/peak.tif")).path("bands").get(0);
        assertEquals("peak surface temperature of the period", peak.path("description").asText());
        assertEquals("degC", peak.path("unit").asText());
        assertEquals("K.h", Gdal.info(out256.resolve("maps/degree_hours.tif")).path("bands").get(0)
                .path("unit").asText());
        JsonNode hourly = Gdal.info(out256.resolve("maps/hourly_2026-07-15.tif")).path("bands");
        assertEquals(24, hourly.size());
        for (int h = 0; h < hourly.size(); h++) {
            JsonNode b = hourly.get(h);
            String time = b.path("metadata").path("").path("TIME").asText();
            assertTrue(time.matches("2026-07-15T\\d\\d:00\\+02:00"), time);
            assertEquals("surface temperature at " + time, b.path("description").asText());
            assertEquals("degC", b.path("unit").asText());
        }
    }
}
