package org.thermotile.jobs.city;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.jobs.config.RunBlocks;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.hotspots.DistrictCells;
import org.thermotile.jobs.hotspots.HotspotOptions;
import org.thermotile.jobs.hotspots.ZoneHotspots;
import org.thermotile.model.hotspot.AnalysisGrid;
import org.thermotile.model.hotspot.DistanceBand;
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
        Path zones, String zoneId) {

    static final List<String> KEYS = RunBlocks.HOTSPOTS;

    /**
     * The block of {@code run}, with the hot-spot job's defaults for absent keys, or null when there
     * is none. The block itself is checked when the run file is read ({@link RunBlocks}); what needs
     * the simulation cell is checked here.
     */
    static HotspotsBlock of(RunFile run, double cellM) {
        RunBlocks.Hotspots h = RunBlocks.hotspotsOf(run);
        if (h == null) {
            return null;
        }
        String where = run.source() + ": hotspots";
        List<String> stats = h.statistics().isEmpty() ? List.of(HotspotOptions.DEFAULT_STATISTIC) : h.statistics();
        double cell = h.cellSizeM();
        if (!Double.isNaN(cell) && !(cell >= cellM)) {
            throw new UserInputException(where + ".cell_size_m: " + num(cell) + " m is less than "
                    + "the simulation cell (" + cellM + " m). Fix: give a whole multiple of " + cellM + " m, e.g. "
                    + cellM * Math.max(1, Math.round(HotspotOptions.DEFAULT_CELL_SIZE_M / cellM)));
        }
        double minCell = Double.isNaN(cell) ? cellM * Math.max(1, Math.ceil(HotspotOptions.DEFAULT_CELL_SIZE_M / cellM
                - 1e-9)) : cell;
        double d = h.distanceM();
        if (!Double.isNaN(d) && !(d >= minCell)) {
            throw new UserInputException(where + ".distance_m: " + num(d) + " m is less than one "
                    + "analysis cell (" + minCell + " m). Fix: give at least " + minCell + " m, or leave distance_m out "
                    + "for the peak of Moran's I");
        }
        DistanceBand.Weights weights = h.weights() == null ? DistanceBand.Weights.BINARY : h.weights();
        double fdr = Double.isNaN(h.fdr()) ? HotspotOptions.DEFAULT_FDR : h.fdr();
        FalseDiscovery method = h.fdrMethod() == null ? FalseDiscovery.BH : h.fdrMethod();
        double ex = Double.isNaN(h.minExcessK()) ? HotspotOptions.DEFAULT_MIN_EXCESS_K : h.minExcessK();
        double area = Double.isNaN(h.minAreaM2()) ? HotspotOptions.DEFAULT_MIN_AREA_M2 : h.minAreaM2();
        double cov = Double.isNaN(h.minCoverage()) ? AnalysisGrid.DEFAULT_MIN_COVERAGE : h.minCoverage();
        Path zones = null;
        if (h.zones() != null) {
            Path base = Path.of(run.source()).toAbsolutePath().getParent();
            zones = base == null ? Path.of(h.zones()) : base.resolve(h.zones()).normalize();
            if (!Files.isRegularFile(zones)) {
                throw new UserInputException(where + ".zones: " + zones + " not found. Fix: give the zones file's path "
                        + "(relative to the run file)");
            }
        }
        return new HotspotsBlock(List.copyOf(stats), d, weights, fdr, cell, method, ex, area, cov, zones, h.zoneId());
    }

    /** The zones of the block, or null when it names none. */
    ZoneHotspots.ZoneOptions zoneOptions() {
        return zones == null ? null : new ZoneHotspots.ZoneOptions(zones, zoneId, "hotspots.zones");
    }

    /** A number as the user wrote it: 2 for 2.0. */
    private static String num(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : Double.toString(v);
    }

    HotspotOptions options(String statistic, int tileSize) {
        return HotspotOptions.of(statistic).withDistance(distanceM, weights).withFdr(fdr).withTileSize(tileSize)
                .withDistricts(DistrictCells.GEOJSON).withCellSize(cellSizeM).withFdrMethod(fdrMethod)
                .withEffect(minExcessK, minAreaM2).withMinCoverage(minCoverage);
    }
}
