package org.thermotile.model.materials;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

class MaterialOverridesTest {

    private static final Material DARK = MaterialLibrary.get("roof_membrane_dark");
    private static final Material WATER = MaterialLibrary.get("water");

    private static String error(Runnable r) {
        return assertThrows(IllegalArgumentException.class, r::run).getMessage();
    }

    @Test
    void scalarOverridesGiveANewMaterialAndSayWhere() {
        Map<String, Double> o = new LinkedHashMap<>();
        o.put("albedo", 0.65);
        o.put("emissivity", 0.88);
        o.put("moisture_availability", 0.1);
        o.put("anthropogenic_heat", 5.0);
        o.put("bottom_temperature_c", 26.0);
        Material m = MaterialOverrides.apply(DARK, o, "command line");
        assertNotSame(DARK, m);
        assertEquals(0.65, m.albedo());
        assertEquals(0.88, m.emissivity());
        assertEquals(0.1, m.moistureAvailability());
        assertEquals(5.0, m.anthropogenicHeatWm2());
        assertEquals(299.15, m.bottom().temperatureK(), 1e-9);
        assertEquals(DARK.bottom().filmResistanceM2KW(), m.bottom().filmResistanceM2KW());
        assertEquals(DARK.layers(), m.layers());
        assertEquals(0.06, DARK.albedo(), "the base is unchanged");
        assertEquals("set to 0.65 by command line", m.sources().get("albedo"));
        assertTrue(m.sources().get("bottom").startsWith("temperature set to 26.0 °C by command line"));
    }

    @Test
    void layerOverrides() {
        Material m = MaterialOverrides.applyAll(DARK, List.of("layers[1].thickness=0.2",
                "layers[1].conductivity = 0.025", "LAYERS[2].heat_capacity=2.0e6"), "scenario 'deep insulation'");
        assertEquals(0.2, m.layers().get(1).thicknessM());
        assertEquals(0.025, m.layers().get(1).conductivityWmK());
        assertEquals(2.0e6, m.layers().get(2).volumetricHeatCapacityJm3K());
        assertEquals(DARK.layers().get(0), m.layers().get(0));
        assertEquals(DARK.layers().get(1).name(), m.layers().get(1).name());
        assertTrue(m.sources().get("layers[1]").startsWith("conductivity set to 0.025 by scenario 'deep insulation'"),
                m.sources().get("layers[1]"));
        // Top layer thickness changes the surface heat capacity ρc·d.
        Material thick = MaterialOverrides.apply(DARK, "layers[0].thickness", 0.003, "test");
        assertEquals(2 * DARK.surfaceHeatCapacityJm2K(), thick.surfaceHeatCapacityJm2K(), 1e-6);
    }

    @Test
    void slabHeatCapacityOnlyForSlabs() {
        Material w = MaterialOverrides.apply(WATER, "surface_heat_capacity", 2.09e6, "test");
        assertEquals(2.09e6, w.surfaceHeatCapacityJm2K());
        String msg = error(() -> MaterialOverrides.apply(DARK, "surface_heat_capacity", 1e4, "command line"));
        assertTrue(msg.contains("surface_heat_capacity applies only to slab materials"), msg);
        assertTrue(msg.contains("'roof_membrane_dark' is layered"), msg);
        assertTrue(msg.contains("layers[0].thickness"), msg);
        msg = error(() -> MaterialOverrides.apply(WATER, "layers[0].thickness", 0.1, "command line"));
        assertTrue(msg.contains("slab material with no layers"), msg);
        msg = error(() -> MaterialOverrides.apply(WATER, "bottom_temperature_c", 10, "command line"));
        assertTrue(msg.contains("adiabatic bottom"), msg);
    }

    @Test
    void unknownKeyListsValidKeysAndSuggests() {
        String msg = error(() -> MaterialOverrides.apply(DARK, "albdo", 0.5, "command line"));
        assertTrue(msg.contains("unknown key 'albdo'"), msg);
        assertTrue(msg.contains("Did you mean 'albedo'?"), msg);
        for (String k : MaterialOverrides.SCALAR_KEYS) {
            assertTrue(msg.contains(k), msg);
        }
        assertTrue(msg.contains("layers[i].thickness [0 < thickness < 20 m]"), msg);
        assertTrue(msg.contains("i = 0…2"), msg);
        assertTrue(msg.contains("material 'roof_membrane_dark' (command line)"), msg);
        msg = error(() -> MaterialOverrides.apply(DARK, "layers[0].thicknes", 0.5, "command line"));
        assertTrue(msg.contains("Did you mean 'layers[0].thickness'?"), msg);
        msg = error(() -> MaterialOverrides.apply(DARK, "layers[7].thickness", 0.5, "command line"));
        assertTrue(msg.contains("has 3 layers, layers[0] … layers[2]"), msg);
    }

    @Test
    void outOfRangeValuesNameKeyAndRange() {
        String msg = error(() -> MaterialOverrides.apply(DARK, "albedo", 1.3, "command line"));
        assertTrue(msg.startsWith("override albedo=1.3 on material 'roof_membrane_dark' (command line)"), msg);
        assertTrue(msg.contains("albedo = 1.3 is outside its valid range 0 ≤ albedo ≤ 1"), msg);
        msg = error(() -> MaterialOverrides.apply(DARK, "layers[0].conductivity", -1, "command line"));
        assertTrue(msg.contains("conductivity = -1 is outside its valid range 0 < conductivity < 500 W/(m K)"), msg);
        msg = error(() -> MaterialOverrides.apply(DARK, "bottom_temperature_c", 95, "command line"));
        assertTrue(msg.contains("bottom_temperature_c = 95 is outside its valid range -73.15 < bottom_temperature_c < 76.85 °C"), msg);
        msg = error(() -> MaterialOverrides.apply(DARK, "albedo", Double.NaN, "command line"));
        assertTrue(msg.contains("finite number"), msg);
    }

    @Test
    void parseKeyValue() {
        assertEquals(new MaterialOverrides.Setting("albedo", 0.65), MaterialOverrides.parse("albedo=0.65"));
        assertEquals(new MaterialOverrides.Setting("layers[0].thickness", 0.05),
                MaterialOverrides.parse(" Layers[0].thickness = 5e-2 "));
        String msg = error(() -> MaterialOverrides.parse("albedo0.65"));
        assertTrue(msg.contains("must look like key=value, e.g. albedo=0.65"), msg);
        msg = error(() -> MaterialOverrides.parse("=0.65"));
        assertTrue(msg.contains("no key"), msg);
        msg = error(() -> MaterialOverrides.parse("albedo=high"));
        assertTrue(msg.contains("'high' is not a number"), msg);
        msg = error(() -> MaterialOverrides.parse("albedo=Infinity"));
        assertTrue(msg.contains("finite"), msg);
    }

    @Test
    void laterOverrideWins() {
        Material m = MaterialOverrides.applyAll(DARK, List.of("albedo=0.3", "albedo=0.7"), "command line");
        assertEquals(0.7, m.albedo());
    }
}
