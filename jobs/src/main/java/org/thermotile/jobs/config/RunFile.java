package org.thermotile.jobs.config;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import com.fasterxml.jackson.dataformat.yaml.YAMLGenerator;
import java.time.Duration;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.TreeMap;
import org.thermotile.model.balance.ColumnSpacing;
import org.thermotile.model.constants.Physical;

/**
 * A validated run file: what to simulate, where, when and what to write. Immutable; built only by
 * {@link RunFileReader}, which checks every value once, so code that receives a {@code RunFile}
 * need not re-check it.
 *
 * <p>Units are those of the run file, named in the fields ({@code tMinC} [°C], {@code windMs}
 * [m s⁻¹]); the {@code …K()} helpers convert to kelvin for the model. Optional numbers that are
 * absent are {@code NaN} (documented per field); optional texts are {@code null}.
 *
 * @param source   the run file as it was read (absolute, normalised path), for messages and the manifest
 * @param name     run name, {@code [a-z0-9_-]}, 1–64 characters
 * @param site     where the city stands (coordinates may be left to the land-cover raster)
 * @param inputs   input files and tables, paths resolved against the run file's folder
 * @param weather  hourly weather file or synthetic weather
 * @param period   local time span simulated and counted
 * @param physics  numerical and physical options
 * @param outputs  which maps and hourly grids to write
 * @param tiling   how the grid is cut into tiles
 * @param reserved raw sections kept for later features ({@link RunFileReader#RESERVED_KEYS}), by key
 *                 (scenarios and sweep among them, as written)
 * @param scenarios the programmes to compare with the baseline (from {@code scenarios:} and
 *                  {@code sweep:}), in file order; empty when there are none
 * @param sweepMax  the sweep's {@code max_scenarios}: more scenarios need confirmation
 * @param periods   the sweep's weather axis ({@code sweep.periods}): every scenario, the baseline
 *                  included, runs in each; empty for a run of one period. When not empty,
 *                  {@code weather} is the run's own weather section (the entries' default) and
 *                  {@code period} that of the first entry.
 * @param grid      the working grid ({@code grid:}): CRS, cell size and area of interest, each
 *                  optional ({@link Grid#DEFAULT} when the section is absent)
 * @param observations thermal images the finished run is compared with ({@code observations:}),
 *                  in file order; empty when there are none
 */
public record RunFile(String source, String name, Site site, Inputs inputs, Weather weather,
        Period period, Physics physics, Outputs outputs, Tiling tiling, Map<String, JsonNode> reserved,
        List<Scenario> scenarios, int sweepMax, List<NamedPeriod> periods, Grid grid,
        List<Observation> observations) {

    /** A run file without observations. */
    public RunFile(String source, String name, Site site, Inputs inputs, Weather weather,
            Period period, Physics physics, Outputs outputs, Tiling tiling, Map<String, JsonNode> reserved,
            List<Scenario> scenarios, int sweepMax, List<NamedPeriod> periods, Grid grid) {
        this(source, name, site, inputs, weather, period, physics, outputs, tiling, reserved, scenarios,
                sweepMax, periods, grid, List.of());
    }

    /**
     * One thermal image of {@code observations:} (the same entries as an observations file read by
     * {@code thermotile observe}).
     *
     * @param file     the image GeoTIFF, absolute (or a URI as written)
     * @param time     acquisition time (UTC instant)
     * @param kind     surface_temperature | brightness_temperature | radiance
     * @param units    K or degC (temperatures)
     * @param scale    stored value · scale + offset = physical value
     * @param offset   see {@code scale}
     * @param nodata   stored value without observation, NaN when not given
     * @param k1       band constant K1 [W m⁻² sr⁻¹ µm⁻¹], NaN when not given
     * @param k2       band constant K2 [K], NaN when not given
     * @param fromUm   band's short edge [µm], NaN when not given
     * @param toUm     band's long edge [µm], NaN when not given
     * @param maskFile quality mask on the image's grid, absolute, or null
     * @param maskKeep the mask codes of good pixels (empty without a mask)
     * @param where    the entry's place in the run file ("run.yaml line 80, column 5: observations[0].time"),
     *                 for messages about its time that only the prepared weather can check
     */
    public record Observation(String file, java.time.Instant time, String kind, String units, double scale,
            double offset, double nodata, double k1, double k2, double fromUm, double toUm, String maskFile,
            List<Integer> maskKeep, String where) {
        public Observation {
            Objects.requireNonNull(file, "file");
            Objects.requireNonNull(time, "time");
            maskKeep = maskKeep == null ? List.of() : List.copyOf(maskKeep);
        }
    }

    /** A run file with the default working grid ({@link Grid#DEFAULT}). */
    public RunFile(String source, String name, Site site, Inputs inputs, Weather weather,
            Period period, Physics physics, Outputs outputs, Tiling tiling, Map<String, JsonNode> reserved,
            List<Scenario> scenarios, int sweepMax, List<NamedPeriod> periods) {
        this(source, name, site, inputs, weather, period, physics, outputs, tiling, reserved, scenarios,
                sweepMax, periods, Grid.DEFAULT);
    }

    /** A run file of one period (no weather axis). */
    public RunFile(String source, String name, Site site, Inputs inputs, Weather weather,
            Period period, Physics physics, Outputs outputs, Tiling tiling, Map<String, JsonNode> reserved,
            List<Scenario> scenarios, int sweepMax) {
        this(source, name, site, inputs, weather, period, physics, outputs, tiling, reserved, scenarios,
                sweepMax, List.of());
    }

    /**
     * One entry of the weather axis: a named period with its own weather.
     *
     * @param name    folder and partition name, {@code [a-z0-9][a-z0-9._-]*}
     * @param weather the period's weather (the run's {@code weather:} unless the entry names a file)
     * @param period  the counted span and its spin-up
     */
    public record NamedPeriod(String name, Weather weather, Period period) {
        public NamedPeriod {
            Objects.requireNonNull(name, "name");
            Objects.requireNonNull(weather, "weather");
            Objects.requireNonNull(period, "period");
        }
    }

    /** True when the run sweeps over several periods or weather files. */
    public boolean hasPeriods() {
        return !periods.isEmpty();
    }

    /**
     * This run file for one entry of its weather axis: that entry's weather and period, no weather
     * axis, and {@code sweep.periods} taken out of the raw sweep section (dropped altogether when the
     * sweep held nothing else), so the result is a valid run file of one period.
     */
    public RunFile forPeriod(NamedPeriod p) {
        Map<String, JsonNode> res = new TreeMap<>(reserved);
        JsonNode sw = res.get("sweep");
        if (sw instanceof ObjectNode o) {
            ObjectNode copy = o.deepCopy();
            copy.remove("periods");
            if (copy.has("axes") || copy.has("change")) {
                res.put("sweep", copy);
            } else {
                res.remove("sweep");
            }
        }
        return new RunFile(source, name, site, inputs, p.weather(), p.period(), physics, outputs, tiling, res,
                scenarios, sweepMax, List.of(), grid, observations);
    }

    public RunFile {
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(site, "site");
        Objects.requireNonNull(inputs, "inputs");
        Objects.requireNonNull(weather, "weather");
        Objects.requireNonNull(period, "period");
        Objects.requireNonNull(physics, "physics");
        Objects.requireNonNull(outputs, "outputs");
        Objects.requireNonNull(tiling, "tiling");
        TreeMap<String, JsonNode> copy = new TreeMap<>();
        reserved.forEach((k, v) -> copy.put(k, v.deepCopy()));
        reserved = Collections.unmodifiableMap(copy);
        scenarios = scenarios == null ? List.of() : List.copyOf(scenarios);
        periods = periods == null ? List.of() : List.copyOf(periods);
        grid = grid == null ? Grid.DEFAULT : grid;
        observations = observations == null ? List.of() : List.copyOf(observations);
    }

    /**
     * The working grid the run is prepared on ({@code grid:} section; see
     * {@code org.thermotile.jobs.ingest.Ingest} for the rules that fill what is left out).
     *
     * @param crs       the working CRS as written ("EPSG:32632"), or null = the land cover's own CRS
     *                  when projected, else the WGS 84 / UTM zone of the area's centre
     * @param cellSizeM cell edge [m], &gt; 0; NaN = the land cover's (nominal) cell size
     * @param area      the area of interest, or null = the extent of all land-cover tiles
     */
    public record Grid(String crs, double cellSizeM, Area area) {
        /** No {@code grid:} section: everything from the land cover. */
        public static final Grid DEFAULT = new Grid(null, Double.NaN, null);

        /** True when nothing is set (the section is absent or empty). */
        public boolean isDefault() {
            return crs == null && Double.isNaN(cellSizeM) && area == null;
        }
    }

    /**
     * An area of interest: a bounding box in a stated CRS, or a polygon file (exactly one).
     *
     * @param minX    west (or smallest first-axis) edge of the box, in {@code bboxCrs} units
     * @param minY    south edge
     * @param maxX    east edge, &gt; minX
     * @param maxY    north edge, &gt; minY
     * @param bboxCrs the box's CRS as written ("EPSG:4326"); axes are taken east, north
     *                (longitude, latitude) whatever the EPSG axis order; null with a polygon
     * @param polygon a GeoJSON file of Polygon/MultiPolygon features (absolute path or URI), or null
     */
    public record Area(double minX, double minY, double maxX, double maxY, String bboxCrs, String polygon) {
        /** True for a bounding box, false for a polygon file. */
        public boolean isBox() {
            return polygon == null;
        }
    }

    /** The raw section {@code key} (a deep copy: Jackson trees are mutable), or null if absent. */
    public JsonNode reserved(String key) {
        JsonNode n = reserved.get(key);
        return n == null ? null : n.deepCopy();
    }

    @Override
    public Map<String, JsonNode> reserved() {
        TreeMap<String, JsonNode> copy = new TreeMap<>();
        reserved.forEach((k, v) -> copy.put(k, v.deepCopy()));
        return Collections.unmodifiableMap(copy);
    }

    /**
     * Site of the simulation.
     *
     * @param latitudeDeg  geodetic latitude [°], north positive, −90…90; NaN = take the centre of
     *                     the land-cover raster
     * @param longitudeDeg longitude [°], east positive, −180…180; NaN together with latitude
     * @param elevationM   height above mean sea level [m]; 0 when not given
     */
    public record Site(double latitudeDeg, double longitudeDeg, double elevationM) {
        /** True when the run file gives latitude and longitude. */
        public boolean hasCoordinates() {
            return !Double.isNaN(latitudeDeg);
        }

        /**
         * The model's site, with the raster centre used when the run file gives no coordinates.
         *
         * @param centreLatDeg latitude of the land-cover raster's centre [°]
         * @param centreLonDeg longitude of the land-cover raster's centre [°]
         */
        public org.thermotile.model.forcing.Site toSite(double centreLatDeg, double centreLonDeg) {
            return hasCoordinates()
                    ? new org.thermotile.model.forcing.Site(latitudeDeg, longitudeDeg, elevationM)
                    : new org.thermotile.model.forcing.Site(centreLatDeg, centreLonDeg, elevationM);
        }
    }

    /**
     * Input locations. Each is an absolute, normalised local path, or a URI kept as written
     * ({@code file:///…}, {@code hdfs://…}); existence is checked by the run check, not here.
     *
     * @param landCover land-cover class raster (GeoTIFF)
     * @param classes   a built-in class table name ({@link ClassTableReader#BUILT_IN}) or the
     *                  location of a class table (.yaml, .yml or .csv)
     * @param materials user materials file, or null
     * @param heights   building/tree height raster, or null
     * @param districts district polygons (GeoJSON), or null
     * @param landCoverTiles every land-cover tile in the order given (a glob expanded and sorted);
     *                  the first is {@code landCover}
     * @param heightsTiles every heights tile, the first being {@code heights}; empty without heights
     * @param buildings building footprints rasterised into heights ({@code inputs.buildings}), or null
     */
    public record Inputs(String landCover, String classes, String materials, String heights,
            String districts, List<String> landCoverTiles, List<String> heightsTiles, Buildings buildings) {

        /** Inputs of one land-cover file and at most one heights file, without footprints. */
        public Inputs(String landCover, String classes, String materials, String heights, String districts) {
            this(landCover, classes, materials, heights, districts,
                    landCover == null ? List.of() : List.of(landCover), heights == null ? List.of() : List.of(heights),
                    null);
        }

        /** Inputs of one land-cover file and at most one heights file, with footprints or null. */
        public Inputs(String landCover, String classes, String materials, String heights, String districts,
                Buildings buildings) {
            this(landCover, classes, materials, heights, districts,
                    landCover == null ? List.of() : List.of(landCover), heights == null ? List.of() : List.of(heights),
                    buildings);
        }

        public Inputs {
            landCoverTiles = landCoverTiles == null ? List.of() : List.copyOf(landCoverTiles);
            heightsTiles = heightsTiles == null ? List.of() : List.copyOf(heightsTiles);
        }

        /** True when {@link #classes()} names a built-in table rather than a file. */
        public boolean classesIsBuiltIn() {
            return ClassTableReader.BUILT_IN.contains(classes);
        }
    }

    /**
     * Building footprints ({@code inputs.buildings}): polygons with a height or a floor-count
     * attribute, rasterised onto the grid by {@code org.thermotile.jobs.ingest.FootprintRasteriser}.
     * Exactly one of {@code heightAttribute} and {@code floorsAttribute} is set.
     *
     * @param file              GeoJSON FeatureCollection location
     * @param heightAttribute   property holding the building height [m], or null
     * @param floorsAttribute   property holding the number of floors, or null
     * @param storeyHeightM     height of one floor [m] (with {@code floorsAttribute}), else NaN
     * @param roofMaterialAttribute property whose value is a material id for the roof cells, or null
     * @param crs               CRS of the coordinates as written in the run file (e.g. "EPSG:32632"),
     *                          or null: the file's legacy "crs" member, else WGS 84 lon/lat (RFC 7946)
     */
    public record Buildings(String file, String heightAttribute, String floorsAttribute, double storeyHeightM,
            String roofMaterialAttribute, String crs) implements java.io.Serializable {
    }

    /**
     * How an hourly CSV in another layout maps onto our weather fields ({@code weather.columns},
     * {@code weather.units}, …); read by {@code org.thermotile.jobs.ingest.WeatherColumns}.
     *
     * @param columns    our field name → the file's column name, in run-file order
     * @param units      our field name → the unit its column is in (fields not listed: our units)
     * @param utcOffset  offset of the file's clock from UTC, for times written without one; or null
     * @param timeFormat a {@link java.time.format.DateTimeFormatter} pattern for the time column, or
     *                   null for ISO-8601 ({@code 2026-07-14T13:00}, with or without offset)
     * @param estimateGhi how to fill global irradiance when no column gives it: {@code cloud_cover},
     *                   {@code clear_sky}, or null (then a ghi column is required)
     */
    public record WeatherMapping(Map<String, String> columns, Map<String, String> units, ZoneOffset utcOffset,
            String timeFormat, String estimateGhi) {
        public WeatherMapping {
            columns = Collections.unmodifiableMap(new java.util.LinkedHashMap<>(columns));
            units = Collections.unmodifiableMap(new java.util.LinkedHashMap<>(units));
        }
    }

    /**
     * Weather: exactly one of {@code file} and {@code synthetic} is non-null.
     *
     * @param file             hourly weather CSV location, or null
     * @param fillGapsMaxHours longest run of missing hours [h] the weather reader may fill by
     *                         interpolation; 0 (the default) means any gap is an error
     * @param synthetic        synthetic clear-sky weather, or null
     * @param mapping          how the file's columns map onto our fields, or null when the file is in
     *                         our own layout
     */
    public record Weather(String file, int fillGapsMaxHours, Synthetic synthetic, WeatherMapping mapping) {
        /** Weather in our own layout (or synthetic). */
        public Weather(String file, int fillGapsMaxHours, Synthetic synthetic) {
            this(file, fillGapsMaxHours, synthetic, null);
        }

        /** True for synthetic weather, false for a weather file. */
        public boolean isSynthetic() {
            return synthetic != null;
        }
    }

    /**
     * Synthetic weather: a daily cycle repeated over the period.
     *
     * @param tMinC          daily minimum air temperature [°C]
     * @param tMaxC          daily maximum air temperature [°C], ≥ tMinC
     * @param relHumidityPct relative humidity [%], 0…100
     * @param windMs         wind speed [m s⁻¹], ≥ 0
     * @param utcOffset      offset of local clock time from UTC, used to place the sun
     */
    public record Synthetic(double tMinC, double tMaxC, double relHumidityPct, double windMs,
            ZoneOffset utcOffset) {
        /** Daily minimum air temperature [K]. */
        public double tMinK() {
            return tMinC + Physical.ZERO_CELSIUS_K;
        }

        /** Daily maximum air temperature [K]. */
        public double tMaxK() {
            return tMaxC + Physical.ZERO_CELSIUS_K;
        }
    }

    /**
     * The local-time span counted in statistics, as a half-open interval {@code [start, end)}
     * on whole hours. A date {@code start} means its midnight; a date {@code end} is inclusive,
     * so it becomes the following midnight; a date-time {@code end} is the instant the run stops.
     *
     * @param start      first counted instant (local clock time, whole hour)
     * @param end        end of the counted span, exclusive, after {@code start}
     * @param spinUpDays days simulated before {@code start} and not counted [d], ≥ 0
     */
    public record Period(LocalDateTime start, LocalDateTime end, int spinUpDays) {
        /** Number of counted hours [h]. */
        public long hours() {
            return Duration.between(start, end).toHours();
        }

        /** The first simulated instant: {@code start} minus the spin-up days. */
        public LocalDateTime simulationStart() {
            return start.minusDays(spinUpDays);
        }

        /** True when the whole local day {@code day} lies inside {@code [start, end)}. */
        public boolean containsDay(LocalDate day) {
            return !day.atStartOfDay().isBefore(start) && !day.plusDays(1).atStartOfDay().isAfter(end);
        }
    }

    /**
     * Numerical and physical options.
     *
     * @param timestepMinutes sub-step of the surface balance [min]; divides 60
     * @param convection      how the convective coefficient h_c is found
     * @param deepGroundTempC temperature of the deep ground boundary [°C]; NaN = the mean air
     *                        temperature of the period
     * @param columnSpacing   how the conduction nodes of every construction are spaced
     *                        ({@code physics.column_spacing}); {@link ColumnSpacing#STANDARD} unless named
     */
    public record Physics(int timestepMinutes, Convection convection, double deepGroundTempC,
            ColumnSpacing columnSpacing) {
        public Physics {
            Objects.requireNonNull(columnSpacing, "columnSpacing");
            if (!ColumnSpacing.NAMED.contains(columnSpacing)) {
                // The resolved run file writes the spacing by name: an unnamed one could not be read back.
                throw new IllegalArgumentException("column spacing must be one of " + ColumnSpacing.names()
                        + ", got " + columnSpacing);
            }
        }

        /** Options with the standard column spacing. */
        public Physics(int timestepMinutes, Convection convection, double deepGroundTempC) {
            this(timestepMinutes, convection, deepGroundTempC, ColumnSpacing.STANDARD);
        }

        /** Sub-step [s]. */
        public int timestepSeconds() {
            return timestepMinutes * 60;
        }

        /** Deep ground temperature [K], NaN when the period's mean air temperature is to be used. */
        public double deepGroundTempK() {
            return deepGroundTempC + Physical.ZERO_CELSIUS_K;
        }
    }

    /**
     * Convective heat transfer: a named wind correlation, or a fixed coefficient.
     *
     * @param model          a correlation name from {@link RunFileReader#CONVECTION_MODELS}, or
     *                       {@link #FIXED}
     * @param coefficientWm2K the fixed h_c [W m⁻² K⁻¹] when {@code model} is {@link #FIXED}, else NaN
     */
    public record Convection(String model, double coefficientWm2K) {
        /** Model name of a fixed coefficient. */
        public static final String FIXED = "fixed";

        /** True for a fixed coefficient, false for a named correlation. */
        public boolean isFixed() {
            return FIXED.equals(model);
        }
    }

    /**
     * The map products a run can write, each with everything said about it in one place: its
     * run-file key (also its file name, {@code maps/KEY.tif}), the report's title, unit and
     * explanation, the GeoTIFF band's description and unit, the per-cell statistic it is cut from,
     * its column in the {@code cells} table, and what else may use it (hot spots, the report,
     * scenario difference maps). To add a map, add a constant here (see DEVELOPERS.md).
     */
    public enum MapKind {
        /** Highest surface temperature of the period. */
        PEAK("peak", "Peak surface temperature", "°C",
                "The highest surface temperature each cell reached in the counted hours.",
                "peak surface temperature of the period", "degC", r -> r.peakC, "peak_c",
                Use.HOTSPOTS, Use.REPORT, Use.DELTA),
        /** Mean surface temperature of the period. */
        MEAN("mean", "Mean surface temperature", "°C",
                "Each cell's surface temperature averaged over the counted hours.",
                "mean surface temperature of the period", "degC", r -> r.meanC, "mean_c",
                Use.HOTSPOTS, Use.REPORT, Use.DELTA),
        /** Lowest night-time surface temperature. */
        NIGHT_MIN("night_min", "Night minimum surface temperature", "°C",
                "The lowest surface temperature each cell reached with the sun below the horizon.",
                "lowest night-time surface temperature", "degC", r -> r.nightMinC, "night_min_c",
                Use.HOTSPOTS, Use.REPORT),
        /**
         * Local hour of day at which the peak occurs. A clock hour, not a quantity: hot spots
         * cannot sum it, the report does not draw it, and its overviews take the nearest cell.
         */
        PEAK_HOUR("peak_hour", "Hour of the peak surface temperature", "h",
                "The local clock hour at which each cell's surface was hottest.",
                "local clock hour of the peak surface temperature", "h", r -> r.peakHour, "peak_hour_h",
                Use.NEAREST_OVERVIEWS),
        /** Sum over hours of the excess of surface temperature above the threshold [K h]. */
        DEGREE_HOURS("degree_hours", "Degree-hours above %s", "K·h",
                "The sum over the counted hours of how far each cell's surface was above the "
                        + "threshold: a measure of how long and how much it was hot.",
                "degree-hours of surface temperature above the threshold", "K.h", r -> r.degreeHoursAbove,
                "degree_hours_k_h", Use.HOTSPOTS, Use.REPORT, Use.DELTA, Use.THRESHOLD),
        /** Number of hours with surface temperature above the threshold [h]. */
        HOURS_ABOVE("hours_above", "Hours above %s", "h",
                "How many counted hours each cell's surface was above the threshold.",
                "hours with surface temperature above the threshold", "h", r -> r.hoursAbove, "hours_above_h",
                Use.HOTSPOTS, Use.REPORT, Use.THRESHOLD);

        /** What, besides being written, a map is used for or needs. */
        private enum Use { HOTSPOTS, REPORT, DELTA, THRESHOLD, NEAREST_OVERVIEWS }

        private final String key;
        private final String title;
        private final String unit;
        private final String explanation;
        private final String bandDescription;
        private final String bandUnit;
        private final java.util.function.Function<org.thermotile.model.tile.TileSimulation.Result, double[]> values;
        private final String column;
        private final java.util.Set<Use> uses;

        MapKind(String key, String title, String unit, String explanation, String bandDescription, String bandUnit,
                java.util.function.Function<org.thermotile.model.tile.TileSimulation.Result, double[]> values,
                String column, Use... uses) {
            this.key = key;
            this.title = title;
            this.unit = unit;
            this.explanation = explanation;
            this.bandDescription = bandDescription;
            this.bandUnit = bandUnit;
            this.values = values;
            this.column = column;
            this.uses = uses.length == 0 ? java.util.EnumSet.noneOf(Use.class)
                    : java.util.EnumSet.copyOf(java.util.Arrays.asList(uses));
        }

        /** The name of this map in run files and output file names ("night_min"). */
        public String key() {
            return key;
        }

        /** The report's title; {@code threshold} ("30 °C", "the threshold") fills a threshold map's. */
        public String title(String threshold) {
            return needsThreshold() ? String.format(java.util.Locale.ROOT, title, threshold) : title;
        }

        /** The unit as readers see it in the report ("°C", "K·h", "h"). */
        public String unit() {
            return unit;
        }

        /** The unit as the hot-spot summaries write it: the report's, with a space for the product dot ("K h"). */
        public String plainUnit() {
            return unit.replace('·', ' ');
        }

        /** The report's one-sentence explanation of the map. */
        public String explanation() {
            return explanation;
        }

        /** The GeoTIFF band's description (gdalinfo's "Description"). */
        public String bandDescription() {
            return bandDescription;
        }

        /** The GeoTIFF band's unit, UDUNITS-2 style ASCII ("degC", "K.h", "h"; gdalinfo's "Unit Type"). */
        public String bandUnit() {
            return bandUnit;
        }

        /** The per-cell statistic of a tile this map is made of, row-major over the tile. */
        public double[] values(org.thermotile.model.tile.TileSimulation.Result r) {
            return values.apply(r);
        }

        /**
         * Its column in the {@code cells} table: the key with the unit suffix of
         * {@code org.thermotile.jobs.storage.TableColumns}' rule ("degree_hours_k_h"); the key itself
         * names the map in run files and file names and does not change with it.
         */
        public String column() {
            return column;
        }

        /** True when the Getis-Ord Gi* hot-spot analysis may use this map (a quantity, not a clock hour). */
        public boolean hotspots() {
            return uses.contains(Use.HOTSPOTS);
        }

        /** True when the report draws this map. */
        public boolean inReport() {
            return uses.contains(Use.REPORT);
        }

        /** True when a comparison writes this map's scenario-minus-baseline difference ({@code delta_KEY.tif}). */
        public boolean delta() {
            return uses.contains(Use.DELTA);
        }

        /** True when this map's overviews take the nearest cell instead of averaging (a clock hour). */
        public boolean nearestOverviews() {
            return uses.contains(Use.NEAREST_OVERVIEWS);
        }

        /** True when this map needs {@code outputs.threshold_c}. */
        public boolean needsThreshold() {
            return uses.contains(Use.THRESHOLD);
        }

        /** The kind named {@code key} in a run file, or null. */
        public static MapKind fromKey(String key) {
            for (MapKind k : values()) {
                if (k.key.equals(key)) {
                    return k;
                }
            }
            return null;
        }

        /** All run-file names, in declaration order. */
        public static List<String> keys() {
            return java.util.Arrays.stream(values()).map(MapKind::key).toList();
        }

        /** The keys of the maps {@code which} holds for, in declaration order. */
        public static List<String> keys(java.util.function.Predicate<MapKind> which) {
            return java.util.Arrays.stream(values()).filter(which).map(MapKind::key).toList();
        }
    }

    /**
     * What to write.
     *
     * @param maps        map products, in the order given, without repeats, not empty
     * @param thresholdC  surface temperature threshold for degree-hours and hours above [°C];
     *                    NaN when not given (then no map needs it)
     * @param hourlyDays  local days for which full hourly grids are written, sorted; may be empty
     */
    public record Outputs(List<MapKind> maps, double thresholdC, List<LocalDate> hourlyDays) {
        public Outputs {
            maps = List.copyOf(maps);
            hourlyDays = List.copyOf(hourlyDays);
        }

        /** Threshold [K], NaN when not given. */
        public double thresholdK() {
            return thresholdC + Physical.ZERO_CELSIUS_K;
        }
    }

    /**
     * Tiling of the grid.
     *
     * @param tileSize tile edge [cells]; a multiple of 16 in 16…4096
     */
    public record Tiling(int tileSize) {
    }

    // ---------------------------------------------------------------- resolved form

    /**
     * The resolved run file as a Jackson tree: the run file's own keys, every default filled in,
     * paths absolute, dates as ISO-8601 local date-times ({@code period.end} exclusive).
     * Reading {@link #toYaml()} back with {@link RunFileReader} gives an equal {@code RunFile}
     * (apart from {@link #source()}). Key order is fixed, so the output is deterministic.
     */
    public ObjectNode toTree() {
        JsonNodeFactory f = JsonNodeFactory.instance;
        ObjectNode root = f.objectNode();
        root.put("name", name);
        ObjectNode s = root.putObject("site");
        if (site.hasCoordinates()) {
            s.put("latitude", site.latitudeDeg());
            s.put("longitude", site.longitudeDeg());
        }
        s.put("elevation_m", site.elevationM());
        ObjectNode in = root.putObject("inputs");
        putLocations(in, "land_cover", inputs.landCover(), inputs.landCoverTiles());
        in.put("classes", inputs.classes());
        putIfSet(in, "materials", inputs.materials());
        putLocations(in, "heights", inputs.heights(), inputs.heightsTiles());
        putIfSet(in, "districts", inputs.districts());
        if (inputs.buildings() != null) {
            Buildings b = inputs.buildings();
            ObjectNode bo = in.putObject("buildings");
            bo.put("file", b.file());
            putIfSet(bo, "height", b.heightAttribute());
            putIfSet(bo, "floors", b.floorsAttribute());
            if (b.floorsAttribute() != null) {
                bo.put("storey_height_m", b.storeyHeightM());
            }
            putIfSet(bo, "roof_material", b.roofMaterialAttribute());
            putIfSet(bo, "crs", b.crs());
        }
        ObjectNode w = root.putObject("weather");
        if (weather.isSynthetic()) {
            Synthetic sy = weather.synthetic();
            ObjectNode so = w.putObject("synthetic");
            so.put("t_min_c", sy.tMinC());
            so.put("t_max_c", sy.tMaxC());
            so.put("rel_humidity_pct", sy.relHumidityPct());
            so.put("wind_ms", sy.windMs());
            so.put("utc_offset", sy.utcOffset().getId());
        } else {
            w.put("file", weather.file());
            w.put("fill_gaps_max_hours", weather.fillGapsMaxHours());
            WeatherMapping m = weather.mapping();
            if (m != null) {
                ObjectNode co = w.putObject("columns");
                m.columns().forEach(co::put);
                if (!m.units().isEmpty()) {
                    ObjectNode uo = w.putObject("units");
                    m.units().forEach(uo::put);
                }
                if (m.utcOffset() != null) {
                    w.put("utc_offset", m.utcOffset().getId());
                }
                putIfSet(w, "time_format", m.timeFormat());
                putIfSet(w, "estimate_ghi", m.estimateGhi());
            }
        }
        if (periods.isEmpty()) {             // with a weather axis, the periods are in sweep.periods
            ObjectNode pe = root.putObject("period");
            pe.put("start", period.start().toString());
            pe.put("end", period.end().toString());
            pe.put("spin_up_days", period.spinUpDays());
        }
        ObjectNode ph = root.putObject("physics");
        ph.put("timestep_minutes", physics.timestepMinutes());
        if (physics.convection().isFixed()) {
            ph.put("convection", physics.convection().coefficientWm2K());
        } else {
            ph.put("convection", physics.convection().model());
        }
        if (Double.isNaN(physics.deepGroundTempC())) {
            ph.putNull("deep_ground_temp_c");
        } else {
            ph.put("deep_ground_temp_c", physics.deepGroundTempC());
        }
        // Written only when not the default, so the resolved run file of a standard run stays as it was.
        if (!ColumnSpacing.STANDARD.equals(physics.columnSpacing())) {
            ph.put("column_spacing", physics.columnSpacing().name());
        }
        ObjectNode out = root.putObject("outputs");
        ArrayNode maps = out.putArray("maps");
        outputs.maps().forEach(m -> maps.add(m.key()));
        if (!Double.isNaN(outputs.thresholdC())) {
            out.put("threshold_c", outputs.thresholdC());
        }
        ArrayNode days = out.putArray("hourly_days");
        outputs.hourlyDays().forEach(d -> days.add(d.toString()));
        root.putObject("tiling").put("tile_size", tiling.tileSize());
        if (!grid.isDefault()) {
            putGrid(root.putObject("grid"));
        }
        reserved.forEach((k, v) -> root.set(k, v.deepCopy()));
        if (!observations.isEmpty()) {
            putObservations(root.putArray("observations"));
        }
        if (!periods.isEmpty() && root.get("sweep") instanceof ObjectNode sw) {
            ArrayNode ps = sw.putArray("periods");   // resolved: absolute weather files, ISO times
            for (NamedPeriod np : periods) {
                ObjectNode o = ps.addObject();
                o.put("name", np.name());
                if (!np.weather().isSynthetic() && !Objects.equals(np.weather().file(), weather.file())) {
                    o.put("weather", np.weather().file());
                }
                o.put("start", np.period().start().toString());
                o.put("end", np.period().end().toString());
                o.put("spin_up_days", np.period().spinUpDays());
            }
        }
        return root;
    }

    /** The resolved {@code observations:} list (absolute files, UTC times, every default filled in). */
    private void putObservations(ArrayNode list) {
        for (Observation o : observations) {
            ObjectNode n = list.addObject();
            n.put("file", o.file());
            n.put("time", o.time().toString());
            n.put("kind", o.kind());
            n.put("units", o.units());
            n.put("scale", o.scale());
            n.put("offset", o.offset());
            if (!Double.isNaN(o.nodata())) {
                n.put("nodata", o.nodata());
            }
            if (!Double.isNaN(o.k1())) {
                n.putObject("band").put("k1", o.k1()).put("k2", o.k2());
            } else if (!Double.isNaN(o.fromUm())) {
                n.putObject("band").put("from_um", o.fromUm()).put("to_um", o.toUm());
            }
            if (o.maskFile() != null) {
                ObjectNode m = n.putObject("mask");
                m.put("file", o.maskFile());
                ArrayNode keep = m.putArray("keep");
                o.maskKeep().forEach(keep::add);
            }
        }
    }

    /** One location as text, several (tiles) as a list. */
    private static void putLocations(ObjectNode o, String key, String first, List<String> all) {
        if (all.size() > 1) {
            ArrayNode a = o.putArray(key);
            all.forEach(a::add);
        } else {
            putIfSet(o, key, first);
        }
    }

    private void putGrid(ObjectNode g) {
        if (grid.crs() != null) {
            g.put("crs", grid.crs());
        }
        if (!Double.isNaN(grid.cellSizeM())) {
            g.put("cell_size_m", grid.cellSizeM());
        }
        Area a = grid.area();
        if (a != null) {
            ObjectNode ao = g.putObject("area");
            if (a.isBox()) {
                ArrayNode b = ao.putArray("bbox");
                b.add(a.minX()).add(a.minY()).add(a.maxX()).add(a.maxY());
                ao.put("crs", a.bboxCrs());
            } else {
                ao.put("polygon", a.polygon());
            }
        }
    }

    private static void putIfSet(ObjectNode o, String key, String value) {
        if (value != null) {
            o.put(key, value);
        }
    }

    /** The resolved form ({@link #toTree()}) as YAML, a valid run file in itself. */
    public String toYaml() {
        YAMLFactory yf = YAMLFactory.builder()
                .disable(YAMLGenerator.Feature.WRITE_DOC_START_MARKER)
                .build();
        return write(new ObjectMapper(yf));
    }

    /** The resolved form ({@link #toTree()}) as indented JSON, for the run manifest. */
    public String toJson() {
        return write(new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT));
    }

    private String write(ObjectMapper mapper) {
        try {
            return mapper.writeValueAsString(toTree());
        } catch (JsonProcessingException e) {
            throw new IllegalStateException("cannot write a Jackson tree we built ourselves", e);
        }
    }
}
