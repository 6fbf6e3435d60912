package org.thermotile.jobs.catalogue;

import java.util.List;
import java.util.Locale;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.raster.GeoTiffWriter;
import org.thermotile.jobs.storage.RunLayout;

/**
 * What each output of a run is, in one place: every map's band description and unit (a chosen
 * map's from its {@link RunFile.MapKind}; written into
 * the GeoTIFF's GDAL metadata: gdalinfo's "Description" and "Unit Type") and every file's title,
 * description and STAC roles (the catalogue entry, {@link StacItem}).
 *
 * <p>Units are UDUNITS-2 style, ASCII: {@code degC} degree Celsius, {@code K} kelvin (a difference
 * of temperatures), {@code K.h} kelvin hours, {@code h} hours, {@code 1} a dimensionless number
 * (fractions, z-scores, q-values, class codes).
 */
public final class OutputDescriptions {
    private OutputDescriptions() {}

    /** A file's catalogue text. */
    public record Entry(String title, String description, List<String> roles) {
    }

    /** The band of a statistic map ({@code maps/KEY.tif}). */
    public static GeoTiffWriter.Band statistic(String key) {
        RunFile.MapKind kind = RunFile.MapKind.fromKey(key);
        if (kind != null) {
            return new GeoTiffWriter.Band(kind.bandDescription(), kind.bandUnit());
        }
        return switch (key) {
            // The urban-geometry maps, written when the run has a geometry: block (not chosen in outputs.maps).
            case "sky_view_factor" -> new GeoTiffWriter.Band("sky view factor", "1");
            case "shaded_hours" -> new GeoTiffWriter.Band("sun hours lost to cast shadows", "h");
            default -> throw new IllegalArgumentException("no band description for " + key);
        };
    }

    /** The unit of a difference of statistic {@code key}: a difference of °C is a kelvin. */
    public static String differenceUnit(String key) {
        String base = java.util.Objects.requireNonNullElse(RunLayout.deltaOf(key), key);
        String u = statistic(base).unit();
        return u.equals("degC") ? "K" : u;
    }

    /** The band of a comparison's delta map ({@code scenarios/NAME/maps/delta_KEY.tif}). */
    public static GeoTiffWriter.Band delta(String key) {
        return new GeoTiffWriter.Band("change in " + statistic(key).description() + ", scenario minus baseline",
                differenceUnit(key));
    }

    /** The band of an hourly stack's band at local time {@code isoTime} (ISO 8601 with offset). */
    public static GeoTiffWriter.Band hourly(String isoTime) {
        return new GeoTiffWriter.Band("surface temperature at " + isoTime, "degC", java.util.Map.of("TIME", isoTime));
    }

    /** Hot spots of {@code statistic}: the Getis–Ord Gi* z-score per analysis cell. */
    public static GeoTiffWriter.Band zscore(String statistic) {
        return new GeoTiffWriter.Band("Getis-Ord Gi* z-score of " + statistic + " per analysis cell", "1");
    }

    /** Hot spots of {@code statistic}: the false-discovery-rate q-value of each Gi* p-value. */
    public static GeoTiffWriter.Band qvalue(String statistic, String method) {
        return new GeoTiffWriter.Band(method + " q-value of the Gi* p-value of " + statistic, "1");
    }

    /** Hot spots of {@code statistic}: the analysis cell's excess over the city's median. */
    public static GeoTiffWriter.Band excess(String statistic) {
        return new GeoTiffWriter.Band("excess of " + statistic + " over the city's median per analysis cell",
                differenceUnit(statistic));
    }

    /** Hot spots of {@code statistic}: the excess band's class code (coding in the file's metadata). */
    public static GeoTiffWriter.Band excessBand(String statistic) {
        return new GeoTiffWriter.Band("excess band of " + statistic + " (class code: signed lower edge in tenths of "
                + "a kelvin, see CODING)", "1");
    }

    /** Hot spots: the share of each analysis cell's area that holds valid simulation cells. */
    public static GeoTiffWriter.Band coverage() {
        return new GeoTiffWriter.Band("share of the analysis cell's area holding valid simulation cells "
                + "(below MIN_COVERAGE: left out of the analysis)", "1");
    }

    /** An observation's difference map: simulated minus observed surface temperature. */
    public static GeoTiffWriter.Band observedDifference(String image) {
        return new GeoTiffWriter.Band("simulated minus observed surface temperature, image " + image
                + ", at the image's resolution", "K");
    }

    private static final List<String> DATA = List.of("data");
    private static final List<String> METADATA = List.of("metadata");

    /**
     * The catalogue text of a file by its path relative to the run folder or a period's folder
     * ({@code maps/peak.tif}, {@code tables/cells/scenario=baseline/part-00000.snappy.parquet}, …).
     */
    public static Entry of(String rel) {
        String[] parts = rel.split("/");
        String base = parts[parts.length - 1];
        String stem = base.contains(".") ? base.substring(0, base.indexOf('.')) : base;
        if (base.startsWith("part-") && parts.length > 1 && !parts[parts.length - 2].contains("=")) {
            // A part file of a small Parquet dataset (comparison/ranking.parquet/, hotspots/peak/polygons/): its folder's name.
            String folder = parts[parts.length - 2];
            stem = folder.contains(".") ? folder.substring(0, folder.indexOf('.')) : folder;
        }
        String variant = variant(rel);
        if (rel.startsWith("tables/")) {
            String table = parts[1];
            StringBuilder where = new StringBuilder();
            for (String p : parts) {
                if (p.contains("=")) {
                    where.append(where.isEmpty() ? "" : ", ").append(p.replace("=", " "));
                }
            }
            return new Entry("table " + table + (where.isEmpty() ? "" : " (" + where + ")") + ", " + stem,
                    tableText(table) + " One part file of the Parquet dataset tables/" + table + "/.", DATA);
        }
        if (base.endsWith(".tif")) {
            String what = mapText(rel, stem);
            return new Entry(stem + " (" + variant + ")", what, DATA);
        }
        if (base.endsWith(".png")) {
            return new Entry("preview of " + stem + " (" + variant + ")", "Colour picture of the map "
                    + stem + " as shown in the report; the GeoTIFF holds the values.", List.of("visual"));
        }
        if (rel.equals("manifest.json")) {
            return new Entry("run manifest", "Inputs with their SHA-256, the fully resolved run file, versions, grid, "
                    + "energy closure, timings and the list of outputs.", METADATA);
        }
        if (rel.equals("report.html")) {
            return new Entry("report", "The run's report: maps, charts and tables in one HTML page.", List.of("overview"));
        }
        if (rel.startsWith("comparison/") || rel.contains("/comparison/")) {
            String text = switch (stem) {
                case "ranking" -> "Scenarios ranked by their mean reduction of the peak surface temperature, with cost.";
                case "districts" -> "Per district and scenario: reduction of the peak, degree-hours avoided, cells "
                        + "above the threshold.";
                case "ranking_by_period" -> "Every period's ranking of the scenarios.";
                case "summary" -> "The comparison in words and tables.";
                default -> "Comparison of the scenarios with the baseline.";
            };
            return new Entry("comparison: " + stem + " (" + kind(base) + ")", text, base.endsWith(".md") ? METADATA : DATA);
        }
        if (rel.contains("hotspots/")) {
            String text = switch (stem) {
                case "hotspots", "hotspots_wgs84" -> "Hot and cool areas as polygons (GeoJSON"
                        + (stem.endsWith("wgs84") ? ", WGS 84 longitude/latitude)." : ", the run's CRS).");
                case "summary" -> "Hot-spot analysis settings and global statistics (Moran's I scan, distance band, "
                        + "false discovery rate).";
                case "polygons" -> "Hot and cool areas: one row per area.";
                case "districts" -> "Hot-spot area per district.";
                default -> "Hot-spot analysis output.";
            };
            return new Entry("hot spots: " + rel.substring(rel.indexOf("hotspots/") + 9), text,
                    stem.equals("summary") ? METADATA : DATA);
        }
        if (rel.startsWith("observed/")) {
            return new Entry("observations: " + base, switch (stem) {
                case "agreement" -> "Agreement of simulated and observed surface temperature (bias, RMSE, MAE, r), "
                        + "overall, per material and per district.";
                case "pairs" -> "Every observed pixel with its simulated mean.";
                case "CAUTIONS" -> "What the comparison with thermal images can and cannot say.";
                default -> "Comparison with thermal images.";
            }, stem.equals("CAUTIONS") ? METADATA : DATA);
        }
        if (base.endsWith(".json") || base.endsWith(".md") || base.endsWith(".txt")) {
            return new Entry(base, "Run metadata.", METADATA);
        }
        return new Entry(base, "Run output.", DATA);
    }

    /** "baseline", "scenario NAME", with a hot-spot folder's statistic where there is one. */
    private static String variant(String rel) {
        int s = rel.indexOf("scenarios/");
        if (s >= 0) {
            String rest = rel.substring(s + "scenarios/".length());
            return "scenario " + rest.substring(0, rest.indexOf('/'));
        }
        return "baseline";
    }

    private static String kind(String base) {
        return base.substring(base.lastIndexOf('.') + 1).toUpperCase(Locale.ROOT);
    }

    private static String mapText(String rel, String stem) {
        if (rel.contains("hotspots/")) {
            return "Hot-spot analysis raster on the analysis grid (Getis-Ord Gi* with a false-discovery-rate "
                    + "correction).";
        }
        if (rel.startsWith("observed/")) {
            return "Difference between the run and a thermal image.";
        }
        if (RunLayout.deltaOf(stem) != null) {
            return "Scenario minus baseline, cell by cell.";
        }
        if (stem.startsWith("hourly_")) {
            return "Hourly surface temperatures of " + stem.substring("hourly_".length()) + ", one band per hour.";
        }
        return "Statistic map of the period, one value per simulation cell.";
    }

    private static String tableText(String table) {
        return switch (table) {
            case "cells" -> "Per-cell statistics of the period: one row per cell and scenario.";
            case "material_hours" -> "Per material and hour: surface temperature statistics.";
            case "district_hours" -> "Per district and hour: surface temperature statistics.";
            case "cell_hours" -> "Hourly surface temperature of every cell on the hourly days.";
            default -> "Table of the run.";
        };
    }
}
