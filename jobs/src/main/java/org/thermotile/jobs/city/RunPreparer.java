package org.thermotile.jobs.city;

import java.nio.file.Path;
import java.time.Instant;
import java.time.LocalDate;
import java.time.LocalDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.apache.sis.referencing.CRS;
import org.apache.sis.referencing.CommonCRS;
import org.apache.sis.geometry.DirectPosition2D;
import org.opengis.referencing.crs.CoordinateReferenceSystem;
import org.opengis.referencing.operation.MathTransform;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.ClassTable;
import org.thermotile.jobs.config.ClassTableReader;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.ingest.FootprintGrid;
import org.thermotile.jobs.ingest.FootprintRasteriser;
import org.thermotile.jobs.ingest.WeatherColumns;
import org.thermotile.jobs.io.MaterialsFile;
import org.thermotile.jobs.io.districts.Districts;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.weather.GapFill;
import org.thermotile.jobs.io.weather.WeatherCsv;
import org.thermotile.jobs.io.weather.WeatherRead;
import org.thermotile.jobs.storage.InputStaging;
import org.thermotile.model.balance.Convection;
import org.thermotile.model.forcing.Forcing;
import org.thermotile.model.forcing.ForcingPreparer;
import org.thermotile.model.forcing.HourlyWeather;
import org.thermotile.model.forcing.Site;
import org.thermotile.model.forcing.SyntheticWeather;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.materials.MaterialOverrides;
import org.thermotile.model.tile.TileSimulation;

/**
 * Reads and checks every input of a run file, once, before any Spark work: rasters (grid, CRS,
 * codes), class table, materials, weather coverage. Writes nothing.
 */
public final class RunPreparer {
    private RunPreparer() {}

    /** Largest land-cover code accepted (16-bit rasters). */
    static final int MAX_CODE = 65_535;

    /**
     * Reads and checks every input, then resolves the scenarios (district names, materials,
     * adoption cuts). A sweep larger than its {@code max_scenarios} needs {@code confirmSweep}.
     */
    public static PreparedRun prepare(RunFile run, boolean confirmSweep) {
        checkSweepSize(run, confirmSweep);
        return prepare(run, readCity(run));
    }

    private static void checkSweepSize(RunFile run, boolean confirmSweep) {
        if (run.scenarios().size() > run.sweepMax() && !confirmSweep) {
            throw new UserInputException(run.source() + ": the scenarios and sweep make " + run.scenarios().size()
                    + " scenarios, more than sweep.max_scenarios = " + run.sweepMax() + ". Fix: narrow the sweep's "
                    + "axes, raise max_scenarios, or confirm with --confirm-sweep");
        }
    }

    /** {@link #prepare(RunFile, boolean)} with the city already read (the sweep's size checked). */
    private static PreparedRun prepare(RunFile run, City city) {
        PreparedRun p = withWeather(run, city);
        HotspotsBlock.of(run, p.grid().pixelWidth()); // checked now, used after the simulation
        return p.withPlan(ScenarioPlanner.plan(p, run.scenarios()));
    }

    /**
     * Every period of the run, prepared: one {@link PreparedRun} for a run of one period, else one
     * per entry of {@code sweep.periods} (its weather and dates; the same city and scenarios), in
     * file order. Every period is checked before anything runs.
     */
    public static List<PreparedRun> prepareAll(RunFile run, boolean confirmSweep) {
        if (!run.hasPeriods()) {
            return List.of(prepare(run, confirmSweep));
        }
        checkSweepSize(run, confirmSweep);
        List<PreparedRun> out = new ArrayList<>();
        City city = null;
        for (RunFile.NamedPeriod np : run.periods()) {
            try {
                // The city (rasters, classes, materials, districts) is read once, and the scenario
                // plan (treated cells, roofs, costs), which depends on the city alone, made once.
                RunFile r = run.forPeriod(np);
                if (city == null) {
                    city = readCity(r);
                }
                PreparedRun p = out.isEmpty() ? prepare(r, city) : withWeather(r, city).withPlan(out.get(0).plan());
                out.add(p.withPeriod(np.name()));
            } catch (UserInputException | IllegalArgumentException e) {
                throw new UserInputException("sweep.periods '" + np.name() + "': " + e.getMessage(), e);
            }
        }
        return out;
    }

    /** {@link #prepare(RunFile, boolean)} without confirming a large sweep. */
    public static PreparedRun prepare(RunFile run) {
        return prepare(run, false);
    }

    /** Reads and checks every input (scenarios not yet resolved). */
    static PreparedRun prepareInputs(RunFile run) {
        return withWeather(run, readCity(run));
    }

    /**
     * What the inputs say about the city, whatever the weather: read and checked once, shared by
     * the periods of a weather axis.
     */
    private record City(Path landCover, RasterGrid grid, Map<Integer, Long> counts, Map<Integer, Long> fallback,
            List<String> notes, Map<String, String> inputs, Material[] palette, List<String> labels, int[] lut,
            List<org.locationtech.jts.geom.Geometry> districts, List<String> districtNames,
            Map<String, Material> known, GeometryBlock geometry, String heights, int tileSize, float[] heightGrid,
            int[] cellPalette, String taskLandCover, org.thermotile.jobs.ingest.IngestReport ingest) {
    }

    /** Reads and checks the land cover, heights, districts, materials and class table. */
    private static City readCity(RunFile run) {
        List<String> notes = new ArrayList<>();
        Map<String, String> inputs = new LinkedHashMap<>();
        RunFile.Inputs in = run.inputs();
        org.thermotile.jobs.ingest.Ingest.Prepared ing = ingest(run, inputs);
        Path landCover = ing.landCover();
        String taskLandCover = ing.unchanged() ? inputs.get("land_cover") : landCover.toString();

        RasterGrid grid;
        Double noData;
        Map<Integer, Long> counts = new TreeMap<>();
        int tileSize = run.tiling().tileSize();
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(landCover)) {
            if (!r.sampleType().isInteger()) {
                throw new UserInputException(landCover + ": land cover holds " + r.sampleType().label()
                        + " samples; class codes must be integers. Fix: write the land cover as an "
                        + "integer raster (e.g. gdal_translate -ot UInt16)");
            }
            grid = r.grid();
            noData = r.noDataValue().isPresent() ? r.noDataValue().getAsDouble() : null;
            // Scan the codes tile by tile: the check needs every code's cell count.
            for (TileSpec t : TileSpec.plan(grid.width(), grid.height(), tileSize)) {
                int[] codes = r.readIntWindow(t.col0(), t.row0(), t.width(), t.height());
                for (int i = 0; i < codes.length; i++) {
                    int c = codes[i];
                    if (noData != null && c == noData) {
                        continue;
                    }
                    if (c < 0 || c > MAX_CODE) {
                        int row = t.row0() + i / t.width();
                        int col = t.col0() + i % t.width();
                        throw new UserInputException(landCover + ": code " + c + " at row " + row
                                + ", column " + col + " is outside 0…" + MAX_CODE
                                + ". Fix: use class codes 0…65535, or declare it as the nodata value");
                    }
                    counts.merge(c, 1L, Long::sum);
                }
            }
        }
        if (counts.isEmpty()) {
            throw new UserInputException(landCover + ": every cell is nodata"
                    + (noData != null ? " (" + noData + ")" : "")
                    + ", so there is nothing to simulate. Fix: check the nodata value and the extent");
        }
        double tallest = 0;
        // With footprints, the whole grid's heights are kept in memory: the raster's (if any), then the
        // footprints' over them (a cell a footprint covers takes the footprint's height).
        float[] heightGrid = null;
        if (in.buildings() != null) {
            heightGrid = new float[Math.toIntExact(grid.cellCount())];
            Arrays.fill(heightGrid, Float.NaN);
        }
        if (in.heights() != null) {
            Path heights = ing.heights();
            try (GeoTiffReader h = GeoTiffReader.openSingleBand(heights)) {
                grid.differenceFrom(h.grid()).ifPresent(d -> {
                    throw new UserInputException(heights + ": its grid differs from the land cover's ("
                            + landCover.getFileName() + "): " + d + ". Fix: resample the heights onto "
                            + "the land-cover grid (e.g. gdalwarp -te/-tr/-t_srs matching it)");
                });
                for (TileSpec t : TileSpec.plan(grid.width(), grid.height(), tileSize)) {
                    float[] v = h.readFloatWindow(t.col0(), t.row0(), t.width(), t.height());
                    for (int i = 0; i < v.length; i++) {
                        float x = v[i];
                        if (Float.isNaN(x)) {
                            continue; // nodata: no structure, 0 m
                        }
                        if (!(x >= 0 && x <= 1000)) {
                            throw new UserInputException(heights + ": height " + x + " m at row " + (t.row0() + i / t.width())
                                    + ", column " + (t.col0() + i % t.width()) + " is outside 0…1000 m. Fix: heights are "
                                    + "metres above ground; fill holes with 0 or the nodata value");
                        }
                        tallest = Math.max(tallest, x);
                    }
                    if (heightGrid != null) {
                        for (int r = 0; r < t.height(); r++) {
                            System.arraycopy(v, r * t.width(), heightGrid, (t.row0() + r) * grid.width() + t.col0(),
                                    t.width());
                        }
                    }
                }
            }
        }
        FootprintRasteriser.Result footprints = null;
        if (in.buildings() != null) {
            Path bf = localPath(in.buildings().file(), "inputs.buildings.file");
            inputs.put("buildings", location(in.buildings().file(), bf));
            if (Math.abs(grid.pixelWidth() + grid.pixelHeight()) > 1e-9 * grid.pixelWidth()) {
                throw new UserInputException(landCover + ": cells of " + grid.pixelWidth() + " × " + -grid.pixelHeight()
                        + " m are not square; footprints are rasterised onto square cells. Fix: resample the land "
                        + "cover to square cells (gdalwarp -tr)");
            }
            footprints = FootprintRasteriser.read(bf, in.buildings(), FootprintGrid.of(grid));
            notes.add(footprints.note(bf, in.buildings()) + (in.heights() != null
                    ? "; footprints replace the heights raster where they cover a cell" : ""));
            for (int i = 0; i < heightGrid.length; i++) {
                if (footprints.feature()[i] >= 0) {
                    heightGrid[i] = footprints.heightM()[i];
                    tallest = Math.max(tallest, heightGrid[i]);
                }
            }
        }
        GeometryBlock geometry = GeometryBlock.of(run, grid.pixelWidth(), tallest);
        Districts districts = null;
        if (in.districts() != null) {
            Path d = localPath(in.districts(), "inputs.districts");
            districts = Districts.read(d, grid);
            inputs.put("districts", location(in.districts(), d));
        }

        // Materials and classes.
        Map<String, Material> known = new LinkedHashMap<>(MaterialLibrary.byId());
        if (in.materials() != null) {
            Path mf = localPath(in.materials(), "inputs.materials");
            inputs.put("materials", location(in.materials(), mf));
            known.putAll(MaterialsFile.mergeWithLibrary(MaterialsFile.read(mf)));
        }
        ClassTable table = ClassTableReader.resolve(in.classesIsBuiltIn() ? in.classes()
                : localPath(in.classes(), "inputs.classes").toString(), known.keySet());
        if (!in.classesIsBuiltIn()) {
            inputs.put("classes", in.classes());
        }
        Map<Integer, Long> fallback = table.checkCodes(counts);
        if (!fallback.isEmpty()) {
            notes.add("codes without a class took the fallback material '" + table.fallback() + "': "
                    + fallback);
        }
        int[] lut = new int[MAX_CODE + 1];
        Arrays.fill(lut, TileSimulation.NO_MATERIAL);
        List<Material> palette = new ArrayList<>();
        List<String> labels = new ArrayList<>();
        Map<String, Integer> paletteIndex = new LinkedHashMap<>();
        for (int code : counts.keySet()) {
            String id = table.materialFor(code);
            Map<String, Double> ov = new TreeMap<>(table.overridesFor(code));
            String label = ov.isEmpty() ? id : id + " " + ov;
            Integer idx = paletteIndex.get(label);
            if (idx == null) {
                Material base = MaterialLibrary.get(id, known);
                Material m = ov.isEmpty() ? base : MaterialOverrides.apply(base, ov,
                        "class table " + table.name() + ", code " + code);
                idx = palette.size();
                palette.add(m);
                labels.add(label);
                paletteIndex.put(label, idx);
            }
            lut[code] = idx;
        }
        int[] cellPalette = null;
        if (footprints != null && in.buildings().roofMaterialAttribute() != null) {
            cellPalette = new int[heightGrid.length];
            Arrays.fill(cellPalette, -1);
            long roofCells = 0;
            Map<String, Long> byMaterial = new TreeMap<>();
            for (int i = 0; i < cellPalette.length; i++) {
                int f = footprints.feature()[i];
                String id = f < 0 ? null : footprints.roofMaterial()[f];
                if (id == null) {
                    continue;
                }
                Integer idx = paletteIndex.get(id);
                if (idx == null) {
                    Material m;
                    try {
                        m = MaterialLibrary.get(id, known);
                    } catch (IllegalArgumentException | UserInputException e) {
                        throw new UserInputException(localPath(in.buildings().file(), "inputs.buildings.file")
                                + ", features[" + f + "]: " + in.buildings().roofMaterialAttribute() + " = '" + id
                                + "' is not a material: " + e.getMessage() + ". Fix: use a material id of the library "
                                + "(thermotile materials) or of inputs.materials", e);
                    }
                    idx = palette.size();
                    palette.add(m);
                    labels.add(id);
                    paletteIndex.put(id, idx);
                }
                cellPalette[i] = idx;
                roofCells++;
                byMaterial.merge(id, 1L, Long::sum);
            }
            notes.add("buildings: roof material from '" + in.buildings().roofMaterialAttribute() + "' on " + roofCells
                    + " cells " + byMaterial + " (cells of footprints without a value keep the land cover's material)");
        }

        return new City(landCover, grid, counts, fallback, List.copyOf(notes), inputs, palette.toArray(new Material[0]),
                List.copyOf(labels), lut, districts == null ? List.of() : districts.geometries(),
                districts == null ? List.of() : districts.districts().stream().map(Districts.District::name).toList(),
                Map.copyOf(known), geometry,
                in.heights() == null ? null : ing.heights().equals(localPath(in.heights(), "inputs.heights"))
                        ? location(in.heights(), ing.heights()) : ing.heights().toString(),
                tileSize, heightGrid, cellPalette, taskLandCover, ing.report());
    }

    /**
     * The land cover and heights on the run's working grid ({@code grid:}; see
     * {@link org.thermotile.jobs.ingest.Ingest}), every tile recorded in {@code inputs} for the
     * manifest ({@code land_cover}, {@code land_cover[1]}, …). Prepared rasters, when any are
     * needed, go to a temporary folder removed when the JVM exits.
     */
    private static org.thermotile.jobs.ingest.Ingest.Prepared ingest(RunFile run, Map<String, String> inputs) {
        RunFile.Inputs in = run.inputs();
        List<Path> lc = new ArrayList<>();
        List<Path> hs = new ArrayList<>();
        for (int i = 0; i < in.landCoverTiles().size(); i++) {
            String key = i == 0 ? "land_cover" : "land_cover[" + i + "]";
            Path p = localPath(in.landCoverTiles().get(i), "inputs." + key);
            lc.add(p);
            inputs.put(key, location(in.landCoverTiles().get(i), p));
        }
        for (int i = 0; i < in.heightsTiles().size(); i++) {
            String key = i == 0 ? "heights" : "heights[" + i + "]";
            Path p = localPath(in.heightsTiles().get(i), "inputs." + key);
            hs.add(p);
            inputs.put(key, location(in.heightsTiles().get(i), p));
        }
        Path folder;
        try {
            folder = java.nio.file.Files.createTempDirectory("thermotile-grid-");
        } catch (java.io.IOException e) {
            throw new UserInputException("cannot create a temporary folder for the prepared rasters (" + e.getMessage()
                    + "). Fix: check java.io.tmpdir (" + System.getProperty("java.io.tmpdir") + ")", e);
        }
        folder.toFile().deleteOnExit();
        try {
            org.thermotile.jobs.ingest.Ingest.Prepared p = org.thermotile.jobs.ingest.Ingest.prepare(run, lc, hs, folder);
            for (Path f : new Path[] {folder.resolve("landcover.tif"), folder.resolve("heights.tif")}) {
                f.toFile().deleteOnExit();            // registered after the folder: deleted before it
            }
            return p;
        } catch (RuntimeException e) {
            deleteQuietly(folder.resolve("landcover.tif"));
            deleteQuietly(folder.resolve("heights.tif"));
            deleteQuietly(folder);
            throw e;
        }
    }

    private static void deleteQuietly(Path p) {
        try {
            java.nio.file.Files.deleteIfExists(p);
        } catch (java.io.IOException ignored) {
            // a temporary file; the error being reported matters more
        }
    }

    /** The city {@code c} under the run file's weather and period: forcing, counted hours, settings. */
    private static PreparedRun withWeather(RunFile run, City c) {
        List<String> notes = new ArrayList<>(c.notes());
        Map<String, String> inputs = new LinkedHashMap<>(c.inputs());
        RasterGrid grid = c.grid();
        Path landCover = c.landCover();
        // Site and weather.
        double[] centre = centreLatLon(grid, landCover);
        Site site = run.site().toSite(centre[0], centre[1]);
        RunFile.Period period = run.period();
        HourlyWeather weather;
        ZoneOffset offset;
        if (run.weather().isSynthetic()) {
            RunFile.Synthetic syn = run.weather().synthetic();
            offset = syn.utcOffset();
            LocalDate first = period.simulationStart().toLocalDate();
            int days = (int) java.time.temporal.ChronoUnit.DAYS.between(first, period.end().toLocalDate()) + 1;
            weather = SyntheticWeather.clearSky(site, SyntheticWeather.Spec.withRelativeHumidity(first, days,
                    offset.getTotalSeconds(), syn.tMinC(), syn.tMaxC(), syn.relHumidityPct() / 100.0, syn.windMs()));
        } else {
            Path wf = localPath(run.weather().file(), "weather.file");
            inputs.put("weather", location(run.weather().file(), wf));
            WeatherRead read;
            GapFill gaps = run.weather().fillGapsMaxHours() > 0
                    ? GapFill.linear(run.weather().fillGapsMaxHours()) : GapFill.none();
            try {
                read = run.weather().mapping() != null
                        ? WeatherColumns.read(wf, run.weather().mapping(), run.source(), site, gaps)
                        : WeatherCsv.read(wf, gaps);
            } catch (java.io.IOException e) {
                throw new UserInputException(wf + ": cannot be read: " + e.getMessage(), e);
            }
            notes.addAll(read.notes());
            weather = read.weather();
            offset = ZoneOffset.ofTotalSeconds(weather.utcOffsetSeconds);
        }
        Instant simStart = period.simulationStart().toInstant(offset);
        Instant end = period.end().toInstant(offset);
        HourlyWeather sliced = WeatherCsv.slice(weather,
                run.weather().isSynthetic() ? "synthetic weather" : run.weather().file(), simStart, end);
        Forcing forcing = ForcingPreparer.prepare(sliced, site);

        // Hours counted in the statistics and hours written as hourly outputs.
        long startSec = period.start().toInstant(offset).getEpochSecond();
        long endSec = end.getEpochSecond();
        int firstSample = -1;
        List<Long> samples = new ArrayList<>();
        List<Integer> hourlyIdx = new ArrayList<>();
        List<Long> hourlyTimes = new ArrayList<>();
        for (int h = 1; h < forcing.hours(); h++) {
            long t = forcing.epochSecond[h];
            if (t >= startSec && t < endSec) {
                if (firstSample < 0) {
                    firstSample = h;
                }
                samples.add(t);
                LocalDate day = LocalDateTime.ofEpochSecond(t, 0, offset).toLocalDate();
                if (run.outputs().hourlyDays().contains(day)) {
                    hourlyIdx.add(h);
                    hourlyTimes.add(t);
                }
            }
        }
        if (firstSample < 0) {
            throw new UserInputException(run.source() + ": the period " + period.start() + " … "
                    + period.end() + " holds no whole hour of the weather. Fix: check period and weather");
        }
        // The statistics run from firstSample to the end of the forcing: the slice ends at or after `end`.
        int lastSample = firstSample + samples.size();
        if (!run.observations().isEmpty()) {
            // Observed images: only the hours bracketing each acquisition time are kept besides hourly_days.
            int[] kept = KeptHours.of(forcing.epochSecond, firstSample, lastSample, hourlyIdx, run.observations());
            hourlyIdx = new ArrayList<>();
            hourlyTimes = new ArrayList<>();
            for (int h : kept) {
                hourlyIdx.add(h);
                hourlyTimes.add(forcing.epochSecond[h]);
            }
        }
        Forcing used = lastSample < forcing.hours() ? truncate(forcing, lastSample) : forcing;
        double deepK = run.physics().deepGroundTempK();
        if (Double.isNaN(deepK)) {
            deepK = Arrays.stream(used.airTempK).average().orElseThrow();
        }
        RunFile.Convection conv = run.physics().convection();
        Convection convection = conv.isFixed() ? Convection.fixed(conv.coefficientWm2K()) : Convection.mcAdams();
        TileSimulation.Settings settings = new TileSimulation.Settings(run.physics().timestepMinutes(),
                convection, deepK, firstSample, run.outputs().thresholdK(),
                hourlyIdx.stream().mapToInt(Integer::intValue).toArray(), run.physics().columnSpacing());
        TileJobSpec spec = new TileJobSpec(c.taskLandCover(), grid, c.palette(), c.lut(), c.districts(), used,
                settings, c.heights(), c.geometry(), c.heightGrid(), c.cellPalette());
        return new PreparedRun(run, grid, spec, TileSpec.plan(grid.width(), grid.height(), c.tileSize()),
                c.labels(), c.districtNames(), c.known(), c.counts(), c.fallback(), inputs,
                samples.stream().mapToLong(Long::longValue).toArray(),
                hourlyTimes.stream().mapToLong(Long::longValue).toArray(), notes, null, null, c.ingest());
    }

    /** The forcing's first {@code hours} hours. */
    static Forcing truncate(Forcing f, int hours) {
        return new Forcing(f.site, Arrays.copyOf(f.epochSecond, hours), f.utcOffsetSeconds,
                Arrays.copyOf(f.airTempK, hours), Arrays.copyOf(f.specificHumidity, hours),
                Arrays.copyOf(f.windMs, hours), Arrays.copyOf(f.pressurePa, hours),
                Arrays.copyOf(f.ghiWm2, hours), Arrays.copyOf(f.beamHorizontalWm2, hours),
                Arrays.copyOf(f.diffuseHorizontalWm2, hours), Arrays.copyOf(f.skyLongwaveWm2, hours),
                Arrays.copyOf(f.sunZenithDeg, hours), Arrays.copyOf(f.sunAzimuthDeg, hours));
    }

    /**
     * A local path from a run-file location: a path, a {@code file:} URI, or a Hadoop URI
     * ({@code hdfs://}, {@code s3a://}, …) whose file is copied to a local folder first
     * ({@link InputStaging}).
     */
    public static Path localPath(String location, String key) {
        return InputStaging.localPath(location, key);
    }

    /** What the manifest and the tasks see: the URI of a remote input, else the local path. */
    static String location(String written, Path local) {
        return InputStaging.isRemote(written) ? written : local.toString();
    }

    /** Geographic latitude and longitude [°] of the grid's centre. */
    static double[] centreLatLon(RasterGrid grid, Path file) {
        try {
            CoordinateReferenceSystem crs = CRS.fromWKT(grid.crsWkt());
            CoordinateReferenceSystem geo = CommonCRS.WGS84.normalizedGeographic();
            MathTransform mt = CRS.findOperation(crs, geo, null).getMathTransform();
            double x = grid.originX() + grid.pixelWidth() * grid.width() / 2.0;
            double y = grid.originY() + grid.pixelHeight() * grid.height() / 2.0;
            DirectPosition2D p = new DirectPosition2D(x, y);
            DirectPosition2D q = new DirectPosition2D();
            mt.transform(p, q);
            return new double[] {q.getY(), q.getX()};
        } catch (Exception e) {
            throw new UserInputException(file + ": cannot place the grid's centre on the Earth from its CRS ("
                    + e.getMessage() + "). Fix: give site.latitude and site.longitude in the run file", e);
        }
    }

}
