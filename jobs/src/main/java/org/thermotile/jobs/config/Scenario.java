package org.thermotile.jobs.config;

import java.util.List;
import java.util.Map;

/**
 * A programme to compare with the baseline: a name and a list of changes applied in order.
 *
 * @param name    unique scenario name, [a-z0-9-_.], never "baseline"
 * @param changes what the programme does
 * @param origin  where it was defined ("scenarios[1]" or "sweep: albedo=0.6, adoption=0.5")
 */
public record Scenario(String name, List<Change> changes, String origin) {

    /** The name every run's unchanged city goes by. */
    public static final String BASELINE = "baseline";

    /**
     * One change of a programme.
     *
     * @param targets    which cells are candidates
     * @param adoption   fraction of the candidate cells (area) treated, 0…1
     * @param seed       picks which candidates are treated, deterministically from each cell's
     *                   (or building's) position
     * @param material   switch treated cells to this library material (null: keep theirs)
     * @param set        property changes applied after the switch (albedo, emissivity,
     *                   moisture_availability, anthropogenic_heat, and layer edits
     *                   {@code layers[i].thickness|conductivity|heat_capacity})
     * @param costPerM2  cost per treated square metre, in the user's currency (NaN: no cost given)
     */
    public record Change(Targets targets, double adoption, long seed, String material,
            Map<String, Double> set, double costPerM2) {
    }

    /**
     * Candidate cells: those whose material id is in {@code materials} or whose land-cover code is
     * in {@code codes} (either list may be empty, not both), optionally only inside the named
     * {@code districts}, optionally only roofs (cells at least {@link #ROOF_MIN_HEIGHT_M} high in
     * the heights raster, trees excepted).
     */
    public record Targets(List<String> materials, List<Integer> codes, List<String> districts,
            boolean roofsOnly) {
    }

    /** Least height above ground [m] of a roof cell when a heights raster is given (common practice: one storey). */
    public static final double ROOF_MIN_HEIGHT_M = 2.5;
}
