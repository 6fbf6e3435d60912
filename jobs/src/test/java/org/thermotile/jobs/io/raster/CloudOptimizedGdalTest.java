package org.thermotile.jobs.io.raster;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.OptionalInt;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Written maps are Cloud-Optimised GeoTIFFs as GDAL judges them: GDAL's own
 * {@code validate_cloud_optimized_geotiff.py} (shipped with Debian's python3-gdal) passes them
 * with no error and no warning, {@code gdalinfo -json} lists the overviews, and overview cells are
 * the documented resampling of the full-resolution cells (read back with {@code gdal_translate
 * -ovr}). Skipped where GDAL is missing, failing when CI is set, as {@link GeoTiffGdalTest}.
 */
class CloudOptimizedGdalTest {
    static final String VALIDATOR = "/usr/lib/python3/dist-packages/osgeo_utils/samples/validate_cloud_optimized_geotiff.py";
    /** 700 × 600 cells: full resolution tiled 3 × 3, overviews 350×300, 175×150. */
    static final RasterGrid GRID = RasterGrid.ofEpsg(700, 600, 431_000.0, 5_006_000.0, 10.0, -10.0, 32633);

    @TempDir
    Path dir;

    @BeforeEach
    void needGdal() {
        org.thermotile.jobs.testing.ExternalTool.require("apt-get install gdal-bin", "gdalinfo");
        org.thermotile.jobs.testing.ExternalTool.requireFile("apt-get install python3-gdal", Path.of(VALIDATOR));
    }

    static String validate(Path f) throws IOException {
        String out = GeoTiffGdalTest.run(List.of("/usr/bin/python3", VALIDATOR, f.toString()));
        assertTrue(out.contains("is a valid cloud optimized GeoTIFF"), out);
        assertTrue(!out.contains("warning") && !out.contains("Warning"), out);
        return out;
    }

    @Test
    void aFloatStackIsAValidCogWithAveragedOverviewsAndItsGrid() throws Exception {
        Path f = dir.resolve("stack.tif");
        GeoTiffWriter.writeFloatStack(f, GRID, new float[][] {GeoTiffGdalTest.field(GRID, 0, -9999f),
            GeoTiffGdalTest.field(GRID, 1, -9999f)}, -9999f);
        validate(f);
        JsonNode info = new ObjectMapper().readTree(GeoTiffGdalTest.run(List.of("gdalinfo", "-json", f.toString())));
        assertArrayEquals(new double[] {431_000, 10, 0, 5_006_000, 0, -10},
                new ObjectMapper().convertValue(info.get("geoTransform"), double[].class), 0);
        assertTrue(info.get("coordinateSystem").get("wkt").asText().contains("\"EPSG\",32633"));
        for (JsonNode band : info.get("bands")) {
            assertEquals(-9999, band.get("noDataValue").asDouble());
            assertEquals(List.of("256x256"), List.of(band.get("block").get(0) + "x" + band.get("block").get(1)));
            JsonNode ovr = band.get("overviews");
            assertEquals(2, ovr.size(), band.toString());
            assertEquals(350, ovr.get(0).get("size").get(0).asInt());
            assertEquals(300, ovr.get(0).get("size").get(1).asInt());
            assertEquals(175, ovr.get(1).get("size").get(0).asInt());
        }
        // Overview 0 of 1000·r + c + b/4: cell (i, j) is the mean of rows 2i, 2i+1 and columns 2j, 2j+1,
        // 1000(2i + 0.5) + 2j + 0.5 + b/4; the last full-resolution row (599) is no-data, so overview
        // row 299 averages row 598 alone: 1000·598 + 2j + 0.5 + b/4.
        String xyz = GeoTiffGdalTest.run(List.of("gdal_translate", "-q", "-ovr", "0", "-b", "2", "-of", "XYZ",
                f.toString(), "/vsistdout/"));
        List<String> lines = xyz.lines().toList();
        assertEquals(350 * 300, lines.size());
        for (int[] ij : new int[][] {{0, 0}, {10, 7}, {298, 349}, {299, 3}}) {
            double v = Double.parseDouble(lines.get(ij[0] * 350 + ij[1]).split(" ")[2]);
            double expected = ij[0] == 299 ? 1000.0 * 598 + 2 * ij[1] + 0.5 + 0.25
                    : 1000.0 * (2 * ij[0] + 0.5) + 2 * ij[1] + 0.5 + 0.25;
            assertEquals(expected, v, 0.05, "overview cell " + ij[0] + "," + ij[1]);
        }
    }

    @Test
    void aClassMapIsAValidCogWithNearestOverviews() throws Exception {
        Path f = dir.resolve("classes.tif");
        int[] codes = new int[GRID.width() * GRID.height()];
        for (int i = 0; i < codes.length; i++) {
            codes[i] = (i / GRID.width() + i % GRID.width()) % 7;       // codes 0…6 in diagonals
        }
        GeoTiffWriter.writeInt(f, GRID, GeoTiffWriter.IntType.UINT8, codes, OptionalInt.of(255));
        validate(f);
        String xyz = GeoTiffGdalTest.run(List.of("gdal_translate", "-q", "-ovr", "0", "-of", "XYZ",
                f.toString(), "/vsistdout/"));
        List<String> lines = xyz.lines().toList();
        for (int[] ij : new int[][] {{0, 0}, {5, 9}, {299, 349}}) {
            int v = (int) Double.parseDouble(lines.get(ij[0] * 350 + ij[1]).split(" ")[2]);
            assertEquals((2 * ij[0] + 2 * ij[1]) % 7, v, "nearest (top-left) code at " + ij[0] + "," + ij[1]);
        }
    }

    @Test
    void aSmallStripMapIsLaidOutDirectoryFirst() throws Exception {
        RasterGrid small = RasterGrid.ofEpsg(200, 120, 431_000.0, 5_006_000.0, 10.0, -10.0, 32633);
        Path f = dir.resolve("small.tif");
        GeoTiffWriter.writeFloat(f, small, GeoTiffGdalTest.field(small, 0, -9999f), -9999f);
        validate(f);
        assertEquals(8, TiffDirectory.read(f).ifdOffset);
    }

    @Test
    void theCommittedDemoInputsAreValidCogs() throws Exception {
        Path demo = Files.isDirectory(Path.of("..", "data-samples", "riverside"))
                ? Path.of("..", "data-samples", "riverside") : Path.of("data-samples", "riverside");
        for (String name : List.of("heights.tif", "landcover.tif")) {
            validate(demo.resolve(name));
        }
    }
}
