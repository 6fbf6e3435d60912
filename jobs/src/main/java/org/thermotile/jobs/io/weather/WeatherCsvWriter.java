package org.thermotile.jobs.io.weather;

import java.io.BufferedReader;
import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.time.Instant;
import java.time.LocalDateTime;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.function.DoubleUnaryOperator;
import java.util.regex.Pattern;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.forcing.HourlyWeather;
import static org.thermotile.jobs.io.weather.WeatherCsvColumns.COLUMNS;
import static org.thermotile.jobs.io.weather.WeatherCsvColumns.TIME;

import org.thermotile.jobs.io.weather.WeatherCsvColumns.Column;

/** Writes hourly weather in the format of {@link WeatherCsv}. */
final class WeatherCsvWriter {
    private WeatherCsvWriter() {}

    // -------------------------------------------------------------------------------- write

    /** {@link #write(HourlyWeather, Writer, List)} with no comment lines. */
    public static void write(HourlyWeather weather, Writer out) throws IOException {
        write(weather, out, List.of());
    }

    /** {@link #write(HourlyWeather, Path, List)} with no comment lines. */
    public static void write(HourlyWeather weather, Path file) throws IOException {
        write(weather, file, List.of());
    }

    /**
     * Writes {@code weather} to {@code file} (UTF-8), through a temporary file beside it that is
     * moved into place when complete, so no half-written file is left behind.
     */
    public static void write(HourlyWeather weather, Path file, List<String> comments) throws IOException {
        Path abs = file.toAbsolutePath();
        Path tmp = abs.resolveSibling(abs.getFileName() + ".tmp");
        try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8)) {
            write(weather, w, comments);
        } catch (IOException | RuntimeException e) {
            Files.deleteIfExists(tmp);
            throw e;
        }
        Files.move(tmp, abs, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
    }

    /**
     * Writes {@code weather} in the format of the class comment: comment lines ({@code # } + text),
     * the header, one line per hour. SI values are converted to file units (t [°C] = T [K] −
     * 273.15, RH [%] = 100·RH, p [hPa] = p [Pa] / 100) and printed with fixed decimals, rounded
     * half up. Every printed value is checked against the reader's ranges, so what is written can
     * be read.
     *
     * @param comments lines written first as comments (no line breaks inside)
     * @throws IllegalArgumentException naming the hour, its time and the column when a required
     *                                  value is missing or not finite, or a value is outside its range
     */
    public static void write(HourlyWeather weather, Writer out, List<String> comments) throws IOException {
        int n = weather.hours();
        if (n == 0) {
            throw new IllegalArgumentException("weather to write has no hours");
        }
        ZoneOffset off = ZoneOffset.ofTotalSeconds(weather.utcOffsetSeconds);
        double[][] series = seriesOf(weather);
        boolean[] write = new boolean[COLUMNS.length];
        StringBuilder s = new StringBuilder(64 * (n + 1));
        for (String c : comments) {
            if (c.indexOf('\n') >= 0 || c.indexOf('\r') >= 0) {
                throw new IllegalArgumentException("a weather file comment must be one line: \"" + c + "\"");
            }
            s.append("# ").append(c).append('\n');
        }
        s.append(TIME);
        for (Column c : COLUMNS) {
            write[c.ordinal()] = c.required || anyValue(series[c.ordinal()]);
            if (write[c.ordinal()]) {
                s.append(',').append(c.header);
            }
        }
        s.append('\n');
        for (int h = 0; h < n; h++) {
            s.append(WeatherCsv.format(weather.epochSecond[h], off));
            for (Column c : COLUMNS) {
                if (!write[c.ordinal()]) {
                    continue;
                }
                s.append(',');
                double v = series[c.ordinal()][h];
                if (Double.isNaN(v) && !c.required) {
                    continue;
                }
                s.append(printed(c, v, h, weather.epochSecond[h], off));
            }
            s.append('\n');
        }
        out.write(s.toString());
        out.flush();
    }

    private static String printed(Column c, double siValue, int hour, long epochSecond, ZoneOffset off) {
        String where = "weather to write, hour " + hour + " (" + WeatherCsv.format(epochSecond, off) + "), column " + c.header;
        if (!Double.isFinite(siValue)) {
            throw new IllegalArgumentException(where + ": value " + siValue + " cannot be written"
                    + (c.required ? " (the column is required)" : " (use NaN for not given)"));
        }
        String text = String.format(Locale.ROOT, "%." + c.decimals + "f", c.fromSi.applyAsDouble(siValue));
        if (text.startsWith("-") && Double.parseDouble(text) == 0.0) {
            text = text.substring(1);
        }
        double v = Double.parseDouble(text);
        if (!(v >= c.min && v <= c.max)) {
            throw new IllegalArgumentException(where + ": " + c.quantity + " " + text
                    + " is outside the accepted range " + c.range());
        }
        return text;
    }

    private static boolean anyValue(double[] a) {
        for (double v : a) {
            if (!Double.isNaN(v)) {
                return true;
            }
        }
        return false;
    }

    private static double[][] seriesOf(HourlyWeather w) {
        double[][] s = new double[COLUMNS.length][];
        s[Column.AIR_TEMP_C.ordinal()] = w.airTempK;
        s[Column.REL_HUMIDITY_PCT.ordinal()] = w.relHumidity;
        s[Column.WIND_MS.ordinal()] = w.windMs;
        s[Column.GHI_WM2.ordinal()] = w.ghiWm2;
        s[Column.DNI_WM2.ordinal()] = w.dniWm2;
        s[Column.DHI_WM2.ordinal()] = w.dhiWm2;
        s[Column.SKY_LW_WM2.ordinal()] = w.skyLongwaveWm2;
        s[Column.CLOUD_FRACTION.ordinal()] = w.cloudFraction;
        s[Column.PRESSURE_HPA.ordinal()] = w.pressurePa;
        return s;
    }

}
