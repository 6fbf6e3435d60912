package org.thermotile.jobs.city;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.OptionalInt;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/** A small invented city for job tests: a land cover with a few classes and a nodata corner. */
final class CityFixture {
    private CityFixture() {}

    static final int W = 150, H = 110;
    static final double X0 = 500_000, Y0 = 5_020_000, CELL = 5;

    static RasterGrid grid() {
        return RasterGrid.ofEpsg(W, H, X0, Y0, CELL, -CELL, 32632);
    }

    /** Codes: 1 street, 2 dark roof, 3 white roof, 4 grass, 5 water, 0 nodata in the top-left corner. */
    static int[] codes() {
        int[] c = new int[W * H];
        for (int r = 0; r < H; r++) {
            for (int col = 0; col < W; col++) {
                int v;
                if (r < 6 && col < 9) {
                    v = 0;
                } else if (r % 20 < 3 || col % 25 < 3) {
                    v = 1;
                } else if (col > 120) {
                    v = 5;
                } else if ((r / 20 + col / 25) % 3 == 0) {
                    v = 2;
                } else if ((r / 20 + col / 25) % 3 == 1) {
                    v = 3;
                } else {
                    v = 4;
                }
                c[r * W + col] = v;
            }
        }
        return c;
    }

    static final String CLASSES = """
            name: test-city
            classes:
              - {code: 1, material: asphalt_aged, label: street}
              - {code: 2, material: roof_membrane_dark, label: dark roof}
              - {code: 3, material: roof_membrane_white, label: white roof, overrides: {albedo: 0.7}}
              - {code: 4, material: grass_irrigated, label: lawn}
              - {code: 5, material: water, label: river}
            """;

    /** West and east halves (the east half ends 50 m short of the grid's edge). */
    static final String DISTRICTS = """
            {"type": "FeatureCollection",
             "crs": {"type": "name", "properties": {"name": "urn:ogc:def:crs:EPSG::32632"}},
             "features": [
              {"type": "Feature", "properties": {"id": "w", "name": "West"}, "geometry": {"type": "Polygon",
               "coordinates": [[[500000, 5020000], [500375, 5020000], [500375, 5019450], [500000, 5019450], [500000, 5020000]]]}},
              {"type": "Feature", "properties": {"id": "e", "name": "East"}, "geometry": {"type": "Polygon",
               "coordinates": [[[500375, 5020000], [500700, 5020000], [500700, 5019450], [500375, 5019450], [500375, 5020000]]]}}
             ]}
            """;

    /** Writes landcover.tif and classes.yaml into {@code dir}; returns the run file's text. */
    static Path write(Path dir, int tileSize, String extraOutputs) throws IOException {
        Files.createDirectories(dir);
        GeoTiffWriter.writeInt(dir.resolve("landcover.tif"), grid(), GeoTiffWriter.IntType.UINT8, codes(),
                OptionalInt.of(0));
        Files.writeString(dir.resolve("classes.yaml"), CLASSES);
        Files.writeString(dir.resolve("districts.geojson"), DISTRICTS);
        return runFile(dir, tileSize, extraOutputs, "landcover.tif");
    }

    static Path runFile(Path dir, int tileSize, String extraOutputs, String landCover) throws IOException {
        String yaml = """
                name: test-city
                site: {latitude: 45.3, longitude: 9.0, elevation_m: 100}
                inputs:
                  land_cover: %s
                  classes: classes.yaml
                  districts: districts.geojson
                weather:
                  synthetic: {t_min_c: 20, t_max_c: 33, rel_humidity_pct: 45, wind_ms: 2, utc_offset: "+02:00"}
                period:
                  start: 2026-07-15
                  end: 2026-07-16
                  spin_up_days: 1
                outputs:
                  maps: [peak, mean, night_min, peak_hour, degree_hours]
                  threshold_c: 45
                %s
                tiling:
                  tile_size: %d
                """.formatted(landCover, extraOutputs, tileSize);
        Path f = dir.resolve("run.yaml");
        Files.writeString(f, yaml);
        return f;
    }
}
