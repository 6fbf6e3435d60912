package org.thermotile.jobs.hotspots;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
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
import org.thermotile.model.hotspot.FalseDiscovery;

/**
 * The hot-spot job end to end on a written run folder (5 m cells aggregated to 20 m analysis
 * cells, 4 × 4 cells each), one shared embedded Spark session. The planted square (60 m, +4 K) and
 * ring (+4 K, a hole of 4 × 4 analysis cells) are aligned to the analysis cells; the noise
 * (σ = 1 K per 5 m cell) is σ = 0.25 K per analysis cell, far below the 1 K minimum excess.
 */
class HotspotsJobTest {
    static SparkSession spark;

    @TempDir
    static Path dir;
    static Path run64, run256;
    static Hotspots.Result peak64, peak256, uniform, noise, scenario, scenarioPeak, scenarioOwn, moran, byPeak;
    static List<Row> change;
    static final double ACELL = 20, ACELL_AREA = ACELL * ACELL;
    static final int SQ_CELLS = 9, RING_CELLS = 36 - 16;

    @BeforeAll
    static void runOnce() throws IOException {
        spark = SparkSessions.get(null, 2);
        run64 = HotspotFixture.write(dir.resolve("run64"), "districts.geojson");
        Files.writeString(run64.resolve("districts.geojson"), "{}");     // read by the test's loader, not parsed
        rewriteDistrictsPath(run64);
        run256 = HotspotFixture.write(dir.resolve("run256"), "districts.geojson");
        Files.writeString(run256.resolve("districts.geojson"), "{}");
        rewriteDistrictsPath(run256);
        HotspotOptions peak = HotspotOptions.of("peak").withCellSize(ACELL).withDistance(20, Weights.BINARY)
                .withDistricts((f, g) -> HotspotFixture.twoDistricts(g));
        peak64 = Hotspots.run(spark, run64, peak.withTileSize(64));
        peak256 = Hotspots.run(spark, run256, peak.withTileSize(256));
        uniform = Hotspots.run(spark, run256, HotspotOptions.of("mean").withCellSize(ACELL).withDistance(20, Weights.BINARY));
        noise = Hotspots.run(spark, run256, HotspotOptions.of("night_min").withCellSize(ACELL)
                .withDistance(20, Weights.BINARY));
        scenario = Hotspots.run(spark, run256, HotspotOptions.of("delta_peak").withScenario("cool_roofs")
                .withCellSize(ACELL).withDistance(20, Weights.INVERSE_DISTANCE));
        HotspotOptions cool = peak.withScenario("cool_roofs");
        scenarioPeak = Hotspots.run(spark, run256, cool);
        change = spark.read().parquet(run256.resolve("scenarios/cool_roofs/hotspots/peak/programme_change").toString())
                .orderBy("district_id").collectAsList();              // before the next run replaces the folder
        scenarioOwn = Hotspots.run(spark, run256, cool.withReference(HotspotOptions.Reference.SCENARIO)
                .withReplace(true));
        moran = Hotspots.run(spark, run64, HotspotOptions.of("degree_hours").withCellSize(ACELL));
        copyTree(run64.resolve("hotspots/peak"), dir.resolve("peak64-copy"));   // before the BY run replaces it
        byPeak = Hotspots.run(spark, run64, peak.withFdrMethod(FalseDiscovery.BY).withReplace(true));
    }

    static void copyTree(Path from, Path to) throws IOException {
        try (var files = Files.walk(from)) {
            for (Path f : files.toList()) {
                Path t = to.resolve(from.relativize(f).toString());
                if (Files.isDirectory(f)) {
                    Files.createDirectories(t);
                } else {
                    Files.copy(f, t);
                }
            }
        }
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
        for (String f : List.of("excess_band.tif", "excess_k.tif", "qvalue.tif", "zscore.tif", "hotspots.geojson",
                "hotspots_wgs84.geojson", "polygons", "districts", "summary.json")) {
            assertTrue(Files.exists(out.resolve(f)), f);
        }
        assertFalse(Files.exists(out.resolve("class.tif")), "no confidence classes any more");
        assertFalse(Files.exists(run256.resolve("hotspots/.peak.partial")));
        assertTrue(Files.exists(run256.resolve("scenarios/cool_roofs/hotspots/delta_peak/excess_band.tif")));
        assertTrue(scenarioPeak.outputs().contains("programme_change/"), scenarioPeak.outputs().toString());
    }

    /** Tile size 64 (windows of 16 × 16 analysis cells) and 256 (one window) give byte-identical outputs. */
    @Test
    void tileSizes64And256GiveIdenticalMaps() throws IOException {
        for (String f : List.of("zscore.tif", "excess_band.tif", "excess_k.tif", "qvalue.tif", "hotspots.geojson",
                "hotspots_wgs84.geojson", "summary.json", "polygons/part-00000.snappy.parquet",
                "districts/part-00000.snappy.parquet")) {
            assertArrayEquals(Files.readAllBytes(run256.resolve("hotspots/peak/" + f)),
                    Files.readAllBytes(dir.resolve("peak64-copy/" + f)), f);
        }
        assertEquals(peak256.bandCells(), peak64.bandCells());
    }

    static int[] readBands(Path run, String rel) {
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(run.resolve(rel))) {
            return r.readIntWindow(0, 0, r.grid().width(), r.grid().height());
        }
    }

    /**
     * The planted square (3 × 3 analysis cells, +4 K) is one warmer area of exactly 3600 m², its cells
     * in the "warmer by >= 2 K" or ">= 4 K" band (+4 K sits on the 4 K edge; noise of a 20 m cell
     * σ = 0.25 K), with a mean excess of 4 K ± 0.3 K (σ of the 9-cell mean 0.08 K; the median moves
     * by far less).
     */
    @Test
    void plantedHotSquareIsFound() throws IOException {
        int[] bands = readBands(run256, "hotspots/peak/excess_band.tif");
        int aw = 38;                                              // ⌈150 / 4⌉
        for (int row = 12; row < 15; row++) {
            for (int col = 10; col < 13; col++) {
                int b = bands[row * aw + col];
                assertTrue(b == 20 || b == 40, "square cell col " + col + " row " + row + ": " + b);
            }
        }
        assertEquals(-128, bands[0], "no-data corner");
        Feature sq = squarePolygon(readFeatures(run256.resolve("hotspots/peak/hotspots.geojson")));
        assertEquals(SQ_CELLS, sq.props.path("cells").asInt());
        assertEquals(3600.0, sq.polygon.getArea(), 1e-6);
        assertEquals(3600.0, sq.props.path("area_m2").asDouble(), 1e-6);
        assertEquals("warmer", sq.props.path("kind").asText());
        assertTrue(sq.props.path("label").asText().startsWith("warmer by >= "), sq.props.toString());
        assertEquals(4.0, sq.props.path("mean_excess_k").asDouble(), 0.3);
        assertTrue(sq.props.path("max_q").asDouble() <= 0.05);
        assertEquals("W1", sq.props.path("district_id").asText(), "the square lies west of column 75");
        assertEquals("Westbank", sq.props.path("district_name").asText());
        assertEquals(2, peak256.hotPolygons(), "the square and the ring, nothing else");
        assertEquals(0, peak256.coldPolygons());
        assertEquals((SQ_CELLS + RING_CELLS) * ACELL_AREA, peak256.hotAreaM2(), 1e-6);
    }

    /**
     * Every polygon of both files is a valid JTS polygon with area = cells × 400 m²; the ring keeps
     * its hole; the order is by area × |mean excess|, largest first.
     */
    @Test
    void geoJsonReadsBackWithJacksonAndJts() throws IOException {
        List<Feature> grid = readFeatures(run256.resolve("hotspots/peak/hotspots.geojson"));
        List<Feature> wgs = readFeatures(run256.resolve("hotspots/peak/hotspots_wgs84.geojson"));
        assertEquals(peak256.hotPolygons() + peak256.coldPolygons(), grid.size());
        assertEquals(grid.size(), wgs.size());
        double previous = Double.POSITIVE_INFINITY;
        for (int i = 0; i < grid.size(); i++) {
            Feature f = grid.get(i);
            assertTrue(f.polygon.isValid(), "valid: " + f.props);
            assertEquals(f.props.path("cells").asInt() * ACELL_AREA, f.polygon.getArea(), 1e-6, f.props.toString());
            assertEquals(i + 1, f.props.path("id").asInt());
            // GeoJSON properties follow the tables' unit-suffix rule (TableColumns) too.
            f.props.fieldNames().forEachRemaining(k -> assertTrue(
                    org.thermotile.jobs.storage.TableColumns.followsRule(k), "property without its unit: " + k));
            double key = f.props.path("area_x_excess_k_m2").asDouble();
            assertEquals(f.polygon.getArea() * Math.abs(f.props.path("mean_excess_k").asDouble()), key, 1e-6 * key);
            assertTrue(key <= previous, "sorted by area × excess");
            previous = key;
        }
        Feature ring = grid.get(0);
        assertEquals(1, ring.polygon.getNumInteriorRing(), "the ring (the largest) keeps its hole: " + ring.props);
        assertEquals(1, ring.props.path("holes").asInt());
        assertEquals(RING_CELLS * ACELL_AREA, ring.polygon.getArea(), 1e-6);
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
            // UTM zone 32 (central meridian 9° E): eastings 500 000–500 760 m lie within 0.01° east of
            // 9°; northings near 5 020 000 m lie near 45.3° N (EPSG:32632 definition).
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
    void uniformFieldHasNoArea() {
        assertEquals(uniform.validCells(), uniform.bandCells().get(0));
        assertEquals(0.0, uniform.sd());
        assertEquals(0, uniform.hotPolygons() + uniform.coldPolygons());
        assertTrue(uniform.notes().stream().anyMatch(n -> n.contains("same value")), uniform.notes().toString());
    }

    /** Spatially independent noise: nothing is distinct. */
    @Test
    void pureNoiseHasNoArea() {
        assertEquals(noise.validCells(), noise.bandCells().get(0), noise.bandCells().toString());
        assertEquals(0, noise.hotPolygons() + noise.coldPolygons());
    }

    @Test
    void scenarioDeltaFindsTheRemovedSquareAsCooler() {
        // cool_roofs = noise without the square and ring, so delta = −4 there and 0 elsewhere.
        assertEquals("K", scenario.unit());
        assertEquals(2, scenario.coldPolygons());
        assertEquals(0, scenario.hotPolygons(), "the delta is 0 or −4: nothing warmer");
        assertEquals(SQ_CELLS + RING_CELLS, scenario.bandCells().get(-40));
        assertNull(scenario.hotAreaRemovedM2(), "a difference map has nothing to compare with");
    }

    /**
     * The scenario (the noise without the square and ring) against the run's median and S: the
     * planted hot areas are gone; the area removed is the run's hot area, per district the square
     * (west) and the ring (east), and nothing is added.
     */
    @Test
    void scenarioAgainstTheRunReportsTheHotAreaRemovedPerDistrict() {
        assertEquals("baseline", scenarioPeak.reference());
        assertEquals(peak256.referenceK(), scenarioPeak.referenceK(), "the run's median is the reference");
        assertEquals(0, scenarioPeak.hotPolygons(), scenarioPeak.bandCells().toString());
        assertEquals(peak256.hotAreaM2(), scenarioPeak.hotAreaRemovedM2(), 1e-9);
        assertEquals(2, change.size());
        assertEquals("E1", change.get(0).getAs("district_id"));
        assertEquals(RING_CELLS * ACELL_AREA, change.get(0).<Double>getAs("removed_m2"), 1e-9);
        assertEquals(SQ_CELLS * ACELL_AREA, change.get(1).<Double>getAs("removed_m2"), 1e-9);
        assertEquals(0.0, change.get(0).<Double>getAs("added_m2") + change.get(1).<Double>getAs("added_m2"), 0.0);
        // Against its own median the scenario is plain noise: its area is not compared.
        assertEquals("own", scenarioOwn.reference());
        assertNull(scenarioOwn.hotAreaRemovedM2());
        assertTrue(scenarioOwn.notes().stream().anyMatch(n -> n.contains("not comparable")), scenarioOwn.notes().toString());
    }

    /** Without a distance the band is the peak of Moran's I z-score, at least one analysis cell. */
    @Test
    void defaultDistanceIsMoransPeak() throws IOException {
        assertEquals("moran_peak", moran.distanceRule());
        assertTrue(moran.distanceM() >= ACELL);
        JsonNode s = new ObjectMapper().readTree(moran.outDir().resolve("summary.json").toFile());
        double best = Double.NEGATIVE_INFINITY, at = 0;
        for (JsonNode m : s.path("moran_scan")) {
            if (m.path("z").asDouble() > best) {
                best = m.path("z").asDouble();
                at = m.path("distance_m").asDouble();
            }
        }
        assertEquals(12, s.path("moran_scan").size());
        assertEquals(at, moran.distanceM(), 0.0);
        assertEquals(at, s.path("distance_m").asDouble(), 0.0);
    }

    /** BY (Benjamini & Yekutieli 2001) never marks more cells than BH on the same data. */
    @Test
    void byMarksNoMoreThanBh() {
        long bh = peak256.bandCells().entrySet().stream().filter(e -> e.getKey() != 0).mapToLong(e -> e.getValue()).sum();
        long by = byPeak.bandCells().entrySet().stream().filter(e -> e.getKey() != 0).mapToLong(e -> e.getValue()).sum();
        assertTrue(by <= bh, by + " > " + bh);
        assertEquals("by", byPeak.fdrMethod());
    }

    @Test
    void parquetTablesMatchTheGeoJsonAndTheBandMap() {
        Path out = run256.resolve("hotspots/peak");
        List<Row> polys = spark.read().parquet(out.resolve("polygons").toString()).orderBy("id").collectAsList();
        assertEquals(peak256.hotPolygons() + peak256.coldPolygons(), polys.size());
        double area = polys.stream().filter(r -> r.<String>getAs("kind").equals("warmer"))
                .mapToDouble(r -> r.<Double>getAs("area_m2")).sum();
        assertEquals(peak256.hotAreaM2(), area, 1e-6);
        // Westbank and Eastfield; no row for "outside", as the only cells outside are no data.
        List<Row> districts = spark.read().parquet(out.resolve("districts").toString())
                .orderBy("district_id").collectAsList();
        assertEquals(2, districts.size());
        assertEquals("E1", districts.get(0).getAs("district_id"));
        double hot = districts.stream().mapToDouble(r -> r.<Double>getAs("hot_area_m2")).sum();
        assertEquals(peak256.hotAreaM2(), hot, 1e-9);
        long cells = districts.stream().mapToLong(r -> r.<Long>getAs("cells")).sum();
        assertEquals(peak256.validCells(), cells);
        // Data area: 150 × 110 cells of 25 m² less the 54 no-data cells, less the 2 × 2 cells of the last
        // analysis cell (column 37, row 27: 25 % covered, below the default minimum coverage of 0.5).
        double data = districts.stream().mapToDouble(r -> r.<Double>getAs("area_m2")).sum();
        assertEquals((150 * 110 - 54 - 4) * 25.0, data, 1e-6);
        assertEquals(SQ_CELLS * ACELL_AREA, districts.get(1).<Double>getAs("hot_area_m2"), 1e-9);
        assertEquals(4.0, districts.get(1).<Double>getAs("hot_mean_excess_k"), 0.3);
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

    /** The polygon that covers the square's centre. */
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
        org.thermotile.jobs.testing.ExternalTool.require("apt-get install gdal-bin", tool);
        return true;
    }

    static String exec(Path workDir, String... cmd) throws IOException, InterruptedException {
        org.thermotile.jobs.testing.ExternalTool.Result r = org.thermotile.jobs.testing.ExternalTool.run(List.of(cmd),
                workDir, java.util.Map.of(), org.thermotile.jobs.testing.ExternalTool.TIMEOUT, null);
        assertEquals(0, r.exitCode(), String.join(" ", cmd) + "\n" + r.all());
        return r.all();
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
        assertEquals(c * ACELL_AREA, a, 1e-6 * a, sum);
    }

    /** gdalinfo sees the band map's type, no-data value, coding and grid, and the float maps' no-data. */
    @Test
    void gdalinfoReadsTheCoding() throws Exception {
        gdal("gdalinfo");
        Path copy = Files.createTempDirectory(dir, "gdal");
        Path out = run256.resolve("hotspots/peak");
        for (String f : List.of("excess_band.tif", "qvalue.tif", "excess_k.tif")) {
            Files.copy(out.resolve(f), copy.resolve(f));
        }
        String info = exec(copy, "gdalinfo", "excess_band.tif");
        assertTrue(info.contains("Type=Int16"), info);
        assertTrue(info.contains("NoData Value=-128"), info);
        assertTrue(info.contains("BAND_40=warmer by >= 4 K"), info);
        assertTrue(info.contains("BAND_-10=cooler by >= 1 K"), info);
        assertTrue(info.contains("BAND_0=not distinct"), info);
        assertTrue(info.contains("ANALYSIS_CELL_M=20"), info);
        assertTrue(info.contains("Pixel Size = (20.000000000000000,-20.000000000000000)"), info);
        assertTrue(info.contains("Size is 38, 28"), info);
        assertFalse(info.contains("confidence"), info);
        for (String f : List.of("qvalue.tif", "excess_k.tif")) {
            String z = exec(copy, "gdalinfo", f);
            assertTrue(z.contains("Type=Float32") && z.contains("NoData Value=-9999"), z);
            assertTrue(z.contains("FDR_METHOD=Benjamini-Hochberg 1995"), z);
        }
    }

    @Test
    void summaryJsonHasTheFigures() throws IOException {
        JsonNode s = new ObjectMapper().readTree(run256.resolve("hotspots/peak/summary.json").toFile());
        assertEquals("peak", s.path("statistic").asText());
        assertEquals(peak256.hotAreaM2(), s.path("hot_area_m2").asDouble(), 1e-9);
        assertEquals(38 * 28 - 3, s.path("global").path("valid_cells").asLong(),
                "two analysis cells are all no data, the corner cell (25 % covered) is left out");
        assertEquals(0.5, s.path("min_coverage").asDouble(), 0.0);
        assertTrue(s.path("notes").toString().contains("1 analysis cell(s) with data cover less than 0.5"), s.toString());
        assertEquals("own", s.path("reference").asText());
        assertEquals("given", s.path("distance_rule").asText());
        assertEquals(20.0, s.path("analysis_cell_m").asDouble(), 0.0);
        assertEquals("warmer by >= 2 K", s.path("coding").path("BAND_20").asText());
        assertEquals(peak256.hotAreaM2() / peak256.cityAreaM2(), s.path("hot_share").asDouble(), 1e-12);
        assertEquals(RING_CELLS * ACELL_AREA, s.path("largest_polygon_m2").asDouble(), 1e-9);
    }
}
