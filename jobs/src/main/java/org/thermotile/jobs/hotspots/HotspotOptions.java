package org.thermotile.jobs.hotspots;

import java.util.Locale;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.hotspot.AnalysisGrid;
import org.thermotile.model.hotspot.DistanceBand.Weights;
import org.thermotile.model.hotspot.ExcessBand;
import org.thermotile.model.hotspot.FalseDiscovery;

/**
 * What a hotspot analysis computes.
 *
 * @param statistic  the per-cell statistic: a map name of the run (peak, mean, night_min,
 *                   degree_hours, hours_above) or, with a scenario, also delta_NAME
 * @param scenario   a scenario name under RUN/scenarios/, or null (or "baseline") for the run itself
 * @param distanceM  band distance D [m], or NaN for the default rule (the peak of Moran's I
 *                   z-score over distances, {@link org.thermotile.model.hotspot.MoransI})
 * @param weights    binary or inverse-distance weights
 * @param fdr        FDR level Q, 0 &lt; Q ≤ {@value #MAX_FDR}
 * @param tileSize   cells per tile edge for the parallel Gi* pass (the result does not depend on it)
 * @param replace    overwrite an existing output folder
 * @param districts  how to read district polygons (null: {@link DistrictCells#NOT_AVAILABLE})
 * @param reference  for a scenario's own map: whose global mean and S Gi* uses (null: baseline)
 * @param cellSizeM  analysis cell [m], a whole multiple of the simulation cell, or NaN for
 *                   {@value #DEFAULT_CELL_SIZE_M} m (rounded up to a multiple of the simulation cell)
 * @param fdrMethod  Benjamini–Hochberg or Benjamini–Yekutieli (null: BH)
 * @param minExcessK Δ₀, the smallest excess over the city's median that counts [K]
 * @param minAreaM2  smallest hot or cold polygon kept [m²]
 * @param minCoverage smallest share of an analysis cell (or zone) that must hold valid simulation
 *                   cells for it to be analysed, in [0, 1] (NaN: {@link AnalysisGrid#DEFAULT_MIN_COVERAGE});
 *                   units below it are left out of Gi*, the global moments and the median
 */
public record HotspotOptions(String statistic, String scenario, double distanceM, Weights weights, double fdr,
        int tileSize, boolean replace, DistrictCells.Loader districts, Reference reference, double cellSizeM,
        FalseDiscovery fdrMethod, double minExcessK, double minAreaM2, double minCoverage) {

    /**
     * Default analysis cell: 40 m, planning scale (a city block or a street frontage, the unit a
     * programme is decided on; our choice within the 30–50 m of the issue), 100 simulation cells
     * of 4 m.
     */
    public static final double DEFAULT_CELL_SIZE_M = 40;

    /** Default Δ₀: 1 K (our choice: about the spread of a sunny afternoon's surface noise). */
    public static final double DEFAULT_MIN_EXCESS_K = 1.0;

    /** Default smallest polygon: 3200 m², two analysis cells of 40 m (our choice: one cell is a spot, not an area). */
    public static final double DEFAULT_MIN_AREA_M2 = 3200;

    /** Largest FDR level accepted (our choice). */
    public static final double MAX_FDR = org.thermotile.jobs.config.RunBlocks.MAX_FDR;

    /** The options of the earlier form, with the new settings at their defaults. */
    public HotspotOptions(String statistic, String scenario, double distanceM, Weights weights, double fdr,
            int tileSize, boolean replace, DistrictCells.Loader districts, Reference reference) {
        this(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, reference, Double.NaN,
                FalseDiscovery.BH, DEFAULT_MIN_EXCESS_K, DEFAULT_MIN_AREA_M2, AnalysisGrid.DEFAULT_MIN_COVERAGE);
    }

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

    /** Defaults: peak, baseline, distance by Moran's I peak, binary weights, FDR 0.05, tiles of 256. */
    public static final String DEFAULT_STATISTIC = "peak";
    public static final double DEFAULT_DISTANCE_M = Double.NaN;
    public static final double DEFAULT_FDR = 0.05;
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
        if (fdrMethod == null) {
            fdrMethod = FalseDiscovery.BH;
        }
        if (Double.isNaN(minCoverage)) {
            minCoverage = AnalysisGrid.DEFAULT_MIN_COVERAGE;
        }
        if (!(minCoverage >= 0) || minCoverage > 1) {
            throw new UserInputException("--min-coverage (min_coverage) " + minCoverage + " is outside [0, 1]. Fix: give "
                    + "the share of an analysis cell or zone that must hold data, e.g. --min-coverage 0.5");
        }
        if (!(fdr > 0) || fdr > MAX_FDR) {
            throw new UserInputException(String.format(Locale.ROOT, "--fdr %s is outside (0, %.2f]. Fix: give e.g. "
                    + "--fdr 0.05", fdr, MAX_FDR));
        }
        if (!(minExcessK > 0) || minExcessK > ExcessBand.MAX_MIN_EXCESS_K) {
            throw new UserInputException("--min-excess " + minExcessK + " K is outside (0, " + ExcessBand.MAX_MIN_EXCESS_K
                    + "] K. Fix: give e.g. --min-excess 1");
        }
        if (!(minAreaM2 >= 0) || !Double.isFinite(minAreaM2)) {
            throw new UserInputException("--min-area " + minAreaM2 + " m² is not a number of square metres ≥ 0. "
                    + "Fix: give e.g. --min-area 3200");
        }
        if (!Double.isNaN(cellSizeM) && (!(cellSizeM > 0) || !Double.isFinite(cellSizeM))) {
            throw new UserInputException("--cell-size " + cellSizeM + " is not a positive number of metres. "
                    + "Fix: give e.g. --cell-size 40");
        }
        if (!Double.isNaN(distanceM) && (!(distanceM > 0) || !Double.isFinite(distanceM))) {
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

    /** These options with analysis cell {@code m} [m] (NaN: the default). */
    public HotspotOptions withCellSize(double m) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, reference,
                m, fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with FDR method {@code f}. */
    public HotspotOptions withFdrMethod(FalseDiscovery f) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, reference,
                cellSizeM, f, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with Δ₀ = {@code k} [K] and smallest polygon {@code a} [m²]. */
    public HotspotOptions withEffect(double k, double a) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, reference,
                cellSizeM, fdrMethod, k, a, minCoverage);
    }

    /** These options for scenario {@code s} (null or "baseline": the run itself). */
    public HotspotOptions withScenario(String s) {
        return new HotspotOptions(statistic, s, distanceM, weights, fdr, tileSize, replace, districts, reference, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with band distance {@code d} [m] and weights {@code w}. */
    public HotspotOptions withDistance(double d, Weights w) {
        return new HotspotOptions(statistic, scenario, d, w, fdr, tileSize, replace, districts, reference, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with FDR level {@code q}, 0 &lt; q ≤ {@value #MAX_FDR}. */
    public HotspotOptions withFdr(double q) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, q, tileSize, replace, districts, reference, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with tiles of {@code t} × {@code t} cells. */
    public HotspotOptions withTileSize(int t) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, t, replace, districts, reference, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options, overwriting an existing output folder when {@code r}. */
    public HotspotOptions withReplace(boolean r) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, r, districts, reference, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options reading districts with {@code l}. */
    public HotspotOptions withDistricts(DistrictCells.Loader l) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, l, reference, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with reference {@code r} for a scenario's own map. */
    public HotspotOptions withReference(Reference r) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, r, cellSizeM,
                fdrMethod, minExcessK, minAreaM2, minCoverage);
    }

    /** These options with minimum coverage {@code c} in [0, 1] (NaN: the default). */
    public HotspotOptions withMinCoverage(double c) {
        return new HotspotOptions(statistic, scenario, distanceM, weights, fdr, tileSize, replace, districts, reference,
                cellSizeM, fdrMethod, minExcessK, minAreaM2, c);
    }

    /** True when the analysis is of the run itself. */
    public boolean isBaseline() {
        return scenario == null || scenario.isBlank() || scenario.equals(RunFolder.BASELINE);
    }
}
