package org.thermotile.jobs.demo;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.concurrent.TimeUnit;
import org.apache.sis.geometry.DirectPosition2D;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.locationtech.jts.algorithm.Orientation;
import org.locationtech.jts.geom.Coordinate;
import org.locationtech.jts.geom.Envelope;
import org.locationtech.jts.geom.Geometry;
import org.locationtech.jts.geom.GeometryFactory;
import org.locationtech.jts.geom.LinearRing;
import org.locationtech.jts.geom.Polygon;
import org.locationtech.jts.operation.union.UnaryUnionOp;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.config.ClassTable;
import org.thermotile.jobs.config.ClassTableReader;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFile.MapKind;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.weather.WeatherCsv;
import org.thermotile.jobs.io.weather.WeatherRead;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.HourlyWeather;
import org.thermotile.model.materials.MaterialLibrary;

/**
 * The committed demo city (data-samples/riverside) against its generator and the readers that
 * will consume it. Expected figures come from the task's specification of the demo (grid, CRS,
 * period, material ids) and from independent tools (PROJ, GDAL), never from the generator.
 */
class DemoCityGeneratorTest {
    /** The committed demo folder, from the jobs module folder where Surefire runs (or the root). */
    static final Path DEMO = Files.isDirectory(Path.of("..", "data-samples", "riverside"))
            ? Path.of("..", "data-samples", "riverside") : Path.of("data-samples", "riverside");

    /** The material ids the demo may use (the task's list; all are library materials). */
    static final Set<String> DEMO_MATERIALS = Set.of("roof_membrane_dark", "roof_membrane_white",
            "bitumen_shingle", "clay_tile", "metal_roof_bare", "green_roof", "asphalt_fresh", "asphalt_aged",
            "concrete", "concrete_pavers", "gravel", "bare_soil_dry", "bare_soil_moist", "grass_irrigated",
            "grass_dry", "tree_canopy", "water");

    static final int W = 500, H = 350;
    static final double X0 = 500_800, Y0 = 4_999_600, CELL = 4;

    // ---------------------------------------------------------------- determinism

    @Test
    void generatorReproducesTheCommittedFilesByteForByte(@TempDir Path tmp) throws IOException {
        DemoCityGenerator.generate(tmp);
        for (String name : DemoCityGenerator.FILES) {
            byte[] committed = Files.readAllBytes(DEMO.resolve(name));
            byte[] fresh = Files.readAllBytes(tmp.resolve(name));
            int at = Arrays.mismatch(committed, fresh);
            assertEquals(-1, at, () -> name + " differs from a fresh run at byte " + at + " (committed "
                    + committed.length + " bytes, fresh " + fresh.length + "): run DemoCityGenerator and "
                    + "commit its output");
        }
        try (var files = Files.list(tmp)) {
            assertEquals(new TreeSet<>(DemoCityGenerator.FILES),
                    new TreeSet<>(files.map(p -> p.getFileName().toString()).toList()), "no temporary files left");
        }
    }

    @Test
    void committedFilesAreSmall() throws IOException {
        for (String name : DemoCityGenerator.FILES) {
            long size = Files.size(DEMO.resolve(name));
            assertTrue(size < 200_000, () -> name + " is " + size + " bytes; the demo inputs should stay small");
        }
    }

    // ---------------------------------------------------------------- rasters

    @Test
    void landCoverIsUint8OnTheDemoGridWithOnlyTableCodes() {
        ClassTable table = ClassTableReader.read(DEMO.resolve("classes.yaml"), Set.copyOf(MaterialLibrary.ids()));
        int[] codes;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(DEMO.resolve("landcover.tif"))) {
            assertDemoGrid(r.grid());
            assertEquals(GeoTiffReader.SampleType.UINT8, r.sampleType());
            assertEquals(0.0, r.noDataValue().orElseThrow());
            codes = r.readIntWindow(0, 0, W, H);
        }
        TreeMap<Integer, Long> counts = DemoCityGenerator.codeCounts(codes);
        assertFalse(counts.containsKey(0), "no no-data cells in the demo");
        Set<Integer> tableCodes = new TreeSet<>();
        table.classes().forEach(c -> tableCodes.add(c.code()));
        assertEquals(tableCodes, counts.keySet(), "every raster code is in classes.yaml and every class is used");
        assertTrue(table.checkCodes(counts).isEmpty(), "every code has its own material");
    }

    @Test
    void riverCrossesTheDistrictAndIsCrossedOnlyOnBridges() {
        int[] codes = readCodes();
        int water = DemoClass.WATER.code;
        for (int c = 0; c < W; c++) {
            boolean wet = false;
            for (int r = 0; r < H && !wet; r++) {
                wet = codes[r * W + c] == water;
            }
            if (!wet) {
                int r = (int) Math.floor(RiversideLayout.riverY(c + 0.5));
                int deck = codes[r * W + c];
                int col = c;
                assertTrue(deck == DemoClass.STREET.code || deck == DemoClass.AVENUE.code,
                        () -> "column " + col + " has no water and no bridge deck on the river line (code " + deck + ")");
            }
        }
        assertTrue(anyInColumn(codes, 0, water) && anyInColumn(codes, W - 1, water), "the river reaches both edges");
    }

    @Test
    void heightsMatchTheLandCoverAndTheSpecifiedRanges() {
        int[] codes = readCodes();
        float[] h;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(DEMO.resolve("heights.tif"))) {
            assertDemoGrid(r.grid());
            assertEquals(GeoTiffReader.SampleType.FLOAT32, r.sampleType());
            assertEquals(-9999.0, r.noDataValue().orElseThrow());
            h = r.readFloatWindow(0, 0, W, H);
        }
        Set<Integer> roofCodes = new HashSet<>();
        for (DemoClass c : DemoClass.values()) {
            if (c.isRoof()) {
                roofCodes.add(c.code);
            }
        }
        int roofs = 0;
        int trees = 0;
        for (int i = 0; i < h.length; i++) {
            int code = codes[i];
            float v = h[i];
            int row = i / W;
            int col = i % W;
            String at = "row " + row + ", column " + col + " (code " + code + ")";
            // Task specification: buildings 6–30 m, trees 8–15 m, 0 elsewhere.
            if (roofCodes.contains(code)) {
                assertTrue(v >= 6 && v <= 30, () -> at + ": roof height " + v + " m outside 6…30 m");
                roofs++;
            } else if (code == DemoClass.TREES.code) {
                assertTrue(v >= 8 && v <= 15, () -> at + ": tree height " + v + " m outside 8…15 m");
                trees++;
            } else {
                assertEquals(0f, v, () -> at + ": ground cell with height " + v + " m");
            }
        }
        assertTrue(roofs > 0 && trees > 0);
    }

    /**
     * GDAL reads both rasters with the same grid, CRS and no-data (an independent reader; GDAL
     * 3.6.2 here). Skipped where gdalinfo is not installed.
     */
    @Test
    void gdalSeesTheGridCrsAndNoData() throws Exception {
        org.thermotile.jobs.testing.ExternalTool.require("apt-get install gdal-bin", "gdalinfo");
        JsonNode lc = gdalinfo(DEMO.resolve("landcover.tif"));
        JsonNode ht = gdalinfo(DEMO.resolve("heights.tif"));
        for (JsonNode info : List.of(lc, ht)) {
            assertEquals(List.of(W, H), List.of(info.get("size").get(0).asInt(), info.get("size").get(1).asInt()));
            List<Double> gt = new ArrayList<>();
            info.get("geoTransform").forEach(n -> gt.add(n.asDouble()));
            assertEquals(List.of(X0, CELL, 0.0, Y0, 0.0, -CELL), gt, "GDAL geotransform");
            String wkt = info.get("coordinateSystem").get("wkt").asText();
            assertTrue(wkt.contains("WGS 84 / UTM zone 32N") && wkt.contains("ID[\"EPSG\",32632]"), wkt);
        }
        assertEquals("Byte", lc.get("bands").get(0).get("type").asText());
        assertEquals(0.0, lc.get("bands").get(0).get("noDataValue").asDouble());
        assertEquals("Float32", ht.get("bands").get(0).get("type").asText());
        assertEquals(-9999.0, ht.get("bands").get(0).get("noDataValue").asDouble());
    }

    // ---------------------------------------------------------------- class table and run file

    @Test
    void classTableParsesAgainstTheLibraryAndUsesOnlyDemoMaterials() {
        ClassTable t = ClassTableReader.read(DEMO.resolve("classes.yaml"), Set.copyOf(MaterialLibrary.ids()));
        assertEquals("riverside", t.name());
        assertTrue(DEMO_MATERIALS.stream().allMatch(id -> MaterialLibrary.find(id).isPresent()));
        Set<String> used = new TreeSet<>();
        for (ClassTable.ClassEntry c : t.classes()) {
            assertTrue(c.code() >= 1 && c.code() <= 255, "uint8 codes, 0 being no-data: " + c.code());
            assertTrue(DEMO_MATERIALS.contains(c.material()), c.material());
            assertTrue(c.label() != null && !c.label().isBlank());
            used.add(c.material());
        }
        assertEquals(new TreeSet<>(DEMO_MATERIALS), used, "every listed material appears in the demo");
        assertEquals(Map.of("albedo", 0.65), t.overridesFor(22), "the weathered white roof");
        assertEquals("roof_membrane_white", t.materialFor(22));
    }

    @Test
    void runFileParsesAndNamesTheCommittedInputs() {
        RunFile rf = RunFileReader.read(DEMO.resolve("run.yaml"));
        Path dir = DEMO.toAbsolutePath().normalize();
        assertEquals(dir.resolve("landcover.tif").toString(), rf.inputs().landCover());
        assertEquals(dir.resolve("classes.yaml").toString(), rf.inputs().classes());
        assertFalse(rf.inputs().classesIsBuiltIn());
        assertEquals(dir.resolve("heights.tif").toString(), rf.inputs().heights());
        assertEquals(dir.resolve("districts.geojson").toString(), rf.inputs().districts());
        assertEquals(dir.resolve("weather.csv").toString(), rf.weather().file());
        for (String p : List.of(rf.inputs().landCover(), rf.inputs().classes(), rf.inputs().heights(),
                rf.inputs().districts(), rf.weather().file())) {
            assertTrue(Files.isRegularFile(Path.of(p)), p + " exists");
        }
        assertEquals(LocalDateTime.of(2026, 7, 14, 0, 0), rf.period().start());
        assertEquals(LocalDateTime.of(2026, 7, 19, 0, 0), rf.period().end(), "end date inclusive");
        assertEquals(2, rf.period().spinUpDays());
        assertEquals(List.of(MapKind.PEAK, MapKind.MEAN, MapKind.NIGHT_MIN, MapKind.PEAK_HOUR,
                MapKind.DEGREE_HOURS), rf.outputs().maps());
        assertEquals(45.0, rf.outputs().thresholdC());
        assertEquals(List.of(LocalDate.of(2026, 7, 16)), rf.outputs().hourlyDays());
        assertEquals(DemoCityGenerator.SITE.latitudeDeg(), rf.site().latitudeDeg(), "run.yaml and the generator");
        assertEquals(DemoCityGenerator.SITE.longitudeDeg(), rf.site().longitudeDeg());
        assertEquals(DemoCityGenerator.SITE.elevationM(), rf.site().elevationM());
    }

    /**
     * The site is the grid centre, E 501 800 m N 4 998 900 m in UTM zone 32N. PROJ 9.1.1
     * ({@code echo "501800 4998900" | cs2cs -f "%.7f" EPSG:32632 EPSG:4326}) gives
     * 45.1435730 N 9.0228955 E; the site is that rounded to 1e-4°, so within 0.5e-4°. Apache SIS
     * (the library the run uses to place the grid) must agree with PROJ to 1e-7°.
     */
    @Test
    void siteIsTheGridCentreByProjAndSis() throws Exception {
        double projLat = 45.1435730;
        double projLon = 9.0228955;
        RunFile rf = RunFileReader.read(DEMO.resolve("run.yaml"));
        assertEquals(projLat, rf.site().latitudeDeg(), 0.5e-4);
        assertEquals(projLon, rf.site().longitudeDeg(), 0.5e-4);

        RasterGrid g = DemoCityGenerator.grid();
        MathTransform mt = CRS.findOperation(CRS.fromWKT(g.crsWkt()), CommonCRS.WGS84.normalizedGeographic(), null)
                .getMathTransform();
        DirectPosition2D q = new DirectPosition2D();
        mt.transform(new DirectPosition2D(g.originX() + g.pixelWidth() * g.width() / 2,
                g.originY() + g.pixelHeight() * g.height() / 2), q);
        assertEquals(projLon, q.getX(), 1e-7, "SIS longitude");
        assertEquals(projLat, q.getY(), 1e-7, "SIS latitude");
    }

    // ---------------------------------------------------------------- weather

    @Test
    void weatherCoversThePeriodWithSpinUpAndSaysItIsInvented() throws IOException {
        Path file = DEMO.resolve("weather.csv");
        assertTrue(Files.readAllLines(file, StandardCharsets.UTF_8).get(0).contains("INVENTED DEMO DATA"));
        WeatherRead read = WeatherCsv.read(file);
        HourlyWeather w = read.weather();
        assertEquals(0, read.filledHours());
        ZoneOffset cest = ZoneOffset.ofHours(2);
        assertEquals(7200, w.utcOffsetSeconds);
        assertEquals(217, w.hours(), "2026-07-11T00:00 … 2026-07-20T00:00, both included");
        assertEquals(OffsetDateTime.of(2026, 7, 11, 0, 0, 0, 0, cest).toEpochSecond(), w.epochSecond[0]);
        assertEquals(OffsetDateTime.of(2026, 7, 20, 0, 0, 0, 0, cest).toEpochSecond(), w.epochSecond[216]);

        RunFile rf = RunFileReader.read(DEMO.resolve("run.yaml"));
        Instant simStart = rf.period().simulationStart().toInstant(cest);
        Instant end = rf.period().end().toInstant(cest);
        read.requireCovers(simStart, end);
        // The run uses 2026-07-12 … 2026-07-19 (spin-up included) of the invented week.
        assertEquals(7 * 24 + 1, read.slice(simStart, end).hours(), "the run's span, both ends included");
    }

    @Test
    void dailyMaximaRiseFrom31To36AndOneAfternoonIsCloudier() throws IOException {
        HourlyWeather w = WeatherCsv.read(DEMO.resolve("weather.csv")).weather();
        ZoneOffset cest = ZoneOffset.ofHours(2);
        TreeMap<LocalDate, Double> maxC = new TreeMap<>();
        TreeMap<LocalDate, Double> ghiSum = new TreeMap<>();
        for (int h = 0; h < w.hours(); h++) {
            LocalDate day = LocalDateTime.ofEpochSecond(w.epochSecond[h], 0, cest).toLocalDate();
            if (day.isAfter(LocalDate.of(2026, 7, 19))) {
                continue;
            }
            maxC.merge(day, w.airTempK[h] - Physical.ZERO_CELSIUS_K, Math::max);
            ghiSum.merge(day, w.ghiWm2[h], Double::sum);
            assertTrue(w.dhiWm2[h] <= w.ghiWm2[h] + 0.1, "diffuse is part of global light, hour " + h);
        }
        assertEquals(9, maxC.size());
        // Task specification: daily maximum rising 31 → 36 °C (hourly samples miss the peak by < 0.5 K).
        assertEquals(31.0, maxC.firstEntry().getValue(), 0.5);
        assertEquals(36.0, maxC.lastEntry().getValue(), 0.5);
        List<Double> m = new ArrayList<>(maxC.values());
        for (int i = 1; i < m.size(); i++) {
            assertTrue(m.get(i) > m.get(i - 1), "daily maximum rises day by day: " + maxC);
        }
        // One cloudier day: at least 15 % less sunshine than each neighbour (a demo choice).
        LocalDate cloudy = ghiSum.entrySet().stream().min(Map.Entry.comparingByValue()).orElseThrow().getKey();
        assertTrue(ghiSum.get(cloudy) < 0.85 * ghiSum.get(cloudy.minusDays(1))
                && ghiSum.get(cloudy) < 0.85 * ghiSum.get(cloudy.plusDays(1)), ghiSum.toString());
    }

    // ---------------------------------------------------------------- districts

    /**
     * The districts are valid JTS polygons whose exterior rings run counter-clockwise (RFC 7946,
     * section 3.1.6, right-hand rule), which do not overlap and which together are exactly the
     * grid's extent (2000 m × 1400 m from the task's grid).
     */
    @Test
    void districtsAreValidPolygonsThatTileTheGrid() throws IOException {
        JsonNode root = new ObjectMapper().readTree(DEMO.resolve("districts.geojson").toFile());
        assertEquals("FeatureCollection", root.get("type").asText());
        assertEquals("urn:ogc:def:crs:EPSG::32632", root.get("crs").get("properties").get("name").asText());
        GeometryFactory gf = new GeometryFactory();
        List<Polygon> polygons = new ArrayList<>();
        Set<String> ids = new HashSet<>();
        Set<String> names = new HashSet<>();
        for (JsonNode f : root.get("features")) {
            String id = f.get("properties").get("id").asText();
            String name = f.get("properties").get("name").asText();
            assertTrue(!id.isBlank() && ids.add(id), "unique id " + id);
            assertTrue(!name.isBlank() && names.add(name), "unique name " + name);
            JsonNode geom = f.get("geometry");
            assertEquals("Polygon", geom.get("type").asText());
            assertEquals(1, geom.get("coordinates").size(), id + ": one ring, no holes");
            JsonNode ringNode = geom.get("coordinates").get(0);
            Coordinate[] ring = new Coordinate[ringNode.size()];
            for (int k = 0; k < ring.length; k++) {
                ring[k] = new Coordinate(ringNode.get(k).get(0).asDouble(), ringNode.get(k).get(1).asDouble());
            }
            LinearRing shell = gf.createLinearRing(ring);
            assertTrue(Orientation.isCCW(shell.getCoordinates()), id + ": exterior ring counter-clockwise");
            Polygon p = gf.createPolygon(shell);
            assertTrue(p.isValid(), id + " is a valid polygon");
            polygons.add(p);
        }
        assertTrue(polygons.size() >= 4 && polygons.size() <= 5, "4–5 districts");
        Polygon extent = (Polygon) gf.toGeometry(new Envelope(X0, X0 + W * CELL, Y0 - H * CELL, Y0));
        double area = 0;
        for (int i = 0; i < polygons.size(); i++) {
            area += polygons.get(i).getArea();
            for (int j = i + 1; j < polygons.size(); j++) {
                assertEquals(0.0, polygons.get(i).intersection(polygons.get(j)).getArea(), 1e-6,
                        "districts " + i + " and " + j + " overlap");
            }
        }
        assertEquals(2000.0 * 1400.0, extent.getArea(), 1e-6);
        assertEquals(extent.getArea(), area, 1e-3, "the districts' areas add up to the grid's");
        Geometry union = UnaryUnionOp.union(new ArrayList<Geometry>(polygons));
        assertEquals(0.0, union.symDifference(extent).getArea(), 1e-3, "the districts cover the grid exactly");
    }

    // ---------------------------------------------------------------- helpers

    static void assertDemoGrid(RasterGrid g) {
        // Task specification: 500 × 350 cells of 4 m, north-up, EPSG:32632, origin on whole metres.
        assertEquals(W, g.width());
        assertEquals(H, g.height());
        assertEquals(X0, g.originX());
        assertEquals(Y0, g.originY());
        assertEquals(CELL, g.pixelWidth());
        assertEquals(-CELL, g.pixelHeight());
        assertEquals(32632, g.epsg());
    }

    static int[] readCodes() {
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(DEMO.resolve("landcover.tif"))) {
            return r.readIntWindow(0, 0, W, H);
        }
    }

    static boolean anyInColumn(int[] codes, int col, int code) {
        for (int r = 0; r < H; r++) {
            if (codes[r * W + col] == code) {
                return true;
            }
        }
        return false;
    }

    /** {@code gdalinfo -json} of a file, or null when gdalinfo cannot be run. */
    static JsonNode gdalinfo(Path file) throws Exception {
        if (org.thermotile.jobs.testing.ExternalTool.locate("gdalinfo").isEmpty()) {
            return null;
        }
        org.thermotile.jobs.testing.ExternalTool.Result r = org.thermotile.jobs.testing.ExternalTool.run(
                List.of("gdalinfo", "-json", file.toAbsolutePath().toString()));
        assertEquals(0, r.exitCode(), () -> "gdalinfo failed on " + file + ": " + r.stderr());
        return new ObjectMapper().readTree(r.stdout());
    }
}
