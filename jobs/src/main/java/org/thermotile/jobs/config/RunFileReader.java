package org.thermotile.jobs.config;

import com.fasterxml.jackson.databind.JsonNode;
import java.io.IOException;
import java.net.URI;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.InvalidPathException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.DateTimeException;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.time.format.DateTimeParseException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.regex.Pattern;
import org.thermotile.jobs.config.RunFile.Convection;
import org.thermotile.jobs.config.RunFile.MapKind;
import org.thermotile.model.balance.ColumnSpacing;

/**
 * Reads and validates a run file (YAML). Every problem of the file is collected and reported
 * together in one {@link RunFileException}; each message names the file, the line and column,
 * the key path ({@code outputs.maps[2]}), the bad value and the fix. A misspelt key at any level
 * is an error that suggests the closest known key ({@link Suggest}).
 *
 * <p>Input paths are resolved against the run file's folder and kept as strings; values with a
 * URI scheme ({@code file:}, {@code hdfs:}, …) are kept as written. The reader does not open the
 * inputs: whether they exist and agree is the run check's business.
 *
 * <p>Defaults (design choices of this project, not physical constants): {@code site} absent =
 * raster centre at elevation 0 m; {@code weather.fill_gaps_max_hours} 0; {@code
 * period.spin_up_days} {@value #DEFAULT_SPIN_UP_DAYS}; {@code physics.timestep_minutes}
 * {@value #DEFAULT_TIMESTEP_MINUTES}; {@code physics.convection} {@value #DEFAULT_CONVECTION};
 * {@code physics.deep_ground_temp_c} the period's mean air temperature; {@code
 * physics.column_spacing} {@code standard} ({@link ColumnSpacing#STANDARD}); {@code outputs.hourly_days}
 * none; {@code tiling.tile_size} {@value #DEFAULT_TILE_SIZE}.
 */
public final class RunFileReader {
    /**
     * Top-level sections kept as raw trees in {@link RunFile#reserved()}, each checked here by its own
     * reader ({@link ScenariosReader}; {@link RunBlocks} for geometry and hotspots).
     */
    public static final List<String> RESERVED_KEYS = List.of("scenarios", "sweep", "hotspots", "geometry");
    /** Named wind correlations for the convective coefficient. */
    public static final List<String> CONVECTION_MODELS = List.of("mcadams");

    public static final int DEFAULT_SPIN_UP_DAYS = 2;
    public static final int DEFAULT_TIMESTEP_MINUTES = 10;
    public static final String DEFAULT_CONVECTION = "mcadams";
    public static final int DEFAULT_TILE_SIZE = 256;

    static final List<String> TOP = List.of("name", "site", "inputs", "weather", "period", "physics",
            "outputs", "tiling", "grid", "observations");
    static final List<String> SITE = List.of("latitude", "longitude", "elevation_m");
    static final List<String> INPUTS = List.of("land_cover", "classes", "materials", "heights", "districts",
            "buildings");
    static final List<String> BUILDINGS = List.of("file", "height", "floors", "storey_height_m", "roof_material",
            "crs");
    static final List<String> WEATHER = List.of("file", "fill_gaps_max_hours", "synthetic", "columns", "units",
            "utc_offset", "time_format", "estimate_ghi");
    /** Our weather fields, as named in {@code weather.columns} (time first). */
    public static final List<String> WEATHER_FIELDS = List.of("time", "air_temperature", "relative_humidity",
            "wind_speed", "ghi", "dni", "dhi", "sky_longwave", "cloud_cover", "pressure");
    /** Ways to fill global irradiance when the file has none ({@code weather.estimate_ghi}). */
    public static final List<String> GHI_ESTIMATES = List.of("cloud_cover", "clear_sky");
    static final List<String> SYNTHETIC = List.of("t_min_c", "t_max_c", "rel_humidity_pct", "wind_ms",
            "utc_offset");
    static final List<String> PERIOD = List.of("start", "end", "spin_up_days");
    static final List<String> PHYSICS = List.of("timestep_minutes", "convection", "deep_ground_temp_c",
            "column_spacing");
    static final List<String> OUTPUTS = List.of("maps", "threshold_c", "hourly_days");
    static final List<String> TILING = List.of("tile_size");
    static final List<String> GRID = List.of("crs", "cell_size_m", "area");
    static final List<String> AREA = List.of("bbox", "crs", "polygon");
    /** Keys of one {@code observations:} entry (those of an observations file for {@code thermotile observe}). */
    static final List<String> OBSERVATION = List.of("file", "time", "kind", "units", "scale", "offset", "nodata",
            "band", "mask");
    static final List<String> OBSERVATION_KINDS = List.of("surface_temperature", "brightness_temperature",
            "radiance");
    static final List<String> BAND = List.of("k1", "k2", "from_um", "to_um");
    static final List<String> MASK = List.of("file", "keep");

    /** Which section each key belongs to, for "'tile_size' belongs under 'tiling'". */
    private static final Map<String, String> HOME = new LinkedHashMap<>();

    static {
        TOP.forEach(k -> HOME.put(k, "top level"));
        RESERVED_KEYS.forEach(k -> HOME.put(k, "top level"));
        SITE.forEach(k -> HOME.put(k, "site"));
        INPUTS.forEach(k -> HOME.put(k, "inputs"));
        BUILDINGS.forEach(k -> HOME.putIfAbsent(k, "inputs.buildings"));
        WEATHER.forEach(k -> HOME.put(k, "weather"));
        SYNTHETIC.forEach(k -> HOME.put(k, "weather.synthetic"));
        PERIOD.forEach(k -> HOME.put(k, "period"));
        PHYSICS.forEach(k -> HOME.put(k, "physics"));
        OUTPUTS.forEach(k -> HOME.put(k, "outputs"));
        TILING.forEach(k -> HOME.put(k, "tiling"));
        GRID.forEach(k -> HOME.putIfAbsent(k, "grid"));
        AREA.forEach(k -> HOME.putIfAbsent(k, "grid.area"));
    }

    private static final Pattern NAME = Pattern.compile("[a-z0-9_-]{1,64}");
    /** A URI scheme of two or more characters (so that "C:\…" stays a path). */
    private static final Pattern URI_SCHEME = Pattern.compile("^[A-Za-z][A-Za-z0-9+.-]+:.*");

    private RunFileReader() {
    }

    /**
     * Reads and validates the run file at {@code file}.
     *
     * @throws RunFileException listing every problem found (unreadable file, YAML syntax, unknown
     *                          keys, missing keys, wrong types, out-of-range or inconsistent values)
     */
    public static RunFile read(Path file) {
        Path abs = file.toAbsolutePath().normalize();
        String text;
        try {
            text = Files.readString(abs, StandardCharsets.UTF_8);
        } catch (NoSuchFileException e) {
            throw new RunFileException(abs.toString(), List.of(abs + ": no such file; check the "
                    + "path, or write a run file there (see data-samples/riverside/run.yaml)"));
        } catch (IOException e) {
            throw new RunFileException(abs.toString(), List.of(abs + ": cannot be read ("
                    + e + "); check the path and its permissions"));
        }
        return parse(text, abs.getParent(), abs.toString());
    }

    /**
     * Validates run-file {@code text} as if read from a file named {@code source} in folder
     * {@code baseDir} (relative input paths resolve against it).
     *
     * @throws RunFileException listing every problem found
     */
    public static RunFile parse(String text, Path baseDir, String source) {
        YamlDoc doc = YamlDoc.parse(source, text);
        RunFile rf = doc.root == null ? null : build(doc, baseDir.toAbsolutePath().normalize(), source);
        if (doc.hasProblems() || rf == null) {
            throw new RunFileException(source, doc.problems());
        }
        return rf;
    }

    private static RunFile build(YamlDoc doc, Path baseDir, String source) {
        Section top = Section.of(doc, doc.root, "");
        if (top == null) {
            return null;
        }
        top.checkKeys(TOP, RESERVED_KEYS, HOME);

        String name = top.text("name", true, "give the run a name such as 'riverside-hot-week'");
        if (name != null && !NAME.matcher(name).matches()) {
            String fixed = name.toLowerCase(Locale.ROOT).replaceAll("[^a-z0-9_-]+", "-");
            fixed = fixed.length() > 64 ? fixed.substring(0, 64) : fixed;
            doc.at("name", "'" + name + "' may use only a-z, 0-9, '-' and '_' (1 to 64 characters); "
                    + "for example '" + fixed + "'");
        }
        RunFile.Site site = site(top.section("site", false, ""));
        RunFile.Inputs inputs = inputs(top.section("inputs", true,
                "add 'inputs:' with at least land_cover and classes"), baseDir);
        RunFile.Weather weather = weather(top.section("weather", true,
                "add 'weather:' with 'file: weather.csv' or 'synthetic: {…}'"), baseDir);
        List<RunFile.NamedPeriod> periods = periods(doc, top.raw("sweep"), weather, baseDir);
        RunFile.Period period;
        List<RunFile.Period> spans = new ArrayList<>();
        if (top.raw("sweep") != null && top.raw("sweep").has("periods")) {
            if (top.has("period")) {
                doc.at("period", "is given together with sweep.periods, which lists the periods to run; "
                        + "remove 'period:' and give its dates as one entry of sweep.periods");
            }
            period = periods.isEmpty() ? null : periods.get(0).period();
            periods.forEach(np -> spans.add(np.period()));
        } else {
            period = period(top.section("period", true, "add 'period:' with start and end dates"));
            if (period != null) {
                spans.add(period);
            }
        }
        RunFile.Physics physics = physics(top.section("physics", false, ""));
        RunFile.Outputs outputs = outputs(top.section("outputs", true,
                "add 'outputs:' with at least 'maps: [peak]'"), spans);
        RunFile.Tiling tiling = tiling(top.section("tiling", false, ""));
        RunFile.Grid grid = grid(top.section("grid", false, ""), baseDir);
        List<RunFile.Observation> observations = observations(top, baseDir, period, weather, !periods.isEmpty()
                || (top.raw("sweep") != null && top.raw("sweep").has("periods")));

        Map<String, JsonNode> reserved = new TreeMap<>();
        for (String k : RESERVED_KEYS) {
            if (top.raw(k) != null) {
                reserved.put(k, top.raw(k));
            }
        }
        RunBlocks.checkGeometry(doc, top.section("geometry", false, ""), inputs, top.raw("geometry"));
        RunBlocks.checkHotspots(top.section("hotspots", false, ""), outputs);
        ScenariosReader.Result sc = ScenariosReader.read(doc, top.raw("scenarios"), top.raw("sweep"));
        if (doc.hasProblems()) {
            return null;
        }
        return new RunFile(source, name, site, inputs, weather, period, physics, outputs, tiling, reserved,
                sc.scenarios(), sc.sweepMax(), periods, grid, observations);
    }

    // ---------------------------------------------------------------- sections

    private static RunFile.Site site(Section s) {
        if (s == null) {
            return new RunFile.Site(Double.NaN, Double.NaN, 0);
        }
        s.checkKeys(SITE, List.of(), HOME);
        Double lat = s.number("latitude", false, "give degrees north, e.g. 45.07");
        Double lon = s.number("longitude", false, "give degrees east, e.g. 7.68");
        Double elev = s.number("elevation_m", false, "give metres above sea level, e.g. 240");
        if (lat != null && !(lat >= -90 && lat <= 90)) {
            s.doc.at(s.child("latitude"), lat + " is outside -90…90°; give degrees north (south negative)");
        }
        if (lon != null && !(lon >= -180 && lon <= 180)) {
            s.doc.at(s.child("longitude"), lon + " is outside -180…180°; give degrees east (west negative)");
        }
        if (s.has("latitude") != s.has("longitude")) {
            s.doc.at(s.path, "give both latitude and longitude, or neither (then the centre of the "
                    + "land-cover raster is used)");
        }
        if (elev != null && !(elev > -500 && elev < 9000)) {
            s.doc.at(s.child("elevation_m"), elev + " m is outside -500…9000 m; give metres above sea level");
        }
        return new RunFile.Site(lat == null ? Double.NaN : lat, lon == null ? Double.NaN : lon,
                elev == null ? 0 : elev);
    }

    private static RunFile.Inputs inputs(Section s, Path baseDir) {
        if (s == null) {
            return null;
        }
        s.checkKeys(INPUTS, List.of(), HOME);
        List<String> landCoverTiles = tiles(s, "land_cover", true, "give the land-cover GeoTIFF, e.g. landcover.tif, "
                + "or its tiles as a list [a.tif, b.tif] or a glob 'tiles/*.tif'", baseDir);
        String landCover = landCoverTiles.isEmpty() ? null : landCoverTiles.get(0);
        String classes = null;
        String c = s.text("classes", true, "name a built-in table (" + String.join(" | ",
                ClassTableReader.BUILT_IN) + ") or give a class table file (.yaml or .csv)");
        if (c != null) {
            if (ClassTableReader.BUILT_IN.contains(c)) {
                classes = c;
            } else if (!ClassTableReader.hasTableExtension(c)) {
                s.doc.at(s.child("classes"), "'" + c + "' is neither a built-in table ("
                        + String.join(" | ", ClassTableReader.BUILT_IN) + ") nor a .yaml, .yml or .csv "
                        + "class table" + Suggest.didYouMean(c, ClassTableReader.BUILT_IN));
            } else {
                classes = resolve(s, "classes", c, baseDir);
            }
        }
        String materials = location(s, "materials", false, "give a materials YAML file", baseDir);
        List<String> heightsTiles = tiles(s, "heights", false, "give a height GeoTIFF, or its tiles as a list or a glob",
                baseDir);
        String heights = heightsTiles.isEmpty() ? null : heightsTiles.get(0);
        String districts = location(s, "districts", false, "give a GeoJSON file", baseDir);
        RunFile.Buildings buildings = null;
        Section b = s.section("buildings", false, "");
        if (b != null) {
            buildings = buildings(b, baseDir);
        }
        return new RunFile.Inputs(landCover, classes, materials, heights, districts, landCoverTiles, heightsTiles,
                buildings);
    }

    /** {@code inputs.buildings}: footprints with a height or a floor-count attribute. */
    private static RunFile.Buildings buildings(Section s, Path baseDir) {
        s.checkKeys(BUILDINGS, List.of(), HOME);
        String file = location(s, "file", true, "give the footprints GeoJSON, e.g. file: footprints.geojson", baseDir);
        String height = s.text("height", false, "name the attribute holding the height in metres, e.g. height: height_m");
        String floors = s.text("floors", false, "name the attribute holding the floor count, e.g. floors: levels");
        Double storey = s.number("storey_height_m", false, "give the height of one floor in metres, e.g. 3.0");
        String roof = s.text("roof_material", false, "name the attribute whose value is a material id");
        String crs = s.text("crs", false, "give the coordinates' CRS, e.g. crs: EPSG:32632");
        if (s.has("height") == s.has("floors")) {
            s.doc.at(s.path, s.has("height") ? "gives both 'height' and 'floors'; keep one"
                    : "needs 'height: ATTR' (height in metres) or 'floors: ATTR' with 'storey_height_m: 3.0'");
        }
        if (s.has("floors") && !s.has("storey_height_m")) {
            s.missing("storey_height_m", "floors need the height of one floor, e.g. storey_height_m: 3.0");
        }
        if (s.has("height") && s.has("storey_height_m")) {
            s.doc.at(s.child("storey_height_m"), "applies to 'floors' only; remove it (heights are in metres)");
        }
        if (storey != null && !(storey >= 1.5 && storey <= 10)) {
            s.doc.at(s.child("storey_height_m"), storey + " m is outside 1.5…10 m; give the height of one floor in "
                    + "metres, e.g. 3.0");
        }
        return new RunFile.Buildings(file, height, floors, storey == null || height != null ? Double.NaN : storey,
                roof, crs);
    }

    private static RunFile.Weather weather(Section s, Path baseDir) {
        if (s == null) {
            return null;
        }
        s.checkKeys(WEATHER, List.of(), HOME);
        boolean hasFile = s.has("file");
        boolean hasSynthetic = s.has("synthetic");
        if (hasFile && hasSynthetic) {
            s.doc.at(s.path, "gives both 'file' and 'synthetic'; keep one");
        } else if (!hasFile && !hasSynthetic) {
            s.doc.at(s.path, "needs 'file: weather.csv' (hourly weather) or 'synthetic: {t_min_c: …, "
                    + "t_max_c: …, rel_humidity_pct: …, wind_ms: …, utc_offset: \"+02:00\"}'");
        }
        String file = location(s, "file", false, "give the hourly weather CSV, e.g. weather.csv", baseDir);
        Integer gaps = s.integer("fill_gaps_max_hours", false, "give whole hours, e.g. 3");
        if (gaps != null) {
            if (gaps < 0 || gaps > 24) {
                s.doc.at(s.child("fill_gaps_max_hours"), gaps + " is outside 0…24 h; longer gaps need "
                        + "filling with a method suited to the data before the run");
            }
            if (hasSynthetic && !hasFile) {
                s.doc.at(s.child("fill_gaps_max_hours"), "applies to a weather file only; remove it "
                        + "(synthetic weather has no gaps)");
            }
        }
        RunFile.Synthetic synthetic = null;
        Section sy = s.section("synthetic", false, "");
        if (sy != null) {
            synthetic = synthetic(sy);
        }
        RunFile.WeatherMapping mapping = null;
        boolean mapKeys = s.has("columns") || s.has("units") || s.has("utc_offset") || s.has("time_format")
                || s.has("estimate_ghi");
        if (mapKeys && !hasFile) {
            s.doc.at(s.path, "columns, units, utc_offset, time_format and estimate_ghi describe a weather file; "
                    + "give 'file:' or remove them");
        } else if (mapKeys) {
            mapping = mapping(s);
        }
        return new RunFile.Weather(file, gaps == null ? 0 : gaps, synthetic, mapping);
    }

    /** {@code weather.columns} and its companions: an hourly CSV in another layout. */
    private static RunFile.WeatherMapping mapping(Section s) {
        Map<String, String> columns = new LinkedHashMap<>();
        Section c = s.section("columns", true, "map our fields onto the file's column names, e.g. columns: "
                + "{time: Date, air_temperature: Temp, relative_humidity: RH, wind_speed: Wind, ghi: Solar}");
        if (c != null) {
            c.checkKeys(WEATHER_FIELDS, List.of(), Map.of());
            for (String k : WEATHER_FIELDS) {
                String v = c.text(k, false, "give the file's column name for " + k);
                if (v != null) {
                    columns.put(k, v.strip());
                }
            }
            for (String k : List.of("time", "air_temperature", "relative_humidity", "wind_speed")) {
                if (!c.has(k)) {
                    c.missing(k, "name the file's column for " + k + " (required)");
                }
            }
        }
        Map<String, String> units = new LinkedHashMap<>();
        Section u = s.section("units", false, "");
        if (u != null) {
            u.checkKeys(WEATHER_FIELDS.subList(1, WEATHER_FIELDS.size()), List.of(), Map.of());
            for (String k : WEATHER_FIELDS.subList(1, WEATHER_FIELDS.size())) {
                String v = u.text(k, false, "give the unit of the " + k + " column, e.g. degF, km/h, %");
                if (v != null) {
                    units.put(k, v.strip());
                }
            }
        }
        ZoneOffset offset = null;
        JsonNode o = s.raw("utc_offset");
        if (o != null && !o.isNull()) {
            try {
                offset = o.isTextual() ? ZoneOffset.of(o.asText().strip()) : null;
            } catch (DateTimeException e) {
                offset = null;
            }
            if (offset == null) {
                s.doc.at(s.child("utc_offset"), YamlDoc.describe(o) + " is not a UTC offset; write \"+HH:MM\" or "
                        + "\"-HH:MM\" in quotes (e.g. \"+02:00\"), or \"Z\" for UTC");
            }
        }
        String format = s.text("time_format", false, "give a date-time pattern, e.g. \"dd/MM/yyyy HH:mm\"");
        if (format != null) {
            try {
                java.time.format.DateTimeFormatter.ofPattern(format, Locale.ROOT);
            } catch (IllegalArgumentException e) {
                s.doc.at(s.child("time_format"), "'" + format + "' is not a date-time pattern (" + e.getMessage()
                        + "); use letters such as yyyy MM dd HH mm, e.g. \"dd/MM/yyyy HH:mm\"");
            }
        }
        String est = s.text("estimate_ghi", false, "one of " + String.join(", ", GHI_ESTIMATES));
        if (est != null && !GHI_ESTIMATES.contains(est)) {
            s.doc.at(s.child("estimate_ghi"), "'" + est + "' is not a way to estimate irradiance"
                    + Suggest.didYouMean(est, GHI_ESTIMATES) + "; use one of " + String.join(", ", GHI_ESTIMATES));
        }
        if (c != null && !c.has("ghi") && est == null) {
            c.missing("ghi", "name the file's global irradiance column, or estimate it with "
                    + "weather.estimate_ghi: cloud_cover (needs a cloud_cover column) or clear_sky");
        }
        if (c != null && c.has("ghi") && est != null) {
            s.doc.at(s.child("estimate_ghi"), "the file gives ghi (column '" + columns.get("ghi") + "'); remove "
                    + "estimate_ghi or the ghi column");
        }
        if ("cloud_cover".equals(est) && c != null && !c.has("cloud_cover")) {
            c.missing("cloud_cover", "estimate_ghi: cloud_cover needs the file's cloud-cover column");
        }
        return new RunFile.WeatherMapping(columns, units, offset, format, est);
    }

    private static RunFile.Synthetic synthetic(Section s) {
        s.checkKeys(SYNTHETIC, List.of(), HOME);
        Double tMin = celsius(s, "t_min_c", true, "give the daily minimum air temperature in °C, e.g. 19", -90, 60);
        Double tMax = celsius(s, "t_max_c", true, "give the daily maximum air temperature in °C, e.g. 34", -90, 60);
        Double rh = s.number("rel_humidity_pct", true, "give relative humidity in %, e.g. 45");
        Double wind = s.number("wind_ms", true, "give wind speed in m/s, e.g. 2.5");
        if (tMin != null && tMax != null && tMin > tMax) {
            s.doc.at(s.child("t_max_c"), "t_max_c " + tMax + " is below t_min_c " + tMin + "; swap them");
        }
        if (rh != null && !(rh >= 0 && rh <= 100)) {
            s.doc.at(s.child("rel_humidity_pct"), rh + " is outside 0…100 %; give percent, e.g. 45 (not 0.45)");
        }
        if (wind != null && !(wind >= 0 && wind < 100)) {
            s.doc.at(s.child("wind_ms"), wind + " is outside 0…100 m/s; give metres per second (km/h ÷ 3.6)");
        }
        ZoneOffset offset = null;
        JsonNode o = s.raw("utc_offset");
        if (o == null || o.isNull()) {
            s.missing("utc_offset", "give the local clock's offset from UTC in quotes, e.g. utc_offset: \"+02:00\"");
        } else if (!o.isTextual()) {
            s.doc.at(s.child("utc_offset"), "expected text such as \"+02:00\", got " + YamlDoc.describe(o)
                    + "; write it in quotes");
        } else {
            try {
                offset = ZoneOffset.of(o.asText().strip());
            } catch (DateTimeException e) {
                s.doc.at(s.child("utc_offset"), "'" + o.asText() + "' is not a UTC offset; write "
                        + "\"+HH:MM\" or \"-HH:MM\" (e.g. \"+02:00\"), or \"Z\" for UTC");
            }
        }
        if (tMin == null || tMax == null || rh == null || wind == null || offset == null) {
            return null;
        }
        return new RunFile.Synthetic(tMin, tMax, rh, wind, offset);
    }

    private static RunFile.Period period(Section s) {
        if (s == null) {
            return null;
        }
        s.checkKeys(PERIOD, List.of(), HOME);
        return periodValues(s);
    }

    /** Start, end and spin-up of a period section (or of an entry of sweep.periods), keys already checked. */
    private static RunFile.Period periodValues(Section s) {
        LocalDateTime start = time(s, "start", false);
        LocalDateTime end = time(s, "end", true);
        Integer spin = s.integer("spin_up_days", false, "give whole days, e.g. 2");
        if (spin != null && (spin < 0 || spin > 365)) {
            s.doc.at(s.child("spin_up_days"), spin + " is outside 0…365 days; give whole days, e.g. 2");
        }
        if (start != null && end != null && !end.isAfter(start)) {
            s.doc.at(s.child("end"), "end " + s.raw("end").asText() + " is not after start "
                    + s.raw("start").asText() + "; the end must not come before the start (a date "
                    + "end is inclusive, a date-time end is the instant the run stops)");
        }
        if (start == null || end == null || !end.isAfter(start)) {
            return null;
        }
        return new RunFile.Period(start, end, spin == null ? DEFAULT_SPIN_UP_DAYS : spin);
    }

    /** Keys of one entry of {@code sweep.periods}. */
    static final List<String> SWEEP_PERIOD = List.of("name", "weather", "start", "end", "spin_up_days");

    /**
     * The weather axis, {@code sweep.periods}: a list of named periods, each with its own dates and,
     * optionally, its own weather file (default: the run's {@code weather:}).
     */
    private static List<RunFile.NamedPeriod> periods(YamlDoc doc, JsonNode sweep, RunFile.Weather runWeather,
            Path baseDir) {
        List<RunFile.NamedPeriod> out = new ArrayList<>();
        if (sweep == null || !sweep.isObject() || !sweep.has("periods")) {
            return out;
        }
        JsonNode list = sweep.get("periods");
        String fix = "list named periods, e.g. periods: [{name: july-2025, weather: weather-2025.csv, "
                + "start: 2025-07-14, end: 2025-07-18}]";
        if (!list.isArray() || list.isEmpty()) {
            doc.at("sweep.periods", "expected a non-empty list of periods; " + fix);
            return out;
        }
        java.util.Set<String> names = new java.util.HashSet<>();
        for (int i = 0; i < list.size(); i++) {
            Section s = Section.of(doc, list.get(i), "sweep.periods[" + i + "]");
            if (s == null) {
                continue;
            }
            s.checkKeys(SWEEP_PERIOD, List.of(), HOME);
            String name = s.text("name", true, "give the period a name, e.g. 'name: july-2025'");
            if (name != null) {
                if (!name.matches("[a-z0-9][a-z0-9._-]{0,63}")) {
                    doc.at(s.child("name"), "period name '" + name + "' must use lower-case letters, digits, "
                            + "'.', '-' and '_' (1 to 64 characters); it names a folder and a partition");
                } else if (!names.add(name)) {
                    doc.at(s.child("name"), "period name '" + name + "' is used twice; give each period its own name");
                }
            }
            RunFile.Weather w = runWeather;
            if (s.has("weather")) {
                String file = location(s, "weather", false, "give an hourly weather CSV, e.g. weather-2025.csv",
                        baseDir);
                w = file == null ? null : new RunFile.Weather(file,
                        runWeather == null ? 0 : runWeather.fillGapsMaxHours(), null,
                        runWeather == null ? null : runWeather.mapping());
            }
            RunFile.Period p = periodValues(s);
            if (name != null && w != null && p != null) {
                out.add(new RunFile.NamedPeriod(name, w, p));
            }
        }
        return out;
    }

    /** A local date (start: its midnight; end: the next midnight) or a local date-time on the hour. */
    private static LocalDateTime time(Section s, String key, boolean isEnd) {
        String fix = "write a local date 2026-07-13 or a local date-time 2026-07-13T06:00";
        JsonNode v = s.raw(key);
        if (v == null || v.isNull()) {
            s.missing(key, fix);
            return null;
        }
        if (!v.isTextual()) {
            s.doc.at(s.child(key), "expected a date, got " + YamlDoc.describe(v) + "; " + fix);
            return null;
        }
        String t = v.asText().strip();
        try {
            if (t.length() <= 10) {
                LocalDate d = LocalDate.parse(t);
                return isEnd ? d.plusDays(1).atStartOfDay() : d.atStartOfDay();
            }
            LocalDateTime dt = LocalDateTime.parse(t.replace(' ', 'T'));
            if (dt.getMinute() != 0 || dt.getSecond() != 0 || dt.getNano() != 0) {
                s.doc.at(s.child(key), "'" + t + "' is not on a whole hour; the weather is hourly, "
                        + "so write e.g. " + dt.withMinute(0).withSecond(0).withNano(0));
                return null;
            }
            return dt;
        } catch (DateTimeParseException e) {
            s.doc.at(s.child(key), "'" + t + "' is not a date; " + fix
                    + " (local clock time, no offset)");
            return null;
        }
    }

    private static RunFile.Physics physics(Section s) {
        if (s == null) {
            return new RunFile.Physics(DEFAULT_TIMESTEP_MINUTES,
                    new Convection(DEFAULT_CONVECTION, Double.NaN), Double.NaN);
        }
        s.checkKeys(PHYSICS, List.of(), HOME);
        Integer step = s.integer("timestep_minutes", false, "give whole minutes that divide 60, e.g. 10");
        if (step != null && (step < 1 || step > 60 || 60 % step != 0)) {
            s.doc.at(s.child("timestep_minutes"), step + " does not divide an hour; use one of "
                    + "1, 2, 3, 4, 5, 6, 10, 12, 15, 20, 30, 60");
            step = null;
        }
        Convection conv = new Convection(DEFAULT_CONVECTION, Double.NaN);
        JsonNode c = s.raw("convection");
        String cp = s.child("convection");
        String fix = "give a correlation name (" + String.join(" | ", CONVECTION_MODELS)
                + ") or a fixed coefficient in W/(m² K), e.g. 12";
        if (c != null && !c.isNull()) {
            if (c.isTextual()) {
                String name = c.asText().strip();
                if (CONVECTION_MODELS.contains(name)) {
                    conv = new Convection(name, Double.NaN);
                } else if (name.matches("[-+0-9.eE]+")) {
                    s.doc.at(cp, "'" + name + "' is a number in quotes; write it without quotes for a "
                            + "fixed coefficient in W/(m² K)");
                } else {
                    s.doc.at(cp, "'" + name + "' is not a known correlation" + Suggest.didYouMean(name,
                            CONVECTION_MODELS) + "; " + fix);
                }
            } else {
                Double h = Section.number(s.doc, c, cp, fix);
                if (h != null) {
                    if (!(h > 0 && h <= 100)) {
                        s.doc.at(cp, h + " W/(m² K) is outside (0, 100]; " + fix);
                    } else {
                        conv = new Convection(Convection.FIXED, h);
                    }
                }
            }
        }
        Double deep = celsius(s, "deep_ground_temp_c", false,
                "give °C, e.g. 15, or null for the period's mean air temperature", -60, 60);
        return new RunFile.Physics(step == null ? DEFAULT_TIMESTEP_MINUTES : step, conv,
                deep == null ? Double.NaN : deep, columnSpacing(s));
    }

    /** {@code physics.column_spacing}: a name from {@link ColumnSpacing#names()}, standard when absent or null. */
    private static ColumnSpacing columnSpacing(Section s) {
        JsonNode v = s.raw("column_spacing");
        if (v == null || v.isNull()) {
            return ColumnSpacing.STANDARD;
        }
        String p = s.child("column_spacing");
        String fix = "use one of " + String.join(" | ", ColumnSpacing.names()) + " (default "
                + ColumnSpacing.STANDARD.name() + "; coarse spaces the nodes below 25 cm wider, for fewer of them)";
        if (!v.isTextual()) {
            s.doc.at(p, "expected a spacing name, got " + YamlDoc.describe(v) + "; " + fix);
            return ColumnSpacing.STANDARD;
        }
        String name = v.asText().strip();
        ColumnSpacing spacing = ColumnSpacing.named(name);
        if (spacing == null) {
            s.doc.at(p, "'" + name + "' is not a column spacing" + Suggest.didYouMean(name, ColumnSpacing.names())
                    + "; " + fix);
            return ColumnSpacing.STANDARD;
        }
        return spacing;
    }

    private static RunFile.Outputs outputs(Section s, List<RunFile.Period> periods) {
        if (s == null) {
            return null;
        }
        s.checkKeys(OUTPUTS, List.of(), HOME);
        List<MapKind> maps = new ArrayList<>();
        String mapFix = "use names from: " + String.join(", ", MapKind.keys());
        JsonNode list = s.list("maps", true, "list the maps to write, e.g. maps: [peak, mean]; " + mapFix);
        if (list != null) {
            if (list.isEmpty()) {
                s.doc.at(s.child("maps"), "is empty; list at least one map, " + mapFix);
            }
            for (int i = 0; i < list.size(); i++) {
                JsonNode m = list.get(i);
                String p = s.child("maps") + "[" + i + "]";
                MapKind k = m.isTextual() ? MapKind.fromKey(m.asText().strip()) : null;
                if (k == null) {
                    String word = m.isTextual() ? "'" + m.asText() + "'" : YamlDoc.describe(m);
                    s.doc.at(p, word + " is not a map name" + (m.isTextual()
                            ? Suggest.didYouMean(m.asText(), MapKind.keys()) : "") + "; " + mapFix);
                } else if (maps.contains(k)) {
                    s.doc.at(p, "'" + k.key() + "' is listed twice; keep one");
                } else {
                    maps.add(k);
                }
            }
        }
        Double threshold = celsius(s, "threshold_c", false,
                "give the surface temperature threshold in °C, e.g. 45", -100, 150);
        if (!s.has("threshold_c")) {
            for (MapKind k : maps) {
                if (k.needsThreshold()) {
                    s.missing("threshold_c", "map '" + k.key() + "' counts hours above a surface "
                            + "temperature threshold; add e.g. threshold_c: 45");
                    break;
                }
            }
        }
        TreeSet<LocalDate> days = new TreeSet<>();
        JsonNode dl = s.list("hourly_days", false, "list local dates, e.g. hourly_days: [2026-07-16], or []");
        if (dl != null) {
            for (int i = 0; i < dl.size(); i++) {
                JsonNode d = dl.get(i);
                String p = s.child("hourly_days") + "[" + i + "]";
                LocalDate day = null;
                try {
                    day = d.isTextual() ? LocalDate.parse(d.asText().strip()) : null;
                } catch (DateTimeParseException e) {
                    day = null;
                }
                if (day == null) {
                    s.doc.at(p, YamlDoc.describe(d) + " is not a date; write a local date such as 2026-07-16");
                } else if (!days.add(day)) {
                    s.doc.at(p, day + " is listed twice; keep one");
                } else if (!periods.isEmpty() && !inAny(periods, day)) {
                    RunFile.Period period = periods.get(0);
                    s.doc.at(p, periods.size() == 1
                            ? day + " is not a whole day inside the period " + period.start() + " … "
                                    + period.end() + " (end exclusive); pick a day of the period"
                            : day + " is not a whole day inside any of sweep.periods; pick a day of one of them "
                                    + "(each period writes the hourly grids of the days it holds)");
                }
            }
        }
        return new RunFile.Outputs(maps, threshold == null ? Double.NaN : threshold, new ArrayList<>(days));
    }

    /**
     * {@code observations:}: thermal images compared with the finished run. Each entry needs a file
     * and an acquisition time with Z or an offset; a time outside the counted period is refused here
     * when the weather states its UTC offset (synthetic weather, {@code weather.utc_offset}), else by
     * the run check once the weather file is read. Files are resolved, not opened: whether the
     * image covers the grid and its mask keeps any pixel is the run check's business.
     */
    private static List<RunFile.Observation> observations(Section top, Path baseDir, RunFile.Period period,
            RunFile.Weather weather, boolean sweepPeriods) {
        List<RunFile.Observation> out = new ArrayList<>();
        String fix = "list images, e.g. observations: [{file: lst.tif, time: 2026-07-16T10:30:00Z}]";
        JsonNode list = top.list("observations", false, fix);
        if (list == null) {
            return out;
        }
        YamlDoc doc = top.doc;
        if (list.isEmpty()) {
            doc.at("observations", "is empty; " + fix + ", or remove the key");
        }
        if (sweepPeriods && !list.isEmpty()) {
            doc.at("observations", "is given together with sweep.periods; an image belongs to one period. Fix: "
                    + "run that period as a run of its own with the observations, or compare afterwards with "
                    + "'thermotile observe PERIOD_DIR --observations FILE.yaml'");
        }
        ZoneOffset offset = weather == null ? null : weather.isSynthetic() ? weather.synthetic().utcOffset()
                : weather.mapping() != null ? weather.mapping().utcOffset() : null;
        java.util.Set<String> names = new java.util.HashSet<>();
        for (int i = 0; i < list.size(); i++) {
            Section s = Section.of(doc, list.get(i), "observations[" + i + "]");
            if (s == null) {
                continue;
            }
            s.checkKeys(OBSERVATION, List.of(), Map.of());
            String file = location(s, "file", true, "name the image's GeoTIFF, e.g. file: observed/lst.tif", baseDir);
            if (file != null) {
                String stem = Path.of(file).getFileName().toString().replaceFirst("\\.[A-Za-z]+$", "");
                if (!names.add(stem)) {
                    doc.at(s.child("file"), "another image has the file name '" + stem + "' (its difference map would "
                            + "overwrite this one's); give the images distinct file names");
                }
            }
            java.time.Instant time = null;
            String t = s.text("time", true, "give the acquisition time in UTC, e.g. time: 2026-07-16T10:30:00Z");
            if (t != null) {
                try {
                    time = java.time.OffsetDateTime.parse(t).toInstant();
                } catch (DateTimeParseException e) {
                    doc.at(s.child("time"), "'" + t + "' is not an ISO-8601 time with Z or an offset; write e.g. "
                            + "2026-07-16T10:30:00Z or 2026-07-16T12:30:00+02:00");
                }
            }
            if (time != null && period != null && offset != null) {
                java.time.Instant first = period.start().toInstant(offset);
                java.time.Instant last = period.end().toInstant(offset).minusSeconds(3600);
                if (time.isBefore(first) || time.isAfter(last)) {
                    doc.at(s.child("time"), time + " is outside the run's counted hours " + first + " … " + last
                            + " (period " + period.start() + " … " + period.end() + ", UTC offset " + offset
                            + "); correct the time, or widen the period to hold it");
                }
            }
            String kind = s.text("kind", false, "give one of " + String.join(", ", OBSERVATION_KINDS));
            if (kind != null && !OBSERVATION_KINDS.contains(kind)) {
                doc.at(s.child("kind"), "'" + kind + "' is not a kind of image" + Suggest.didYouMean(kind,
                        OBSERVATION_KINDS) + "; use one of " + String.join(", ", OBSERVATION_KINDS));
                kind = null;
            }
            kind = kind == null ? "surface_temperature" : kind;
            String units = s.text("units", false, "give K or degC");
            if (units != null && !units.equals("K") && !units.equals("degC")) {
                doc.at(s.child("units"), "'" + units + "' is not a temperature unit" + Suggest.didYouMean(units,
                        List.of("K", "degC")) + "; use K or degC");
            }
            if (kind.equals("radiance") && "degC".equals(units)) {
                doc.at(s.child("units"), "a radiance is not in degC; remove 'units' (radiance is W m-2 sr-1 um-1)");
            }
            units = units == null || !units.equals("degC") ? "K" : units;
            Double scale = s.number("scale", false, "give the factor of the stored values, e.g. 0.00341802");
            if (scale != null && scale == 0) {
                doc.at(s.child("scale"), "is 0, which maps every value to the offset; give the product's scale factor");
            }
            Double off = s.number("offset", false, "give the offset of the stored values, e.g. 149.0");
            Double nodata = s.number("nodata", false, "give the stored value of pixels without observation, e.g. 0");
            double k1 = Double.NaN, k2 = Double.NaN, from = Double.NaN, to = Double.NaN;
            Section band = s.section("band", false, "");
            if (band != null) {
                band.checkKeys(BAND, List.of(), Map.of());
                Double a = band.number("k1", false, "give the band's K1 [W m-2 sr-1 um-1]");
                Double b = band.number("k2", false, "give the band's K2 [K]");
                Double c = band.number("from_um", false, "give the band's short edge in um");
                Double d = band.number("to_um", false, "give the band's long edge in um");
                boolean hasK = a != null && b != null && a > 0 && b > 0;
                boolean hasW = c != null && d != null && d > c && c > 0;
                if (hasK == hasW) {
                    doc.at(band.path, "give either {k1, k2} (both > 0) or {from_um, to_um} (to_um > from_um > 0), "
                            + "e.g. band: {k1: 774.8853, k2: 1321.0789}");
                } else if (hasK) {
                    k1 = a;
                    k2 = b;
                } else {
                    from = c;
                    to = d;
                }
            } else if (!kind.equals("surface_temperature")) {
                s.missing("band", "kind " + kind + " needs the sensor band: band: {k1: .., k2: ..} or "
                        + "band: {from_um: .., to_um: ..}");
            }
            String maskFile = null;
            List<Integer> keep = new ArrayList<>();
            Section mask = s.section("mask", false, "");
            if (mask != null) {
                mask.checkKeys(MASK, List.of(), Map.of());
                maskFile = location(mask, "file", true, "name the quality-mask GeoTIFF on the image's grid", baseDir);
                JsonNode kl = mask.list("keep", true, "list the codes of good pixels, e.g. keep: [1]");
                if (kl != null && kl.isEmpty()) {
                    doc.at(mask.child("keep"), "is empty, so no pixel would be kept; list the codes of good pixels, "
                            + "e.g. keep: [1]");
                }
                if (kl != null) {
                    for (int j = 0; j < kl.size(); j++) {
                        JsonNode k = kl.get(j);
                        if (!k.canConvertToInt() || !k.isIntegralNumber()) {
                            doc.at(mask.child("keep") + "[" + j + "]", YamlDoc.describe(k) + " is not a whole-number "
                                    + "mask code; write codes such as 1 or 64");
                        } else {
                            keep.add(k.intValue());
                        }
                    }
                }
            }
            if (file != null && time != null) {
                out.add(new RunFile.Observation(file, time, kind, units, scale == null ? 1.0 : scale,
                        off == null ? 0.0 : off, nodata == null ? Double.NaN : nodata, k1, k2, from, to, maskFile,
                        keep, doc.where(s.child("time"))));
            }
        }
        return out;
    }

    private static boolean inAny(List<RunFile.Period> periods, LocalDate day) {
        return periods.stream().anyMatch(pe -> pe.containsDay(day));
    }

    private static RunFile.Tiling tiling(Section s) {
        if (s == null) {
            return new RunFile.Tiling(DEFAULT_TILE_SIZE);
        }
        s.checkKeys(TILING, List.of(), HOME);
        Integer size = s.integer("tile_size", false, "give cells per tile edge, e.g. 256");
        if (size != null && (size < 16 || size > 4096 || size % 16 != 0)) {
            int near = Math.max(16, Math.min(4096, Math.round(size / 16f) * 16));
            s.doc.at(s.child("tile_size"), size + " is not a multiple of 16 between 16 and 4096; "
                    + "use e.g. " + near);
            size = null;
        }
        return new RunFile.Tiling(size == null ? DEFAULT_TILE_SIZE : size);
    }

    /**
     * The working grid section: {@code crs} (text such as "EPSG:32632"; whether Apache SIS knows
     * it is checked by the run check), {@code cell_size_m} (&gt; 0, at most 10 km) and {@code area}
     * (a box {@code {bbox: [minx, miny, maxx, maxy], crs: EPSG:4326}} or {@code {polygon: file}}).
     */
    private static RunFile.Grid grid(Section s, Path baseDir) {
        if (s == null) {
            return RunFile.Grid.DEFAULT;
        }
        s.checkKeys(GRID, List.of(), HOME);
        String crs = s.text("crs", false, "give an EPSG code such as EPSG:32632");
        if (crs != null && !crs.matches("(?i)EPSG:\\d+")) {
            s.doc.at(s.child("crs"), "'" + crs + "' is not an EPSG code; write e.g. EPSG:32632 (a WGS 84 / UTM zone)");
            crs = null;
        }
        Double size = s.number("cell_size_m", false, "give the cell edge in metres, e.g. 4");
        if (size != null && !(size > 0 && size <= 10_000)) {
            s.doc.at(s.child("cell_size_m"), size + " m is not a cell size; give metres above 0 (at most 10000), e.g. 4");
            size = null;
        }
        RunFile.Area area = null;
        Section a = s.section("area", false, "");
        if (a != null) {
            a.checkKeys(AREA, List.of(), HOME);
            if (a.has("bbox") == a.has("polygon")) {
                a.doc.at(a.path, "give either 'bbox: [minx, miny, maxx, maxy]' with 'crs: EPSG:…', or 'polygon: aoi.geojson'");
            } else if (a.has("polygon")) {
                if (a.has("crs")) {
                    a.doc.at(a.child("crs"), "applies to a bbox only; a polygon file declares its own CRS (GeoJSON \"crs\" "
                            + "member, else WGS 84); remove it");
                }
                String poly = location(a, "polygon", true, "give a GeoJSON file of polygons", baseDir);
                if (poly != null) {
                    area = new RunFile.Area(Double.NaN, Double.NaN, Double.NaN, Double.NaN, null, poly);
                }
            } else {
                JsonNode b = a.list("bbox", true, "give [minx, miny, maxx, maxy]");
                String bc = a.text("crs", true, "give the box's CRS, e.g. crs: EPSG:4326 (then x = longitude, y = latitude)");
                if (bc != null && !bc.matches("(?i)EPSG:\\d+")) {
                    a.doc.at(a.child("crs"), "'" + bc + "' is not an EPSG code; write e.g. EPSG:4326");
                    bc = null;
                }
                double[] v = new double[4];
                boolean ok = b != null && bc != null;
                if (b != null && b.size() != 4) {
                    a.doc.at(a.child("bbox"), "holds " + b.size() + " numbers; give four: [minx, miny, maxx, maxy]");
                    ok = false;
                } else if (b != null) {
                    for (int i = 0; i < 4; i++) {
                        Double d = Section.number(a.doc, b.get(i), a.child("bbox") + "[" + i + "]", "give a number");
                        if (d == null) {
                            ok = false;
                        } else {
                            v[i] = d;
                        }
                    }
                    if (ok && !(v[0] < v[2] && v[1] < v[3])) {
                        a.doc.at(a.child("bbox"), "[" + v[0] + ", " + v[1] + ", " + v[2] + ", " + v[3] + "] is empty or "
                                + "inverted; give [minx, miny, maxx, maxy] with minx < maxx and miny < maxy "
                                + "(longitude before latitude in EPSG:4326)");
                        ok = false;
                    }
                }
                if (ok) {
                    area = new RunFile.Area(v[0], v[1], v[2], v[3], bc.toUpperCase(Locale.ROOT), null);
                }
            }
        }
        return new RunFile.Grid(crs == null ? null : crs.toUpperCase(Locale.ROOT), size == null ? Double.NaN : size, area);
    }

    // ---------------------------------------------------------------- values

    /** Characters that make a location a glob pattern. */
    private static final Pattern GLOB = Pattern.compile(".*[*?\\[{].*");

    /**
     * One location, a list of locations, or a glob (a path with {@code * ? [ {}) whose matches
     * are listed in name order; a glob that matches nothing is an error. Globs work on local paths
     * only.
     */
    private static List<String> tiles(Section s, String key, boolean required, String fix, Path baseDir) {
        JsonNode v = s.raw(key);
        if (v != null && v.isArray()) {
            if (v.isEmpty()) {
                s.doc.at(s.child(key), "is an empty list; " + fix);
                return List.of();
            }
            List<String> out = new ArrayList<>();
            for (int i = 0; i < v.size(); i++) {
                JsonNode e = v.get(i);
                String p = s.child(key) + "[" + i + "]";
                if (!e.isTextual() || e.asText().isBlank()) {
                    s.doc.at(p, "expected a file name, got " + YamlDoc.describe(e) + "; " + fix);
                    continue;
                }
                String r = resolve(s, key, e.asText().strip(), baseDir);
                if (r != null && out.contains(r)) {
                    s.doc.at(p, "'" + e.asText() + "' is listed twice; keep one");
                } else if (r != null) {
                    out.add(r);
                }
            }
            return out;
        }
        String one = s.text(key, required, fix);
        if (one == null) {
            return List.of();
        }
        if (!GLOB.matcher(one).matches() || URI_SCHEME.matcher(one).matches()) {
            String r = resolve(s, key, one, baseDir);
            return r == null ? List.of() : List.of(r);
        }
        Path pattern = Path.of(one);
        Path abs = (pattern.isAbsolute() ? pattern : baseDir.resolve(pattern)).normalize();
        Path dir = abs.getParent();
        String glob = abs.getFileName().toString();
        if (dir == null || GLOB.matcher(dir.toString()).matches()) {
            s.doc.at(s.child(key), "'" + one + "': only the file name may hold wildcards (e.g. tiles/lc_*.tif); "
                    + "list the files instead");
            return List.of();
        }
        java.nio.file.PathMatcher m = java.nio.file.FileSystems.getDefault().getPathMatcher("glob:" + glob);
        List<String> out = new ArrayList<>();
        try (var stream = Files.list(dir)) {
            stream.filter(p -> Files.isRegularFile(p) && m.matches(p.getFileName())).map(Path::toString).sorted()
                    .forEach(out::add);
        } catch (IOException e) {
            s.doc.at(s.child(key), "the glob '" + one + "' matches no file: folder " + dir + " is missing or unreadable; "
                    + "check the path (relative to the run file's folder)");
            return List.of();
        }
        if (out.isEmpty()) {
            s.doc.at(s.child(key), "the glob '" + one + "' matches no file in " + dir + "; check the pattern and the "
                    + "folder, or list the tiles as [a.tif, b.tif]");
        }
        return out;
    }

    /**
     * A temperature in °C within a plausibility guard {@code [lo, hi]}; values from 200 to 400
     * (surface temperatures in kelvin) are flagged as probably kelvin.
     */
    private static Double celsius(Section s, String key, boolean required, String fix, double lo, double hi) {
        Double t = s.number(key, required, fix);
        if (t == null) {
            return null;
        }
        if (t > 200 && t <= 400) {
            s.doc.at(s.child(key), t + " looks like kelvin; give °C (K − 273.15)");
            return null;
        }
        if (t < lo || t > hi) {
            s.doc.at(s.child(key), t + " °C is outside the plausible range " + lo + "…" + hi + " °C; " + fix);
            return null;
        }
        return t;
    }

    private static String location(Section s, String key, boolean required, String fix, Path baseDir) {
        String v = s.text(key, required, fix);
        return v == null ? null : resolve(s, key, v, baseDir);
    }

    /**
     * A URI (scheme of two or more letters) as written; a path made absolute against
     * {@code baseDir} and normalised.
     */
    private static String resolve(Section s, String key, String value, Path baseDir) {
        if (URI_SCHEME.matcher(value).matches()) {
            try {
                new URI(value);
                return value;
            } catch (URISyntaxException e) {
                s.doc.at(s.child(key), "'" + value + "' is not a valid URI (" + e.getReason()
                        + "); encode spaces as %20, or give a plain path");
                return null;
            }
        }
        try {
            Path p = Path.of(value);
            return (p.isAbsolute() ? p : baseDir.resolve(p)).normalize().toString();
        } catch (InvalidPathException e) {
            s.doc.at(s.child(key), "'" + value + "' is not a valid path (" + e.getReason() + ")");
            return null;
        }
    }
}
