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
import static org.thermotile.jobs.io.weather.WeatherCsvColumns.allNames;
import static org.thermotile.jobs.io.weather.WeatherCsvColumns.byHeader;
import static org.thermotile.jobs.io.weather.WeatherCsvColumns.requiredNames;

import org.thermotile.jobs.io.weather.WeatherCsvColumns.Column;

/**
 * Reader and writer of thermotile's hourly weather file, a small CSV format of our own.
 *
 * <h2>Format</h2>
 * UTF-8 text, one record per line, cells separated by commas (no quoting: every cell is a number
 * or a time). Lines whose first non-blank character is {@code #} are comments; blank lines are
 * skipped. Line numbers in messages count every physical line, comments included.
 * <ul>
 * <li>The first other line is the <b>header</b>: column names, in any order, case-insensitive,
 *     each at most once. An unknown name is an error (with the nearest known name suggested).</li>
 * <li>Every following line is one <b>hour</b>, with exactly as many cells as the header.</li>
 * </ul>
 * Columns (file units in the name; converted to SI on reading):
 * <table>
 * <caption>columns</caption>
 * <tr><th>column</th><th>required</th><th>meaning [file unit]</th><th>accepted range</th><th>SI field</th></tr>
 * <tr><td>time</td><td>yes</td><td>ISO-8601 local time with UTC offset, e.g. 2026-07-14T13:00+02:00</td><td>see below</td><td>epochSecond, utcOffsetSeconds</td></tr>
 * <tr><td>air_temp_c</td><td>yes</td><td>air temperature [°C]</td><td>−60…60</td><td>airTempK [K]</td></tr>
 * <tr><td>rel_humidity_pct</td><td>yes</td><td>relative humidity [%]</td><td>0…100</td><td>relHumidity [fraction]</td></tr>
 * <tr><td>wind_ms</td><td>yes</td><td>wind speed [m s⁻¹]</td><td>0…75</td><td>windMs</td></tr>
 * <tr><td>ghi_wm2</td><td>yes</td><td>global horizontal irradiance [W m⁻²]</td><td>0…1400</td><td>ghiWm2</td></tr>
 * <tr><td>dni_wm2</td><td>no</td><td>direct normal irradiance [W m⁻²]</td><td>0…1400</td><td>dniWm2</td></tr>
 * <tr><td>dhi_wm2</td><td>no</td><td>diffuse horizontal irradiance [W m⁻²]</td><td>0…900</td><td>dhiWm2</td></tr>
 * <tr><td>sky_lw_wm2</td><td>no</td><td>downwelling sky longwave irradiance [W m⁻²]</td><td>50…600</td><td>skyLongwaveWm2</td></tr>
 * <tr><td>cloud_fraction</td><td>no</td><td>cloud cover [fraction 0…1]</td><td>0…1</td><td>cloudFraction</td></tr>
 * <tr><td>pressure_hpa</td><td>no</td><td>station pressure [hPa]</td><td>500…1100</td><td>pressurePa [Pa]</td></tr>
 * </table>
 * Conversions: T [K] = t [°C] + 273.15 (SI Brochure, 9th ed., 2019); RH fraction = RH [%] / 100;
 * p [Pa] = p [hPa] × 100. Values are instantaneous at their time stamp (as {@link HourlyWeather}
 * takes them). Numbers are plain decimals with a point ({@code 21.5}, {@code -3}, {@code 1.2e3});
 * no units, thousands separators, {@code NaN} or {@code Infinity}. An empty cell in an optional
 * column means "not given" (NaN, filled later from published models); in a required column it is
 * an error. An optional column left out of the header is "not given" for every hour
 * ({@link HourlyWeather#absent}).
 *
 * <h2>Time</h2>
 * Every row carries the same UTC offset (a file written on a local clock that changes for
 * daylight saving must be converted to one fixed offset). Times must be strictly increasing and
 * spaced by whole hours: a step of 0 is a duplicate, a step that is not a multiple of 3600 s is
 * not hourly data, and a step of k·3600 s with k &gt; 1 leaves k − 1 hours missing, which is an
 * error unless {@link GapFill#linear(int)} allows filling it. Time stamps need not fall on the
 * full hour (e.g. :30 throughout is fine).
 *
 * <h2>Accepted ranges, and where they come from</h2>
 * The ranges catch wrong units and broken records; they are plausibility limits, not climate
 * statistics. Both ends are accepted.
 * <ul>
 * <li>Air temperature −60…60 °C: above the highest air temperature the WMO recognises,
 *     56.7 °C (Death Valley, 1913; from memory). The lower limit is a choice (common practice)
 *     that keeps a wide margin for any city's winter; colder air exists (−89.2 °C, Vostok, 1983;
 *     from memory) but not in surface-temperature studies of cities. It matches the −60 °C clamp
 *     of {@code Psychrometrics}.</li>
 * <li>Relative humidity 0…100 %: by definition (supersaturation is not reported by
 *     hygrometers; readings a little above 100 % are sensor error and should be clipped).</li>
 * <li>Wind 0…75 m s⁻¹: an hourly mean above the Saffir–Simpson category-5 threshold for 1-minute
 *     sustained wind, 70 m s⁻¹ (157 mph; from memory); hourly means are lower than 1-minute
 *     values. Gusts go higher (113 m s⁻¹, Barrow Island, 1996; from memory) but this column is a
 *     mean.</li>
 * <li>GHI and DNI 0…1400 W m⁻²: just above the solar constant, 1361 W m⁻² (Kopp &amp; Lean 2011,
 *     {@link Physical#SOLAR_CONSTANT}); at perihelion the top-of-atmosphere normal irradiance is
 *     about 3.4 % higher (≈ 1407 W m⁻², from memory), and the atmosphere always removes more than
 *     that at the ground in an hourly mean (common practice). Short cloud-edge enhancement above
 *     the limit averages out over an hour.</li>
 * <li>DHI 0…900 W m⁻²: common practice; diffuse light is the scattered part of global light and
 *     stays well below it. Compare the "physically possible" checks of the BSRN Global Network
 *     recommended QC tests, V2.0 (C. N. Long and E. G. Dutton).</li>
 * <li>Sky longwave 50…600 W m⁻²: the black-body emission σT⁴ (CODATA 2018 σ) of about 172 K
 *     (−101 °C) and 321 K (48 °C). The sky radiates as a grey body colder than the air near the
 *     ground, so real values lie well inside (common practice).</li>
 * <li>Cloud fraction 0…1: by definition.</li>
 * <li>Pressure 500…1100 hPa: above the highest sea-level pressure on record, 1083.8 hPa (Agata,
 *     Siberia, 1968; from memory); 500 hPa is the ICAO standard-atmosphere pressure near 5.6 km,
 *     above any city (see {@code Psychrometrics.standardPressurePa}).</li>
 * </ul>
 *
 * <h2>Writing</h2>
 * {@link #write(HourlyWeather, Writer)} writes the same format: the header lists the required
 * columns, then each optional column that has at least one value; cells use fixed decimals
 * (0.01 °C, 0.01 %, 0.01 m s⁻¹, 0.1 W m⁻², 0.001 cloud, 0.01 hPa), NaN as an empty cell, and
 * times in the weather's own offset. Output is deterministic ({@code \n} line ends, no locale).
 * Reading a written file and writing it again gives the same text; values read back equal the
 * originals to within half the last printed digit.
 */
public final class WeatherCsv {
    private WeatherCsv() {}

    /** Seconds in one hour. */
    private static final int HOUR_S = Physical.SECONDS_PER_HOUR;

    private static final Pattern NUMBER = Pattern.compile("[+-]?(?:\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][+-]?\\d+)?");
    private static final DateTimeFormatter TIME_MINUTES = DateTimeFormatter.ofPattern("uuuu-MM-dd'T'HH:mmxxxxx", Locale.ROOT);
    private static final DateTimeFormatter TIME_SECONDS = DateTimeFormatter.ofPattern("uuuu-MM-dd'T'HH:mm:ssxxxxx", Locale.ROOT);
    private static final String EXAMPLE_TIME = "2026-07-14T13:00+02:00";


    // ------------------------------------------------------------------------------------ read

    /** Reads a weather file, refusing any missing hour; see {@link #read(Reader, String, GapFill)}. */
    public static WeatherRead read(Path file) throws IOException {
        return read(file, GapFill.none());
    }

    /**
     * Reads a weather file (UTF-8) in the format described in the class comment.
     *
     * @param file    the file; named in every message
     * @param gapFill how far missing hours may be filled
     * @throws WeatherCsvException when the file is missing or its content is wrong (names the
     *                             file, line, column, value and fix)
     * @throws IOException         on other failures to read the file
     */
    public static WeatherRead read(Path file, GapFill gapFill) throws IOException {
        String source = file.toString();
        BufferedReader in;
        try {
            in = Files.newBufferedReader(file, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new WeatherCsvException(source, 0, null, "no such file",
                    "check the weather file's path (relative paths are taken from the working folder "
                            + Path.of("").toAbsolutePath() + ")");
        }
        try (in) {
            return read(in, source, gapFill);
        }
    }

    /**
     * Reads weather from {@code in} in the format described in the class comment, converting to
     * SI: T [K] = t [°C] + 273.15, RH [fraction] = RH [%] / 100, p [Pa] = 100 · p [hPa]; other
     * columns are already SI. Filled gaps are linear in time between the surrounding rows,
     * {@code x(t) = x₀ + (x₁ − x₀)·(t − t₀)/(t₁ − t₀)}.
     *
     * @param in      the text; not closed
     * @param source  how to name the source in messages (usually the file path)
     * @param gapFill how far missing hours may be filled
     * @return the weather [SI], the number of filled hours and notes
     * @throws WeatherCsvException on any content error (names source, line, column, value, fix)
     * @throws IOException         when {@code in} fails
     */
    public static WeatherRead read(Reader in, String source, GapFill gapFill) throws IOException {
        return new Parser(in, source, gapFill).parse();
    }

    /** One pass over the lines; rows are kept as parsed, then laid out hour by hour. */
    private static final class Parser {
        private final BufferedReader in;
        private final String source;
        private final GapFill gapFill;
        private int lineNo;

        private int headerLine;
        private String headerText;
        private int cellCount;
        private int timeCell = -1;
        /** Cell position of each value column, −1 when absent. */
        private final int[] cellOf = new int[COLUMNS.length];

        private int rows;
        private long[] epoch = new long[256];
        private int[] lineOfRow = new int[256];
        private double[][] si = new double[COLUMNS.length][256];
        private final int[] emptyCells = new int[COLUMNS.length];
        private ZoneOffset offset;
        private String firstTimeText;
        private int firstTimeLine;

        Parser(Reader in, String source, GapFill gapFill) {
            this.in = in instanceof BufferedReader b ? b : new BufferedReader(in);
            this.source = source;
            this.gapFill = gapFill;
        }

        WeatherRead parse() throws IOException {
            String line;
            while ((line = nextLine()) != null) {
                if (lineNo == 1 && line.startsWith("\uFEFF")) {
                    line = line.substring(1);
                }
                String trimmed = line.strip();
                if (trimmed.isEmpty() || trimmed.startsWith("#")) {
                    continue;
                }
                if (headerLine == 0) {
                    header(line);
                } else {
                    row(line);
                }
            }
            if (headerLine == 0) {
                throw new WeatherCsvException(source, 0, null, "no header line (the file is empty or only comments)",
                        "start the file with a header such as time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2");
            }
            if (rows == 0) {
                throw new WeatherCsvException(source, headerLine, null, "the header is not followed by any hour",
                        "add one line per hour below the header");
            }
            return layOut();
        }

        private String nextLine() throws IOException {
            try {
                String line = in.readLine();
                if (line != null) {
                    lineNo++;
                }
                return line;
            } catch (CharacterCodingException e) {
                throw new WeatherCsvException(source, lineNo + 1, null, "the text is not valid UTF-8",
                        "save the file as UTF-8 (plain ASCII is fine)");
            }
        }

        private void header(String line) {
            headerLine = lineNo;
            headerText = line.strip();
            String[] names = line.split(",", -1);
            cellCount = names.length;
            Arrays.fill(cellOf, -1);
            for (int i = 0; i < names.length; i++) {
                String name = names[i].strip().toLowerCase(Locale.ROOT);
                if (name.isEmpty()) {
                    throw new WeatherCsvException(source, lineNo, "#" + (i + 1),
                            "header cell " + (i + 1) + " is empty (header: \"" + line.strip() + "\")",
                            "name every column, and remove trailing commas");
                }
                int seen = -1;
                if (name.equals(TIME)) {
                    seen = timeCell;
                    timeCell = i;
                } else {
                    Column c = byHeader(name);
                    if (c == null) {
                        throw new WeatherCsvException(source, lineNo, names[i].strip(),
                                "unknown column \"" + names[i].strip() + "\"", unknownColumnFix(name));
                    }
                    seen = cellOf[c.ordinal()];
                    cellOf[c.ordinal()] = i;
                }
                if (seen >= 0) {
                    throw new WeatherCsvException(source, lineNo, name, "column \"" + name
                            + "\" appears twice in the header (cells " + (seen + 1) + " and " + (i + 1) + ")",
                            "keep one of the two columns");
                }
            }
            List<String> missing = new ArrayList<>();
            if (timeCell < 0) {
                missing.add(TIME);
            }
            for (Column c : COLUMNS) {
                if (c.required && cellOf[c.ordinal()] < 0) {
                    missing.add(c.header);
                }
            }
            if (!missing.isEmpty()) {
                throw new WeatherCsvException(source, lineNo, String.join(", ", missing),
                        "the header lacks the required column" + (missing.size() > 1 ? "s " : " ")
                                + String.join(", ", missing) + " (header: \"" + line.strip() + "\")",
                        "add the column" + (missing.size() > 1 ? "s" : "") + "; required are "
                                + requiredNames());
            }
        }

        private void row(String line) {
            String[] cells = line.split(",", -1);
            if (cells.length != cellCount) {
                throw new WeatherCsvException(source, lineNo, null, "the line has " + cells.length
                        + " cells but the header (line " + headerLine + ") has " + cellCount + " columns (" + headerText + ")",
                        "give exactly one cell per header column, empty cells included (commas are separators; "
                                + "write decimals with a point)");
            }
            long t = time(cells[timeCell].strip());
            if (rows == epoch.length) {
                grow();
            }
            epoch[rows] = t;
            lineOfRow[rows] = lineNo;
            for (Column c : COLUMNS) {
                int cell = cellOf[c.ordinal()];
                si[c.ordinal()][rows] = cell < 0 ? Double.NaN : value(c, cells[cell].strip());
            }
            rows++;
        }

        /** Parses and checks one time cell against the previous row; returns epoch seconds. */
        private long time(String text) {
            OffsetDateTime odt;
            try {
                odt = OffsetDateTime.parse(text);
            } catch (DateTimeParseException e) {
                String fix = "write times as ISO-8601 local time with UTC offset, e.g. " + EXAMPLE_TIME;
                try {
                    LocalDateTime.parse(text);
                    fix = "add the UTC offset of the clock the times are in, e.g. " + text + "+02:00 (or " + text
                            + "Z for UTC)";
                } catch (DateTimeParseException notLocalEither) {
                    // keep the general fix
                }
                throw new WeatherCsvException(source, lineNo, TIME, "\"" + text + "\" is not a time with offset",
                        fix);
            }
            if (odt.getNano() != 0) {
                throw new WeatherCsvException(source, lineNo, TIME, "\"" + text + "\" has fractional seconds",
                        "give times to the second at most, e.g. " + EXAMPLE_TIME);
            }
            if (offset == null) {
                offset = odt.getOffset();
                firstTimeText = text;
                firstTimeLine = lineNo;
            } else if (!offset.equals(odt.getOffset())) {
                throw new WeatherCsvException(source, lineNo, TIME, "\"" + text + "\" has UTC offset "
                        + odt.getOffset() + " but the first time (\"" + firstTimeText + "\", line " + firstTimeLine
                        + ") has " + offset,
                        "write every time with one offset (no daylight-saving switch); in " + offset
                                + " this time is " + format(odt.toEpochSecond(), offset));
            }
            long t = odt.toEpochSecond();
            if (rows > 0) {
                long prev = epoch[rows - 1];
                int prevLine = lineOfRow[rows - 1];
                String prevText = format(prev, offset);
                long step = t - prev;
                if (step == 0) {
                    throw new WeatherCsvException(source, lineNo, TIME, "duplicate time \"" + text
                            + "\", already on line " + prevLine, "keep one row per hour");
                }
                if (step < 0) {
                    throw outOfOrder(lineNo, text, prevText, prevLine);
                }
                if (step % HOUR_S != 0) {
                    throw new WeatherCsvException(source, lineNo, TIME, "time \"" + text + "\" is " + step / 60
                            + " min " + (step % 60 != 0 ? step % 60 + " s " : "") + "after " + prevText
                            + " on line " + prevLine + "; rows must be whole hours apart",
                            "give hourly data: resample to one row per hour");
                }
                long missing = step / HOUR_S - 1;
                if (missing > gapFill.maxHours()) {
                    String allow = gapFill.isNone() ? "or allow linear gap filling of at least " + missing + " hour"
                            + (missing > 1 ? "s" : "")
                            : "gaps are filled up to " + gapFill.maxHours() + " hour"
                                    + (gapFill.maxHours() > 1 ? "s" : "") + " only";
                    WeatherCsvException gap = new WeatherCsvException(source, lineNo, TIME, missing + " hour"
                            + (missing > 1 ? "s" : "") + " missing between " + prevText + " (line " + prevLine
                            + ") and " + text, "add the missing rows, " + allow);
                    WeatherCsvException unordered = backwardsAfter(t);
                    throw unordered != null ? unordered : gap;
                }
            }
            return t;
        }

        /** A row whose time is earlier than the row before it: the hours are out of order. */
        private WeatherCsvException outOfOrder(int line, String text, String prevText, int prevLine) {
            return new WeatherCsvException(source, line, TIME, "the hours are out of order: \"" + text
                    + "\" is earlier than " + prevText + " on line " + prevLine + ", the row before",
                    "sort the rows by time, earliest first (one row per hour)");
        }

        /**
         * After a gap too long to fill at the current line (time {@code t}), whether the hours
         * merely come out of order: the following lines' time cells are read on until one is
         * earlier than the row before it (that row's out-of-order error, which explains the gap),
         * or a line cannot be read as a row (null: the gap is the first problem).
         */
        private WeatherCsvException backwardsAfter(long t) {
            long prev = t;
            int prevLine = lineNo;
            String line;
            try {
                while ((line = in.readLine()) != null) {
                    int here = ++lineNo;
                    String trimmed = line.strip();
                    if (trimmed.isEmpty() || trimmed.startsWith("#")) {
                        continue;
                    }
                    String[] cells = line.split(",", -1);
                    if (cells.length != cellCount) {
                        return null;
                    }
                    String cell = cells[timeCell].strip();
                    OffsetDateTime odt;
                    try {
                        odt = OffsetDateTime.parse(cell);
                    } catch (DateTimeParseException e) {
                        return null;
                    }
                    long now = odt.toEpochSecond();
                    if (now < prev) {
                        return outOfOrder(here, cell, format(prev, offset), prevLine);
                    }
                    prev = now;
                    prevLine = here;
                }
            } catch (IOException e) {
                return null; // the gap stays the error to report
            }
            return null;
        }

        private double value(Column c, String text) {
            if (text.isEmpty()) {
                if (c.required) {
                    throw new WeatherCsvException(source, lineNo, c.header, "empty cell in a required column",
                            "give the " + c.quantity + " for every hour" + (c.unit.isEmpty() ? "" : " in " + c.unit));
                }
                emptyCells[c.ordinal()]++;
                return Double.NaN;
            }
            if (!NUMBER.matcher(text).matches()) {
                throw new WeatherCsvException(source, lineNo, c.header, "\"" + text + "\" is not a number",
                        "write a plain decimal number with a point and no unit, e.g. 21.5"
                                + (c.required ? "" : ", or leave the cell empty when not given"));
            }
            double v = Double.parseDouble(text);
            if (!(v >= c.min && v <= c.max)) {
                throw new WeatherCsvException(source, lineNo, c.header, c.quantity + " \"" + text
                        + "\" is outside the accepted range " + c.range(), c.rangeFix);
            }
            return c.toSi.applyAsDouble(v);
        }

        private void grow() {
            int n = epoch.length * 2;
            epoch = Arrays.copyOf(epoch, n);
            lineOfRow = Arrays.copyOf(lineOfRow, n);
            for (int k = 0; k < si.length; k++) {
                si[k] = Arrays.copyOf(si[k], n);
            }
        }

        /** Places rows at their hour index and fills the gaps the parser let through. */
        private WeatherRead layOut() {
            long t0 = epoch[0];
            int hours = Math.toIntExact((epoch[rows - 1] - t0) / HOUR_S + 1);
            long[] time = new long[hours];
            double[][] out = new double[COLUMNS.length][hours];
            List<String> notes = new ArrayList<>();
            int filled = 0;
            int prevHour = -1;
            for (int r = 0; r < rows; r++) {
                int h = (int) ((epoch[r] - t0) / HOUR_S);
                time[h] = epoch[r];
                for (int k = 0; k < COLUMNS.length; k++) {
                    out[k][h] = si[k][r];
                }
                int gap = h - prevHour - 1;
                if (r > 0 && gap > 0) {
                    for (int m = prevHour + 1; m < h; m++) {
                        time[m] = t0 + (long) m * HOUR_S;
                        double f = (double) (m - prevHour) / (h - prevHour);
                        for (int k = 0; k < COLUMNS.length; k++) {
                            out[k][m] = linear(out[k][prevHour], out[k][h], f);
                        }
                    }
                    filled += gap;
                    notes.add("filled " + gap + " missing hour" + (gap > 1 ? "s" : "") + " between "
                            + format(epoch[r - 1], offset) + " (line " + lineOfRow[r - 1] + ") and "
                            + format(epoch[r], offset) + " (line " + lineOfRow[r] + ") by linear interpolation");
                }
                prevHour = h;
            }
            for (Column c : COLUMNS) {
                int empty = emptyCells[c.ordinal()];
                if (empty > 0) {
                    notes.add("column " + c.header + ": " + empty + " of " + rows
                            + " rows empty (not given; modelled where needed)");
                }
            }
            HourlyWeather w = new HourlyWeather(time, offset.getTotalSeconds(),
                    out[Column.AIR_TEMP_C.ordinal()], out[Column.REL_HUMIDITY_PCT.ordinal()],
                    out[Column.WIND_MS.ordinal()], out[Column.GHI_WM2.ordinal()], out[Column.DNI_WM2.ordinal()],
                    out[Column.DHI_WM2.ordinal()], out[Column.SKY_LW_WM2.ordinal()],
                    out[Column.CLOUD_FRACTION.ordinal()], out[Column.PRESSURE_HPA.ordinal()]);
            return new WeatherRead(w, source, filled, notes);
        }
    }

    /**
     * Linear interpolation {@code x₀ + (x₁ − x₀)·f} at fraction {@code f} ∈ (0, 1) of the way
     * from x₀ to x₁; NaN (not given) when either end is NaN.
     */
    static double linear(double x0, double x1, double f) {
        return x0 + (x1 - x0) * f;
    }

    // ---------------------------------------------------------------------------- coverage

    /** See {@link WeatherCoverage#requireCovers}. */
    public static void requireCovers(HourlyWeather weather, String source, Instant start, Instant end) {
        WeatherCoverage.requireCovers(weather, source, start, end);
    }

    /** See {@link WeatherCoverage#slice}. */
    public static HourlyWeather slice(HourlyWeather weather, String source, Instant start, Instant end) {
        return WeatherCoverage.slice(weather, source, start, end);
    }

    // -------------------------------------------------------------------------------- write

    /** {@link #write(HourlyWeather, Writer, List)} with no comment lines. */
    public static void write(HourlyWeather weather, Writer out) throws IOException {
        WeatherCsvWriter.write(weather, out);
    }

    /** {@link #write(HourlyWeather, Path, List)} with no comment lines. */
    public static void write(HourlyWeather weather, Path file) throws IOException {
        WeatherCsvWriter.write(weather, file);
    }

    /** See {@link WeatherCsvWriter#write(HourlyWeather, Path, List)}. */
    public static void write(HourlyWeather weather, Path file, List<String> comments) throws IOException {
        WeatherCsvWriter.write(weather, file, comments);
    }

    /** See {@link WeatherCsvWriter#write(HourlyWeather, Writer, List)}. */
    public static void write(HourlyWeather weather, Writer out, List<String> comments) throws IOException {
        WeatherCsvWriter.write(weather, out, comments);
    }

    // ------------------------------------------------------------------------ column names

    /** See {@link WeatherCsvColumns#unknownColumnFix}. */
    static String unknownColumnFix(String name) {
        return WeatherCsvColumns.unknownColumnFix(name);
    }

    /** See {@link WeatherCsvColumns#editDistance}. */
    static int editDistance(String a, String b) {
        return WeatherCsvColumns.editDistance(a, b);
    }

    /** A time as the format writes it: local time in {@code offset}, seconds only when not zero. */
    static String format(long epochSecond, ZoneOffset offset) {
        OffsetDateTime t = OffsetDateTime.ofInstant(Instant.ofEpochSecond(epochSecond), offset);
        return (t.getSecond() == 0 ? TIME_MINUTES : TIME_SECONDS).format(t);
    }

    static String format(Instant t, ZoneOffset offset) {
        return t.getNano() == 0 ? format(t.getEpochSecond(), offset) : OffsetDateTime.ofInstant(t, offset).toString();
    }

}
