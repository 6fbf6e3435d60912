package org.thermotile.jobs.hotspots;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.locationtech.jts.algorithm.Orientation;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LinearRing;
import org.locationtech.jts.geom.Polygon;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.model.hotspot.DistanceBand.Weights;

/** The hotspot job end to end on a written run folder, one shared embedded Spark session. */
class HotspotsJobTest {
    static SparkSession spark;
    @TempDir
    static Path dir;
    static Path run64, run256;
    static Hotspots.Result peak64, peak256, uniform, noise, scenario, scenarioPeak, scenarioOwn;
    static final double CELL_AREA = HotspotFixture.CELL * HotspotFixture.CELL;

    @BeforeAll
    static void runOnce() throws IOException {
        spark = SparkSessions.get(null, 2);
        run64 = HotspotFixture.write(dir.resolve("run64"), "districts.geojson");
        Files.writeString(run64.resolve("districts.geojson"), "{}");     // read by the test's loader, not parsed
        rewriteDistrictsPath(run64);
        run256 = HotspotFixture.write(dir.resolve("run256"), "districts.geojson");
        Files.writeString(run256.resolve("districts.geojson"), "{}");
        rewriteDistrictsPath(run256);
        HotspotOptions peak = HotspotOptions.of("peak").withDistance(15, Weights.BINARY)
                .withDistricts((f, g) -> HotspotFixture.twoDistricts());
        peak64 = Hotspots.run(spark, run64, peak.withTileSize(64));
        peak256 = Hotspots.run(spark, run256, peak.withTileSize(256));
        uniform = Hotspots.run(spark, run256, HotspotOptions.of("mean").withDistance(15, Weights.BINARY));
        noise = Hotspots.run(spark, run256, HotspotOptions.of("night_min").withDistance(15, Weights.BINARY));
        scenario = Hotspots.run(spark, run256, HotspotOptions.of("delta_peak").withScenario("cool_roofs")
                .withDistance(15, Weights.INVERSE_DISTANCE));
        HotspotOptions cool = HotspotOptions.of("peak").withScenario("cool_roofs").withDistance(15, Weights.BINARY);
        scenarioPeak = Hotspots.run(spark, run256, cool);
        scenarioOwn = Hotspots.run(spark, run256, cool.withReference(HotspotOptions.Reference.SCENARIO)
                .withReplace(true));
    }

    /** The manifest's districts path made absolute (the run command writes absolute paths). */
    static void rewriteDistrictsPath(Path run) throws IOException {
        HotspotFixture.manifest(run, run.resolve("districts.geojson").toString(), List.of("maps/peak.tif",
                "maps/mean.tif", "maps/night_min.tif", "maps/peak_hour.tif", "maps/degree_hours.tif", "tables/cells"));
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    @Test
    void writesEveryOutputAndNoTemporaryFolder() {
        Path out = run256.resolve("hotspots/peak");
        assertEquals(out, peak256.outDir());
        for (String f : List.of("zscore.tif", "class.tif", "hotspots.geojson", "hotspots_wgs84.geojson", "polygons",
                "districts", "summary.json")) {
            assertTrue(Files.exists(out.resolve(f)), f);
        }
        assertFalse(Files.exists(run256.resolve("hotspots/.peak.partial")));
        assertTrue(Files.exists(run256.resolve("scenarios/cool_roofs/hotspots/delta_peak/class.tif")));
        assertTrue(Files.exists(run256.resolve("scenarios/cool_roofs/hotspots/peak/class.tif")));
    }

    /** Tile size 64 (3 × 2 tiles with halos) and 256 (one tile) give byte-identical outputs. */
    @Test
    void tileSizes64And256GiveIdenticalMaps() throws IOException {
        for (String f : List.of("zscore.tif", "class.tif", "hotspots.geojson", "hotspots_wgs84.geojson",
                "summary.json", "polygons/part-00000.snappy.parquet", "districts/part-00000.snappy.parquet")) {
            assertArrayEquals(Files.readAllBytes(run256.resolve("hotspots/peak/" + f)),
                    Files.readAllBytes(run64.resolve("hotspots/peak/" + f)), f);
        }
        float[] a = readZ(run64), b = readZ(run256);
        assertArrayEquals(a, b);
        assertEquals(peak256.classCells(), peak64.classCells());
    }

    static float[] readZ(Path run) {
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(run.resolve("hotspots/peak/zscore.tif"))) {
            return r.readFloatWindow(0, 0, HotspotFixture.W, HotspotFixture.H);
        }
    }

    /** The planted square is a class-3 hot spot whose polygon's area is its cell count × 25 m². */
    @Test
    void plantedHotSquareIsFound() throws IOException {
        int[] classes;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(run256.resolve("hotspots/peak/class.tif"))) {
            classes = r.readIntWindow(0, 0, HotspotFixture.W, HotspotFixture.H);
        }
        for (int row = HotspotFixture.SQ_R0; row < HotspotFixture.SQ_R0 + HotspotFixture.SQ; row++) {
            for (int col = HotspotFixture.SQ_C0; col < HotspotFixture.SQ_C0 + HotspotFixture.SQ; col++) {
                assertEquals(3, classes[row * HotspotFixture.W + col], "square cell col " + col + " row " + row);
            }
        }
        assertEquals(-128, classes[0], "no-data corner");
        Feature sq = squarePolygon(readFeatures(run256.resolve("hotspots/peak/hotspots.geojson")));
        int cells = sq.props.path("cells").asInt();
        assertTrue(cells >= HotspotFixture.SQ * HotspotFixture.SQ, "holds the square: " + cells);
        assertEquals(cells * CELL_AREA, sq.polygon.getArea(), 1e-9 * cells * CELL_AREA);
        assertEquals(sq.polygon.getArea(), sq.props.path("area_m2").asDouble(), 1e-6);
        assertEquals(3, sq.props.path("class").asInt());
        assertTrue(sq.props.path("mean_value").asDouble() > 42, "mean peak inside: " + sq.props.path("mean_value"));
        assertEquals("W1", sq.props.path("district_id").asText(), "the square lies west of column 75");
        assertEquals("Westbank", sq.props.path("district_name").asText());
    }

    /** Every polygon of both files is a valid JTS polygon with area = cells × cell area. */
    @Test
    void geoJsonReadsBackWithJacksonAndJts() throws IOException {
        List<Feature> grid = readFeatures(run256.resolve("hotspots/peak/hotspots.geojson"));
        List<Feature> wgs = readFeatures(run256.resolve("hotspots/peak/hotspots_wgs84.geojson"));
        assertEquals(peak256.hotPolygons() + peak256.coldPolygons(), grid.size());
        assertEquals(grid.size(), wgs.size());
        boolean holes = false;
        for (Feature f : grid) {
            assertTrue(f.polygon.isValid(), "valid: " + f.props);
            assertEquals(f.props.path("cells").asInt() * CELL_AREA, f.polygon.getArea(), 1e-6, f.props.toString());
            holes |= f.polygon.getNumInteriorRing() > 0;
        }
        assertTrue(holes, "the planted ring is a polygon with a hole");
        JsonNode root = new ObjectMapper().readTree(run256.resolve("hotspots/peak/hotspots.geojson").toFile());
        assertEquals("urn:ogc:def:crs:EPSG::32632", root.path("crs").path("properties").path("name").asText());
        JsonNode wroot = new ObjectMapper().readTree(run256.resolve("hotspots/peak/hotspots_wgs84.geojson").toFile());
        assertTrue(wroot.path("crs").isMissingNode(), "RFC 7946 has no crs member");
        for (Feature f : wgs) {
            assertTrue(f.polygon.isValid());
            assertTrue(Orientation.isCCW(f.polygon.getExteriorRing().getCoordinates()), "RFC 7946 §3.1.6 exterior CCW");
            for (int h = 0; h < f.polygon.getNumInteriorRing(); h++) {
                assertFalse(Orientation.isCCW(f.polygon.getInteriorRingN(h).getCoordinates()), "holes clockwise");
            }
            // UTM zone 32 (central meridian 9° E): eastings 500 000–500 750 m lie within 0.01° east of
            // 9°; northings 5 019 450–5 020 000 m lie near 45.3° N (EPSG:32632 definition).
            for (Coordinate c : f.polygon.getCoordinates()) {
                assertTrue(c.x >= 9.0 && c.x < 9.01, "longitude " + c.x);
                assertTrue(c.y > 45.2 && c.y < 45.4, "latitude " + c.y);
            }
        }
    }

    /** Transverse Mercator maps the central meridian (easting 500 000 m) to longitude 9° exactly. */
    @Test
    void westEdgeOfTheGridIsTheCentralMeridian() throws Exception {
        var mt = GeoJsonWriter.toWgs84(HotspotFixture.grid());
        double[] p = {500_000, 5_020_000};
        mt.transform(p, 0, p, 0, 1);
        assertEquals(9.0, p[0], 1e-9);
    }

    @Test
    void uniformFieldHasNoSignificantCells() {
        long significant = uniform.classCells().entrySet().stream().filter(e -> e.getKey() != 0)
                .mapToLong(Map.Entry::getValue).sum();
        assertEquals(0, significant);
        assertEquals(uniform.validCells(), uniform.classCells().get(0));
        assertEquals(0.0, uniform.sd());
        assertEquals(0, uniform.hotPolygons() + uniform.coldPolygons());
        assertTrue(uniform.notes().stream().anyMatch(n -> n.contains("same value")), uniform.notes().toString());
    }

    /** Spatially independent noise: Benjamini–Hochberg leaves no cell significant. */
    @Test
    void pureNoiseHasNoSignificantCells() {
        assertEquals(noise.validCells(), noise.classCells().get(0), noise.classCells().toString());
    }

    @Test
    void scenarioDeltaFindsTheRemovedSquareAsColdSpot() {
        // cool_roofs = noise without the square, so delta = −4 on the square and 0 elsewhere.
        assertEquals("K", scenario.unit());
        assertTrue(scenario.coldPolygons() >= 1);
        assertEquals(0, scenario.hotPolygons(), "the delta is 0 or −4: nothing hot");
        assertTrue(scenario.classCells().get(-3) >= HotspotFixture.SQ * HotspotFixture.SQ);
    }

    /**
     * The scenario (the noise without the square and ring) against the run's mean and S: the
     * planted hot spots are gone, and the area removed is the run's hot area minus the scenario's.
     */
    @Test
    void scenarioAgainstTheRunReportsTheHotAreaRemoved() {
        assertEquals("baseline", scenarioPeak.reference());
        assertEquals(peak256.mean(), scenarioPeak.mean(), "the run's mean is the reference");
        assertEquals(0L, scenarioPeak.classCells().get(3), "no 99 % hot cell is left: " + scenarioPeak.classCells());
        assertNotNull(scenarioPeak.hotAreaRemovedM2());
        assertEquals(peak256.hotAreaM2() - scenarioPeak.hotAreaM2(), scenarioPeak.hotAreaRemovedM2(), 1e-9);
        assertTrue(scenarioPeak.hotAreaRemovedM2() > 2 * HotspotFixture.SQ * HotspotFixture.SQ * CELL_AREA,
                "square and ring removed: " + scenarioPeak.hotAreaRemovedM2());
        // Against its own mean the scenario is plain noise: its area is not compared.
        assertEquals("own", scenarioOwn.reference());
        assertNull(scenarioOwn.hotAreaRemovedM2());
        assertTrue(scenarioOwn.notes().stream().anyMatch(n -> n.contains("not comparable")), scenarioOwn.notes().toString());
    }

    @Test
    void parquetTablesMatchTheGeoJsonAndTheClassMap() {
        Path out = run64.resolve("hotspots/peak");
        List<Row> polys = spark.read().parquet(out.resolve("polygons").toString()).orderBy("id").collectAsList();
        assertEquals(peak64.hotPolygons() + peak64.coldPolygons(), polys.size());
        double area = polys.stream().filter(r -> r.<Integer>getAs("class") > 0)
                .mapToDouble(r -> r.<Double>getAs("area_m2")).sum();
        assertEquals(peak64.hotAreaM2(), area, 1e-6);
        // Westbank and Eastfield; no row for "outside", as the only cells outside are no data.
        List<Row> districts = spark.read().parquet(out.resolve("districts").toString())
                .orderBy("district_id").collectAsList();
        assertEquals(2, districts.size());
        assertEquals("E1", districts.get(0).getAs("district_id"));
        long hot = districts.stream().mapToLong(r -> r.<Long>getAs("hot_cells")).sum();
        long hotCells = peak64.classCells().entrySet().stream().filter(e -> e.getKey() > 0)
                .mapToLong(Map.Entry::getValue).sum();
        assertEquals(hotCells, hot);
        long cells = districts.stream().mapToLong(r -> r.<Long>getAs("cells")).sum();
        assertEquals(peak64.validCells(), cells);
        Row west = districts.get(1);
        assertEquals(75L * HotspotFixture.H - 54, west.<Long>getAs("cells"), "75 columns less the no-data corner");
        assertEquals(west.<Long>getAs("hot_cells") * CELL_AREA, west.<Double>getAs("hot_area_m2"), 1e-9);
        assertTrue(west.<Long>getAs("hot_99_cells") >= HotspotFixture.SQ * HotspotFixture.SQ);
    }

    static final class Feature {
        final Polygon polygon;
        final JsonNode props;

        Feature(Polygon polygon, JsonNode props) {
            this.polygon = polygon;
            this.props = props;
        }
    }

    /** Parses a GeoJSON FeatureCollection of Polygons with Jackson into JTS polygons. */
    static List<Feature> readFeatures(Path file) throws IOException {
        JsonNode root = new ObjectMapper().readTree(file.toFile());
        assertEquals("FeatureCollection", root.path("type").asText());
        GeometryFactory gf = new GeometryFactory();
        List<Feature> out = new ArrayList<>();
        for (JsonNode f : root.path("features")) {
            assertEquals("Feature", f.path("type").asText());
            assertEquals("Polygon", f.path("geometry").path("type").asText());
            JsonNode rings = f.path("geometry").path("coordinates");
            LinearRing shell = ring(gf, rings.get(0));
            LinearRing[] holes = new LinearRing[rings.size() - 1];
            for (int h = 1; h < rings.size(); h++) {
                holes[h - 1] = ring(gf, rings.get(h));
            }
            out.add(new Feature(gf.createPolygon(shell, holes), f.path("properties")));
        }
        return out;
    }

    static LinearRing ring(GeometryFactory gf, JsonNode pts) {
        Coordinate[] c = new Coordinate[pts.size()];
        for (int i = 0; i < c.length; i++) {
            c[i] = new Coordinate(pts.get(i).get(0).asDouble(), pts.get(i).get(1).asDouble());
        }
        return gf.createLinearRing(c);
    }

    /** The class-3 polygon that covers the square's centre. */
    static Feature squarePolygon(List<Feature> features) {
        double x = HotspotFixture.X0 + (HotspotFixture.SQ_C0 + HotspotFixture.SQ / 2.0) * HotspotFixture.CELL;
        double y = HotspotFixture.Y0 - (HotspotFixture.SQ_R0 + HotspotFixture.SQ / 2.0) * HotspotFixture.CELL;
        var centre = new GeometryFactory().createPoint(new Coordinate(x, y));
        for (Feature f : features) {
            if (f.polygon.contains(centre)) {
                return f;
            }
        }
        fail("no polygon covers the square's centre");
        return null;
    }

    // ---- GDAL (Debian gdal-bin): runs in CI, skipped elsewhere when missing ----

    static boolean gdal(String tool) {
        boolean present;
        try {
            Process p = new ProcessBuilder(tool, "--version").redirectErrorStream(true).start();
            present = p.waitFor(20, TimeUnit.SECONDS) && p.exitValue() == 0;
        } catch (IOException | InterruptedException e) {
            present = false;
        }
        if (!present && System.getenv("CI") != null) {
            fail(tool + " not found but CI is set: the CI script must install Debian gdal-bin");
        }
        assumeTrue(present, tool + " not installed (apt-get install gdal-bin); GDAL checks skipped");
        return true;
    }

    static String exec(Path workDir, String... cmd) throws IOException, InterruptedException {
        Process p = new ProcessBuilder(cmd).directory(workDir.toFile()).redirectErrorStream(true).start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(60, TimeUnit.SECONDS), "timed out: " + String.join(" ", cmd));
        assertEquals(0, p.exitValue(), String.join(" ", cmd) + "\n" + out);
        return out;
    }

    /** ogrinfo reads both GeoJSON files: feature count, CRS, and GDAL's own polygon areas. */
    @Test
    void ogrinfoReadsBothGeoJsonFiles() throws Exception {
        gdal("ogrinfo");
        Path copy = Files.createTempDirectory(dir, "ogr");
        Path out = run256.resolve("hotspots/peak");
        Files.copy(out.resolve("hotspots.geojson"), copy.resolve("hotspots.geojson"));
        Files.copy(out.resolve("hotspots_wgs84.geojson"), copy.resolve("hotspots_wgs84.geojson"));
        int n = peak256.hotPolygons() + peak256.coldPolygons();
        String utm = exec(copy, "ogrinfo", "-ro", "-al", "-so", "hotspots.geojson");
        assertTrue(utm.contains("Feature Count: " + n), utm);
        assertTrue(utm.contains("ID[\"EPSG\",32632]") || utm.contains("32632"), utm);
        assertTrue(utm.contains("Geometry: Polygon"), utm);
        String wgs = exec(copy, "ogrinfo", "-ro", "-al", "-so", "hotspots_wgs84.geojson");
        assertTrue(wgs.contains("Feature Count: " + n), wgs);
        assertTrue(wgs.contains("WGS 84"), wgs);
        // OGR SQL's OGR_GEOM_AREA is GDAL's own planar area of each geometry.
        String sum = exec(copy, "ogrinfo", "-ro", "-q", "-sql",
                "SELECT SUM(OGR_GEOM_AREA) AS a, SUM(cells) AS c FROM hotspots", "hotspots.geojson");
        double a = Double.parseDouble(sum.replaceAll("(?s).*a \\(Real\\) = ([0-9.eE+-]+).*", "$1"));
        double c = Double.parseDouble(sum.replaceAll("(?s).*c \\([A-Za-z0-9]+\\) = ([0-9.eE+-]+).*", "$1"));
        assertEquals(c * CELL_AREA, a, 1e-6 * a, sum);
    }

    /** gdalinfo sees the class map's type, no-data value and code table, and the z-score map's no-data. */
    @Test
    void gdalinfoReadsTheCodeTable() throws Exception {
        gdal("gdalinfo");
        Path copy = Files.createTempDirectory(dir, "gdal");
        Path out = run256.resolve("hotspots/peak");
        Files.copy(out.resolve("class.tif"), copy.resolve("class.tif"));
        Files.copy(out.resolve("zscore.tif"), copy.resolve("zscore.tif"));
        String info = exec(copy, "gdalinfo", "class.tif");
        assertTrue(info.contains("Type=Int16"), info);
        assertTrue(info.contains("NoData Value=-128"), info);
        assertTrue(info.contains("CLASS_3=hot spot, 99 % confidence"), info);
        assertTrue(info.contains("CLASS_-3=cold spot, 99 % confidence"), info);
        assertTrue(info.contains("STATISTIC=peak"), info);
        assertTrue(info.contains("32632"), info);
        String z = exec(copy, "gdalinfo", "zscore.tif");
        assertTrue(z.contains("Type=Float32"), z);
        assertTrue(z.contains("NoData Value=-9999"), z);
        assertTrue(z.contains("WEIGHTS=binary"), z);
    }

    @Test
    void summaryJsonHasTheFigures() throws IOException {
        JsonNode s = new ObjectMapper().readTree(run256.resolve("hotspots/peak/summary.json").toFile());
        assertEquals("peak", s.path("statistic").asText());
        assertEquals(peak256.hotAreaM2(), s.path("hot_area_m2").asDouble(), 1e-9);
        assertEquals(HotspotFixture.W * HotspotFixture.H - 54, s.path("global").path("valid_cells").asLong());
        assertEquals("own", s.path("reference").asText());
        assertNull(scenario.hotAreaRemovedM2(), "a difference map has nothing to compare with");
        assertNotNull(s.path("p_thresholds").path("class_3"));
    }
}
