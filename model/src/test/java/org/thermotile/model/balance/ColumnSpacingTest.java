package org.thermotile.model.balance;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.LinkedHashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;

/** Conduction nodes per library material for each named spacing (the table the README states). */
class ColumnSpacingTest {

    /** id → {standard, coarse} unknown nodes. Roofs are thinner than 25 cm and keep every node. */
    static final Map<String, int[]> NODES = new LinkedHashMap<>();

    static {
        NODES.put("roof_membrane_dark", new int[] {10, 10});
        NODES.put("roof_membrane_white", new int[] {10, 10});
        NODES.put("bitumen_shingle", new int[] {9, 9});
        NODES.put("clay_tile", new int[] {9, 9});
        NODES.put("metal_roof_bare", new int[] {7, 7});
        NODES.put("green_roof", new int[] {11, 11});
        NODES.put("asphalt_fresh", new int[] {15, 11});
        NODES.put("asphalt_aged", new int[] {15, 11});
        NODES.put("concrete", new int[] {15, 12});
        NODES.put("concrete_pavers", new int[] {15, 11});
        NODES.put("gravel", new int[] {15, 11});
        NODES.put("bare_soil_dry", new int[] {15, 11});
        NODES.put("bare_soil_moist", new int[] {15, 11});
        NODES.put("grass_irrigated", new int[] {15, 11});
        NODES.put("grass_dry", new int[] {15, 11});
        NODES.put("tree_canopy", new int[] {1, 1});
        NODES.put("water", new int[] {1, 1});
    }

    @Test
    void nodeCountsPerLibraryMaterialMatchTheTable() {
        assertEquals(NODES.keySet().size(), MaterialLibrary.all().size(), "every library material in the table");
        for (Material m : MaterialLibrary.all()) {
            int[] want = NODES.get(m.id());
            assertEquals(want[0], ColumnGrid.of(m, ColumnSpacing.STANDARD).nodes(), m.id() + " standard");
            assertEquals(want[1], ColumnGrid.of(m, ColumnSpacing.COARSE).nodes(), m.id() + " coarse");
        }
    }
}
