package org.thermotile.jobs.storage;

import java.nio.file.Path;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.thermotile.jobs.errors.UserInputException;

/**
 * The naming rule of every written table column (Parquet, CSV, GeoJSON properties), and the
 * columns an older run folder still names the old way.
 *
 * <p>Rule: a column holding a quantity with a physical unit ends in that unit ({@code _c} °C,
 * {@code _k} K, {@code _m}, {@code _m2}, {@code _km2}, {@code _h} hours, {@code _k_h} K·h,
 * {@code _k_m2} K·m², {@code _k_h_m2} K·h·m², {@code _c_km2} °C·km², {@code _deg} degrees of
 * longitude or latitude; the weather and point files' {@code _wm2} W/m², {@code _ms} m/s,
 * {@code _pct} %; products in the order written); a column that
 * divides by a unit names it after {@code _per_} ({@code cost_per_k_h_m2}). Dimensionless,
 * categorical and count columns carry none: ids, names, codes, labels, fractions and shares,
 * albedo, emissivity, sky view factor, z, q, band, counts ({@code cells}), timestamps
 * ({@code time}, ISO 8601 text). Two documented exceptions: {@code cost} columns are in the run
 * file's currency, which the run file does not name; {@code mean_value} of the hot-spot tables
 * is in the analysed map's unit, which the {@code unit} column beside it gives.
 */
public final class TableColumns {
    private TableColumns() {}

    /**
     * The table layout: 2 since every column carries its unit (1, unrecorded: before). Part of
     * every partition key, so {@code run --resume} on a folder of the older layout recomputes its
     * partitions instead of mixing old and new column names in one dataset.
     */
    public static final int LAYOUT = 2;

    /**
     * Columns renamed when every column got its unit suffix: new name → the name older run folders
     * have. The GeoTIFF maps and the run file's map keys did not change.
     */
    public static final Map<String, String> RENAMED;

    static {
        Map<String, String> m = new LinkedHashMap<>();
        m.put("x_m", "x");
        m.put("y_m", "y");
        m.put("peak_hour_h", "peak_hour");
        m.put("hours_above_h", "hours_above");
        m.put("degree_hours_k_h", "degree_hours");
        m.put("local_hour_h", "local_hour");
        m.put("cost_per_k_h_m2", "cost_per_degree_hour_m2");
        m.put("area_x_excess_k_m2", "area_x_excess_m2k");
        m.put("centroid_x_m", "centroid_x");
        m.put("centroid_y_m", "centroid_y");
        m.put("centroid_lon_deg", "centroid_lon");
        m.put("centroid_lat_deg", "centroid_lat");
        RENAMED = java.util.Collections.unmodifiableMap(m);
    }

    /** The unit suffixes of the rule ("_k_h" K·h); a column ends in one of them, or is in {@link #UNITLESS}. */
    public static final List<String> UNIT_SUFFIXES = List.of("_c", "_k", "_m", "_m2", "_km2", "_h", "_k_h", "_k_m2",
            "_k_h_m2", "_c_km2", "_deg", "_wm2", "_ms", "_pct", "_per_k_h_m2", "_per_c_km2");

    /**
     * Written columns without a unit: ids, names, codes, labels, counts, fractions, statistics
     * without a unit, ISO 8601 timestamps ({@code time}), and the documented exceptions whose unit
     * is given elsewhere ({@code cost}: the run file's currency; {@code mean_value}: the
     * {@code unit} column; calibration {@code before}/{@code after}/{@code standard_error}: the
     * unit of the row's {@code quantity}).
     */
    public static final java.util.Set<String> UNITLESS = java.util.Set.of(
            // keys and names
            "scenario", "period", "col", "row", "land_cover", "material", "district", "district_id", "district_name",
            "id", "zone_id", "feature", "image", "group", "name", "pixel", "kind", "statistic", "unit", "quantity",
            "label", "note", "time",
            // codes, counts, ranks, flags
            "top_band", "band", "cells", "holes", "count", "hot_polygons", "cold_polygons", "rank", "included",
            "identifiable",
            // dimensionless quantities
            "sky_view_factor", "covered_fraction", "hot_share", "cold_share", "z", "q", "max_q", "mean_z",
            "pearson_r",
            // unit given elsewhere (see above)
            "cost", "mean_value", "before", "after", "standard_error");

    /** Whether a column name follows the rule: it ends in a unit suffix or is a known unitless column. */
    public static boolean followsRule(String column) {
        return UNITLESS.contains(column) || UNIT_SUFFIXES.stream().anyMatch(column::endsWith);
    }

    /**
     * What to tell the user when {@code column} is missing from a table that has {@code present}:
     * when the table still has the column's old name, the folder was written before the rename,
     * and the fix is to run it again; otherwise null (a plain missing column).
     */
    public static String olderLayout(Path table, String column, Collection<String> present) {
        String old = RENAMED.get(column);
        if (old == null || !present.contains(old)) {
            return null;
        }
        return table + ": column '" + old + "' is named '" + column + "' since column names carry their unit "
                + "(this folder was written by an older thermotile, whose tables the current one does not read). "
                + "Fix: run the run file again into a new folder (or with --replace)";
    }

    /**
     * Checks that a table read back from a run folder has the columns a reader needs.
     *
     * @throws UserInputException naming the table and the column, with the fix "run again" when
     *         the folder is of the older naming, else listing the columns that exist
     */
    public static void require(Path table, Collection<String> present, List<String> needed) {
        for (String c : needed) {
            if (present.contains(c)) {
                continue;
            }
            String older = olderLayout(table, c, present);
            throw new UserInputException(older != null ? older
                    : table + ": column '" + c + "' is missing (columns: " + String.join(", ", present)
                            + "). Fix: give the folder of a finished run, or run the run file again");
        }
    }
}
