package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.OptionalInt;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.io.raster.TinyTiff;
import picocli.CommandLine;

/**
 * Each bad input of the city job gives a clear message (file, place, fix), exit status 2, and no
 * output folder. All of these fail in the checks, before Spark starts.
 */
class CityInputErrorsTest {
    @TempDir
    Path dir;

    /** Runs {@code thermotile run RUNFILE --out OUT}; returns the error text after asserting status 2 and no output. */
    String runFails(Path runFile) {
        Path out = dir.resolve("out");
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setErr(new PrintWriter(err));
        int status = Main.executeWith(cl, "run", runFile.toString(), "--out", out.toString(), "--quiet");
        assertEquals(Main.BAD_INPUT, status, err.toString());
        assertFalse(Files.exists(out), "no output folder");
        assertFalse(Files.exists(dir.resolve(".out.partial")), "no temporary folder");
        return err.toString();
    }

    @Test
    void unknownClassCodesAreListedWithTheirCellCounts() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        Files.writeString(dir.resolve("classes.yaml"), CityFixture.CLASSES.replace(
                "  - {code: 5, material: water, label: river}\n", ""));
        long water = Arrays.stream(CityFixture.codes()).filter(c -> c == 5).count();
        String msg = runFails(rf);
        assertTrue(msg.contains("5") && msg.contains(Long.toString(water)), msg);
        assertTrue(msg.contains("classes.yaml"), msg);
    }

    /** Heights on another grid (shifted 5 m) are put onto the working grid, not refused. */
    @Test
    void heightsOnAnotherGridAreResampled() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        RasterGrid shifted = RasterGrid.ofEpsg(CityFixture.W, CityFixture.H, CityFixture.X0 + 5, CityFixture.Y0,
                CityFixture.CELL, -CityFixture.CELL, 32632);
        GeoTiffWriter.writeFloat(dir.resolve("heights.tif"), shifted, new float[CityFixture.W * CityFixture.H], -9999f);
        Files.writeString(rf, Files.readString(rf).replace("  classes: classes.yaml",
                "  classes: classes.yaml\n  heights: heights.tif"));
        var p = org.thermotile.jobs.city.RunPreparer.prepare(org.thermotile.jobs.config.RunFileReader.read(rf));
        String step = p.ingest().steps().get("heights");   // 5 m = one cell: aligned, copied with its offset
        assertTrue(step.contains("copied") || step.contains("bilinear"), p.ingest().steps().toString());
    }

    @Test
    void heightsInAnotherCrsAreRefused() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        RasterGrid other = RasterGrid.ofEpsg(CityFixture.W, CityFixture.H, CityFixture.X0, CityFixture.Y0,
                CityFixture.CELL, -CityFixture.CELL, 32633);
        GeoTiffWriter.writeFloat(dir.resolve("heights.tif"), other, new float[CityFixture.W * CityFixture.H], -9999f);
        Files.writeString(rf, Files.readString(rf).replace("  classes: classes.yaml",
                "  classes: classes.yaml\n  heights: heights.tif"));
        String msg = runFails(rf);
        assertTrue(msg.contains("EPSG:32633") && msg.contains("EPSG:32632"), msg);
    }

    @Test
    void weatherNotCoveringThePeriodIsRefused() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        // Two hours of weather for a two-day period.
        Files.writeString(dir.resolve("weather.csv"), """
                time,air_temp_c,rel_humidity_pct,wind_ms,ghi_wm2
                2026-07-15T00:00+02:00,22,50,2,0
                2026-07-15T01:00+02:00,21,52,2,0
                """);
        Files.writeString(rf, Files.readString(rf).replaceAll("  synthetic: .*", "  file: weather.csv"));
        String msg = runFails(rf);
        assertTrue(msg.contains("weather.csv") && msg.contains("2026-07-15T01:00+02:00"), msg);
    }

    @Test
    void truncatedTiffIsRefused() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        Path lc = dir.resolve("landcover.tif");
        byte[] all = Files.readAllBytes(lc);
        Files.write(lc, Arrays.copyOf(all, all.length / 2));
        String msg = runFails(rf);
        assertTrue(msg.contains("landcover.tif"), msg);
        assertTrue(msg.contains("Fix"), msg);
    }

    @Test
    void notATiffIsRefused() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        Files.writeString(dir.resolve("landcover.tif"), "not a tiff at all");
        String msg = runFails(rf);
        assertTrue(msg.contains("landcover.tif"), msg);
    }

    @Test
    void rotatedGeotransformIsRefused() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        double c = 5 * Math.cos(Math.toRadians(20)), s = 5 * Math.sin(Math.toRadians(20));
        List<TinyTiff.Tag> tags = new ArrayList<>(List.of(
                new TinyTiff.Tag(TinyTiff.MODEL_TRANSFORMATION, new double[] {
                    c, -s, 0, CityFixture.X0, -s, -c, 0, CityFixture.Y0, 0, 0, 0, 0, 0, 0, 0, 1}),
                TinyTiff.projectedKeys(32632)));
        float[] px = new float[12];
        Arrays.fill(px, 1);
        TinyTiff.write(dir.resolve("landcover.tif"), ByteOrder.LITTLE_ENDIAN, 4, 3, px, tags);
        String msg = runFails(rf);
        assertTrue(msg.contains("rotated") && msg.contains("north-up"), msg);
    }

    @Test
    void allNodataRasterIsRefused() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        GeoTiffWriter.writeInt(dir.resolve("landcover.tif"), CityFixture.grid(), GeoTiffWriter.IntType.UINT8,
                new int[CityFixture.W * CityFixture.H], OptionalInt.of(0));
        String msg = runFails(rf);
        assertTrue(msg.contains("every cell is nodata"), msg);
    }

    @Test
    void misspeltKeySuggestsTheRightOne() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        Files.writeString(rf, Files.readString(rf).replace("outputs:", "ouputs:"));
        String msg = runFails(rf);
        assertTrue(msg.contains("ouputs") && msg.contains("did you mean 'outputs'"), msg);
    }

    @Test
    void checkCommandPassesOnGoodInputsAndWritesNothing() throws Exception {
        Path rf = CityFixture.write(dir, 256, "");
        StringWriter out = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out));
        long before = Files.list(dir).count();
        assertEquals(0, Main.executeWith(cl, "check", rf.toString()), out.toString());
        assertTrue(out.toString().contains("ok") && out.toString().contains("roof_membrane_dark"), out.toString());
        assertEquals(before, Files.list(dir).count(), "check writes nothing");
    }
}
