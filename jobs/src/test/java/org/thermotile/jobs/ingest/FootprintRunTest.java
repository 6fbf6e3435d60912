package org.thermotile.jobs.ingest;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.city.PreparedRun;
import org.thermotile.jobs.city.RunPreparer;
import org.thermotile.jobs.cli.Main;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.config.RunFileException;
import org.thermotile.jobs.config.RunFileReader;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import picocli.CommandLine;

/** Footprints through the run file: keys, the check, heights with a raster, roof materials, bad input. */
class FootprintRunTest {
    @TempDir
    Path dir;

    static final Path DEMO = FootprintRasteriserTest.demoFolder();
    static final Path EXAMPLE = DEMO.resolveSibling("footprints-example");

    Path runFile(String buildings, boolean heights) throws Exception {
        Path rf = dir.resolve("run.yaml");
        Files.writeString(rf, "name: fp\n"
                + "site: {latitude: 45.1436, longitude: 9.0229, elevation_m: 70}\n"
                + "inputs:\n  land_cover: " + DEMO.resolve("landcover.tif") + "\n  classes: "
                + DEMO.resolve("classes.yaml") + "\n"
                + (heights ? "  heights: " + DEMO.resolve("heights.tif") + "\n" : "")
                + "  buildings: " + buildings + "\n"
                + "weather:\n  file: " + DEMO.resolve("weather.csv") + "\n"
                + "period: {start: 2026-07-14, end: 2026-07-14, spin_up_days: 1}\n"
                + "outputs: {maps: [peak]}\n");
        return rf;
    }

    String fp() {
        return EXAMPLE.resolve("footprints.geojson").toString();
    }

    @Test
    void footprintsOverTheHeightsRasterAndRoofMaterials() throws Exception {
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(runFile(
                "{file: " + fp() + ", height: height_m, roof_material: roof}", true)));
        float[] grid = p.spec().heightGrid();
        float[] raster;
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(DEMO.resolve("heights.tif"))) {
            raster = r.readFloatWindow(0, 0, p.grid().width(), p.grid().height());
        }
        // Building 6 of the example: 30 m, E 501600…501680, N 4998900…4999000; a cell inside it
        // (centre E 501642, N 4998950) and a cell far from every footprint (the grid's top-left).
        int inside = (int) ((4999600 - 4998950) / 4) * p.grid().width() + (int) ((501642 - 500800) / 4);
        assertEquals(30f, grid[inside], 0f);
        assertEquals(Float.floatToIntBits(raster[0]), Float.floatToIntBits(grid[0]), "raster kept outside footprints");
        int m = p.spec().cellPalette()[inside];
        assertEquals("roof_membrane_white", p.spec().palette()[m].id());
        assertTrue(p.notes().stream().anyMatch(n -> n.contains("footprints replace the heights raster")), p.notes().toString());
        assertTrue(p.notes().stream().anyMatch(n -> n.contains("missing=1, not numeric=1")), p.notes().toString());
    }

    @Test
    void withoutRoofMaterialTheLandCoverKeepsItsMaterials() throws Exception {
        PreparedRun p = RunPreparer.prepare(RunFileReader.read(runFile("{file: " + fp() + ", height: height_m}", false)));
        assertNull(p.spec().cellPalette());
        assertNull(p.spec().heights());
        assertTrue(p.spec().hasHeights());
    }

    @Test
    void floorsNeedStoreyHeightAndHeightExcludesFloors() throws Exception {
        RunFileException e = assertThrows(RunFileException.class,
                () -> RunFileReader.read(runFile("{file: " + fp() + ", floors: levels}", false)));
        assertTrue(e.getMessage().contains("storey_height_m"), e.getMessage());
        e = assertThrows(RunFileException.class,
                () -> RunFileReader.read(runFile("{file: " + fp() + ", floors: levels, height: height_m}", false)));
        assertTrue(e.getMessage().contains("keep one"), e.getMessage());
        RunFile ok = RunFileReader.read(runFile("{file: " + fp() + ", floors: levels, storey_height_m: 3.0}", false));
        assertEquals(ok.inputs(), RunFileReader.parse(ok.toYaml(), dir, "again").inputs(), "resolved form reads back");
    }

    @Test
    void noHeightAttributeExitsTwoNamingFileAttributeAndTheExistingOnes() throws Exception {
        Path out = dir.resolve("out");
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setErr(new PrintWriter(err));
        int status = Main.executeWith(cl, "run", runFile("{file: " + fp() + ", height: height}", false).toString(),
                "--out", out.toString(), "--quiet");
        assertEquals(Main.BAD_INPUT, status, err.toString());
        assertFalse(Files.exists(out), "nothing written");
        String msg = err.toString();
        assertTrue(msg.contains("footprints.geojson") && msg.contains("'height'"), msg);
        assertTrue(msg.contains("height_m, levels, name, roof") && msg.contains("Did you mean 'height_m'"), msg);
    }

    /**
     * {@code check} on the committed example: the footprints' cells counted by hand from the generator's
     * rectangles (edges on the 4 m cell edges: 300 + 100 + 600 + 156 + 120 + 500 + 135 + 375 + 100 + 625
     * cells, plus the 100 cells of the 12 m block outside the 30 m block it overlaps = 3111), the two
     * features without height, and the mapped weather.
     */
    @Test
    void checkOfTheExampleReportsTheHandCountedCells() {
        StringWriter out = new StringWriter();
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out));
        assertEquals(0, Main.executeWith(cl, "check", EXAMPLE.resolve("run.yaml").toString()), out.toString());
        String s = out.toString();
        assertTrue(s.contains("13 features, 11 rasterised onto 3111 cells"), s);
        assertTrue(s.contains("{missing=1, not numeric=1, not positive=0, not a polygon=0}"), s);
        assertTrue(s.contains("air_temperature ← 'Temp (F)' [degF]") && s.contains("wind_speed ← 'Wind km/h' [km/h]"), s);
    }

    @Test
    void anUnknownRoofMaterialNamesTheFeature() throws Exception {
        Path f = dir.resolve("f.geojson");
        Files.writeString(f, Files.readString(EXAMPLE.resolve("footprints.geojson")).replace("\"clay_tile\"", "\"clay_tiles\""));
        var e = assertThrows(org.thermotile.jobs.errors.UserInputException.class, () -> RunPreparer.prepare(
                RunFileReader.read(runFile("{file: " + f + ", height: height_m, roof_material: roof}", false))));
        assertTrue(e.getMessage().contains("features[1]") && e.getMessage().contains("clay_tiles")
                && e.getMessage().contains("clay_tile"), e.getMessage());
    }
}
