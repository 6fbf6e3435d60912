package org.thermotile.jobs.config;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.List;
import java.util.Optional;
import org.junit.jupiter.api.Test;

class SuggestTest {

    @Test
    void levenshteinTextbookExample() {
        // kitten → sitting needs 3 edits (two substitutions, one insertion): the standard example
        // of the Levenshtein (1966) distance, common practice in textbooks.
        assertEquals(3, Suggest.distance("kitten", "sitting"));
        assertEquals(0, Suggest.distance("outputs", "outputs"));
        assertEquals(7, Suggest.distance("", "outputs"));
    }

    @Test
    void adjacentTranspositionCountsOnce() {
        // Damerau (1964): a swap of two adjacent letters is one error, not two substitutions.
        assertEquals(1, Suggest.distance("ouptuts", "outputs"));
        assertEquals(1, Suggest.distance("ab", "ba"));
        // Optimal string alignment does not edit a substring twice: "ca" → "abc" costs 3
        // (unrestricted Damerau–Levenshtein would give 2); from memory of the usual OSA example.
        assertEquals(3, Suggest.distance("ca", "abc"));
    }

    @Test
    void closestSuggestsOnlyLikelyTypos() {
        List<String> keys = RunFileReader.TOP;
        assertEquals(Optional.of("outputs"), Suggest.closest("ouputs", keys));
        assertEquals(Optional.of("physics"), Suggest.closest("phisycs", keys));
        assertEquals(Optional.of("tiling"), Suggest.closest("Tiling", keys));
        assertEquals(Optional.empty(), Suggest.closest("colour", keys));
        assertEquals(Optional.of("timestep_minutes"), Suggest.closest("timestep", RunFileReader.PHYSICS));
    }
}
