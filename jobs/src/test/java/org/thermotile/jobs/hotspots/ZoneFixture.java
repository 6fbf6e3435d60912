package org.thermotile.jobs.hotspots;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Random;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * A small finished run folder for zone analyses (invented data, no simulation): 100 × 100 cells
 * of 4 m (400 m × 400 m, EPSG:32632) and blocks of 40 m (10 × 10 cells) as zones.
 * <ul>
 *   <li>peak: seeded N(40, 1) per cell plus {@value #LIFT} K on the 3 × 3 blocks of columns and
 *       rows 3…5 (a planted hot area of 120 m); no data on rows 0–9, columns 93–99 (7 of the 10
 *       columns of block (9, 0), which is left 30 % covered);</li>
 *   <li>night_min: the noise alone; mean: uniform 30.</li>
 * </ul>
 * Zones (property {@code block_ref}): every block "B-c-r", except blocks (3, 3) and (4, 3) as one
 * 80 × 40 m rectangle "H-wide", blocks (9, 7) and (9, 9) as one MultiPolygon "M-split", and
 * "E-edge", 40 m wide of which 12 m lie on the grid (30 % covered) at the east edge: 99 zones.
 */
final class ZoneFixture {
    private ZoneFixture() {}

    static final int W = 100, H = 100, BLOCK = 10;
    static final double X0 = 500_000, Y0 = 5_020_000, CELL = 4, LIFT = 3.0;

    static RasterGrid grid() {
        return RasterGrid.ofEpsg(W, H, X0, Y0, CELL, -CELL, 32632);
    }

    static boolean noData(int col, int row) {
        return row < 10 && col >= 93;
    }

    static boolean planted(int col, int row) {
        int bc = col / BLOCK, br = row / BLOCK;
        return bc >= 3 && bc <= 5 && br >= 3 && br <= 5;
    }

    /** Per-cell noise N(40, σ²) plus, when {@code blockSd} &gt; 0, one N(0, blockSd²) level per block. */
    static float[] noise(long seed, double sd, double blockSd) {
        return noise(seed, sd, blockSd, true);
    }

    /** As {@link #noise(long, double, double)}, with the no-data corner when {@code withNoData}. */
    static float[] noise(long seed, double sd, double blockSd, boolean withNoData) {
        Random rnd = new Random(seed);
        double[] level = new double[BLOCK * BLOCK];
        for (int k = 0; k < level.length; k++) {
            level[k] = blockSd > 0 ? blockSd * rnd.nextGaussian() : 0;
        }
        float[] v = new float[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                double x = 40 + sd * rnd.nextGaussian() + level[(r / BLOCK) * BLOCK + c / BLOCK];
                v[r * W + c] = withNoData && noData(c, r) ? Float.NaN : (float) x;
            }
        }
        return v;
    }

    static float[] peak() {
        float[] v = noise(16, 1, 0);
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                if (planted(c, r) && !Float.isNaN(v[r * W + c])) {
                    v[r * W + c] += (float) LIFT;
                }
            }
        }
        return v;
    }

    private static float[] nodata(float[] v) {
        float[] o = v.clone();
        for (int i = 0; i < o.length; i++) {
            o[i] = Float.isNaN(o[i]) ? -9999f : o[i];
        }
        return o;
    }

    /** Writes the run folder and the zones file {@code dir/blocks.geojson}; returns the run folder. */
    static Path write(Path dir) throws IOException {
        Path run = dir.resolve("run");
        Files.createDirectories(run.resolve("maps"));
        RasterGrid g = grid();
        GeoTiffWriter.writeFloat(run.resolve("maps/peak.tif"), g, nodata(peak()), -9999f);
        GeoTiffWriter.writeFloat(run.resolve("maps/night_min.tif"), g, nodata(noise(7, 1, 0)), -9999f);
        float[] u = new float[W * H];
        java.util.Arrays.fill(u, 30f);
        GeoTiffWriter.writeFloat(run.resolve("maps/mean.tif"), g, u, -9999f);
        Files.createDirectories(run.resolve("tables/cells"));
        Files.writeString(run.resolve("manifest.json"), """
                {
                  "format": "thermotile-run-manifest/1",
                  "name": "zone-fixture",
                  "run_file": {"name": "zone-fixture", "inputs": {"land_cover": "landcover.tif", "classes": "classes.yaml"}},
                  "grid": {"width": %d, "height": %d, "epsg": 32632, "pixel_m": %s, "tiles": 1},
                  "outputs": ["maps/peak.tif", "maps/night_min.tif", "maps/mean.tif", "tables/cells"]
                }
                """.formatted(W, H, CELL));
        Files.writeString(dir.resolve("blocks.geojson"), collection(blocks()));
        return run;
    }

    /** x of column edge {@code c} [m]. */
    static double x(double c) {
        return X0 + c * CELL;
    }

    /** y of row edge {@code r} [m]. */
    static double y(double r) {
        return Y0 - r * CELL;
    }

    /** A rectangle ring over columns c0…c1 and rows r0…r1 (edges, in cells). */
    static String rect(double c0, double r0, double c1, double r1) {
        return String.format(Locale.ROOT, "[[%s,%s],[%s,%s],[%s,%s],[%s,%s],[%s,%s]]", x(c0), y(r1), x(c1), y(r1),
                x(c1), y(r0), x(c0), y(r0), x(c0), y(r1));
    }

    static String polygon(String id, String ring) {
        return "{\"type\": \"Feature\", \"properties\": {\"block_ref\": \"" + id + "\", \"use\": \"mixed\"}, "
                + "\"geometry\": {\"type\": \"Polygon\", \"coordinates\": [" + ring + "]}}";
    }

    static List<String> blocks() {
        List<String> f = new ArrayList<>();
        for (int br = 0; br < BLOCK; br++) {
            for (int bc = 0; bc < BLOCK; bc++) {
                if ((br == 3 && (bc == 3 || bc == 4)) || (bc == 9 && (br == 7 || br == 9))) {
                    continue;
                }
                f.add(polygon("B-" + bc + "-" + br, rect(bc * 10, br * 10, bc * 10 + 10, br * 10 + 10)));
            }
        }
        f.add(polygon("H-wide", rect(30, 30, 50, 40)));
        f.add("{\"type\": \"Feature\", \"properties\": {\"block_ref\": \"M-split\"}, \"geometry\": {\"type\": "
                + "\"MultiPolygon\", \"coordinates\": [[" + rect(90, 70, 100, 80) + "], [" + rect(90, 90, 100, 100)
                + "]]}}");
        f.add(polygon("E-edge", rect(97, 50, 107, 60)));
        return f;
    }

    static String collection(List<String> features) {
        return "{\"type\": \"FeatureCollection\", \"crs\": {\"type\": \"name\", \"properties\": {\"name\": "
                + "\"urn:ogc:def:crs:EPSG::32632\"}}, \"features\": [\n" + String.join(",\n", features) + "]}\n";
    }
}
