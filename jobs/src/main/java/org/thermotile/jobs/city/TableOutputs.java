package org.thermotile.jobs.city;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.broadcast.Broadcast;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.model.constants.Physical;
import org.thermotile.model.tile.TileSimulation;

/**
 * Writes the Parquet tables through Spark's commit protocol, then gives the part files
 * deterministic names (Spark's carry a per-job random id) so identical runs give identical trees.
 */
final class TableOutputs {
    private TableOutputs() {}

    static final StructType CELLS = new StructType()
            .add("col", DataTypes.IntegerType, false)
            .add("row", DataTypes.IntegerType, false)
            .add("x", DataTypes.DoubleType, false)
            .add("y", DataTypes.DoubleType, false)
            .add("land_cover", DataTypes.IntegerType, false)
            .add("material", DataTypes.StringType, false)
            .add("peak_c", DataTypes.DoubleType, false)
            .add("mean_c", DataTypes.DoubleType, false)
            .add("night_min_c", DataTypes.DoubleType, true)
            .add("peak_hour", DataTypes.IntegerType, false)
            .add("hours_above", DataTypes.IntegerType, false)
            .add("degree_hours", DataTypes.DoubleType, false);

    static final StructType MATERIAL_HOURS = new StructType()
            .add("material", DataTypes.StringType, false)
            .add("time", DataTypes.StringType, false)
            .add("local_hour", DataTypes.IntegerType, false)
            .add("mean_c", DataTypes.DoubleType, false)
            .add("cells", DataTypes.LongType, false);

    static final StructType CELL_HOURS = new StructType()
            .add("col", DataTypes.IntegerType, false)
            .add("row", DataTypes.IntegerType, false)
            .add("time", DataTypes.StringType, false)
            .add("surface_c", DataTypes.FloatType, false);

    /** Per-cell summary: one row per cell with a material, ordered by tile then row-major. */
    static void writeCells(SparkSession spark, PreparedRun p, JavaRDD<TileOutput> results, Path dir) {
        RasterGrid grid = p.grid();
        List<String> labels = p.paletteLabels();
        JavaRDD<Row> rows = results.flatMap(o -> {
            TileSpec t = o.tile();
            TileSimulation.Result r = o.result();
            List<Row> out = new ArrayList<>();
            for (int i = 0; i < t.cells(); i++) {
                int idx = o.paletteIndex()[i];
                if (idx < 0) {
                    continue;
                }
                int col = t.col0() + i % t.width();
                int row = t.row0() + i / t.width();
                double night = r.nightMinC[i];
                out.add(RowFactory.create(col, row, grid.cellCentreX(col), grid.cellCentreY(row),
                        o.codes()[i], labels.get(idx), r.peakC[i], r.meanC[i],
                        Double.isNaN(night) ? null : night, (int) r.peakHour[i], (int) r.hoursAbove[i],
                        r.degreeHoursAbove[i]));
            }
            return out.iterator();
        });
        spark.createDataFrame(rows, CELLS).write().mode(SaveMode.ErrorIfExists).parquet(dir.toUri().toString());
        renameParts(dir);
    }

    /** Per-material hourly means of surface temperature (diurnal curves), from the tiles' sums. */
    static void writeMaterialHours(SparkSession spark, PreparedRun p, List<TileOutput> tiles, Path dir) {
        int palette = p.paletteLabels().size();
        long[] samples = p.sampleEpochSeconds();
        double[][] sum = new double[palette][samples.length];
        long[] cells = new long[palette];
        for (TileOutput o : tiles) {
            TileSimulation.Result r = o.result();
            for (int m = 0; m < palette; m++) {
                cells[m] += r.paletteCells[m];
                double[] s = r.paletteHourSumK[m];
                for (int h = 0; h < samples.length; h++) {
                    sum[m][h] += s[h];
                }
            }
        }
        int off = p.spec().forcing().utcOffsetSeconds;
        java.time.ZoneOffset zo = java.time.ZoneOffset.ofTotalSeconds(off);
        List<Row> rows = new ArrayList<>();
        for (int m = 0; m < palette; m++) {
            if (cells[m] == 0) {
                continue;
            }
            for (int h = 0; h < samples.length; h++) {
                java.time.OffsetDateTime t = java.time.OffsetDateTime.ofInstant(
                        java.time.Instant.ofEpochSecond(samples[h]), zo);
                rows.add(RowFactory.create(p.paletteLabels().get(m), t.toString(), t.getHour(),
                        sum[m][h] / cells[m] - Physical.ZERO_CELSIUS_K, cells[m]));
            }
        }
        spark.createDataFrame(rows, MATERIAL_HOURS).coalesce(1).write().mode(SaveMode.ErrorIfExists)
                .parquet(dir.toUri().toString());
        renameParts(dir);
    }

    /** Per-cell hourly rows for the chosen days. */
    static void writeCellHours(SparkSession spark, PreparedRun p, JavaRDD<TileOutput> results, Path dir) {
        long[] hours = p.hourlyEpochSeconds();
        java.time.ZoneOffset zo = java.time.ZoneOffset.ofTotalSeconds(p.spec().forcing().utcOffsetSeconds);
        String[] times = new String[hours.length];
        for (int i = 0; i < hours.length; i++) {
            times[i] = java.time.OffsetDateTime.ofInstant(java.time.Instant.ofEpochSecond(hours[i]), zo).toString();
        }
        JavaRDD<Row> rows = results.flatMap(o -> {
            TileSpec t = o.tile();
            List<Row> out = new ArrayList<>();
            for (int h = 0; h < times.length; h++) {
                float[] v = o.result().hourlyC[h];
                for (int i = 0; i < t.cells(); i++) {
                    if (o.paletteIndex()[i] >= 0) {
                        out.add(RowFactory.create(t.col0() + i % t.width(), t.row0() + i / t.width(), times[h], v[i]));
                    }
                }
            }
            return out.iterator();
        });
        spark.createDataFrame(rows, CELL_HOURS).write().mode(SaveMode.ErrorIfExists).parquet(dir.toUri().toString());
        renameParts(dir);
    }

    private static final Pattern PART = Pattern.compile("part-(\\d+)-.*?(\\.[a-z0-9]+)?\\.parquet");

    /** part-00003-&lt;uuid&gt;-c000.snappy.parquet → part-00003.snappy.parquet; checksum files removed. */
    static void renameParts(Path dir) {
        try (Stream<Path> s = Files.list(dir)) {
            for (Path f : s.sorted().toList()) {
                String n = f.getFileName().toString();
                if (n.endsWith(".crc")) {
                    Files.delete(f);
                    continue;
                }
                Matcher m = PART.matcher(n);
                if (m.matches()) {
                    String ext = m.group(2) == null ? "" : m.group(2);
                    Files.move(f, dir.resolve("part-" + m.group(1) + ext + ".parquet"));
                }
            }
        } catch (IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}
