package org.thermotile.jobs.city;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * How a tile's variants are split over tasks: one pass while the tiles fill the cores, else
 * contiguous groups in plan order, as many as fill the cores. That the outputs do not depend on
 * the grouping is checked end to end by {@code ScenarioTest}: a sweep of nine variants on one
 * 256-cell tile on 2 cores runs in two groups and gives the bytes of the 64-cell tiling, which
 * runs in one pass.
 */
class VariantGroupsTest {
    private static final List<String> SIX = List.of("baseline", "a", "b", "c", "d", "e");
    private static final List<String> TWELVE = List.of("baseline", "a", "b", "c", "d", "e", "f", "g", "h", "i",
            "j", "k");

    @Test
    void oneGroupWhileTheTilesFillTheCores() {
        assertEquals(List.of(SIX), CityJob.variantGroups(SIX, 16, 2));
        assertEquals(List.of(SIX), CityJob.variantGroups(SIX, 2, 2));
    }

    @Test
    void fewerTilesThanCoresSplitTheVariantsInOrderInGroupsOfAtLeastFour() {
        assertEquals(List.of(TWELVE.subList(0, 6), TWELVE.subList(6, 12)), CityJob.variantGroups(TWELVE, 1, 2));
        // 3 tiles on 8 cores: ⌈8/3⌉ = 3 groups, 9 tasks.
        assertEquals(List.of(TWELVE.subList(0, 4), TWELVE.subList(4, 8), TWELVE.subList(8, 12)),
                CityJob.variantGroups(TWELVE, 3, 8));
        // 1 tile on 64 cores: no group smaller than four variants.
        assertEquals(3, CityJob.variantGroups(TWELVE, 1, 64).size());
        // Six variants make one group of four or more only: one pass.
        assertEquals(List.of(SIX), CityJob.variantGroups(SIX, 1, 2));
        assertEquals(List.of(), CityJob.variantGroups(List.of(), 1, 4));
    }
}
