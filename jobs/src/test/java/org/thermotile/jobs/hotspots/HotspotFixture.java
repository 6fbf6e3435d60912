package org.thermotile.jobs.hotspots;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Random;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * A small finished run folder written directly (invented demo data, no simulation): 150 × 110
 * cells of 5 m in EPSG:32632 with a no-data corner, and maps
 * <ul>
 *   <li>peak: seeded Gaussian noise (mean 40, sd 1) plus a planted hot square of 12 × 12 cells, +4,
 *       and a hot ring (24 × 24 cells, 4 wide, +4) whose normal inside makes a polygon with a hole;</li>
 *   <li>mean: uniform 30 (every valid cell equal);</li>
 *   <li>night_min: the noise alone;</li>
 *   <li>peak_hour, degree_hours: present so the folder looks like a run's;</li>
 *   <li>scenarios/cool_roofs/maps/peak.tif: the noise without the square.</li>
 * </ul>
 */
public final class HotspotFixture {
    private HotspotFixture() {}

    public static final int W = 150, H = 110;
    public static final double X0 = 500_000, Y0 = 5_020_000, CELL = 5;
    /** The planted square: columns SQ_C0 … SQ_C0+SQ−1, rows SQ_R0 … SQ_R0+SQ−1. */
    public static final int SQ_C0 = 40, SQ_R0 = 48, SQ = 12;   // aligned to analysis cells of 4 × 4 cells
    public static final double SQ_LIFT = 4.0;

    public static RasterGrid grid() {
        return RasterGrid.ofEpsg(W, H, X0, Y0, CELL, -CELL, 32632);
    }

    static boolean noData(int col, int row) {
        return row < 6 && col < 9;
    }

    static boolean inSquare(int col, int row) {
        return col >= SQ_C0 && col < SQ_C0 + SQ && row >= SQ_R0 && row < SQ_R0 + SQ;
    }

    /** The planted ring: outer square RING_C0 … RING_C0+RING−1 (columns and rows alike), 4 cells wide. */
    public static final int RING_C0 = 96, RING_R0 = 28, RING = 24, RING_WIDTH = 4;   // aligned likewise

    static boolean inRing(int col, int row) {
        int c = col - RING_C0, r = row - RING_R0;
        boolean outer = c >= 0 && c < RING && r >= 0 && r < RING;
        boolean inner = c >= RING_WIDTH && c < RING - RING_WIDTH && r >= RING_WIDTH && r < RING - RING_WIDTH;
        return outer && !inner;
    }

    static float[] noise(long seed) {
        Random rnd = new Random(seed);
        float[] v = new float[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                double x = 40 + rnd.nextGaussian();
                v[r * W + c] = noData(c, r) ? -9999f : (float) x;
            }
        }
        return v;
    }

    static float[] peak() {
        float[] v = noise(42);
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                if (inSquare(c, r) || inRing(c, r)) {
                    v[r * W + c] += (float) SQ_LIFT;
                }
            }
        }
        return v;
    }

    static float[] uniform(float value) {
        float[] v = new float[W * H];
        for (int r = 0; r < H; r++) {
            for (int c = 0; c < W; c++) {
                v[r * W + c] = noData(c, r) ? -9999f : value;
            }
        }
        return v;
    }

    /** Writes the run folder {@code dir} (maps, scenario, manifest); returns it. */
    public static Path write(Path dir) throws IOException {
        return write(dir, null);
    }

    /** As {@link #write(Path)}; {@code districts} (a path, or null) goes into the manifest. */
    public static Path write(Path dir, String districts) throws IOException {
        Files.createDirectories(dir.resolve("maps"));
        RasterGrid g = grid();
        GeoTiffWriter.writeFloat(dir.resolve("maps/peak.tif"), g, peak(), -9999f);
        GeoTiffWriter.writeFloat(dir.resolve("maps/mean.tif"), g, uniform(30f), -9999f);
        GeoTiffWriter.writeFloat(dir.resolve("maps/night_min.tif"), g, noise(7), -9999f);
        GeoTiffWriter.writeFloat(dir.resolve("maps/peak_hour.tif"), g, uniform(14f), -9999f);
        GeoTiffWriter.writeFloat(dir.resolve("maps/degree_hours.tif"), g, noise(9), -9999f);
        Path sc = dir.resolve("scenarios/cool_roofs/maps");
        Files.createDirectories(sc);
        GeoTiffWriter.writeFloat(sc.resolve("peak.tif"), g, noise(42), -9999f);
        manifest(dir, districts, List.of("maps/peak.tif", "maps/mean.tif", "maps/night_min.tif",
                "maps/peak_hour.tif", "maps/degree_hours.tif", "tables/cells"));
        Files.createDirectories(dir.resolve("tables/cells"));
        return dir;
    }

    /** A minimal manifest.json with the keys the hotspot analysis reads. */
    public static void manifest(Path dir, String districts, List<String> outputs) throws IOException {
        String d = districts == null ? "" : ",\n      \"districts\": \"" + districts + "\"";
        String outs = String.join(", ", outputs.stream().map(o -> "\"" + o + "\"").toList());
        Files.writeString(dir.resolve("manifest.json"), """
                {
                  "format": "thermotile-run-manifest/1",
                  "name": "hotspot-fixture",
                  "run_file": {
                    "name": "hotspot-fixture",
                    "inputs": {
                      "land_cover": "landcover.tif",
                      "classes": "classes.yaml"%s
                    }
                  },
                  "grid": {"width": %d, "height": %d, "epsg": 32632, "pixel_m": %s, "tiles": 1},
                  "outputs": [%s]
                }
                """.formatted(d, W, H, CELL, outs));
    }

    /** Two districts split at column 75: west (index 0) and east (index 1); the no-data corner in none. */
    public static DistrictCells twoDistricts() {
        return twoDistricts(grid());
    }

    /** The same split (easting X0 + 75 cells) on any grid over the fixture, by cell centre. */
    public static DistrictCells twoDistricts(RasterGrid g) {
        int[] cell = new int[g.width() * g.height()];
        double split = X0 + 75 * CELL;
        boolean fine = g.sameGridAs(grid());
        for (int r = 0; r < g.height(); r++) {
            for (int c = 0; c < g.width(); c++) {
                cell[r * g.width() + c] = fine && noData(c, r) ? -1 : g.cellCentreX(c) < split ? 0 : 1;
            }
        }
        return DistrictCells.of(List.of(new DistrictCells.District(0, "W1", "Westbank"),
                new DistrictCells.District(1, "E1", "Eastfield")), cell);
    }
}
