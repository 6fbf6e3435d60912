package org.thermotile.jobs.ingest;

import java.io.IOException;
import java.io.StringReader;
import java.nio.charset.MalformedInputException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.time.LocalDateTime;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.time.format.DateTimeParseException;
import java.time.temporal.TemporalAccessor;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.DoubleUnaryOperator;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.Suggest;
import org.thermotile.jobs.io.weather.GapFill;
import org.thermotile.jobs.io.weather.WeatherCsv;
import org.thermotile.jobs.io.weather.WeatherCsvException;
import org.thermotile.jobs.io.weather.WeatherRead;
import org.thermotile.model.air.Psychrometrics;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.sun.ClearSky;
import org.thermotile.model.sun.Extraterrestrial;
import org.thermotile.model.sun.SolarPosition;

/**
 * An hourly weather CSV in another layout, read through a column mapping from the run file
 * ({@code weather.columns}, {@code weather.units}, {@code weather.utc_offset},
 * {@code weather.time_format}, {@code weather.estimate_ghi}).
 *
 * <p>The file is UTF-8, cells separated by commas (a cell may be in double quotes); lines starting
 * with {@code #} and blank lines are skipped; the first other line is the header. Columns the
 * mapping does not name are ignored. Each mapped value is converted to our file unit and the rows
 * are handed, line for line, to {@link WeatherCsv}'s reader, so every check of our own layout
 * (ranges, hourly steps, one UTC offset, gap filling) applies with the file's own line numbers.
 * Converted values are carried to 10⁻⁶ of our file unit (far below any instrument's resolution), so a
 * value that converts exactly to a decimal of our layout (e.g. 70.52 °F = 21.40 °C) reads as the same
 * double as that decimal written in our layout.
 *
 * <h2>Units and their conversion to our file units (°C, %, m s⁻¹, W m⁻², fraction, hPa)</h2>
 * Factors are exact by definition; source: NIST Special Publication 811 (2008), Appendix B.8/B.9
 * (Thompson &amp; Taylor, "Guide for the Use of the International System of Units").
 * <ul>
 * <li>air_temperature: {@code degC} (also °C, C); {@code degF} (°F, F): t/°C = (t/°F − 32)/1.8;
 *     {@code K}: t/°C = T/K − 273.15.</li>
 * <li>wind_speed: {@code m/s}; {@code km/h}: ÷ 3.6; {@code mph}: × 0.44704; {@code knots} (kn, kt):
 *     × 1852/3600 (1 nautical mile = 1852 m exactly).</li>
 * <li>relative_humidity: {@code %}; {@code fraction}: × 100.</li>
 * <li>ghi, dni, dhi, sky_longwave: {@code W/m2} (W/m²) only.</li>
 * <li>cloud_cover: {@code fraction}; {@code %}: ÷ 100; {@code okta}: ÷ 8.</li>
 * <li>pressure: {@code hPa} (mbar, 1 mbar = 1 hPa); {@code kPa}: × 10; {@code Pa}: ÷ 100.</li>
 * </ul>
 *
 * <h2>Estimated global irradiance</h2>
 * With {@code estimate_ghi: clear_sky}, G = G_clear, the Bird &amp; Hulstrom (1981) clear-sky
 * global irradiance ({@link ClearSky#bird}, default atmosphere) at the site and the row's time, with
 * the NREL SPA sun position. With {@code estimate_ghi: cloud_cover},
 * G = G_clear · (1 − 0.75 · N^3.4) [W m⁻²], N the cloud cover as a fraction 0…1 (Kasten &amp; Czeplak
 * 1980, "Solar and terrestrial radiation dependent on the amount and type of cloud", Solar Energy
 * 24, 177–189, eq. for global radiation with N = oktas/8). Station pressure for Bird is the row's
 * pressure when mapped, else the standard-atmosphere pressure at the site's elevation.
 */
public final class WeatherColumns {
    private WeatherColumns() {}

    /** Our file's column for each mapped field (the time column is "time"). */
    static final Map<String, String> OUR_COLUMN = new LinkedHashMap<>();

    static {
        OUR_COLUMN.put("time", "time");
        OUR_COLUMN.put("air_temperature", "air_temp_c");
        OUR_COLUMN.put("relative_humidity", "rel_humidity_pct");
        OUR_COLUMN.put("wind_speed", "wind_ms");
        OUR_COLUMN.put("ghi", "ghi_wm2");
        OUR_COLUMN.put("dni", "dni_wm2");
        OUR_COLUMN.put("dhi", "dhi_wm2");
        OUR_COLUMN.put("sky_longwave", "sky_lw_wm2");
        OUR_COLUMN.put("cloud_cover", "cloud_fraction");
        OUR_COLUMN.put("pressure", "pressure_hpa");
    }

    /** A unit: its accepted spellings and the conversion to our file unit. */
    record Unit(String name, List<String> spellings, DoubleUnaryOperator toOurs) {
    }

    /** Units per field; the first is our own (identity). NIST SP 811 (2008) App. B for the factors. */
    static final Map<String, List<Unit>> UNITS = new LinkedHashMap<>();

    static {
        UNITS.put("air_temperature", List.of(
                new Unit("degC", List.of("degc", "°c", "c", "celsius"), t -> t),
                new Unit("degF", List.of("degf", "°f", "f", "fahrenheit"), f -> (f - 32.0) / 1.8),
                new Unit("K", List.of("k", "kelvin"), k -> k - 273.15)));
        UNITS.put("relative_humidity", List.of(
                new Unit("%", List.of("%", "percent", "pct"), p -> p),
                new Unit("fraction", List.of("fraction", "1"), f -> f * 100.0)));
        UNITS.put("wind_speed", List.of(
                new Unit("m/s", List.of("m/s", "ms", "m s-1"), v -> v),
                new Unit("km/h", List.of("km/h", "kmh", "kph"), v -> v / 3.6),
                new Unit("mph", List.of("mph", "mi/h"), v -> v * 0.44704),
                new Unit("knots", List.of("knots", "knot", "kn", "kt"), v -> v * 1852.0 / 3600.0)));
        List<Unit> irr = List.of(new Unit("W/m2", List.of("w/m2", "w/m²", "w m-2"), v -> v));
        for (String k : List.of("ghi", "dni", "dhi", "sky_longwave")) {
            UNITS.put(k, irr);
        }
        UNITS.put("cloud_cover", List.of(
                new Unit("fraction", List.of("fraction", "1"), f -> f),
                new Unit("%", List.of("%", "percent", "pct"), p -> p / 100.0),
                new Unit("okta", List.of("okta", "oktas"), o -> o / 8.0)));
        UNITS.put("pressure", List.of(
                new Unit("hPa", List.of("hpa", "mbar", "mb"), h -> h),
                new Unit("kPa", List.of("kpa"), k -> k * 10.0),
                new Unit("Pa", List.of("pa"), p -> p / 100.0)));
    }

    /**
     * Reads {@code file} through {@code mapping}.
     *
     * @param runFile the run file (named in messages about the mapping)
     * @param site    where the city stands (for estimated irradiance)
     * @throws UserInputException naming the file, the key or line and the fix
     */
    public static WeatherRead read(Path file, RunFile.WeatherMapping mapping, String runFile, Site site,
            GapFill gapFill) {
        Map<String, Unit> units = units(mapping, runFile);
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new UserInputException(file + ": no such file. Fix: check weather.file in " + runFile);
        } catch (MalformedInputException e) {
            throw new UserInputException(file + ": the text is not valid UTF-8. Fix: save the file as UTF-8");
        } catch (IOException e) {
            throw new UserInputException(file + ": cannot be read (" + e.getMessage() + ")", e);
        }
        int headerAt = -1;
        for (int i = 0; i < lines.size(); i++) {
            String t = strip(lines.get(i));
            if (!t.isEmpty() && !t.startsWith("#")) {
                headerAt = i;
                break;
            }
        }
        if (headerAt < 0) {
            throw new UserInputException(file + ": no header line (the file is empty or only comments). Fix: give a "
                    + "header line naming the columns");
        }
        List<String> header = cells(strip(lines.get(headerAt)));
        // Field → cell index in the file.
        Map<String, Integer> cellOf = new LinkedHashMap<>();
        for (Map.Entry<String, String> e : mapping.columns().entrySet()) {
            int idx = header.indexOf(e.getValue());
            if (idx < 0) {
                String hint = Suggest.closest(e.getValue(), header).map(c -> " (did you mean '" + c + "'?)").orElse("");
                throw new UserInputException(runFile + ": weather.columns." + e.getKey() + " names column '"
                        + e.getValue() + "', which the header of " + file + " (line " + (headerAt + 1) + ") lacks"
                        + hint + ". The header's columns: " + String.join(", ", header)
                        + ". Fix: name one of them (names are case-sensitive)");
            }
            cellOf.put(e.getKey(), idx);
        }
        List<String> fields = new ArrayList<>();
        for (String f : OUR_COLUMN.keySet()) {
            if (cellOf.containsKey(f) || ("ghi".equals(f) && mapping.estimateGhi() != null)) {
                fields.add(f);
            }
        }
        DateTimeFormatter fmt = mapping.timeFormat() == null ? null
                : DateTimeFormatter.ofPattern(mapping.timeFormat(), Locale.ROOT);
        StringBuilder out = new StringBuilder();
        for (int i = 0; i < headerAt; i++) {
            out.append("#\n");
        }
        out.append(String.join(",", fields.stream().map(OUR_COLUMN::get).toList())).append('\n');
        int estimated = 0;
        double[] sun = new double[3];
        double[] clear = new double[3];
        for (int i = headerAt + 1; i < lines.size(); i++) {
            String line = strip(lines.get(i));
            int lineNo = i + 1;
            if (line.isEmpty() || line.startsWith("#")) {
                out.append("#\n");
                continue;
            }
            List<String> cells = cells(line);
            if (cells.size() != header.size()) {
                throw new UserInputException(file + ", line " + lineNo + ": " + cells.size() + " cells but the header "
                        + "(line " + (headerAt + 1) + ") has " + header.size() + ". Fix: give one cell per header column");
            }
            OffsetDateTime time = time(file, lineNo, mapping, fmt, cells.get(cellOf.get("time")), runFile);
            List<String> row = new ArrayList<>();
            double[] ours = new double[OUR_COLUMN.size()];
            java.util.Arrays.fill(ours, Double.NaN);
            List<String> keys = new ArrayList<>(OUR_COLUMN.keySet());
            for (String f : fields) {
                if ("time".equals(f)) {
                    row.add(time.format(DateTimeFormatter.ISO_OFFSET_DATE_TIME));
                    continue;
                }
                Integer cell = cellOf.get(f);
                if (cell == null) {
                    row.add("");           // the estimated ghi, filled below
                    continue;
                }
                String text = cells.get(cell);
                if (text.isEmpty()) {
                    row.add("");
                    continue;
                }
                double v;
                try {
                    v = Double.parseDouble(text);
                } catch (NumberFormatException e) {
                    throw new UserInputException(file + ", line " + lineNo + ", column '" + header.get(cell) + "' ("
                            + f + "): \"" + text + "\" is not a number. Fix: write a plain decimal with a point, or "
                            + "leave the cell empty when not given");
                }
                if (!Double.isFinite(v)) {
                    throw new UserInputException(file + ", line " + lineNo + ", column '" + header.get(cell) + "' ("
                            + f + "): \"" + text + "\" is not a finite number. Fix: leave the cell empty when not given");
                }
                double o = units.get(f).toOurs().applyAsDouble(v);
                ours[keys.indexOf(f)] = o;
                row.add(decimal(o));
            }
            if (mapping.estimateGhi() != null) {
                double cloud = ours[keys.indexOf("cloud_cover")];
                if ("cloud_cover".equals(mapping.estimateGhi()) && Double.isNaN(cloud)) {
                    throw new UserInputException(file + ", line " + lineNo + ", column '" + mapping.columns()
                            .get("cloud_cover") + "': empty, so global irradiance cannot be estimated from cloud "
                            + "cover (weather.estimate_ghi: cloud_cover). Fix: give the cloud cover of every hour, "
                            + "or use estimate_ghi: clear_sky");
                }
                double hpa = ours[keys.indexOf("pressure")];
                double pressurePa = Double.isNaN(hpa) ? Psychrometrics.standardPressurePa(site.elevationM()) : hpa * 100;
                double tC = ours[keys.indexOf("air_temperature")];
                double g = ghi(time.toEpochSecond(), site, pressurePa, Double.isNaN(tC) ? 288.15 : tC + 273.15,
                        "cloud_cover".equals(mapping.estimateGhi()) ? cloud : 0.0, sun, clear);
                row.set(fields.indexOf("ghi"), decimal(g));
                estimated++;
            }
            out.append(String.join(",", row)).append('\n');
        }
        WeatherRead read;
        try {
            read = WeatherCsv.read(new StringReader(out.toString()), file.toString(), gapFill);
        } catch (WeatherCsvException e) {
            String our = e.column();
            String theirs = null;
            for (Map.Entry<String, String> m : OUR_COLUMN.entrySet()) {
                if (m.getValue().equals(our) && mapping.columns().containsKey(m.getKey())) {
                    theirs = m.getKey() + " = column '" + mapping.columns().get(m.getKey()) + "' in "
                            + units.getOrDefault(m.getKey(), UNITS.getOrDefault(m.getKey(), List.of()).stream()
                                    .findFirst().orElse(new Unit("as written", List.of(), x -> x))).name();
                }
            }
            throw new UserInputException(e.getMessage() + (theirs == null ? "" : " (mapped field " + theirs
                    + ", checked after conversion to our unit)"), e);
        } catch (IOException e) {
            throw new IllegalStateException("reading from a string cannot fail", e);
        }
        List<String> notes = new ArrayList<>();
        StringBuilder desc = new StringBuilder("weather " + file.getFileName() + " read through weather.columns:");
        for (Map.Entry<String, String> m : mapping.columns().entrySet()) {
            desc.append(' ').append(m.getKey()).append(" ← '").append(m.getValue()).append('\'');
            Unit u = units.get(m.getKey());
            if (u != null && UNITS.get(m.getKey()).get(0) != u) {
                desc.append(" [").append(u.name()).append(']');
            }
            desc.append(';');
        }
        desc.setLength(desc.length() - 1);
        notes.add(desc.toString());
        if (mapping.estimateGhi() != null) {
            notes.add("weather: ghi estimated for " + estimated + " hours, " + ("cloud_cover".equals(mapping.estimateGhi())
                    ? "from cloud cover by Kasten & Czeplak (1980), G = G_clear (1 - 0.75 N^3.4), on the Bird & "
                            + "Hulstrom (1981) clear sky"
                    : "as the Bird & Hulstrom (1981) clear sky (no cloud)"));
        }
        notes.addAll(read.notes());
        return new WeatherRead(read.weather(), read.source(), read.filledHours(), notes);
    }

    /**
     * Estimated global horizontal irradiance [W m⁻²]: G = G_clear · (1 − 0.75 · N^3.4) (Kasten &amp; Czeplak
     * 1980), G_clear by Bird &amp; Hulstrom (1981) with the NREL SPA sun position.
     *
     * @param cloudFraction N [fraction 0…1]; 0 gives the clear sky
     */
    static double ghi(long epochSecond, Site site, double pressurePa, double airTempK, double cloudFraction,
            double[] sun, double[] clear) {
        SolarPosition.compute(epochSecond, site.latitudeDeg(), site.longitudeDeg(), site.elevationM(), pressurePa,
                airTempK, SolarPosition.DEFAULT_DELTA_T_S, sun);
        double e0n = Extraterrestrial.normalIrradianceFromRadiusWm2(sun[SolarPosition.RADIUS]);
        ClearSky.bird(sun[SolarPosition.ZENITH], e0n, pressurePa, ClearSky.DEFAULT, clear);
        double n = Math.max(0, Math.min(1, cloudFraction));
        return clear[ClearSky.GHI] * (1.0 - 0.75 * Math.pow(n, 3.4));
    }

    /** The units of each mapped field; an unknown or misplaced unit is an error naming the key. */
    static Map<String, Unit> units(RunFile.WeatherMapping mapping, String runFile) {
        Map<String, Unit> out = new LinkedHashMap<>();
        for (String f : OUR_COLUMN.keySet()) {
            if ("time".equals(f)) {
                continue;
            }
            List<Unit> known = UNITS.get(f);
            String given = mapping.units().get(f);
            if (given == null) {
                out.put(f, known.get(0));
                continue;
            }
            if (!mapping.columns().containsKey(f)) {
                throw new UserInputException(runFile + ": weather.units." + f + " is given but weather.columns maps no "
                        + "column to " + f + ". Fix: add weather.columns." + f + " or remove the unit");
            }
            Unit hit = null;
            for (Unit u : known) {
                if (u.spellings().contains(given.toLowerCase(Locale.ROOT)) || u.name().equals(given)) {
                    hit = u;
                }
            }
            if (hit == null) {
                List<String> names = known.stream().map(Unit::name).toList();
                String hint = Suggest.closest(given, names).map(c -> " (did you mean '" + c + "'?)").orElse("");
                throw new UserInputException(runFile + ": weather.units." + f + ": unknown unit '" + given + "'" + hint
                        + ". Fix: use one of " + String.join(", ", names));
            }
            out.put(f, hit);
        }
        return out;
    }

    private static OffsetDateTime time(Path file, int lineNo, RunFile.WeatherMapping m, DateTimeFormatter fmt,
            String text, String runFile) {
        String where = file + ", line " + lineNo + ", column '" + m.columns().get("time") + "' (time)";
        TemporalAccessor t;
        try {
            DateTimeFormatter f = fmt != null ? fmt : DateTimeFormatter.ISO_DATE_TIME;
            t = f.parseBest(text.replace(' ', fmt == null ? 'T' : ' '), OffsetDateTime::from, LocalDateTime::from);
        } catch (DateTimeParseException e) {
            throw new UserInputException(where + ": \"" + text + "\" is not a time" + (fmt == null
                    ? " in ISO-8601 (2026-07-14T13:00)" : " of the pattern '" + m.timeFormat() + "'")
                    + ". Fix: " + (fmt == null ? "give weather.time_format, e.g. \"dd/MM/yyyy HH:mm\"" : "correct "
                    + "weather.time_format in " + runFile + " or the cell"));
        }
        if (t instanceof OffsetDateTime odt) {
            return m.utcOffset() == null ? odt : odt.withOffsetSameInstant(m.utcOffset());
        }
        if (m.utcOffset() == null) {
            throw new UserInputException(where + ": \"" + text + "\" has no UTC offset. Fix: give the offset of the "
                    + "file's clock as weather.utc_offset in " + runFile + ", e.g. utc_offset: \"+02:00\"");
        }
        return ((LocalDateTime) t).atOffset(m.utcOffset());
    }

    /** A value to 10⁻⁶ of our unit, plain decimal ("21.370000"). */
    static String decimal(double v) {
        String s = String.format(Locale.ROOT, "%.6f", v);
        return s.equals("-0.000000") ? "0.000000" : s;
    }

    private static String strip(String line) {
        return line.startsWith("\uFEFF") ? line.substring(1).strip() : line.strip();
    }

    /** Comma-separated cells; a cell in double quotes may hold commas ("" is a quote). Cells stripped. */
    static List<String> cells(String line) {
        List<String> out = new ArrayList<>();
        StringBuilder cur = new StringBuilder();
        boolean quoted = false;
        for (int i = 0; i < line.length(); i++) {
            char ch = line.charAt(i);
            if (quoted) {
                if (ch == '"' && i + 1 < line.length() && line.charAt(i + 1) == '"') {
                    cur.append('"');
                    i++;
                } else if (ch == '"') {
                    quoted = false;
                } else {
                    cur.append(ch);
                }
            } else if (ch == '"') {
                quoted = true;
            } else if (ch == ',') {
                out.add(cur.toString().strip());
                cur.setLength(0);
            } else {
                cur.append(ch);
            }
        }
        out.add(cur.toString().strip());
        return out;
    }
}
