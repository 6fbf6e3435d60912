package org.thermotile.jobs.config;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFile.MapKind;
import org.thermotile.model.balance.ColumnSpacing;

class RunFileReaderTest {
    /** The demo run file, from the jobs module folder where Surefire runs. */
    private static final Path EXAMPLE = Path.of("..", "data-samples", "riverside", "run.yaml");
    private static final Path BASE = Path.of("/data/riverside");
    private static final String SRC = "run.yaml";

    /** A small valid run file; tests replace one line at a time. */
    private static final String MINIMAL = String.join("\n",
            "name: test-run",
            "inputs:",
            "  land_cover: lc.tif",
            "  classes: worldcover",
            "weather:",
            "  file: weather.csv",
            "period:",
            "  start: 2026-07-13",
            "  end: 2026-07-14",
            "outputs:",
            "  maps: [peak, mean]",
            "");

    private static RunFile parse(String text) {
        return RunFileReader.parse(text, BASE, SRC);
    }

    private static List<String> problems(String text) {
        return assertThrows(RunFileException.class, () -> parse(text)).problems();
    }

    private static String only(List<String> problems) {
        assertEquals(1, problems.size(), () -> "expected one problem, got " + problems);
        return problems.get(0);
    }

    private static void assertContains(String text, String... parts) {
        for (String p : parts) {
            assertTrue(text.contains(p), () -> "'" + p + "' not in: " + text);
        }
    }

    // ---------------------------------------------------------------- valid files

    @Test
    void exampleRunFileParses() {
        RunFile rf = RunFileReader.read(EXAMPLE);
        Path dir = EXAMPLE.toAbsolutePath().normalize().getParent();
        assertEquals("riverside-hot-week", rf.name());
        assertEquals(45.1436, rf.site().latitudeDeg());
        assertEquals(9.0229, rf.site().longitudeDeg());
        assertEquals(70.0, rf.site().elevationM());
        assertEquals(dir.resolve("landcover.tif").toString(), rf.inputs().landCover());
        assertEquals(dir.resolve("classes.yaml").toString(), rf.inputs().classes());
        assertFalse(rf.inputs().classesIsBuiltIn());
        assertNull(rf.inputs().materials());
        assertEquals(dir.resolve("heights.tif").toString(), rf.inputs().heights());
        assertEquals(dir.resolve("districts.geojson").toString(), rf.inputs().districts());
        assertEquals(dir.resolve("weather.csv").toString(), rf.weather().file());
        assertEquals(3, rf.weather().fillGapsMaxHours());
        assertFalse(rf.weather().isSynthetic());
        assertEquals(LocalDateTime.of(2026, 7, 14, 0, 0), rf.period().start());
        assertEquals(LocalDateTime.of(2026, 7, 19, 0, 0), rf.period().end(), "date end is inclusive");
        assertEquals(5 * 24, rf.period().hours());
        assertEquals(LocalDateTime.of(2026, 7, 12, 0, 0), rf.period().simulationStart());
        assertEquals(10, rf.physics().timestepMinutes());
        assertEquals("mcadams", rf.physics().convection().model());
        assertTrue(Double.isNaN(rf.physics().deepGroundTempC()));
        assertEquals(List.of(MapKind.PEAK, MapKind.MEAN, MapKind.NIGHT_MIN, MapKind.PEAK_HOUR,
                MapKind.DEGREE_HOURS), rf.outputs().maps());
        assertEquals(45.0, rf.outputs().thresholdC());
        assertEquals(List.of(LocalDate.of(2026, 7, 16)), rf.outputs().hourlyDays());
        assertEquals(256, rf.tiling().tileSize());
        assertEquals(java.util.Set.of("hotspots", "scenarios", "sweep"), rf.reserved().keySet());
        assertEquals(5, rf.scenarios().size(), "three programmes and a two-value sweep");
        assertEquals(EXAMPLE.toAbsolutePath().normalize().toString(), rf.source());
    }

    @Test
    void defaultsFillOptionalSections() {
        RunFile rf = parse(MINIMAL);
        assertFalse(rf.site().hasCoordinates());
        assertEquals(0.0, rf.site().elevationM());
        assertEquals(RunFileReader.DEFAULT_SPIN_UP_DAYS, rf.period().spinUpDays());
        assertEquals(RunFileReader.DEFAULT_TIMESTEP_MINUTES, rf.physics().timestepMinutes());
        assertEquals(RunFileReader.DEFAULT_TILE_SIZE, rf.tiling().tileSize());
        assertEquals(0, rf.weather().fillGapsMaxHours());
        assertTrue(rf.outputs().hourlyDays().isEmpty());
        assertTrue(Double.isNaN(rf.outputs().thresholdC()));
        // The raster centre stands in for missing coordinates.
        var site = rf.site().toSite(51.5, -0.1);
        assertEquals(51.5, site.latitudeDeg());
        assertEquals(-0.1, site.longitudeDeg());
    }

    @Test
    void pathsResolveAgainstTheRunFileFolderAndUrisStay() {
        RunFile rf = parse(MINIMAL
                .replace("land_cover: lc.tif", "land_cover: ../shared/./lc.tif")
                .replace("file: weather.csv", "file: hdfs://namenode:8020/wx/weather.csv")
                .replace("classes: worldcover", "classes: tables/riverside.csv\n  heights: /abs/h.tif\n"
                        + "  districts: file:///abs/d.geojson"));
        assertEquals(Path.of("/data/shared/lc.tif").toString(), rf.inputs().landCover());
        assertEquals("hdfs://namenode:8020/wx/weather.csv", rf.weather().file());
        assertEquals(Path.of("/data/riverside/tables/riverside.csv").toString(), rf.inputs().classes());
        assertFalse(rf.inputs().classesIsBuiltIn());
        assertEquals(Path.of("/abs/h.tif").toString(), rf.inputs().heights());
        assertEquals("file:///abs/d.geojson", rf.inputs().districts());
    }

    @Test
    void syntheticWeatherFixedConvectionAndDateTimes() {
        RunFile rf = parse(MINIMAL
                .replace("file: weather.csv", "synthetic: {t_min_c: 19, t_max_c: 34, rel_humidity_pct: 45, "
                        + "wind_ms: 2.5, utc_offset: \"+02:00\"}")
                .replace("start: 2026-07-13", "start: 2026-07-13T06:00")
                .replace("end: 2026-07-14", "end: 2026-07-14T18:00")
                + "physics:\n  convection: 12\n  timestep_minutes: 15\n  deep_ground_temp_c: 14.5\n");
        RunFile.Synthetic s = rf.weather().synthetic();
        assertEquals(new RunFile.Synthetic(19, 34, 45, 2.5, ZoneOffset.ofHours(2)), s);
        // 0 °C = 273.15 K exactly (SI Brochure, 9th ed., 2019, definition of the degree Celsius; from memory).
        assertEquals(292.15, s.tMinK(), 1e-12);
        assertTrue(rf.physics().convection().isFixed());
        assertEquals(12.0, rf.physics().convection().coefficientWm2K());
        assertEquals(15 * 60, rf.physics().timestepSeconds());
        assertEquals(14.5, rf.physics().deepGroundTempC());
        assertEquals(36, rf.period().hours(), "06:00 to next day 18:00 is 36 h");
    }

    @Test
    void reservedSectionsAreKeptRaw() {
        RunFile rf = parse(MINIMAL + "scenarios:\n  - {name: cool-roofs, changes: [{targets: {codes: [1]}, set: {albedo: 0.7}}]}\n"
                + "hotspots: {statistics: [peak]}\n");
        assertEquals(2, rf.reserved().size());
        JsonNode sc = rf.reserved("scenarios");
        assertEquals("cool-roofs", sc.get(0).get("name").asText());
        // The record is immutable: changing a returned tree does not change the run file.
        ((com.fasterxml.jackson.databind.node.ObjectNode) sc.get(0)).put("name", "changed");
        assertEquals("cool-roofs", rf.reserved("scenarios").get(0).get("name").asText());
    }

    /** {@code report:} was once accepted and never read; a key nothing reads is now refused. */
    @Test
    void aSectionNothingReadsIsRefused() {
        RunFileException e = assertThrows(RunFileException.class, () -> parse(MINIMAL + "report: {title: x}\n"));
        assertTrue(e.getMessage().contains("report"), e.getMessage());
    }

    @Test
    void resolvedYamlReadsBackEqualAndJsonHasAllSections(@TempDir Path tmp) throws Exception {
        RunFile rf = RunFileReader.read(EXAMPLE);
        Path copy = tmp.resolve("resolved.yaml");
        Files.writeString(copy, rf.toYaml());
        RunFile back = RunFileReader.read(copy);
        assertEquals(rf.inputs(), back.inputs(), "absolute paths stay the same");
        assertEquals(rf.period(), back.period(), "exclusive end date-time reads back the same");
        assertEquals(rf.site(), back.site());
        assertEquals(rf.weather(), back.weather());
        assertEquals(rf.physics(), back.physics());
        assertEquals(rf.outputs(), back.outputs());
        assertEquals(rf.tiling(), back.tiling());
        assertEquals(rf.name(), back.name());

        JsonNode json = new ObjectMapper().readTree(rf.toJson());
        assertEquals(List.of("name", "site", "inputs", "weather", "period", "physics", "outputs", "tiling",
                "hotspots", "scenarios", "sweep", "observations"), iterate(json));
        assertEquals("2026-07-19T00:00", json.get("period").get("end").asText());
        assertTrue(json.get("physics").get("deep_ground_temp_c").isNull());
        assertEquals(rf.toJson(), RunFileReader.read(EXAMPLE).toJson(), "deterministic output");

        // A fixed coefficient and synthetic weather round-trip too.
        RunFile syn = parse(MINIMAL.replace("file: weather.csv", "synthetic: {t_min_c: -3.5, t_max_c: 4, "
                + "rel_humidity_pct: 80, wind_ms: 0, utc_offset: Z}") + "physics: {convection: 5.5}\n"
                + "scenarios: [{name: a, changes: [{targets: {codes: [3]}, set: {albedo: 0.5}}]}]\n");
        RunFile synBack = parse(syn.toYaml());
        assertEquals(syn.weather(), synBack.weather());
        assertEquals(syn.physics(), synBack.physics());
        assertEquals(syn.reserved(), synBack.reserved());
    }

    @Test
    void columnSpacingIsStandardUnlessCoarseIsNamed() {
        assertEquals(ColumnSpacing.STANDARD, parse(MINIMAL).physics().columnSpacing(), "no physics section");
        assertEquals(ColumnSpacing.STANDARD, parse(MINIMAL + "physics: {timestep_minutes: 10}\n")
                .physics().columnSpacing(), "physics without the key");
        assertEquals(ColumnSpacing.STANDARD, parse(MINIMAL + "physics: {column_spacing: null}\n")
                .physics().columnSpacing(), "null is the default, as for deep_ground_temp_c");
        assertEquals(ColumnSpacing.STANDARD, parse(MINIMAL + "physics: {column_spacing: standard}\n")
                .physics().columnSpacing());
        RunFile rf = parse(MINIMAL + "physics:\n  convection: 12\n  column_spacing: coarse\n");
        assertEquals(ColumnSpacing.COARSE, rf.physics().columnSpacing());
        assertEquals(12.0, rf.physics().convection().coefficientWm2K(), "the other keys still read");
        // The three-argument form older callers use keeps the standard spacing.
        assertEquals(ColumnSpacing.STANDARD, new RunFile.Physics(10,
                new RunFile.Convection("mcadams", Double.NaN), Double.NaN).columnSpacing());
    }

    @Test
    void coarseSpacingRoundTripsAndAStandardRunWritesNoKey() {
        RunFile coarse = parse(MINIMAL + "physics: {column_spacing: coarse}\n");
        JsonNode ph = coarse.toTree().get("physics");
        assertEquals("coarse", ph.get("column_spacing").asText());
        RunFile back = parse(coarse.toYaml());
        assertEquals(coarse.physics(), back.physics());
        assertEquals(coarse.toJson(), back.toJson());

        // Standard, written or not: the resolved file (and so every existing run's manifest and
        // partition keys) is what it was before the key existed.
        RunFile plain = parse(MINIMAL);
        RunFile named = parse(MINIMAL + "physics: {column_spacing: standard}\n");
        assertFalse(plain.toTree().get("physics").has("column_spacing"), plain.toJson());
        assertEquals(List.of("timestep_minutes", "convection", "deep_ground_temp_c"),
                iterate(plain.toTree().get("physics")));
        assertEquals(plain.toJson(), named.toJson());
        assertFalse(RunFileReader.read(EXAMPLE).toTree().get("physics").has("column_spacing"));
    }

    @Test
    void unknownOrMistypedColumnSpacingIsAnErrorWithItsPlace() {
        for (String typo : List.of("coarse_", "corse", "Coarse")) {
            String p = only(problems(MINIMAL + "physics:\n  column_spacing: " + typo + "\n"));
            assertContains(p, "run.yaml line 13, column 3", "physics.column_spacing",
                    "'" + typo + "' is not a column spacing", "did you mean 'coarse'?", "standard | coarse");
        }
        String far = only(problems(MINIMAL + "physics: {column_spacing: medium}\n"));
        assertContains(far, "physics.column_spacing", "'medium' is not a column spacing", "use one of standard | coarse");
        assertFalse(far.contains("did you mean"), far);
        String number = only(problems(MINIMAL + "physics: {column_spacing: 3}\n"));
        assertContains(number, "physics.column_spacing", "expected a spacing name, got the number 3",
                "standard | coarse");
        String list = only(problems(MINIMAL + "physics: {column_spacing: [coarse]}\n"));
        assertContains(list, "physics.column_spacing", "got a list");
        String key = only(problems(MINIMAL + "physics: {colum_spacing: coarse}\n"));
        assertContains(key, "unknown key 'colum_spacing'", "did you mean 'column_spacing'?");
        // Reported with the file's other problems, not instead of them.
        List<String> both = problems(MINIMAL + "physics: {timestep_minutes: 7, column_spacing: corse}\n");
        assertEquals(2, both.size(), both::toString);
        assertContains(String.join("\n", both), "physics.timestep_minutes", "physics.column_spacing");
    }

    private static List<String> iterate(JsonNode n) {
        List<String> out = new java.util.ArrayList<>();
        n.fieldNames().forEachRemaining(out::add);
        return out;
    }

    // ---------------------------------------------------------------- errors

    @Test
    void misspeltTopLevelKeySuggestsTheRightOne() {
        String p = only(problems(MINIMAL.replace("outputs:", "ouputs:")
                .replace("  maps: [peak, mean]", "  maps: [peak]")).stream()
                .filter(s -> s.contains("ouputs")).toList());
        assertContains(p, "run.yaml line 10, column 1", "unknown key 'ouputs' at top level",
                "did you mean 'outputs'?");
        // The misspelt section also leaves 'outputs' missing, and that is said too.
        List<String> all = problems(MINIMAL.replace("outputs:", "ouputs:"));
        assertEquals(2, all.size(), all::toString);
        assertContains(all.get(1), "run.yaml: top level: required key 'outputs' is missing");
    }

    @Test
    void misspeltNestedKeySuggestsTheRightOne() {
        String p = only(problems(MINIMAL + "physics:\n  timestep_minuts: 10\n"));
        assertContains(p, "physics.timestep_minuts", "unknown key 'timestep_minuts' in 'physics'",
                "did you mean 'timestep_minutes'?");
        String q = only(problems(MINIMAL.replace("file: weather.csv", "synthetic: {t_min_c: 19, t_max_c: 34, "
                + "rel_humidty_pct: 45, rel_humidity_pct: 40, wind_ms: 2, utc_offset: \"+01:00\"}")));
        assertContains(q, "weather.synthetic.rel_humidty_pct", "did you mean 'rel_humidity_pct'?");
    }

    @Test
    void keyInTheWrongSectionIsPointedHome() {
        String p = only(problems(MINIMAL.replace("  maps: [peak, mean]", "  maps: [peak]\n  tile_size: 256")));
        assertContains(p, "outputs.tile_size", "'tile_size' belongs under 'tiling'");
    }

    @Test
    void missingRequiredKeysAreNamed() {
        List<String> ps = problems("name: x\ninputs:\n  classes: nlcd\nperiod: {start: 2026-07-13}\n");
        assertContains(String.join("\n", ps), "inputs: required key 'land_cover' is missing",
                "required key 'weather' is missing", "period: required key 'end' is missing",
                "required key 'outputs' is missing");
        assertEquals(4, ps.size(), ps::toString);
    }

    @Test
    void wrongTypesAreReportedWithTheValue() {
        String p = only(problems(MINIMAL + "tiling:\n  tile_size: \"256\"\n"));
        assertContains(p, "tiling.tile_size", "expected a number, got the text '256'", "without quotes");
        String q = only(problems(MINIMAL.replace("name: test-run", "name: 2026")));
        assertContains(q, "name", "expected text, got the number 2026", "quotes");
        String r = only(problems(MINIMAL.replace("  maps: [peak, mean]", "  maps: peak")));
        assertContains(r, "outputs.maps", "expected a list");
        String s = only(problems(MINIMAL + "site: 45.07\n"));
        assertContains(s, "site", "expected a mapping of keys, got the number 45.07");
        String t = only(problems(MINIMAL + "physics: {timestep_minutes: 7.5}\n"));
        assertContains(t, "physics.timestep_minutes", "expected a whole number, got 7.5");
    }

    @Test
    void endBeforeStartIsAnError() {
        String p = only(problems(MINIMAL.replace("end: 2026-07-14", "end: 2026-07-12")));
        assertContains(p, "period.end", "2026-07-12", "is not after start 2026-07-13");
        // The same date is one whole day, which is fine.
        assertEquals(24, parse(MINIMAL.replace("end: 2026-07-14", "end: 2026-07-13")).period().hours());
        String q = only(problems(MINIMAL.replace("start: 2026-07-13", "start: 2026-07-13T06:30")));
        assertContains(q, "period.start", "not on a whole hour", "2026-07-13T06:00");
        String r = only(problems(MINIMAL.replace("start: 2026-07-13", "start: 2026-13-01")));
        assertContains(r, "period.start", "'2026-13-01' is not a date");
    }

    @Test
    void timestepMustDivideAnHour() {
        for (String bad : List.of("7", "0", "90", "-5")) {
            String p = only(problems(MINIMAL + "physics: {timestep_minutes: " + bad + "}\n"));
            assertContains(p, "physics.timestep_minutes", bad + " does not divide an hour",
                    "1, 2, 3, 4, 5, 6, 10, 12, 15, 20, 30, 60");
        }
        for (int good : new int[] {1, 2, 3, 4, 5, 6, 10, 12, 15, 20, 30, 60}) {
            assertEquals(good, parse(MINIMAL + "physics: {timestep_minutes: " + good + "}\n")
                    .physics().timestepMinutes());
        }
    }

    @Test
    void unknownMapNameIsAnErrorWithSuggestion() {
        String p = only(problems(MINIMAL.replace("maps: [peak, mean]", "maps: [peak, mean, night_mn]")));
        assertContains(p, "run.yaml line 11", "outputs.maps[2]", "'night_mn' is not a map name",
                "did you mean 'night_min'?", "peak, mean, night_min, peak_hour, degree_hours, hours_above");
        String q = only(problems(MINIMAL.replace("maps: [peak, mean]", "maps: [peak, peak]")));
        assertContains(q, "outputs.maps[1]", "listed twice");
        String r = only(problems(MINIMAL.replace("maps: [peak, mean]", "maps: [degree_hours]")));
        assertContains(r, "outputs: required key 'threshold_c' is missing", "degree_hours");
    }

    @Test
    void tileSizeMustBeAMultipleOf16InRange() {
        for (String bad : List.of("100", "0", "8192", "4112")) {
            String p = only(problems(MINIMAL + "tiling: {tile_size: " + bad + "}\n"));
            assertContains(p, "tiling.tile_size", "not a multiple of 16 between 16 and 4096");
        }
        assertEquals(16, parse(MINIMAL + "tiling: {tile_size: 16}\n").tiling().tileSize());
        assertEquals(4096, parse(MINIMAL + "tiling: {tile_size: 4096}\n").tiling().tileSize());
    }

    @Test
    void otherValueChecks() {
        assertContains(only(problems(MINIMAL.replace("name: test-run", "name: Riverside Hot Week"))),
                "may use only a-z", "'riverside-hot-week'");
        assertContains(only(problems(MINIMAL + "site: {latitude: 95, longitude: 7}\n")),
                "site.latitude", "outside -90…90");
        assertContains(only(problems(MINIMAL + "site: {latitude: 45}\n")), "both latitude and longitude");
        assertContains(only(problems(MINIMAL.replace("classes: worldcover", "classes: worldcovr"))),
                "inputs.classes", "did you mean 'worldcover'?");
        assertContains(only(problems(MINIMAL + "physics: {convection: mcadam}\n")),
                "physics.convection", "did you mean 'mcadams'?");
        assertContains(only(problems(MINIMAL + "physics: {convection: \"12\"}\n")),
                "number in quotes");
        assertContains(only(problems(MINIMAL.replace("  maps: [peak, mean]",
                "  maps: [degree_hours]\n  threshold_c: 318.15"))), "outputs.threshold_c", "looks like kelvin");
        assertContains(only(problems(MINIMAL.replace("  maps: [peak, mean]",
                "  maps: [peak]\n  hourly_days: [2026-07-20]"))), "outputs.hourly_days[0]",
                "not a whole day inside the period");
        assertContains(only(problems(MINIMAL.replace("file: weather.csv",
                "file: w.csv\n  synthetic: {t_min_c: 1, t_max_c: 2, rel_humidity_pct: 3, wind_ms: 1, "
                        + "utc_offset: Z}"))), "gives both 'file' and 'synthetic'");
        assertContains(only(problems(MINIMAL.replace("file: weather.csv", "synthetic: {t_min_c: 30, "
                + "t_max_c: 20, rel_humidity_pct: 45, wind_ms: 1, utc_offset: \"+25:00\"}")).stream()
                .filter(s -> s.contains("utc_offset")).toList()), "not a UTC offset");
        assertContains(only(problems(MINIMAL.replace("end: 2026-07-14", "end: 2026-07-14\n  end: 2026-07-15"))),
                "period.end", "key given twice");
        assertContains(only(problems("name: [unclosed\n")), "not valid YAML", "line");
        assertContains(only(problems("")), "empty");
    }

    @Test
    void allErrorsAreCollectedTogether() {
        String text = MINIMAL
                .replace("outputs:", "ouputs_extra: 1\noutputs:")
                .replace("end: 2026-07-14", "end: 2026-07-01")
                .replace("maps: [peak, mean]", "maps: [peak, maen]")
                + "physics: {timestep_minutes: 7}\ntiling: {tile_size: 100}\n";
        RunFileException e = assertThrows(RunFileException.class, () -> parse(text));
        List<String> ps = e.problems();
        assertEquals(5, ps.size(), ps::toString);
        String all = String.join("\n", ps);
        assertContains(all, "ouputs_extra", "period.end", "outputs.maps[1]", "did you mean 'mean'?",
                "physics.timestep_minutes", "tiling.tile_size");
        assertContains(e.getMessage(), "run file run.yaml: 5 problems");
        for (String p : ps) {
            assertTrue(p.startsWith("run.yaml line "), p);
        }
    }

    @Test
    void missingFileIsAClearError(@TempDir Path tmp) {
        RunFileException e = assertThrows(RunFileException.class,
                () -> RunFileReader.read(tmp.resolve("nope.yaml")));
        assertContains(only(e.problems()), "nope.yaml", "no such file");
    }
}
