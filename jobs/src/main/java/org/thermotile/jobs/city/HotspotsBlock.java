package org.thermotile.jobs.city;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.List;
import org.thermotile.jobs.cli.UserInputException;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.hotspots.DistrictCells;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.model.hotspot.DistanceBand;

/**
 * The run file's optional {@code hotspots:} block, so that {@code run} also maps significant hot
 * and cold spots:
 * <pre>
 * hotspots:
 *   statistics: [peak]        # any of the run's maps except peak_hour
 *   distance_m: 100           # neighbourhood radius, at least one cell
 *   weights: binary           # or inverse_distance
 *   fdr: 0.10                 # Benjamini–Hochberg level, at most 0.10
 * </pre>
 */
record HotspotsBlock(List<String> statistics, double distanceM, DistanceBand.Weights weights, double fdr) {

    static final List<String> KEYS = List.of("statistics", "distance_m", "weights", "fdr");

    /** The block of {@code run}, checked, or null when there is none. */
    static HotspotsBlock of(RunFile run, double cellM) {
        JsonNode n = run.reserved("hotspots");
        if (n == null || n.isNull()) {
            return null;
        }
        String where = run.source() + ": hotspots";
        if (!n.isObject()) {
            throw new UserInputException(where + " must be a mapping (statistics, distance_m, weights, fdr)");
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
        double d = n.path("distance_m").asDouble(HotspotOptions.DEFAULT_DISTANCE_M);
        if (!(d >= cellM)) {
            throw new UserInputException(where + ".distance_m: " + d + " m is less than one cell (" + cellM
                    + " m). Fix: give at least the cell size");
        }
        String w = n.path("weights").asText("binary");
        DistanceBand.Weights weights;
        switch (w) {
            case "binary" -> weights = DistanceBand.Weights.BINARY;
            case "inverse_distance" -> weights = DistanceBand.Weights.INVERSE_DISTANCE;
            default -> throw new UserInputException(where + ".weights: '" + w + "'; use binary or inverse_distance");
        }
        double fdr = n.path("fdr").asDouble(HotspotOptions.DEFAULT_FDR);
        if (!(fdr > 0 && fdr <= 0.10)) {
            throw new UserInputException(where + ".fdr: " + fdr + " must be above 0 and at most 0.10");
        }
        return new HotspotsBlock(List.copyOf(stats), d, weights, fdr);
    }

    HotspotOptions options(String statistic, int tileSize) {
        return HotspotOptions.of(statistic).withDistance(distanceM, weights).withFdr(fdr).withTileSize(tileSize)
                .withDistricts(DistrictCells.GEOJSON);
    }
}
