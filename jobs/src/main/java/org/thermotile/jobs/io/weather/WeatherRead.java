package org.thermotile.jobs.io.weather;

import java.time.Instant;
import java.util.List;
import java.util.Objects;
import org.thermotile.model.forcing.HourlyWeather;

/**
 * What {@link WeatherCsv#read} returns: the weather, where it came from, how many hours were
 * filled, and notes worth showing to the user (filled gaps, partly empty optional columns).
 *
 * @param weather     the hourly weather in SI units
 * @param source      the file it was read from, as named in messages
 * @param filledHours number of hours filled by gap filling (0 when the file had no gaps)
 * @param notes       human-readable notes, in file order; empty when there is nothing to say
 */
public record WeatherRead(HourlyWeather weather, String source, int filledHours, List<String> notes) {
    public WeatherRead {
        Objects.requireNonNull(weather, "weather");
        Objects.requireNonNull(source, "source");
        notes = List.copyOf(notes);
    }

    /** {@link WeatherCsv#requireCovers} for this file's weather. */
    public void requireCovers(Instant start, Instant end) {
        WeatherCsv.requireCovers(weather, source, start, end);
    }

    /** {@link WeatherCsv#slice} of this file's weather. */
    public HourlyWeather slice(Instant start, Instant end) {
        return WeatherCsv.slice(weather, source, start, end);
    }
}
