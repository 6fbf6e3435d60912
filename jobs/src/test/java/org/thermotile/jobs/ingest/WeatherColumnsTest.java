package org.thermotile.jobs.ingest;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.demo.FootprintsExample;
import org.thermotile.jobs.io.weather.GapFill;
import org.thermotile.jobs.io.weather.WeatherCsv;
import org.thermotile.jobs.io.weather.WeatherRead;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.HourlyWeather;
import org.thermotile.model.forcing.Site;
import picocli.CommandLine;

class WeatherColumnsTest {
    @TempDir
    Path dir;

    static final Path DEMO = FootprintRasteriserTest.demoFolder();

    static final String MAPPING = """
              columns:
                time: Observed at
                air_temperature: Temp (F)
                relative_humidity: RH %
                wind_speed: Wind km/h
                ghi: Global W/m2
                dni: Beam W/m2
                dhi: Diffuse W/m2
                cloud_cover: Cloud %
                pressure: Station kPa
              units: {air_temperature: degF, wind_speed: km/h, cloud_cover: "%", pressure: kPa}
              time_format: "dd/MM/yyyy HH:mm"
              utc_offset: "+02:00"
            """;

    /** A one-day run file on the demo land cover (no heights), with the weather section {@code weather}. */
    Path runFile(String name, String weather) throws Exception {
        Path rf = dir.resolve(name + ".yaml");
        Files.writeString(rf, "name: " + name + "\n"
                + "site: {latitude: 45.1436, longitude: 9.0229, elevation_m: 70}\n"
                + "inputs:\n  land_cover: " + DEMO.resolve("landcover.tif") + "\n  classes: "
                + DEMO.resolve("classes.yaml") + "\n"
                + "weather:\n" + weather
                + "period: {start: 2026-07-14, end: 2026-07-14, spin_up_days: 1}\n"
                + "outputs: {maps: [peak]}\n");
        return rf;
    }

    Path mappedDemoWeather() throws Exception {
        Path w = dir.resolve("weather-mapped.csv");
        FootprintsExample.writeMappedWeather(DEMO.resolve("weather.csv"), w);
        return w;
    }

    /**
     * The demo weather rewritten with other names, °F, km/h, kPa and cloud in % (exact decimal conversions,
     * NIST SP 811 (2008) App. B) and read back through the run file's mapping gives, bit for bit, the
     * weather and the prepared forcing of the file in our own layout.
     */
    @Test
    void mappedWeatherGivesTheSameForcingAsOurLayout() throws Exception {
        Path mapped = mappedDemoWeather();
        PreparedRun ours = RunPreparer.prepare(RunFileReader.read(runFile("ours",
                "  file: " + DEMO.resolve("weather.csv") + "\n")));
        PreparedRun theirs = RunPreparer.prepare(RunFileReader.read(runFile("theirs",
                "  file: " + mapped + "\n" + MAPPING)));
        Forcing a = ours.spec().forcing();
        Forcing b = theirs.spec().forcing();
        assertArrayEquals(a.epochSecond, b.epochSecond);
        assertEquals(a.utcOffsetSeconds, b.utcOffsetSeconds);
        assertArrayEquals(a.airTempK, b.airTempK);
        assertArrayEquals(a.specificHumidity, b.specificHumidity);
        assertArrayEquals(a.windMs, b.windMs);
        assertArrayEquals(a.pressurePa, b.pressurePa);
        assertArrayEquals(a.ghiWm2, b.ghiWm2);
        assertArrayEquals(a.beamHorizontalWm2, b.beamHorizontalWm2);
        assertArrayEquals(a.diffuseHorizontalWm2, b.diffuseHorizontalWm2);
        assertArrayEquals(a.skyLongwaveWm2, b.skyLongwaveWm2);
        assertEquals(ours.spec().settings().deepGroundK(), theirs.spec().settings().deepGroundK());
        assertTrue(theirs.notes().stream().anyMatch(n -> n.contains("air_temperature ← 'Temp (F)' [degF]")),
                theirs.notes().toString());
    }

    /** Conversion factors: NIST SP 811 (2008), App. B.8 (mph, knot, km/h) and B.9 (°F, K); hPa = 100 Pa. */
    @Test
    void unitConversionsFollowNistSp811() {
        assertEquals(100.0, conv("air_temperature", "degF", 212), 1e-12);
        assertEquals(0.0, conv("air_temperature", "°F", 32), 1e-12);
        assertEquals(-40.0, conv("air_temperature", "F", -40), 1e-12);
        assertEquals(0.0, conv("air_temperature", "K", 273.15), 1e-12);
        assertEquals(0.44704, conv("wind_speed", "mph", 1), 1e-15);
        assertEquals(0.514444, conv("wind_speed", "knots", 1), 1e-6);
        assertEquals(10.0, conv("wind_speed", "km/h", 36), 1e-12);
        assertEquals(1013.25, conv("pressure", "kPa", 101.325), 1e-9);
        assertEquals(1013.25, conv("pressure", "Pa", 101325), 1e-9);
        assertEquals(45.0, conv("relative_humidity", "fraction", 0.45), 1e-12);
        assertEquals(0.375, conv("cloud_cover", "okta", 3), 1e-15);
    }

    static double conv(String field, String unit, double v) {
        var m = new org.thermotile.jobs.config.RunFile.WeatherMapping(java.util.Map.of(field, "x"),
                java.util.Map.of(field, unit), null, null, null);
        return WeatherColumns.units(m, "run.yaml").get(field).toOurs().applyAsDouble(v);
    }

    /**
     * Kasten &amp; Czeplak (1980): G/G_clear = 1 − 0.75 (N/8)^3.4; overcast (8 oktas) gives 0.25, 4 oktas
     * 1 − 0.75 · 0.5^3.4 = 0.92896 (hand-worked); clear is the Bird clear sky itself.
     */
    @Test
    void cloudCoverEstimateFollowsKastenCzeplak() {
        Site site = new Site(45.1436, 9.0229, 70);
        long noon = java.time.OffsetDateTime.parse("2026-07-14T13:00+02:00").toEpochSecond();
        double[] s = new double[3], c = new double[3];
        double clear = WeatherColumns.ghi(noon, site, 100_000, 303, 0, s, c);
        assertTrue(clear > 800 && clear < 1000, "clear-sky noon GHI " + clear);
        assertEquals(0.25 * clear, WeatherColumns.ghi(noon, site, 100_000, 303, 1.0, s, c), 1e-9);
        assertEquals((1 - 0.75 * Math.pow(0.5, 3.4)) * clear, WeatherColumns.ghi(noon, site, 100_000, 303, 0.5, s, c),
                1e-9);
        assertEquals(0.92896, WeatherColumns.ghi(noon, site, 100_000, 303, 0.5, s, c) / clear, 1e-5);
    }

    /** With estimate_ghi, the file needs no irradiance column; the notes say what was estimated and how. */
    @Test
    void ghiEstimatedFromCloudCoverIsReported() throws Exception {
        Path f = dir.resolve("w.csv");
        Files.writeString(f, "when,T,H,V,N\n2026-07-14T12:00,30,40,2,4\n2026-07-14T13:00,31,38,2,8\n");
        var m = new org.thermotile.jobs.config.RunFile.WeatherMapping(
                new java.util.LinkedHashMap<>(java.util.Map.of("time", "when", "air_temperature", "T",
                        "relative_humidity", "H", "wind_speed", "V", "cloud_cover", "N")),
                java.util.Map.of("cloud_cover", "okta"), java.time.ZoneOffset.ofHours(2), null, "cloud_cover");
        WeatherRead r = WeatherColumns.read(f, m, "run.yaml", new Site(45.1436, 9.0229, 70), GapFill.none());
        HourlyWeather w = r.weather();
        assertEquals(2, w.ghiWm2.length);
        assertTrue(w.ghiWm2[1] > 0 && w.ghiWm2[0] > w.ghiWm2[1], java.util.Arrays.toString(w.ghiWm2));
        assertTrue(r.notes().stream().anyMatch(n -> n.contains("ghi estimated for 2 hours")
                && n.contains("Kasten & Czeplak (1980)")), r.notes().toString());
    }

    /** Runs {@code thermotile run} and returns the error text after asserting status 2 and nothing written. */
    String runFails(Path rf) {
        Path out = dir.resolve("out");
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setErr(new PrintWriter(err));
        int status = Main.executeWith(cl, "run", rf.toString(), "--out", out.toString(), "--quiet");
        assertEquals(Main.BAD_INPUT, status, err.toString());
        assertFalse(Files.exists(out), "no output folder");
        return err.toString();
    }

    @Test
    void aMappedColumnMissingFromTheHeaderIsRefused() throws Exception {
        Path mapped = mappedDemoWeather();
        String msg = runFails(runFile("bad", "  file: " + mapped + "\n" + MAPPING.replace("Temp (F)", "Temp F")));
        assertTrue(msg.contains("weather.columns.air_temperature") && msg.contains("'Temp F'"), msg);
        assertTrue(msg.contains(mapped.toString()) && msg.contains("line 3"), msg);
        assertTrue(msg.contains("did you mean 'Temp (F)'") && msg.contains(FootprintsExample.MAPPED_HEADER
                .replace(",", ", ")), msg);
    }

    @Test
    void anUnknownUnitIsRefused() throws Exception {
        Path mapped = mappedDemoWeather();
        String msg = runFails(runFile("bad", "  file: " + mapped + "\n" + MAPPING.replace("km/h", "kmph")));
        assertTrue(msg.contains("weather.units.wind_speed") && msg.contains("'kmph'"), msg);
        assertTrue(msg.contains("m/s, km/h, mph, knots"), msg);
    }

    @Test
    void aValueOutOfRangeAfterConversionNamesTheLineAndTheMappedColumn() throws Exception {
        Path mapped = mappedDemoWeather();
        List<String> lines = new java.util.ArrayList<>(Files.readAllLines(mapped));
        lines.set(5, lines.get(5).replaceFirst(",[0-9.]+,", ",212.0,"));   // 100 °C
        Files.write(mapped, lines);
        String msg = runFails(runFile("bad", "  file: " + mapped + "\n" + MAPPING));
        assertTrue(msg.contains("line 6") && msg.contains("Temp (F)") && msg.contains("degF"), msg);
    }

    @Test
    void localTimesWithoutOffsetNeedUtcOffset() throws Exception {
        Path mapped = mappedDemoWeather();
        String msg = runFails(runFile("bad", "  file: " + mapped + "\n" + MAPPING.replace("  utc_offset: \"+02:00\"\n", "")));
        assertTrue(msg.contains("weather.utc_offset") && msg.contains("line 4"), msg);
    }

    /** Our own reader on the same file, as a sanity check of the generator's exact decimal conversion. */
    @Test
    void generatorWritesExactConversions() throws Exception {
        HourlyWeather ours = WeatherCsv.read(DEMO.resolve("weather.csv")).weather();
        List<String> lines = Files.readAllLines(mappedDemoWeather());
        String[] first = lines.get(3).split(",", -1);
        assertEquals("11/07/2026 00:00", first[0]);
        assertEquals((ours.airTempK[0] - 273.15) * 1.8 + 32, Double.parseDouble(first[1]), 1e-9);
        assertEquals(ours.windMs[0] * 3.6, Double.parseDouble(first[3]), 1e-9);
    }
}
