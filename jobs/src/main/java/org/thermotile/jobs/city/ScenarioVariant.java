package org.thermotile.jobs.city;

import java.util.BitSet;

/**
 * One variant of the city a tile task runs: the baseline (no changes) or a programme, resolved
 * against the run's palette: its extended palette and, per change, the candidate test, the
 * adoption cut and the material each palette entry becomes.
 *
 * @param name     "baseline" or the scenario's name
 * @param palette  materials of this variant: the run's palette, then the changed materials
 * @param changes  resolved changes, applied in order
 */
public record ScenarioVariant(String name, org.thermotile.model.materials.Material[] palette, Change[] changes)
        implements java.io.Serializable {

    /**
     * A resolved change.
     *
     * @param materialTarget per base palette entry, whether its cells are candidates
     * @param codeTarget     land-cover codes whose cells are candidates
     * @param districtTarget district indices the change is limited to (null: everywhere)
     * @param roofsOnly      candidates must be roofs (heights raster)
     * @param seed           adoption seed
     * @param threshold      adoption cut on the units' keys (unsigned; key &lt; threshold is treated)
     * @param all            every candidate is treated (adoption 1)
     * @param replacement    per palette index of this variant, the index it becomes
     */
    public record Change(boolean[] materialTarget, BitSet codeTarget, BitSet districtTarget, boolean roofsOnly,
            long seed, long threshold, boolean all, int[] replacement) implements java.io.Serializable {

        /** Whether a cell (by its baseline palette entry, code, district and roof flag) is a candidate. */
        boolean candidate(int basePalette, int code, int district, boolean roof) {
            if (!(materialTarget[basePalette] || codeTarget.get(code))) {
                return false;
            }
            if (districtTarget != null && (district < 0 || !districtTarget.get(district))) {
                return false;
            }
            return !roofsOnly || roof;
        }
    }

    public boolean isBaseline() {
        return changes.length == 0;
    }
}
