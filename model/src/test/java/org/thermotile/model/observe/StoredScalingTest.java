package org.thermotile.model.observe;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class StoredScalingTest {
    /**
     * Landsat Collection 2 Level-2 ST_B10: K = DN · 0.00341802 + 149.0 (USGS, Landsat 8–9
     * Collection 2 Level-2 Science Product Guide, 2022, Table 6-1), nodata 0. Stored integers made
     * from known kelvin values read back within half a step (0.00171 K).
     */
    @Test
    void collection2SurfaceTemperatureReadsBackStoredKelvin() {
        StoredScaling st = new StoredScaling(0.00341802, 149.0, 0, false);
        for (double k = 260.0; k <= 340.0; k += 3.3) {
            int dn = (int) Math.round((k - 149.0) / 0.00341802);
            assertTrue(dn > 0 && dn <= 65535);
            assertEquals(k, st.decode(dn), 0.00341802 / 2 + 1e-12);
        }
        // one worked value: DN 44177 → 44177 · 0.00341802 + 149 = 299.99787 K (by hand)
        assertEquals(299.99786954, st.decode(44177), 1e-8);
        assertTrue(Double.isNaN(st.decode(0)));
    }

    @Test
    void celsiusIsConvertedToKelvin() {
        StoredScaling c = new StoredScaling(0.01, 0, -9999, true);
        assertEquals(273.15 + 31.25, c.decode(3125), 1e-9);
        assertTrue(Double.isNaN(c.decode(-9999)));
    }
}
