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
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.thermotile.jobs.config.RunFile.MapKind;
import org.thermotile.jobs.io.raster.RasterGrid;
import org.thermotile.jobs.storage.OutputStore;
import org.thermotile.jobs.storage.CanonicalParquet;
import org.thermotile.model.stats.GroupHourStats;
import org.thermotile.model.tile.TileSimulation;

/**
 * Writes the Parquet tables through Spark's commit protocol, then gives the part files
 * deterministic names (Spark's carry a per-job random id) so identical runs give identical trees.
 */
public final class TableOutputs {
    private TableOutputs() {}

    /** Column names follow {@link org.thermotile.jobs.storage.TableColumns}' unit-suffix rule. */
    static final StructType CELLS = new StructType()
            .add("scenario", DataTypes.StringType, false)
            .add("col", DataTypes.IntegerType, false)
            .add("row", DataTypes.IntegerType, false)
            .add("x_m", DataTypes.DoubleType, false)     // cell centre, working-grid CRS (projected, metres)
            .add("y_m", DataTypes.DoubleType, false)
            .add("land_cover", DataTypes.IntegerType, false)
            .add("material", DataTypes.StringType, false)
            .add("district", DataTypes.StringType, true)
            .add(MapKind.PEAK.column(), DataTypes.DoubleType, false)
            .add(MapKind.MEAN.column(), DataTypes.DoubleType, false)
            .add(MapKind.NIGHT_MIN.column(), DataTypes.DoubleType, true)
            .add(MapKind.PEAK_HOUR.column(), DataTypes.IntegerType, false)
            .add(MapKind.HOURS_ABOVE.column(), DataTypes.IntegerType, false)
            .add(MapKind.DEGREE_HOURS.column(), DataTypes.DoubleType, false)
            .add("sky_view_factor", DataTypes.DoubleType, true);

    static final StructType CELL_HOURS = new StructType()
            .add("scenario", DataTypes.StringType, false)
            .add("col", DataTypes.IntegerType, false)
            .add("row", DataTypes.IntegerType, false)
            .add("time", DataTypes.StringType, false)
            .add("surface_c", DataTypes.FloatType, false);

    /** Per-cell summary: one row per cell with a material, ordered by tile then row-major. */
    static void writeCells(SparkSession spark, PreparedRun p, List<String> variants, JavaRDD<TileOutput> results,
            Path dir) {
        RasterGrid grid = p.grid();
        java.util.Map<String, List<String>> labelsOf = new java.util.HashMap<>();
        for (ScenarioVariant v : p.plan().variants()) {
            labelsOf.put(v.name(), labels(p, v));
        }
        List<String> districts = p.districtNames();
        JavaRDD<Row> rows = results.flatMap(o -> {
            TileSpec t = o.tile();
            TileSimulation.Result r = o.result();
            List<String> labels = labelsOf.get(o.variant());
            List<Row> out = new ArrayList<>();
            for (int i = 0; i < t.cells(); i++) {
                int idx = o.paletteIndex()[i];
                if (idx < 0) {
                    continue;
                }
                int col = t.col0() + i % t.width();
                int row = t.row0() + i / t.width();
                double night = r.nightMinC[i];
                out.add(RowFactory.create(o.variant(), col, row, grid.cellCentreX(col), grid.cellCentreY(row),
                        o.codes()[i], labels.get(idx),
                        o.districtIndex() == null || o.districtIndex()[i] < 0 ? null
                                : districts.get(o.districtIndex()[i]),
                        r.peakC[i], r.meanC[i],
                        Double.isNaN(night) ? null : night, (int) r.peakHour[i], (int) r.hoursAbove[i],
                        r.degreeHoursAbove[i], r.skyViewFactor == null ? null : r.skyViewFactor[i]));
            }
            return out.iterator();
        });
        spark.createDataFrame(rows, CELLS).write().mode(SaveMode.ErrorIfExists).partitionBy("scenario")
                .parquet(OutputStore.sparkUri(dir));
        CanonicalParquet.renameParts(dir);
    }

    /**
     * Material labels of a variant's palette: the run's labels, then each changed material's id
     * marked "(treated)".
     */
    static List<String> labels(PreparedRun p, ScenarioVariant v) {
        List<String> l = new ArrayList<>(p.paletteLabels());
        for (int i = l.size(); i < v.palette().length; i++) {
            l.add(v.palette()[i].id() + " (treated)");
        }
        return l;
    }

    /** Per-material hourly mean and 10–90 % band of surface temperature (diurnal curves). */
    static void writeMaterialHours(SparkSession spark, PreparedRun p, List<ScenarioVariant> variants,
            java.util.Map<String, GroupHourStats> stats, Path dir) {
        List<Row> rows = new ArrayList<>();
        for (ScenarioVariant v : variants) {
            GroupHourStats all = stats.get(v.name());
            // Entries sharing a label (several changed copies of one material) are one curve.
            List<String> labels = labels(p, v);
            List<String> distinct = labels.stream().distinct().toList();
            int[] to = labels.stream().mapToInt(distinct::indexOf).toArray();
            rows.addAll(groupHourRows(p, v.name(), all.regroup(to, distinct.size()), distinct));
        }
        writeGroupTable(spark, rows, "material", dir);
    }

    /** Per-district hourly mean and 10–90 % band of surface temperature. */
    static void writeDistrictHours(SparkSession spark, PreparedRun p, List<String> variants,
            java.util.Map<String, GroupHourStats> stats, Path dir) {
        List<Row> rows = new ArrayList<>();
        for (String v : variants) {
            rows.addAll(groupHourRows(p, v, stats.get(v), p.districtNames()));
        }
        writeGroupTable(spark, rows, "district", dir);
    }

    static StructType groupHours(String key) {
        return new StructType()
                .add("scenario", DataTypes.StringType, false)
                .add(key, DataTypes.StringType, false)
                .add("time", DataTypes.StringType, false)
                .add("local_hour_h", DataTypes.IntegerType, false)
                .add("mean_c", DataTypes.DoubleType, false)
                .add("p10_c", DataTypes.DoubleType, false)
                .add("p90_c", DataTypes.DoubleType, false)
                .add("cells", DataTypes.LongType, false);
    }

    static List<Row> groupHourRows(PreparedRun p, String variant, GroupHourStats st, List<String> names) {
        long[] samples = p.sampleEpochSeconds();
        java.time.ZoneOffset zo = java.time.ZoneOffset.ofTotalSeconds(p.spec().forcing().utcOffsetSeconds);
        List<Row> rows = new ArrayList<>();
        for (int g = 0; g < names.size(); g++) {
            if (st.count(g, 0) == 0) {
                continue;
            }
            for (int h = 0; h < samples.length; h++) {
                java.time.OffsetDateTime t = java.time.OffsetDateTime.ofInstant(
                        java.time.Instant.ofEpochSecond(samples[h]), zo);
                rows.add(RowFactory.create(variant, names.get(g), t.toString(), t.getHour(), st.meanC(g, h),
                        st.quantileC(g, h, 0.1), st.quantileC(g, h, 0.9), st.count(g, h)));
            }
        }
        return rows;
    }

    static void writeGroupTable(SparkSession spark, List<Row> rows, String key, Path dir) {
        spark.createDataFrame(rows, groupHours(key)).coalesce(1).write().mode(SaveMode.ErrorIfExists)
                .partitionBy("scenario").parquet(OutputStore.sparkUri(dir));
        CanonicalParquet.renameParts(dir);
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
                        out.add(RowFactory.create(o.variant(), t.col0() + i % t.width(), t.row0() + i / t.width(),
                                times[h], v[i]));
                    }
                }
            }
            return out.iterator();
        });
        spark.createDataFrame(rows, CELL_HOURS).write().mode(SaveMode.ErrorIfExists).partitionBy("scenario")
                .parquet(OutputStore.sparkUri(dir));
        CanonicalParquet.renameParts(dir);
    }
}
