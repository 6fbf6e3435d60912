package org.thermotile.jobs.hotspots;

import java.util.Locale;
import org.thermotile.jobs.cli.UserInputException;
import org.thermotile.model.hotspot.DistanceBand.Weights;
import org.thermotile.model.hotspot.HotspotClass;

/**
 * What a hotspot analysis computes.
 *
 * @param statistic  the per-cell statistic: a map name of the run (peak, mean, night_min,
 *                   degree_hours, hours_above) or, with a scenario, also delta_NAME
 * @param scenario   a scenario name under RUN/scenarios/, or null (or "baseline") for the run itself
 * @param distanceM  band distance D [m]
 * @param weights    binary or inverse-distance weights
 * @param fdr        Benjamini–Hochberg FDR level Q, 0 &lt; Q ≤ 0.10
 * @param tileSize   cells per tile edge for the parallel Gi* pass (the result does not depend on it)
 * @param replace    overwrite an existing output folder
 * @param districts  how to read district polygons (null: {@link DistrictCells#NOT_AVAILABLE})
 * @param reference  for a scenario's own map: whose global mean and S Gi* uses (null: baseline)
 */
public record HotspotOptions(String statistic, String scenario, double distanceM, Weights weights, double fdr,
        int tileSize, boolean replace, DistrictCells.Loader districts, Reference reference) {

    /**
     * Whose global mean x̄ and standard deviation S a scenario's Gi* uses. {@code BASELINE}: the
     * run's map of the same statistic, so "hot" means hotter than the city as it is and hot-spot
     * areas of the run and its scenarios can be compared (the z-score then tests the scenario's
     * local mean against the run's city-wide mean and spread). {@code SCENARIO}: the scenario's
     * own map, the textbook Gi* of that map alone (Ord & Getis 1995). Differences (delta_…) and the
     * run itself always use their own field.
     */
    public enum Reference {
        BASELINE("baseline"), SCENARIO("scenario");

        private final String key;

        Reference(String key) {
            this.key = key;
        }

        /** The name users write ("baseline", "scenario"). */
        public String key() {
            return key;
        }

        /** The reference for a user's name, or null. */
        public static Reference ofKey(String key) {
            for (Reference r : values()) {
                if (r.key.equals(key)) {
                    return r;
                }
            }
            return null;
        }
    }

    /** Defaults: peak, baseline, 100 m, binary weights, FDR 0.10, tiles of 256. */
    public static final String DEFAULT_STATISTIC = "peak";
    public static final double DEFAULT_DISTANCE_M = 100;
    public static final double DEFAULT_FDR = 0.10;
    public static final int DEFAULT_TILE_SIZE = 256;

    /** Smallest and largest tile edge accepted [cells] (our choice). */
    public static final int MIN_TILE = 16, MAX_TILE = 4096;

    public HotspotOptions {
        if (statistic == null || statistic.isBlank()) {
            statistic = DEFAULT_STATISTIC;
        }
        if (weights == null) {
            weights = Weights.BINARY;
        }
        if (districts == null) {
            districts = DistrictCells.NOT_AVAILABLE;
        }
        if (reference == null) {
            reference = Reference.BASELINE;
        }
        if (!(fdr > 0) || fdr > HotspotClass.MAX_FDR) {
            throw new UserInputException(String.format(Locale.ROOT, "--fdr %s is outside (0, %.2f]: the classes stop "
                    + "at 90 %% confidence (FDR 0.10). Fix: give e.g. --fdr 0.05", fdr, HotspotClass.MAX_FDR));
        }
        if (!(distanceM > 0) || !Double.isFinite(distanceM)) {
            throw new UserInputException("--distance " + distanceM + " is not a positive number of metres. "
                    + "Fix: give the band distance in metres, e.g. --distance 100");
        }
        if (tileSize < MIN_TILE || tileSize > MAX_TILE) {
            throw new UserInputException("--tile-size " + tileSize + " is outside " + MIN_TILE + "…" + MAX_TILE
                    + " cells. Fix: give e.g. --tile-size 256");
        }
    }

    /** The defaults for {@code statistic}. */
    public static HotspotOptions of(String statistic) {
        return new HotspotOptions(statistic, null, DEFAULT_DISTANCE_M, Weights.BINARY, DEFAULT_FDR,
                DEFAULT_TILE_SIZE, false, null, null);
    }

    /** These options for scenario {@code s} (null or "baseline": the run itself). */
    public HotspotOptions withScenario(String s) {
        return new HotspotOptions(statistic, s, distanceM, weights, fdr, tileSize, replace, districts, reference);
    }

    /** These options with band distance {@code d} [m] and weights {@code w}. */
    public HotspotOptions withDistance(double d, Weights w) {
        return new HotspotOptions(statistic, scenario, d, w, fdr, tileSize, replace, districts, reference);
    }

    /** These options with FDR level {@code q}, 0 &lt; q ≤ 0.10. */
    public HotspotOptions withFdr(double q) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, q, tileSize, replace, districts, reference);
    }

    /** These options with tiles of {@code t} × {@code t} cells. */
    public HotspotOptions withTileSize(int t) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, t, replace, districts, reference);
    }

    /** These options, overwriting an existing output folder when {@code r}. */
    public HotspotOptions withReplace(boolean r) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, r, districts, reference);
    }

    /** These options reading districts with {@code l}. */
    public HotspotOptions withDistricts(DistrictCells.Loader l) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, l, reference);
    }

    /** These options with reference {@code r} for a scenario's own map. */
    public HotspotOptions withReference(Reference r) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, r);
    }

    /** True when the analysis is of the run itself. */
    public boolean isBaseline() {
        return scenario == null || scenario.isBlank() || scenario.equals(RunFolder.BASELINE);
    }
}
