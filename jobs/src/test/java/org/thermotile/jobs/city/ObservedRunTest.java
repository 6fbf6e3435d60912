package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.OptionalInt;
import java.util.Random;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.observe.Observe;
import org.thermotile.jobs.observe.ObservationSet;

/**
 * A run whose file holds an {@code observations:} block: it keeps only the hours bracketing each
 * acquisition, compares itself before it is published, and gives what {@code observe} gives.
 */
class ObservedRunTest {
    @TempDir
    static Path dir;
    static Path in;
    static Path out;
    static RunFile run;
    static PreparedRun prepared;
    static SparkSession spark;

    /** A 30 m image grid over the fixture's 750 × 550 m, its west/north edges on the run's. */
    static RasterGrid imageGrid() {
        return RasterGrid.ofEpsg(25, 18, CityFixture.X0, CityFixture.Y0, 30, -30, 32632);
    }

    /** An invented UInt16 image (Collection 2 scale and offset, nodata 0) and its quality mask. */
    static void image(String name, double meanK, int maskCode) throws Exception {
        RasterGrid g = imageGrid();
        int[] v = new int[g.width() * g.height()];
        int[] qa = new int[v.length];
        Random rnd = new Random(7);
        for (int i = 0; i < v.length; i++) {
            double k = meanK + 2 * rnd.nextGaussian();
            v[i] = (int) Math.round((k - 149.0) / 0.00341802);
            qa[i] = i % 7 == 0 ? 2 : 1;        // code 2: a cloud over every seventh pixel
        }
        GeoTiffWriter.writeInt(in.resolve(name + ".tif"), g, GeoTiffWriter.IntType.UINT16, v, OptionalInt.of(0));
        GeoTiffWriter.writeInt(in.resolve(name + "-qa.tif"), g, GeoTiffWriter.IntType.UINT8, qa, OptionalInt.empty());
    }

    static String entry(String name, String time, String keep) {
        return "  - {file: " + name + ".tif, time: \"" + time + "\", scale: 0.00341802, offset: 149.0, nodata: 0, "
                + "mask: {file: " + name + "-qa.tif, keep: [" + keep + "]}}\n";
    }

    /** The fixture's run file (no hourly_days) with an observations block. */
    static Path runFile(String name, String block) throws Exception {
        Path f = CityFixture.runFile(in, 64, "", "landcover.tif");
        Path g = in.resolve(name + ".yaml");
        Files.writeString(g, Files.readString(f) + "observations:\n" + block);
        return g;
    }

    @BeforeAll
    static void runOnce() throws Exception {
        in = dir.resolve("in");
        CityFixture.write(in, 64, "");
        image("day", 315, 1);
        image("night", 295, 1);
        Path rf = runFile("observed", entry("day", "2026-07-15T10:30:00Z", "1")
                + entry("night", "2026-07-15T20:00:00Z", "1"));
        run = RunFileReader.read(rf);
        prepared = RunPreparer.prepare(run);
        out = dir.resolve("out");
        assertEquals(0, org.thermotile.jobs.cli.Main.execute("run", rf.toString(), "--out", out.toString(),
                "--quiet"));
        assertEquals(0, org.thermotile.jobs.cli.Main.execute("check", rf.toString()), "check of a good block");
        spark = SparkSessions.get(null, 2);
    }

    @AfterAll
    static void stop() {
        if (spark != null) {
            spark.stop();
        }
    }

    /**
     * Kept hours: 10:30Z is bracketed by 10:00Z and 11:00Z, 20:00Z is on the hour: three hours of
     * state are asked of the tiles, the tiles hold three grids, and the table has three hours.
     */
    @Test
    void onlyTheBracketingHoursAreKept() {
        long[] want = {Instant.parse("2026-07-15T10:00:00Z").getEpochSecond(),
                Instant.parse("2026-07-15T11:00:00Z").getEpochSecond(),
                Instant.parse("2026-07-15T20:00:00Z").getEpochSecond()};
        assertArrayEquals(want, prepared.hourlyEpochSeconds());
        assertEquals(3, prepared.spec().settings().hourlyOutputHours().length);
        TileOutput t = TileTask.run(prepared.tiles().get(0), prepared.spec(), null, null, null);
        assertEquals(3, t.result().hourlyC.length, "hourly grids held by a tile");
        var times = spark.read().parquet(out.resolve("tables/cell_hours").toUri().toString()).select("time")
                .distinct().collectAsList();
        assertEquals(3, times.size(), times.toString());
        assertEquals(3 * prepared.activeCells(), spark.read().parquet(out.resolve("tables/cell_hours").toUri()
                .toString()).count());
    }

    @Test
    void noHourlyMapsForHoursKeptOnlyForTheImages() throws Exception {
        try (var maps = Files.list(out.resolve("maps"))) {
            assertTrue(maps.noneMatch(m -> m.getFileName().toString().startsWith("hourly_")));
        }
    }

    /** The run's own comparison equals {@code observe} on the finished run, byte for byte. */
    @Test
    void theRunsComparisonEqualsObserveOnTheFinishedRun() throws Exception {
        Path obs = out.resolve("observed");
        for (String f : List.of("agreement.csv", "pairs.csv", "CAUTIONS.txt", "difference_day.tif",
                "difference_night.tif", "agreement.parquet/part-00000.snappy.parquet",
                "pairs.parquet/part-00000.snappy.parquet")) {
            assertTrue(Files.isRegularFile(obs.resolve(f)), f);
        }
        String csv = Files.readString(obs.resolve("agreement.csv"));
        assertTrue(csv.contains("day,all,all,") && csv.contains("night,all,all,"), csv);
        Path copy = dir.resolve("copy");
        copyTree(out, copy);
        org.thermotile.jobs.storage.Folders.deleteTree(copy.resolve("observed"));
        Observe.run(spark, copy, ObservationSet.of(run));
        for (String f : List.of("agreement.csv", "pairs.csv", "agreement.parquet/part-00000.snappy.parquet",
                "pairs.parquet/part-00000.snappy.parquet", "difference_day.tif")) {
            assertArrayEquals(Files.readAllBytes(obs.resolve(f)), Files.readAllBytes(copy.resolve("observed").resolve(f)),
                    f);
        }
        // The Parquet table holds the CSV's rows, units in the column names.
        var rows = spark.read().parquet(obs.resolve("agreement.parquet").toUri().toString());
        assertEquals(List.of("image", "group", "name", "count", "bias_k", "rmse_k", "mae_k", "pearson_r"),
                List.of(rows.columns()));
        assertEquals(csv.lines().count() - 1, rows.count());
        var pairs = spark.read().parquet(obs.resolve("pairs.parquet").toUri().toString());
        assertEquals(List.of("image", "pixel", "simulated_c", "observed_c"), List.of(pairs.columns()));
        assertEquals(Files.readString(obs.resolve("pairs.csv")).lines().count() - 1, pairs.count());
    }

    static void copyTree(Path from, Path to) throws Exception {
        try (var walk = Files.walk(from)) {
            for (Path q : (Iterable<Path>) walk::iterator) {
                Path t = to.resolve(from.relativize(q).toString());
                if (Files.isDirectory(q)) {
                    Files.createDirectories(t);
                } else {
                    Files.copy(q, t);
                }
            }
        }
    }

    /** Bad blocks: exit 2 with the fix, and no run folder nor a partial one. */
    @Test
    void badBlocksExitTwoAndWriteNothing() throws Exception {
        RasterGrid far = RasterGrid.ofEpsg(4, 4, CityFixture.X0 + 10_000, CityFixture.Y0, 30, -30, 32632);
        GeoTiffWriter.writeInt(in.resolve("far.tif"), far, GeoTiffWriter.IntType.UINT16, new int[16], OptionalInt.of(0));
        String[][] cases = {
                {"no-time", "  - {file: day.tif}\n", "'time' is missing", "e.g. time: 2026-07-16T10:30:00Z"},
                {"late", entry("day", "2026-07-20T10:00:00Z", "1"), "outside the run's counted hours",
                        "widen the period"},
                {"mask", entry("day", "2026-07-15T10:00:00Z", "5, 9"), "names no code", "list the codes of good"},
                {"far", "  - {file: far.tif, time: \"2026-07-15T10:00:00Z\", nodata: 0}\n", "no valid pixel",
                        "fix: give an image that covers the run's area"},
        };
        for (String[] c : cases) {
            Path rf = runFile(c[0], c[1]);
            Path o = dir.resolve("bad-" + c[0]);
            java.io.ByteArrayOutputStream err = new java.io.ByteArrayOutputStream();
            PrintStream old = System.err;
            System.setErr(new PrintStream(err, true));
            int code;
            try {
                code = org.thermotile.jobs.cli.Main.execute("run", rf.toString(), "--out", o.toString(), "--quiet");
            } finally {
                System.setErr(old);
            }
            assertEquals(2, code, c[0]);
            assertEquals(2, org.thermotile.jobs.cli.Main.execute("check", rf.toString()), "check " + c[0]);
            assertTrue(err.toString().contains(c[2]) && err.toString().contains(c[3]), c[0] + ": " + err);
            assertFalse(Files.exists(o), c[0]);
            assertFalse(Files.exists(dir.resolve(".bad-" + c[0] + ".partial")), c[0]);
        }
    }

    /** A weather file's offset is known only once it is read: the run check places the time then. */
    @Test
    void keptHoursRefuseATimeWithoutCountedHoursOnBothSides() {
        long[] epochs = {0, 3600, 7200, 10800, 14400};
        RunFile.Observation o = new RunFile.Observation("x.tif", Instant.ofEpochSecond(14_000), "surface_temperature",
                "K", 1, 0, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, null, List.of(),
                "run.yaml line 9, column 3: observations[0].time");
        var e = assertThrows(UserInputException.class, () -> KeptHours.of(epochs, 1, 4, List.of(), List.of(o)));
        assertTrue(e.getMessage().startsWith("run.yaml line 9") && e.getMessage().contains("fix"), e.getMessage());
        RunFile.Observation on = new RunFile.Observation("x.tif", Instant.ofEpochSecond(7200), "surface_temperature",
                "K", 1, 0, Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN, null, List.of(), "");
        assertArrayEquals(new int[] {1, 2}, KeptHours.of(epochs, 1, 4, List.of(1), List.of(on)));
    }
}
