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

/**
 * Checks that hourly weather covers a period, and cuts it to the period (the validation of a read
 * weather series against what a run asks for).
 */
final class WeatherCoverage {
    private WeatherCoverage() {}

    private static final int HOUR_S = Physical.SECONDS_PER_HOUR;

    // ---------------------------------------------------------------------------- coverage

    /**
     * Checks that {@code weather} can drive the period {@code [start, end]}: its first hour is at
     * or before {@code start} and its last hour at or after {@code end}, so every instant of the
     * period lies between two time stamps and can be interpolated.
     *
     * @param source named in the message (file path, or e.g. "synthetic weather")
     * @throws WeatherCsvException naming the first and last time available and the period asked
     *                             for, when the weather does not cover it
     * @throws IllegalArgumentException when {@code end} is not after {@code start}
     */
    public static void requireCovers(HourlyWeather weather, String source, Instant start, Instant end) {
        if (!end.isAfter(start)) {
            throw new IllegalArgumentException("period end " + end + " must be after its start " + start);
        }
        ZoneOffset off = ZoneOffset.ofTotalSeconds(weather.utcOffsetSeconds);
        int n = weather.hours();
        if (n == 0) {
            throw new WeatherCsvException(source, 0, null, "the weather has no hours",
                    "give weather that covers " + WeatherCsv.format(start, off) + " … " + WeatherCsv.format(end, off));
        }
        long first = weather.epochSecond[0];
        long last = weather.epochSecond[n - 1];
        long startS = start.getEpochSecond();
        long endS = ceilSeconds(end);
        if (startS >= first && endS <= last) {
            return;
        }
        StringBuilder why = new StringBuilder();
        if (startS < first) {
            why.append("it starts ").append(duration(first - startS)).append(" after the period starts");
        }
        if (endS > last) {
            why.append(why.length() > 0 ? " and " : "").append("it ends ").append(duration(endS - last))
                    .append(" before the period ends");
        }
        throw new WeatherCsvException(source, 0, null, "the weather covers " + WeatherCsv.format(first, off) + " … "
                + WeatherCsv.format(last, off) + " (" + n + " hours) but the period asked for is " + WeatherCsv.format(start, off) + " … "
                + WeatherCsv.format(end, off) + ": " + why,
                "give weather with a time stamp at or before the period's start and at or after its end, "
                        + "or shorten the period to lie within " + WeatherCsv.format(first, off) + " … " + WeatherCsv.format(last, off));
    }

    /**
     * The smallest run of hours of {@code weather} that spans {@code [start, end]}: from the last
     * hour at or before {@code start} to the first hour at or after {@code end}, both included.
     *
     * @throws WeatherCsvException as {@link #requireCovers} when the weather does not cover the period
     */
    public static HourlyWeather slice(HourlyWeather weather, String source, Instant start, Instant end) {
        requireCovers(weather, source, start, end);
        long t0 = weather.epochSecond[0];
        int from = (int) Math.floorDiv(start.getEpochSecond() - t0, (long) HOUR_S);
        int to = (int) -Math.floorDiv(-(ceilSeconds(end) - t0), (long) HOUR_S);
        return weather.slice(from, to + 1);
    }

    private static long ceilSeconds(Instant t) {
        return t.getNano() == 0 ? t.getEpochSecond() : t.getEpochSecond() + 1;
    }

    private static String duration(long seconds) {
        long h = seconds / HOUR_S;
        long rest = seconds % HOUR_S;
        return h + " h" + (rest != 0 ? " " + rest / 60 + " min" : "");
    }

}
