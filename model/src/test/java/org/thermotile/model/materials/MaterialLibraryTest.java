package org.thermotile.model.materials;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.thermotile.model.constants.Physical;

class MaterialLibraryTest {

    private static final List<String> REQUIRED_IDS = List.of("roof_membrane_dark", "roof_membrane_white",
            "bitumen_shingle", "clay_tile", "metal_roof_bare", "green_roof", "asphalt_fresh", "asphalt_aged",
            "concrete", "concrete_pavers", "gravel", "bare_soil_dry", "bare_soil_moist", "grass_irrigated",
            "grass_dry", "tree_canopy", "water");

    @Test
    void libraryHasTheRequiredIdsInOrder() {
        assertTrue(MaterialLibrary.all().size() >= 15);
        assertEquals(REQUIRED_IDS, MaterialLibrary.ids());
        for (String id : REQUIRED_IDS) {
            assertEquals(id, MaterialLibrary.get(id).id());
        }
    }

    /** Every property of every material names a source. */
    @Test
    void everyPropertyHasASource() {
        for (Material m : MaterialLibrary.all()) {
            List<String> keys = new java.util.ArrayList<>(List.of("albedo", "emissivity", "moisture_availability",
                    "anthropogenic_heat", "bottom"));
            if (m.isSlab()) {
                keys.add("surface_heat_capacity");
            }
            for (int i = 0; i < m.layers().size(); i++) {
                keys.add("layers[" + i + "]");
            }
            for (String k : keys) {
                String s = m.sources().get(k);
                assertTrue(s != null && !s.isBlank(), m.id() + ": no source for " + k);
                assertTrue(s.contains("(from memory)") || s.contains("common practice") || s.contains("ISO 6946")
                        || s.contains("FAO") || s.contains("by definition"),
                        m.id() + "." + k + " should say how it is known: " + s);
            }
        }
    }

    /**
     * Physical bounds: albedo 0.03–0.9 and emissivity 0.1–1 for real surfaces (Oke 1987 Table 1.1
     * ranges, from memory); k from 0.02 (foam) to ~60 (steel) W/(m K); ρc from 1e4 (foam, batts)
     * to 4.2e6 (water) J/(m³ K) (Oke 1987 thermal tables, from memory); ground depth 1–2 m.
     */
    @Test
    void valuesAreWithinPhysicalBounds() {
        for (Material m : MaterialLibrary.all()) {
            assertTrue(m.albedo() >= 0.03 && m.albedo() <= 0.9, m.id());
            assertTrue(m.emissivity() >= 0.1 && m.emissivity() <= 1.0, m.id());
            assertTrue(m.moistureAvailability() >= 0 && m.moistureAvailability() <= 1, m.id());
            assertTrue(m.anthropogenicHeatWm2() >= 0 && m.anthropogenicHeatWm2() <= 100, m.id());
            double depth = 0;
            for (Layer l : m.layers()) {
                assertTrue(l.conductivityWmK() >= 0.02 && l.conductivityWmK() <= 60, m.id() + " " + l);
                assertTrue(l.volumetricHeatCapacityJm3K() >= 1e4 && l.volumetricHeatCapacityJm3K() <= 4.2e6,
                        m.id() + " " + l);
                depth += l.thicknessM();
            }
            if (!m.isSlab()) {
                assertTrue(m.layers().get(0).thicknessM() <= 0.05, m.id() + ": top layer sets C_s, keep it thin");
            }
            switch (m.bottom().kind()) {
                case DEEP_GROUND -> assertTrue(depth >= 1.0 && depth <= 2.0, m.id() + " depth " + depth);
                case INDOOR_AIR -> {
                    assertEquals(297.15, m.bottom().temperatureK(), 1e-9, m.id());
                    // ISO 6946:2017 Table 7 R_si: 0.10 (up), 0.13 (horizontal), 0.17 (down).
                    assertEquals(0.17, m.bottom().filmResistanceM2KW(), 1e-12, m.id());
                }
                case ADIABATIC -> assertTrue(m.isSlab(), m.id());
            }
        }
    }

    @Test
    void whiteMembraneIsBrighterThanDark() {
        assertTrue(MaterialLibrary.get("roof_membrane_white").albedo()
                > MaterialLibrary.get("roof_membrane_dark").albedo() + 0.5);
        assertTrue(MaterialLibrary.get("asphalt_aged").albedo() > MaterialLibrary.get("asphalt_fresh").albedo());
        assertTrue(MaterialLibrary.get("grass_irrigated").moistureAvailability()
                > MaterialLibrary.get("grass_dry").moistureAvailability());
    }

    /** Roofs end at indoor air, ground surfaces at deep ground. */
    @Test
    void roofsAndGroundHaveTheirBottoms() {
        for (String id : List.of("roof_membrane_dark", "roof_membrane_white", "bitumen_shingle", "clay_tile",
                "metal_roof_bare", "green_roof")) {
            assertEquals(BottomBoundary.Kind.INDOOR_AIR, MaterialLibrary.get(id).bottom().kind(), id);
        }
        for (String id : List.of("asphalt_fresh", "asphalt_aged", "concrete", "concrete_pavers", "gravel",
                "bare_soil_dry", "bare_soil_moist", "grass_irrigated", "grass_dry")) {
            assertEquals(BottomBoundary.Kind.DEEP_GROUND, MaterialLibrary.get(id).bottom().kind(), id);
        }
    }

    /**
     * Water is a slab of a 1 m mixed layer: C = ρc·d = 4.18e6 J/(m² K) with ρc of water 4.18
     * MJ/(m³ K) (Oke 1987 Table 2.1, from memory; c_p 4182 J/(kg K) at 20 °C × 1000 kg/m³ is the
     * same to 0.1 %), fully wet, adiabatic bottom.
     */
    @Test
    void waterIsASlab() {
        Material w = MaterialLibrary.get("water");
        assertTrue(w.isSlab());
        assertTrue(w.layers().isEmpty());
        assertEquals(4.18e6, w.surfaceHeatCapacityJm2K(), 0.01e6);
        assertEquals(1.0, w.moistureAvailability());
        assertEquals(BottomBoundary.Kind.ADIABATIC, w.bottom().kind());
        Material tree = MaterialLibrary.get("tree_canopy");
        assertTrue(tree.isSlab());
        assertTrue(tree.surfaceHeatCapacityJm2K() < 0.01 * w.surfaceHeatCapacityJm2K());
        assertTrue(tree.moistureAvailability() >= 0.5);
    }

    /** The insulated roofs have U-values of a modern roof, 0.15–0.5 W/(m² K) (common practice). */
    @Test
    void roofUValuesAreTypical() {
        for (Material m : MaterialLibrary.all()) {
            if (m.bottom().kind() != BottomBoundary.Kind.INDOOR_AIR) {
                continue;
            }
            double r = m.bottom().filmResistanceM2KW() + 0.04; // + R_se 0.04 (ISO 6946:2017 Table 7)
            for (Layer l : m.layers()) {
                r += l.thicknessM() / l.conductivityWmK();
            }
            double u = 1 / r;
            assertTrue(u > 0.15 && u < 0.5, m.id() + " U = " + u);
        }
    }

    @Test
    void unknownIdNamesTheKnownIdsAndASuggestion() {
        var e = assertThrows(IllegalArgumentException.class, () -> MaterialLibrary.get("asphalt_agd"));
        String msg = e.getMessage();
        assertTrue(msg.contains("unknown material 'asphalt_agd'"), msg);
        assertTrue(msg.contains("Did you mean 'asphalt_aged'?"), msg);
        for (String id : REQUIRED_IDS) {
            assertTrue(msg.contains(id), msg);
        }
        e = assertThrows(IllegalArgumentException.class, () -> MaterialLibrary.get("zzzzzzzzzzzzzzzzzzzzzzzzz"));
        assertFalse(e.getMessage().contains("Did you mean"), e.getMessage());
        assertTrue(MaterialLibrary.find("nope").isEmpty());
    }

    /** Levenshtein (1966) distances of textbook pairs: kitten/sitting 3, flaw/lawn 2. */
    @Test
    void editDistanceOfTextbookPairs() {
        assertEquals(3, NameSuggestions.editDistance("kitten", "sitting"));
        assertEquals(2, NameSuggestions.editDistance("flaw", "lawn"));
        assertEquals(0, NameSuggestions.editDistance("", ""));
        assertEquals(4, NameSuggestions.editDistance("", "abcd"));
        assertEquals("water", NameSuggestions.closest("Watr", MaterialLibrary.ids()).orElseThrow());
    }

    /** Surface heat capacity of the dark roof's membrane: ρc·d of 1.5 mm rubber, ~3.3 kJ/(m² K). */
    @Test
    void membraneSurfaceHeatCapacity() {
        Material m = MaterialLibrary.get("roof_membrane_dark");
        assertEquals(0.0015 * 1100 * 2010, m.surfaceHeatCapacityJm2K(), 1e-6);
        assertEquals(Physical.ZERO_CELSIUS_K + 24, m.bottom().temperatureK(), 1e-9);
    }
}
