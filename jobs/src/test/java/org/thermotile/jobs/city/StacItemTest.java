package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.TreeSet;
import java.util.stream.Stream;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.catalogue.StacItem;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.testing.Gdal;

/**
 * The run's catalogue entry ({@code item.json}) and the band texts of every map.
 *
 * <p>No artifact on Maven Central ships the published STAC JSON schemas (item-spec 1.0.0 and the
 * projection/raster extension schemas), and they may not be fetched while testing, so the item is
 * checked against the fields the STAC 1.0.0 Item specification requires ("Item Fields": type =
 * Feature, stac_version, id, geometry, bbox when geometry is not null, properties with datetime or,
 * when datetime is null, start_datetime and end_datetime, links, assets with href) and the field
 * types of the projection extension v1.1.0 (proj:epsg integer or null, proj:shape two integers,
 * proj:transform six or nine numbers, proj:bbox four numbers). GDAL is the independent reader: the
 * geometry agrees with gdalinfo's own WGS 84 extent, and the projection fields with its size and
 * geotransform.
 */
class StacItemTest {
    @TempDir
    static Path dir;

    static SparkSession spark;
    static Path out;

    @BeforeAll
    static void runCity() throws Exception {
        Path rf = CityFixture.write(dir.resolve("in"), 64, "  hourly_days: [2026-07-15]");
        // Every map the run file can ask for, so each map descriptor's band is written and checked.
        Files.writeString(rf, Files.readString(rf).replace("degree_hours]", "degree_hours, hours_above]") + """
                scenarios:
                  - name: cool-dark-roofs
                    changes:
                      - {targets: {materials: [roof_membrane_dark]}, set: {albedo: 0.8}}
                hotspots: {statistics: [peak], cell_size_m: 20}
                """);
        spark = SparkSessions.get(null, 2);
        out = dir.resolve("out");
        CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(rf)), new CityJob.Options(out, null, false, true, 2,
                false, org.thermotile.jobs.report.RunReport::write), new PrintStream(new ByteArrayOutputStream()));
    }

    @AfterAll
    static void stop() {
        if (spark != null) {
            spark.stop();
        }
    }

    static JsonNode item() throws Exception {
        return new ObjectMapper().readTree(out.resolve("item.json").toFile());
    }

    @Test
    void theItemHasTheFieldsStacRequires() throws Exception {
        JsonNode item = item();
        assertEquals("Feature", item.path("type").asText());
        assertEquals("1.0.0", item.path("stac_version").asText());
        assertEquals("test-city", item.path("id").asText());
        assertTrue(item.path("stac_extensions").isArray());
        assertTrue(item.path("links").isArray());
        JsonNode g = item.path("geometry");
        assertEquals("Polygon", g.path("type").asText());
        JsonNode ring = g.path("coordinates").path(0);
        assertEquals(5, ring.size());
        assertEquals(ring.get(0), ring.get(4), "the ring is closed");
        JsonNode bbox = item.path("bbox");
        assertEquals(4, bbox.size());
        assertTrue(bbox.get(0).asDouble() < bbox.get(2).asDouble() && bbox.get(1).asDouble() < bbox.get(3).asDouble());
        assertTrue(Math.abs(bbox.get(0).asDouble()) <= 180 && Math.abs(bbox.get(1).asDouble()) <= 90);

        JsonNode p = item.path("properties");
        assertTrue(p.has("datetime") && p.get("datetime").isNull(), "datetime null, the run being a range");
        // 2026-07-15 00:00 … 2026-07-16 24:00 local clock time at +02:00 (the run file's period and offset).
        assertEquals(Instant.parse("2026-07-14T22:00:00Z"), Instant.parse(p.path("start_datetime").asText()));
        assertEquals(Instant.parse("2026-07-16T22:00:00Z"), Instant.parse(p.path("end_datetime").asText()));
        assertEquals(List.of("baseline", "cool-dark-roofs"),
                new ObjectMapper().convertValue(p.path("thermotile:scenarios"), List.class));
        assertEquals(CityFixture.CELL, p.path("thermotile:cell_size_m").asDouble(), 0);
        assertEquals(32632, p.path("proj:epsg").asInt());

        JsonNode assets = item.path("assets");
        assertTrue(assets.size() > 20, "assets: " + assets.size());
        for (Iterator<Map.Entry<String, JsonNode>> it = assets.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            JsonNode a = e.getValue();
            String href = a.path("href").asText();
            assertTrue(Files.isRegularFile(out.resolve(href)), e.getKey() + ": " + href + " exists");
            assertTrue(a.path("roles").isArray() && a.path("roles").size() > 0, e.getKey() + " roles");
            assertFalse(a.path("title").asText().isBlank(), e.getKey() + " title");
            assertFalse(a.path("description").asText().isBlank(), e.getKey() + " description");
            String type = a.path("type").asText();
            String expected = href.endsWith(".tif") ? "image/tiff; application=geotiff; profile=cloud-optimized"
                    : href.endsWith(".parquet") ? "application/vnd.apache.parquet"
                    : href.endsWith(".csv") ? "text/csv"
                    : href.endsWith(".html") ? "text/html"
                    : href.endsWith(".geojson") ? "application/geo+json"
                    : href.endsWith(".json") ? "application/json"
                    : href.endsWith(".png") ? "image/png"
                    : href.endsWith(".md") ? "text/markdown" : "?";
            assertEquals(expected, type, href);
        }
        assertEquals(List.of("metadata"), new ObjectMapper().convertValue(assets.path("manifest.json").path("roles"),
                List.class));
        assertEquals("report.html", assets.path("report.html").path("href").asText());
    }

    /** Every file of the run is an asset: maps, tables, comparison, hot spots, report, manifest. */
    @Test
    void everyOutputFileIsListed() throws Exception {
        TreeSet<String> files = new TreeSet<>();
        try (Stream<Path> s = Files.walk(out)) {
            s.filter(Files::isRegularFile).map(x -> out.relativize(x).toString().replace('\\', '/'))
                    .filter(f -> !f.equals("item.json") && !f.endsWith("_SUCCESS") && !f.contains("/."))
                    .forEach(files::add);
        }
        TreeSet<String> hrefs = new TreeSet<>();
        item().path("assets").forEach(a -> hrefs.add(a.path("href").asText()));
        assertEquals(files, hrefs);
        for (String must : List.of("maps/peak.tif", "maps/hourly_2026-07-15.tif", "manifest.json", "report.html",
                "scenarios/cool-dark-roofs/maps/delta_peak.tif", "comparison/ranking.csv", "hotspots/peak/zscore.tif",
                "tables/cells/scenario=baseline/part-00000.snappy.parquet")) {
            assertTrue(hrefs.contains(must), must + " in " + hrefs);
        }
    }

    /** The projection fields of every map agree with gdalinfo (size, geotransform, EPSG), and GDAL opens each COG. */
    @Test
    void projectionFieldsAgreeWithGdal() throws Exception {
        Gdal.require("gdalinfo");
        int maps = 0;
        for (JsonNode a : item().path("assets")) {
            String href = a.path("href").asText();
            if (!href.endsWith(".tif")) {
                continue;
            }
            maps++;
            JsonNode info = Gdal.info(out.resolve(href));
            assertTrue(a.path("proj:epsg").isInt(), href);
            assertEquals(32632, a.path("proj:epsg").asInt(), href);
            JsonNode size = info.path("size");   // [width, height]
            assertEquals(size.get(1).asInt(), a.path("proj:shape").get(0).asInt(), href);
            assertEquals(size.get(0).asInt(), a.path("proj:shape").get(1).asInt(), href);
            JsonNode gt = info.path("geoTransform");   // GDAL: x0, a, b, y0, d, e
            JsonNode t = a.path("proj:transform");     // STAC: a, b, x0, d, e, y0
            assertEquals(6, t.size());
            double[] ours = {t.get(2).asDouble(), t.get(0).asDouble(), t.get(1).asDouble(), t.get(5).asDouble(),
                    t.get(3).asDouble(), t.get(4).asDouble()};
            for (int i = 0; i < 6; i++) {
                assertEquals(gt.get(i).asDouble(), ours[i], 1e-9, href + " geotransform " + i);
            }
            assertEquals(4, a.path("proj:bbox").size(), href);
            JsonNode bands = info.path("bands");
            assertEquals(bands.size(), a.path("raster:bands").size(), href);
            assertEquals(bands.get(0).path("type").asText().toLowerCase(java.util.Locale.ROOT),
                    a.path("raster:bands").get(0).path("data_type").asText(), href);
            assertTrue(bands.get(0).path("overviews").size() > 0 || size.get(0).asInt() <= 256, href + " overviews");
        }
        assertTrue(maps >= 10, "maps: " + maps);
    }

    /** The item's polygon is the grid's corners in WGS 84: gdalinfo's own wgs84Extent (PROJ), to 1e-7°. */
    @Test
    void geometryIsTheGridInWgs84AsGdalComputesIt() throws Exception {
        Gdal.require("gdalinfo");
        JsonNode gdal = new ObjectMapper().readTree(Gdal.run(List.of("gdalinfo", "-json",
                out.resolve("maps/peak.tif").toString()))).path("wgs84Extent").path("coordinates").path(0);
        JsonNode ours = item().path("geometry").path("coordinates").path(0);
        // gdalinfo lists upper left, lower left, lower right, upper right; ours starts at the lower left.
        List<double[]> g = new ArrayList<>();
        gdal.forEach(c -> g.add(new double[] {c.get(0).asDouble(), c.get(1).asDouble()}));
        for (int i = 0; i < 4; i++) {
            double lon = ours.get(i).get(0).asDouble(), lat = ours.get(i).get(1).asDouble();
            boolean found = g.stream().anyMatch(c -> Math.abs(c[0] - lon) < 1e-7 && Math.abs(c[1] - lat) < 1e-7);
            assertTrue(found, "corner " + lon + ", " + lat + " in gdalinfo's " + gdal);
        }
    }

    /** gdalinfo shows a description and a unit on every band of every map the run wrote. */
    @Test
    void everyMapBandHasADescriptionAndAUnit() throws Exception {
        Gdal.require("gdalinfo");
        for (JsonNode a : item().path("assets")) {
            String href = a.path("href").asText();
            if (!href.endsWith(".tif")) {
                continue;
            }
            JsonNode bands = Gdal.info(out.resolve(href)).path("bands");
            for (JsonNode b : bands) {
                assertFalse(b.path("description").asText().isBlank(), href + " band " + b.path("band") + " description");
                assertFalse(b.path("unit").asText().isBlank(), href + " band " + b.path("band") + " unit");
            }
        }
        JsonNode delta = Gdal.info(out.resolve("scenarios/cool-dark-roofs/maps/delta_peak.tif")).path("bands").get(0);
        assertEquals("K", delta.path("unit").asText());
        assertTrue(delta.path("description").asText().contains("scenario minus baseline"));
        JsonNode z = Gdal.info(out.resolve("hotspots/peak/zscore.tif")).path("bands").get(0);
        assertEquals("1", z.path("unit").asText());
        assertTrue(z.path("description").asText().contains("Gi* z-score"), z.toString());
    }

    /**
     * Every map descriptor's band description and unit are what gdalinfo reads from its file, and a
     * scenario has a difference map exactly for the descriptors that ask for one ("change in …", a
     * difference of °C in kelvin).
     */
    @Test
    void everyMapDescriptorIsWhatItsFileSays() throws Exception {
        Gdal.require("gdalinfo");
        for (RunFile.MapKind kind : RunFile.MapKind.values()) {
            Path tif = out.resolve("maps/" + kind.key() + ".tif");
            JsonNode band = Gdal.info(tif).path("bands").get(0);
            assertEquals(kind.bandDescription(), band.path("description").asText(), tif.toString());
            assertEquals(kind.bandUnit(), band.path("unit").asText(), tif.toString());
            Path delta = out.resolve("scenarios/cool-dark-roofs/maps/delta_" + kind.key() + ".tif");
            assertEquals(kind.delta(), Files.isRegularFile(delta), delta.toString());
            if (kind.delta()) {
                JsonNode d = Gdal.info(delta).path("bands").get(0);
                assertEquals("change in " + kind.bandDescription() + ", scenario minus baseline",
                        d.path("description").asText(), delta.toString());
                assertEquals(kind.bandUnit().equals("degC") ? "K" : kind.bandUnit(), d.path("unit").asText(),
                        delta.toString());
            }
        }
    }

    /** Written again over the same folder, the item keeps its bytes (no clock time, fixed order). */
    @Test
    void writingAgainGivesTheSameBytes() throws Exception {
        byte[] before = Files.readAllBytes(out.resolve("item.json"));
        StacItem.writeAll(out);
        assertArrayEquals(before, Files.readAllBytes(out.resolve("item.json")));
    }
}
