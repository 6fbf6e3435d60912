package org.thermotile.jobs.io.raster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalInt;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Written files as GDAL sees them ({@code gdalinfo -json -stats}, {@code gdallocationinfo}): GDAL
 * is the independent reader GIS users have. Expected statistics are closed-form sums of the test
 * fields. Runs in CI (which installs Debian gdal-bin); elsewhere it is skipped when gdalinfo is
 * missing, and it fails when the CI variable is set but gdalinfo is missing.
 */
class GeoTiffGdalTest {

    static final int W = 300, H = 170;
    static final RasterGrid GRID = GeoTiffRoundTripTest.GRID;

    @TempDir
    Path dir;

    private static boolean gdalPresent;

    @BeforeAll
    static void findGdal() {
        try {
            gdalPresent = run(List.of("gdalinfo", "--version")).startsWith("GDAL");
        } catch (IOException e) {
            gdalPresent = false;
        }
    }

    /** Per test, so each one shows as skipped (not silently absent) where GDAL is missing. */
    @BeforeEach
    void needGdal() {
        org.thermotile.jobs.testing.ExternalTool.require("apt-get install gdal-bin", "gdalinfo");
    }

    /** Field 1000·row + col + band/4 [any unit]; the last row is no-data. */
    static float[] field(RasterGrid g, int band, float noData) {
        float[] v = new float[g.width() * g.height()];
        for (int r = 0; r < g.height(); r++) {
            for (int c = 0; c < g.width(); c++) {
                v[r * g.width() + c] = r == g.height() - 1 ? noData : r * 1000f + c + band * 0.25f;
            }
        }
        return v;
    }

    /**
     * Over rows 0…h−2 and columns 0…w−1 of 1000·r + c + b/4: minimum b/4, maximum
     * 1000(h−2) + (w−1) + b/4, mean 1000(h−2)/2 + (w−1)/2 + b/4 (arithmetic series).
     */
    static void assertFieldStats(JsonNode band, int w, int h, int b) {
        double q = b * 0.25;
        assertEquals(q, band.get("minimum").asDouble(), 1e-9);
        assertEquals(1000.0 * (h - 2) + (w - 1) + q, band.get("maximum").asDouble(), 1e-9);
        assertEquals(1000.0 * (h - 2) / 2 + (w - 1) / 2.0 + q, band.get("mean").asDouble(), 1e-3);
    }

    static void assertGeoreferencing(JsonNode info, RasterGrid g) {
        assertEquals(g.width(), info.get("size").get(0).asInt());
        assertEquals(g.height(), info.get("size").get(1).asInt());
        JsonNode gt = info.get("geoTransform");
        double[] expected = {g.originX(), g.pixelWidth(), 0, g.originY(), 0, g.pixelHeight()};
        for (int i = 0; i < 6; i++) {
            assertEquals(expected[i], gt.get(i).asDouble(), 0.0, "geoTransform[" + i + "]");
        }
        String wkt = info.get("coordinateSystem").get("wkt").asText();
        assertTrue(wkt.replaceAll("\\s", "").endsWith("ID[\"EPSG\"," + g.epsg() + "]]"), wkt);
    }

    @Test
    void floatMapHasEpsgGeotransformNoDataStatsTilingAndDeflate() throws IOException {
        Path f = dir.resolve("peak.tif");
        GeoTiffWriter.writeFloat(f, GRID, field(GRID, 0, -9999f), -9999f);
        JsonNode info = gdalinfo(f);
        assertGeoreferencing(info, GRID);
        assertEquals("DEFLATE", info.at("/metadata/IMAGE_STRUCTURE/COMPRESSION").asText());
        JsonNode band = info.get("bands").get(0);
        assertEquals("Float32", band.get("type").asText());
        assertEquals(256, band.get("block").get(0).asInt());
        assertEquals(256, band.get("block").get(1).asInt());
        assertEquals(-9999.0, band.get("noDataValue").asDouble(), 0.0);
        assertFieldStats(band, W, H, 0);
        assertTrue(run(List.of("gdalinfo", f.toString())).contains("NoData Value=-9999"));
        // Single cells in both tile columns, read by GDAL: value 1000·row + col.
        assertEquals("255", locate(f, 255, 0));
        assertEquals("168299", locate(f, 299, 168));
        assertEquals("100256", locate(f, 256, 100));
    }

    @Test
    void hourlyStackHasOneBandPerHourEachWithNoData() throws IOException {
        Path f = dir.resolve("hourly.tif");
        float nd = Float.NaN;
        GeoTiffWriter.writeFloatStack(f, GRID, new float[][] {field(GRID, 0, nd), field(GRID, 1, nd), field(GRID, 2, nd)}, nd);
        JsonNode info = gdalinfo(f);
        assertGeoreferencing(info, GRID);
        assertEquals(3, info.get("bands").size());
        assertEquals("BAND", info.at("/metadata/IMAGE_STRUCTURE/INTERLEAVE").asText());
        for (int b = 0; b < 3; b++) {
            JsonNode band = info.get("bands").get(b);
            assertEquals("NaN", band.get("noDataValue").asText(), "GDAL's JSON spells NaN no-data \"NaN\"");
            assertEquals(256, band.get("block").get(0).asInt());
            assertFieldStats(band, W, H, b);
        }
    }

    @Test
    void landCoverIsByteWithNoDataAndRightCodes() throws IOException {
        Path f = dir.resolve("landcover.tif");
        int[] codes = new int[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                codes[r * W + c] = r == 0 ? 255 : 1 + c % 9;
            }
        }
        GeoTiffWriter.writeInt(f, GRID, GeoTiffWriter.IntType.UINT8, codes, OptionalInt.of(255));
        JsonNode info = gdalinfo(f);
        assertGeoreferencing(info, GRID);
        JsonNode band = info.get("bands").get(0);
        assertEquals("Byte", band.get("type").asText());
        assertEquals(255, band.get("noDataValue").asInt());
        assertEquals(1, band.get("minimum").asInt());
        assertEquals(9, band.get("maximum").asInt());
        // Per row: 33 full cycles of 1…9 (sum 45) and 1, 2, 3: (33·45 + 6) / 300 = 4.97.
        assertEquals(4.97, band.get("mean").asDouble(), 1e-9);
        assertEquals("DEFLATE", info.at("/metadata/IMAGE_STRUCTURE/COMPRESSION").asText());
    }

    @Test
    void narrowRasterInStripsAndBigTiffAreReadRight() throws IOException {
        // 270 rows: strips of 135 rows; 257 rows (prime): strips of one row. A strip padded past
        // the last row made GDAL misread the end of the raster; the no-data last row shows it.
        int[][] sizes = {{200, 270, 135}, {200, 257, 1}, {13, 170, 170}};
        for (int[] s : sizes) {
            RasterGrid narrow = RasterGrid.ofEpsg(s[0], s[1], 431_000.0, 5_006_000.0, 2.0, -2.0, 32633);
            Path f = dir.resolve("narrow" + s[0] + "x" + s[1] + ".tif");
            GeoTiffWriter.writeFloat(f, narrow, field(narrow, 0, -9999f), -9999f);
            JsonNode info = gdalinfo(f);
            assertGeoreferencing(info, narrow);
            JsonNode band = info.get("bands").get(0);
            assertEquals(s[0], band.get("block").get(0).asInt(), "strips as wide as the raster");
            assertEquals(s[2], band.get("block").get(1).asInt(), "rows per strip");
            assertFieldStats(band, s[0], s[1], 0);
            assertEquals("-9999", locate(f, s[0] - 1, s[1] - 1));
            assertEquals(Integer.toString((s[1] - 2) * 1000 + s[0] - 1), locate(f, s[0] - 1, s[1] - 2));
        }

        Path big = dir.resolve("big.tif");
        float[] v = field(GRID, 0, -9999f);
        GeoTiffWriter.writeFloatBlocks(big, GRID, 1, -9999f, (b, c0, r0, w, h, out) -> {
            for (int r = 0; r < h; r++) {
                System.arraycopy(v, (r0 + r) * W + c0, out, r * w, w);
            }
        }, true);
        JsonNode bigInfo = gdalinfo(big);
        assertGeoreferencing(bigInfo, GRID);
        assertEquals(-9999.0, bigInfo.get("bands").get(0).get("noDataValue").asDouble(), 0.0);
        assertFieldStats(bigInfo.get("bands").get(0), W, H, 0);
    }

    @Test
    void gdalWrittenInputsReadRightOrAreRefused() throws IOException {
        // Land cover and heights as a GIS user might produce them with GDAL.
        Path lc = dir.resolve("lc.tif");
        int[] codes = new int[W * H];
        for (int i = 0; i < codes.length; i++) {
            codes[i] = (i * 31) % 251;
        }
        GeoTiffWriter.writeInt(lc, GRID, GeoTiffWriter.IntType.UINT8, codes, OptionalInt.empty());
        Path heights = dir.resolve("h.tif");
        float[] h = field(GRID, 0, -9999f);
        GeoTiffWriter.writeFloat(heights, GRID, h, -9999f);

        String[][] readable = {
            {"lc", "-co", "COMPRESS=LZW", "-co", "PREDICTOR=2"},
            {"lc", "-co", "TILED=YES", "-co", "BLOCKXSIZE=128", "-co", "BLOCKYSIZE=64", "-co", "COMPRESS=DEFLATE", "-co", "PREDICTOR=2"},
            {"lc", "-ot", "Int16", "-co", "COMPRESS=PACKBITS"},
            {"h", "-co", "COMPRESS=LZW"},
            {"h", "-co", "TILED=YES", "-co", "COMPRESS=DEFLATE"},
        };
        int n = 0;
        for (String[] opts : readable) {
            Path out = translate(opts[0].equals("lc") ? lc : heights, "ok" + n++ + ".tif", opts);
            try (GeoTiffReader r = GeoTiffReader.openSingleBand(out)) {
                assertTrue(r.grid().sameGridAs(GRID), () -> String.join(" ", opts) + ": " + r.grid().differenceFrom(GRID));
                if (opts[0].equals("lc")) {
                    assertArrayEquals(codes, r.readIntWindow(0, 0, W, H), String.join(" ", opts));
                } else {
                    float[] got = r.readFloatWindow(0, 0, W, H);
                    for (int i = 0; i < got.length; i++) {
                        assertEquals(h[i] == -9999f ? Float.NaN : h[i], got[i], String.join(" ", opts) + " cell " + i);
                    }
                }
            }
        }
        String[][] refused = {
            {"h", "-co", "COMPRESS=DEFLATE", "-co", "PREDICTOR=2"},
            {"h", "-co", "COMPRESS=DEFLATE", "-co", "PREDICTOR=3"},
            {"h", "-co", "COMPRESS=ZSTD"},
        };
        for (String[] opts : refused) {
            Path out = translate(heights, "refused" + n++ + ".tif", opts);
            RasterFileException e = assertThrows(RasterFileException.class, () -> GeoTiffReader.open(out),
                    String.join(" ", opts));
            assertTrue(e.getMessage().contains("gdal_translate -co COMPRESS=DEFLATE"), e.getMessage());
        }
    }

    /** gdal_translate with {@code opts[1…]} (opts[0] names the input kind). */
    private Path translate(Path in, String name, String... opts) throws IOException {
        Path out = dir.resolve(name);
        List<String> cmd = new ArrayList<>(List.of("gdal_translate", "-q"));
        cmd.addAll(List.of(opts).subList(1, opts.length));
        cmd.add(in.toString());
        cmd.add(out.toString());
        run(cmd);
        return out;
    }

    /** gdalinfo -json -stats on a copy, with GDAL's side-car .aux.xml files turned off. */
    private JsonNode gdalinfo(Path file) throws IOException {
        Path copy = Files.createTempDirectory(dir, "gdal").resolve(file.getFileName());
        Files.copy(file, copy);
        return new ObjectMapper().readTree(run(List.of("gdalinfo", "-json", "-stats", copy.toString())));
    }

    private static String locate(Path file, int col, int row) throws IOException {
        return run(List.of("gdallocationinfo", "-valonly", file.toString(), Integer.toString(col),
                Integer.toString(row))).trim();
    }

    static String run(List<String> command) throws IOException {
        org.thermotile.jobs.testing.ExternalTool.Result r = org.thermotile.jobs.testing.ExternalTool.run(command, null,
                java.util.Map.of("GDAL_PAM_ENABLED", "NO"), org.thermotile.jobs.testing.ExternalTool.TIMEOUT, null);
        if (r.exitCode() != 0) {
            fail(String.join(" ", command) + " failed:\n" + r.all());
        }
        return r.all();
    }
}
