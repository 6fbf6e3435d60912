package org.thermotile.jobs.ingest;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.OptionalInt;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.testing.Gdal;

class FootprintRasteriserTest {
    @TempDir
    Path dir;

    static final double X0 = 500_000, Y0 = 5_000_000, CELL = 4;
    static final RasterGrid GRID = RasterGrid.ofEpsg(100, 80, X0, Y0, CELL, -CELL, 32632);

    static RunFile.Buildings height(String attr) {
        return new RunFile.Buildings("f.geojson", attr, null, Double.NaN, null, null);
    }

    /** A FeatureCollection in EPSG:32632 (legacy "crs" member) of the given features' JSON. */
    Path collection(String crs, String... features) throws Exception {
        Path f = dir.resolve("f.geojson");
        Files.writeString(f, "{\"type\": \"FeatureCollection\"," + (crs == null ? ""
                : "\"crs\": {\"type\": \"name\", \"properties\": {\"name\": \"" + crs + "\"}},")
                + "\"features\": [" + String.join(",", features) + "]}");
        return f;
    }

    static String rect(double w, double s, double e, double n, String props) {
        return String.format(Locale.ROOT, "{\"type\": \"Feature\", \"properties\": {%s}, \"geometry\": {\"type\": "
                + "\"Polygon\", \"coordinates\": [[[%s, %s], [%s, %s], [%s, %s], [%s, %s], [%s, %s]]]}}",
                props, w, s, e, s, e, n, w, n, w, s);
    }

    /**
     * A square of side L at an arbitrary offset: by the cell-centre rule each row holds ⌊L/c⌋ or ⌈L/c⌉
     * cells and there are ⌊L/c⌋ or ⌈L/c⌉ such rows (counting lattice points of spacing c in an interval
     * of length L; analytic), so the area is within one cell per edge: |A − L²| ≤ 4·L·c.
     */
    @Test
    void squareOfKnownSizeRasterisesToItsAreaWithinOneCellPerEdge() throws Exception {
        double side = 37.3;
        double w = X0 + 41.7, n = Y0 - 53.9;
        Path f = collection("urn:ogc:def:crs:EPSG::32632", rect(w, n - side, w + side, n, "\"h\": 10"));
        FootprintRasteriser.Result r = FootprintRasteriser.read(f, height("h"), FootprintGrid.of(GRID));
        double area = r.cells() * CELL * CELL;
        double err = Math.abs(area - side * side);
        System.out.printf(Locale.ROOT, "square %.1f m: %d cells = %.0f m² vs %.2f m² (error %.1f m², %.2f %%)%n",
                side, r.cells(), area, side * side, err, 100 * err / (side * side));
        assertTrue(err <= 4 * side * CELL, "area error " + err);
        // Row and column counts are each ⌊L/c⌋ or ⌈L/c⌉.
        int lo = (int) Math.floor(side / CELL), hi = (int) Math.ceil(side / CELL);
        int rows = 0;
        for (int row = 0; row < GRID.height(); row++) {
            int inRow = 0;
            for (int c = 0; c < GRID.width(); c++) {
                if (r.feature()[row * GRID.width() + c] == 0) {
                    inRow++;
                    assertEquals(10f, r.heightM()[row * GRID.width() + c]);
                }
            }
            if (inRow > 0) {
                rows++;
                assertTrue(inRow == lo || inRow == hi, "row " + row + ": " + inRow);
            }
        }
        assertTrue(rows == lo || rows == hi, "rows " + rows);
        assertEquals(1, r.rasterised());
    }

    /**
     * The same square written in WGS 84 lon/lat by GDAL's ogr2ogr (an independent reprojection) and read
     * without a "crs" member (RFC 7946) rasterises, after our SIS transform back, onto the same cells.
     */
    @Test
    void wgs84FootprintsFromOgr2ogrLandOnTheSameCells() throws Exception {
        Gdal.require("ogr2ogr");
        double side = 37.3;
        double w = X0 + 41.7, n = Y0 - 53.9;
        Path utm = collection("urn:ogc:def:crs:EPSG::32632", rect(w, n - side, w + side, n, "\"h\": 10"));
        Path geo = dir.resolve("geo.geojson");
        Gdal.run(List.of("ogr2ogr", "-f", "GeoJSON", "-t_srs", "EPSG:4326", "-lco", "RFC7946=YES",
                "-lco", "COORDINATE_PRECISION=9", geo.toString(), utm.toString()));
        FootprintRasteriser.Result a = FootprintRasteriser.read(utm, height("h"), FootprintGrid.of(GRID));
        FootprintRasteriser.Result b = FootprintRasteriser.read(geo, height("h"), FootprintGrid.of(GRID));
        assertTrue(b.crs().contains("transformed"), b.crs());
        assertEquals(a.cells(), b.cells());
        for (int i = 0; i < a.feature().length; i++) {
            assertEquals(a.feature()[i], b.feature()[i], "cell " + i);
        }
    }

    /** floors × storey height; the tallest wins where footprints overlap (our stated rules). */
    @Test
    void floorsTimesStoreyHeightAndTallestWins() throws Exception {
        Path f = collection("EPSG:32632",
                rect(X0 + 10, Y0 - 50, X0 + 50, Y0 - 10, "\"levels\": 4"),
                rect(X0 + 30, Y0 - 70, X0 + 70, Y0 - 30, "\"levels\": 7"));
        var b = new RunFile.Buildings("f.geojson", null, "levels", 3.0, null, null);
        FootprintRasteriser.Result r = FootprintRasteriser.read(f, b, FootprintGrid.of(GRID));
        int inFirstOnly = (int) ((Y0 - (Y0 - 12)) / CELL) * GRID.width() + (int) (12 / CELL);   // centre (14, -14)
        int inBoth = (int) (42 / CELL) * GRID.width() + (int) (42 / CELL);                       // centre (42, -42)
        assertEquals(12f, r.heightM()[inFirstOnly], 0f);
        assertEquals(21f, r.heightM()[inBoth], 0f);
        assertEquals(1, r.feature()[inBoth]);
        assertEquals(2, r.rasterised());
    }

    /** Features without a usable height are counted by reason, never rasterised as 0 m. */
    @Test
    void featuresWithoutUsableHeightAreCounted() throws Exception {
        Path f = collection("EPSG:32632",
                rect(X0 + 10, Y0 - 50, X0 + 50, Y0 - 10, "\"h\": 8"),
                rect(X0 + 60, Y0 - 50, X0 + 90, Y0 - 10, "\"h\": null"),
                rect(X0 + 100, Y0 - 50, X0 + 130, Y0 - 10, "\"other\": 3"),
                rect(X0 + 140, Y0 - 50, X0 + 170, Y0 - 10, "\"h\": \"tall\""),
                rect(X0 + 180, Y0 - 50, X0 + 210, Y0 - 10, "\"h\": 0"),
                rect(X0 + 220, Y0 - 50, X0 + 250, Y0 - 10, "\"h\": -3"),
                rect(X0 + 260, Y0 - 50, X0 + 290, Y0 - 10, "\"h\": \"6.5\""),
                "{\"type\": \"Feature\", \"properties\": {\"h\": 5}, \"geometry\": {\"type\": \"Point\", "
                        + "\"coordinates\": [500300, 4999970]}}");
        FootprintRasteriser.Result r = FootprintRasteriser.read(f, height("h"), FootprintGrid.of(GRID));
        assertEquals(8, r.features());
        assertEquals(2, r.rasterised());
        assertEquals(2, r.skipped().get("missing"));
        assertEquals(1, r.skipped().get("not numeric"));
        assertEquals(2, r.skipped().get("not positive"));
        assertEquals(1, r.skipped().get("not a polygon"));
        assertEquals(6, r.skippedTotal());
        for (int i = 0; i < r.feature().length; i++) {
            if (r.feature()[i] >= 0) {
                assertTrue(r.heightM()[i] == 8f || r.heightM()[i] == 6.5f);
            } else {
                assertTrue(Float.isNaN(r.heightM()[i]), "no footprint: no height, not 0");
            }
        }
        assertTrue(r.note(f, height("h")).contains("not numeric=1"), r.note(f, height("h")));
    }

    @Test
    void noFeatureWithTheAttributeIsRefusedWithTheAttributesThatExist() throws Exception {
        Path f = collection("EPSG:32632", rect(X0 + 10, Y0 - 50, X0 + 50, Y0 - 10, "\"height_m\": 8, \"name\": \"a\""));
        UserInputException e = assertThrows(UserInputException.class,
                () -> FootprintRasteriser.read(f, height("heigth_m"), FootprintGrid.of(GRID)));
        String m = e.getMessage();
        assertTrue(m.contains(f.toString()) && m.contains("'heigth_m'") && m.contains("inputs.buildings.height"), m);
        assertTrue(m.contains("height_m, name") && m.contains("Did you mean 'height_m'"), m);
    }

    @Test
    void unknownCrsIsRefused() throws Exception {
        Path f = collection("EPSG:99999", rect(X0 + 10, Y0 - 50, X0 + 50, Y0 - 10, "\"h\": 8"));
        UserInputException e = assertThrows(UserInputException.class,
                () -> FootprintRasteriser.read(f, height("h"), FootprintGrid.of(GRID)));
        assertTrue(e.getMessage().contains("EPSG:99999") && e.getMessage().contains("Fix:"), e.getMessage());
    }

    /**
     * The demo's roof cells (heights.tif ≥ 2.5 m on non-tree land cover; the roof rule of
     * {@code Scenario.ROOF_MIN_HEIGHT_M}) turned into polygons by GDAL's gdal_polygonize.py (an
     * independent vectoriser; one polygon per 4-connected region of equal decimetre height) and
     * rasterised back reproduce the roof cells: ≥ 98 % of them, with ≤ 2 % extra cells.
     */
    @Test
    void demoRoofsPolygonisedByGdalAreReproduced() throws Exception {
        Gdal.require("gdalinfo");
        Path polygonize = org.thermotile.jobs.testing.ExternalTool.require("apt-get install python3-gdal",
                "gdal_polygonize.py", "/usr/bin/gdal_polygonize.py");
        Path demo = demoFolder();
        RasterGrid grid;
        float[] h;
        int[] codes;
        try (GeoTiffReader hr = GeoTiffReader.openSingleBand(demo.resolve("heights.tif"));
                GeoTiffReader lc = GeoTiffReader.openSingleBand(demo.resolve("landcover.tif"))) {
            grid = lc.grid();
            h = hr.readFloatWindow(0, 0, grid.width(), grid.height());
            codes = lc.readIntWindow(0, 0, grid.width(), grid.height());
        }
        int n = h.length;
        boolean[] roof = new boolean[n];
        int[] dm = new int[n];
        long roofs = 0;
        for (int i = 0; i < n; i++) {
            roof[i] = !Float.isNaN(h[i]) && h[i] >= 2.5f && codes[i] != 42;   // 42 = trees (classes.yaml)
            dm[i] = roof[i] ? Math.round(h[i] * 10) : 0;
            roofs += roof[i] ? 1 : 0;
        }
        Path tif = dir.resolve("roof-dm.tif");
        GeoTiffWriter.writeInt(tif, grid, GeoTiffWriter.IntType.INT16, dm, OptionalInt.empty());
        Path geo = dir.resolve("roofs.geojson");
        Gdal.run(List.of(polygonize.toString(), tif.toString(), "-f", "GeoJSON", geo.toString(), "roofs", "dm"));
        FootprintRasteriser.Result r = FootprintRasteriser.read(geo,
                new RunFile.Buildings(geo.toString(), "dm", null, Double.NaN, null, null), FootprintGrid.of(grid));
        long hit = 0, extra = 0;
        for (int i = 0; i < n; i++) {
            boolean got = r.feature()[i] >= 0;
            if (got && roof[i]) {
                hit++;
                assertEquals(dm[i], r.heightM()[i], 0f, "cell " + i);
            } else if (got) {
                extra++;
            }
        }
        double agree = 100.0 * hit / roofs;
        System.out.printf(Locale.ROOT, "demo roofs: %d cells, %d reproduced (%.3f %%), %d extra; %d polygons, "
                + "%d skipped (height 0 background)%n", roofs, hit, agree, extra, r.features(), r.skippedTotal());
        assertTrue(agree >= 98.0, "agreement " + agree);
        assertTrue(extra <= 0.02 * roofs, "extra " + extra);
        assertTrue(r.skipped().get("not positive") > 0, "the background polygons (0) are counted, not rasterised");
    }

    static Path demoFolder() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !Files.isDirectory(p.resolve("data-samples/riverside"))) {
            p = p.getParent();
        }
        return p.resolve("data-samples/riverside");
    }
}
