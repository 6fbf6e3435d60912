package org.thermotile.jobs.hotspots;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.errors.UserInputException;

/**
 * The zone analysis end to end on {@link ZoneFixture}: 99 zones over a 4 m city with a planted
 * 120 m hot area (+3 K) of 3 × 3 blocks, default band (Moran's I peak), BH at q = 0.05, one shared
 * embedded Spark session.
 */
class ZoneHotspotsTest {
    static SparkSession spark;

    @TempDir
    static Path dir;
    static Path run, out;
    static ZoneHotspots.Result peak;
    static List<Row> table;
    static JsonNode summary;

    static final Set<String> PLANTED = Set.of("H-wide", "B-5-3", "B-3-4", "B-4-4", "B-5-4", "B-3-5", "B-4-5", "B-5-5");

    @BeforeAll
    static void runOnce() throws IOException {
        spark = SparkSessions.get(null, 2);
        run = ZoneFixture.write(dir);
        peak = ZoneHotspots.run(spark, run, HotspotOptions.of("peak").withTileSize(64),
                new ZoneHotspots.ZoneOptions(dir.resolve("blocks.geojson"), "block_ref"));
        out = run.resolve("zones/blocks/peak");
        table = spark.read().parquet(out.resolve("zones").toString()).orderBy("feature").collectAsList();
        summary = new ObjectMapper().readTree(out.resolve("summary.json").toFile());
    }

    @Test
    void thePlantedHotBlocksAreTheHotZonesLargestFirst() {
        List<String> hot = peak.hot().stream().map(ZoneHotspots.ZoneRow::id).toList();
        assertEquals(PLANTED, new TreeSet<>(hot), "hot zones " + hot);
        assertEquals("H-wide", hot.get(0), "the 80 m × 40 m zone is the largest");
        assertEquals(3200, peak.hot().get(0).areaM2(), 1e-6);
        for (ZoneHotspots.ZoneRow z : peak.hot()) {
            assertEquals(20, z.band(), z.id() + ": excess " + z.excessK() + " K lies in the 2–4 K band");
            assertEquals(ZoneFixture.LIFT, z.excessK(), 0.35, z.id());
            assertTrue(z.q() <= 0.05, z.id());
        }
        assertTrue(peak.cold().isEmpty(), "no cold zone: " + peak.cold());
        assertEquals("moran_peak", peak.distanceRule());
        JsonNode first = summary.path("hot_zones").get(0);
        assertEquals("H-wide", first.path("zone_id").asText());
        assertEquals(PLANTED.size(), summary.path("hot_zones").size());
        assertTrue(summary.path("moran_scan").size() >= 1);
        // The scan's step is the largest nearest-neighbour centroid distance: H-wide to its neighbours above and below.
        assertEquals(Math.hypot(20, 40), summary.path("moran_scan").get(0).path("distance_m").asDouble(), 1e-9);
    }

    /** Gi* of the written zones against an O(n²) loop over the table's means and centroids (Ord & Getis 1995). */
    @Test
    void giStarOfTheZonesMatchesTheQuadraticDefinition() {
        int n = table.size();
        double d = peak.distanceM();
        List<double[]> in = new ArrayList<>();
        for (Row r : table) {
            if (r.getBoolean(r.fieldIndex("included"))) {
                in.add(new double[] {r.getDouble(r.fieldIndex("mean_value")), r.getDouble(r.fieldIndex("centroid_x_m")),
                        r.getDouble(r.fieldIndex("centroid_y_m"))});
            }
        }
        int m = in.size();
        double mean = 0;
        for (double[] a : in) {
            mean += a[0] / m;
        }
        double ss = 0;
        for (double[] a : in) {
            ss += (a[0] - mean) * (a[0] - mean);
        }
        double s = Math.sqrt(ss / m);
        int checked = 0;
        for (Row r : table) {
            if (!r.getBoolean(r.fieldIndex("included"))) {
                assertTrue(r.isNullAt(r.fieldIndex("z")) && r.isNullAt(r.fieldIndex("band")));
                continue;
            }
            double x = r.getDouble(r.fieldIndex("centroid_x_m")), y = r.getDouble(r.fieldIndex("centroid_y_m"));
            double wx = 0, w = 0;
            for (double[] a : in) {
                if (Math.hypot(a[1] - x, a[2] - y) <= d * (1 + 1e-9)) {
                    wx += a[0];
                    w += 1;
                }
            }
            double ref = (wx - mean * w) / (s * Math.sqrt((m * w - w * w) / (m - 1)));
            assertEquals(ref, r.getDouble(r.fieldIndex("z")), 1e-9, r.getString(0));
            checked++;
        }
        assertEquals(97, checked, "99 zones, 2 left out");
        assertEquals(99, n);
    }

    /** Coverage: the 30 % covered zones (no data, and beyond the grid's edge) are carried but left out. */
    @Test
    void zonesUnderTheMinimumCoverageAreLeftOut() {
        for (String id : List.of("B-9-0", "E-edge")) {
            Row r = table.stream().filter(x -> x.getString(0).equals(id)).findFirst().orElseThrow();
            assertEquals(0.3, r.getDouble(r.fieldIndex("covered_fraction")), 1e-12, id);
            assertFalse(r.getBoolean(r.fieldIndex("included")), id);
            assertTrue(r.isNullAt(r.fieldIndex("mean_value")), id);
            assertTrue(r.getString(r.fieldIndex("label")).startsWith("left out (coverage below 0.5)"), id);
        }
        assertEquals(97, peak.included());
        assertTrue(peak.notes().stream().anyMatch(s -> s.startsWith("2 zone(s) cover less than 0.5")), peak.notes().toString());
    }

    /** A block's mean is the area-weighted mean of its 100 cells (here all of equal area: their plain mean). */
    @Test
    void aBlockHoldsTheAreaWeightedMeanOfItsCells() {
        float[] v = ZoneFixture.peak();
        double sum = 0;
        for (int r = 60; r < 70; r++) {
            for (int c = 20; c < 30; c++) {
                sum += 16.0 * v[r * ZoneFixture.W + c];
            }
        }
        Row b = table.stream().filter(x -> x.getString(0).equals("B-2-6")).findFirst().orElseThrow();
        assertEquals(sum / 1600, b.getDouble(b.fieldIndex("mean_value")), 1e-12);
        assertEquals(1.0, b.getDouble(b.fieldIndex("covered_fraction")), 1e-15);
        // The MultiPolygon zone: both of its blocks, 3200 m².
        Row ms = table.stream().filter(x -> x.getString(0).equals("M-split")).findFirst().orElseThrow();
        assertEquals(3200, ms.getDouble(ms.fieldIndex("area_m2")), 1e-6);
    }

    @Test
    void csvAndGeoJsonCarryTheTable() throws IOException {
        List<String> csv = Files.readAllLines(out.resolve("zones.csv"));
        assertEquals("zone_id,feature,area_m2,covered_fraction,included,mean_value,unit,excess_k,z,q,band,label,"
                + "centroid_x_m,centroid_y_m", csv.get(0));
        assertEquals(100, csv.size());
        Row h = table.stream().filter(x -> x.getString(0).equals("H-wide")).findFirst().orElseThrow();
        String line = csv.stream().filter(l -> l.startsWith("H-wide,")).findFirst().orElseThrow();
        assertTrue(line.contains("," + h.getDouble(h.fieldIndex("z")) + ",") && line.contains(",20,warmer by >= 2 K,"),
                line);
        JsonNode gj = new ObjectMapper().readTree(out.resolve("zones.geojson").toFile());
        assertEquals("urn:ogc:def:crs:EPSG::32632", gj.path("crs").path("properties").path("name").asText());
        assertEquals(99, gj.path("features").size());
        int multi = 0;
        for (JsonNode f : gj.path("features")) {
            JsonNode p = f.path("properties");
            for (String k : List.of("zone_id", "area_m2", "covered_fraction", "mean_value", "excess_k", "z", "q", "band")) {
                assertTrue(p.has(k), k);
            }
            p.fieldNames().forEachRemaining(k -> assertTrue(
                    org.thermotile.jobs.storage.TableColumns.followsRule(k), "property without its unit: " + k));
            multi += f.path("geometry").path("type").asText().equals("MultiPolygon") ? 1 : 0;
        }
        assertEquals(1, multi);
        JsonNode wgs = new ObjectMapper().readTree(out.resolve("zones_wgs84.geojson").toFile());
        double lon = wgs.path("features").get(0).path("geometry").path("coordinates").get(0).get(0).get(0).asDouble();
        assertTrue(lon > 8.9 && lon < 9.1, "UTM 32N near 9° E: " + lon);
    }

    /** A zone over no-data cells only: exit-2 error naming it, and nothing left under the run folder. */
    @Test
    void aZoneWithoutValidCellsIsRefusedAndNothingIsWritten() throws IOException {
        Path f = dir.resolve("nodata-zones.geojson");
        Files.writeString(f, ZoneFixture.collection(List.of(
                ZoneFixture.polygon("a", ZoneFixture.rect(0, 0, 10, 10)),
                ZoneFixture.polygon("b", ZoneFixture.rect(10, 0, 20, 10)),
                ZoneFixture.polygon("c", ZoneFixture.rect(20, 0, 30, 10)),
                ZoneFixture.polygon("wet", ZoneFixture.rect(94, 2, 98, 6)))));
        String m = assertThrows(UserInputException.class, () -> ZoneHotspots.run(spark, run, HotspotOptions.of("peak"),
                new ZoneHotspots.ZoneOptions(f, "block_ref"))).getMessage();
        assertTrue(m.contains("nodata-zones.geojson, features[3] (id 'wet'): the zone covers no valid simulation cell"), m);
        assertTrue(m.contains("Fix: remove the zone"), m);
        Path parent = run.resolve("zones/nodata-zones");
        try (var s = Files.list(parent)) {
            assertEquals(List.of(), s.toList(), "nothing partial left");
        }
    }

    /** The run report lists the hot zones, largest first. */
    @Test
    void theReportListsTheHotZonesLargestFirst() throws IOException {
        Path page = org.thermotile.jobs.report.RunReport.write(run);
        String html = Files.readString(page);
        int section = html.indexOf("Hot zones");
        assertTrue(section > 0, "a Hot zones section");
        String rest = html.substring(section);
        assertTrue(rest.contains("blocks (peak): 8 hot of 99 zones"), rest.substring(0, Math.min(600, rest.length())));
        int wide = rest.indexOf("<td>H-wide</td>");
        assertTrue(wide > 0, "H-wide listed");
        for (String id : PLANTED) {
            assertTrue(rest.indexOf("<td>" + id + "</td>") >= wide, id + " after the largest zone");
        }
    }
}
