package org.thermotile.jobs.observe;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.OptionalInt;
import java.util.Random;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.city.TileSpec;
import org.thermotile.jobs.city.TileTask;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.observe.Calibration;
import org.thermotile.model.observe.PixelCells;
import org.thermotile.model.observe.PixelFootprints;
import org.thermotile.model.tile.TileSimulation;

/**
 * Calibration on a small invented city with urban geometry (24 × 20 cells of 5 m: streets, dark
 * roofs 10 m high, lawns; two tiles of 16 cells so that pixels straddle tile edges), against 10 m
 * images offset by 2.5 m from the cells (every pixel mixes partial cells), made by our own code from
 * a city job's hourly table: once from the run itself (identity), once from the same city with
 * changed materials (identifiability).
 */
class CalibrateJobTest {
    @TempDir
    static Path dir;
    static SparkSession spark;
    static final int W = 24, H = 20;
    static final double CELL = 5;
    static RasterGrid grid;
    static PreparedRun library;
    static Path libraryRun;
    static Path truthRun;
    static final String DAY = "2026-07-15T13:00+02:00";
    static final String NIGHT = "2026-07-15T22:00+02:00";

    /** The invented truth: asphalt albedo 0.12 → 0.20, dark roof 0.06 → 0.15, lawn albedo 0.23 → 0.18 and β 0.9 → 0.55. */
    static final String TRUTH_OVERRIDES = """
              - {code: 1, material: asphalt_aged, label: street, overrides: {albedo: 0.20}}
              - {code: 2, material: roof_membrane_dark, label: roof, overrides: {albedo: 0.15}}
              - {code: 3, material: grass_irrigated, label: lawn, overrides: {albedo: 0.18, moisture_availability: 0.55}}
            """;
    static final String LIBRARY_CLASSES = """
              - {code: 1, material: asphalt_aged, label: street}
              - {code: 2, material: roof_membrane_dark, label: roof}
              - {code: 3, material: grass_irrigated, label: lawn}
            """;

    static Path write(Path d, String classes) throws Exception {
        Files.createDirectories(d);
        int[] codes = new int[W * H];
        float[] heights = new float[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                int code;
                if (r % 10 < 2 || c % 8 < 2) {
                    code = 1; // streets two cells (10 m) wide
                } else if ((r / 10 + c / 8) % 2 == 0) {
                    code = 2; // a 6 × 8-cell roof block
                } else {
                    code = 3; // a lawn block
                }
                codes[r * W + c] = code;
                heights[r * W + c] = code == 2 ? 10f : 0f;
            }
        }
        GeoTiffWriter.writeInt(d.resolve("landcover.tif"), grid, GeoTiffWriter.IntType.UINT8, codes, OptionalInt.empty());
        GeoTiffWriter.writeFloat(d.resolve("heights.tif"), grid, heights, -9999f);
        Files.writeString(d.resolve("classes.yaml"), "name: calib-city\nclasses:\n" + classes);
        Path rf = d.resolve("run.yaml");
        Files.writeString(rf, """
                name: calib-city
                site: {latitude: 45.3, longitude: 9.0, elevation_m: 100}
                inputs: {land_cover: landcover.tif, classes: classes.yaml, heights: heights.tif}
                weather:
                  synthetic: {t_min_c: 20, t_max_c: 33, rel_humidity_pct: 45, wind_ms: 2, utc_offset: "+02:00"}
                period: {start: 2026-07-15, end: 2026-07-15, spin_up_days: 1}
                outputs:
                  maps: [peak, mean]
                  threshold_c: 45
                  hourly_days: [2026-07-15]
                geometry: {sky_view_directions: 32, search_radius_m: 50}
                tiling: {tile_size: 16}
                """);
        return rf;
    }

    static Path run(String name, String classes) throws Exception {
        Path rf = write(dir.resolve("in-" + name), classes);
        Path out = dir.resolve(name);
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(rf));
        CityJob.run(spark, p, new CityJob.Options(out, null, false, true, 0), new PrintStream(new ByteArrayOutputStream()));
        if (name.equals("library")) {
            library = p;
        }
        return out;
    }

    @BeforeAll
    static void once() throws Exception {
        spark = SparkSessions.get(null, 2);
        grid = RasterGrid.ofEpsg(W, H, 500_000, 5_020_000, CELL, -CELL, 32632);
        libraryRun = run("library", LIBRARY_CLASSES);
        truthRun = run("truth", TRUTH_OVERRIDES);
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    /** Surface temperature [K] per cell of {@code run} at the kept hour {@code time}. */
    static double[] hour(Path run, String time) {
        double[] v = new double[W * H];
        java.util.Arrays.fill(v, Double.NaN);
        for (Row r : spark.read().parquet(run.resolve("tables/cell_hours").toUri().toString())
                .filter("scenario = 'baseline' and time = '" + time + "'").collectAsList()) {
            v[r.<Integer>getAs("row") * W + r.<Integer>getAs("col")] = r.<Float>getAs("surface_c") + 273.15;
        }
        return v;
    }

    /**
     * A 10 m image, its west/north edges 2.5 m inside the grid's (the last column and row hang over
     * the edge and are left out): each pixel the area-weighted mean of {@code cells} plus
     * N(0, σ²) noise from {@code seed}.
     */
    static Path image(String name, double[] cells, double sigma, long seed) throws Exception {
        RasterGrid ig = new RasterGrid(12, 10, grid.originX() + 2.5, grid.originY() - 2.5, 10, -10, grid.epsg(),
                grid.crsWkt());
        PixelFootprints fp = new PixelFootprints(grid.originX(), grid.originY(), CELL, W, H);
        Random rnd = new Random(seed);
        float[] v = new float[ig.width() * ig.height()];
        for (int r = 0; r < ig.height(); r++) {
            for (int c = 0; c < ig.width(); c++) {
                double x0 = ig.originX() + 10 * c;
                double y1 = ig.originY() - 10 * r;
                double m = fp.rectangle(x0, y1 - 10, x0 + 10, y1).weightedMean(cells);
                double noise = sigma * rnd.nextGaussian();
                v[r * ig.width() + c] = Double.isNaN(m) ? -9999f : (float) (m + noise);
            }
        }
        Path f = dir.resolve(name + ".tif");
        GeoTiffWriter.writeFloat(f, ig, v, -9999f);
        return f;
    }

    static ObservationSet observations(String name, String... imageAndTime) throws Exception {
        StringBuilder b = new StringBuilder("observations:\n");
        for (int i = 0; i < imageAndTime.length; i += 2) {
            b.append("  - {file: ").append(imageAndTime[i]).append(", time: \"").append(imageAndTime[i + 1])
                    .append("\", kind: surface_temperature, units: K, nodata: -9999}\n");
        }
        Path f = dir.resolve(name + ".yaml");
        Files.writeString(f, b.toString());
        return ObservationSet.read(f);
    }

    static List<Calibrate.ObserveResultView> compare(Path run, ObservationSet set) {
        return Calibrate.ObserveResultView.of(Observe.run(spark, run, set), set);
    }

    static String describe(Calibration.Fit fit) {
        StringBuilder b = new StringBuilder();
        for (Calibration.Estimate e : fit.estimates()) {
            b.append(String.format(Locale.ROOT, "%s %s: %.4f -> %.4f ± %.4f%s%n", fit.palette()[e.parameter().material()].id(),
                    e.parameter().key(), e.start(), e.value(), e.standardError(), e.identifiable() ? "" : " NOT IDENTIFIABLE"));
        }
        return b.append(String.format(Locale.ROOT, "RMSE %.4f -> %.4f K, %d evaluations", fit.rmseBeforeK(),
                fit.rmseAfterK(), fit.evaluations())).toString();
    }

    /**
     * Images made from the run's own 13:00 and 22:00 temperatures: each sampled pixel, simulated
     * as its own cells (materials, sky view factor, shadows across a tile edge) and averaged with
     * the comparison's weights, equals the comparison's simulated value (the run's hourly table),
     * so the sample starts at RMSE 0 and the fit moves nothing. The Spark evaluation equals the
     * plain-Java one bit for bit.
     */
    @Test
    void ownTemperaturesStartAtZeroAndMoveNothing() throws Exception {
        image("own13", hour(libraryRun, DAY), 0, 1);
        image("own22", hour(libraryRun, NIGHT), 0, 2);
        ObservationSet set = observations("own", "own13.tif", "2026-07-15T11:00:00Z", "own22.tif", "2026-07-15T20:00:00Z");
        List<Observe.ImageResult> compared = Observe.run(spark, libraryRun, set);
        List<Calibrate.ObserveResultView> views = Calibrate.ObserveResultView.of(compared, set);
        List<String> keys = List.of("albedo", "moisture_availability");
        Calibrate.Sample s = Calibrate.sample(libraryRun, library, views, keys);
        assertTrue(s.sample().length >= 60, "sampled pixels " + s.sample().length);
        boolean geometry = s.cells().stream().allMatch(c -> c.geometry() != null);
        assertTrue(geometry, "every sampled pixel carries its geometry window");
        double[][] spark1;
        try (CalibrationJob job = new CalibrationJob(spark, s.simulation(), s.cells())) {
            assertTrue(job.slices() > 1, "partitions of pixels");
            spark1 = job.simulate(s.palette());
        }
        double[][] local = Calibration.local(s.simulation(), s.cells()).simulate(s.palette());
        for (int i = 0; i < local.length; i++) {
            assertArrayEquals(local[i], spark1[i], "pixel " + i + ": Spark evaluation = plain Java");
        }
        // Against the comparison's own simulated pixel values (pixel p of image k is offset + p).
        double worst = 0;
        int offset12 = compared.get(0).observed().length;
        for (int i = 0; i < s.sample().length; i++) {
            int p = s.sample()[i];
            int k = p < offset12 ? 0 : 1;
            double expect = compared.get(k).simulated()[p - k * offset12];
            worst = Math.max(worst, Math.abs(spark1[i][k] - expect));
        }
        assertTrue(worst < 1e-9, "largest |sample pixel - comparison pixel| " + worst + " K");

        ByteArrayOutputStream console = new ByteArrayOutputStream();
        Calibration.Fit fit = Calibrate.run(spark, libraryRun, library, views, keys,
                new PrintStream(console, true, StandardCharsets.UTF_8));
        String d = describe(fit);
        System.out.println("identity:\n" + d);
        // Float32 storage of ~300 K in the images: 1e-5 K at most.
        assertTrue(fit.rmseBeforeK() < 1e-4, d);
        for (Calibration.Estimate e : fit.estimates()) {
            assertEquals(e.start(), e.value(), 1e-3, "moved " + e + "\n" + d);
        }
        String out = console.toString(StandardCharsets.UTF_8);
        assertTrue(out.contains("stratified random sample by dominant material, equal allocation"), out);
        assertTrue(out.contains("evaluation 1: RMSE") && out.contains("evaluation 10: RMSE"), out);
        String csv = Files.readString(libraryRun.resolve("observed/calibration.csv"));
        assertTrue(csv.contains("stratified random sample by dominant material"), csv);
        List<Row> table = spark.read().parquet(libraryRun.resolve("observed/calibration.parquet").toUri().toString())
                .collectAsList();
        assertEquals(fit.estimates().size() + 2, table.size(), "one row per parameter, then RMSE and bias");
        Row rmse = table.stream().filter(r -> r.getString(0).equals("rmse_k")).findFirst().orElseThrow();
        assertEquals(fit.rmseBeforeK(), rmse.getDouble(2), 0.0);
        assertEquals(fit.rmseAfterK(), rmse.getDouble(3), 0.0);
        try (var parts = Files.list(libraryRun.resolve("observed/calibration.parquet"))) {
            assertTrue(parts.anyMatch(f -> f.getFileName().toString().equals("part-00000.snappy.parquet")),
                    "canonical part name");
        }
    }

    /**
     * The sampled pixels' cells, read once per run tile and cut per pixel, equal each pixel's
     * bounding window read alone through {@link TileTask#inputs} (the city job's path): the same
     * materials, areas and geometry window with its halo, value for value, for pixels inside a tile,
     * across a tile edge and with a halo reaching outside the raster.
     */
    @Test
    void cellsCutFromOneReadPerTileEqualEachPixelReadAlone() throws Exception {
        image("cut13", hour(libraryRun, DAY), 0, 3);
        ObservationSet set = observations("cut", "cut13.tif", "2026-07-15T11:00:00Z");
        List<Calibrate.ObserveResultView> views = compare(libraryRun, set);
        List<PixelFootprints.Footprint> footprints = CalibrationSample.footprints(views.get(0).imageFile(), grid);
        Calibrate.Sample s = Calibrate.sample(libraryRun, library, views, List.of("albedo"));
        boolean acrossEdge = false;
        boolean atGridEdge = false;
        for (int i = 0; i < s.sample().length; i++) {
            PixelFootprints.Footprint f = footprints.get(s.sample()[i]);
            int c0 = Integer.MAX_VALUE, r0 = Integer.MAX_VALUE, c1 = -1, r1 = -1;
            for (int cell : f.cells()) {
                c0 = Math.min(c0, cell % W);
                c1 = Math.max(c1, cell % W);
                r0 = Math.min(r0, cell / W);
                r1 = Math.max(r1, cell / W);
            }
            acrossEdge |= c0 / 16 != c1 / 16 || r0 / 16 != r1 / 16;
            int w = c1 - c0 + 1;
            TileTask.Inputs alone = TileTask.inputs(new TileSpec(0, c0, r0, w, r1 - r0 + 1), library.spec());
            int halo = alone.geometry().haloCells();
            atGridEdge |= c0 < halo || r0 < halo || c1 + halo >= W || r1 + halo >= H;
            double[] areas = new double[w * (r1 - r0 + 1)];
            for (int k = 0; k < f.cells().length; k++) {
                areas[(f.cells()[k] / W - r0) * w + f.cells()[k] % W - c0] += f.areas()[k];
            }
            int[] idx = alone.materialIndex().clone();
            for (int k = 0; k < idx.length; k++) {
                idx[k] = areas[k] > 0 ? idx[k] : TileSimulation.NO_MATERIAL;
            }
            PixelCells cut = s.cells().get(i);
            assertArrayEquals(idx, cut.materialIndex(), "pixel " + i + " materials");
            assertArrayEquals(areas, cut.areasM2(), "pixel " + i + " areas");
            TileSimulation.Geometry a = alone.geometry();
            TileSimulation.Geometry b = cut.geometry();
            assertEquals(List.of(a.windowCols(), a.windowRows(), a.haloCells()),
                    List.of(b.windowCols(), b.windowRows(), b.haloCells()), "pixel " + i + " window");
            assertArrayEquals(a.heightsM(), b.heightsM(), "pixel " + i + " building heights");
            assertArrayEquals(a.treeHeightsM(), b.treeHeightsM(), "pixel " + i + " tree heights");
            assertEquals(List.of(a.cellM(), a.searchRadiusM(), a.directions(), a.canopyTransmissivity(),
                    a.minSunElevationDeg(), a.wallEmissivity()), List.of(b.cellM(), b.searchRadiusM(), b.directions(),
                    b.canopyTransmissivity(), b.minSunElevationDeg(), b.wallEmissivity()), "pixel " + i + " settings");
        }
        assertTrue(acrossEdge, "a sampled pixel straddles a tile edge");
        assertTrue(atGridEdge, "a sampled pixel's halo reaches outside the raster");
    }

    /**
     * Identifiability (issue check): images by day (13:00) and night (22:00) of the city with the
     * invented true materials, plus N(0, 0.5² K²) seeded noise, fitted from the library values.
     *
     * <p>Tolerances, and why: with 0.5 K noise and about 30 pixels per material and image, a
     * material's mean is known to 0.5/√30 ≈ 0.09 K; a noon surface moves by roughly 30–50 K per unit
     * albedo (absorbed 800 W m⁻² against a linearised loss of 15–25 W m⁻² K⁻¹, common practice), so
     * albedo is determined to ~0.003; the lawn moves ~20 K per unit β. The parameters are correlated
     * within a material (two images, two unknowns), which widens that several-fold: we allow 0.03 on
     * albedo and 0.08 on β, and require the fitted value within 4 standard errors of the truth too.
     */
    @Test
    void dayAndNightImagesRecoverKnownAlbedoAndMoisture() throws Exception {
        image("true13", hour(truthRun, DAY), 0.5, 13);
        image("true22", hour(truthRun, NIGHT), 0.5, 22);
        ObservationSet set = observations("truth", "true13.tif", "2026-07-15T11:00:00Z", "true22.tif",
                "2026-07-15T20:00:00Z");
        Calibration.Fit fit = Calibrate.run(spark, libraryRun, library, compare(libraryRun, set),
                List.of("albedo", "moisture_availability"), new PrintStream(PrintStream.nullOutputStream()));
        String d = describe(fit);
        System.out.println("day + night:\n" + d);
        java.util.Map<String, Double> truth = java.util.Map.of("asphalt_aged albedo", 0.20,
                "asphalt_aged moisture_availability", 0.0, "roof_membrane_dark albedo", 0.15,
                "roof_membrane_dark moisture_availability", 0.0, "grass_irrigated albedo", 0.18,
                "grass_irrigated moisture_availability", 0.55);
        assertEquals(6, fit.estimates().size(), d);
        for (Calibration.Estimate e : fit.estimates()) {
            String name = fit.palette()[e.parameter().material()].id() + " " + e.parameter().key();
            double t = truth.get(name);
            double tol = e.parameter().key().equals("albedo") ? 0.03 : 0.08;
            assertTrue(e.identifiable(), name + " identifiable\n" + d);
            assertEquals(t, e.value(), tol, name + "\n" + d);
            assertTrue(Math.abs(e.value() - t) <= 4 * e.standardError() + 1e-3, name + " within 4 SE\n" + d);
        }
        // The noise floor: the fit leaves about the 0.5 K that was added.
        assertEquals(0.5, fit.rmseAfterK(), 0.12, d);
        assertTrue(fit.rmseBeforeK() > 1.0, d);
    }

    /**
     * One night-time image alone: at 22:00 a surface's temperature carries the day's absorbed and
     * evaporated energy as one sum, so a material's albedo and moisture availability act as one
     * combination and cannot both be recovered. The fit must say so rather than report values.
     */
    @Test
    void oneNightImageIsReportedNotIdentifiable() throws Exception {
        image("night22", hour(truthRun, NIGHT), 0.5, 22);
        ObservationSet set = observations("night", "night22.tif", "2026-07-15T20:00:00Z");
        Calibration.Fit fit = Calibrate.run(spark, libraryRun, library, compare(libraryRun, set),
                List.of("albedo", "moisture_availability"), new PrintStream(PrintStream.nullOutputStream()));
        String d = describe(fit);
        System.out.println("night only:\n" + d);
        boolean lawn = fit.estimates().stream().filter(e -> fit.palette()[e.parameter().material()].id()
                .equals("grass_irrigated")).anyMatch(e -> !e.identifiable());
        assertTrue(lawn, "a lawn parameter reported not identifiable\n" + d);
        String yaml = Files.readString(libraryRun.resolve("observed/calibrated_materials.yaml"));
        assertTrue(yaml.contains("not identifiable"), yaml);
        assertFalse(fit.estimates().stream().allMatch(Calibration.Estimate::identifiable), d);
    }
}
