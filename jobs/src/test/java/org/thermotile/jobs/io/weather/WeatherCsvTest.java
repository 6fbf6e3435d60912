package org.thermotile.jobs.io.weather;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.StringReader;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.thermotile.model.forcing.HourlyWeather;

/**
 * The weather file reader and writer. Expected values are worked by hand from the file text:
 * unit conversions by their definitions (T/K = t/°C + 273.15, SI Brochure 9th ed. 2019; 1 hPa =
 * 100 Pa and 1 % = 0.01 by the SI prefix and percent definitions), filled values by the
 * definition of linear interpolation.
 */
class WeatherCsvTest {
    private static final String SRC = "w.csv";
    private static final String HEADER = "time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2\n";

    private static WeatherRead read(String text) {
        return read(text, GapFill.none());
    }

    private static WeatherRead read(String text, GapFill fill) {
        try {
            return WeatherCsv.read(new StringReader(text), SRC, fill);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static WeatherCsvException fails(String text) {
        return fails(text, GapFill.none());
    }

    private static WeatherCsvException fails(String text, GapFill fill) {
        return assertThrows(WeatherCsvException.class, () -> WeatherCsv.read(new StringReader(text), SRC, fill));
    }

    /** Asserts the error's place and that its message names the file, the line and the column. */
    private static void assertPlace(WeatherCsvException e, int line, String column) {
        assertEquals(SRC, e.source(), e.getMessage());
        assertEquals(line, e.line(), e.getMessage());
        assertEquals(column, e.column(), e.getMessage());
        assertTrue(e.getMessage().startsWith(SRC + ", line " + line + (column == null ? "" : ", column " + column)),
                e.getMessage());
        assertTrue(e.getMessage().contains("Fix: "), e.getMessage());
    }

    private static String text(WeatherCsvException e) {
        return e.getMessage();
    }

    private static long epoch(String iso) {
        return OffsetDateTime.parse(iso).toEpochSecond();
    }

    private static String write(HourlyWeather w) {
        StringWriter s = new StringWriter();
        try {
            WeatherCsv.write(w, s);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return s.toString();
    }

    /** {@code n} rows from 2026-07-14T00:00+02:00, air 20 °C + hour, RH 50 %, wind 2, GHI 0. */
    private static String hours(int n) {
        StringBuilder s = new StringBuilder(HEADER);
        for (int h = 0; h < n; h++) {
            s.append(String.format("2026-07-14T%02d:00+02:00,%d,50,2,0\n", h, 20 + h));
        }
        return s.toString();
    }

    // ------------------------------------------------------------------------- happy path

    @Test
    void convertsFileUnitsToSi() {
        HourlyWeather w = read("time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2,dni_wm2,dhi_wm2,sky_lw_wm2,"
                + "cloud_fraction,pressure_hpa\n"
                + "2026-07-14T13:00+02:00,25,55,3.5,800.5,650,120,410,0.25,1013.25\n").weather();
        assertEquals(1, w.hours());
        assertEquals(epoch("2026-07-14T11:00Z"), w.epochSecond[0]);
        assertEquals(7200, w.utcOffsetSeconds);
        assertEquals(298.15, w.airTempK[0], 1e-12);        // 25 °C + 273.15
        assertEquals(0.55, w.relHumidity[0], 1e-15);       // 55 % / 100
        assertEquals(3.5, w.windMs[0], 0);
        assertEquals(800.5, w.ghiWm2[0], 0);
        assertEquals(650, w.dniWm2[0], 0);
        assertEquals(120, w.dhiWm2[0], 0);
        assertEquals(410, w.skyLongwaveWm2[0], 0);
        assertEquals(0.25, w.cloudFraction[0], 0);
        assertEquals(101325.0, w.pressurePa[0], 1e-9);     // 1013.25 hPa × 100
    }

    @Test
    void headerIsCaseInsensitiveAndInAnyOrder() {
        HourlyWeather w = read("GHI_WM2, Wind_ms ,Time,REL_HUMIDITY_PCT,air_temp_C\n"
                + "100,4,2026-07-14T13:00Z,40,30\n").weather();
        assertEquals(303.15, w.airTempK[0], 1e-12);
        assertEquals(0.40, w.relHumidity[0], 1e-15);
        assertEquals(4, w.windMs[0], 0);
        assertEquals(100, w.ghiWm2[0], 0);
        assertEquals(0, w.utcOffsetSeconds);
    }

    @Test
    void commentsBlankLinesBomAndCrlfAreSkippedButCounted() {
        String text = "\uFEFF# invented test data\r\n\r\n" + "time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2\r\n"
                + "  # a comment between rows\r\n" + "2026-07-14T00:00+02:00,20,50,2,0\r\n"
                + "2026-07-14T01:00+02:00,21,50,2,0\r\n";
        HourlyWeather w = read(text).weather();
        assertEquals(2, w.hours());
        assertEquals(294.15, w.airTempK[1], 1e-12);
        // line 7 is the first bad line: line numbers count the comment, blank and BOM lines
        WeatherCsvException e = fails(text + "2026-07-14T02:00+02:00,x,50,2,0\r\n");
        assertPlace(e, 7, "air_temp_c");
    }

    @Test
    void missingOptionalColumnsAreAbsentAndEmptyOptionalCellsAreNotGiven() {
        WeatherRead r = read(hours(2));
        HourlyWeather w = r.weather();
        for (double[] a : new double[][] {w.dniWm2, w.dhiWm2, w.skyLongwaveWm2, w.cloudFraction, w.pressurePa}) {
            assertTrue(Double.isNaN(a[0]) && Double.isNaN(a[1]));
        }
        assertEquals(List.of(), r.notes());

        WeatherRead p = read(HEADER.strip() + ",pressure_hpa,cloud_fraction\n"
                + "2026-07-14T00:00+02:00,20,50,2,0,1000,\n" + "2026-07-14T01:00+02:00,20,50,2,0,,0.5\n");
        assertEquals(100000.0, p.weather().pressurePa[0], 1e-9);
        assertTrue(Double.isNaN(p.weather().pressurePa[1]));
        assertTrue(Double.isNaN(p.weather().cloudFraction[0]));
        assertEquals(0.5, p.weather().cloudFraction[1], 0);
        assertEquals(2, p.notes().size(), p.notes().toString());
        assertTrue(p.notes().get(0).contains("cloud_fraction: 1 of 2 rows empty"), p.notes().toString());
    }

    @Test
    void rangeLimitsThemselvesAreAccepted() {
        HourlyWeather w = read("time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2,dni_wm2,dhi_wm2,sky_lw_wm2,"
                + "cloud_fraction,pressure_hpa\n"
                + "2026-07-14T00:00+02:00,-60,0,0,0,0,0,50,0,500\n"
                + "2026-07-14T01:00+02:00,60,100,75,1400,1400,900,600,1,1100\n").weather();
        assertEquals(213.15, w.airTempK[0], 1e-12);
        assertEquals(333.15, w.airTempK[1], 1e-12);
        assertEquals(110000.0, w.pressurePa[1], 1e-9);
    }

    @Test
    void writeReadWriteRoundTripIsExactToThePrintedPrecision() {
        long t0 = epoch("2026-07-14T00:00+02:00");
        double nan = Double.NaN;
        HourlyWeather w = new HourlyWeather(new long[] {t0, t0 + 3600, t0 + 7200}, 7200,
                new double[] {293.15, 300.0, 305.123}, new double[] {0.553, 0.12344, 1.0},
                new double[] {0.0, 3.456, 12.0}, new double[] {0.0, 512.34, 1000.0},
                new double[] {nan, 400.0, 850.06}, new double[] {nan, nan, 110.0},
                HourlyWeather.absent(3), new double[] {0.0, 0.1234, 1.0},
                new double[] {101325.0, 100012.3, 95000.0});
        String text = write(w);
        // Hand-converted: 300.0 K − 273.15 = 26.85 °C; 305.123 K → 31.973 → 31.97; 0.12344 → 12.344 % → 12.34;
        // 100012.3 Pa → 1000.123 hPa → 1000.12; sky longwave has no value so its column is left out.
        assertEquals("time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2,dni_wm2,dhi_wm2,cloud_fraction,pressure_hpa\n"
                + "2026-07-14T00:00+02:00,20.00,55.30,0.00,0.0,,,0.000,1013.25\n"
                + "2026-07-14T01:00+02:00,26.85,12.34,3.46,512.3,400.0,,0.123,1000.12\n"
                + "2026-07-14T02:00+02:00,31.97,100.00,12.00,1000.0,850.1,110.0,1.000,950.00\n", text);

        HourlyWeather back = read(text).weather();
        assertArrayEquals(w.epochSecond, back.epochSecond);
        assertEquals(w.utcOffsetSeconds, back.utcOffsetSeconds);
        // values read back equal the originals to within half the last printed digit
        assertArrayEquals(w.airTempK, back.airTempK, 0.005 + 1e-9);
        assertArrayEquals(w.relHumidity, back.relHumidity, 0.00005 + 1e-12);
        assertArrayEquals(w.windMs, back.windMs, 0.005 + 1e-12);
        assertArrayEquals(w.ghiWm2, back.ghiWm2, 0.05 + 1e-9);
        assertArrayEquals(w.dniWm2, back.dniWm2, 0.05 + 1e-9);
        assertArrayEquals(w.dhiWm2, back.dhiWm2, 0.05 + 1e-9);
        assertArrayEquals(w.skyLongwaveWm2, back.skyLongwaveWm2, 0);
        assertArrayEquals(w.cloudFraction, back.cloudFraction, 0.0005 + 1e-12);
        assertArrayEquals(w.pressurePa, back.pressurePa, 0.5 + 1e-9);
        assertTrue(Double.isNaN(back.dniWm2[0]) && Double.isNaN(back.dhiWm2[1]));
        // and the text is a fixed point: writing what was read gives the same bytes
        assertEquals(text, write(back));
    }

    @Test
    void writesToAFileWithCommentsAndReadsItBack(@TempDir Path dir) throws IOException {
        HourlyWeather w = read(hours(3)).weather();
        Path file = dir.resolve("out.csv");
        WeatherCsv.write(w, file, List.of("invented test data"));
        String text = Files.readString(file, StandardCharsets.UTF_8);
        assertTrue(text.startsWith("# invented test data\ntime,"), text);
        assertFalse(Files.exists(dir.resolve("out.csv.tmp")));
        WeatherRead back = WeatherCsv.read(file);
        assertEquals(file.toString(), back.source());
        assertArrayEquals(w.airTempK, back.weather().airTempK, 1e-9);
    }

    @Test
    void timesNeedNotBeOnTheFullHourAndSecondsArePrinted() {
        HourlyWeather w = read(HEADER + "2026-07-14T00:30:15+05:30,20,50,2,0\n2026-07-14T01:30:15+05:30,20,50,2,0\n")
                .weather();
        assertEquals(19800, w.utcOffsetSeconds);
        assertTrue(write(w).contains("\n2026-07-14T01:30:15+05:30,20.00,"), write(w));
    }

    @Test
    void exampleWeekInDataSamplesIsReadable() throws IOException {
        Path p = Path.of("../data-samples/weather/example-hot-week.csv");
        if (!Files.exists(p)) {
            p = Path.of("data-samples/weather/example-hot-week.csv");
        }
        WeatherRead r = WeatherCsv.read(p);
        HourlyWeather w = r.weather();
        assertEquals(7 * 24, w.hours());
        assertEquals(7200, w.utcOffsetSeconds);
        assertEquals(epoch("2026-07-13T00:00+02:00"), w.epochSecond[0]);
        assertTrue(Double.isNaN(w.dniWm2[0]) && !Double.isNaN(w.cloudFraction[0]) && !Double.isNaN(w.pressurePa[0]));
        assertEquals(List.of(), r.notes());
        HourlyWeather again = read(write(w)).weather();
        assertArrayEquals(w.airTempK, again.airTempK, 1e-9);
        assertArrayEquals(w.ghiWm2, again.ghiWm2, 1e-9);
    }

    // ------------------------------------------------------------------------------ header

    @Test
    void unknownColumnSuggestsTheNearestName() {
        WeatherCsvException e = fails("# c\ntime,air_temp,rel_humidity_pct,wind_ms,ghi_wm2\n");
        assertPlace(e, 2, "air_temp");
        assertTrue(text(e).contains("unknown column \"air_temp\""), text(e));
        assertTrue(text(e).contains("did you mean \"air_temp_c\"?"), text(e));

        WeatherCsvException f = fails(HEADER.strip() + ",pressure_pa\n");
        assertTrue(text(f).contains("did you mean \"pressure_hpa\"?"), text(f));

        WeatherCsvException g = fails(HEADER.strip() + ",visibility_km\n");
        assertPlace(g, 1, "visibility_km");
        assertFalse(text(g).contains("did you mean"), text(g));
        assertTrue(text(g).contains("the columns are time, air_temp_c, rel_humidity_pct"), text(g));
    }

    @Test
    void missingRequiredColumnIsNamed() {
        WeatherCsvException e = fails("time,air_temp_c,wind_ms\n2026-07-14T00:00+02:00,20,2\n");
        assertPlace(e, 1, "rel_humidity_pct, ghi_wm2");
        assertTrue(text(e).contains("lacks the required columns rel_humidity_pct, ghi_wm2"), text(e));
    }

    @Test
    void duplicateAndEmptyHeaderCellsAreErrors() {
        WeatherCsvException e = fails(HEADER.strip() + ",Wind_MS\n");
        assertPlace(e, 1, "wind_ms");
        assertTrue(text(e).contains("appears twice in the header (cells 4 and 6)"), text(e));

        WeatherCsvException f = fails(HEADER.strip() + ",\n");
        assertPlace(f, 1, "#6");
        assertTrue(text(f).contains("header cell 6 is empty"), text(f));
    }

    @Test
    void emptyFileAndHeaderOnlyAreErrors() {
        assertEquals(0, fails("# only a comment\n\n").line());
        WeatherCsvException e = fails("# c\n" + HEADER);
        assertEquals(2, e.line());
        assertTrue(text(e).contains("not followed by any hour"), text(e));
    }

    // -------------------------------------------------------------------------------- cells

    @Test
    void wrongCellCountNamesTheLineAndBothCounts() {
        WeatherCsvException e = fails(HEADER + "2026-07-14T00:00+02:00,20,50,2,0\n2026-07-14T01:00+02:00,20,5,0,2,0\n");
        assertPlace(e, 3, null);
        assertTrue(text(e).contains("the line has 6 cells but the header (line 1) has 5 columns"), text(e));
    }

    @Test
    void unparsableNumberNamesLineColumnAndValue() {
        WeatherCsvException e = fails(HEADER + "2026-07-14T00:00+02:00,20,50,2,0\n2026-07-14T01:00+02:00,20,50,2 m/s,0\n");
        assertPlace(e, 3, "wind_ms");
        assertTrue(text(e).contains("\"2 m/s\" is not a number"), text(e));

        for (String bad : new String[] {"NaN", "Infinity", "12d", "1e", "0x10", "--1"}) {
            String line = "2026-07-14T00:00+02:00," + bad + ",50,2,0\n";
            WeatherCsvException f = fails(HEADER + line);
            assertPlace(f, 2, "air_temp_c");
            assertTrue(text(f).contains("\"" + bad + "\" is not a number"), text(f));
        }
    }

    @Test
    void emptyRequiredCellIsAnError() {
        WeatherCsvException e = fails(HEADER + "2026-07-14T00:00+02:00,20,,2,0\n");
        assertPlace(e, 2, "rel_humidity_pct");
        assertTrue(text(e).contains("empty cell in a required column"), text(e));
    }

    @ParameterizedTest
    @CsvSource({
        "air_temp_c, 60.01, -60…60 °C", "air_temp_c, -61, -60…60 °C",
        "rel_humidity_pct, 100.5, 0…100 %", "rel_humidity_pct, -1, 0…100 %",
        "wind_ms, 75.1, 0…75 m/s", "wind_ms, -0.1, 0…75 m/s",
        "ghi_wm2, 1401, 0…1400 W/m²", "ghi_wm2, -2, 0…1400 W/m²",
        "dni_wm2, 1400.5, 0…1400 W/m²", "dhi_wm2, 901, 0…900 W/m²",
        "sky_lw_wm2, 49.9, 50…600 W/m²", "sky_lw_wm2, 601, 50…600 W/m²",
        "cloud_fraction, 1.01, 0…1", "cloud_fraction, -0.01, 0…1",
        "pressure_hpa, 499, 500…1100 hPa", "pressure_hpa, 101325, 500…1100 hPa",
    })
    void valuesOutsideThePhysicalRangeNameLineColumnValueAndRange(String column, String value, String range) {
        String[] base = {"2026-07-14T00:00+02:00", "20", "50", "2", "0"};
        String header = HEADER.strip();
        String row = String.join(",", base);
        switch (column) {
            case "air_temp_c" -> row = row.replaceFirst(",20,", "," + value + ",");
            case "rel_humidity_pct" -> row = row.replaceFirst(",50,", "," + value + ",");
            case "wind_ms" -> row = row.replaceFirst(",2,", "," + value + ",");
            case "ghi_wm2" -> row = row.substring(0, row.length() - 1) + value;
            default -> {
                header += "," + column;
                row += "," + value;
            }
        }
        String ok = "2026-07-13T23:00+02:00,20,50,2,0" + (header.equals(HEADER.strip()) ? "" : ",");
        WeatherCsvException e = fails(header + "\n" + ok + "\n" + row + "\n");
        assertPlace(e, 3, column);
        assertTrue(text(e).contains("\"" + value + "\" is outside the accepted range " + range), text(e));
    }

    // --------------------------------------------------------------------------------- time

    @Test
    void unparsableTimeAndTimeWithoutOffset() {
        WeatherCsvException e = fails(HEADER + "14.07.2026 13:00,20,50,2,0\n");
        assertPlace(e, 2, "time");
        assertTrue(text(e).contains("\"14.07.2026 13:00\" is not a time with offset"), text(e));
        assertTrue(text(e).contains("e.g. 2026-07-14T13:00+02:00"), text(e));

        WeatherCsvException f = fails(HEADER + "2026-07-14T13:00,20,50,2,0\n");
        assertPlace(f, 2, "time");
        assertTrue(text(f).contains("add the UTC offset"), text(f));
        assertTrue(text(f).contains("2026-07-14T13:00+02:00"), text(f));
    }

    @Test
    void mixedOffsetsAreAnErrorNamingBothOffsets() {
        // 02:00+01:00 is 03:00+02:00, the right next hour in instants: the offset alone is at fault
        WeatherCsvException e = fails(HEADER + "2026-07-14T01:00+02:00,20,50,2,0\n"
                + "2026-07-14T02:00+02:00,20,50,2,0\n" + "2026-07-14T02:00+01:00,20,50,2,0\n");
        assertPlace(e, 4, "time");
        assertTrue(text(e).contains("has UTC offset +01:00 but the first time (\"2026-07-14T01:00+02:00\", line 2) has +02:00"),
                text(e));
        assertTrue(text(e).contains("in +02:00 this time is 2026-07-14T03:00+02:00"), text(e));
    }

    @Test
    void duplicateDecreasingAndNonHourlyTimes() {
        String first = HEADER + "2026-07-14T05:00+02:00,20,50,2,0\n";
        WeatherCsvException dup = fails(first + "2026-07-14T05:00+02:00,21,50,2,0\n");
        assertPlace(dup, 3, "time");
        assertTrue(text(dup).contains("duplicate time \"2026-07-14T05:00+02:00\", already on line 2"), text(dup));

        WeatherCsvException back = fails(first + "2026-07-14T04:00+02:00,21,50,2,0\n");
        assertPlace(back, 3, "time");
        assertTrue(text(back).contains("is earlier than 2026-07-14T05:00+02:00 on line 2"), text(back));

        assertTrue(text(back).contains("the hours are out of order"), text(back));
        assertTrue(text(back).contains("sort the rows by time"), text(back));

        // Two hours swapped: the forward jump on line 3 is not reported as a missing hour, the row
        // that comes back (line 4) is the one named.
        WeatherCsvException swapped = fails(first + "2026-07-14T07:00+02:00,21,50,2,0\n"
                + "2026-07-14T06:00+02:00,21,50,2,0\n2026-07-14T08:00+02:00,21,50,2,0\n");
        assertPlace(swapped, 4, "time");
        assertTrue(text(swapped).contains("the hours are out of order: \"2026-07-14T06:00+02:00\" is earlier than "
                + "2026-07-14T07:00+02:00 on line 3"), text(swapped));
        assertFalse(text(swapped).contains("missing"), text(swapped));
        // A block moved later: the row that goes back is found past the rows in order after the
        // jump, across a comment.
        WeatherCsvException moved = fails(first + "2026-07-14T08:00+02:00,21,50,2,0\n"
                + "2026-07-14T09:00+02:00,21,50,2,0\n# block\n2026-07-14T06:00+02:00,21,50,2,0\n"
                + "2026-07-14T07:00+02:00,21,50,2,0\n");
        assertPlace(moved, 6, "time");
        assertTrue(text(moved).contains("\"2026-07-14T06:00+02:00\" is earlier than 2026-07-14T09:00+02:00 on line 4"),
                text(moved));
        // A true gap (no row comes back) stays a gap, named where it is.
        WeatherCsvException gap = fails(first + "2026-07-14T07:00+02:00,21,50,2,0\n"
                + "2026-07-14T08:00+02:00,21,50,2,0\n");
        assertPlace(gap, 3, "time");
        assertTrue(text(gap).contains("1 hour missing between 2026-07-14T05:00+02:00 (line 2)"), text(gap));

        WeatherCsvException half = fails(first + "2026-07-14T05:30+02:00,21,50,2,0\n");
        assertPlace(half, 3, "time");
        assertTrue(text(half).contains("is 30 min after 2026-07-14T05:00+02:00"), text(half));
        assertTrue(text(half).contains("resample to one row per hour"), text(half));

        WeatherCsvException fraction = fails(first + "2026-07-14T06:00:00.5+02:00,21,50,2,0\n");
        assertPlace(fraction, 3, "time");
    }

    // ---------------------------------------------------------------------------------- gaps

    private static final String GAP = HEADER.strip() + ",dni_wm2,pressure_hpa\n"
            + "2026-07-14T02:00+02:00,20,40,1,0,,1000\n"
            + "2026-07-14T03:00+02:00,20,40,1,0,,1000\n"
            + "2026-07-14T06:00+02:00,23,70,4,300,600,1003\n"   // 04:00 and 05:00 missing
            + "2026-07-14T07:00+02:00,24,70,4,400,700,1003\n";

    @Test
    void missingHourIsAnErrorNamingTheSurroundingTimes() {
        WeatherCsvException e = fails(GAP);
        assertPlace(e, 4, "time");
        assertTrue(text(e).contains("2 hours missing between 2026-07-14T03:00+02:00 (line 3) and 2026-07-14T06:00+02:00"),
                text(e));
        assertTrue(text(e).contains("allow linear gap filling of at least 2 hours"), text(e));
    }

    @Test
    void linearGapFillInterpolatesInTime() {
        WeatherRead r = read(GAP, GapFill.linear(2));
        HourlyWeather w = r.weather();
        assertEquals(6, w.hours());
        assertEquals(2, r.filledHours());
        assertEquals(epoch("2026-07-14T04:00+02:00"), w.epochSecond[2]);
        assertEquals(epoch("2026-07-14T05:00+02:00"), w.epochSecond[3]);
        // by hand, x₀ + (x₁ − x₀)·k/3 for k = 1, 2 between 03:00 and 06:00:
        // air 20 → 23 °C gives 21, 22 °C; RH 40 → 70 % gives 50, 60 %; wind 1 → 4 gives 2, 3;
        // GHI 0 → 300 gives 100, 200; pressure 1000 → 1003 hPa gives 1001, 1002 hPa.
        assertEquals(21 + 273.15, w.airTempK[2], 1e-9);
        assertEquals(22 + 273.15, w.airTempK[3], 1e-9);
        assertEquals(0.50, w.relHumidity[2], 1e-12);
        assertEquals(0.60, w.relHumidity[3], 1e-12);
        assertEquals(2.0, w.windMs[2], 1e-12);
        assertEquals(3.0, w.windMs[3], 1e-12);
        assertEquals(100.0, w.ghiWm2[2], 1e-9);
        assertEquals(200.0, w.ghiWm2[3], 1e-9);
        assertEquals(100100.0, w.pressurePa[2], 1e-6);
        assertEquals(100200.0, w.pressurePa[3], 1e-6);
        // DNI is not given at 03:00, so it stays not given in the gap
        assertTrue(Double.isNaN(w.dniWm2[2]) && Double.isNaN(w.dniWm2[3]));
        assertEquals(600.0, w.dniWm2[4], 0);
        // rows that were in the file are untouched
        assertEquals(23 + 273.15, w.airTempK[4], 1e-12);
        assertTrue(r.notes().get(0).startsWith("filled 2 missing hours between 2026-07-14T03:00+02:00 (line 3) and "
                + "2026-07-14T06:00+02:00 (line 4)"), r.notes().toString());
    }

    @Test
    void gapLongerThanTheFillLimitStillFails() {
        WeatherCsvException e = fails(GAP, GapFill.linear(1));
        assertPlace(e, 4, "time");
        assertTrue(text(e).contains("2 hours missing between 2026-07-14T03:00+02:00"), text(e));
        assertTrue(text(e).contains("gaps are filled up to 1 hour only"), text(e));
    }

    @Test
    void gapFillOptionChecksItsArgument() {
        assertThrows(IllegalArgumentException.class, () -> GapFill.linear(0));
        assertThrows(IllegalArgumentException.class, () -> new GapFill(-1));
        assertTrue(GapFill.none().isNone());
    }

    // ----------------------------------------------------------------------------- coverage

    private static Instant at(String iso) {
        return OffsetDateTime.parse(iso).toInstant();
    }

    @Test
    void coverageAcceptsAPeriodInsideAndSlicesIt() {
        WeatherRead r = read(hours(10)); // 00:00 … 09:00 +02:00
        r.requireCovers(at("2026-07-14T00:00+02:00"), at("2026-07-14T09:00+02:00"));
        HourlyWeather s = r.slice(at("2026-07-14T02:00+02:00"), at("2026-07-14T05:00+02:00"));
        assertEquals(4, s.hours());
        assertEquals(epoch("2026-07-14T02:00+02:00"), s.epochSecond[0]);
        assertEquals(25 + 273.15, s.airTempK[3], 1e-12);
        // a period off the hour takes the hours around it: 02:30 … 05:10 needs 02:00 … 06:00
        HourlyWeather u = r.slice(at("2026-07-14T02:30+02:00"), at("2026-07-14T05:10+02:00"));
        assertEquals(5, u.hours());
        assertEquals(epoch("2026-07-14T02:00+02:00"), u.epochSecond[0]);
        assertEquals(epoch("2026-07-14T06:00+02:00"), u.epochSecond[4]);
        // UTC instants work the same way
        assertEquals(2, r.slice(at("2026-07-14T00:00Z"), at("2026-07-14T00:00:01Z")).hours());
    }

    @Test
    void coverageErrorsNameWhatIsAvailableAndWhatWasAsked() {
        WeatherRead r = read(hours(10));
        WeatherCsvException early = assertThrows(WeatherCsvException.class,
                () -> r.requireCovers(at("2026-07-13T23:00+02:00"), at("2026-07-14T05:00+02:00")));
        assertEquals(SRC, early.source());
        assertTrue(text(early).contains("covers 2026-07-14T00:00+02:00 … 2026-07-14T09:00+02:00 (10 hours)"), text(early));
        assertTrue(text(early).contains("period asked for is 2026-07-13T23:00+02:00 … 2026-07-14T05:00+02:00"), text(early));
        assertTrue(text(early).contains("it starts 1 h after the period starts"), text(early));

        WeatherCsvException late = assertThrows(WeatherCsvException.class,
                () -> r.slice(at("2026-07-14T01:00+02:00"), at("2026-07-14T12:00+02:00")));
        assertTrue(text(late).contains("it ends 3 h before the period ends"), text(late));

        assertThrows(IllegalArgumentException.class,
                () -> r.requireCovers(at("2026-07-14T05:00+02:00"), at("2026-07-14T05:00+02:00")));
    }

    // ------------------------------------------------------------------------------- writer

    @Test
    void writerRefusesWhatTheReaderWouldRefuse() {
        long t0 = epoch("2026-07-14T00:00+02:00");
        double[] one = {0.5};
        HourlyWeather noTemp = new HourlyWeather(new long[] {t0}, 7200, new double[] {Double.NaN}, one, one, one,
                HourlyWeather.absent(1), HourlyWeather.absent(1), HourlyWeather.absent(1), HourlyWeather.absent(1),
                HourlyWeather.absent(1));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> write(noTemp));
        assertTrue(e.getMessage().contains("hour 0 (2026-07-14T00:00+02:00), column air_temp_c"), e.getMessage());

        // 60.006 °C prints as 60.01 °C, which the reader refuses, so the writer refuses it
        HourlyWeather hot = new HourlyWeather(new long[] {t0}, 7200, new double[] {60.006 + 273.15}, one, one, one,
                HourlyWeather.absent(1), HourlyWeather.absent(1), HourlyWeather.absent(1), HourlyWeather.absent(1),
                HourlyWeather.absent(1));
        IllegalArgumentException f = assertThrows(IllegalArgumentException.class, () -> write(hot));
        assertTrue(f.getMessage().contains("60.01 is outside the accepted range -60…60 °C"), f.getMessage());

        assertThrows(IllegalArgumentException.class,
                () -> WeatherCsv.write(read(hours(1)).weather(), new StringWriter(), List.of("two\nlines")));
    }

    @Test
    void missingFileIsNamed(@TempDir Path dir) {
        Path p = dir.resolve("nope.csv");
        WeatherCsvException e = assertThrows(WeatherCsvException.class, () -> WeatherCsv.read(p));
        assertEquals(p.toString(), e.source());
        assertTrue(e.getMessage().contains("no such file"), e.getMessage());
        assertNull(e.column());
    }

    @Test
    void editDistanceOfTheClassicExample() {
        // kitten → sitting takes 3 edits (the usual textbook example of Levenshtein distance, from memory)
        assertEquals(3, WeatherCsv.editDistance("kitten", "sitting"));
        assertEquals(0, WeatherCsv.editDistance("wind_ms", "wind_ms"));
        assertEquals(7, WeatherCsv.editDistance("", "wind_ms"));
    }
}
