package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.hotspots.ZoneHotspots;
import org.thermotile.jobs.storage.Folders;

/**
 * A run file's {@code hotspots: {zones: …}} analyses the zones after the grid, inside the run, and
 * gives the same zones table as the {@code hotspots --zones} analysis of the finished run.
 */
class ZonesInRunTest {
    @TempDir
    Path dir;

    /** 50 m blocks over the fixture's 750 m × 550 m grid, ids "b<col>-<row>" (165 zones). */
    static String blocks() {
        StringBuilder sb = new StringBuilder("{\"type\": \"FeatureCollection\", \"crs\": {\"type\": \"name\", "
                + "\"properties\": {\"name\": \"urn:ogc:def:crs:EPSG::32632\"}}, \"features\": [");
        String sep = "";
        for (int r = 0; r < 11; r++) {
            for (int c = 0; c < 15; c++) {
                double x0 = CityFixture.X0 + 50 * c, y0 = CityFixture.Y0 - 50 * r, x1 = x0 + 50, y1 = y0 - 50;
                sb.append(sep).append(String.format(Locale.ROOT, "{\"type\": \"Feature\", \"properties\": "
                        + "{\"block\": \"b%d-%d\"}, \"geometry\": {\"type\": \"Polygon\", \"coordinates\": [[[%.0f, %.0f], "
                        + "[%.0f, %.0f], [%.0f, %.0f], [%.0f, %.0f], [%.0f, %.0f]]]}}", c, r, x0, y0, x1, y0, x1, y1, x0,
                        y1, x0, y0));
                sep = ",";
            }
        }
        return sb.append("]}").toString();
    }

    @Test
    void theRunAnalysesItsZonesAsTheCommandDoesAfterwards() throws Exception {
        Path in = dir.resolve("in");
        Path rf = CityFixture.write(in, 256, "");
        Files.writeString(in.resolve("blocks.geojson"), blocks());
        Files.writeString(rf, Files.readString(rf)
                + "hotspots: {statistics: [peak], cell_size_m: 10, zones: blocks.geojson, zone_id: block}\n");
        Path out = dir.resolve("out");
        SparkSession spark = SparkSessions.get(null, 2);
        try {
            CityJob.run(spark, RunPreparer.prepare(RunFileReader.read(rf)),
                    new CityJob.Options(out, null, false, true, 0), new PrintStream(new ByteArrayOutputStream()));
            Path csv = out.resolve("zones/blocks/peak/zones.csv");
            assertTrue(Files.isRegularFile(csv), "the run wrote its zones table");
            assertTrue(Files.isRegularFile(out.resolve("hotspots/peak/excess_band.tif")), "and the grid analysis");
            List<String> rows = Files.readAllLines(csv);
            assertEquals(1 + 165, rows.size(), "a header and one row per block");
            assertTrue(rows.stream().anyMatch(l -> l.startsWith("b0-0,")) && rows.stream()
                    .anyMatch(l -> l.startsWith("b14-10,")), "ids from the zone_id property");
            byte[] inRun = Files.readAllBytes(csv);

            // The same analysis as a command on the finished run (its zones folder removed first).
            Folders.deleteTree(out.resolve("zones"));
            HotspotsBlock hs = HotspotsBlock.of(RunFileReader.read(rf), CityFixture.CELL);
            ZoneHotspots.run(spark, out, hs.options("peak", 256), hs.zoneOptions());
            assertArrayEquals(inRun, Files.readAllBytes(csv), "zones.csv as the command writes it");
        } finally {
            spark.stop();
        }
    }
}
