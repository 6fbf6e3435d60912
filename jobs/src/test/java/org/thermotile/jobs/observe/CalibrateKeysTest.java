package org.thermotile.jobs.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.thermotile.jobs.errors.UserInputException;
import org.thermotile.model.materials.Material;
import org.thermotile.model.materials.MaterialLibrary;
import org.thermotile.model.observe.Calibration;

/** {@code --calibrate} keys: bare keys free a parameter of every observed material, MATERIAL.KEY of one. */
class CalibrateKeysTest {
    static final Material[] PALETTE = {MaterialLibrary.get("asphalt_aged"), MaterialLibrary.get("grass_dry"),
            MaterialLibrary.get("roof_membrane_white")};
    static final boolean[] USED = {true, true, false};

    @Test
    void bareKeysFreeEveryObservedMaterialAndMaterialKeysOnlyTheirOwn() {
        List<Calibration.Parameter> all = Calibrate.freeParameters(PALETTE, USED, Calibrate.keys("albedo"));
        assertEquals(List.of(Calibration.Parameter.of(0, "albedo"), Calibration.Parameter.of(1, "albedo")), all,
                "the unobserved white roof does not move");
        List<Calibration.Parameter> some = Calibrate.freeParameters(PALETTE, USED,
                Calibrate.keys("asphalt_aged.albedo, grass_dry.moisture_availability,asphalt_aged.albedo"));
        assertEquals(List.of(Calibration.Parameter.of(0, "albedo"), Calibration.Parameter.of(1,
                "moisture_availability")), some, "each named once, in palette order");
        List<Calibration.Parameter> mixed = Calibrate.freeParameters(PALETTE, USED,
                Calibrate.keys("grass_dry.albedo,albedo"));
        assertEquals(2, mixed.size(), "a material key already covered by a bare key is not doubled");
    }

    @Test
    void unknownKeysAndMaterialsNameTheFix() {
        String k = assertThrows(UserInputException.class, () -> Calibrate.keys("asphalt_aged.albdo")).getMessage();
        assertTrue(k.contains("'asphalt_aged.albdo' is not a parameter") && k.contains("MATERIAL.KEY"), k);
        String m = assertThrows(UserInputException.class, () -> Calibrate.freeParameters(PALETTE, USED,
                Calibrate.keys("concrete.albedo"))).getMessage();
        assertTrue(m.contains("material 'concrete' is not in the run") && m.contains("asphalt_aged, grass_dry"), m);
        String u = assertThrows(UserInputException.class, () -> Calibrate.freeParameters(PALETTE, USED,
                Calibrate.keys("roof_membrane_white.albedo"))).getMessage();
        assertTrue(u.contains("dominates no observed pixel"), u);
    }
}
