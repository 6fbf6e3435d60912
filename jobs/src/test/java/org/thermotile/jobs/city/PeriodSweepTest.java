package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.stream.StreamSupport;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffReader;

/**
 * The weather axis of a sweep ({@code sweep.periods}): every scenario runs in every period, each
 * period is the same as a run of that period alone, the tables load as one dataset partitioned by
 * period and scenario, the comparison spans the periods, and a resumed run keeps what is complete.
 */
class PeriodSweepTest {
    static SparkSession spark;
    @TempDir
    static Path dir;
    static Path in;
    static Path out;

    static final String SCENARIOS = """
            scenarios:
              - name: cool-dark-roofs
                changes:
                  - {targets: {codes: [2]}, set: {albedo: 0.75}, cost_per_m2: 25}
            """;

    static final String PERIODS = """
            sweep:
              periods:
                - {name: mid-july, start: 2026-07-15, end: 2026-07-15, spin_up_days: 1}
                - {name: mid-july-warm, weather: weather-warm.csv, start: 2026-07-15, end: 2026-07-15, spin_up_days: 1}
                - {name: late-july, start: 2026-07-18, end: 2026-07-18, spin_up_days: 1}
            """;

    /** The test city's run file with a weather file, {@code timeBlock} (period or sweep) and the scenario. */
    static String runFile(String weather, String timeBlock) {
        return """
                name: test-city
                site: {latitude: 45.3, longitude: 9.0, elevation_m: 100}
                inputs:
                  land_cover: landcover.tif
                  classes: classes.yaml
                  districts: districts.geojson
                weather:
                  file: %s
                outputs:
                  maps: [peak, mean, degree_hours]
                  threshold_c: 45
                  hourly_days: [2026-07-15]
                tiling:
                  tile_size: 64
                """.formatted(weather) + timeBlock + SCENARIOS;
    }

    static void run(Path runFile, Path o, boolean resume) {
        CityJob.run(spark, RunPreparer.prepareAll(RunFileReader.read(runFile), false),
                new CityJob.Options(o, null, false, true, 0, resume), new PrintStream(new ByteArrayOutputStream()));
    }

    @BeforeAll
    static void runOnce() throws Exception {
        spark = SparkSessions.get(null, 2);
        in = dir.resolve("in");
        writeInputs(in);
        out = dir.resolve("sweep");
        run(in.resolve("sweep.yaml"), out, false);
    }

    /** The test city, the demo's weather, a 3 K warmer copy of it and the sweep's run file, in {@code in}. */
    static void writeInputs(Path in) throws Exception {
        CityFixture.write(in, 64, "");
        // The demo's invented hot week, and the same week 3 K warmer (air temperature column only).
        Path demo = Path.of("..", "data-samples", "riverside", "weather.csv");
        Files.copy(demo, in.resolve("weather.csv"));
        StringBuilder warm = new StringBuilder();
        for (String line : Files.readAllLines(demo)) {
            String[] c = line.split(",", -1);
            if (line.startsWith("#") || c[0].equals("time")) {
                warm.append(line).append('\n');
                continue;
            }
            c[1] = String.format(Locale.ROOT, "%.2f", Double.parseDouble(c[1]) + 3.0);
            warm.append(String.join(",", c)).append('\n');
        }
        Files.writeString(in.resolve("weather-warm.csv"), warm.toString());
        Files.writeString(in.resolve("sweep.yaml"), runFile("weather.csv", PERIODS));
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    @Test
    void everyScenarioRunsInEveryPeriodAndTheTablesLoadAsOneDataset() throws Exception {
        for (String p : List.of("mid-july", "mid-july-warm", "late-july")) {
            assertTrue(Files.isRegularFile(out.resolve("periods/" + p + "/maps/peak.tif")), p);
            assertTrue(Files.isRegularFile(out.resolve("periods/" + p + "/scenarios/cool-dark-roofs/maps/peak.tif")), p);
            assertTrue(Files.isRegularFile(out.resolve("periods/" + p + "/comparison/ranking.csv")), p);
            assertEquals(p, new ObjectMapper().readTree(out.resolve("periods/" + p + "/manifest.json").toFile())
                    .path("period").asText());
        }
        // One dataset: Spark finds both partition columns under tables/cells.
        var cells = spark.read().parquet(out.resolve("tables/cells").toUri().toString());
        assertTrue(List.of(cells.columns()).containsAll(List.of("period", "scenario")));
        List<Row> groups = cells.groupBy("period", "scenario").count().orderBy("period", "scenario").collectAsList();
        assertEquals(6, groups.size());
        long perGroup = groups.get(0).getLong(2);
        assertEquals(CityFixture.W * CityFixture.H - zeroCodes(), perGroup);
        groups.forEach(g -> assertEquals(perGroup, g.getLong(2)));
        // The hourly day lies in the two mid-July periods only.
        var hours = spark.read().parquet(out.resolve("tables/cell_hours").toUri().toString());
        assertEquals(List.of("mid-july", "mid-july-warm"), hours.select("period").distinct().orderBy("period")
                .collectAsList().stream().map(r -> r.getString(0)).toList());
        JsonNode m = new ObjectMapper().readTree(out.resolve("manifest.json").toFile());
        assertEquals(List.of("mid-july", "mid-july-warm", "late-july"),
                StreamSupport.stream(m.path("periods").spliterator(), false).map(p -> p.path("name").asText()).toList());
    }

    static long zeroCodes() {
        int n = 0;
        for (int c : CityFixture.codes()) {
            n += c == 0 ? 1 : 0;
        }
        return n;
    }

    /**
     * A period of the sweep is the run of that period alone: the same map bytes and the same
     * Parquet bytes, only the folder differs.
     */
    @Test
    void eachPeriodEqualsTheRunOfThatPeriodAlone() throws Exception {
        Files.writeString(in.resolve("warm-alone.yaml"), runFile("weather-warm.csv", """
                period: {start: 2026-07-15, end: 2026-07-15, spin_up_days: 1}
                """));
        Path alone = dir.resolve("warm-alone");
        run(in.resolve("warm-alone.yaml"), alone, false);
        Path period = out.resolve("periods/mid-july-warm");
        int compared = 0;
        for (String f : DeterminismTest.tree(alone)) {
            if (f.startsWith("maps/") || f.startsWith("scenarios/")) {
                assertArrayEquals(Files.readAllBytes(alone.resolve(f)), Files.readAllBytes(period.resolve(f)), f);
                compared++;
            } else if (f.startsWith("tables/")) {
                String[] parts = f.split("/", 3);           // tables, TABLE, scenario=…/part-…
                Path twin = out.resolve("tables").resolve(parts[1]).resolve("period=mid-july-warm").resolve(parts[2]);
                assertArrayEquals(Files.readAllBytes(alone.resolve(f)), Files.readAllBytes(twin), f);
                compared++;
            }
        }
        assertTrue(compared >= 10, "compared " + compared + " files");
    }

    /**
     * The weather file of a period is the one used: 3 K warmer air with the same sun, humidity and
     * wind raises every cell's peak (a warmer surroundings can only add heat to the balance: more
     * sky longwave and less convective loss), and a different week gives a different map.
     */
    @Test
    void aPeriodsOwnWeatherIsTheOneUsed() throws Exception {
        float[] base = peak(out.resolve("periods/mid-july/maps/peak.tif"));
        float[] warm = peak(out.resolve("periods/mid-july-warm/maps/peak.tif"));
        float[] late = peak(out.resolve("periods/late-july/maps/peak.tif"));
        int cells = 0;
        boolean lateDiffers = false;
        for (int i = 0; i < base.length; i++) {
            if (Float.isNaN(base[i]) || base[i] == CityJob.MAP_NODATA) {
                continue;
            }
            cells++;
            assertTrue(warm[i] > base[i], "cell " + i + ": " + warm[i] + " vs " + base[i]);
            lateDiffers |= late[i] != base[i];
        }
        assertTrue(cells > 1000);
        assertTrue(lateDiffers);
    }

    static float[] peak(Path tif) throws Exception {
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(tif)) {
            return r.readFloatWindow(0, 0, r.grid().width(), r.grid().height());
        }
    }

    @Test
    void theComparisonSpansThePeriods() throws Exception {
        List<String> lines = Files.readAllLines(out.resolve("comparison/ranking_by_period.csv"));
        assertTrue(lines.get(0).startsWith("period,scenario,district,"));
        for (String p : List.of("mid-july", "mid-july-warm", "late-july")) {
            assertTrue(lines.stream().anyMatch(l -> l.startsWith(p + ",cool-dark-roofs,(all),")), p);
            // Each period's rows are that period's own ranking, row for row.
            List<String> own = Files.readAllLines(out.resolve("periods/" + p + "/comparison/ranking.csv"));
            List<String> here = lines.stream().filter(l -> l.startsWith(p + ",")).map(l -> l.substring(p.length() + 1))
                    .toList();
            assertEquals(own.subList(1, own.size()), here);
        }
        String md = Files.readString(out.resolve("comparison/summary.md"));
        assertTrue(md.contains("rank mid-july-warm") && md.contains("| cool-dark-roofs | 1 |"), md);
        assertTrue(md.contains("not air temperature"));
        var ranking = spark.read().parquet(out.resolve("comparison/ranking_by_period.parquet").toUri().toString());
        assertEquals(lines.size() - 1, ranking.count());
    }

    @Test
    void theReportIndexesThePeriods() throws Exception {
        org.thermotile.jobs.report.RunReport.Result r = org.thermotile.jobs.report.RunReport.build(out);
        String html = Files.readString(r.html());
        for (String p : List.of("mid-july", "mid-july-warm", "late-july")) {
            assertTrue(html.contains("href=\"periods/" + p + "/report.html\""), p);
            assertTrue(Files.isRegularFile(out.resolve("periods/" + p + "/report.html")), p);
        }
        assertTrue(html.contains("not air temperature"));
        assertTrue(r.sections().containsAll(List.of("periods", "comparison")));
    }

    @Test
    void resumeKeepsCompletePeriodsAndRecomputesOnlyTheMissingPartition() throws Exception {
        Path copy = dir.resolve("resumed");
        ScenarioTest.copyTree(out, copy);
        org.thermotile.jobs.storage.Folders.deleteTree(copy.resolve("periods/late-july/scenarios/cool-dark-roofs"));
        org.thermotile.jobs.storage.Folders.deleteTree(copy.resolve("tables/cells/period=late-july/scenario=cool-dark-roofs"));
        run(in.resolve("sweep.yaml"), copy, true);
        List<String> files = DeterminismTest.tree(out).stream().filter(f -> !f.endsWith(".html") && !f.endsWith(".png"))
                .toList();
        assertEquals(files, DeterminismTest.tree(copy).stream().filter(f -> !f.endsWith(".html") && !f.endsWith(".png"))
                .toList());
        for (String f : files) {
            if (f.endsWith("manifest.json")) {
                assertEquals(DeterminismTest.withoutTiming(out.resolve(f)), DeterminismTest.withoutTiming(copy.resolve(f)), f);
            } else {
                assertArrayEquals(Files.readAllBytes(out.resolve(f)), Files.readAllBytes(copy.resolve(f)), f);
            }
        }
        JsonNode late = new ObjectMapper().readTree(copy.resolve("periods/late-july/manifest.json").toFile()).path("timing");
        assertEquals("[\"baseline\"]", late.path("resumed_partitions").toString());
        JsonNode mid = new ObjectMapper().readTree(copy.resolve("periods/mid-july/manifest.json").toFile()).path("timing");
        assertEquals("[\"baseline\",\"cool-dark-roofs\"]", mid.path("resumed_partitions").toString());
        assertEquals(0, mid.path("computed_cell_hours").asLong());
    }

    /**
     * A run over several periods has a catalogue entry per period (its own maps and its partitions
     * of the run's tables, hrefs relative to the period's folder) and one for the whole run (every
     * file, links to the periods' entries), with the periods' time ranges (STAC 1.0.0 Item spec).
     */
    @Test
    void everyPeriodAndTheRunHaveACatalogueEntry() throws Exception {
        ObjectMapper om = new ObjectMapper();
        JsonNode run = om.readTree(out.resolve("item.json").toFile());
        assertEquals("test-city", run.path("id").asText());
        assertEquals(3, run.path("links").size());
        java.time.Instant runStart = java.time.Instant.parse(run.path("properties").path("start_datetime").asText());
        java.time.Instant runEnd = java.time.Instant.parse(run.path("properties").path("end_datetime").asText());
        for (String p : List.of("mid-july", "mid-july-warm", "late-july")) {
            Path folder = out.resolve("periods").resolve(p);
            JsonNode item = om.readTree(folder.resolve("item.json").toFile());
            assertEquals("test-city-" + p, item.path("id").asText());
            assertEquals("../../item.json", item.path("links").path(0).path("href").asText());
            assertTrue(Files.isRegularFile(folder.resolve(item.path("links").path(0).path("href").asText()).normalize()));
            JsonNode props = item.path("properties");
            java.time.Instant s = java.time.Instant.parse(props.path("start_datetime").asText());
            java.time.Instant e = java.time.Instant.parse(props.path("end_datetime").asText());
            assertEquals(java.time.Duration.ofHours(24), java.time.Duration.between(s, e), p);
            assertTrue(!s.isBefore(runStart) && !e.isAfter(runEnd), p);
            int tables = 0;
            for (JsonNode a : item.path("assets")) {
                String href = a.path("href").asText();
                assertTrue(Files.isRegularFile(folder.resolve(href)), p + ": " + href);
                if (href.startsWith("../../tables/")) {
                    assertTrue(href.contains("/period=" + p + "/"), href);
                    tables++;
                }
            }
            assertTrue(tables >= 4, p + ": " + tables + " table parts");
            assertTrue(item.path("assets").has("maps/peak.tif"), p);
        }
        assertEquals(java.time.Instant.parse(om.readTree(out.resolve("periods/mid-july/item.json").toFile())
                .path("properties").path("start_datetime").asText()), runStart);
        assertEquals(java.time.Instant.parse(om.readTree(out.resolve("periods/late-july/item.json").toFile())
                .path("properties").path("end_datetime").asText()), runEnd);
        for (JsonNode a : run.path("assets")) {
            assertTrue(Files.isRegularFile(out.resolve(a.path("href").asText())), a.path("href").asText());
        }
        assertTrue(run.path("assets").has("periods/late-july/maps/peak.tif"));
    }

    /** The resolved run file (as the manifest records it) is a valid run file with the same periods. */
    @Test
    void theResolvedRunFileReadsBackWithTheSamePeriods() throws Exception {
        var run = RunFileReader.read(in.resolve("sweep.yaml"));
        Path again = in.resolve("resolved.yaml");
        Files.writeString(again, run.toYaml());
        var back = RunFileReader.read(again);
        assertEquals(run.periods(), back.periods());
        assertEquals(3, back.periods().size());
        assertEquals(in.resolve("weather-warm.csv").toString(), back.periods().get(1).weather().file());
        // One period of it is a run file of one period.
        var one = RunFileReader.parse(run.forPeriod(run.periods().get(1)).toYaml(), in, "one.yaml");
        assertTrue(one.periods().isEmpty());
        assertEquals(run.periods().get(1).period(), one.period());
        assertEquals(run.periods().get(1).weather(), one.weather());
    }

    /** The bundled example of the weather axis reads and prepares: two periods of the demo week. */
    @Test
    void theBundledPeriodsExamplePrepares() {
        var run = RunFileReader.read(Path.of("..", "data-samples", "riverside", "periods.yaml"));
        List<PreparedRun> ps = RunPreparer.prepareAll(run, false);
        assertEquals(List.of("cloudy-start", "hottest-days"), ps.stream().map(PreparedRun::period).toList());
        assertEquals(List.of(48, 48), ps.stream().map(p -> p.sampleEpochSeconds().length).toList());
        assertEquals(3, ps.get(0).plan().variants().size());
        assertTrue(ps.get(0).plan() == ps.get(1).plan(), "the scenario plan is made once and shared");
    }

    // ---- bad inputs

    static String problems(String text) throws Exception {
        Path f = in.resolve("bad-" + Math.abs(text.hashCode()) + ".yaml");
        Files.writeString(f, text);
        Exception e = assertThrows(RuntimeException.class,
                () -> RunPreparer.prepareAll(RunFileReader.read(f), false));
        return e.getMessage();
    }

    @Test
    void aPeriodBlockBesideSweepPeriodsIsRefused() throws Exception {
        String msg = problems(runFile("weather.csv", "period: {start: 2026-07-15, end: 2026-07-15}\n" + PERIODS));
        assertTrue(msg.contains("period") && msg.contains("sweep.periods"), msg);
    }

    @Test
    void duplicateAndMalformedPeriodNamesAreRefusedTogether() throws Exception {
        String msg = problems(runFile("weather.csv", """
                sweep:
                  periods:
                    - {name: july, start: 2026-07-15, end: 2026-07-15}
                    - {name: july, start: 2026-07-16, end: 2026-07-16}
                    - {name: "July 18", start: 2026-07-18, end: 2026-07-18}
                """));
        assertTrue(msg.contains("'july' is used twice"), msg);
        assertTrue(msg.contains("'July 18' must use lower-case"), msg);
    }

    @Test
    void aPeriodTheWeatherDoesNotCoverNamesThePeriodAndTheFile() throws Exception {
        String msg = problems(runFile("weather.csv", """
                sweep:
                  periods:
                    - {name: mid-july, start: 2026-07-15, end: 2026-07-15}
                    - {name: august, start: 2026-08-10, end: 2026-08-12}
                """));
        assertTrue(msg.contains("sweep.periods 'august'") && msg.contains("weather.csv"), msg);
    }

    @Test
    void anHourlyDayOutsideEveryPeriodIsRefused() throws Exception {
        String msg = problems(runFile("weather.csv", PERIODS).replace("hourly_days: [2026-07-15]",
                "hourly_days: [2026-07-17]"));
        assertTrue(msg.contains("2026-07-17 is not a whole day inside any of sweep.periods"), msg);
    }
}
