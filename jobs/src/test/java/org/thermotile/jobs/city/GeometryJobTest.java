package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.OptionalInt;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * Urban geometry in the city job, on an invented street canyon: two long 20 m buildings either
 * side of a 20 m wide east–west street (H/W = 1), open asphalt to the south.
 */
class GeometryJobTest {
    static SparkSession spark;
    @TempDir
    static Path dir;
    static final int W = 160, H = 120;
    static final double CELL = 2;
    // Street rows 30..39 (10 cells = 20 m) between buildings in rows 20..29 and 40..49.
    static final int STREET_ROW0 = 30, STREET_ROWS = 10;

    static Path write(Path d, int tile) throws Exception {
        Files.createDirectories(d);
        RasterGrid g = RasterGrid.ofEpsg(W, H, 500_000, 5_020_000, CELL, -CELL, 32632);
        int[] codes = new int[W * H];
        float[] heights = new float[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                boolean building = (r >= 20 && r < 30) || (r >= 40 && r < 50);
                codes[r * W + c] = building ? 2 : 1;
                heights[r * W + c] = building ? 20f : 0f;
            }
        }
        GeoTiffWriter.writeInt(d.resolve("landcover.tif"), g, GeoTiffWriter.IntType.UINT8, codes, OptionalInt.empty());
        GeoTiffWriter.writeFloat(d.resolve("heights.tif"), g, heights, -9999f);
        Files.writeString(d.resolve("classes.yaml"), """
                name: canyon
                classes:
                  - {code: 1, material: asphalt_aged, label: street}
                  - {code: 2, material: roof_membrane_dark, label: roof}
                """);
        Path rf = d.resolve("run.yaml");
        Files.writeString(rf, """
                name: canyon
                site: {latitude: 45.3, longitude: 9.0, elevation_m: 100}
                inputs: {land_cover: landcover.tif, classes: classes.yaml, heights: heights.tif}
                weather:
                  synthetic: {t_min_c: 20, t_max_c: 33, rel_humidity_pct: 45, wind_ms: 2, utc_offset: "+02:00"}
                period: {start: 2026-07-15, end: 2026-07-15, spin_up_days: 1}
                outputs: {maps: [peak, mean, night_min], threshold_c: 45}
                geometry: {sky_view_directions: 32, search_radius_m: 100, min_sun_elevation_deg: 10}
                tiling: {tile_size: %d}
                """.formatted(tile));
        return rf;
    }

    static Path run(String name, int tile) throws Exception {
        Path rf = write(dir.resolve("in-" + name), tile);
        Path out = dir.resolve(name);
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(rf)), new CityJob.Options(out, null, false, true, 0),
                new PrintStream(new ByteArrayOutputStream()));
        return out;
    }

    static Path out256;

    @BeforeAll
    static void once() throws Exception {
        spark = SparkSessions.get(null, 2);
        out256 = run("t256", 256);
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    static Row cell(int col, int row) {
        return spark.read().parquet(out256.resolve("tables/cells").toString())
                .where("scenario = 'baseline' and col = " + col + " and row = " + row).first();
    }

    /**
     * The canyon floor's centre sees the sky view factor of an infinite canyon, cos(atan(2H/W))
     * (Oke 1987; Johnson &amp; Watson 1984) = 0.447 for H/W = 1, within 0.02 (the search radius of
     * 100 m cuts the most oblique rays); open ground sees 1.
     */
    @Test
    void canyonFloorSeesTheAnalyticSkyViewFactor() {
        double expect = Math.cos(Math.atan(2.0));
        // Row 34/35 straddle the centre line; take the mean of the two central rows.
        double svf = (cell(80, 34).<Double>getAs("sky_view_factor") + cell(80, 35).<Double>getAs("sky_view_factor")) / 2;
        assertEquals(expect, svf, 0.02);
        assertEquals(1.0, cell(80, 100).<Double>getAs("sky_view_factor"), 1e-9);
        assertTrue(Files.exists(out256.resolve("maps/sky_view_factor.tif")));
        assertTrue(Files.exists(out256.resolve("maps/shaded_hours.tif")));
    }

    /**
     * A canyon floor's peak is lower and its night minimum higher than open asphalt's (issue
     * check). In this east–west street the July noon sun (about 68° high) still reaches the
     * centre line, so the peak drops by the lost diffuse sky (more than 0.5 K), not by a shadow.
     */
    @Test
    void canyonFloorIsCoolerAtNoonAndWarmerAtNight() {
        Row canyon = cell(80, 35);
        Row open = cell(80, 100);
        assertTrue(canyon.<Double>getAs("peak_c") < open.<Double>getAs("peak_c") - 0.5,
                "peak canyon " + canyon.getAs("peak_c") + " vs open " + open.getAs("peak_c"));
        assertTrue(canyon.<Double>getAs("night_min_c") > open.<Double>getAs("night_min_c"),
                "night minimum canyon " + canyon.getAs("night_min_c") + " vs open " + open.getAs("night_min_c"));
    }

    /** Tile sizes 64 and 256 give identical sky view factor, shadow and temperature maps. */
    @Test
    void tileSizesGiveIdenticalGeometryAndTemperatureMaps() throws Exception {
        Path out64 = run("t64", 64);
        for (String m : List.of("sky_view_factor", "shaded_hours", "peak", "mean", "night_min")) {
            assertArrayEquals(Files.readAllBytes(out256.resolve("maps/" + m + ".tif")),
                    Files.readAllBytes(out64.resolve("maps/" + m + ".tif")), m);
        }
    }

    /**
     * The manifest's run file is fully resolved (every geometry default actually used is written
     * out), and a re-run from it alone gives byte-identical maps.
     */
    @Test
    void aReRunFromTheManifestsResolvedRunFileGivesIdenticalMaps() throws Exception {
        com.fasterxml.jackson.databind.JsonNode rf = new com.fasterxml.jackson.databind.ObjectMapper()
                .readTree(out256.resolve("manifest.json").toFile()).get("run_file");
        com.fasterxml.jackson.databind.JsonNode g = rf.get("geometry");
        assertEquals(0.3, g.get("canopy_transmissivity").asDouble(), 0);
        assertEquals(org.thermotile.model.geometry.GeometryFactors.DEFAULT_WALL_EMISSIVITY,
                g.get("wall_emissivity").asDouble(), 0);
        assertEquals(10, g.get("min_sun_elevation_deg").asDouble(), 0);
        for (String k : List.of("physics", "outputs", "tiling", "period", "weather", "site", "inputs")) {
            assertTrue(rf.has(k), "resolved run file has " + k);
        }
        Path in = dir.resolve("in-t256");
        Path again = in.resolve("resolved.yaml");
        Files.writeString(again, new com.fasterxml.jackson.databind.ObjectMapper(
                new com.fasterxml.jackson.dataformat.yaml.YAMLFactory()).writeValueAsString(rf));
        Path out = dir.resolve("rerun");
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(again)), new CityJob.Options(out, null, false, true, 0),
                new PrintStream(new ByteArrayOutputStream()));
        List<String> maps;
        try (java.util.stream.Stream<Path> st = Files.list(out256.resolve("maps"))) {
            maps = st.map(x -> x.getFileName().toString()).sorted().toList();
        }
        assertTrue(maps.size() >= 5, maps.toString());
        for (String m : maps) {
            org.junit.jupiter.api.Assertions.assertArrayEquals(Files.readAllBytes(out256.resolve("maps/" + m)),
                    Files.readAllBytes(out.resolve("maps/" + m)), m);
        }
    }
}
