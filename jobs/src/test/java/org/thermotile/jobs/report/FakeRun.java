package org.thermotile.jobs.report;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import java.util.OptionalInt;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * A small run folder as the city job leaves it, with invented demo values (the invented town of
 * Quillan Vale): statistic maps, a manifest, the hourly tables written by Spark, district outlines,
 * and optionally hotspot and scenario folders in the layout the report reads.
 */
final class FakeRun {
    private FakeRun() {}

    static final float NODATA = -9999f;
    static final String[] MATERIALS = {"asphalt_aged", "roof_membrane_dark", "grass_irrigated"};
    static final long[] MATERIAL_CELLS = {800, 600, 900};
    static final String[] DISTRICTS = {"Old Quay", "Linden Park"};
    static final int DAYS = 2, HOURS = 24 * DAYS;

    /** The rows written to tables/material_hours: material, time, local_hour_h, mean_c, cells. */
    static List<Row> materialRows() {
        List<Row> rows = new ArrayList<>();
        OffsetDateTime t0 = OffsetDateTime.parse("2026-07-15T00:00+02:00");
        for (int m = 0; m < MATERIALS.length; m++) {
            for (int i = 0; i < HOURS; i++) {
                OffsetDateTime t = t0.plusHours(i);
                rows.add(RowFactory.create(MATERIALS[m], t.toString(), t.getHour(), invented(m, i), MATERIAL_CELLS[m]));
            }
        }
        return rows;
    }

    /** Invented diurnal values: a daytime hump per material, the second day 1.5 K warmer. */
    static double invented(int material, int hourIndex) {
        int h = hourIndex % 24;
        double sun = Math.max(0, Math.sin(Math.PI * (h - 6) / 14.0));
        double[] base = {24, 23, 19};
        double[] amp = {31, 38, 12};
        return base[material] + amp[material] * sun + 1.5 * (hourIndex / 24);
    }

    static final StructType MATERIAL_HOURS = new StructType()
            .add("material", DataTypes.StringType, false)
            .add("time", DataTypes.StringType, false)
            .add("local_hour_h", DataTypes.IntegerType, false)
            .add("mean_c", DataTypes.DoubleType, false)
            .add("cells", DataTypes.LongType, false);

    static final StructType DISTRICT_HOURS = new StructType()
            .add("district", DataTypes.StringType, false)
            .add("time", DataTypes.StringType, false)
            .add("local_hour_h", DataTypes.IntegerType, false)
            .add("mean_c", DataTypes.DoubleType, false)
            .add("p10_c", DataTypes.DoubleType, false)
            .add("p90_c", DataTypes.DoubleType, false)
            .add("cells", DataTypes.LongType, false);

    /** What to put into a fake run folder. */
    record Options(int width, int height, double cellM, boolean districts, boolean districtTable, boolean hotspots,
            boolean scenarios) {
    }

    static RasterGrid grid(Options o) {
        return RasterGrid.ofEpsg(o.width(), o.height(), 500_000, 5_020_000, o.cellM(), -o.cellM(), 32632);
    }

    /** Invented peak field [°C]: warm in the middle, a cool band, a no-data corner of 4 × 3 cells. */
    static float[] peak(int w, int h) {
        float[] v = new float[w * h];
        for (int r = 0; r < h; r++) {
            for (int c = 0; c < w; c++) {
                double x = (double) c / w, y = (double) r / h;
                v[r * w + c] = (float) (36 + 18 * Math.exp(-((x - 0.6) * (x - 0.6) + (y - 0.45) * (y - 0.45)) / 0.05)
                        - 9 * Math.exp(-(y - 0.85) * (y - 0.85) / 0.004) + 2 * Math.sin(c * 0.9) * Math.cos(r * 0.7));
            }
        }
        corner(v, w);
        return v;
    }

    static void corner(float[] v, int w) {
        for (int r = 0; r < 3; r++) {
            for (int c = 0; c < 4; c++) {
                v[r * w + c] = NODATA;
            }
        }
    }

    static float[] derived(float[] peak, double scale, double offset) {
        float[] v = new float[peak.length];
        for (int i = 0; i < v.length; i++) {
            v[i] = peak[i] == NODATA ? NODATA : (float) (peak[i] * scale + offset);
        }
        return v;
    }

    static float[] degreeHours(float[] peak) {
        float[] v = new float[peak.length];
        for (int i = 0; i < v.length; i++) {
            v[i] = peak[i] == NODATA ? NODATA : (float) Math.max(0, (peak[i] - 45) * 6.5);
        }
        return v;
    }

    /** Writes the folder; Parquet tables through {@code spark}. */
    static void write(Path dir, Options o, SparkSession spark) throws IOException {
        RasterGrid g = grid(o);
        Path maps = Files.createDirectories(dir.resolve("maps"));
        float[] peak = peak(o.width(), o.height());
        GeoTiffWriter.writeFloat(maps.resolve("peak.tif"), g, peak, NODATA);
        GeoTiffWriter.writeFloat(maps.resolve("mean.tif"), g, derived(peak, 0.55, 6), NODATA);
        GeoTiffWriter.writeFloat(maps.resolve("night_min.tif"), g, derived(peak, 0.25, 12), NODATA);
        GeoTiffWriter.writeFloat(maps.resolve("degree_hours.tif"), g, degreeHours(peak), NODATA);
        Files.createDirectories(dir.resolve("tables"));
        spark.createDataFrame(materialRows(), MATERIAL_HOURS).coalesce(1).write()
                .parquet(dir.resolve("tables/material_hours").toUri().toString());
        if (o.districtTable()) {
            List<Row> rows = new ArrayList<>();
            OffsetDateTime t0 = OffsetDateTime.parse("2026-07-15T00:00+02:00");
            for (int d = 0; d < DISTRICTS.length; d++) {
                for (int i = 0; i < HOURS; i++) {
                    OffsetDateTime t = t0.plusHours(i);
                    double m = invented(d, i) - 2;
                    rows.add(RowFactory.create(DISTRICTS[d], t.toString(), t.getHour(), m, m - 3 - d, m + 4 + 2 * d,
                            1100L + 100 * d));
                }
            }
            spark.createDataFrame(rows, DISTRICT_HOURS).coalesce(1).write()
                    .parquet(dir.resolve("tables/district_hours").toUri().toString());
        }
        Path districts = dir.getParent().resolve(dir.getFileName() + "-districts.geojson");
        if (o.districts()) {
            double x0 = 500_000, y0 = 5_020_000, wM = o.width() * o.cellM(), hM = o.height() * o.cellM();
            double split = x0 + 0.37 * wM;
            Files.writeString(districts, """
                    {"type": "FeatureCollection", "features": [
                     {"type": "Feature", "properties": {"id": "d1", "name": "Old Quay"},
                      "geometry": {"type": "Polygon", "coordinates": [[[%1$s, %2$s], [%3$s, %2$s], [%3$s, %4$s], [%1$s, %4$s], [%1$s, %2$s]]]}},
                     {"type": "Feature", "properties": {"id": "d2", "name": "Linden Park"},
                      "geometry": {"type": "MultiPolygon", "coordinates": [[[[%3$s, %2$s], [%5$s, %2$s], [%5$s, %4$s], [%3$s, %4$s], [%3$s, %2$s]]]]}}
                    ]}
                    """.formatted(x0 + 0.05 * wM, y0 - 0.08 * hM, split, y0 - 0.7 * hM, x0 + 0.93 * wM));
        }
        if (o.hotspots()) {
            Path hs = Files.createDirectories(dir.resolve("hotspots/peak"));
            int[] cls = new int[o.width() * o.height()];
            float[] ex = new float[cls.length];
            for (int i = 0; i < cls.length; i++) {
                float p = peak[i];
                ex[i] = p == NODATA ? NODATA : p - 40;
                int a = (int) Math.abs(ex[i]);
                int band = a >= 4 ? 40 : a >= 2 ? 20 : a >= 1 ? 10 : 0;
                cls[i] = p == NODATA ? -128 : ex[i] < 0 ? -band : band;
            }
            GeoTiffWriter.writeInt(hs.resolve("excess_band.tif"), g, GeoTiffWriter.IntType.INT16, cls, OptionalInt.of(-128));
            GeoTiffWriter.writeFloat(hs.resolve("excess_k.tif"), g, ex, NODATA);
            double x0 = 500_000, y0 = 5_020_000, wM = o.width() * o.cellM(), hM = o.height() * o.cellM();
            Files.writeString(hs.resolve("polygons.geojson"), """
                    {"type": "FeatureCollection", "features": [
                     {"type": "Feature", "properties": {"id": 1, "kind": "hot", "mean_z": 4.25, "cells": 180},
                      "geometry": {"type": "Polygon", "coordinates": [[[%1$s, %2$s], [%3$s, %2$s], [%3$s, %4$s], [%1$s, %2$s]]]}}
                    ]}
                    """.formatted(x0 + 0.45 * wM, y0 - 0.25 * hM, x0 + 0.75 * wM, y0 - 0.65 * hM));
        }
        if (o.scenarios()) {
            Path sm = Files.createDirectories(dir.resolve("scenarios/cool_roofs/maps"));
            float[] prog = new float[peak.length];
            float[] delta = new float[peak.length];
            for (int i = 0; i < peak.length; i++) {
                int c = i % o.width();
                double cut = c > o.width() / 2 ? 4.5 : c > o.width() / 3 ? 1.5 : -0.4;
                prog[i] = peak[i] == NODATA ? NODATA : (float) (peak[i] - cut);
                delta[i] = peak[i] == NODATA ? NODATA : prog[i] - peak[i];
            }
            GeoTiffWriter.writeFloat(sm.resolve("peak.tif"), g, prog, NODATA);
            GeoTiffWriter.writeFloat(sm.resolve("delta_peak.tif"), g, delta, NODATA);
            Files.writeString(dir.resolve("scenarios/ranking.csv"), """
                    rank,scenario,adoption_pct,cost_eur,degree_hours_avoided,cost_per_degree_hour_eur
                    1,cool_roofs,60,1250000,84000,14.9
                    """);
        }
        Files.writeString(dir.resolve("manifest.json"), manifest(o, g, o.districts() ? districts : null));
    }

    /** A manifest shaped like the city job's (see city/Manifest.java); timing values invented. */
    static String manifest(Options o, RasterGrid g, Path districts) throws IOException {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("format", "thermotile-run-manifest/1");
        root.put("name", "quillan-vale");
        ObjectNode inputs = root.putObject("inputs");
        inputs.putObject("land_cover").put("location", "/data/quillan/landcover.tif").put("sha256",
                "3f5a0c1e9b7d2a4c6e8f0a1b3c5d7e9f00112233445566778899aabbccddeeff");
        ObjectNode rf = root.putObject("run_file");
        rf.put("name", "quillan-vale");
        rf.putObject("site").put("latitude", 45.3).put("longitude", 9.0).put("elevation_m", 100);
        ObjectNode ri = rf.putObject("inputs");
        ri.put("land_cover", "/data/quillan/landcover.tif");
        ri.put("classes", "worldcover");
        if (districts != null) {
            ri.put("districts", districts.toString());
            inputs.putObject("districts").put("location", districts.toString()).put("sha256",
                    "00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff00ff");
        }
        rf.putObject("weather").putObject("synthetic").put("t_min_c", 20).put("t_max_c", 33)
                .put("rel_humidity_pct", 45).put("wind_ms", 2).put("utc_offset", "+02:00");
        rf.putObject("period").put("start", "2026-07-15T00:00").put("end", "2026-07-17T00:00").put("spin_up_days", 1);
        ObjectNode out = rf.putObject("outputs");
        out.putArray("maps").add("peak").add("mean").add("night_min").add("degree_hours");
        out.put("threshold_c", 45);
        out.putArray("hourly_days");
        root.putObject("versions").put("thermotile", "0.1.0-SNAPSHOT").put("java", "17").put("spark", "4.2.0");
        ObjectNode grid = root.putObject("grid");
        grid.put("width", g.width()).put("height", g.height()).put("epsg", g.epsg()).put("pixel_m", g.pixelWidth())
                .put("tiles", 1);
        ObjectNode sim = root.putObject("simulation");
        long cells = g.cellCount() - 12;
        sim.put("cells", cells).put("hours", 72).put("counted_hours", HOURS).put("cell_hours", cells * 72)
                .put("max_closure_residual", 3.1e-7).put("deep_ground_c", 26.5);
        sim.putObject("materials").put("street", "asphalt_aged").put("dark roof", "roof_membrane_dark")
                .put("lawn", "grass_irrigated");
        root.putArray("notes").add("an invented note for the test");
        root.putObject("timing").put("wall_seconds", 12.345).put("simulate_seconds", 9.8)
                .put("cell_hours_per_second", 14000);
        return om.writeValueAsString(root) + "\n";
    }
}
