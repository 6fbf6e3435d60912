package org.thermotile.jobs.faults;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.spark.sql.SparkSession;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;
import org.thermotile.jobs.city.CityJob;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.city.SparkSessions;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.testing.Gdal;
import picocli.CommandLine;

/**
 * The bad-input catalogue: inputs of unusual storage or content, tried as a
 * hostile user would, one row each. A row that must be refused asserts exit status 2, a message
 * naming the file and the place (line, column, key or cell) and that no output folder (nor a
 * staging folder or lock) is left. A row that should work is run and its maps and tables compared
 * byte for byte with the plain input's run.
 *
 * <p>The inputs are a 40 × 30-cell window of the Riverside Flats demo land cover (cut with
 * {@code gdal_translate}, which also writes every raster variant) and two days of its weather.
 */
class BadInputCatalogueTest {
    @TempDir
    static Path dir;
    static SparkSession spark;
    static Path plainOut;
    static final Path DEMO = Path.of("..", "data-samples", "riverside").toAbsolutePath().normalize();

    /** What a row expects: refused with these fragments in the message, or the plain run's outputs. */
    record Row(String name, Setup setup, boolean works, int[] cellShift, String... fragments) {
        @Override
        public String toString() {
            return name;
        }
    }

    interface Setup {
        /** Writes the row's inputs into {@code in}; returns its run file. */
        Path write(Path in) throws Exception;
    }

    static Row fails(String name, Setup s, String... fragments) {
        return new Row(name, s, false, null, fragments);
    }

    static Row works(String name, Setup s) {
        return new Row(name, s, true, null);
    }

    /**
     * Works on another window of the demo: each of its cells inside the plain window has the plain
     * run's values there (no heights, so a cell's balance is its own), cell (c, r) being plain cell
     * (c + dc, r + dr).
     */
    static Row worksOnCells(String name, Setup s, int dc, int dr) {
        return new Row(name, s, true, new int[] {dc, dr});
    }

    @BeforeAll
    static void plainRun() throws Exception {
        Gdal.require("gdal_translate");
        spark = SparkSessions.get(null, 2);
        Path in = dir.resolve("plain");
        Path rf = plain(in);
        plainOut = dir.resolve("plain-out");
        CityJob.run(spark, RunPreparer.prepareAll(RunFileReader.read(rf), false),
                new CityJob.Options(plainOut, null, false, true, 0), new PrintStream(new ByteArrayOutputStream()));
    }

    @AfterAll
    static void stop() {
        if (spark != null) {
            spark.stop();
        }
    }

    // ---- inputs ----------------------------------------------------------------------------

    static final String RUN = """
            name: catalogue
            site: {latitude: 45.1436, longitude: 9.0229, elevation_m: 70}
            inputs:
              land_cover: %s
              classes: classes.yaml
            weather:
              file: %s
            period:
              start: 2026-07-14
              end: 2026-07-14
              spin_up_days: 1
            outputs:
              maps: [peak, mean, night_min]
              threshold_c: 45
            tiling:
              tile_size: 32
            """;

    /** The plain inputs: a tiled DEFLATE window of the demo land cover, its classes and weather. */
    static Path plain(Path in) throws Exception {
        Files.createDirectories(in);
        raster(in.resolve("landcover.tif"), "-srcwin", "180", "120", "40", "30", "-co", "TILED=YES",
                "-co", "BLOCKXSIZE=16", "-co", "BLOCKYSIZE=16", "-co", "COMPRESS=DEFLATE");
        Files.copy(DEMO.resolve("classes.yaml"), in.resolve("classes.yaml"));
        Files.copy(DEMO.resolve("weather.csv"), in.resolve("weather.csv"));
        return runFile(in, "landcover.tif", "weather.csv");
    }

    static Path runFile(Path in, String landCover, String weather) throws IOException {
        return Files.writeString(in.resolve("run.yaml"), RUN.formatted(landCover, weather));
    }

    /** {@code gdal_translate} of the demo land cover with {@code options} into {@code target}. */
    static void raster(Path target, String... options) throws IOException {
        raster(DEMO.resolve("landcover.tif"), target, options);
    }

    static void raster(Path source, Path target, String... options) throws IOException {
        List<String> cmd = new ArrayList<>(List.of("gdal_translate", "-q"));
        cmd.addAll(List.of(options));
        cmd.add(source.toString());
        cmd.add(target.toString());
        Gdal.run(cmd);
    }

    /** The plain inputs with the land cover replaced by a variant of the window. */
    static Setup landCover(String... options) {
        return in -> {
            Path rf = plain(in);
            List<String> o = new ArrayList<>(List.of("-srcwin", "180", "120", "40", "30"));
            o.addAll(List.of(options));
            raster(in.resolve("variant.tif"), o.toArray(String[]::new));
            return runFile(in, "variant.tif", "weather.csv");
        };
    }

    /** The plain inputs with the land cover cut to another window. */
    static Setup window(String x, String y, String w, String h) {
        return in -> {
            plain(in);
            raster(in.resolve("variant.tif"), "-srcwin", x, y, w, h);
            return runFile(in, "variant.tif", "weather.csv");
        };
    }

    /** A paletted copy: the window through a VRT given a colour table. */
    static Path paletted(Path in) throws Exception {
        Path rf = plain(in);
        Path vrt = in.resolve("p.vrt");
        raster(in.resolve("landcover.tif"), vrt, "-of", "VRT");
        StringBuilder table = new StringBuilder("<ColorInterp>Palette</ColorInterp><ColorTable>");
        for (int i = 0; i < 256; i++) {
            table.append("<Entry c1=\"").append(i).append("\" c2=\"").append(255 - i).append("\" c3=\"")
                    .append((i * 7) % 256).append("\" c4=\"255\"/>");
        }
        table.append("</ColorTable>");
        String x = Files.readString(vrt).replaceFirst("<ColorInterp>Gray</ColorInterp>", "")
                .replaceFirst("(<VRTRasterBand[^>]*>)", "$1" + table);
        Files.writeString(vrt, x);
        raster(vrt, in.resolve("variant.tif"));
        return runFile(in, "variant.tif", "weather.csv");
    }

    /** The plain inputs with the weather text changed by {@code edit}. */
    static Setup weather(java.util.function.UnaryOperator<String> edit) {
        return in -> {
            plain(in);
            Files.writeString(in.resolve("weather.csv"), edit.apply(Files.readString(in.resolve("weather.csv"))));
            return in.resolve("run.yaml");
        };
    }

    /** The plain inputs with the weather file's bytes changed by {@code edit}. */
    static Setup weatherBytes(java.util.function.UnaryOperator<byte[]> edit) {
        return in -> {
            plain(in);
            Path w = in.resolve("weather.csv");
            Files.write(w, edit.apply(Files.readAllBytes(w)));
            return in.resolve("run.yaml");
        };
    }

    /** The plain inputs with the run file's text changed by {@code edit}. */
    static Setup runText(java.util.function.UnaryOperator<String> edit) {
        return in -> {
            Path rf = plain(in);
            Files.writeString(rf, edit.apply(Files.readString(rf)));
            return rf;
        };
    }

    /** The plain inputs in a folder named {@code name}. */
    static Setup folder(String name) {
        return in -> plain(in.resolve(name));
    }

    static String replaceLine(String text, String startsWith, String by) {
        StringBuilder b = new StringBuilder();
        for (String l : text.split("\n", -1)) {
            b.append(l.startsWith(startsWith) ? by : l).append('\n');
        }
        return b.substring(0, b.length() - 1);
    }

    static Stream<Row> rows() {
        return Stream.of(
                // rasters of unusual storage
                works("BigTIFF", landCover("-co", "BIGTIFF=YES", "-co", "TILED=YES")),
                works("striped, not tiled", landCover()),
                works("LZW", landCover("-co", "COMPRESS=LZW")),
                works("PackBits", landCover("-co", "COMPRESS=PACKBITS")),
                works("uncompressed", landCover("-co", "COMPRESS=NONE", "-co", "TILED=YES")),
                works("paletted", BadInputCatalogueTest::paletted),
                fails("floating-point class codes", landCover("-ot", "Float32"), "variant.tif: land cover holds float32 samples"),
                fails("16-bit class codes not in the table", landCover("-ot", "UInt16", "-scale",
                        "0", "50", "0", "500"), "classes.yaml", "code 100 (193 cells in the land-cover raster)"),
                worksOnCells("1 × 1", window("200", "130", "1", "1"), 20, 10),
                worksOnCells("one cell wide, very tall", window("200", "0", "1", "350"), 20, -120),
                fails("not a TIFF at all", in -> {
                    Path rf = plain(in);
                    Files.writeString(in.resolve("variant.tif"), "GIF89a not a tiff");
                    return runFile(in, "variant.tif", "weather.csv");
                }, "variant.tif"),
                // weather files
                fails("daylight-saving jump (offset changes mid-file)", weather(t -> t.replace(
                        "2026-07-13T05:00+02:00", "2026-07-13T04:00+01:00")), "weather.csv, line 60, column time", "has UTC offset +01:00"),
                fails("duplicate hour", weather(t -> t.replace("2026-07-13T05:00+02:00,",
                        "2026-07-13T04:00+02:00,")), "weather.csv, line 60, column time", "duplicate time"),
                fails("unordered hours", weather(t -> {
                    String a = "2026-07-13T05:00+02:00", b = "2026-07-13T06:00+02:00";
                    return t.replace(a, "@@").replace(b, a).replace("@@", b);
                }), "weather.csv, line 61, column time", "the hours are out of order: \"2026-07-13T05:00+02:00\" is earlier than "
                        + "2026-07-13T06:00+02:00 on line 60", "sort the rows by time"),
                fails("times without offsets", weather(t -> t.replace("+02:00,", ",")), "weather.csv, line 7, column time", "not a time with offset"),
                fails("another year", weather(t -> t.replace("2026-07-", "2025-07-")), "weather.csv"),
                fails("latin-1 comment", weatherBytes(b -> {
                    byte[] head = "# Saltmere station, air temperature in \u00b0C\n".getBytes(StandardCharsets.ISO_8859_1);
                    byte[] all = new byte[head.length + b.length];
                    System.arraycopy(head, 0, all, 0, head.length);
                    System.arraycopy(b, 0, all, head.length, b.length);
                    return all;
                }), "weather.csv", "line 1"),
                works("UTF-8 with BOM", weather(t -> "\uFEFF" + t)),
                works("CRLF line ends", weather(t -> t.replace("\n", "\r\n"))),
                fails("NaN", weather(t -> t.replace("2026-07-13T05:00+02:00,", "2026-07-13T05:00+02:00,NaN,")
                        .replaceFirst("(2026-07-13T05:00\\+02:00,NaN,)[^,]*,", "$1")), "weather.csv, line 60, column air_temp_c", "\"NaN\" is not a number"),
                fails("sentinel -999", weather(t -> t.replaceFirst("(2026-07-13T05:00\\+02:00,)[^,]*", "$1-999")),
                        "weather.csv, line 60, column air_temp_c", "outside the accepted range"),
                fails("sentinel 9999", weather(t -> t.replaceFirst(
                        "(2026-07-13T05:00\\+02:00,[^,]*,[^,]*,[^,]*,)[^,]*", "$19999")), "weather.csv, line 60, column ghi_wm2", "outside the accepted range"),
                fails("empty file", weather(t -> ""), "weather.csv: no header line"),
                fails("header only", weather(t -> t.substring(0, t.indexOf("\n2026-"))), "weather.csv, line 6: the header is not followed by any hour"),
                // run files
                fails("tab indentation", runText(t -> t.replace("  classes: classes.yaml", "\tclasses: classes.yaml")),
                        "run.yaml line 4, column 28", "Do not use \\t(TAB) for indentation"),
                fails("duplicate key", runText(t -> t + "name: again\n"), "run.yaml line 17, column 1",
                        "key given twice (first on line 1)"),
                fails("anchors and aliases", runText(t -> t.replace("start: 2026-07-14", "start: &day 2026-07-14")
                        .replace("end: 2026-07-14", "end: *day")), "run.yaml line 10, column 8",
                        "period.end: the YAML alias *day is not supported"),
                fails("huge threshold 1e308", runText(t -> t.replace("threshold_c: 45", "threshold_c: 1e308")),
                        "run.yaml line 14, column 3", "threshold_c", "outside the plausible range"),
                fails("spin-up of 10^6 days", runText(t -> t.replace("spin_up_days: 1", "spin_up_days: 1000000")),
                        "run.yaml line 11, column 3", "spin_up_days: 1000000 is outside 0…365 days"),
                fails("period of 10^6 days", runText(t -> t.replace("end: 2026-07-14", "end: 4764-06-10")),
                        "weather.csv", "4764-06-11"),
                // paths
                works("paths with spaces", folder("my city inputs")),
                works("paths with non-ASCII characters", folder("Saltmère – Ørsted ü")));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("rows")
    void catalogue(Row row) throws Exception {
        Path in = Files.createDirectories(dir.resolve("rows").resolve(row.name().replaceAll("[^A-Za-z0-9]+", "_")));
        Path rf = row.setup().write(in);
        Path out = rf.getParent().resolve("out " + (row.name().contains("non-ASCII") ? "ü" : "x"));
        if (!row.works()) {
            StringWriter err = new StringWriter();
            CommandLine cl = new CommandLine(new Main());
            cl.setErr(new PrintWriter(err));
            cl.setOut(new PrintWriter(new StringWriter()));
            int status = Main.executeWith(cl, "run", rf.toString(), "--out", out.toString(), "--quiet");
            String msg = err.toString();
            System.out.println("CATALOGUE | " + row.name() + " | exit " + status + " | " + msg.strip());
            assertEquals(Main.BAD_INPUT, status, msg);
            for (String f : row.fragments()) {
                assertTrue(msg.contains(f), "message names " + f + ": " + msg);
            }
            assertFalse(Files.exists(out), "no output folder");
            try (Stream<Path> s = Files.list(rf.getParent())) {
                assertTrue(s.noneMatch(p -> p.getFileName().toString().endsWith(".partial")
                        || p.getFileName().toString().endsWith(".lock")), "no staging folder or lock");
            }
        } else {
            CityJob.run(spark, RunPreparer.prepareAll(RunFileReader.read(rf), false),
                    new CityJob.Options(out, null, false, true, 0), new PrintStream(new ByteArrayOutputStream()));
            if (row.cellShift() != null) {
                System.out.println("CATALOGUE | " + row.name() + " | works, same cells");
                sameCells(out, row.cellShift()[0], row.cellShift()[1]);
                return;
            }
            System.out.println("CATALOGUE | " + row.name() + " | works, same maps");
            for (String f : files(plainOut)) {
                if (!f.equals("manifest.json")) {
                    assertArrayEquals(Files.readAllBytes(plainOut.resolve(f)), Files.readAllBytes(out.resolve(f)), f);
                }
            }
            assertEquals(files(plainOut), files(out));
        }
    }

    /** Every map of {@code out} equals the plain run's where the two windows overlap (and they do). */
    static void sameCells(Path out, int dc, int dr) {
        for (String m : List.of("peak", "mean", "night_min")) {
            try (GeoTiffReader a = GeoTiffReader.openSingleBand(out.resolve("maps/" + m + ".tif"));
                 GeoTiffReader p = GeoTiffReader.openSingleBand(plainOut.resolve("maps/" + m + ".tif"))) {
                int w = a.grid().width(), h = a.grid().height();
                int pw = p.grid().width(), ph = p.grid().height();
                float[] va = a.readFloatWindow(0, 0, w, h), vp = p.readFloatWindow(0, 0, pw, ph);
                int compared = 0;
                for (int r = 0; r < h; r++) {
                    for (int c = 0; c < w; c++) {
                        int pc = c + dc, pr = r + dr;
                        if (pc >= 0 && pc < pw && pr >= 0 && pr < ph) {
                            assertEquals(vp[pr * pw + pc], va[r * w + c], 0.0, m + " at " + c + "," + r);
                            compared++;
                        }
                    }
                }
                assertTrue(compared > 0, "the windows overlap");
            }
        }
    }

    static List<String> files(Path root) throws IOException {
        try (Stream<Path> s = Files.walk(root)) {
            return s.filter(Files::isRegularFile).map(p -> root.relativize(p).toString()).sorted().toList();
        }
    }
}
