package org.thermotile.jobs.ingest;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.demo.SaltmereExample;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.forcing.Forcing;
import picocli.CommandLine;

/** The committed Saltmere example: working grid, footprints, mapped weather, and its generator. */
class SaltmereExampleTest {
    @TempDir
    Path dir;

    static final Path SALTMERE = FootprintRasteriserTest.demoFolder().resolveSibling("saltmere");
    static final Path RIVERSIDE_WEATHER = FootprintRasteriserTest.demoFolder().resolve("weather.csv");

    /**
     * Cells of the 11 footprints with a usable height, hand-counted from the generator's rectangles
     * (edges on the 4 m cell edges, none overlapping): 21×19 + 17×18 + 20×18 + 21×17 + 19×19 + 17×18
     * + 17×21 + 5×20 + 18×18 + 20×19 + 17×18 = 3556.
     */
    static final int HAND_COUNTED_CELLS = 3556;

    @Test
    void prepareGivesTheWorkingGridTheFootprintCellsAndTheMappedWeather() throws Exception {
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(SALTMERE.resolve("run.yaml")));
        RasterGrid g = p.grid();
        assertEquals(32632, g.epsg());
        assertEquals(4.0, g.pixelWidth(), 0.0);
        assertEquals(4.0, Math.abs(g.pixelHeight()), 0.0);

        // Cells with a footprint height, against the hand count and against an independent count from the
        // GeoJSON: usable features' corners back to UTM 32N, cell centres inside each (rectangular) footprint.
        float[] heights = p.spec().heightGrid();
        int withHeight = 0;
        for (float h : heights) {
            if (!Float.isNaN(h) && h > 0) {
                withHeight++;
            }
        }
        assertEquals(HAND_COUNTED_CELLS, withHeight);
        assertEquals(HAND_COUNTED_CELLS, countFromGeoJson(SALTMERE.resolve("footprints.geojson"), g));
        assertTrue(p.notes().stream().anyMatch(n -> n.contains("13 features, 11 rasterised onto 3556 cells")),
                p.notes().toString());
        assertTrue(p.notes().stream().anyMatch(n -> n.contains("{missing=1, not numeric=1, not positive=0")),
                p.notes().toString());

        // The first hours of the file (07/14/2026 00:00…02:00 on the UTC+02:00 clock = 2026-07-13T22:00Z…),
        // converted by hand: t/°C = (t/°F − 32)/1.8 and v/(m/s) = v/(km/h) / 3.6 (NIST SP 811 (2008), App. B.8);
        // T/K = t/°C + 273.15 (NIST SP 811 (2008), 4.2.1.1).
        Forcing f = p.spec().forcing();
        long t0 = Instant.parse("2026-07-13T22:00:00Z").getEpochSecond();
        int i = -1;
        for (int k = 0; k < f.epochSecond.length; k++) {
            if (f.epochSecond[k] == t0) {
                i = k;
                break;
            }
        }
        assertTrue(i >= 0, "hour 2026-07-13T22:00Z in the forcing");
        double[] celsius = {24.61, 23.4, 22.34};   // from 76.298, 74.12, 72.212 °F
        double[] wind = {2.03, 1.88, 1.75};        // from 7.308, 6.768, 6.3 km/h
        for (int k = 0; k < 3; k++) {
            assertEquals(t0 + 3600L * k, f.epochSecond[i + k]);
            assertEquals(celsius[k] + 273.15, f.airTempK[i + k], 1e-9, "hour " + k);
            assertEquals(wind[k], f.windMs[i + k], 1e-9, "hour " + k);
        }
    }

    /** Cell centres of the grid inside the footprints with a positive numeric height (union). */
    static int countFromGeoJson(Path file, RasterGrid g) throws Exception {
        MathTransform toUtm = CRS.findOperation(CommonCRS.WGS84.normalizedGeographic(),
                CommonCRS.WGS84.universal(45, 9), null).getMathTransform();
        boolean[] in = new boolean[g.width() * g.height()];
        for (JsonNode feature : new ObjectMapper().readTree(file.toFile()).get("features")) {
            JsonNode h = feature.get("properties").get("height");
            if (!h.isNumber() || h.asDouble() <= 0) {
                continue;
            }
            JsonNode ring = feature.get("geometry").get("coordinates").get(0);
            double minX = Double.MAX_VALUE, minY = Double.MAX_VALUE, maxX = -Double.MAX_VALUE, maxY = -Double.MAX_VALUE;
            for (JsonNode v : ring) {
                double[] p = {v.get(0).asDouble(), v.get(1).asDouble()};
                toUtm.transform(p, 0, p, 0, 1);
                minX = Math.min(minX, p[0]);
                maxX = Math.max(maxX, p[0]);
                minY = Math.min(minY, p[1]);
                maxY = Math.max(maxY, p[1]);
            }
            for (int r = 0; r < g.height(); r++) {
                double y = g.cellCentreY(r);
                for (int c = 0; c < g.width(); c++) {
                    double x = g.cellCentreX(c);
                    if (x > minX && x < maxX && y > minY && y < maxY) {
                        in[r * g.width() + c] = true;
                    }
                }
            }
        }
        int n = 0;
        for (boolean b : in) {
            n += b ? 1 : 0;
        }
        return n;
    }

    @Test
    void checkPrintsTheWorkingGridFootprintAndWeatherNotes() {
        StringWriter out = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out));
        assertEquals(0, Main.executeWith(cl, "check", SALTMERE.resolve("run.yaml").toString()), out.toString());
        String s = out.toString();
        assertTrue(s.contains("working grid: EPSG:32632, 4 m cells"), s);
        assertTrue(s.contains("11 rasterised onto 3556 cells"), s);
        assertTrue(s.contains("air_temperature ← 'Dry Bulb F' [degF]") && s.contains("wind_speed ← 'Wind kmh' [km/h]"), s);
    }

    @Test
    void theGeneratorReproducesTheCommittedFilesByteForByte() throws Exception {
        SaltmereExample.checkOnRoofs(List.of(SALTMERE.resolve("landcover_w.tif"), SALTMERE.resolve("landcover_e.tif")),
                SaltmereExample.BUILDINGS);
        SaltmereExample.writeWeather(RIVERSIDE_WEATHER, dir.resolve("weather-local.csv"));
        SaltmereExample.writeFootprints(dir.resolve("footprints.geojson"));
        for (String name : List.of("weather-local.csv", "footprints.geojson")) {
            assertArrayEquals(Files.readAllBytes(SALTMERE.resolve(name)), Files.readAllBytes(dir.resolve(name)), name);
        }
    }

    /** A rectangle on the river (land-cover code 50) is refused by the generator's roof check. */
    @Test
    void aBuildingOffTheRoofsIsRefused() {
        Object[][] onWater = {{501000, 4998984, 501016, 4999000, 10.0, null}};
        IllegalStateException e = assertThrows(IllegalStateException.class, () -> SaltmereExample.checkOnRoofs(
                List.of(SALTMERE.resolve("landcover_w.tif"), SALTMERE.resolve("landcover_e.tif")), onWater));
        assertTrue(e.getMessage().contains("code 50"), e.getMessage());
    }
}
