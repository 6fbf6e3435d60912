package org.thermotile.jobs.city;

import java.util.List;
import java.util.Map;
import org.thermotile.jobs.config.RunFile;
import org.thermotile.jobs.io.raster.RasterGrid;

/**
 * A run file whose every input has been read and checked: what the driver needs to plan, run and
 * write a city job. Made by {@link RunPreparer}; nothing has been written yet.
 *
 * @param spec          what every tile task gets (broadcast)
 * @param tiles         the tiles, row-major
 * @param paletteLabels per palette entry, the material id plus any overrides ("asphalt_aged")
 * @param districtNames district names in file order (empty without districts)
 * @param knownMaterials the library plus the user's materials file, by id
 * @param codeCounts    land-cover code → cells (nodata excluded)
 * @param fallbackCodes codes that took the class table's fallback material, with their counts
 * @param inputFiles    every input file read, for the manifest's hashes (label → location)
 * @param sampleEpochSeconds time of each sampled (counted) hour
 * @param hourlyEpochSeconds time of each hour written as an hourly output
 * @param notes         things worth telling the user (filled weather gaps, fallbacks)
 * @param plan          the baseline and scenarios to run (see {@link RunPreparer#prepare})
 * @param period        the name of this run's entry of the weather axis ({@code sweep.periods}),
 *                      or null for a run of one period
 * @param ingest        how the inputs were put on the working grid (grid, resampling, mosaic, counts)
 */
public record PreparedRun(RunFile run, RasterGrid grid, TileJobSpec spec, List<TileSpec> tiles,
        List<String> paletteLabels, List<String> districtNames,
        Map<String, org.thermotile.model.materials.Material> knownMaterials, Map<Integer, Long> codeCounts, Map<Integer, Long> fallbackCodes,
        Map<String, String> inputFiles, long[] sampleEpochSeconds, long[] hourlyEpochSeconds,
        List<String> notes, ScenarioPlanner.Plan plan, String period,
        org.thermotile.jobs.ingest.IngestReport ingest) {

    /** This run with its scenarios resolved (see {@link ScenarioPlanner#plan}). */
    public PreparedRun withPlan(ScenarioPlanner.Plan plan) {
        return new PreparedRun(run, grid, spec, tiles, paletteLabels, districtNames, knownMaterials, codeCounts,
                fallbackCodes, inputFiles, sampleEpochSeconds, hourlyEpochSeconds, notes, plan, period, ingest);
    }

    /** This run as the entry {@code name} of a weather axis. */
    PreparedRun withPeriod(String name) {
        return new PreparedRun(run, grid, spec, tiles, paletteLabels, districtNames, knownMaterials, codeCounts,
                fallbackCodes, inputFiles, sampleEpochSeconds, hourlyEpochSeconds, notes, plan, name, ingest);
    }

    /** Cells with a material. */
    public long activeCells() {
        return codeCounts.entrySet().stream()
                .filter(e -> e.getKey() >= 0 && e.getKey() < spec.codeToPalette().length
                        && spec.codeToPalette()[e.getKey()] >= 0)
                .mapToLong(Map.Entry::getValue).sum();
    }

    /** Cell-hours to simulate (spin-up included). */
    public long cellHours() {
        return activeCells() * Math.max(0, spec.forcing().hours() - 1);
    }
}
