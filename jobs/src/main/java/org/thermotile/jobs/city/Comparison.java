package org.thermotile.jobs.city;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.spark.sql.Dataset;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructType;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.storage.CanonicalParquet;
import org.thermotile.jobs.storage.OutputStore;
import org.thermotile.jobs.storage.RunLayout;
import org.thermotile.jobs.storage.TableColumns;
import org.thermotile.jobs.config.RunFile.MapKind;
import org.thermotile.jobs.io.raster.GeoTiffReader;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * The comparison of a finished run's scenarios with its baseline, from the run folder alone
 * (maps, the cell table and the manifest; nothing is re-simulated):
 * <ul>
 *   <li>delta maps per scenario (scenario − baseline) of peak, mean and degree-hours:
 *       {@code scenarios/NAME/maps/delta_peak.tif} …;</li>
 *   <li>{@code comparison/districts.(parquet|csv)}: per scenario and district (and "(all)"):
 *       area treated, mean and 95th-percentile peak reduction, change of area-weighted degree-hours
 *       above the threshold, change of the area whose peak exceeds the threshold, cost, cost per
 *       degree-hour avoided and per °C·km² of peak reduction;</li>
 *   <li>{@code comparison/ranking.(parquet|csv)}: the scenarios ranked, over the whole grid and
 *       per district; {@code comparison/summary.md}: the ranking in Markdown.</li>
 * </ul>
 * Degree-hours avoided are area-weighted: Σ over cells of (DH_baseline − DH_scenario) × cell area,
 * in K·h·m². Peak reduction in °C·km²: Σ (peak_baseline − peak_scenario) × cell area in km².
 * Ranking: by cost per degree-hour avoided where every scenario has a cost, else by degree-hours
 * avoided (most first); ties by name.
 */
public final class Comparison {
    private Comparison() {}

    static final String ALL = "(all)";
    static final List<String> DELTA_MAPS = org.thermotile.jobs.config.RunFile.MapKind.keys(
            org.thermotile.jobs.config.RunFile.MapKind::delta);

    static final StructType DISTRICTS = new StructType()
            .add("scenario", DataTypes.StringType, false)
            .add("district", DataTypes.StringType, false)
            .add("area_m2", DataTypes.DoubleType, false)
            .add("treated_area_m2", DataTypes.DoubleType, false)
            .add("peak_reduction_mean_c", DataTypes.DoubleType, false)
            .add("peak_reduction_p95_c", DataTypes.DoubleType, false)
            .add("peak_reduction_c_km2", DataTypes.DoubleType, false)
            .add("degree_hours_avoided_k_h_m2", DataTypes.DoubleType, false)
            .add("area_above_threshold_change_m2", DataTypes.DoubleType, false)
            .add("cost", DataTypes.DoubleType, true)                 // the run file's currency
            .add("cost_per_k_h_m2", DataTypes.DoubleType, true)      // cost per K·h·m² avoided
            .add("cost_per_c_km2", DataTypes.DoubleType, true);

    static final StructType RANKING = DISTRICTS.add("rank", DataTypes.IntegerType, false);

    // Positions in DISTRICTS/RANKING rows, looked up by name so a new or renamed column cannot shift them.
    private static final int SCENARIO = RANKING.fieldIndex("scenario");
    private static final int DISTRICT = RANKING.fieldIndex("district");
    private static final int TREATED = RANKING.fieldIndex("treated_area_m2");
    private static final int RED_MEAN = RANKING.fieldIndex("peak_reduction_mean_c");
    private static final int RED_P95 = RANKING.fieldIndex("peak_reduction_p95_c");
    private static final int DH_AVOIDED = RANKING.fieldIndex("degree_hours_avoided_k_h_m2");
    private static final int ABOVE = RANKING.fieldIndex("area_above_threshold_change_m2");
    private static final int COST = RANKING.fieldIndex("cost");
    private static final int COST_PER_DH = RANKING.fieldIndex("cost_per_k_h_m2");
    private static final int COST_PER_C_KM2 = RANKING.fieldIndex("cost_per_c_km2");
    private static final int RANK = RANKING.fieldIndex("rank");

    /** Writes the comparison of the run in {@code runDir} (its manifest must list scenarios). */
    public static void write(SparkSession spark, Path runDir) {
        JsonNode manifest;
        try {
            manifest = new ObjectMapper().readTree(runDir.resolve("manifest.json").toFile());
        } catch (IOException e) {
            throw new UserInputException(runDir + ": no readable manifest.json (" + e.getMessage()
                    + "). Fix: give the folder of a finished run");
        }
        JsonNode sc = manifest.path("scenarios");
        if (sc.path("list").size() == 0) {
            throw new UserInputException(runDir + ": the run has no scenarios to compare. Fix: add 'scenarios:' "
                    + "or 'sweep:' to the run file and run it again");
        }
        double cellArea = sc.path("cell_area_m2").asDouble();
        double threshold = sc.path("threshold_c").asDouble();
        try {
            Dataset<Row> cells = cells(spark, runDir);   // checked before anything is written
            deltaMaps(runDir, sc);
            List<Row> rows = districtRows(spark, cells, sc, cellArea, threshold);
            Path out = runDir.resolve("comparison");
            Files.createDirectories(out);
            writeTable(spark, rows, DISTRICTS, out.resolve("districts.parquet"), out.resolve("districts.csv"));
            List<Row> ranked = rank(rows, sc);
            writeTable(spark, ranked, RANKING, out.resolve("ranking.parquet"), out.resolve("ranking.csv"));
            Files.writeString(out.resolve("summary.md"), summary(manifest, ranked));
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Columns of {@code comparison/ranking_by_period}: the period, then {@link #RANKING}. */
    static final StructType RANKING_BY_PERIOD;

    static {
        StructType t = new StructType().add("period", DataTypes.StringType, false);
        for (var f : RANKING.fields()) {
            t = t.add(f);
        }
        RANKING_BY_PERIOD = t;
    }

    /**
     * The comparison over the periods of a run with a weather axis, from each period's own
     * comparison: {@code comparison/ranking_by_period.(parquet|csv)} (every period's ranking, period
     * first) and {@code comparison/summary.md}, whose table shows each scenario's whole-grid rank,
     * mean peak reduction and degree-hours avoided in every period, so a ranking that holds in one
     * summer and not in another shows at a glance.
     */
    public static void writeAcrossPeriods(SparkSession spark, Path runDir, List<String> periods) {
        List<Row> all = new ArrayList<>();
        Map<String, Map<String, Row>> whole = new java.util.LinkedHashMap<>(); // scenario → period → (all) row
        for (String p : periods) {
            Path r = runDir.resolve("periods").resolve(p).resolve("comparison/ranking.parquet");
            Dataset<Row> ranking = spark.read().parquet(OutputStore.sparkUri(r));
            TableColumns.require(r, List.of(ranking.columns()), List.of(RANKING.fieldNames()));
            // Rows in RANKING's order whatever the file's, so the positions above hold.
            for (Row row : ranking.selectExpr(RANKING.fieldNames()).collectAsList()) {
                Object[] v = new Object[row.size() + 1];
                v[0] = p;
                for (int i = 0; i < row.size(); i++) {
                    v[i + 1] = row.get(i);
                }
                all.add(RowFactory.create(v));
                if (ALL.equals(row.getString(DISTRICT))) {
                    whole.computeIfAbsent(row.getString(SCENARIO), k -> new java.util.LinkedHashMap<>()).put(p, row);
                }
            }
        }
        Path out = runDir.resolve("comparison");
        try {
            Files.createDirectories(out);
            writeTable(spark, all, RANKING_BY_PERIOD, out.resolve("ranking_by_period.parquet"),
                    out.resolve("ranking_by_period.csv"));
            StringBuilder sb = new StringBuilder("# Programme comparison across periods\n\n");
            sb.append("Each period is a complete run of the baseline and every scenario with that period's weather "
                    + "(periods/NAME/comparison/ holds its full comparison). Whole grid; rank 1 is best; peak "
                    + "reduction is baseline minus scenario (positive = cooler); degree-hours avoided are "
                    + "area-weighted (K·h·m²).\n\n| scenario |");
            for (String p : periods) {
                sb.append(" rank ").append(p).append(" | peak reduction °C ").append(p)
                        .append(" | degree-hours avoided ").append(p).append(" |");
            }
            sb.append("\n|---|").append("---:|---:|---:|".repeat(periods.size())).append('\n');
            for (Map.Entry<String, Map<String, Row>> e : whole.entrySet()) {
                sb.append("| ").append(e.getKey()).append(" |");
                for (String p : periods) {
                    Row r = e.getValue().get(p);
                    sb.append(r == null ? " – | – | – |" : String.format(Locale.ROOT, " %d | %.2f | %.4g |",
                            r.getInt(RANK), r.getDouble(RED_MEAN), r.getDouble(DH_AVOIDED)));
                }
                sb.append('\n');
            }
            sb.append("\nSurface temperature is not air temperature nor a heat-health index; these figures compare "
                    + "options and do not replace local building codes or licensed professionals.\n");
            Files.writeString(out.resolve("summary.md"), sb.toString());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static void deltaMaps(Path runDir, JsonNode sc) {
        for (JsonNode s : sc.path("list")) {
            String name = s.path("name").asText();
            for (String m : DELTA_MAPS) {
                Path base = runDir.resolve("maps").resolve(m + ".tif");
                Path scen = runDir.resolve("scenarios").resolve(name).resolve("maps").resolve(m + ".tif");
                if (!Files.exists(base) || !Files.exists(scen)) {
                    continue;
                }
                try (GeoTiffReader b = GeoTiffReader.openSingleBand(base);
                        GeoTiffReader t = GeoTiffReader.openSingleBand(scen)) {
                    RasterGrid g = b.grid();
                    GeoTiffWriter.writeFloatBlocks(scen.resolveSibling(RunLayout.deltaName(m) + ".tif"), g,
                            List.of(org.thermotile.jobs.catalogue.OutputDescriptions.delta(m)), CityJob.MAP_NODATA,
                            (band, c0, r0, w, h, out) -> {
                                float[] x = b.readFloatWindow(c0, r0, w, h);
                                float[] y = t.readFloatWindow(c0, r0, w, h);
                                for (int i = 0; i < out.length; i++) {
                                    float d = y[i] - x[i];
                                    out[i] = Float.isNaN(d) ? CityJob.MAP_NODATA : d;
                                }
                            }, org.thermotile.jobs.io.raster.CloudOptimized.Resampling.AVERAGE);
                }
            }
        }
    }

    /**
     * The run's cells table, with the columns the comparison reads.
     *
     * @throws UserInputException when a column is missing, naming the table (and, for a folder
     *         written before the columns carried units, the old and new name and the fix)
     */
    static Dataset<Row> cells(SparkSession spark, Path runDir) {
        Path cellsDir = RunLayout.of(runDir).table("cells");
        Dataset<Row> cells = spark.read().parquet(OutputStore.sparkUri(cellsDir));
        TableColumns.require(cellsDir, List.of(cells.columns()), List.of("scenario", "col", "row", "district",
                MapKind.PEAK.column(), MapKind.DEGREE_HOURS.column()));
        return cells;
    }

    static List<Row> districtRows(SparkSession spark, Dataset<Row> cells, JsonNode sc, double cellArea,
            double threshold) {
        String peak = MapKind.PEAK.column(), dhours = MapKind.DEGREE_HOURS.column();
        cells.createOrReplaceTempView("tt_cells");
        String q = "select s.scenario, coalesce(b.district, '(outside districts)') district, count(*) n,"
                + " avg(b.%2$s - s.%2$s) red_mean, percentile(b.%2$s - s.%2$s, 0.95) red_p95,"
                + " sum(b.%2$s - s.%2$s) red_sum, sum(b.%3$s - s.%3$s) dh_avoided,"
                + " sum(case when s.%2$s > %1$s then 1 else 0 end) - sum(case when b.%2$s > %1$s then 1 else 0 end) above"
                + " from tt_cells b join tt_cells s on b.col = s.col and b.row = s.row"
                + " where b.scenario = 'baseline' and s.scenario <> 'baseline'"
                + " group by grouping sets ((s.scenario, coalesce(b.district, '(outside districts)')), (s.scenario))"
                + " order by 1, 2";
        List<Row> raw = spark.sql(String.format(Locale.ROOT, q, threshold, peak, dhours)).collectAsList();
        List<Row> rows = new ArrayList<>();
        for (Row r : raw) {
            String scen = r.getAs("scenario");
            String district = r.isNullAt(r.fieldIndex("district")) ? ALL : r.getAs("district");
            JsonNode entry = find(sc, scen);
            double treated = 0;
            double cost = 0;
            for (Iterator<String> it = entry.path("treated_cells").fieldNames(); it.hasNext(); ) {
                String d = it.next();
                if (district.equals(ALL) || district.equals(d)) {
                    treated += entry.path("treated_cells").path(d).asDouble() * cellArea;
                    cost += entry.path("cost").path(d).asDouble();
                }
            }
            boolean hasCost = entry.path("has_cost").asBoolean();
            double dh = r.<Double>getAs("dh_avoided") * cellArea;
            double cKm2 = r.<Double>getAs("red_sum") * cellArea / 1e6;
            rows.add(RowFactory.create(scen, district, r.<Long>getAs("n") * cellArea, treated, r.<Double>getAs("red_mean"),
                    r.<Double>getAs("red_p95"), cKm2, dh, r.<Long>getAs("above") * cellArea, hasCost ? cost : null,
                    hasCost && dh > 0 ? cost / dh : null, hasCost && cKm2 > 0 ? cost / cKm2 : null));
        }
        return rows;
    }

    static JsonNode find(JsonNode sc, String name) {
        for (JsonNode s : sc.path("list")) {
            if (s.path("name").asText().equals(name)) {
                return s;
            }
        }
        throw new IllegalStateException("scenario " + name + " is in the tables but not in the manifest");
    }

    /** Ranks the scenarios within each district (and "(all)"). */
    static List<Row> rank(List<Row> rows, JsonNode sc) {
        boolean allCost = true;
        for (JsonNode s : sc.path("list")) {
            allCost &= s.path("has_cost").asBoolean();
        }
        final boolean byCost = allCost;
        List<Row> out = new ArrayList<>();
        List<String> districts = rows.stream().map(r -> r.getString(DISTRICT)).distinct().sorted((a, b) ->
                a.equals(ALL) ? -1 : b.equals(ALL) ? 1 : a.compareTo(b)).toList();
        for (String d : districts) {
            List<Row> in = new ArrayList<>(rows.stream().filter(r -> r.getString(DISTRICT).equals(d)).toList());
            in.sort((a, b) -> {
                int c;
                if (byCost) {
                    double ca = a.isNullAt(COST_PER_DH) ? Double.POSITIVE_INFINITY : a.getDouble(COST_PER_DH);
                    double cb = b.isNullAt(COST_PER_DH) ? Double.POSITIVE_INFINITY : b.getDouble(COST_PER_DH);
                    c = Double.compare(ca, cb);
                } else {
                    c = Double.compare(b.getDouble(DH_AVOIDED), a.getDouble(DH_AVOIDED));
                }
                return c != 0 ? c : a.getString(SCENARIO).compareTo(b.getString(SCENARIO));
            });
            for (int i = 0; i < in.size(); i++) {
                Row r = in.get(i);
                Object[] v = new Object[r.size() + 1];
                for (int k = 0; k < r.size(); k++) {
                    v[k] = r.get(k);
                }
                v[r.size()] = i + 1;
                out.add(RowFactory.create(v));
            }
        }
        return out;
    }

    static void writeTable(SparkSession spark, List<Row> rows, StructType schema, Path parquet, Path csv)
            throws IOException {
        spark.createDataFrame(rows, schema).coalesce(1).write().mode(SaveMode.ErrorIfExists)
                .parquet(OutputStore.sparkUri(parquet));
        CanonicalParquet.renameParts(parquet);
        StringBuilder sb = new StringBuilder(String.join(",", schema.fieldNames())).append('\n');
        for (Row r : rows) {
            for (int i = 0; i < r.size(); i++) {
                if (i > 0) {
                    sb.append(',');
                }
                Object v = r.get(i);
                if (v == null) {
                    continue;
                }
                sb.append(v instanceof Double d ? String.format(Locale.ROOT, "%.6g", d)
                        : v.toString().contains(",") ? "\"" + v + "\"" : v.toString());
            }
            sb.append('\n');
        }
        Files.writeString(csv, sb.toString());
    }

    static String summary(JsonNode manifest, List<Row> ranked) {
        StringBuilder sb = new StringBuilder();
        sb.append("# Programme comparison: ").append(manifest.path("name").asText()).append("\n\n");
        sb.append("Baseline and ").append(manifest.path("scenarios").path("list").size())
                .append(" scenarios; threshold ").append(manifest.path("scenarios").path("threshold_c").asText())
                .append(" °C. Peak reduction is baseline minus scenario (positive = cooler). Degree-hours avoided are "
                        + "area-weighted (K·h·m²). Costs are in the run file's currency.\n\n");
        sb.append("| rank | scenario | district | treated m² | mean peak reduction °C | p95 °C | degree-hours avoided K·h·m² "
                + "| area above threshold Δ m² | cost | cost per K·h·m² | cost per °C·km² |\n");
        sb.append("|---:|---|---|---:|---:|---:|---:|---:|---:|---:|---:|\n");
        for (Row r : ranked) {
            sb.append(String.format(Locale.ROOT, "| %d | %s | %s | %.0f | %.2f | %.2f | %.4g | %.0f | %s | %s | %s |%n",
                    r.getInt(RANK), r.getString(SCENARIO), r.getString(DISTRICT), r.getDouble(TREATED),
                    r.getDouble(RED_MEAN), r.getDouble(RED_P95), r.getDouble(DH_AVOIDED), r.getDouble(ABOVE),
                    fmt(r, COST), fmt(r, COST_PER_DH), fmt(r, COST_PER_C_KM2)));
        }
        sb.append("\nSurface temperature is not air temperature nor a heat-health index; these figures compare "
                + "options and do not replace local building codes or licensed professionals.\n");
        return sb.toString();
    }

    static String fmt(Row r, int i) {
        return r.isNullAt(i) ? "–" : String.format(Locale.ROOT, "%.4g", r.getDouble(i));
    }
}
