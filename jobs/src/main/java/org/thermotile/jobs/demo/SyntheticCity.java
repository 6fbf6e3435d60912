package org.thermotile.jobs.demo;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.LocalDate;
import java.util.OptionalInt;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * A synthetic city of N × N cells for benchmarks: a regular street grid with blocks of mixed
 * roofs, lawns and trees (invented), synthetic clear-sky weather, and optionally three programmes
 * (cool roofs at two adoptions, cool pavements). Deterministic.
 *
 * <pre>java … org.thermotile.jobs.demo.SyntheticCity OUT_DIR N DAYS [scenarios yes|no] [hourly yes|no]</pre>
 */
public final class SyntheticCity {
    private SyntheticCity() {}

    public static void main(String[] args) throws IOException {
        if (args.length < 3) {
            System.err.println("usage: SyntheticCity OUT_DIR N DAYS [scenarios yes|no] [hourly yes|no]");
            System.exit(2);
        }
        write(Path.of(args[0]), Integer.parseInt(args[1]), Integer.parseInt(args[2]),
                args.length < 4 || args[3].equals("yes"), args.length >= 5 && args[4].equals("yes"));
    }

    /** Writes landcover.tif, classes.yaml and run.yaml into {@code dir}. */
    public static void write(Path dir, int n, int days, boolean scenarios, boolean hourly) throws IOException {
        Files.createDirectories(dir);
        RasterGrid grid = RasterGrid.ofEpsg(n, n, 500_000, 5_000_000, 2, -2, 32632);
        GeoTiffWriter.writeIntBlocks(dir.resolve("landcover.tif"), grid, GeoTiffWriter.IntType.UINT8, 1,
                OptionalInt.empty(), (band, c0, r0, w, h, out) -> {
                    for (int r = 0; r < h; r++) {
                        for (int c = 0; c < w; c++) {
                            out[r * w + c] = code(c0 + c, r0 + r);
                        }
                    }
                });
        Files.writeString(dir.resolve("classes.yaml"), """
                name: synthetic
                classes:
                  - {code: 1, material: asphalt_aged, label: street}
                  - {code: 2, material: roof_membrane_dark, label: flat roof}
                  - {code: 3, material: clay_tile, label: pitched roof}
                  - {code: 4, material: grass_irrigated, label: lawn}
                  - {code: 5, material: tree_canopy, label: trees}
                  - {code: 6, material: concrete, label: sidewalk}
                """);
        LocalDate start = LocalDate.of(2026, 6, 1);
        String yaml = """
                name: synthetic-%d
                site: {latitude: 45.1, longitude: 9.0, elevation_m: 100}
                inputs:
                  land_cover: landcover.tif
                  classes: classes.yaml
                weather:
                  synthetic: {t_min_c: 19, t_max_c: 33, rel_humidity_pct: 45, wind_ms: 2.5, utc_offset: "+02:00"}
                period:
                  start: %s
                  end: %s
                  spin_up_days: 1
                outputs:
                  maps: [peak, mean, night_min, peak_hour, degree_hours]
                  threshold_c: 45
                  hourly_days: [%s]
                """.formatted(n, start, start.plusDays(days - 1), hourly ? start.toString() : "");
        if (scenarios) {
            yaml += """
                    scenarios:
                      - name: cool-roofs-50
                        changes:
                          - {targets: {materials: [roof_membrane_dark]}, adoption: 0.5, set: {albedo: 0.75}, cost_per_m2: 30}
                      - name: cool-roofs-100
                        changes:
                          - {targets: {materials: [roof_membrane_dark]}, set: {albedo: 0.75}, cost_per_m2: 30}
                      - name: cool-pavements
                        changes:
                          - {targets: {materials: [asphalt_aged]}, set: {albedo: 0.33}, cost_per_m2: 12}
                    """;
        }
        Files.writeString(dir.resolve("run.yaml"), yaml);
    }

    /** Blocks of 50 × 50 cells (100 m): 6-cell streets, 2-cell sidewalks, then roofs, lawns, trees. */
    static int code(int col, int row) {
        int bc = col % 50;
        int br = row % 50;
        if (bc < 6 || br < 6) {
            return 1;
        }
        if (bc < 8 || br < 8) {
            return 6;
        }
        int block = (col / 50) * 7919 + (row / 50) * 104_729;
        int kind = Math.floorMod(block, 5);
        boolean inner = bc > 12 && bc < 46 && br > 12 && br < 46;
        return switch (kind) {
            case 0, 1 -> inner ? 2 : 4;
            case 2 -> inner ? 3 : 4;
            case 3 -> inner ? 5 : 4;
            default -> inner ? 2 : 6;
        };
    }
}
