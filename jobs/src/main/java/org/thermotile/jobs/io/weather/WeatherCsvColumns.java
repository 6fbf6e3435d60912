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

/**
 * The weather CSV format's columns: header names, units, accepted ranges, conversions to SI and
 * printed decimals ({@link Column}), and the lookups and did-you-mean of header names. Parsing is in
 * {@link WeatherCsv}, writing in {@link WeatherCsvWriter}, period checks in {@link WeatherCoverage}.
 */
final class WeatherCsvColumns {
    private WeatherCsvColumns() {}

    static final String TIME = "time";

    /** The value columns of the format, in writing order. Ranges are in file units. */
    enum Column {
        AIR_TEMP_C("air_temp_c", true, "air temperature", "°C", -60, 60, 2,
                c -> c + Physical.ZERO_CELSIUS_K, k -> k - Physical.ZERO_CELSIUS_K,
                "give air temperature in °C (not °F or K)"),
        REL_HUMIDITY_PCT("rel_humidity_pct", true, "relative humidity", "%", 0, 100, 2,
                p -> p / 100.0, f -> f * 100.0,
                "give relative humidity in percent; clip sensor readings slightly above 100 to 100"),
        WIND_MS("wind_ms", true, "wind speed", "m/s", 0, 75, 2, v -> v, v -> v,
                "give the hourly mean wind speed in m/s (km/h ÷ 3.6, knots × 0.5144)"),
        GHI_WM2("ghi_wm2", true, "global horizontal irradiance", "W/m²", 0, 1400, 1, v -> v, v -> v,
                "give hourly mean irradiance in W/m² (Wh/m² per hour is the same number; kJ/m² per hour ÷ 3.6); "
                        + "set small negative night-time readings to 0"),
        DNI_WM2("dni_wm2", false, "direct normal irradiance", "W/m²", 0, 1400, 1, v -> v, v -> v,
                "give hourly mean irradiance in W/m² (kJ/m² per hour ÷ 3.6), or leave the cell empty"),
        DHI_WM2("dhi_wm2", false, "diffuse horizontal irradiance", "W/m²", 0, 900, 1, v -> v, v -> v,
                "give hourly mean irradiance in W/m² (kJ/m² per hour ÷ 3.6), or leave the cell empty"),
        SKY_LW_WM2("sky_lw_wm2", false, "sky longwave irradiance", "W/m²", 50, 600, 1, v -> v, v -> v,
                "give downwelling longwave irradiance in W/m², or leave the cell empty to have it modelled"),
        CLOUD_FRACTION("cloud_fraction", false, "cloud fraction", "", 0, 1, 3, v -> v, v -> v,
                "give cloud cover as a fraction 0…1 (oktas ÷ 8, percent ÷ 100), or leave the cell empty"),
        PRESSURE_HPA("pressure_hpa", false, "station pressure", "hPa", 500, 1100, 2,
                h -> h * 100.0, p -> p / 100.0,
                "give station pressure in hPa (Pa ÷ 100, kPa × 10), or leave the cell empty");

        final String header;
        final boolean required;
        final String quantity;
        final String unit;
        final double min;
        final double max;
        final int decimals;
        final DoubleUnaryOperator toSi;
        final DoubleUnaryOperator fromSi;
        final String rangeFix;

        Column(String header, boolean required, String quantity, String unit, double min, double max,
                int decimals, DoubleUnaryOperator toSi, DoubleUnaryOperator fromSi, String rangeFix) {
            this.header = header;
            this.required = required;
            this.quantity = quantity;
            this.unit = unit;
            this.min = min;
            this.max = max;
            this.decimals = decimals;
            this.toSi = toSi;
            this.fromSi = fromSi;
            this.rangeFix = rangeFix;
        }

        String range() {
            return fmtLimit(min) + "…" + fmtLimit(max) + (unit.isEmpty() ? "" : " " + unit);
        }

        static String fmtLimit(double v) {
            return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
        }
    }

    static final Column[] COLUMNS = Column.values();

    static Column byHeader(String name) {
        for (Column c : COLUMNS) {
            if (c.header.equals(name)) {
                return c;
            }
        }
        return null;
    }

    static String allNames() {
        StringBuilder s = new StringBuilder(TIME);
        for (Column c : COLUMNS) {
            s.append(", ").append(c.header);
        }
        return s.toString();
    }

    static String requiredNames() {
        StringBuilder s = new StringBuilder(TIME);
        for (Column c : COLUMNS) {
            if (c.required) {
                s.append(", ").append(c.header);
            }
        }
        return s.toString();
    }

    /** "did you mean …?" for a header name that is not a column, then the full list. */
    static String unknownColumnFix(String name) {
        String best = null;
        int bestDistance = Integer.MAX_VALUE;
        List<String> names = new ArrayList<>();
        names.add(TIME);
        for (Column c : COLUMNS) {
            names.add(c.header);
        }
        for (String known : names) {
            int d = known.startsWith(name) && name.length() >= 2 ? 1 : editDistance(name, known);
            if (d < bestDistance) {
                bestDistance = d;
                best = known;
            }
        }
        String list = "the columns are " + allNames();
        if (bestDistance <= Math.max(2, name.length() / 3)) {
            return "did you mean \"" + best + "\"? (" + list + ")";
        }
        return "rename or remove the column; " + list;
    }

    /** Levenshtein edit distance (insertions, deletions, substitutions each cost 1). */
    static int editDistance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int sub = prev[j - 1] + (a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1);
                cur[j] = Math.min(sub, Math.min(prev[j] + 1, cur[j - 1] + 1));
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }

}
