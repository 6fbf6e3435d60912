package org.thermotile.jobs.hotspots;

import java.nio.file.Path;
import java.util.List;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;

/**
 * The hotspot Parquet tables, each written as one part file through Spark's commit protocol and
 * renamed to a stable name (part-00000.snappy.parquet), so identical inputs give identical trees.
 */
final class HotspotTables {
    private HotspotTables() {}

    /** One row per polygon, largest area × excess first: the GeoJSON properties plus the centroid. */
    static final StructType POLYGONS = new StructType()
            .add("id", DataTypes.IntegerType, false)
            .add("kind", DataTypes.StringType, false)
            .add("top_band", DataTypes.IntegerType, false)
            .add("label", DataTypes.StringType, false)
            .add("cells", DataTypes.IntegerType, false)
            .add("area_m2", DataTypes.DoubleType, false)
            .add("holes", DataTypes.IntegerType, false)
            .add("mean_excess_k", DataTypes.DoubleType, false)
            .add("max_abs_excess_k", DataTypes.DoubleType, false)
            .add("area_x_excess_k_m2", DataTypes.DoubleType, false)
            .add("max_q", DataTypes.DoubleType, false)
            .add("statistic", DataTypes.StringType, false)
            .add("unit", DataTypes.StringType, false)
            .add("mean_value", DataTypes.DoubleType, false)
            .add("mean_z", DataTypes.DoubleType, false)
            .add("district_id", DataTypes.StringType, true)
            .add("district_name", DataTypes.StringType, true)
            .add("centroid_x_m", DataTypes.DoubleType, false)       // the maps' CRS (projected, metres)
            .add("centroid_y_m", DataTypes.DoubleType, false)
            .add("centroid_lon_deg", DataTypes.DoubleType, false)   // WGS 84
            .add("centroid_lat_deg", DataTypes.DoubleType, false);

    /** One row per district (and one for cells outside every district, or one for all cells); areas are data areas. */
    static final StructType DISTRICTS = new StructType()
            .add("district_id", DataTypes.StringType, true)
            .add("district_name", DataTypes.StringType, false)
            .add("cells", DataTypes.LongType, false)
            .add("area_m2", DataTypes.DoubleType, false)
            .add("mean_value", DataTypes.DoubleType, true)
            .add("hot_area_m2", DataTypes.DoubleType, false)
            .add("hot_share", DataTypes.DoubleType, true)
            .add("hot_mean_excess_k", DataTypes.DoubleType, true)
            .add("cold_area_m2", DataTypes.DoubleType, false)
            .add("cold_share", DataTypes.DoubleType, true)
            .add("hot_polygons", DataTypes.IntegerType, false)
            .add("cold_polygons", DataTypes.IntegerType, false);

    /** A scenario's hot area against the run's, per district [m²]: removed = hot before and not after. */
    static final StructType CHANGE = new StructType()
            .add("district_id", DataTypes.StringType, true)
            .add("district_name", DataTypes.StringType, false)
            .add("baseline_hot_m2", DataTypes.DoubleType, false)
            .add("scenario_hot_m2", DataTypes.DoubleType, false)
            .add("removed_m2", DataTypes.DoubleType, false)
            .add("added_m2", DataTypes.DoubleType, false)
            .add("net_removed_m2", DataTypes.DoubleType, false);

    /** One row per zone of a zone analysis, in file order ({@link ZoneHotspots}); null where a zone was not tested. */
    static final StructType ZONES = new StructType()
            .add("zone_id", DataTypes.StringType, false)
            .add("feature", DataTypes.IntegerType, false)
            .add("area_m2", DataTypes.DoubleType, false)
            .add("covered_fraction", DataTypes.DoubleType, false)
            .add("included", DataTypes.BooleanType, false)
            .add("mean_value", DataTypes.DoubleType, true)
            .add("unit", DataTypes.StringType, false)
            .add("excess_k", DataTypes.DoubleType, true)
            .add("z", DataTypes.DoubleType, true)
            .add("q", DataTypes.DoubleType, true)
            .add("band", DataTypes.IntegerType, true)
            .add("label", DataTypes.StringType, false)
            .add("centroid_x_m", DataTypes.DoubleType, false)
            .add("centroid_y_m", DataTypes.DoubleType, false);

    static void write(SparkSession spark, List<Row> rows, StructType schema, Path dir) {
        spark.createDataFrame(rows, schema).coalesce(1).write().mode(SaveMode.ErrorIfExists)
                .parquet(org.thermotile.jobs.storage.OutputStore.sparkUri(dir));
        org.thermotile.jobs.storage.CanonicalParquet.renameParts(dir);   // footers canonical, as every table
    }
}
