package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.OptionalInt;
import java.util.Random;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.observe.Observe;
import org.thermotile.jobs.observe.ObservationSet;
import org.thermotile.model.observe.PixelFootprints;

/** A finished tiny run compared with images made from its own surface temperature. */
class ObserveTest {
    @TempDir
    static Path dir;
    static SparkSession spark;
    static Path out;
    static RasterGrid grid;
    static PreparedRun prepared;
    static Path runFile;
    /** Surface temperature [K] of each cell at 2026-07-15T12:00Z (14:00 local), NaN without material. */
    static double[] atNoonUtc;

    /** A 30 m image grid, same CRS, its west/north edges 2.5 m inside the run's (partial cells). */
    static RasterGrid imageGrid() {
        return new RasterGrid(24, 17, grid.originX() + 2.5, grid.originY() - 2.5, 30, -30, grid.epsg(), grid.crsWkt());
    }

    @BeforeAll
    static void runOnce() throws Exception {
        spark = SparkSessions.get(null, 2);
        Path rf = CityFixture.write(dir.resolve("in"), 256, "  hourly_days: [2026-07-15]");
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(rf));
        grid = p.grid();
        prepared = p;
        runFile = rf;
        out = dir.resolve("out");
        CityJob.run(spark, p, new CityJob.Options(out, null, false, true, 0), new PrintStream(PrintStream.nullOutputStream()));
        atNoonUtc = new double[grid.width() * grid.height()];
        java.util.Arrays.fill(atNoonUtc, Double.NaN);
        for (Row r : spark.read().parquet(out.resolve("tables/cell_hours").toUri().toString())
                .filter("scenario = 'baseline' and time = '2026-07-15T14:00+02:00'").collectAsList()) {
            atNoonUtc[r.<Integer>getAs("row") * grid.width() + r.<Integer>getAs("col")] = r.<Float>getAs("surface_c") + 273.15;
        }
    }

    @AfterAll
    static void stop() {
        spark.stop();
    }

    /** Writes an image whose pixels are the area means of the run's cells plus N(0, σ²) noise. */
    static Path image(String name, double sigma, boolean celsius) throws Exception {
        RasterGrid ig = imageGrid();
        PixelFootprints cells = new PixelFootprints(grid.originX(), grid.originY(), grid.pixelWidth(), grid.width(),
                grid.height());
        Random rnd = new Random(42);
        float[] v = new float[ig.width() * ig.height()];
        for (int r = 0; r < ig.height(); r++) {
            for (int c = 0; c < ig.width(); c++) {
                double x0 = ig.originX() + 30 * c;
                double y1 = ig.originY() - 30 * r;
                double m = cells.rectangle(x0, y1 - 30, x0 + 30, y1).weightedMean(atNoonUtc);
                double k = m + sigma * rnd.nextGaussian();
                v[r * ig.width() + c] = Double.isNaN(m) ? -9999f : (float) (celsius ? k - 273.15 : k);
            }
        }
        Path f = dir.resolve("in").resolve(name + ".tif");
        GeoTiffWriter.writeFloat(f, ig, v, -9999f);
        return f;
    }

    static Path observations(String name, String body) throws Exception {
        Path f = dir.resolve("in").resolve(name + ".yaml");
        Files.writeString(f, "observations:\n" + body);
        return f;
    }

    /** Observations made from the run's own hour: bias 0, RMSE 0 (to float32 storage of ~310 K, 3e-5 K). */
    @Test
    void identity() throws Exception {
        image("own", 0, false);
        var set = ObservationSet.read(observations("own", """
                  - {file: own.tif, time: "2026-07-15T12:00:00Z", kind: surface_temperature, units: K, nodata: -9999}
                """));
        var res = Observe.run(spark, out, set).get(0);
        // 24×17 pixels; the last column and row stick out over the grid's east and south edges.
        assertTrue(res.all().count() > 300, "pixels " + res.all().count());
        assertEquals(0.0, res.all().bias(), 1e-4);
        assertEquals(0.0, res.all().rmse(), 1e-4);
        try (var d = org.thermotile.jobs.io.raster.GeoTiffReader.openSingleBand(out.resolve("observed/difference_own.tif"))) {
            assertTrue(d.grid().sameGridAs(grid), "difference map on the run grid");
            float[] v = d.readFloatWindow(0, 0, grid.width(), grid.height());
            int shown = 0;
            for (float x : v) {
                if (!Float.isNaN(x) && x != CityJob.MAP_NODATA) {
                    shown++;
                    assertEquals(0.0, x, 1e-4, "difference map of an identity image");
                }
            }
            assertTrue(shown > 0.8 * grid.width() * grid.height(), "cells shown " + shown);
        }
        String csv = Files.readString(out.resolve("observed/agreement.csv"));
        assertTrue(csv.contains(",material,") && csv.contains(",district,"), csv);
    }

    /**
     * With N(0, 1 K²) noise (seed 42) RMSE ≈ 1 K: its sampling sd is about 1/√(2n) ≈ 0.04 K for
     * n ≈ 380 pixels (normal theory, common practice); we allow 0.15 K. Stored in °C.
     */
    @Test
    void gaussianNoiseOfOneKelvinGivesRmseOfOneKelvin() throws Exception {
        image("noisy", 1.0, true);
        var set = ObservationSet.read(observations("noisy", """
                  - {file: noisy.tif, time: "2026-07-15T14:00:00+02:00", units: degC, nodata: -9999}
                """));
        var res = Observe.run(spark, out, set).get(0);
        assertEquals(1.0, res.all().rmse(), 0.15, "RMSE " + res.all().rmse());
        assertEquals(0.0, res.all().bias(), 0.2);
    }

    /** Half an hour after 14:00 local is between the 14:00 and 15:00 kept hours: linear in between. */
    @Test
    void betweenHoursIsInterpolated() throws Exception {
        image("half", 0, false);
        var at14 = Observe.run(spark, out, ObservationSet.read(observations("h14", """
                  - {file: half.tif, time: "2026-07-15T12:00:00Z", nodata: -9999}
                """))).get(0);
        var at1430 = Observe.run(spark, out, ObservationSet.read(observations("h1430", """
                  - {file: half.tif, time: "2026-07-15T12:30:00Z", nodata: -9999}
                """))).get(0);
        var at15 = Observe.run(spark, out, ObservationSet.read(observations("h15", """
                  - {file: half.tif, time: "2026-07-15T13:00:00Z", nodata: -9999}
                """))).get(0);
        assertEquals(0.5 * (at14.all().bias() + at15.all().bias()), at1430.all().bias(), 1e-6);
        assertTrue(at15.all().rmse() > 0.01, "the hours differ: RMSE " + at15.all().rmse());
    }

    @Test
    void badInputsAreExitTwoAndWriteNothing() throws Exception {
        Path img = image("bad", 0, false);
        Path fresh = dir.resolve("fresh");
        try (var walk = Files.walk(out)) {
            for (Path q : (Iterable<Path>) walk::iterator) {
                Path t = fresh.resolve(out.relativize(q).toString());
                if (Files.isDirectory(q)) {
                    Files.createDirectories(t);
                } else {
                    Files.copy(q, t);
                }
            }
        }
        org.thermotile.jobs.storage.Folders.deleteQuietly(fresh.resolve("observed"));
        // no acquisition time
        var e1 = assertThrows(UserInputException.class, () -> ObservationSet.read(observations("b1", """
                  - {file: bad.tif, kind: surface_temperature}
                """)));
        assertTrue(e1.getMessage().contains("'time'") && e1.getMessage().contains("fix"), e1.getMessage());
        // a time outside the kept hours (the period has only 2026-07-15 kept)
        var e2 = assertThrows(UserInputException.class, () -> Observe.run(spark, fresh, ObservationSet.read(
                observations("b2", "  - {file: bad.tif, time: \"2026-08-01T10:00:00Z\"}\n"))));
        assertTrue(e2.getMessage().contains("outside"), e2.getMessage());
        // a mask whose keep list names no code present
        int[] qa = new int[imageGrid().width() * imageGrid().height()];
        java.util.Arrays.fill(qa, 1);
        GeoTiffWriter.writeInt(dir.resolve("in/qa.tif"), imageGrid(), GeoTiffWriter.IntType.UINT8, qa, OptionalInt.empty());
        var e3 = assertThrows(UserInputException.class, () -> Observe.run(spark, fresh, ObservationSet.read(
                observations("b3", "  - {file: bad.tif, time: \"2026-07-15T12:00:00Z\", mask: {file: qa.tif, keep: [5, 7]}}\n"))));
        assertTrue(e3.getMessage().contains("names no code"), e3.getMessage());
        // an image outside the grid
        RasterGrid far = new RasterGrid(4, 4, grid.originX() + 10_000, grid.originY(), 30, -30, grid.epsg(), grid.crsWkt());
        GeoTiffWriter.writeFloat(dir.resolve("in/far.tif"), far, new float[16], -9999f);
        var e4 = assertThrows(UserInputException.class, () -> Observe.run(spark, fresh, ObservationSet.read(
                observations("b4", "  - {file: far.tif, time: \"2026-07-15T12:00:00Z\"}\n"))));
        assertTrue(e4.getMessage().contains("no valid pixel"), e4.getMessage());
        assertFalse(Files.exists(fresh.resolve("observed")));
        assertFalse(Files.exists(fresh.resolve(".observed.tmp")));
        assertTrue(Files.exists(img));
    }

    /**
     * --calibrate's job on the tiny run: albedo of every material dominating an observed pixel,
     * fitted to the noisy 14:00 image; the calibrated file reads back through MaterialsFile, the
     * sample's RMSE does not grow, and a second fit writes byte-identical files (fixed seed).
     * Recovery of known values is checked in the model (CalibrationTest).
     */
    @Test
    void calibrationWritesAMaterialsFileThatReadsBack() throws Exception {
        image("cal", 0.5, false);
        var set = ObservationSet.read(observations("cal", """
                  - {file: cal.tif, time: "2026-07-15T12:00:00Z", nodata: -9999}
                """));
        var views = org.thermotile.jobs.observe.Calibrate.ObserveResultView.of(Observe.run(spark, out, set), set);
        PrintStream quiet = new PrintStream(PrintStream.nullOutputStream());
        var fit = org.thermotile.jobs.observe.Calibrate.run(spark, out, prepared, views, List.of("albedo"), quiet);
        String d = fit.estimates() + " RMSE " + fit.rmseBeforeK() + " -> " + fit.rmseAfterK();
        assertFalse(fit.estimates().isEmpty(), d);
        assertTrue(fit.rmseAfterK() <= fit.rmseBeforeK() + 1e-9, d);
        Path yaml = out.resolve("observed/calibrated_materials.yaml");
        var read = org.thermotile.jobs.io.MaterialsFile.read(yaml);
        assertFalse(read.isEmpty(), Files.readString(yaml));
        String csv = Files.readString(out.resolve("observed/calibration.csv"));
        assertTrue(csv.startsWith("quantity,material,before,after,standard_error,identifiable,note\n"), csv);
        String y1 = Files.readString(yaml);
        org.thermotile.jobs.observe.Calibrate.run(spark, out, prepared, views, List.of("albedo"), quiet);
        assertEquals(y1, Files.readString(yaml), "same inputs, same calibrated file");
        assertEquals(csv, Files.readString(out.resolve("observed/calibration.csv")));
        assertThrows(UserInputException.class, () -> org.thermotile.jobs.observe.Calibrate.keys("albedo,albdo"));
    }

    /** The command's own checks: --calibrate without --run-file, or with an unknown key, is exit 2 before anything runs. */
    @Test
    void calibrateOptionsAreCheckedFirst() throws Exception {
        image("opt", 0, false);
        Path yaml = observations("opt", """
                  - {file: opt.tif, time: "2026-07-15T12:00:00Z", nodata: -9999}
                """);
        Path empty = dir.resolve("empty-run");
        Files.createDirectories(empty);
        assertEquals(2, org.thermotile.jobs.cli.Main.execute("observe", empty.toString(), "--observations",
                yaml.toString(), "--calibrate", "albedo"));
        assertEquals(2, org.thermotile.jobs.cli.Main.execute("observe", empty.toString(), "--observations",
                yaml.toString(), "--calibrate", "albedo,albdo", "--run-file", runFile.toString()));
        try (var files = Files.list(empty)) {
            assertEquals(0, files.count(), "nothing written");
        }
    }
}
