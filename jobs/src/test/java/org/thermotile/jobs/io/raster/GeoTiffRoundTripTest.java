package org.thermotile.jobs.io.raster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.OptionalInt;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.thermotile.jobs.io.raster.GeoTiffWriter.IntType;

/**
 * Write → read round trips. Expected values come from the closed-form test fields below, never
 * from the code under test; odd sizes make edge tiles partial and windows cross tile edges.
 */
class GeoTiffRoundTripTest {

    static final int W = 300, H = 170;
    static final float NODATA = -9999f;
    /** UTM zone 33N (EPSG:32633) at an invented place; 10 m cells. */
    static final RasterGrid GRID = RasterGrid.ofEpsg(W, H, 431_000.0, 5_006_000.0, 10.0, -10.0,
            RasterGrid.utmEpsg(45.2, 15.1));

    @TempDir
    Path dir;

    /**
     * Test field: 1000·row + col + band/4, exact in float32 here; no-data where (row+col) % 97 = 0.
     * Read back, no-data cells are NaN.
     */
    static float field(int col, int row, int band) {
        return (row + col) % 97 == 0 ? NODATA : row * 1000f + col + band * 0.25f;
    }

    static float[] fieldBand(RasterGrid g, int band) {
        float[] v = new float[g.width() * g.height()];
        for (int r = 0; r < g.height(); r++) {
            for (int c = 0; c < g.width(); c++) {
                v[r * g.width() + c] = field(c, r, band);
            }
        }
        return v;
    }

    static void assertWindow(GeoTiffReader reader, int band, int c0, int r0, int w, int h) {
        float[] got = reader.readFloatWindow(band, c0, r0, w, h);
        assertEquals(w * h, got.length);
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                float expected = field(c0 + c, r0 + r, band);
                assertEquals(expected == NODATA ? Float.NaN : expected, got[r * w + c],
                        "band " + band + " col " + (c0 + c) + " row " + (r0 + r));
            }
        }
    }

    @Test
    void floatGridKeepsValuesCrsGeotransformAndNoData() {
        assertEquals(32633, GRID.epsg(), "UTM zone of 15.1°E is 33 (zone = floor((15.1+180)/6)+1)");
        Path f = dir.resolve("temp.tif");
        GeoTiffWriter.writeFloat(f, GRID, fieldBand(GRID, 0), NODATA);
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(f)) {
            assertTrue(r.grid().sameGridAs(GRID), () -> r.grid().differenceFrom(GRID).orElse(""));
            assertEquals(GRID.originX(), r.grid().originX(), 0.0);
            assertEquals(GRID.originY(), r.grid().originY(), 0.0);
            assertEquals(GRID.pixelWidth(), r.grid().pixelWidth(), 0.0);
            assertEquals(GRID.pixelHeight(), r.grid().pixelHeight(), 0.0);
            assertEquals(32633, r.grid().epsg());
            assertTrue(r.grid().crsWkt().contains("UTM zone 33N"), r.grid().crsWkt());
            assertEquals(GeoTiffReader.SampleType.FLOAT32, r.sampleType());
            assertEquals(NODATA, r.noDataValue().getAsDouble(), 0.0);
            assertWindow(r, 0, 0, 0, W, H);              // whole grid
            assertWindow(r, 0, 250, 160, 16, 10);        // crosses the tile edge at column 256
            assertWindow(r, 0, 255, 0, 2, 170);          // two columns astride the edge, all rows
            assertWindow(r, 0, 299, 169, 1, 1);          // last cell, in the partial edge tile
            assertWindow(r, 0, 0, 0, 1, 1);
        }
    }

    @Test
    void nanNoDataIsDeclaredAndReadBack() {
        Path f = dir.resolve("nan.tif");
        float[] v = fieldBand(GRID, 0);
        v[5] = Float.NaN;
        GeoTiffWriter.writeFloat(f, GRID, v, Float.NaN);
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertTrue(Double.isNaN(r.noDataValue().getAsDouble()));
            float[] got = r.readFloatWindow(0, 0, 10, 1);
            assertTrue(Float.isNaN(got[5]));
            assertEquals(field(6, 0, 0), got[6]);
        }
    }

    @Test
    void stackKeepsEveryBand() {
        Path f = dir.resolve("hourly.tif");
        float[][] bands = {fieldBand(GRID, 0), fieldBand(GRID, 1), fieldBand(GRID, 2)};
        GeoTiffWriter.writeFloatStack(f, GRID, bands, NODATA);
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertEquals(3, r.bandCount());
            for (int b = 0; b < 3; b++) {
                assertWindow(r, b, 240, 100, 40, 70);
            }
        }
        RasterFileException e = assertThrows(RasterFileException.class, () -> GeoTiffReader.openSingleBand(f));
        assertTrue(e.getMessage().contains("hourly.tif") && e.getMessage().contains("3 bands")
                && e.getMessage().contains("gdal_translate -b 1"), e.getMessage());
    }

    @Test
    void blockSourceIsAskedOncePerTileAndBandAndCoversTheGrid() {
        Path f = dir.resolve("blocks.tif");
        List<int[]> calls = new ArrayList<>();
        GeoTiffWriter.writeFloatBlocks(f, GRID, 2, NODATA, (band, c0, r0, w, h, out) -> {
            calls.add(new int[] {band, c0, r0, w, h});
            assertEquals(w * h, out.length);
            for (int r = 0; r < h; r++) {
                for (int c = 0; c < w; c++) {
                    out[r * w + c] = field(c0 + c, r0 + r, band);
                }
            }
        });
        // 300 × 170 in 256 × 256 tiles: 2 tiles (256 + 44 columns) × 1 row, 2 bands.
        assertEquals(4, calls.size());
        Set<String> seen = new HashSet<>();
        for (int[] c : calls) {
            assertTrue(seen.add(c[0] + "/" + c[1] + "/" + c[2]), "block asked twice");
        }
        assertArrayEquals(new int[] {0, 0, 0, 256, 170}, calls.get(0));
        assertArrayEquals(new int[] {1, 0, 0, 256, 170}, calls.get(1));
        assertArrayEquals(new int[] {0, 256, 0, 44, 170}, calls.get(2));
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertWindow(r, 1, 0, 0, W, H);
        }
    }

    @Test
    void integerTypesRoundTripWithNoData() {
        int[][] ranges = {{0, 255}, {0, 65535}, {-32768, 32767}};
        IntType[] types = {IntType.UINT8, IntType.UINT16, IntType.INT16};
        GeoTiffReader.SampleType[] expected = {GeoTiffReader.SampleType.UINT8, GeoTiffReader.SampleType.UINT16,
            GeoTiffReader.SampleType.INT16};
        for (int t = 0; t < types.length; t++) {
            int lo = ranges[t][0], hi = ranges[t][1];
            int[] v = new int[W * H];
            for (int i = 0; i < v.length; i++) {
                v[i] = lo + (int) ((i * 7919L) % (hi - lo + 1L));    // covers the range, both ends included
            }
            v[0] = lo;
            v[1] = hi;
            Path f = dir.resolve(types[t] + ".tif");
            GeoTiffWriter.writeInt(f, GRID, types[t], v, OptionalInt.of(hi));
            try (GeoTiffReader r = GeoTiffReader.openSingleBand(f)) {
                assertEquals(expected[t], r.sampleType());
                assertEquals(hi, r.noDataValue().getAsDouble(), 0.0, types[t].name());
                assertArrayEquals(v, r.readIntWindow(0, 0, W, H), types[t].name());
                int[] win = r.readIntWindow(250, 100, 20, 30);
                for (int row = 0; row < 30; row++) {
                    for (int c = 0; c < 20; c++) {
                        assertEquals(v[(100 + row) * W + 250 + c], win[row * 20 + c]);
                    }
                }
                assertTrue(r.grid().sameGridAs(GRID));
                float[] asFloat = r.readFloatWindow(0, 0, W, H);
                for (int i = 0; i < v.length; i++) {
                    assertEquals(v[i] == hi ? Float.NaN : (float) v[i], asFloat[i], "as float, no-data is NaN");
                }
            }
        }
    }

    @Test
    void landCoverWithoutNoDataDeclaresNone() {
        Path f = dir.resolve("landcover.tif");
        int[] v = new int[W * H];
        for (int i = 0; i < v.length; i++) {
            v[i] = 1 + i % 9;
        }
        GeoTiffWriter.writeInt(f, GRID, IntType.UINT8, v, OptionalInt.empty());
        try (GeoTiffReader r = GeoTiffReader.openSingleBand(f)) {
            assertTrue(r.noDataValue().isEmpty());
            assertArrayEquals(v, r.readIntWindow(0, 0, W, H));
        }
    }

    @Test
    void valueOutsideTheIntegerTypeNamesRowAndColumnAndLeavesNoFile() {
        Path f = dir.resolve("bad.tif");
        int[] v = new int[W * H];
        v[3 * W + 7] = 256;
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> GeoTiffWriter.writeInt(f, GRID, IntType.UINT8, v, OptionalInt.empty()));
        assertTrue(e.getMessage().contains("row 3, column 7") && e.getMessage().contains("0…255"), e.getMessage());
        assertFalse(Files.exists(f), "a half-written file is deleted");
    }

    @Test
    void narrowRasterWrittenAsStripsRoundTrips() {
        // ≤ 256 columns: SIS writes strips; see GeoTiffWriter.tileWidthFor.
        RasterGrid g = RasterGrid.ofEpsg(200, 270, 431_000.0, 5_006_000.0, 2.0, -2.0, 32633);
        Path f = dir.resolve("narrow.tif");
        GeoTiffWriter.writeFloat(f, g, fieldBand(g, 0), NODATA);
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertTrue(r.grid().sameGridAs(g));
            assertWindow(r, 0, 0, 0, 200, 270);
            assertWindow(r, 0, 150, 250, 50, 20);
        }
    }

    @Test
    void bigTiffRoundTrips() throws Exception {
        Path f = dir.resolve("big.tif");
        float[] v = fieldBand(GRID, 0);
        GeoTiffWriter.writeFloatBlocks(f, GRID, 1, NODATA, (band, c0, r0, w, h, out) -> {
            for (int r = 0; r < h; r++) {
                System.arraycopy(v, (r0 + r) * W + c0, out, r * w, w);
            }
        }, true);
        assertTrue(TiffDirectory.read(f).bigTiff);
        try (GeoTiffReader r = GeoTiffReader.open(f)) {
            assertEquals(NODATA, r.noDataValue().getAsDouble(), 0.0);
            assertWindow(r, 0, 250, 160, 16, 10);
        }
    }

    @Test
    void outputIsDeterministicAndCarriesNoTimestamp() throws Exception {
        Path a = dir.resolve("a.tif"), b = dir.resolve("b.tif");
        GeoTiffWriter.writeFloatStack(a, GRID, new float[][] {fieldBand(GRID, 0), fieldBand(GRID, 1)}, NODATA);
        GeoTiffWriter.writeFloatStack(b, GRID, new float[][] {fieldBand(GRID, 0), fieldBand(GRID, 1)}, NODATA);
        assertArrayEquals(Files.readAllBytes(a), Files.readAllBytes(b));
        TiffDirectory d = TiffDirectory.read(a);
        assertNull(d.entry(TiffDirectory.DATE_TIME), "no DateTime tag (306)");
        // TIFF 6.0: Compression 8 = Deflate (Adobe), 32946 = old Deflate; PhotometricInterpretation 1 = BlackIsZero.
        long compression = d.integer(TiffDirectory.COMPRESSION, 0);
        assertTrue(compression == 8 || compression == 32946, "compression " + compression);
        assertEquals(1, d.integer(TiffDirectory.PHOTOMETRIC, -1), "grey, not RGB");
        assertEquals(256, d.integer(TiffDirectory.TILE_WIDTH, 0));
        assertEquals(256, d.integer(TiffDirectory.TILE_LENGTH, 0));
        assertEquals("-9999", d.ascii(TiffDirectory.GDAL_NODATA));
    }

    @Test
    void missingFolderIsReported() {
        Path f = dir.resolve("no/such/folder/out.tif");
        RasterFileException e = assertThrows(RasterFileException.class,
                () -> GeoTiffWriter.writeFloat(f, GRID, fieldBand(GRID, 0), NODATA));
        assertTrue(e.getMessage().contains("does not exist"), e.getMessage());
    }
}
