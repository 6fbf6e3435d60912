package org.thermotile.jobs.city;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.hotspots.DistrictCells;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.model.hotspot.DistanceBand;
import org.thermotile.model.hotspot.ExcessBand;
import org.thermotile.model.hotspot.FalseDiscovery;

/**
 * The run file's optional {@code hotspots:} block, so that {@code run} also maps significant hot
 * and cold spots:
 * <pre>
 * hotspots:
 *   statistics: [peak]        # any of the run's maps except peak_hour
 *   cell_size_m: 40           # analysis cell, a whole multiple of the simulation cell
 *   distance_m: 120           # optional neighbourhood radius, at least one analysis cell
 *                             # (default: the peak of Moran's I z-score)
 *   weights: binary           # or inverse_distance
 *   fdr: 0.05                 # false discovery rate, at most 0.20
 *   fdr_method: bh            # or by (Benjamini–Yekutieli)
 *   min_excess_k: 1           # smallest excess over the city's median that counts [K]
 *   min_area_m2: 3200         # smallest area kept [m²]
 *   min_coverage: 0.5         # analysis cells (zones) with less data than this share are left out
 *   zones: blocks.geojson     # optional: Gi* on these polygons too (relative to the run file)
 *   zone_id: block_ref        # the zones' id property (default id)
 * </pre>
 */
record HotspotsBlock(List<String> statistics, double distanceM, DistanceBand.Weights weights, double fdr,
        double cellSizeM, FalseDiscovery fdrMethod, double minExcessK, double minAreaM2, double minCoverage,
        java.nio.file.Path zones, String zoneId) {

    static final List<String> KEYS = List.of("statistics", "cell_size_m", "distance_m", "weights", "fdr", "fdr_method",
            "min_excess_k", "min_area_m2", "min_coverage", "zones", "zone_id");

    /** The block of {@code run}, checked, or null when there is none. */
    static HotspotsBlock of(RunFile run, double cellM) {
        JsonNode n = run.reserved("hotspots");
        if (n == null || n.isNull()) {
            return null;
        }
        String where = run.source() + ": hotspots";
        if (!n.isObject()) {
            throw new UserInputException(where + " must be a mapping (" + String.join(", ", KEYS) + ")");
        }
        n.fieldNames().forEachRemaining(k -> {
            if (!KEYS.contains(k)) {
                throw new UserInputException(where + "." + k + ": unknown key; known keys: " + String.join(", ", KEYS));
            }
        });
        List<String> stats = new ArrayList<>();
        JsonNode s = n.path("statistics");
        if (s.isMissingNode()) {
            stats.add(HotspotOptions.DEFAULT_STATISTIC);
        } else {
            for (JsonNode v : s) {
                String stat = v.asText();
                boolean mapped = run.outputs().maps().stream().anyMatch(m -> m.key().equals(stat));
                if (!mapped || stat.equals("peak_hour")) {
                    throw new UserInputException(where + ".statistics: '" + stat + "' is not one of the run's maps "
                            + "(peak_hour excepted). Fix: use one of " + run.outputs().maps().stream()
                                    .map(RunFile.MapKind::key).filter(k -> !k.equals("peak_hour")).toList());
                }
                stats.add(stat);
            }
        }
        double cell = n.path("cell_size_m").asDouble(Double.NaN);
        if (n.has("cell_size_m") && !(cell >= cellM)) {
            throw new UserInputException(where + ".cell_size_m: " + n.path("cell_size_m").asText() + " m is less than "
                    + "the simulation cell (" + cellM + " m). Fix: give a whole multiple of " + cellM + " m, e.g. "
                    + cellM * Math.max(1, Math.round(HotspotOptions.DEFAULT_CELL_SIZE_M / cellM)));
        }
        double minCell = Double.isNaN(cell) ? cellM * Math.max(1, Math.ceil(HotspotOptions.DEFAULT_CELL_SIZE_M / cellM
                - 1e-9)) : cell;
        double d = n.path("distance_m").asDouble(Double.NaN);
        if (n.has("distance_m") && !(d >= minCell)) {
            throw new UserInputException(where + ".distance_m: " + n.path("distance_m").asText() + " m is less than one "
                    + "analysis cell (" + minCell + " m). Fix: give at least " + minCell + " m, or leave distance_m out "
                    + "for the peak of Moran's I");
        }
        String w = n.path("weights").asText("binary");
        DistanceBand.Weights weights;
        switch (w) {
            case "binary" -> weights = DistanceBand.Weights.BINARY;
            case "inverse_distance" -> weights = DistanceBand.Weights.INVERSE_DISTANCE;
            default -> throw new UserInputException(where + ".weights: '" + w + "'; use binary or inverse_distance");
        }
        double fdr = n.path("fdr").asDouble(HotspotOptions.DEFAULT_FDR);
        if (!(fdr > 0 && fdr <= HotspotOptions.MAX_FDR)) {
            throw new UserInputException(where + ".fdr: " + fdr + " must be above 0 and at most " + HotspotOptions.MAX_FDR
                    + ". Fix: give e.g. 0.05");
        }
        String fm = n.path("fdr_method").asText("bh");
        FalseDiscovery method = FalseDiscovery.ofKey(fm);
        if (method == null) {
            throw new UserInputException(where + ".fdr_method: '" + fm + "'; use bh or by");
        }
        double ex = n.path("min_excess_k").asDouble(HotspotOptions.DEFAULT_MIN_EXCESS_K);
        if (!(ex > 0 && ex <= ExcessBand.MAX_MIN_EXCESS_K)) {
            throw new UserInputException(where + ".min_excess_k: " + n.path("min_excess_k").asText() + " must be above 0 "
                    + "and at most " + ExcessBand.MAX_MIN_EXCESS_K + " K. Fix: give e.g. 1");
        }
        double area = n.path("min_area_m2").asDouble(HotspotOptions.DEFAULT_MIN_AREA_M2);
        if (!(area >= 0) || !Double.isFinite(area)) {
            throw new UserInputException(where + ".min_area_m2: " + n.path("min_area_m2").asText() + " must be a number "
                    + "of m² at least 0. Fix: give e.g. 3200");
        }
        double cov = n.path("min_coverage").asDouble(org.thermotile.model.hotspot.AnalysisGrid.DEFAULT_MIN_COVERAGE);
        if (n.has("min_coverage") && (!n.path("min_coverage").isNumber() || !(cov >= 0 && cov <= 1))) {
            throw new UserInputException(where + ".min_coverage: " + n.path("min_coverage").asText() + " must be a "
                    + "share from 0 to 1. Fix: give e.g. 0.5");
        }
        java.nio.file.Path zones = null;
        if (n.has("zones")) {
            String z = n.path("zones").asText("");
            if (z.isBlank()) {
                throw new UserInputException(where + ".zones: give a GeoJSON file of polygons, e.g. zones: blocks.geojson");
            }
            java.nio.file.Path base = java.nio.file.Path.of(run.source()).toAbsolutePath().getParent();
            zones = base == null ? java.nio.file.Path.of(z) : base.resolve(z).normalize();
            if (!java.nio.file.Files.isRegularFile(zones)) {
                throw new UserInputException(where + ".zones: " + zones + " not found. Fix: give the zones file's path "
                        + "(relative to the run file)");
            }
            if (!weights.equals(DistanceBand.Weights.BINARY)) {
                throw new UserInputException(where + ".weights: zones use binary weights over centroid distances. Fix: "
                        + "drop weights, or run the zones with 'thermotile hotspots --zones'");
            }
        } else if (n.has("zone_id")) {
            throw new UserInputException(where + ".zone_id without zones. Fix: add zones: FILE.geojson, or drop zone_id");
        }
        String zoneId = n.path("zone_id").asText(null);
        return new HotspotsBlock(List.copyOf(stats), d, weights, fdr, cell, method, ex, area, cov, zones, zoneId);
    }

    /** The zones of the block, or null when it names none. */
    org.thermotile.jobs.hotspots.ZoneHotspots.ZoneOptions zoneOptions() {
        return zones == null ? null : new org.thermotile.jobs.hotspots.ZoneHotspots.ZoneOptions(zones, zoneId,
                "hotspots.zones");
    }

    HotspotOptions options(String statistic, int tileSize) {
        return HotspotOptions.of(statistic).withDistance(distanceM, weights).withFdr(fdr).withTileSize(tileSize)
                .withDistricts(DistrictCells.GEOJSON).withCellSize(cellSizeM).withFdrMethod(fdrMethod)
                .withEffect(minExcessK, minAreaM2).withMinCoverage(minCoverage);
    }
}
